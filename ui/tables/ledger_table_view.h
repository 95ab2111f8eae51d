// LedgerTableView: a QTableView that behaves like a spreadsheet for the workbench's
// ScenarioTableModels — type to overwrite, Enter moves down, Tab moves right to the
// next cell that takes typing (after naming a new row Enter moves right too), arrows
// move, Ctrl+C / Ctrl+V copy and paste tab-separated blocks (the way spreadsheets put
// them on the clipboard), Ctrl+D fills down, Delete clears. Every block edit is one
// undo step, and what could not be taken is reported cell by cell.
#pragma once

#include <QTableView>

#include "ui/tables/scenario_table_model.h"

namespace tl::ui {

class LedgerTableView : public QTableView {
    Q_OBJECT
public:
    explicit LedgerTableView(QWidget* parent = nullptr);

    ScenarioTableModel* ledgerModel() const;
    QList<QAction*> editActions() const { return editActions_; }

    // The width the cells of a column need, its header left out (the header wraps).
    int cellWidthHint(int column) const { return sizeHintForColumn(column); }

    void copySelection();
    void pasteClipboard();
    void fillDownSelection();
    void clearSelectedCells();  // empties the selected cells (one undo step); not QAbstractItemView::clearSelection
    // Sets the current cell and selects it (Checks panel navigation).
    void goToCell(int row, int column);
    // Row entry (a row just added): opens the first cell of `row` for typing; until the
    // cursor leaves the row, Enter moves on to the next cell of the row as Tab does.
    void startRowEntry(int row, int column = 0);
    int entryRow() const { return entryRow_; }

signals:
    // A block edit finished: the summary says what was taken and what was refused.
    void blockEdited(const tl::ui::BlockEditReport& report, const QString& action);

protected:
    void keyPressEvent(QKeyEvent* event) override;
    // Tab / Shift+Tab stop only at cells that take typing (ScenarioTableModel::takesTyping).
    QModelIndex moveCursor(CursorAction action, Qt::KeyboardModifiers modifiers) override;
    // Enter after typing: the next cell of the row in row entry, else the cell below.
    void closeEditor(QWidget* editor, QAbstractItemDelegate::EndEditHint hint) override;

private:
    QList<QAction*> editActions_;
    int entryRow_ = -1;
};

}  // namespace tl::ui
