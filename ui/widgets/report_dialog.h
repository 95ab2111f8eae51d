// File > Report…: the report of the current scenario, every scenario, or the comparison
// picked on the Compare page, previewed as it will print (charts drawn from their SVG),
// then saved as self-contained HTML or as PDF (core/io/html_report.h, ui/report). The
// provenance names the project file and its SHA-256; with unsaved changes the report
// says the file on disk is older than what it shows. The report is built off the GUI
// thread (a thousand compartments take seconds) behind a busy bar; the window stays
// responsive, and closing the dialog meanwhile drops the result (the worker holds its
// own copy of the project). The worker also parses the HTML into the preview's rich-text
// document, which for a large project takes longer than the report itself. The saved HTML is the previewed report with its charts
// inline (withInlineFigures), not a second build.
#pragma once

#include <QDialog>
#include <QStringList>
#include <memory>

#include "core/io/html_report.h"
#include "core/store/project.h"

class QComboBox;
class QLabel;
class QProgressBar;
class QPushButton;
class QTextBrowser;
class QTextDocument;

namespace tl::ui {

class ReportDialog : public QDialog {
    Q_OBJECT
public:
    // `projectPath`: the .tledger file the project was read from, or empty;
    // `comparison`: the scenarios picked on the Compare page (reference first).
    ReportDialog(const tl::Project& project, const QString& projectPath, bool unsavedChanges, const QString& currentScenario,
                 const QStringList& comparison, QWidget* parent = nullptr);
    ~ReportDialog() override;

    // 0 current scenario, 1 every scenario, 2 the comparison (when offered).
    void setScope(int scope);
    const tl::HtmlReport& report() const { return report_; }
    QTextBrowser* preview() const { return preview_; }
    // True while a report is being built (the Save buttons wait for it).
    bool building() const { return building_; }
    // The options of the scope shown (provenance included), as the worker gets them.
    tl::ReportOptions reportOptions(bool markers) const { return options(markers); }

signals:
    void reportReady();  // the preview shows a newly built report (or its error)

public:

    // Both return an error sentence, or empty on success.
    QString saveHtml(const QString& path) const;
    QString savePdf(const QString& path) const;

private:
    tl::ReportOptions options(bool markers) const;
    void rebuild();
    void showReport(tl::HtmlReport report);
    void saveInteractively(bool pdf);

    tl::Project project_;
    QString projectPath_;
    bool unsaved_;
    QString current_;
    QStringList comparison_;
    QComboBox* scope_;
    QLabel* note_;
    QTextBrowser* preview_;
    QProgressBar* busy_;
    QPushButton* saveHtml_;
    QPushButton* savePdf_;
    std::shared_ptr<const tl::Project> shared_;  // what the workers read
    tl::HtmlReport report_;                      // with figure markers, as previewed
    std::shared_ptr<QTextDocument> previewDocument_;  // made by the worker, shown by preview_
    quint64 generation_ = 0;                     // only the newest build is shown
    bool building_ = false;
};

}  // namespace tl::ui
