// Flow map layout: where each box of the flow map goes. Geometry only, no science and
// no Qt, so that it can be unit-tested on its own.
//
// The map reads like a layered drawing of a directed graph:
//   x  = trophic level, mapped linearly (x = margin + (TL - 1) * pixelsPerLevel);
//   living compartments whose boxes (plus labels) would overlap horizontally share a
//   layer and are stacked vertically in it; the order inside each layer is chosen to
//   reduce ribbon crossings with the barycentre heuristic of Sugiyama, Tagawa & Toda
//   (1981), "Methods for visual understanding of hierarchical system structures",
//   IEEE Trans. Syst. Man Cybern. 11:109-125: alternate down/up sweeps, each node moved
//   to the mean position of its neighbours, keeping the best ordering seen;
//   detritus pools sit on their own lane along the bottom, each near the mean x of the
//   compartments it exchanges with; fleets form a last column at the right.
// Box area follows biomass (side ~ sqrt(B)), clamped to a legible minimum.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

namespace tl::ui {

enum class FlowMapRole { Living, Detritus, Fleet };

struct FlowMapNode {
    std::string name;
    FlowMapRole role = FlowMapRole::Living;
    double trophicLevel = 1.0;  // ignored for fleets
    double biomass = 0.0;       // <= 0 or NaN: drawn at the minimum size
    double labelWidth = 0.0;    // width the caption needs (measured by the view)
    double labelHeight = 0.0;   // height of the caption drawn under the box
};

struct FlowMapEdge {
    std::size_t from = 0;
    std::size_t to = 0;
    double flow = 0.0;  // > 0
};

struct FlowMapLayoutOptions {
    double pixelsPerLevel = 240.0;
    double margin = 40.0;
    double maxBoxArea = 110.0 * 80.0;  // the largest biomass gets this area
    double minBoxWidth = 30.0;
    double aspect = 1.4;           // width / height of a box
    double verticalGap = 28.0;     // between stacked boxes (plus the caption)
    double horizontalGap = 16.0;   // between layers and between detritus pools
    double laneGap = 70.0;         // between the living region and the detritus lane
    double fleetColumnGap = 140.0; // from the right-most living box to the fleets
    double fleetWidth = 70.0, fleetHeight = 44.0;
    int sweeps = 12;
};

struct BoxGeometry {
    double x = 0, y = 0, width = 0, height = 0;  // top-left corner and size
    double centreX() const { return x + width / 2; }
    double centreY() const { return y + height / 2; }
    double right() const { return x + width; }
    double bottom() const { return y + height; }
};

struct FlowMapLayout {
    std::vector<BoxGeometry> boxes;           // one per node, same order
    std::vector<std::vector<std::size_t>> layers;  // living layers left to right, top to bottom
    double detritusLaneTop = 0.0;              // y of the detritus lane's upper edge
    double detritusLaneBottom = 0.0;
    double livingTop = 0.0;
    double width = 0.0, height = 0.0;          // extent of the drawing
    double minLevel = 1.0, maxLevel = 1.0;     // trophic-level range of the x axis
    double levelToX(double level) const { return originX + (level - 1.0) * pixelsPerLevel; }
    double originX = 0.0, pixelsPerLevel = 1.0;
    int crossingsBefore = 0, crossingsAfter = 0;  // straight-line crossings, input order vs chosen
};

FlowMapLayout layoutFlowMap(const std::vector<FlowMapNode>& nodes, const std::vector<FlowMapEdge>& edges,
                            const FlowMapLayoutOptions& options = {});

// Box of node `i` with its caption (the region that must not overlap another's).
BoxGeometry footprint(const FlowMapLayout& layout, const std::vector<FlowMapNode>& nodes, std::size_t i);

bool overlaps(const BoxGeometry& a, const BoxGeometry& b);

// Number of pairs of edges whose straight centre-to-centre segments cross (edges that
// share an end are not counted): the quantity the barycentre ordering tries to lower.
int countCrossings(const std::vector<BoxGeometry>& boxes, const std::vector<FlowMapEdge>& edges);

}  // namespace tl::ui
