// Impact matrix page: the mixed trophic impact matrix (Ulanowicz & Puccia 1990) as a
// heat map. Rows are impacting groups (fleets at the bottom, in italics below a rule),
// columns impacted groups; purple = negative, green = positive, white = none
// (impact_colour_map.h). Rows can be ordered by name, keystone index or overall effect.
// Right-click exports the figure (PNG/SVG/PDF, ui/results/figure_export.h).
#pragma once

#include <memory>

#include "ui/analysis/impact_matrix_model.h"
#include "ui/analysis/scenario_analysis.h"
#include "ui/results/figure_export.h"
#include "ui/results/results_pages.h"

class QComboBox;
class QLabel;
class QTableView;

namespace tl::ui {

// Colour bar from -range to +range, labelled "negative impact" / "positive impact".
class ImpactLegend : public QWidget {
    Q_OBJECT
public:
    using QWidget::QWidget;
    void setRange(double range);
    QSize sizeHint() const override { return {420, 44}; }
    // Draws the legend into `area` (also used by the exported figure).
    static void paintLegend(QPainter& painter, const QRectF& area, double range, const QFont& font);

protected:
    void paintEvent(QPaintEvent* event) override;

private:
    double range_ = 0.0;
};

class ImpactMatrixPage : public ResultsPage, public FigureSource {
    Q_OBJECT
public:
    explicit ImpactMatrixPage(QWidget* parent = nullptr);
    ~ImpactMatrixPage() override;

    void setScenario(const tl::Model& model, const tl::BalanceSheet& sheet) override;
    QString title() const override { return tr("Impact matrix"); }
    QString key() const override { return QStringLiteral("impact-matrix"); }

    ImpactMatrixModel* matrixModel() const { return model_; }
    QTableView* view() const { return view_; }
    AnalysisRunner* runner() const { return runner_; }
    void setRowOrder(ImpactRowOrder order);
    QString unavailableReason() const { return message_; }

    QSize figureSize() const override;
    void renderFigure(QPaintDevice& device, QSize size, double scale) override;
    QString figureTitle() const override { return titled(tr("Mixed trophic impact (row acts on column)")); }

private:
    void display(std::shared_ptr<const ScenarioAnalysis> analysis);
    void paintFigure(QPainter& painter, QSize size);

    ImpactMatrixModel* model_;
    QTableView* view_;
    QComboBox* orderCombo_;
    ImpactLegend* legend_;
    QLabel* status_;
    AnalysisRunner* runner_;
    QString message_;
};

}  // namespace tl::ui
