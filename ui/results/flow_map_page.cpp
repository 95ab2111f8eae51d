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
    event->accept();
}

FlowMapPage::FlowMapPage(QWidget* parent)
    : ResultsPage(parent), scene_(new FlowMapScene(this)), view_(new FlowMapView(scene_, this)),
      slider_(new QSlider(Qt::Horizontal, this)), thresholdLabel_(new QLabel(this))
{
    slider_->setRange(0, kSliderSteps);
    slider_->setToolTip(tr("Hide flows below a threshold (logarithmic)"));
    thresholdLabel_->setMinimumWidth(260);
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
    connect(fit, &QPushButton::clicked, this, &FlowMapPage::fitToView);
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
    if (!fitted_ && isVisible()) {
        fitToView();
        fitted_ = true;
    }
}

void FlowMapPage::showEvent(QShowEvent* event)
{
    ResultsPage::showEvent(event);
    if (!fitted_) {  // the first time the map is seen, show all of it
        fitToView();
        fitted_ = true;
    }
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

void FlowMapPage::fitToView()
{
    view_->fitInView(scene_->figureRect(), Qt::KeepAspectRatio);
}

QSize FlowMapPage::figureSize() const
{
    const QRectF r = scene_->figureRect();
    return QSize(static_cast<int>(std::ceil(r.width())), static_cast<int>(std::ceil(r.height())));
}

void FlowMapPage::renderFigure(QPaintDevice& device, QSize size, double scale)
{
    const auto highlighted = scene_->highlighted();
    scene_->highlight(std::nullopt);
    QPainter painter(&device);
    painter.setRenderHints(QPainter::Antialiasing | QPainter::TextAntialiasing);
    painter.scale(scale, scale);
    painter.fillRect(QRectF(QPointF(0, 0), QSizeF(size)), Qt::white);
    scene_->render(&painter, QRectF(QPointF(0, 0), QSizeF(size)), scene_->figureRect(), Qt::KeepAspectRatio);
    painter.end();
    scene_->highlight(highlighted);
}

}  // namespace tl::ui
