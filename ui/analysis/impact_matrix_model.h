// Table model of the mixed trophic impact matrix M (core/network/mixed_trophic_impact.h,
// Ulanowicz & Puccia 1990): row i (impacting group) acts on column j (impacted group).
// Rows and columns are the compartments in model order, then the fleets; fleets stay at
// the bottom (and right) whatever the row order. Cells show m_ij with 2 decimals and are
// left blank when |m_ij| < 0.005, for calm reading; the exact value is in ValueRole and
// the tooltip. Colours: impact_colour_map.h on the range +-max|m|.
#pragma once

#include <QAbstractTableModel>
#include <memory>
#include <vector>

#include "ui/analysis/scenario_analysis.h"

namespace tl::ui {

enum class ImpactRowOrder { AsEntered, ByName, ByKeystoneIndex, ByOverallEffect };

class ImpactMatrixModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Role { ValueRole = Qt::UserRole + 1, IsFleetRole, MatrixIndexRole };
    static constexpr double kBlankBelow = 0.005;

    explicit ImpactMatrixModel(QObject* parent = nullptr);

    void setAnalysis(std::shared_ptr<const ScenarioAnalysis> analysis);
    void setRowOrder(ImpactRowOrder order);
    ImpactRowOrder rowOrder() const { return order_; }

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role) const override;

    // The matrix position (row of M) shown at display row `row`.
    std::size_t matrixRow(int row) const { return rowOrder_[static_cast<std::size_t>(row)]; }
    double value(int row, int column) const;
    double range() const { return range_; }  // max |m_ij| over finite cells (0 when none)
    bool singular() const;
    bool isFleet(std::size_t matrixIndex) const;
    int firstFleetRow() const;  // display row of the first fleet, or -1
    QString name(std::size_t matrixIndex) const;
    // Sort keys, per matrix row: keystone index (NaN for detritus and fleets) and the
    // overall effect sqrt(sum_{j != i} m_ij^2) over every column shown.
    double keystoneIndex(std::size_t matrixIndex) const;
    double overallEffect(std::size_t matrixIndex) const;

private:
    void reorder();
    QString kindText(std::size_t matrixIndex) const;

    std::shared_ptr<const ScenarioAnalysis> analysis_;
    std::vector<std::size_t> rowOrder_;
    std::vector<double> keystone_, overall_;
    double range_ = 0.0;
    ImpactRowOrder order_ = ImpactRowOrder::AsEntered;
};

}  // namespace tl::ui
