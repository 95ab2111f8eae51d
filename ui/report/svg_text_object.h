// A chart inside Qt rich text: an object character whose format carries the SVG, drawn
// by QSvgRenderer (vector paths and text) at a size that fits the page. Used by the PDF
// report (report_pdf.cpp) and the report preview.
#pragma once

#include <QObject>
#include <QSizeF>
#include <QTextCharFormat>
#include <QTextObjectInterface>

namespace tl {
struct HtmlReport;
}

class QTextDocument;

namespace tl::ui {

class SvgTextObject : public QObject, public QTextObjectInterface {
    Q_OBJECT
    Q_INTERFACES(QTextObjectInterface)

public:
    static constexpr int kType = QTextFormat::UserObject + 16;
    explicit SvgTextObject(QObject* parent = nullptr) : QObject(parent) {}

    // The format of one object character holding `svg`, drawn at `size` (CSS pixels) or
    // smaller.
    static QTextCharFormat format(const QByteArray& svg, const QSizeF& size);
    // Figures wider or taller than this are scaled down, keeping their proportions.
    void setMaximumSize(const QSizeF& size) { maximum_ = size; }

    QSizeF intrinsicSize(QTextDocument* doc, int posInDocument, const QTextFormat& format) override;
    void drawObject(QPainter* painter, const QRectF& rect, QTextDocument* doc, int posInDocument,
                    const QTextFormat& format) override;

private:
    QSizeF maximum_{680, 900};
};

// Replaces each figure marker of `report` (made with ReportOptions::figureMarkers) in
// `doc`, laid out from report.html, by an SVG object; `doc`'s layout needs an
// SvgTextObject registered for SvgTextObject::kType.
void placeReportFigures(QTextDocument& doc, const tl::HtmlReport& report);

}  // namespace tl::ui
