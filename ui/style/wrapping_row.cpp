#include "ui/style/wrapping_row.h"

#include <QWidget>
#include <algorithm>

namespace tl::ui {

WrappingRow::WrappingRow(QWidget* parent, int spacing) : QLayout(parent)
{
    setSpacing(spacing);
    setContentsMargins(0, 0, 0, 0);
}

WrappingRow::~WrappingRow()
{
    while (QLayoutItem* item = takeAt(0)) delete item;
}

void WrappingRow::addItem(QLayoutItem* item) { items_.append(item); }

QLayoutItem* WrappingRow::takeAt(int index)
{
    if (index < 0 || index >= items_.size()) return nullptr;
    return items_.takeAt(index);
}

QSize WrappingRow::minimumSize() const
{
    QSize size;
    for (const QLayoutItem* item : items_)
        if (!item->isEmpty()) size = size.expandedTo(item->minimumSize());
    const QMargins m = contentsMargins();
    return size + QSize(m.left() + m.right(), m.top() + m.bottom());
}

QSize WrappingRow::sizeHint() const
{
    int width = 0, height = 0, visible = 0;
    for (const QLayoutItem* item : items_) {
        if (item->isEmpty()) continue;
        const QSize hint = item->sizeHint();
        width += hint.width();
        height = std::max(height, hint.height());
        ++visible;
    }
    const QMargins m = contentsMargins();
    return {width + std::max(0, visible - 1) * spacing() + m.left() + m.right(), height + m.top() + m.bottom()};
}

void WrappingRow::setGeometry(const QRect& rect)
{
    QLayout::setGeometry(rect);
    arrange(rect, true);
}

int WrappingRow::arrange(const QRect& rect, bool apply) const
{
    const QRect area = rect.marginsRemoved(contentsMargins());
    int x = area.x(), y = area.y(), lineHeight = 0;
    // Items of one line share its height and are centred in it vertically.
    QList<QPair<QLayoutItem*, QPoint>> line;
    auto flush = [&] {
        for (const auto& [item, at] : line) {
            const QSize hint = item->sizeHint();
            if (apply) item->setGeometry(QRect(QPoint(at.x(), at.y() + (lineHeight - hint.height()) / 2), hint));
        }
        line.clear();
    };
    for (QLayoutItem* item : items_) {
        if (item->isEmpty()) continue;
        const QSize hint = item->sizeHint();
        if (!line.isEmpty() && x + hint.width() > area.right() + 1) {
            flush();
            x = area.x();
            y += lineHeight + spacing();
            lineHeight = 0;
        }
        line.append({item, QPoint(x, y)});
        x += hint.width() + spacing();
        lineHeight = std::max(lineHeight, hint.height());
    }
    flush();
    const QMargins m = contentsMargins();
    return y + lineHeight - rect.y() + m.bottom();
}

}  // namespace tl::ui
