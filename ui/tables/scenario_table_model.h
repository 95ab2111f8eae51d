// ScenarioTableModel: the common ground of the workbench's editing tables, each a
// QAbstractTableModel adapter over the current scenario's tl::Model held by a
// ProjectDocument. A subclass says what its cells are (rowKeys/columnKeys, cellText,
// applyText); this base turns every change — one cell, a pasted block, fill down,
// clearing — into ONE undoable ModelEditCommand on a copy of the model, and refuses
// text it cannot take with a sentence naming the cell and what it expects.
//
// An empty cell means "unknown" (DESIGN.md 3.1): clearing a cell never writes 0.
#pragma once

#include <QAbstractTableModel>
#include <QModelIndexList>
#include <QStringList>
#include <vector>

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"

namespace tl::ui {

class ProjectDocument;

// What a paste, fill or clear could not take, cell by cell.
struct CellRefusal {
    int row = 0, column = 0;
    QString text;    // the text offered
    QString reason;  // why it was refused: names the cell and what is expected
};

struct BlockEditReport {
    int taken = 0;
    int outside = 0;  // cells of the pasted block that fell outside the table
    std::vector<CellRefusal> refused;
    bool ok() const { return refused.empty() && outside == 0; }
    QString summary() const;  // one paragraph for the status bar or a message box
};

class ScenarioTableModel : public QAbstractTableModel {
    Q_OBJECT
public:
    explicit ScenarioTableModel(ProjectDocument* doc, QObject* parent = nullptr);

    ProjectDocument* document() const { return doc_; }
    // The latest solved state: shown as grey, italic values in cells left unknown.
    void setBalanceSheet(const tl::BalanceSheet& sheet);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role) const override;
    bool setData(const QModelIndex& index, const QVariant& value, int role = Qt::EditRole) override;
    Qt::ItemFlags flags(const QModelIndex& index) const override;

    // Block edits, each one undo step.
    BlockEditReport pasteText(const QModelIndex& topLeft, const QString& tabSeparated);
    BlockEditReport fillDown(const QModelIndexList& selection);
    BlockEditReport clearCells(const QModelIndexList& selection);
    QString copyText(const QModelIndexList& selection) const;  // tab-separated, rows by line

    QString lastRefusal() const { return lastRefusal_; }

    // Shortest text that reads back to exactly `v`, in plain notation for the magnitudes
    // of field data ("20", "150", "0.025"); exponents only beyond 1e-6 .. 1e15.
    static QString numberText(double v);

    // Name of a cell for messages and undo texts, e.g. "B of Zooplankton".
    virtual QString cellName(int row, int column) const = 0;
    virtual bool isEditable(int row, int column) const = 0;
    // Cells that Tab and Enter stop at while typing: editable ones, unless chosen from a
    // list (a compartment's kind) rather than typed.
    virtual bool takesTyping(int row, int column) const { return isEditable(row, column); }

signals:
    // A typed value was refused; the model is unchanged.
    void inputRefused(const QString& message);

protected:
    // Caches what the other hooks need from `m` (e.g. which compartment each row shows);
    // called first on every refresh.
    virtual void indexModel(const tl::Model& m);
    // Identity of the rows and columns (e.g. compartment names): when it changes the
    // view is reset; otherwise only the values are refreshed, keeping the selection.
    virtual QStringList rowKeys(const tl::Model& m) const = 0;
    virtual QStringList columnKeys(const tl::Model& m) const = 0;
    // Display and edit text of a cell (empty = unknown or zero as the table defines).
    virtual QString cellText(const tl::Model& m, int row, int column) const = 0;
    // Writes `text` into the model copy, or returns why it cannot (the copy may then be
    // partly changed; the caller discards it).
    virtual QString applyText(tl::Model& m, int row, int column, const QString& text) const = 0;
    // Optional extras for the view.
    virtual QVariant extraData(const tl::Model& m, int row, int column, int role) const;

    const tl::Model& model() const;
    const tl::BalanceSheet& sheet() const { return sheet_; }
    // For tables whose rows are compartments: the row header of compartment `c` (its
    // name, with its kind's icon), and the row showing `c` in `rows` (or -1).
    QVariant compartmentHeader(std::size_t c, int role) const;
    static int rowOf(const std::vector<std::size_t>& rows, std::size_t c);
    // Re-reads the row and column identity (call after the subclass changes its layout).
    void refreshFromDocument();

    // Shared numeric parsing: empty -> nullopt, a number -> value, else a reason.
    struct Parsed {
        std::optional<double> value;
        QString error;
    };
    static Parsed parseCell(const QString& text, const QString& cell, bool allowEmpty, double min, double max);

private:
    BlockEditReport applyBlock(const std::vector<std::tuple<int, int, QString>>& cells, const QString& undoText);

    ProjectDocument* doc_;
    QStringList rowKeys_, columnKeys_;
    tl::BalanceSheet sheet_;
    QString lastRefusal_;
};

}  // namespace tl::ui
