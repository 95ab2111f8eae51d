#include "ui/results/figure_export.h"
#include "ui/results/figure_export_cli.h"

#include <QApplication>
#include <QBuffer>
#include <QRegularExpression>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QImage>
#include <QInputDialog>
#include <QMenu>
#include <QMessageBox>
#include <QPageSize>
#include <QPdfWriter>
#include <QSaveFile>
#include <QSvgGenerator>
#include <QTemporaryDir>

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"
#include "ui/results/flow_map_page.h"
#include "ui/results/level_bars_page.h"

namespace tl::ui {
namespace {

constexpr double kLogicalDpi = 96.0;  // logical pixels per inch of the figure layout

// Writes `bytes` to `path` through QSaveFile (temporary file, then rename).
std::optional<QString> writeAtomically(const QString& path, const QByteArray& bytes)
{
    QSaveFile file(path);
    if (!file.open(QIODevice::WriteOnly)) return QObject::tr("Cannot write %1: %2").arg(path, file.errorString());
    file.write(bytes);
    if (!file.commit()) return QObject::tr("Cannot write %1: %2").arg(path, file.errorString());
    return std::nullopt;
}

}  // namespace

void FigureSource::setFigureContext(const QString& scenario, const QString& project)
{
    if (scenario == scenario_ && project == project_) return;
    scenario_ = scenario;
    project_ = project;
    figureContextChanged();
}

QString FigureSource::figureContext() const
{
    QStringList parts;
    if (!scenario_.isEmpty()) parts << QObject::tr("scenario %1").arg(scenario_);
    if (!project_.isEmpty()) parts << QObject::tr("project %1").arg(project_);
    return parts.join(QStringLiteral(" · "));
}

QString FigureSource::titled(const QString& what) const
{
    const QString context = figureContext();
    return context.isEmpty() ? what : what + QStringLiteral(" — ") + context;
}

std::optional<FigureFormat> parseFigureFormat(const QString& text)
{
    const QString t = text.trimmed().toLower();
    if (t == "png") return FigureFormat::Png;
    if (t == "svg") return FigureFormat::Svg;
    if (t == "pdf") return FigureFormat::Pdf;
    return std::nullopt;
}

QString figureSuffix(FigureFormat f)
{
    switch (f) {
    case FigureFormat::Png: return "png";
    case FigureFormat::Svg: return "svg";
    case FigureFormat::Pdf: return "pdf";
    }
    return {};
}

std::optional<QString> exportFigure(FigureSource& source, FigureFormat format, const QString& path,
                                    const FigureOptions& options)
{
    const QSize size = options.size.isEmpty() ? source.figureSize() : options.size;
    if (size.isEmpty()) return QObject::tr("The figure is empty; nothing to export.");
    if (options.dpi < 30 || options.dpi > 2400)
        return QObject::tr("Resolution %1 dpi is outside 30-2400 dpi.").arg(options.dpi);
    const double scale = options.dpi / kLogicalDpi;

    switch (format) {
    case FigureFormat::Png: {
        const QSize pixels(qRound(size.width() * scale), qRound(size.height() * scale));
        if (static_cast<qint64>(pixels.width()) * pixels.height() > 400'000'000LL)
            return QObject::tr("%1 x %2 pixels is too large; lower the resolution.").arg(pixels.width()).arg(pixels.height());
        QImage image(pixels, QImage::Format_ARGB32_Premultiplied);
        image.fill(Qt::white);
        // Paint at the logical 96 dpi (fonts in points would otherwise grow twice: once by
        // the device resolution, once by the painter's scale), then record the real dpi.
        const int logicalDotsPerMeter = qRound(kLogicalDpi / 0.0254);
        image.setDotsPerMeterX(logicalDotsPerMeter);
        image.setDotsPerMeterY(logicalDotsPerMeter);
        source.renderFigure(image, size, scale);
        const int dotsPerMeter = qRound(options.dpi / 0.0254);
        image.setDotsPerMeterX(dotsPerMeter);
        image.setDotsPerMeterY(dotsPerMeter);
        QByteArray bytes;
        {
            QBuffer buffer(&bytes);
            buffer.open(QIODevice::WriteOnly);
            if (!image.save(&buffer, "PNG")) return QObject::tr("Could not encode the PNG image.");
        }
        return writeAtomically(path, bytes);
    }
    case FigureFormat::Svg: {
        QByteArray bytes;
        QBuffer buffer(&bytes);
        buffer.open(QIODevice::WriteOnly);
        QSvgGenerator svg;
        svg.setOutputDevice(&buffer);
        svg.setSize(size);
        svg.setViewBox(QRect(QPoint(0, 0), size));
        svg.setResolution(static_cast<int>(kLogicalDpi));
        svg.setTitle(source.figureTitle());
        svg.setDescription(QObject::tr("Trophic Ledger figure"));
        source.renderFigure(svg, size, 1.0);
        buffer.close();
        return writeAtomically(path, bytes);
    }
    case FigureFormat::Pdf: {
        // QPdfWriter needs a file: write into a temporary one next to the target, then rename.
        const QFileInfo target(path);
        QSaveFile file(path);
        if (!file.open(QIODevice::WriteOnly)) return QObject::tr("Cannot write %1: %2").arg(path, file.errorString());
        QPdfWriter pdf(&file);
        pdf.setResolution(static_cast<int>(kLogicalDpi));  // vector output; fonts keep their layout size
        pdf.setPageSize(QPageSize(QSizeF(size.width() / kLogicalDpi * 72.0, size.height() / kLogicalDpi * 72.0),
                                  QPageSize::Point, QString(), QPageSize::ExactMatch));
        pdf.setPageMargins(QMarginsF(0, 0, 0, 0));
        pdf.setTitle(source.figureTitle());
        pdf.setCreator(QStringLiteral("Trophic Ledger"));
        source.renderFigure(pdf, size, 1.0);
        if (!file.commit()) return QObject::tr("Cannot write %1: %2").arg(path, file.errorString());
        return std::nullopt;
    }
    }
    return QObject::tr("Unknown figure format.");
}

void addFigureExportActions(QMenu& menu, FigureSource& source, QWidget* dialogParent)
{
    for (FigureFormat format : {FigureFormat::Png, FigureFormat::Svg, FigureFormat::Pdf}) {
        const QString suffix = figureSuffix(format);
        menu.addAction(QObject::tr("Export as %1…").arg(suffix.toUpper()), dialogParent, [&source, dialogParent, format, suffix] {
            FigureOptions options;
            if (format == FigureFormat::Png) {
                bool ok = false;
                options.dpi = QInputDialog::getInt(dialogParent, QObject::tr("Export as PNG"),
                                                   QObject::tr("Resolution (dots per inch):"), 300, 72, 1200, 1, &ok);
                if (!ok) return;
            }
            const QString path = QFileDialog::getSaveFileName(
                dialogParent, QObject::tr("Export figure"), QDir::home().filePath(suggestedFigureFileName(source, format)),
                QObject::tr("%1 files (*.%2)").arg(suffix.toUpper(), suffix));
            if (path.isEmpty()) return;
            if (auto error = exportFigure(source, format, path, options))
                QMessageBox::warning(dialogParent, QObject::tr("Export figure"), *error);
        });
    }
}

QString suggestedFigureFileName(const FigureSource& source, FigureFormat format)
{
    QString name = source.figureTitle().toLower();
    name.replace(QRegularExpression(QStringLiteral("[^\\w]+"), QRegularExpression::UseUnicodePropertiesOption), QStringLiteral("_"));
    name.remove(QRegularExpression(QStringLiteral("^_+|_+$")));
    if (name.isEmpty()) name = QStringLiteral("figure");
    return name.left(120) + QLatin1Char('.') + figureSuffix(format);
}

QString exportFigureInteractively(FigureSource& source, QWidget* dialogParent)
{
    const QString png = QObject::tr("PNG image (*.png)"), svg = QObject::tr("SVG drawing (*.svg)"),
                  pdf = QObject::tr("PDF document (*.pdf)");
    QString filter = png;
    QString path = QFileDialog::getSaveFileName(dialogParent, QObject::tr("Export figure"),
                                                QDir::home().filePath(suggestedFigureFileName(source, FigureFormat::Png)),
                                                QStringList{png, svg, pdf}.join(QStringLiteral(";;")), &filter);
    if (path.isEmpty()) return {};
    auto format = parseFigureFormat(QFileInfo(path).suffix());
    if (!format) {  // no or unknown suffix: take the chosen filter's and add it
        format = filter == svg ? FigureFormat::Svg : filter == pdf ? FigureFormat::Pdf : FigureFormat::Png;
        path += QLatin1Char('.') + figureSuffix(*format);
    }
    FigureOptions options;
    if (*format == FigureFormat::Png) {
        bool ok = false;
        options.dpi = QInputDialog::getInt(dialogParent, QObject::tr("Export as PNG"),
                                           QObject::tr("Resolution (dots per inch):"), 300, 72, 1200, 1, &ok);
        if (!ok) return {};
    }
    if (auto error = exportFigure(source, *format, path, options)) {
        QMessageBox::warning(dialogParent, QObject::tr("Export figure"), *error);
        return {};
    }
    return path;
}

void ensureGuiApplication()
{
    if (QCoreApplication::instance()) return;
    if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", "offscreen");
    static int argc = 1;
    static char name[] = "tledger";
    static char* argv[] = {name, nullptr};
    // Deliberately never deleted: a static QApplication would be destroyed after other
    // Qt globals at exit; the process ends right after the export anyway.
    new QApplication(argc, argv);
}

std::optional<QString> exportScenarioFigure(const tl::Model& model, const tl::BalanceSheet& sheet,
                                            const ScenarioFigureRequest& request)
{
    ensureGuiApplication();
    if (request.view == "level-bars") {
        LevelBarsPage page;
        page.setScenario(model, sheet);
        if (!page.unavailableReason().isEmpty()) return page.unavailableReason();
        const QString q = request.quantity.toLower(), c = request.chains.toLower();
        if (q == "throughput") page.setQuantity(LevelQuantity::Throughput);
        else if (q == "biomass") page.setQuantity(LevelQuantity::Biomass);
        else if (q == "production") page.setQuantity(LevelQuantity::Production);
        else return QObject::tr("Unknown quantity '%1'; expected throughput, biomass or production.").arg(request.quantity);
        if (c == "combined") page.setChains(LevelChains::Combined);
        else if (c == "producers") page.setChains(LevelChains::FromProducers);
        else if (c == "detritus") page.setChains(LevelChains::FromDetritus);
        else return QObject::tr("Unknown chains '%1'; expected combined, producers or detritus.").arg(request.chains);
        page.setLogScale(request.logScale);
        page.setFigureContext(request.scenario, request.project);
        return exportFigure(page, request.format, request.path, request.options);
    }
    if (request.view == "flow-map") {
        FlowMapPage page;
        page.setScenario(model, sheet);
        if (!page.scene()->unavailableReason().isEmpty()) return page.scene()->unavailableReason();
        page.setFigureContext(request.scenario, request.project);
        return exportFigure(page, request.format, request.path, request.options);
    }
    return QObject::tr("Unknown view '%1'; expected level-bars or flow-map.").arg(request.view);
}

}  // namespace tl::ui

// --- Qt-free CLI entry point (figure_export_cli.h) ------------------------------------

namespace tl::ui {

std::string exportFigureForCli(const tl::Model& model, const tl::BalanceSheet& sheet, const CliFigureRequest& request)
{
    const auto format = parseFigureFormat(QString::fromStdString(request.format));
    if (!format)
        return "unknown figure format '" + request.format + "'; expected svg, png or pdf";
    ensureGuiApplication();
    ScenarioFigureRequest r;
    r.view = QString::fromStdString(request.view);
    r.format = *format;
    r.path = QString::fromStdString(request.path);
    r.options.dpi = request.dpi;
    if (request.width > 0 && request.height > 0) r.options.size = QSize(request.width, request.height);
    r.quantity = QString::fromStdString(request.quantity);
    r.chains = QString::fromStdString(request.chains);
    r.logScale = request.logScale;
    r.scenario = QString::fromStdString(request.scenario);
    r.project = QString::fromStdString(request.project);
    const auto error = exportScenarioFigure(model, sheet, r);
    return error ? error->toStdString() : std::string();
}

}  // namespace tl::ui
