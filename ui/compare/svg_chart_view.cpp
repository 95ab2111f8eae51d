#include "ui/compare/svg_chart_view.h"

#include <QPainter>
#include <QResizeEvent>
#include <QSvgRenderer>
#include <QVBoxLayout>

namespace tl::ui {

SvgChartView::SvgChartView(QWidget* parent) : QWidget(parent), renderer_(new QSvgRenderer(this)), caption_(new QLabel(this))
{
    caption_->setWordWrap(true);
    caption_->setObjectName(QStringLiteral("chartCaption"));
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(8, 8, 8, 8);
    layout->addStretch(1);
    layout->addWidget(caption_);
    setBackgroundRole(QPalette::Base);
    setAutoFillBackground(true);
}

void SvgChartView::setFigure(const tl::SvgFigure& figure)
{
    figure_ = figure;
    renderer_->load(QByteArray::fromStdString(figure.svg));
    caption_->setText(QString::fromStdString(figure.caption));
    setMinimumHeight(heightForWidth(std::max(width(), 400)));  // layouts in a scroll area ignore height-for-width
    updateGeometry();
    update();
}

QRectF SvgChartView::chartRect() const
{
    if (figure_.svg.empty() || figure_.width <= 0) return {};
    const double available = width() - 16.0;
    const double scale = std::min(1.0, available / figure_.width);
    return QRectF(8, 8, figure_.width * scale, figure_.height * scale);
}

int SvgChartView::heightForWidth(int width) const
{
    const double scale = figure_.width > 0 ? std::min(1.0, (width - 16.0) / figure_.width) : 0.0;
    return static_cast<int>(figure_.height * scale) + 16 + caption_->heightForWidth(width - 16) + 8;
}

QSize SvgChartView::sizeHint() const
{
    const int w = static_cast<int>(figure_.width) + 16;
    return {w, heightForWidth(w)};
}

void SvgChartView::resizeEvent(QResizeEvent* event)
{
    QWidget::resizeEvent(event);
    const int needed = heightForWidth(width());
    if (needed != minimumHeight()) setMinimumHeight(needed);
}

void SvgChartView::paintEvent(QPaintEvent*)
{
    const QRectF r = chartRect();
    if (r.isEmpty() || !renderer_->isValid()) return;
    QPainter p(this);
    p.setRenderHint(QPainter::Antialiasing);
    renderer_->render(&p, r);
}

}  // namespace tl::ui
