// File > Report…: the report of the current scenario, every scenario, or the comparison
// picked on the Compare page, previewed as it will print (charts drawn from their SVG),
// then saved as self-contained HTML or as PDF (core/io/html_report.h, ui/report). The
// provenance names the project file and its SHA-256; with unsaved changes the report
// says the file on disk is older than what it shows.
#pragma once

#include <QDialog>
#include <QStringList>

#include "core/io/html_report.h"
#include "core/store/project.h"

class QComboBox;
class QLabel;
class QTextBrowser;

namespace tl::ui {

class ReportDialog : public QDialog {
    Q_OBJECT
public:
    // `projectPath`: the .tledger file the project was read from, or empty;
    // `comparison`: the scenarios picked on the Compare page (reference first).
    ReportDialog(const tl::Project& project, const QString& projectPath, bool unsavedChanges, const QString& currentScenario,
                 const QStringList& comparison, QWidget* parent = nullptr);

    // 0 current scenario, 1 every scenario, 2 the comparison (when offered).
    void setScope(int scope);
    const tl::HtmlReport& report() const { return report_; }
    QTextBrowser* preview() const { return preview_; }

    // Both return an error sentence, or empty on success.
    QString saveHtml(const QString& path) const;
    QString savePdf(const QString& path) const;

private:
    tl::ReportOptions options(bool markers) const;
    void rebuild();
    void saveInteractively(bool pdf);

    tl::Project project_;
    QString projectPath_;
    bool unsaved_;
    QString current_;
    QStringList comparison_;
    QComboBox* scope_;
    QLabel* note_;
    QTextBrowser* preview_;
    tl::HtmlReport report_;  // with figure markers, as previewed
};

}  // namespace tl::ui
