#include "ui/tables/cell_delegates.h"

#include <QComboBox>
#include <QLineEdit>

#include "core/model/compartment.h"
#include "ui/style/palette.h"

namespace tl::ui {

QWidget* KindDelegate::createEditor(QWidget* parent, const QStyleOptionViewItem&, const QModelIndex&) const
{
    auto* box = new QComboBox(parent);
    for (auto k : {tl::CompartmentKind::Producer, tl::CompartmentKind::Consumer, tl::CompartmentKind::Detritus})
        box->addItem(kindIcon(k), kindLabel(k), QString::fromUtf8(tl::kindKey(k).data(), qsizetype(tl::kindKey(k).size())));
    return box;
}

void KindDelegate::setEditorData(QWidget* editor, const QModelIndex& index) const
{
    auto* box = static_cast<QComboBox*>(editor);
    const int i = box->findData(index.data(Qt::EditRole).toString());
    box->setCurrentIndex(std::max(0, i));
}

void KindDelegate::setModelData(QWidget* editor, QAbstractItemModel* model, const QModelIndex& index) const
{
    auto* box = static_cast<QComboBox*>(editor);
    model->setData(index, box->currentData().toString(), Qt::EditRole);
}

QWidget* NumberDelegate::createEditor(QWidget* parent, const QStyleOptionViewItem&, const QModelIndex&) const
{
    auto* edit = new QLineEdit(parent);
    edit->setAlignment(Qt::AlignRight);
    edit->setPlaceholderText(tr("empty = unknown"));
    return edit;
}

void NumberDelegate::setEditorData(QWidget* editor, const QModelIndex& index) const
{
    static_cast<QLineEdit*>(editor)->setText(index.data(Qt::EditRole).toString());
}

}  // namespace tl::ui
