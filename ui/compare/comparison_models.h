// Table models over a scenario comparison (core/compare/scenario_comparison.h) for the
// Compare page: the inputs that differ, and the outputs side by side with their change
// against the reference. Views only: every number comes from core/compare. A change is
// shown by an arrow icon and text ("▲ +25 %", "▼ -3 %", "= 0 %"), never by colour alone.
#pragma once

#include <QAbstractTableModel>
#include <QStringList>

#include "core/compare/scenario_comparison.h"

namespace tl::ui {

class InputDifferencesModel : public QAbstractTableModel {
    Q_OBJECT
public:
    using QAbstractTableModel::QAbstractTableModel;
    void setComparison(const tl::ScenarioComparison* comparison);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

    // Columns: compartment, input, one per scenario, what differs, source notes.
    static constexpr int kFirstScenarioColumn = 2;
    // The scenario a column shows, or -1.
    int scenarioOfColumn(int column) const;
    const tl::InputDifference* row(int r) const;

private:
    const tl::ScenarioComparison* c_ = nullptr;
};

class ComparedOutputsModel : public QAbstractTableModel {
    Q_OBJECT
public:
    using QAbstractTableModel::QAbstractTableModel;
    void setComparison(const tl::ScenarioComparison* comparison);
    void setOnlyDiffering(bool only);
    bool onlyDiffering() const { return only_; }

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

    // Columns: subject, output, unit, one value per scenario, one change per scenario
    // after the reference.
    static constexpr int kFirstValueColumn = 3;
    int scenarioOfColumn(int column) const;  // the scenario a value or change column is about, or -1
    const tl::ComparedOutput* row(int r) const;

    // "▲ +25 %" and the like: the change of scenario s (>= 1) as a person reads it.
    static QString changeText(const tl::OutputDifference& d);

private:
    void rebuild();
    const tl::ScenarioComparison* c_ = nullptr;
    bool only_ = true;
    std::vector<int> rows_;  // indices into c_->outputs
};

}  // namespace tl::ui
