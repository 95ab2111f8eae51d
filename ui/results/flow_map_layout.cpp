#include "ui/results/flow_map_layout.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace tl::ui {
namespace {

constexpr double kCaptionPad = 4.0;
constexpr double kLanePad = 12.0;

BoxGeometry sizedBox(const FlowMapNode& node, double maxBiomass, const FlowMapLayoutOptions& o)
{
    BoxGeometry b;
    if (node.role == FlowMapRole::Fleet) {
        b.width = o.fleetWidth;
        b.height = o.fleetHeight;
        return b;
    }
    const double share = (std::isfinite(node.biomass) && node.biomass > 0 && maxBiomass > 0)
                             ? node.biomass / maxBiomass : 0.0;
    b.height = std::sqrt(o.maxBoxArea * share / o.aspect);
    b.width = o.aspect * b.height;
    if (b.width < o.minBoxWidth) {
        b.width = o.minBoxWidth;
        b.height = o.minBoxWidth / o.aspect;
    }
    return b;
}

double footprintWidth(const BoxGeometry& b, const FlowMapNode& n) { return std::max(b.width, n.labelWidth); }
double footprintHeight(const BoxGeometry& b, const FlowMapNode& n)
{
    return b.height + (n.labelHeight > 0 ? kCaptionPad + n.labelHeight : 0.0);
}

// Stacks the nodes of one column centred on `centreY`; x is kept.
void stackColumn(const std::vector<std::size_t>& column, double columnHeight, double top,
                 const std::vector<FlowMapNode>& nodes, std::vector<BoxGeometry>& boxes, double gap)
{
    double used = 0;
    for (std::size_t k = 0; k < column.size(); ++k)
        used += footprintHeight(boxes[column[k]], nodes[column[k]]) + (k ? gap : 0.0);
    double y = top + (columnHeight - used) / 2;
    for (std::size_t i : column) {
        boxes[i].y = y;
        y += footprintHeight(boxes[i], nodes[i]) + gap;
    }
}

double columnHeight(const std::vector<std::size_t>& column, const std::vector<FlowMapNode>& nodes,
                    const std::vector<BoxGeometry>& boxes, double gap)
{
    double h = 0;
    for (std::size_t k = 0; k < column.size(); ++k)
        h += footprintHeight(boxes[column[k]], nodes[column[k]]) + (k ? gap : 0.0);
    return h;
}

bool segmentsCross(double ax, double ay, double bx, double by, double cx, double cy, double dx, double dy)
{
    auto orient = [](double px, double py, double qx, double qy, double rx, double ry) {
        const double v = (qx - px) * (ry - py) - (qy - py) * (rx - px);
        return (v > 1e-9) - (v < -1e-9);
    };
    const int o1 = orient(ax, ay, bx, by, cx, cy), o2 = orient(ax, ay, bx, by, dx, dy);
    const int o3 = orient(cx, cy, dx, dy, ax, ay), o4 = orient(cx, cy, dx, dy, bx, by);
    return o1 * o2 < 0 && o3 * o4 < 0;
}

}  // namespace

bool overlaps(const BoxGeometry& a, const BoxGeometry& b)
{
    return a.x < b.right() && b.x < a.right() && a.y < b.bottom() && b.y < a.bottom();
}

BoxGeometry footprint(const FlowMapLayout& layout, const std::vector<FlowMapNode>& nodes, std::size_t i)
{
    const BoxGeometry& b = layout.boxes[i];
    const double w = footprintWidth(b, nodes[i]);
    return {b.centreX() - w / 2, b.y, w, footprintHeight(b, nodes[i])};
}

int countCrossings(const std::vector<BoxGeometry>& boxes, const std::vector<FlowMapEdge>& edges)
{
    int crossings = 0;
    for (std::size_t a = 0; a < edges.size(); ++a) {
        const FlowMapEdge& e = edges[a];
        if (e.from == e.to) continue;
        for (std::size_t b = a + 1; b < edges.size(); ++b) {
            const FlowMapEdge& f = edges[b];
            if (f.from == f.to || f.from == e.from || f.from == e.to || f.to == e.from || f.to == e.to) continue;
            if (segmentsCross(boxes[e.from].centreX(), boxes[e.from].centreY(), boxes[e.to].centreX(),
                              boxes[e.to].centreY(), boxes[f.from].centreX(), boxes[f.from].centreY(),
                              boxes[f.to].centreX(), boxes[f.to].centreY()))
                ++crossings;
        }
    }
    return crossings;
}

