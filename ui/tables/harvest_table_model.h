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
    void indexModel(const tl::Model& m) override;
    QStringList rowKeys(const tl::Model& m) const override;
    QStringList columnKeys(const tl::Model& m) const override;
    QString cellText(const tl::Model& m, int row, int column) const override;
    QString applyText(tl::Model& m, int row, int column, const QString& text) const override;
    QVariant extraData(const tl::Model& m, int row, int column, int role) const override;

private:
    std::vector<std::size_t> rows_;  // living compartment indices
};

}  // namespace tl::ui
