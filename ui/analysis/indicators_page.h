// Indicators page: the system indicators of the scenario (indicator_rows.h) as a table
// with units and one-line definitions, copyable as tab-separated text, and the keystone
// ranking (Libralato, Christensen & Pauly 2006, Ecol Model 195:153) as horizontal bars,
// highest first, coloured by compartment kind (Okabe–Ito, ui/style/palette.h).
// The catch figures come with the decision-support line. Right-click on the chart
// exports it (ui/results/figure_export.h).
#pragma once

#include <QString>
#include <memory>
#include <vector>

#include "ui/analysis/indicator_rows.h"
#include "ui/analysis/scenario_analysis.h"
#include "ui/results/figure_export.h"
#include "ui/results/results_pages.h"

class QCustomPlot;
class QLabel;
class QStandardItemModel;
class QTableView;

namespace tl::ui {

struct KeystoneBar {
    QString name;
    CompartmentKind kind = CompartmentKind::Consumer;
    double keystoneIndex = 0.0;
    double position = 0.0;  // bar key on the plot: the highest index sits at the top
};

class IndicatorsPage : public ResultsPage, public FigureSource {
    Q_OBJECT
public:
    enum Column { NameColumn, ValueColumn, UnitColumn, DefinitionColumn, ColumnCount };
    static constexpr int ValueRole = Qt::UserRole + 1;  // exact value in the value column

    explicit IndicatorsPage(QWidget* parent = nullptr);
    ~IndicatorsPage() override;

    void setScenario(const tl::Model& model, const tl::BalanceSheet& sheet) override;
    QString title() const override { return tr("Indicators"); }
    QString key() const override { return QStringLiteral("indicators"); }

    QStandardItemModel* tableModel() const { return table_; }
    QTableView* view() const { return view_; }
    QCustomPlot* plot() const { return plot_; }
    AnalysisRunner* runner() const { return runner_; }
    const std::vector<IndicatorRow>& rows() const { return rows_; }
    const std::vector<KeystoneBar>& keystoneBars() const { return bars_; }
    QString noticeText() const;
    // The table as tab-separated text (header line, one line per indicator, full
    // precision, then the decision-support line); also what Copy puts on the clipboard.
    QString tabSeparatedText() const;
    void copyToClipboard() const;

    QSize figureSize() const override;
    void renderFigure(QPaintDevice& device, QSize size, double scale) override;
    QString figureTitle() const override { return titled(tr("Keystone index by compartment")); }

protected:
    void figureContextChanged() override;

private:
    void display(std::shared_ptr<const ScenarioAnalysis> analysis);
    void rebuildPlot();

    QStandardItemModel* table_;
    QTableView* view_;
    QCustomPlot* plot_;
    QLabel* status_;
    QLabel* notice_;
    AnalysisRunner* runner_;
    std::shared_ptr<const ScenarioAnalysis> analysis_;
    std::vector<IndicatorRow> rows_;
    std::vector<KeystoneBar> bars_;
    int leftOut_ = 0;  // compartments without a finite keystone index
};

}  // namespace tl::ui
