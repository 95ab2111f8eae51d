// Figure export: any results chart as PNG (at a chosen DPI), SVG (QSvgGenerator, text
// kept as text) or PDF, written atomically; plus the offscreen renderer that the CLI's
// `tledger export MODEL --format svg|png|pdf --view level-bars|flow-map --out PATH`
// calls (see figure_export_cli.h for its Qt-free entry point).
#pragma once

#include <QPaintDevice>
#include <QSize>
#include <QString>
#include <optional>

class QMenu;
class QWidget;

namespace tl {
class Model;
struct BalanceSheet;
}  // namespace tl

namespace tl::ui {

// A view that can draw itself as a figure of a given logical size (pixels at 96 dpi).
class FigureSource {
public:
    virtual ~FigureSource() = default;
    virtual QSize figureSize() const = 0;  // natural size of the figure
    // Draws the whole figure on `device`: laid out at `size` logical pixels, painted
    // scaled by `scale` (device pixels per logical pixel). Opens its own painter.
    virtual void renderFigure(QPaintDevice& device, QSize size, double scale) = 0;
    virtual QString figureTitle() const = 0;

    // The scenario and project the figure shows ("Dry year", "reservoir.tledger"). Every
    // figure title carries them (titled()), so an exported file says where it came from.
    void setFigureContext(const QString& scenario, const QString& project);
    QString figureContext() const;  // "scenario Dry year · project reservoir.tledger", or empty

protected:
    // `what` followed by the context: "Flow map — scenario Dry year · project reservoir.tledger".
    QString titled(const QString& what) const;
    // Called after the context changed (a page redraws the title it shows).
    virtual void figureContextChanged() {}

private:
    QString scenario_, project_;
};

enum class FigureFormat { Png, Svg, Pdf };
std::optional<FigureFormat> parseFigureFormat(const QString& text);  // "png", "svg", "pdf"
QString figureSuffix(FigureFormat f);

struct FigureOptions {
    int dpi = 300;           // PNG resolution; SVG and PDF are vector output
    QSize size;              // logical size; empty = the source's figureSize()
};

// Returns an error message, or nullopt on success. The file is replaced atomically.
std::optional<QString> exportFigure(FigureSource& source, FigureFormat format, const QString& path,
                                    const FigureOptions& options = {});

// Adds "Export as PNG… / SVG… / PDF…" entries (file dialog, DPI prompt for PNG).
void addFigureExportActions(QMenu& menu, FigureSource& source, QWidget* dialogParent);
// The whole interactive export: asks for a file (its type chosen by the filter or the
// suffix, PNG by default) and, for PNG, a resolution; reports a failure in a message
// box. Returns the path written, or empty when cancelled or failed.
QString exportFigureInteractively(FigureSource& source, QWidget* dialogParent);
// A file name for the figure: its title in lower case, words joined by '_'.
QString suggestedFigureFileName(const FigureSource& source, FigureFormat format);

// Offscreen rendering of one view of a scenario ("level-bars" or "flow-map").
struct ScenarioFigureRequest {
    QString view;
    FigureFormat format = FigureFormat::Svg;
    QString path;
    FigureOptions options;
    QString quantity = QStringLiteral("throughput");  // level bars: throughput|biomass|production
    QString chains = QStringLiteral("combined");      // level bars: combined|producers|detritus
    bool logScale = false;                            // level bars
    QString scenario, project;                        // carried in the figure's title
};
std::optional<QString> exportScenarioFigure(const tl::Model& model, const tl::BalanceSheet& sheet,
                                            const ScenarioFigureRequest& request);

// Creates a QApplication on the offscreen platform when none exists (CLI use).
void ensureGuiApplication();

}  // namespace tl::ui
