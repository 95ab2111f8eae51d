// Flow map layout (ui/results/flow_map_layout.h): geometry checks on hand-made and
// random layered graphs. Facts checked are properties of the drawing the layout
// promises (no overlap, x from trophic level, lanes), and the barycentre heuristic of
// Sugiyama, Tagawa & Toda (1981) removing a crossing it is known to remove.
#include "ui/results/flow_map_layout.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

namespace tl::ui {
namespace {

FlowMapNode living(const char* name, double tl, double b)
{
    FlowMapNode n;
    n.name = name;
    n.trophicLevel = tl;
    n.biomass = b;
    n.labelWidth = 60;
    n.labelHeight = 14;
    return n;
}

void expectNoOverlap(const FlowMapLayout& layout, const std::vector<FlowMapNode>& nodes)
{
    for (std::size_t i = 0; i < nodes.size(); ++i)
        for (std::size_t j = i + 1; j < nodes.size(); ++j)
            EXPECT_FALSE(overlaps(footprint(layout, nodes, i), footprint(layout, nodes, j)))
                << nodes[i].name << " overlaps " << nodes[j].name;
}

TEST(FlowMapLayout, OneBoxPerNodeAndAreaFollowsBiomass)
{
    std::vector<FlowMapNode> nodes = {living("a", 1, 100), living("b", 2, 25), living("c", 3, 1e-6)};
    const FlowMapLayout layout = layoutFlowMap(nodes, {{0, 1, 10}, {1, 2, 1}});
    ASSERT_EQ(layout.boxes.size(), nodes.size());
    const double areaA = layout.boxes[0].width * layout.boxes[0].height;
    const double areaB = layout.boxes[1].width * layout.boxes[1].height;
    EXPECT_NEAR(areaB / areaA, 0.25, 1e-9);  // area proportional to biomass
    EXPECT_GE(layout.boxes[2].width, FlowMapLayoutOptions{}.minBoxWidth - 1e-9);  // clamped, still visible
}

TEST(FlowMapLayout, XFollowsTrophicLevel)
{
    std::vector<FlowMapNode> nodes = {living("p", 1, 10), living("h", 2.1, 5), living("c", 3.4, 1), living("o", 2.6, 1)};
    const FlowMapLayout layout = layoutFlowMap(nodes, {{0, 1, 1}, {1, 2, 1}, {1, 3, 1}, {3, 2, 1}});
    for (std::size_t i = 0; i < nodes.size(); ++i)
        EXPECT_NEAR(layout.boxes[i].centreX(), layout.levelToX(nodes[i].trophicLevel), 1e-9) << nodes[i].name;
    EXPECT_LT(layout.boxes[0].centreX(), layout.boxes[1].centreX());
    EXPECT_LT(layout.boxes[3].centreX(), layout.boxes[2].centreX());
}

TEST(FlowMapLayout, DetritusOnTheBottomLaneAndFleetsAtTheRight)
{
    std::vector<FlowMapNode> nodes = {living("p", 1, 10), living("f", 2.5, 2), living("top", 3.8, 0.5)};
    FlowMapNode det = living("det", 1, 50), det2 = living("dom", 1, 5), fleet = living("boats", 0, 0);
    det.role = FlowMapRole::Detritus;
    det2.role = FlowMapRole::Detritus;
    fleet.role = FlowMapRole::Fleet;
    nodes.push_back(det);
    nodes.push_back(det2);
    nodes.push_back(fleet);
    const std::vector<FlowMapEdge> edges = {{0, 1, 5}, {1, 2, 1}, {3, 1, 2}, {1, 3, 1}, {2, 4, 0.1}, {2, 5, 0.2}, {1, 5, 0.3}};
    const FlowMapLayout layout = layoutFlowMap(nodes, edges);
    for (std::size_t d : {3u, 4u}) {
        EXPECT_GE(layout.boxes[d].y, layout.detritusLaneTop);
        EXPECT_LE(layout.boxes[d].bottom(), layout.detritusLaneBottom);
        for (std::size_t i : {0u, 1u, 2u, 5u}) EXPECT_LT(footprint(layout, nodes, i).bottom(), layout.detritusLaneTop);
    }
    for (std::size_t i : {0u, 1u, 2u}) EXPECT_GT(layout.boxes[5].x, footprint(layout, nodes, i).right());
    expectNoOverlap(layout, nodes);
}

// Two layers, edges a->d and b->c with a above b and c above d: one crossing in the
// input order, none once d moves above c or b above a (barycentre of d is a's position).
TEST(FlowMapLayout, BarycentreOrderingRemovesAnAvoidableCrossing)
{
    std::vector<FlowMapNode> nodes = {living("a", 1, 10), living("b", 1, 10), living("c", 2, 10), living("d", 2, 10)};
    const std::vector<FlowMapEdge> edges = {{0, 3, 1}, {1, 2, 1}};
    const FlowMapLayout layout = layoutFlowMap(nodes, edges);
    EXPECT_EQ(layout.crossingsBefore, 1);
    EXPECT_EQ(layout.crossingsAfter, 0);
    EXPECT_EQ(countCrossings(layout.boxes, edges), 0);
    // Either column may have moved; what matters is that a and d end up on the same side.
    EXPECT_EQ(layout.boxes[0].y < layout.boxes[1].y, layout.boxes[3].y < layout.boxes[2].y);
}

TEST(FlowMapLayout, RandomWebsNeverOverlapAndNeverGetWorse)
{
    std::mt19937 rng(20261202);
    std::uniform_real_distribution<double> tl(1.0, 4.5), logB(-3, 3), unit(0, 1);
    for (int trial = 0; trial < 40; ++trial) {
        const int n = 4 + trial;
        std::vector<FlowMapNode> nodes;
        for (int i = 0; i < n; ++i) {
            FlowMapNode node = living("n", i < 2 ? 1.0 : tl(rng), std::pow(10.0, logB(rng)));
            node.name = "node " + std::to_string(i);
            node.labelWidth = 30 + 80 * unit(rng);
            if (i == n - 1) node.role = FlowMapRole::Detritus;
            if (i == n - 2 && trial % 2) node.role = FlowMapRole::Fleet;
            nodes.push_back(node);
        }
        std::vector<FlowMapEdge> edges;
        for (int i = 0; i < n; ++i)
            for (int j = 0; j < n; ++j)
                if (i != j && unit(rng) < 0.15) edges.push_back({std::size_t(i), std::size_t(j), std::pow(10.0, logB(rng))});
        const FlowMapLayout layout = layoutFlowMap(nodes, edges);
        ASSERT_EQ(layout.boxes.size(), nodes.size());
        expectNoOverlap(layout, nodes);
        EXPECT_LE(layout.crossingsAfter, layout.crossingsBefore) << "trial " << trial;
        for (std::size_t i = 0; i < nodes.size(); ++i) {
            const BoxGeometry f = footprint(layout, nodes, i);
            EXPECT_GE(f.x, 0.0);
            EXPECT_LE(f.right(), layout.width);
            EXPECT_LE(f.bottom(), layout.height);
        }
    }
}

TEST(FlowMapLayout, EmptyWebGivesAnEmptyLayout)
{
    const FlowMapLayout layout = layoutFlowMap({}, {});
    EXPECT_TRUE(layout.boxes.empty());
    EXPECT_EQ(layout.crossingsAfter, 0);
}

}  // namespace
}  // namespace tl::ui
