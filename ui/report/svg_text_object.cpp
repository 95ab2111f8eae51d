#include "ui/report/svg_text_object.h"

#include <QPainter>
#include <QSvgRenderer>

namespace tl::ui {
namespace {
constexpr int kSvgData = QTextFormat::UserProperty + 1;
constexpr int kSvgSize = QTextFormat::UserProperty + 2;
}  // namespace

QTextCharFormat SvgTextObject::format(const QByteArray& svg, const QSizeF& size)
{
    QTextCharFormat f;
    f.setObjectType(kType);
    f.setProperty(kSvgData, svg);
    f.setProperty(kSvgSize, size);
    return f;
}

QSizeF SvgTextObject::intrinsicSize(QTextDocument*, int, const QTextFormat& format)
{
    QSizeF size = format.property(kSvgSize).toSizeF();
    if (size.isEmpty()) return {1, 1};
    const double scale = std::min({1.0, maximum_.width() / size.width(), maximum_.height() / size.height()});
    return size * scale;
}

void SvgTextObject::drawObject(QPainter* painter, const QRectF& rect, QTextDocument*, int, const QTextFormat& format)
{
    QSvgRenderer renderer(format.property(kSvgData).toByteArray());
    if (renderer.isValid()) renderer.render(painter, rect);
}

}  // namespace tl::ui
