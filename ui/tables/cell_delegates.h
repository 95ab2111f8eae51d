// Cell editors: the kind of a compartment is chosen from a list (producer, consumer,
// detritus pool) rather than typed; numeric cells use a plain line edit whose text the
// table model parses — and refuses with a sentence naming the cell and what it expects.
// After a committed edit the cursor moves down, as in a spreadsheet.
#pragma once

#include <QStyledItemDelegate>

namespace tl::ui {

class KindDelegate : public QStyledItemDelegate {
    Q_OBJECT
public:
    using QStyledItemDelegate::QStyledItemDelegate;
    QWidget* createEditor(QWidget* parent, const QStyleOptionViewItem& option, const QModelIndex& index) const override;
    void setEditorData(QWidget* editor, const QModelIndex& index) const override;
    void setModelData(QWidget* editor, QAbstractItemModel* model, const QModelIndex& index) const override;
};

class NumberDelegate : public QStyledItemDelegate {
    Q_OBJECT
public:
    using QStyledItemDelegate::QStyledItemDelegate;
    QWidget* createEditor(QWidget* parent, const QStyleOptionViewItem& option, const QModelIndex& index) const override;
    void setEditorData(QWidget* editor, const QModelIndex& index) const override;
};

}  // namespace tl::ui
