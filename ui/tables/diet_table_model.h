// DietTableModel: the Diet matrix (DESIGN.md 3.1) as a crew writes it down — one row
// per predator (each consumer), one column per prey in compartment order, then the
// `import` column (food taken outside the modelled area) and, at the right end, the
// row's sum with a status icon and a word: each row should sum to 1 within the
// project's tolerance (Model::rules.dietSumTolerance). An empty cell is 0.
#pragma once

#include <vector>

#include "ui/tables/scenario_table_model.h"

namespace tl::ui {

class DietTableModel : public ScenarioTableModel {
    Q_OBJECT
public:
    explicit DietTableModel(ProjectDocument* doc, QObject* parent = nullptr);

    QVariant headerData(int section, Qt::Orientation orientation, int role) const override;
    QString cellName(int row, int column) const override;
    bool isEditable(int row, int column) const override;

    int importColumn() const { return int(model().size()); }
    int sumColumn() const { return int(model().size()) + 1; }
    // Model index of the predator on a row, and the row of a predator (or -1).
    std::size_t predatorOf(int row) const { return predators_[std::size_t(row)]; }
    int rowOfPredator(std::size_t compartment) const;
    // Prey columns (compartment indices) that some predator eats.
    std::vector<bool> usedPrey() const;

    // Undoable: scales a row so that it sums to 1 (refuses an all-zero row).
    bool normaliseRow(int row, QString* why = nullptr);

protected:
    void indexModel(const tl::Model& m) override;
    QStringList rowKeys(const tl::Model& m) const override;
    QStringList columnKeys(const tl::Model& m) const override;
    QString cellText(const tl::Model& m, int row, int column) const override;
    QString applyText(tl::Model& m, int row, int column, const QString& text) const override;
    QVariant extraData(const tl::Model& m, int row, int column, int role) const override;

private:
    std::vector<std::size_t> predators_;  // consumer indices, in compartment order
};

}  // namespace tl::ui
