#include "ui/results/flow_map_page.h"

#include <QHBoxLayout>
#include <QLabel>
#include <QMenu>
#include <QPushButton>
#include <QSlider>
#include <QVBoxLayout>
#include <QWheelEvent>
#include <cmath>

namespace tl::ui {
namespace {
constexpr int kSliderSteps = 1000;
constexpr int kTitleBand = 34;  // exported figures: the title above the map, in logical pixels
}

FlowMapView::FlowMapView(QGraphicsScene* scene, QWidget* parent) : QGraphicsView(scene, parent)
{
    setRenderHints(QPainter::Antialiasing | QPainter::TextAntialiasing | QPainter::SmoothPixmapTransform);
    setDragMode(QGraphicsView::ScrollHandDrag);
    setTransformationAnchor(QGraphicsView::AnchorUnderMouse);
    setResizeAnchor(QGraphicsView::AnchorViewCenter);
    setViewportUpdateMode(QGraphicsView::BoundingRectViewportUpdate);
    setBackgroundBrush(Qt::white);
}

void FlowMapView::zoomBy(double factor)
{
    const double current = transform().m11();
    const double next = std::clamp(current * factor, 0.05, 20.0);
    scale(next / current, next / current);
}

void FlowMapView::wheelEvent(QWheelEvent* event)
{
    const double steps = event->angleDelta().y() / 120.0;
    if (steps == 0) return QGraphicsView::wheelEvent(event);
    zoomBy(std::pow(1.15, steps));
    emit zoomedByUser();
    event->accept();
}

FlowMapPage::FlowMapPage(QWidget* parent)
    : ResultsPage(parent), scene_(new FlowMapScene(this)), view_(new FlowMapView(scene_, this)),
      slider_(new QSlider(Qt::Horizontal, this)), thresholdLabel_(new QLabel(this))
{
    slider_->setRange(0, kSliderSteps);
    slider_->setToolTip(tr("Hide flows below a threshold (logarithmic)"));
    thresholdLabel_->setMinimumWidth(150);
    auto* fit = new QPushButton(tr("Fit"), this);
    fit->setToolTip(tr("Zoom to show the whole map"));
    auto* reset = new QPushButton(tr("Reset layout"), this);
    reset->setToolTip(tr("Put every box back where the automatic layout places it"));

    auto* controls = new QHBoxLayout;
    controls->addWidget(new QLabel(tr("Hide small flows"), this));
    controls->addWidget(slider_, 1);
    controls->addWidget(thresholdLabel_);
    controls->addWidget(fit);
    controls->addWidget(reset);
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(controls);
    layout->addWidget(view_, 1);

    view_->setContextMenuPolicy(Qt::CustomContextMenu);
    connect(view_, &QWidget::customContextMenuRequested, this, [this](QPoint at) {
        QMenu menu(this);
        menu.addAction(tr("Zoom to fit"), this, &FlowMapPage::fitToView);
        menu.addSeparator();
        addFigureExportActions(menu, *this, this);
        menu.exec(view_->viewport()->mapToGlobal(at));
    });
    connect(slider_, &QSlider::valueChanged, this, &FlowMapPage::applySlider);
    connect(fit, &QPushButton::clicked, this, [this] {
        autoFit_ = true;
        fitToView();
    });
    connect(view_, &FlowMapView::zoomedByUser, this, [this] { autoFit_ = false; });
    connect(reset, &QPushButton::clicked, this, [this] {
        scene_->resetLayout();
        applySlider(slider_->value());
        emit positionsChanged();
    });
    connect(scene_, &FlowMapScene::positionsChanged, this, &FlowMapPage::positionsChanged);
    connect(scene_, &FlowMapScene::nodeActivated, this, &ResultsPage::compartmentActivated);
    applySlider(0);
}

void FlowMapPage::setScenario(const tl::Model& model, const tl::BalanceSheet& sheet)
{
    scene_->setScenario(model, sheet);
    applySlider(slider_->value());
    if (autoFit_ && isVisible()) fitToView();
}

// Until the user zooms with the wheel, the whole map stays in view: when first shown,
// after every change of scenario and when the window is resized.
void FlowMapPage::showEvent(QShowEvent* event)
{
    ResultsPage::showEvent(event);
    if (autoFit_) fitToView();
}

void FlowMapPage::resizeEvent(QResizeEvent* event)
{
    ResultsPage::resizeEvent(event);
    if (autoFit_ && isVisible()) fitToView();
}

void FlowMapPage::applySlider(int value)
{
    const double lo = scene_->minFlow(), hi = scene_->maxFlow();
    double threshold = 0.0;
    if (value > 0 && lo > 0 && hi > lo) threshold = lo * std::pow(hi / lo, static_cast<double>(value) / kSliderSteps);
    scene_->setThreshold(threshold);
    const QString unit = scene_->flowUnit();
    thresholdLabel_->setText(threshold > 0 ? tr("below %1 %2 hidden (%3 shown)").arg(QString::number(threshold, 'g', 3), unit)
                                                  .arg(scene_->visibleRibbonCount())
                                           : tr("all %1 flows shown").arg(scene_->visibleRibbonCount()));
}

void FlowMapPage::replaceMovedPositions(const QHash<QString, QPointF>& moved)
{
    scene_->replaceMovedPositions(moved);
    applySlider(slider_->value());
    if (autoFit_ && isVisible()) fitToView();
}

void FlowMapPage::fitToView()
{
    view_->fitInView(scene_->figureRect(), Qt::KeepAspectRatio);
}

QSize FlowMapPage::figureSize() const
{
    const QRectF r = scene_->figureRect();
    return QSize(static_cast<int>(std::ceil(r.width())), static_cast<int>(std::ceil(r.height())) + kTitleBand);
}

void FlowMapPage::renderFigure(QPaintDevice& device, QSize size, double scale)
{
    const auto highlighted = scene_->highlighted();
    scene_->highlight(std::nullopt);
    QPainter painter(&device);
    painter.setRenderHints(QPainter::Antialiasing | QPainter::TextAntialiasing);
    painter.scale(scale, scale);
    painter.fillRect(QRectF(QPointF(0, 0), QSizeF(size)), Qt::white);
    // Title band on top (what, which scenario, which project), the map below it.
    QFont heading = font();
    heading.setPointSizeF(11);
    heading.setBold(true);
    painter.setFont(heading);
    painter.setPen(Qt::black);
    const QRectF band(12, 4, size.width() - 24, kTitleBand - 8);
    painter.drawText(band, Qt::AlignLeft | Qt::AlignVCenter | Qt::TextSingleLine,
                     QFontMetricsF(heading).elidedText(figureTitle(), Qt::ElideRight, band.width()));
    const QRectF map(0, kTitleBand, size.width(), std::max(1, size.height() - kTitleBand));
    scene_->render(&painter, map, scene_->figureRect(), Qt::KeepAspectRatio);
    painter.end();
    scene_->highlight(highlighted);
}

}  // namespace tl::ui
