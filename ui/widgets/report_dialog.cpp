#include "ui/widgets/report_dialog.h"

#include <QAbstractTextDocumentLayout>
#include <QApplication>
#include <QComboBox>
#include <QCoreApplication>
#include <QDateTime>
#include <QDialogButtonBox>
#include <QFutureWatcher>
#include <QProgressBar>
#include <QtConcurrent/QtConcurrentRun>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QHBoxLayout>
#include <QLabel>
#include <QMessageBox>
#include <QPushButton>
#include <QTextBrowser>
#include <QTextDocument>
#include <QThread>
#include <QVBoxLayout>

#include "core/io/atomic_file.h"
#include "core/io/sha256.h"
#include "ui/report/report_pdf.h"
#include "ui/report/svg_text_object.h"

namespace tl::ui {

ReportDialog::ReportDialog(const tl::Project& project, const QString& projectPath, bool unsavedChanges,
                           const QString& currentScenario, const QStringList& comparison, QWidget* parent)
    : QDialog(parent), project_(project), projectPath_(projectPath), unsaved_(unsavedChanges), current_(currentScenario),
      comparison_(comparison), shared_(std::make_shared<const tl::Project>(project))
{
    setObjectName(QStringLiteral("reportDialog"));
    setWindowTitle(tr("Report"));
    auto* layout = new QVBoxLayout(this);
    auto* row = new QHBoxLayout;
    scope_ = new QComboBox(this);
    scope_->setObjectName(QStringLiteral("reportScope"));
    scope_->addItem(tr("Scenario '%1'").arg(current_));
    scope_->addItem(tr("Every scenario (%1)").arg(project_.scenarios.size()));
    if (comparison_.size() >= 2) scope_->addItem(tr("Comparison: %1").arg(comparison_.join(QStringLiteral(", "))));
    auto* label = new QLabel(tr("&Report on:"), this);
    label->setBuddy(scope_);
    row->addWidget(label);
    row->addWidget(scope_, 1);
    layout->addLayout(row);
    note_ = new QLabel(this);
    note_->setWordWrap(true);
    layout->addWidget(note_);
    busy_ = new QProgressBar(this);
    busy_->setObjectName(QStringLiteral("reportBusy"));
    busy_->setRange(0, 0);  // no measure of progress inside one build: a busy bar
    busy_->setTextVisible(false);
    busy_->setMaximumHeight(12);
    busy_->hide();
    layout->addWidget(busy_);
    preview_ = new QTextBrowser(this);
    preview_->setObjectName(QStringLiteral("reportPreview"));
    preview_->setOpenLinks(false);
    layout->addWidget(preview_, 1);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
    saveHtml_ = buttons->addButton(tr("Save &HTML…"), QDialogButtonBox::ActionRole);
    savePdf_ = buttons->addButton(tr("Save &PDF…"), QDialogButtonBox::ActionRole);
    connect(saveHtml_, &QPushButton::clicked, this, [this] { saveInteractively(false); });
    connect(savePdf_, &QPushButton::clicked, this, [this] { saveInteractively(true); });
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    layout->addWidget(buttons);
    connect(scope_, &QComboBox::currentIndexChanged, this, [this] { rebuild(); });
    resize(980, 760);
    rebuild();
}

ReportDialog::~ReportDialog() = default;

void ReportDialog::setScope(int scope)
{
    if (scope >= 0 && scope < scope_->count()) scope_->setCurrentIndex(scope);
}

tl::ReportOptions ReportDialog::options(bool markers) const
{
    tl::ReportOptions o;
    o.figureMarkers = markers;
    switch (scope_->currentIndex()) {
    case 0: o.scenarios = {current_.toStdString()}; break;
    case 2:
        for (const QString& s : comparison_) o.scenarios.push_back(s.toStdString());
        o.compare = true;
        break;
    default: break;
    }
    o.provenance.programVersion = QCoreApplication::applicationVersion().toStdString();
    o.provenance.date = QDateTime::currentDateTimeUtc().toString(QStringLiteral("yyyy-MM-dd")).toStdString();
    const QFileInfo file(projectPath_);
    if (file.isFile()) {
        o.provenance.projectFile = file.fileName().toStdString() + (unsaved_ ? " (with unsaved changes: the file is older than this report)" : "");
        o.provenance.projectSha256 = tl::fileSha256(file.absoluteFilePath().toStdString()).value_or("");
    } else {
        o.provenance.projectFile = projectPath_.isEmpty() ? "" : file.fileName().toStdString();
    }
    return o;
}

namespace {

// The previewed report and its rich-text document, both made on a worker thread: for a
// large project the HTML parse takes longer than the report itself. The document is
// handed to the GUI thread before the worker returns and deleted there (deleteLater) when
// its last holder lets go, also when the dialog closed before it arrived.
struct BuiltReport {
    tl::HtmlReport report;
    std::shared_ptr<QTextDocument> document;
};

BuiltReport buildReport(const tl::Project& project, const tl::ReportOptions& options, QThread* gui)
{
    BuiltReport built;
    built.report = tl::makeHtmlReport(project, options);
    if (!built.report.error.empty()) return built;
    auto* doc = new QTextDocument;
    // The chart handler is the document's child: it moves with it.
    auto* charts = new SvgTextObject(doc);
    charts->setMaximumSize(QSizeF(860, 900));
    doc->documentLayout()->registerHandler(SvgTextObject::kType, charts);
    doc->setHtml(QString::fromStdString(built.report.html));
    placeReportFigures(*doc, built.report);
    doc->moveToThread(gui);
    built.document = std::shared_ptr<QTextDocument>(doc, [](QTextDocument* d) { d->deleteLater(); });
    return built;
}

}  // namespace

void ReportDialog::rebuild()
{
    // Off the GUI thread: the worker reads its own copy of the project (shared_), and a
    // result that arrives after the scope changed or the dialog closed is dropped.
    const quint64 generation = ++generation_;
    building_ = true;
    busy_->show();
    saveHtml_->setEnabled(false);
    savePdf_->setEnabled(false);
    note_->setText(tr("Building the report…"));
    auto* watcher = new QFutureWatcher<BuiltReport>(this);
    connect(watcher, &QFutureWatcher<BuiltReport>::finished, this, [this, watcher, generation] {
        watcher->deleteLater();
        if (generation != generation_) return;
        BuiltReport built = watcher->result();
        previewDocument_ = built.document;
        showReport(std::move(built.report));
    });
    watcher->setFuture(QtConcurrent::run([project = shared_, options = options(true), gui = thread()] {
        return buildReport(*project, options, gui);
    }));
}

void ReportDialog::showReport(tl::HtmlReport report)
{
    report_ = std::move(report);
    building_ = false;
    busy_->hide();
    const bool ok = report_.error.empty() && previewDocument_;
    saveHtml_->setEnabled(ok);
    savePdf_->setEnabled(ok);
    if (!ok) {
        note_->setText(QString::fromStdString(report_.error));
        preview_->clear();
    } else {
        note_->setText(tr("%n chart(s); the preview shows the report as the PDF lays it out. The HTML shows the same "
                          "charts and needs no network.", nullptr, int(report_.figures.size())));
        // Not owned by the browser: previewDocument_ keeps it. Qt lays the document out on
        // this thread; for hundreds of compartments per scenario that still takes seconds.
        preview_->setDocument(previewDocument_.get());
    }
    emit reportReady();
}

QString ReportDialog::saveHtml(const QString& path) const
{
    if (building_) return tr("The report is still being built.");
    if (!report_.error.empty()) return QString::fromStdString(report_.error);
    if (const auto failed = tl::writeFileAtomically(path.toStdString(), tl::withInlineFigures(report_)))
        return QDir::toNativeSeparators(path) + QStringLiteral(": ") + QString::fromStdString(*failed);
    return {};
}

QString ReportDialog::savePdf(const QString& path) const
{
    if (building_) return tr("The report is still being built.");
    if (!report_.error.empty()) return QString::fromStdString(report_.error);
    return QString::fromStdString(writeReportPdf(report_, path.toStdString()));
}

void ReportDialog::saveInteractively(bool pdf)
{
    const QString suffix = pdf ? QStringLiteral(".pdf") : QStringLiteral(".html");
    const QString base = QFileInfo(projectPath_).completeBaseName().isEmpty() ? QStringLiteral("project")
                                                                               : QFileInfo(projectPath_).completeBaseName();
    QString path = QFileDialog::getSaveFileName(this, pdf ? tr("Save report as PDF") : tr("Save report as HTML"),
                                                QDir::home().filePath(base + QStringLiteral("-report") + suffix),
                                                pdf ? tr("PDF (*.pdf)") : tr("HTML report (*.html)"));
    if (path.isEmpty()) return;
    if (!path.endsWith(suffix, Qt::CaseInsensitive)) path += suffix;
    const QString error = pdf ? savePdf(path) : saveHtml(path);
    if (!error.isEmpty()) QMessageBox::warning(this, tr("Report"), error);
    else note_->setText(tr("Report written to %1").arg(QDir::toNativeSeparators(path)));
}

}  // namespace tl::ui
