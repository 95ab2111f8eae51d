// The user guide (Help > User guide, F1): a short HTML page shipped as a Qt resource
// (resources/help/guide.html) on how to build a model, what each page shows and the
// equations with their sources. Two parts are filled in when it opens, so that they
// can never drift from the program: the table of problem codes (from the registry in
// core/model/problem_codes.h) and the keyboard shortcuts (from the window's actions).
#pragma once

#include <QDialog>
#include <QList>
#include <QString>

class QAction;
class QTextBrowser;

namespace tl::ui {

// Registers the guide and the icons of resources/help.qrc; idempotent.
void initGuideResources();

// The guide's HTML with the problem codes and the shortcuts of `actions` filled in.
QString userGuideHtml(const QList<QAction*>& actions);

// "Save  Ctrl+S" rows for every action in `actions` (menus followed) that has a
// shortcut, in menu order, as an HTML table.
QString shortcutTableHtml(const QList<QAction*>& actions);

class HelpWindow : public QDialog {
    Q_OBJECT
public:
    explicit HelpWindow(const QList<QAction*>& actions, QWidget* parent = nullptr);
    QTextBrowser* browser() const { return browser_; }
    // Scrolls to a section of the guide ("build", "pages", "checks", "equations", "keys").
    void showSection(const QString& anchor);

private:
    QTextBrowser* browser_;
};

}  // namespace tl::ui
