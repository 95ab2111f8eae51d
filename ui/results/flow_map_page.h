// Flow map page: the FlowMapScene in a zoomable, pannable view (wheel zooms around the
// cursor, dragging the background pans, dragging a box moves it), with a slider that
// hides flows below a threshold and a context menu to export the figure.
#pragma once

#include <QGraphicsView>

#include "ui/results/figure_export.h"
#include "ui/results/flow_map_scene.h"
#include "ui/results/results_pages.h"

class QLabel;
class QSlider;

namespace tl::ui {

class FlowMapView : public QGraphicsView {
    Q_OBJECT
public:
    explicit FlowMapView(QGraphicsScene* scene, QWidget* parent = nullptr);
    void zoomBy(double factor);

signals:
    void zoomedByUser();  // the wheel zoomed: the page stops fitting the map by itself

protected:
    void wheelEvent(QWheelEvent* event) override;
};

class FlowMapPage : public ResultsPage, public FigureSource {
    Q_OBJECT
public:
    explicit FlowMapPage(QWidget* parent = nullptr);

    void setScenario(const tl::Model& model, const tl::BalanceSheet& sheet) override;
    QString title() const override { return tr("Flow map"); }
    QString key() const override { return QStringLiteral("flow-map"); }

    FlowMapScene* scene() const { return scene_; }
    FlowMapView* view() const { return view_; }
    QSlider* thresholdSlider() const { return slider_; }

    // Box positions, for the workbench to store with the project (see FlowMapScene).
    QHash<QString, QPointF> positions() const { return scene_->positions(); }
    void setPositions(const QHash<QString, QPointF>& p) { scene_->setPositions(p); }
    QHash<QString, QPointF> movedPositions() const { return scene_->movedPositions(); }
    void replaceMovedPositions(const QHash<QString, QPointF>& moved);

    void fitToView();

    QSize figureSize() const override;
    void renderFigure(QPaintDevice& device, QSize size, double scale) override;
    QString figureTitle() const override { return titled(tr("Flow map")); }

signals:
    void positionsChanged();

protected:
    void showEvent(QShowEvent* event) override;
    void resizeEvent(QResizeEvent* event) override;

private:
    void applySlider(int value);

    FlowMapScene* scene_;
    FlowMapView* view_;
    QSlider* slider_;
    QLabel* thresholdLabel_;
    bool autoFit_ = true;  // fit the whole map after every change until the user zooms
};

}  // namespace tl::ui
