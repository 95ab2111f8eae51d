// CompartmentTableModel: one row per compartment, columns Name, Kind and the
// parameters of compartments.csv (DESIGN.md 3.1, 5.1) with their units in the header.
// Unknown values are empty; once solved, the solved value is shown grey and italic.
// Structural edits (add, remove, move) are undoable ModelEditCommands like cell edits.
#pragma once

#include <optional>

#include "core/model/compartment.h"
#include "ui/tables/scenario_table_model.h"

namespace tl::ui {

class CompartmentTableModel : public ScenarioTableModel {
    Q_OBJECT
public:
    static constexpr int kNameColumn = 0;
    static constexpr int kKindColumn = 1;
    static constexpr int kFirstParamColumn = 2;

    explicit CompartmentTableModel(ProjectDocument* doc, QObject* parent = nullptr);

    QVariant headerData(int section, Qt::Orientation orientation, int role) const override;
    QString cellName(int row, int column) const override;
    bool isEditable(int row, int column) const override;
    bool takesTyping(int row, int column) const override;  // the kind is chosen from a list

    static int columnOf(tl::Param p) { return kFirstParamColumn + static_cast<int>(p); }
    static std::optional<tl::Param> paramOf(int column);
    // Unit text of a parameter in the model's units ("t wet weight/km²", "/year", "").
    static QString unitOf(const tl::Model& m, tl::Param p);

    // Undoable structure edits; each returns the row now holding the compartment.
    int addCompartment(int at, tl::CompartmentKind kind);
    void removeCompartments(QList<int> rows);
    int moveCompartment(int row, int delta);
    QString uniqueName(const QString& stem) const;
    // Why `name` cannot name the compartment on `row` (empty, or the same as another's
    // up to case and spaces), or empty when it can. Names are trimmed before use.
    static QString nameRefusal(const tl::Model& m, int row, const QString& name);

protected:
    QStringList rowKeys(const tl::Model& m) const override;
    QStringList columnKeys(const tl::Model& m) const override;
    QString cellText(const tl::Model& m, int row, int column) const override;
    QString applyText(tl::Model& m, int row, int column, const QString& text) const override;
    QVariant extraData(const tl::Model& m, int row, int column, int role) const override;
};

}  // namespace tl::ui
