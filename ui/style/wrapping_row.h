// WrappingRow: a row of buttons and small controls that continues on the next line
// when the page is too narrow for all of them, instead of forcing its width on the
// window (the editing pages' and results pages' action rows). Items keep their size
// hints; the layout reports height-for-width so the page grows by a line as needed.
#pragma once

#include <QLayout>
#include <QList>

namespace tl::ui {

class WrappingRow : public QLayout {
public:
    explicit WrappingRow(QWidget* parent = nullptr, int spacing = 6);
    ~WrappingRow() override;

    void addItem(QLayoutItem* item) override;
    int count() const override { return int(items_.size()); }
    QLayoutItem* itemAt(int index) const override { return items_.value(index); }
    QLayoutItem* takeAt(int index) override;

    Qt::Orientations expandingDirections() const override { return {}; }
    bool hasHeightForWidth() const override { return true; }
    int heightForWidth(int width) const override { return arrange(QRect(0, 0, width, 0), false); }
    QSize minimumSize() const override;  // the widest single item: never wider
    QSize sizeHint() const override;     // everything on one line
    void setGeometry(const QRect& rect) override;

private:
    int arrange(const QRect& rect, bool apply) const;  // returns the height used
    QList<QLayoutItem*> items_;
};

}  // namespace tl::ui
