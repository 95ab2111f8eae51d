// Flow network of a solved scenario (DESIGN.md 3.5): every node of a balanced model is
// balanced as a network, and the analysis survives a round trip through SCOR.
#include <cmath>

#include <gtest/gtest.h>

#include "core/balance/solver.h"
#include "core/io/scor.h"
#include "core/network/flow_network.h"
#include "core/network/flow_trophic_level.h"
#include "core/network/indicators.h"
#include "core/network/level_decomposition.h"
#include "tests/support/network_models.h"

namespace tl {
namespace {

double relDiff(double a, double b) { return std::abs(a - b) / std::max(std::abs(b), 1e-300); }

TEST(FlowNetwork, BalancedModelGivesBalancedNodes)
{
    const auto [model, sheet, net] = testing::solvedScenario(testing::richWeb());
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced) << (sheet.problems.empty() ? "" : sheet.problems[0].message);
    ASSERT_EQ(net.size(), 8u);
    for (std::size_t j = 0; j < net.size(); ++j) {
        const double in = net.inflow(j) + net.imports[j];
        const double out = net.outflow(j) + net.exports[j] + net.respiration[j];
        EXPECT_NEAR(in, out, 1e-10 * in) << net.names[j];
    }
    // Spot checks by hand. Zooplankton Q = 6 x 70 = 420: 0.8 of it from phytoplankton.
    EXPECT_NEAR(net.flows(0, 2), 336.0, 1e-12);
    // Planktivores: Q = 18, 10 % imported food; immigration 0.2 enters as import.
    EXPECT_NEAR(net.foodImport[4], 1.8, 1e-12);
    EXPECT_NEAR(net.imports[4], 2.0, 1e-12);
    // Landings leave as exports; half the 0.1 discards die and fall to the first pool.
    EXPECT_NEAR(net.landings(4), 0.3, 1e-15);
    EXPECT_NEAR(net.catchTotal(4), 0.35, 1e-15);
    // Macrophytes (P = 200, nobody eats them) all go to plant litter by routing.
    EXPECT_NEAR(net.flows(1, 7), 200.0, 1e-12);
    EXPECT_EQ(net.flows(1, 6), 0.0);
    EXPECT_EQ(net.respiration[0], 0.0);  // producers enter with net production

    // Agrees with the balance sheet written independently (core/balance): flow to
    // detritus per compartment, detritus export per pool, respiration per consumer.
    for (std::size_t i = 0; i < net.size(); ++i) {
        const CompartmentBalance& row = sheet.rows[i];
        if (!net.isLiving(i)) {
            EXPECT_NEAR(net.exports[i], row.detritusExport, 1e-10 * row.detritusInflow) << net.names[i];
            EXPECT_NEAR(net.throughflow(i), row.detritusInflow, 1e-10 * row.detritusInflow) << net.names[i];
            continue;
        }
        const double toPools = net.flows(static_cast<Eigen::Index>(i), 6) + net.flows(static_cast<Eigen::Index>(i), 7);
        EXPECT_NEAR(toPools, row.flowToDetritus, 1e-10 * row.production) << net.names[i];
        if (net.roles[i] == NodeRole::Consumer) {
            EXPECT_NEAR(net.respiration[i], row.respiration, 1e-12) << net.names[i];
        }
    }
}

TEST(FlowNetwork, AnalysisSurvivesScorRoundTrip)
{
    // SCOR has no fleets: landings become plain exports and dead discards plain flows
    // to detritus, so TE, which counts all of the catch, would lose the dead discards.
    // Discards all survive here; the discard case is checked below.
    Model model = testing::richWeb();
    model.fleet(0).discardSurvival[4] = 1.0;
    const BalanceSheet sheet = solveBalance(model);
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);
    const FlowNetwork net = buildFlowNetwork(model, sheet);
    const std::string text = writeScor(scorFromFlowNetwork(net, "rich web; invented test data"));
    const ScorReadResult read = readScor(text, "roundtrip.scor");
    ASSERT_TRUE(read.network) << read.problems[0].describe();
    const FlowNetwork back = flowNetworkFromScor(*read.network);
    ASSERT_EQ(back.size(), net.size());
    for (std::size_t j = 0; j < net.size(); ++j) {
        EXPECT_EQ(back.names[j], net.names[j]);  // living first already holds for this model
        EXPECT_EQ(back.roles[j], net.roles[j]) << net.names[j];
    }
    const SystemIndicators a = systemIndicators(net), b = systemIndicators(back);
    for (auto [x, y] : {std::pair{a.tst, b.tst}, {a.tstp, b.tstp}, {a.boundaryInput, b.boundaryInput},
                        {a.fci, b.fci}, {a.apl, b.apl}, {a.ami, b.ami}, {a.ascendency, b.ascendency},
                        {a.capacity, b.capacity}, {a.overhead, b.overhead}, {a.connectance, b.connectance},
                        {a.totalPrimaryProduction, b.totalPrimaryProduction}, {a.systemOmnivory, b.systemOmnivory}})
        EXPECT_EQ(x, y);  // the writer keeps every double exactly
    EXPECT_EQ(a.links, b.links);
    const FlowTrophicLevels ta = flowTrophicLevels(net), tb = flowTrophicLevels(back);
    EXPECT_EQ(ta.tl, tb.tl);
    const LevelDecomposition la = decomposeLevels(net), lb = decomposeLevels(back);
    ASSERT_EQ(la.levelCount(), lb.levelCount());
    for (int k = 0; k < la.levelCount(); ++k) {
        EXPECT_NEAR(relDiff(lb.combined.levels[k].throughput, la.combined.levels[k].throughput), 0, 1e-12);
        EXPECT_NEAR(relDiff(lb.combined.levels[k].biomass, la.combined.levels[k].biomass), 0, 1e-12);
        if (k == 0) EXPECT_TRUE(std::isnan(la.combined.levels[k].te) && std::isnan(lb.combined.levels[k].te));
        else EXPECT_NEAR(lb.combined.levels[k].te, la.combined.levels[k].te, 1e-12);
    }
    EXPECT_NEAR(la.primaryProductionConsumed, lb.primaryProductionConsumed, 1e-12);
    EXPECT_NEAR(la.detritusInflowConsumed, lb.detritusInflowConsumed, 1e-12);
}

