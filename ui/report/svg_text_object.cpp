#include "ui/report/svg_text_object.h"

#include <QPainter>
#include <QSvgRenderer>
#include <QTextCursor>
#include <QTextDocument>

#include "core/io/html_report.h"

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

void placeReportFigures(QTextDocument& doc, const tl::HtmlReport& report)
{
    for (std::size_t k = 0; k < report.figures.size(); ++k) {
        if (report.figures[k].svg.empty()) continue;
        QTextCursor at = doc.find(QString::fromStdString(tl::figureMarker(k)));
        if (at.isNull()) continue;
        at.insertText(QString(QChar::ObjectReplacementCharacter),
                      SvgTextObject::format(QByteArray::fromStdString(report.figures[k].svg),
                                            QSizeF(report.figures[k].width, report.figures[k].height)));
    }
}

}  // namespace tl::ui