FlowMapLayout layoutFlowMap(const std::vector<FlowMapNode>& nodes, const std::vector<FlowMapEdge>& edges,
                            const FlowMapLayoutOptions& o)
{
    FlowMapLayout L;
    L.pixelsPerLevel = o.pixelsPerLevel;
    const std::size_t n = nodes.size();
    L.boxes.resize(n);

    double maxBiomass = 0;
    for (const auto& node : nodes)
        if (node.role != FlowMapRole::Fleet && std::isfinite(node.biomass)) maxBiomass = std::max(maxBiomass, node.biomass);
    for (std::size_t i = 0; i < n; ++i) L.boxes[i] = sizedBox(nodes[i], maxBiomass, o);

    std::vector<std::size_t> living, detritus, fleets;
    for (std::size_t i = 0; i < n; ++i) {
        switch (nodes[i].role) {
        case FlowMapRole::Living: living.push_back(i); break;
        case FlowMapRole::Detritus: detritus.push_back(i); break;
        case FlowMapRole::Fleet: fleets.push_back(i); break;
        }
    }

    // Neighbours among living nodes and fleets (detritus is on its own lane and would
    // pull every box towards the bottom).
    std::vector<std::vector<std::size_t>> neighbours(n);
    for (const auto& e : edges) {
        if (e.from >= n || e.to >= n || e.from == e.to) continue;
        neighbours[e.from].push_back(e.to);
        neighbours[e.to].push_back(e.from);
    }

    // x from trophic level; the origin leaves room for the widest half-footprint.
    double halfMax = 0;
    L.minLevel = living.empty() ? 1.0 : 1e300;
    L.maxLevel = 1.0;
    for (std::size_t i : living) {
        halfMax = std::max(halfMax, footprintWidth(L.boxes[i], nodes[i]) / 2);
        const double tl = std::isfinite(nodes[i].trophicLevel) ? nodes[i].trophicLevel : 1.0;
        L.minLevel = std::min(L.minLevel, tl);
        L.maxLevel = std::max(L.maxLevel, tl);
    }
    L.originX = o.margin + halfMax - (L.minLevel - 1.0) * o.pixelsPerLevel;
    for (std::size_t i : living) {
        const double tl = std::isfinite(nodes[i].trophicLevel) ? nodes[i].trophicLevel : 1.0;
        L.boxes[i].x = L.levelToX(tl) - L.boxes[i].width / 2;
    }

    // Layers: sweep by x; a node whose footprint reaches into the current layer joins it.
    std::vector<std::size_t> byX = living;
    std::stable_sort(byX.begin(), byX.end(),
                     [&](std::size_t a, std::size_t b) { return L.boxes[a].centreX() < L.boxes[b].centreX(); });
    double layerRight = -1e300;
    for (std::size_t i : byX) {
        const double w = footprintWidth(L.boxes[i], nodes[i]);
        const double left = L.boxes[i].centreX() - w / 2, right = left + w;
        if (L.layers.empty() || left >= layerRight + o.horizontalGap) {
            L.layers.emplace_back();
            layerRight = right;
        } else {
            layerRight = std::max(layerRight, right);
        }
        L.layers.back().push_back(i);
    }
    // Input order within each layer is the starting order.
    for (auto& layer : L.layers) std::sort(layer.begin(), layer.end());

    double livingHeight = 0;
    for (const auto& layer : L.layers) livingHeight = std::max(livingHeight, columnHeight(layer, nodes, L.boxes, o.verticalGap));
    double rightMost = o.margin;
    for (std::size_t i : living) rightMost = std::max(rightMost, L.boxes[i].centreX() + footprintWidth(L.boxes[i], nodes[i]) / 2);
    double fleetsWidth = 0;
    for (std::size_t i : fleets) fleetsWidth = std::max(fleetsWidth, footprintWidth(L.boxes[i], nodes[i]));
    for (std::size_t i : fleets) L.boxes[i].x = rightMost + o.fleetColumnGap + fleetsWidth / 2 - L.boxes[i].width / 2;
    livingHeight = std::max(livingHeight, columnHeight(fleets, nodes, L.boxes, o.verticalGap));
    L.livingTop = o.margin;
    L.detritusLaneTop = L.livingTop + livingHeight + o.laneGap;

    auto placeDetritus = [&] {
        std::vector<std::pair<double, std::size_t>> wanted;
        for (std::size_t d : detritus) {
            double sum = 0;
            int count = 0;
            for (std::size_t j : neighbours[d])
                if (nodes[j].role != FlowMapRole::Detritus) { sum += L.boxes[j].centreX(); ++count; }
            wanted.emplace_back(count ? sum / count : L.levelToX(1.0), d);
        }
        std::stable_sort(wanted.begin(), wanted.end());
        double nextLeft = o.margin;
        for (auto [cx, d] : wanted) {
            const double w = footprintWidth(L.boxes[d], nodes[d]);
            const double left = std::max(cx - w / 2, nextLeft);
            L.boxes[d].x = left + w / 2 - L.boxes[d].width / 2;
            L.boxes[d].y = L.detritusLaneTop + kLanePad;
            nextLeft = left + w + o.horizontalGap;
        }
    };
    auto stackAll = [&] {
        for (const auto& layer : L.layers) stackColumn(layer, livingHeight, L.livingTop, nodes, L.boxes, o.verticalGap);
        stackColumn(fleets, livingHeight, L.livingTop, nodes, L.boxes, o.verticalGap);
        placeDetritus();
    };
    auto reorder = [&](std::vector<std::size_t>& column) {
        std::vector<std::pair<double, std::size_t>> keyed;
        for (std::size_t i : column) {
            double sum = 0;
            int count = 0;
            for (std::size_t j : neighbours[i])
                if (nodes[j].role != FlowMapRole::Detritus) { sum += L.boxes[j].centreY(); ++count; }
            keyed.emplace_back(count ? sum / count : L.boxes[i].centreY(), i);
        }
        std::stable_sort(keyed.begin(), keyed.end(),
                         [](const auto& a, const auto& b) { return a.first < b.first; });
        for (std::size_t k = 0; k < column.size(); ++k) column[k] = keyed[k].second;
        stackColumn(column, livingHeight, L.livingTop, nodes, L.boxes, o.verticalGap);
    };

    stackAll();
    L.crossingsBefore = countCrossings(L.boxes, edges);
    auto bestLayers = L.layers;
    auto bestFleets = fleets;
    int best = L.crossingsBefore;
    for (int sweep = 0; sweep < o.sweeps && best > 0; ++sweep) {
        if (sweep % 2 == 0) {
            for (auto& layer : L.layers) reorder(layer);
            reorder(fleets);
        } else {
            reorder(fleets);
            for (auto it = L.layers.rbegin(); it != L.layers.rend(); ++it) reorder(*it);
        }
        placeDetritus();
        const int c = countCrossings(L.boxes, edges);
        if (c < best) {
            best = c;
            bestLayers = L.layers;
            bestFleets = fleets;
        }
    }
    L.layers = bestLayers;
    fleets = bestFleets;
    stackAll();
    L.crossingsAfter = countCrossings(L.boxes, edges);

    double laneHeight = 0;
    for (std::size_t d : detritus) laneHeight = std::max(laneHeight, footprintHeight(L.boxes[d], nodes[d]));
    L.detritusLaneBottom = detritus.empty() ? L.detritusLaneTop : L.detritusLaneTop + laneHeight + 2 * kLanePad;
    double right = 0;
    for (std::size_t i = 0; i < n; ++i) right = std::max(right, footprint(L, nodes, i).right());
    L.width = right + o.margin;
    L.height = (detritus.empty() ? L.livingTop + livingHeight : L.detritusLaneBottom) + o.margin;
    return L;
}

}  // namespace tl::ui