// With dead discards, the SCOR copy's TE at a level is lower by exactly the dead
// discards at that level over its throughput.
TEST(FlowNetwork, ScorRoundTripLosesOnlyTheDeadDiscardsFromTe)
{
    const auto [model, sheet, net] = testing::solvedScenario(testing::richWeb());
    const FlowNetwork back = flowNetworkFromScor(*readScor(writeScor(scorFromFlowNetwork(net, "t")), "t").network);
    const LevelDecomposition la = decomposeLevels(net), lb = decomposeLevels(back);
    const double deadDiscards = net.catchTotal(4) - net.landings(4);
    ASSERT_NEAR(deadDiscards, 0.05, 1e-15);
    for (int k = 1; k < la.levelCount(); ++k) {  // level I has no TE
        const double lost = deadDiscards * la.combined.share(4, k) / la.combined.levels[k].throughput;
        EXPECT_NEAR(la.combined.levels[k].te - lb.combined.levels[k].te, lost, 1e-12) << "level " << k + 1;
    }
}

TEST(FlowNetwork, ScorOrdersLivingCompartmentsFirst)
{
    Model model = testing::tenPercentChain();
    model.moveCompartment(4, 0);  // detritus first
    const BalanceSheet sheet = solveBalance(model);
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced);
    const FlowNetwork net = buildFlowNetwork(model, sheet);
    const ScorNetwork scor = scorFromFlowNetwork(net, "t");
    EXPECT_EQ(scor.livingCount, 4u);
    EXPECT_EQ(scor.names.back(), "Detritus");
    EXPECT_EQ(scor.names.front(), "Algae");
    const SystemIndicators a = systemIndicators(net), b = systemIndicators(flowNetworkFromScor(scor));
    EXPECT_NEAR(relDiff(b.ascendency, a.ascendency), 0, 1e-13);
    EXPECT_NEAR(relDiff(b.fci + 1, a.fci + 1), 0, 1e-13);
}

}  // namespace
}  // namespace tl

namespace tl {
namespace {

// An unbalanced scenario (invented: predators eat 40 of the grazers' production of 10):
// no negative flow, every node still balanced, and a warning names the compartment.
TEST(FlowNetwork, UnbalancedScenarioBooksShortfallsAsImports)
{
    Model model = testing::tenPercentChain();
    model.compartment(2).value(Param::QB) = 40.0;
    const BalanceSheet sheet = solveBalance(model);
    ASSERT_EQ(sheet.status, BalanceStatus::Unbalanced);
    const FlowNetwork net = buildFlowNetwork(model, sheet);
    EXPECT_GE(net.flows.minCoeff(), 0.0);
    for (std::size_t j = 0; j < net.size(); ++j) {
        EXPECT_GE(net.imports[j], 0.0);
        EXPECT_GE(net.respiration[j], 0.0);
        const double in = net.inflow(j) + net.imports[j];
        const double out = net.outflow(j) + net.exports[j] + net.respiration[j];
        EXPECT_NEAR(in, out, 1e-10 * std::max(in, 1.0)) << net.names[j];
    }
    // Grazers: P = 10, eaten 40, egestion 0.2 x 100 = 20: M0 + egestion = 10 - 40 + 20 = -10,
    // booked as an import of 10 with a warning; no flow from grazers to detritus.
    ASSERT_EQ(net.adjustments.size(), 1u);
    EXPECT_EQ(net.adjustments[0].compartment, "Grazers");
    EXPECT_EQ(net.adjustments[0].severity, Severity::Warning);
    EXPECT_NEAR(net.imports[1], 10.0, 1e-12);
    EXPECT_EQ(net.flows(1, 4), 0.0);
}

}  // namespace
}  // namespace tl
