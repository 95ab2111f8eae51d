#include "ui/tables/ledger_table_view.h"

#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QHeaderView>
#include <QKeyEvent>
#include <QMimeData>

namespace tl::ui {

LedgerTableView::LedgerTableView(QWidget* parent) : QTableView(parent)
{
    setSelectionMode(QAbstractItemView::ExtendedSelection);
    setSelectionBehavior(QAbstractItemView::SelectItems);
    setEditTriggers(QAbstractItemView::DoubleClicked | QAbstractItemView::EditKeyPressed |
                    QAbstractItemView::AnyKeyPressed);
    setContextMenuPolicy(Qt::ActionsContextMenu);
    horizontalHeader()->setDefaultAlignment(Qt::Alignment(Qt::AlignCenter | Qt::TextWordWrap));
    horizontalHeader()->setMinimumSectionSize(64);
    verticalHeader()->setDefaultSectionSize(24);
    setWordWrap(false);
    setCornerButtonEnabled(true);

    auto add = [this](const QString& text, const QKeySequence& key, void (LedgerTableView::*slot)()) {
        auto* a = new QAction(text, this);
        a->setShortcut(key);
        a->setShortcutContext(Qt::WidgetShortcut);  // the window's Edit menu owns the global ones
        connect(a, &QAction::triggered, this, slot);
        addAction(a);
        editActions_ << a;
    };
    add(tr("Copy"), QKeySequence::Copy, &LedgerTableView::copySelection);
    add(tr("Paste"), QKeySequence::Paste, &LedgerTableView::pasteClipboard);
    add(tr("Fill down"), QKeySequence(Qt::CTRL | Qt::Key_D), &LedgerTableView::fillDownSelection);
    add(tr("Clear"), QKeySequence::Delete, &LedgerTableView::clearSelectedCells);
}

ScenarioTableModel* LedgerTableView::ledgerModel() const { return qobject_cast<ScenarioTableModel*>(model()); }

void LedgerTableView::copySelection()
{
    if (auto* m = ledgerModel()) QApplication::clipboard()->setText(m->copyText(selectedIndexes()));
}

void LedgerTableView::pasteClipboard()
{
    auto* m = ledgerModel();
    if (!m) return;
    const QString text = QApplication::clipboard()->text();
    if (text.isEmpty()) return;
    // The block starts at the top-left of the selection (or the current cell).
    QModelIndex topLeft = currentIndex();
    for (const QModelIndex& i : selectedIndexes())
        if (!topLeft.isValid() || i.row() < topLeft.row() || (i.row() == topLeft.row() && i.column() < topLeft.column()))
            topLeft = i;
    const BlockEditReport report = m->pasteText(topLeft, text);
    emit blockEdited(report, tr("Paste"));
}

void LedgerTableView::fillDownSelection()
{
    if (auto* m = ledgerModel()) emit blockEdited(m->fillDown(selectedIndexes()), tr("Fill down"));
}

void LedgerTableView::clearSelectedCells()
{
    if (auto* m = ledgerModel()) emit blockEdited(m->clearCells(selectedIndexes()), tr("Clear"));
}

void LedgerTableView::goToCell(int row, int column)
{
    if (!model()) return;
    const QModelIndex i = model()->index(std::max(0, row), std::max(0, column));
    if (!i.isValid()) return;
    setCurrentIndex(i);
    selectionModel()->select(i, QItemSelectionModel::ClearAndSelect);
    scrollTo(i);
    setFocus();
}

void LedgerTableView::startRowEntry(int row, int column)
{
    goToCell(row, column);
    entryRow_ = currentIndex().isValid() ? currentIndex().row() : -1;
    if (entryRow_ >= 0) edit(currentIndex());
}

QModelIndex LedgerTableView::moveCursor(CursorAction action, Qt::KeyboardModifiers modifiers)
{
    ScenarioTableModel* m = ledgerModel();
    const QModelIndex current = currentIndex();
    if (!m || !current.isValid() || (action != MoveNext && action != MovePrevious))
        return QTableView::moveCursor(action, modifiers);
    // Row by row, as QTableView moves, wrapping at the ends; hidden cells are passed over.
    const int rows = m->rowCount(), cols = m->columnCount();
    const int step = action == MoveNext ? 1 : -1;
    int r = current.row(), c = current.column();
    for (int k = 0; k < rows * cols; ++k) {
        c += step;
        if (c >= cols) c = 0, r = (r + 1) % rows;
        if (c < 0) c = cols - 1, r = (r - 1 + rows) % rows;
        if (isRowHidden(r) || isColumnHidden(c)) continue;
        if (m->takesTyping(r, c)) return m->index(r, c);
    }
    return current;
}

void LedgerTableView::closeEditor(QWidget* editor, QAbstractItemDelegate::EndEditHint hint)
{
    const QModelIndex at = currentIndex();
    const bool enter = hint == QAbstractItemDelegate::SubmitModelCache;
    if (enter && entryRow_ >= 0 && at.row() == entryRow_) hint = QAbstractItemDelegate::EditNextItem;
    QTableView::closeEditor(editor, enter && hint != QAbstractItemDelegate::EditNextItem ? QAbstractItemDelegate::NoHint : hint);
    if (hint == QAbstractItemDelegate::RevertModelCache || currentIndex().row() != entryRow_) entryRow_ = -1;
    // Enter outside row entry: down one row, as in a spreadsheet (typing there starts an edit).
    if (enter && hint != QAbstractItemDelegate::EditNextItem && at.isValid() && at.row() + 1 < model()->rowCount())
        goToCell(at.row() + 1, at.column());
}

void LedgerTableView::keyPressEvent(QKeyEvent* event)
{
    if (state() != QAbstractItemView::EditingState) {
        if (event->matches(QKeySequence::Paste)) return pasteClipboard();
        if (event->matches(QKeySequence::Copy)) return copySelection();
        if (event->matches(QKeySequence::Delete) || event->key() == Qt::Key_Backspace) return clearSelectedCells();
        if (event->key() == Qt::Key_D && event->modifiers() == Qt::ControlModifier) return fillDownSelection();
        if ((event->key() == Qt::Key_Return || event->key() == Qt::Key_Enter) && event->modifiers() == Qt::NoModifier) {
            // Enter moves down, as in a spreadsheet (F2 edits in place).
            const QModelIndex c = currentIndex();
            if (c.isValid() && c.row() + 1 < model()->rowCount()) goToCell(c.row() + 1, c.column());
            return;
        }
    }
    QTableView::keyPressEvent(event);
}

}  // namespace tl::ui
