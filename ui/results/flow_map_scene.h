// Flow map scene: the food web drawn with trophic level left to right (DESIGN.md 4).
// Compartments are rounded boxes whose area follows biomass, coloured by kind
// (Okabe-Ito); fleets are boat-shaped at the right; detritus pools have their own lane
// along the bottom. Each flow of the core's flow network (core/network/flow_network.h)
// is a curved ribbon whose width follows log(flow); catches run to their fleet.
// Geometry comes from flow_map_layout.h; the user may drag boxes, and positions can be
// read and restored so that the workbench saves them with the project.
#pragma once

#include <QGraphicsScene>
#include <QHash>
#include <QPointF>
#include <QString>
#include <memory>
#include <optional>
#include <vector>

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"
#include "core/network/flow_network.h"
#include "ui/results/flow_map_layout.h"

namespace tl::ui {

class FlowMapBoxItem;
class FlowMapRibbonItem;

class FlowMapScene : public QGraphicsScene {
    Q_OBJECT
public:
    explicit FlowMapScene(QObject* parent = nullptr);
    ~FlowMapScene() override;

    void setScenario(const tl::Model& model, const tl::BalanceSheet& sheet);
    QString unavailableReason() const { return unavailable_; }

    // Nodes: the compartments in model order, then one per fleet. Edges: every
    // non-zero flow of the flow network, then each fleet's catch (landings + dead
    // discards) per compartment.
    const std::vector<FlowMapNode>& nodes() const { return nodes_; }
    const std::vector<FlowMapEdge>& edges() const { return edges_; }
    const FlowMapLayout& layout() const { return layout_; }
    std::size_t compartmentCount() const { return compartmentCount_; }

    // Flows below the threshold are hidden (0 shows all).
    void setThreshold(double flow);
    double threshold() const { return threshold_; }
    double minFlow() const { return minFlow_; }
    double maxFlow() const { return maxFlow_; }
    int visibleRibbonCount() const;
    double ribbonWidth(double flow) const;  // pixels, from log(flow)

    QRectF boxRect(std::size_t node) const;  // scene rectangle of a box (no caption)
    QRectF footprintRect(std::size_t node) const;  // box with its caption

    // Positions of boxes (top-left, scene coordinates), keyed by compartment name and
    // "fleet:<name>" for fleets. setPositions moves the named boxes and keeps them there
    // across later setScenario calls until resetLayout().
    QHash<QString, QPointF> positions() const;
    void setPositions(const QHash<QString, QPointF>& positions);
    void resetLayout();
    // The boxes placed by hand (a subset of positions()): what a project stores.
    QHash<QString, QPointF> movedPositions() const { return overrides_; }
    // Exactly `moved` placed by hand, every other box where the automatic layout puts it
    // (undo of a drag, a scenario's stored layout). Emits nothing.
    void replaceMovedPositions(const QHash<QString, QPointF>& moved);

    // Hover: the node, its prey and its predators stay bright, the rest fades.
    void highlight(std::optional<std::size_t> node);
    std::optional<std::size_t> highlighted() const { return highlighted_; }
    bool isDimmed(std::size_t node) const;

    QRectF figureRect() const;  // what an exported figure shows
    QString flowUnit() const { return flowUnit_; }

signals:
    void positionsChanged();
    void nodeActivated(const QString& name);

private:
    friend class FlowMapBoxItem;
    void rebuild();
    void addDecorations();
    void addLegend(double top);
    void updateRibbons();
    void nodeMoved(std::size_t node);
    void nodeReleased(std::size_t node);
    QString positionKey(std::size_t node) const;

    std::vector<FlowMapNode> nodes_;
    std::vector<FlowMapEdge> edges_;
    std::vector<CompartmentKind> kinds_;
    std::vector<QString> toolTips_;
    FlowMapLayout layout_;
    std::size_t compartmentCount_ = 0;
    std::vector<FlowMapBoxItem*> boxes_;
    std::vector<FlowMapRibbonItem*> ribbons_;
    QHash<QString, QPointF> overrides_;
    double threshold_ = 0.0, minFlow_ = 0.0, maxFlow_ = 0.0;
    QString unavailable_, flowUnit_, biomassUnit_;
    double maxBiomass_ = 0.0;
    std::optional<std::size_t> highlighted_;
    bool rebuilding_ = false;
};

}  // namespace tl::ui
