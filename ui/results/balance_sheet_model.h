// BalanceSheetModel: a read-only table model over one solved scenario, one row per
// compartment: the entered inputs beside the balanced values (solved ones carry the
// solvedIcon()), the derived flows and rates of DESIGN.md 3.2, trophic level and
// omnivory index (3.3), and a status column naming the compartment's problems.
// Every number is copied from tl::BalanceSheet; nothing is computed here.
#pragma once

#include <QAbstractTableModel>
#include <QString>
#include <optional>
#include <vector>

#include "core/balance/balance_sheet.h"
#include "core/ensemble/ensemble_summary.h"
#include "core/model/model.h"

namespace tl::ui {

class BalanceSheetModel : public QAbstractTableModel {
    Q_OBJECT
public:
    // Raw double (NaN when empty or not applicable) for sorting, copying and tests.
    static constexpr int kValueRole = Qt::UserRole + 1;
    // True when the cell shows a value the balance solved.
    static constexpr int kSolvedRole = Qt::UserRole + 2;

    enum class Column {
        Name, Kind, Status,
        BiomassIn, Biomass, PbIn, Pb, QbIn, Qb, EeIn, Ee, PqIn, Pq, Unassim,
        Production, Consumption, Respiration, FlowToDetritus, Catch,
        M0, M2, F, Z, NetEfficiency, TrophicLevel, Omnivory,
        Count
    };

    explicit BalanceSheetModel(QObject* parent = nullptr);

    void setScenario(const tl::Model& model, const tl::BalanceSheet& sheet);
    // A stored ensemble run of the scenario (null: none). With one, a last column
    // (kEeIntervalColumn, after Column::Count) gives each compartment's EE over the middle
    // 95 % of the balanced draws, and the tooltips of B, P/B, Q/B, EE, P/Q and TL add
    // their intervals.
    void setEnsemble(std::shared_ptr<const tl::ensemble::EnsembleSummary> summary, const QString& origin);
    bool hasEnsemble() const { return ensemble_ != nullptr; }
    static constexpr int kEeIntervalColumn = static_cast<int>(Column::Count);
    const tl::BalanceSheet& sheet() const { return sheet_; }
    const tl::Model& model() const { return model_; }

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

    static int column(Column c) { return static_cast<int>(c); }
    // JSON key of `tledger solve --json` the column matches, or empty (DESIGN 5.3).
    static QString jsonKey(Column c);
    // Header without units, e.g. "B (input)"; the display header adds the unit line.
    static QString shortHeader(Column c);
    QString unit(Column c) const;

    // Rows as text: a header line, then one line per row, cells joined by `separator`.
    // Numbers at full precision (shortest round-trip), not the rounded display.
    QString toText(const std::vector<int>& rows, QChar separator) const;
    QString cellText(int row, Column c) const;  // full precision, "" when empty

    // Worst severity among the problems of row `row` (none: no problem).
    std::optional<Severity> worstSeverity(int row) const;

private:
    double value(int row, Column c) const;
    std::optional<double> input(int row, Column c) const;
    bool isSolved(int row, Column c) const;
    QString statusText(int row) const;
    QString statusToolTip(int row) const;

    QString intervalText(int row, const char* quantity) const;  // "0.31 – 0.72", or ""

    tl::Model model_;
    tl::BalanceSheet sheet_;
    std::shared_ptr<const tl::ensemble::EnsembleSummary> ensemble_;
    QString ensembleOrigin_;
    std::vector<std::vector<const Problem*>> rowProblems_;
};

}  // namespace tl::ui
