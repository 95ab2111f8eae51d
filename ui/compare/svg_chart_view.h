// A report chart (core/io/report_svg.h) on screen: the same SVG the HTML report embeds
// and the PDF draws, painted by QSvgRenderer at its natural size (or smaller, to fit the
// width), with its caption underneath. Put it in a QScrollArea for tall charts.
#pragma once

#include <QLabel>
#include <QWidget>

#include "core/io/report_svg.h"

class QSvgRenderer;

namespace tl::ui {

class SvgChartView : public QWidget {
    Q_OBJECT
public:
    explicit SvgChartView(QWidget* parent = nullptr);
    void setFigure(const tl::SvgFigure& figure);
    const tl::SvgFigure& figure() const { return figure_; }

    QSize sizeHint() const override;
    bool hasHeightForWidth() const override { return true; }
    int heightForWidth(int width) const override;

protected:
    void paintEvent(QPaintEvent* event) override;
    void resizeEvent(QResizeEvent* event) override;

private:
    QRectF chartRect() const;
    tl::SvgFigure figure_;
    QSvgRenderer* renderer_;
    QLabel* caption_;
};

}  // namespace tl::ui
