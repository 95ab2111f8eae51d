// Level bars page: one horizontal bar per integer trophic level (I at the bottom),
// stacked by the compartments contributing to it and centred so the stack reads as a
// pyramid (DESIGN.md 4). Switches: throughput / biomass / production; combined chains,
// chains from producers or from detritus; linear or log bar length. The transfer
// efficiency of each level is written beside the gap to the next; hovering a segment
// shows the compartment's part and share. Numbers: core/network/level_decomposition.h.
#pragma once

#include <QString>
#include <memory>
#include <optional>

#include "ui/results/figure_export.h"
#include "ui/results/level_bars_data.h"
#include "ui/results/results_pages.h"

class QComboBox;
class QCustomPlot;
class QMouseEvent;

namespace tl::ui {

class LevelBarsPage : public ResultsPage, public FigureSource {
    Q_OBJECT
public:
    explicit LevelBarsPage(QWidget* parent = nullptr);
    ~LevelBarsPage() override;

    void setScenario(const tl::Model& model, const tl::BalanceSheet& sheet) override;
    // With a stored ensemble run that has "levels", each TE and the mean TE are followed
    // by their middle 95 % over the balanced draws (combined chains, feeding cycles
    // removed: what the ensemble computes; other views say so instead).
    void setEnsembleBands(std::shared_ptr<const tl::ensemble::EnsembleSummary> summary, const QString& origin) override;
    // The band written after level `level`'s TE (1 = I), or "" (tests).
    QString teBandText(int level) const;
    QString title() const override { return tr("Level bars"); }
    QString key() const override { return QStringLiteral("level-bars"); }

    void setQuantity(LevelQuantity q);
    void setChains(LevelChains c);
    void setLogScale(bool on);
    LevelQuantity quantity() const { return quantity_; }
    LevelChains chains() const { return chains_; }
    bool logScale() const { return log_; }

    // What is drawn now (empty stacks when the scenario could not be decomposed).
    const LevelBarsData& data() const { return data_; }
    const FlowNetwork* network() const { return network_.get(); }
    const LevelDecomposition* decomposition() const { return decomposition_.get(); }
    QString unavailableReason() const { return unavailable_; }
    QCustomPlot* plot() const { return plot_; }
    // Text shown when hovering over the segment at plot coordinates (x, level).
    QString segmentToolTip(double x, double level) const;

    // The names written on the chart: inside a segment wide enough, else just above or
    // below the bar when the room there is free (pixel rectangles of the last drawing).
    struct SegmentLabel {
        QString name;
        bool outside = false;
        QRectF pixels;
        std::size_t segment = 0;  // index into segmentPixelRects()
    };
    const std::vector<SegmentLabel>& segmentLabels() const { return labels_; }
    // Pixel rectangles of the bars' segments in the last drawing.
    std::vector<QRectF> segmentPixelRects() const;

    QSize figureSize() const override { return {900, 620}; }
    void renderFigure(QPaintDevice& device, QSize size, double scale) override;
    QString figureTitle() const override;

protected:
    void showEvent(QShowEvent* event) override;
    void resizeEvent(QResizeEvent* event) override;
    void figureContextChanged() override { scheduleRebuild(); }

private:
    struct DrawnSegment {
        double left, right, bottom, top;
        std::size_t node;
        double value, share;
        int level;
        bool tinted;  // drawn in the lighter tint of its kind's colour
    };
    void scheduleRebuild();
    void rebuild();
    void addSegmentLabels();
    void onMouseMove(QMouseEvent* event);
    QString quantityLabel() const;
    QString unitLabel() const;

    QCustomPlot* plot_;
    QComboBox* quantityCombo_;
    QComboBox* chainsCombo_;
    QComboBox* scaleCombo_;
    QComboBox* cyclesCombo_;
    tl::FeedingCycles cycles_ = tl::FeedingCycles::Removed;
    std::unique_ptr<FlowNetwork> network_;
    std::unique_ptr<LevelDecomposition> decomposition_;
    std::vector<CompartmentKind> kinds_;
    QString biomassUnit_, flowUnit_;
    QString unavailable_;
    LevelBarsData data_;
    std::vector<DrawnSegment> drawn_;
    std::vector<SegmentLabel> labels_;
    LevelQuantity quantity_ = LevelQuantity::Throughput;
    LevelChains chains_ = LevelChains::Combined;
    bool log_ = false;
    bool dirty_ = false;
    std::shared_ptr<const tl::ensemble::EnsembleSummary> ensemble_;
    QString ensembleOrigin_;
};

QString romanNumeral(int level);

}  // namespace tl::ui
