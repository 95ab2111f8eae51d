// RoutingTableModel: Detritus routing (DESIGN.md 3.1) — for each living compartment
// (row), the fraction of its non-predation mortality and egestion going to each
// detritus pool (column). A row left empty sends everything to the first pool; that
// default is shown in grey so it is never mistaken for an entered value.
#pragma once

#include "ui/tables/scenario_table_model.h"

namespace tl::ui {

class RoutingTableModel : public ScenarioTableModel {
    Q_OBJECT
public:
    explicit RoutingTableModel(ProjectDocument* doc, QObject* parent = nullptr);

    QVariant headerData(int section, Qt::Orientation orientation, int role) const override;
    QString cellName(int row, int column) const override;
    bool isEditable(int row, int column) const override;

    std::size_t sourceOf(int row) const { return rows_[std::size_t(row)]; }
    std::size_t poolOf(int column) const { return pools_[std::size_t(column)]; }
    int rowOfCompartment(std::size_t compartment) const;
    int sumColumn() const { return int(pools_.size()); }

protected:
    void indexModel(const tl::Model& m) override;
    QStringList rowKeys(const tl::Model& m) const override;
    QStringList columnKeys(const tl::Model& m) const override;
    QString cellText(const tl::Model& m, int row, int column) const override;
    QString applyText(tl::Model& m, int row, int column, const QString& text) const override;
    QVariant extraData(const tl::Model& m, int row, int column, int role) const override;

private:
    std::vector<std::size_t> rows_;   // living compartments
    std::vector<std::size_t> pools_;  // detritus pools
};

}  // namespace tl::ui
