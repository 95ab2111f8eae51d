// Balance sheet page: the BalanceSheetModel in a sortable, filterable table, with the
// scenario's status (icon + text), a legend for the solved mark, copy as tab-separated
// text (Ctrl+C) and export as CSV (written atomically).
#pragma once

#include <QSortFilterProxyModel>

#include "ui/results/balance_sheet_model.h"
#include "ui/results/results_pages.h"

class QCheckBox;
class QComboBox;
class QLabel;
class QLineEdit;
class QTableView;

namespace tl::ui {

// Filters rows by name (case-insensitive substring), kind and "only with problems";
// sorts numbers by value with empty cells last.
class BalanceSheetFilter : public QSortFilterProxyModel {
    Q_OBJECT
public:
    using QSortFilterProxyModel::QSortFilterProxyModel;
    void setNameFilter(const QString& text);
    void setKindFilter(std::optional<CompartmentKind> kind);
    void setProblemsOnly(bool on);

protected:
    bool filterAcceptsRow(int sourceRow, const QModelIndex& sourceParent) const override;
    bool lessThan(const QModelIndex& left, const QModelIndex& right) const override;

private:
    QString name_;
    std::optional<CompartmentKind> kind_;
    bool problemsOnly_ = false;
};

class BalanceSheetPage : public ResultsPage {
    Q_OBJECT
public:
    explicit BalanceSheetPage(QWidget* parent = nullptr);

    void setScenario(const tl::Model& model, const tl::BalanceSheet& sheet) override;
    void setEnsembleBands(std::shared_ptr<const tl::ensemble::EnsembleSummary> summary, const QString& origin) override;
    QString title() const override { return tr("Balance sheet"); }
    QString key() const override { return QStringLiteral("balance-sheet"); }

    BalanceSheetModel* sheetModel() const { return model_; }
    BalanceSheetFilter* filter() const { return filter_; }
    QTableView* table() const { return table_; }
    // "Who takes its production": the uses of the current row's production (predators,
    // fleets, E, BA, from core/balance/production_uses.h), shown under the table.
    QString productionUsesText() const;

    // Selected rows (all visible rows when none is selected), in view order, as
    // tab-separated text with a header line; also put on the clipboard by copy().
    QString selectionAsText() const;
    void copy();
    // Writes the visible rows as CSV, atomically. Returns false and sets `error` on failure.
    bool exportCsv(const QString& path, QString* error) const;

private:
    void exportCsvInteractive();
    std::vector<int> chosenSourceRows(bool selectionOnly) const;
    void showProductionUses();

    BalanceSheetModel* model_;
    BalanceSheetFilter* filter_;
    QTableView* table_;
    QLabel* statusIcon_;
    QLabel* statusLabel_;
    QLineEdit* nameEdit_;
    QComboBox* kindCombo_;
    QCheckBox* problemsOnly_;
    QLabel* uses_;
};

}  // namespace tl::ui
