#include "ui/widgets/report_dialog.h"

#include <QAbstractTextDocumentLayout>
#include <QApplication>
#include <QComboBox>
#include <QCoreApplication>
#include <QDateTime>
#include <QDialogButtonBox>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QHBoxLayout>
#include <QLabel>
#include <QMessageBox>
#include <QPushButton>
#include <QTextBrowser>
#include <QVBoxLayout>

#include "core/io/atomic_file.h"
#include "core/io/sha256.h"
#include "ui/report/report_pdf.h"
#include "ui/report/svg_text_object.h"

namespace tl::ui {

ReportDialog::ReportDialog(const tl::Project& project, const QString& projectPath, bool unsavedChanges,
                           const QString& currentScenario, const QStringList& comparison, QWidget* parent)
    : QDialog(parent), project_(project), projectPath_(projectPath), unsaved_(unsavedChanges), current_(currentScenario),
      comparison_(comparison)
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
    preview_ = new QTextBrowser(this);
    preview_->setObjectName(QStringLiteral("reportPreview"));
    preview_->setOpenLinks(false);
    auto* charts = new SvgTextObject(preview_->document());
    charts->setMaximumSize(QSizeF(860, 900));
    preview_->document()->documentLayout()->registerHandler(SvgTextObject::kType, charts);
    layout->addWidget(preview_, 1);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
    QPushButton* html = buttons->addButton(tr("Save &HTML…"), QDialogButtonBox::ActionRole);
    QPushButton* pdf = buttons->addButton(tr("Save &PDF…"), QDialogButtonBox::ActionRole);
    connect(html, &QPushButton::clicked, this, [this] { saveInteractively(false); });
    connect(pdf, &QPushButton::clicked, this, [this] { saveInteractively(true); });
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    layout->addWidget(buttons);
    connect(scope_, &QComboBox::currentIndexChanged, this, [this] { rebuild(); });
    resize(980, 760);
    rebuild();
}

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

void ReportDialog::rebuild()
{
    // Built here, on the GUI thread: a second or more for a thousand compartments.
    QApplication::setOverrideCursor(Qt::WaitCursor);
    report_ = tl::makeHtmlReport(project_, options(true));
    QApplication::restoreOverrideCursor();
    if (!report_.error.empty()) {
        note_->setText(QString::fromStdString(report_.error));
        preview_->clear();
        return;
    }
    note_->setText(tr("%n chart(s); the preview shows the report as the PDF lays it out. The HTML shows the same "
                      "charts and needs no network.", nullptr, int(report_.figures.size())));
    preview_->setHtml(QString::fromStdString(report_.html));
    placeReportFigures(*preview_->document(), report_);
}

QString ReportDialog::saveHtml(const QString& path) const
{
    const tl::HtmlReport report = tl::makeHtmlReport(project_, options(false));
    if (!report.error.empty()) return QString::fromStdString(report.error);
    if (const auto failed = tl::writeFileAtomically(path.toStdString(), report.html))
        return QDir::toNativeSeparators(path) + QStringLiteral(": ") + QString::fromStdString(*failed);
    return {};
}

QString ReportDialog::savePdf(const QString& path) const
{
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
