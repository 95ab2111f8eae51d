// HarvestTableModel: what each fleet takes (DESIGN.md 3.1) — one row per living
// compartment, three columns per fleet: landings and discards (currency/area/year) and
// the surviving fraction of discards. Y_i = landings + dead discards enters the mass
// balance (Model::totalCatch). An empty cell is 0.
#pragma once

#include "ui/tables/scenario_table_model.h"

namespace tl::ui {

class HarvestTableModel : public ScenarioTableModel {
    Q_OBJECT
public:
    enum class Field { Landings, Discards, Survival };
    static constexpr int kFieldsPerFleet = 3;

    explicit HarvestTableModel(ProjectDocument* doc, QObject* parent = nullptr);

    QVariant headerData(int section, Qt::Orientation orientation, int role) const override;
    QString cellName(int row, int column) const override;
    bool isEditable(int row, int column) const override;

    std::size_t compartmentOf(int row) const { return rows_[std::size_t(row)]; }
    int rowOfCompartment(std::size_t compartment) const;
    static int fleetOf(int column) { return column / kFieldsPerFleet; }
    static Field fieldOf(int column) { return Field(column % kFieldsPerFleet); }

    // Undoable fleet operations.
    QString addFleet(const QString& name, QString* why = nullptr);  // returns the name used
    bool renameFleet(int fleet, const QString& name, QString* why = nullptr);
    void removeFleet(int fleet);

protected:
    QStringList rowKeys(const tl::Model& m) const override;
    QStringList columnKeys(const tl::Model& m) const override;
    QString cellText(const tl::Model& m, int row, int column) const override;
    QString applyText(tl::Model& m, int row, int column, const QString& text) const override;
    QVariant extraData(const tl::Model& m, int row, int column, int role) const override;

private:
    std::vector<std::size_t> rows_;  // living compartment indices
};

// RoutingTableModel: Detritus routing (DESIGN.md 3.1) — for each living compartment
// (row), the fraction of its non-predation mortality and egestion going to each
// detritus pool (column). A row left empty sends everything to the first pool; that
// default is shown in grey so it is never mistaken for an entered value.
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
