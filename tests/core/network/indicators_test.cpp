// Food-web and catch indicators of a solved scenario.
#include <cmath>

#include <gtest/gtest.h>

#include "core/balance/solver.h"
#include "core/network/flow_network.h"
#include "core/network/indicators.h"
#include "tests/support/network_models.h"

namespace tl {
namespace {

// Primary production required (Pauly & Christensen 1995, Nature 374:255) on the 10 %
// chain, by hand: per unit production a grazer needs Q/P = 10 units of algae, a predator
// 10 x 10, the top 1000; the catch of 0.1 top needs 100 = 10 % of TPP 1000.
TEST(Indicators, PrimaryProductionRequiredForTheCatchByHand)
{
    const auto [model, sheet, net] = testing::solvedScenario(testing::tenPercentChain());
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced);
    const SystemIndicators s = systemIndicators(model, sheet, net);
    ASSERT_EQ(s.pprPerUnitProduction.size(), 5u);
    EXPECT_NEAR(s.pprPerUnitProduction[1], 10.0, 1e-12);
    EXPECT_NEAR(s.pprPerUnitProduction[2], 100.0, 1e-10);
    EXPECT_NEAR(s.pprPerUnitProduction[3], 1000.0, 1e-9);
    EXPECT_NEAR(s.totalCatch, 0.1, 1e-15);
    EXPECT_NEAR(s.catchPpr, 100.0, 1e-9);
    // Nothing eats detritus here, so both readings of PPR agree; each is divided by its
    // own total: TPP plus the detritus inflow (summed from the balance sheet), or TPP.
    double detritusInflow = 0;
    for (const CompartmentBalance& r : sheet.rows)
        if (r.kind != CompartmentKind::Detritus) detritusInflow += r.flowToDetritus;
    EXPECT_NEAR(s.totalDetritusInflow, detritusInflow, 1e-9);
    EXPECT_NEAR(s.catchPprShareOfTpp, 100.0 / (1000.0 + detritusInflow), 1e-12);
    EXPECT_NEAR(s.catchPprProducersOnly, 100.0, 1e-9);
    EXPECT_NEAR(s.catchPprProducersOnlyShare, 0.1, 1e-12);
    EXPECT_NEAR(s.catchMeanTl, 4.0, 1e-12);
    EXPECT_NEAR(s.catchMeanTlWithDiscards, 4.0, 1e-12);
    EXPECT_NEAR(s.totalPrimaryProduction, 1000.0, 1e-9);
    // Respiration R = 0.8 Q - P: 70 + 7 + 0.7.
    EXPECT_NEAR(s.totalRespiration, 77.7, 1e-9);
    EXPECT_NEAR(s.tppOverR, 1000.0 / 77.7, 1e-9);
    EXPECT_NEAR(s.tppOverB, 1000.0 / 111.1, 1e-9);
    EXPECT_NEAR(s.totalLivingBiomass, 111.1, 1e-12);
    EXPECT_NEAR(s.systemOmnivory, 0.0, 1e-15);  // a straight chain has no omnivory
    // Links: algae->grazers->predators->top, and algae, grazers, predators, top -> detritus.
    EXPECT_EQ(s.links, 7u);
    EXPECT_DOUBLE_EQ(s.connectance, 7.0 / 25.0);
    // Feeding links among the 4 living compartments: 3 of 16 possible.
    EXPECT_EQ(s.feedingLinks, 3u);
    EXPECT_DOUBLE_EQ(s.foodWebConnectance, 3.0 / 16.0);
    EXPECT_TRUE(s.producersIdentified);
}

// Mean TL of the catch on landings (Pauly et al. 1998), and on landings plus dead
// discards beside it: discarding grazers (TL 2) lowers the second only.
// By hand: landings 0.1 at TL 4; dead discards 0.6 x 1 = 0.6 grazers at TL 2:
// (0.1 x 4 + 0.6 x 2) / 0.7 = 1.6 / 0.7.
TEST(Indicators, MeanTrophicLevelOfCatchOnLandingsAndWithDiscards)
{
    Model model = testing::tenPercentChain();
    model.fleet(0).discards[1] = 1.0;
    model.fleet(0).discardSurvival[1] = 0.4;
    const BalanceSheet sheet = solveBalance(model);
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);
    const SystemIndicators s = systemIndicators(model, sheet, buildFlowNetwork(model, sheet));
    EXPECT_NEAR(s.totalLandings, 0.1, 1e-15);
    EXPECT_NEAR(s.totalCatch, 0.7, 1e-15);
    EXPECT_NEAR(s.catchMeanTl, 4.0, 1e-12);
    EXPECT_NEAR(s.catchMeanTlWithDiscards, 1.6 / 0.7, 1e-12);
}

TEST(Indicators, NoCatchNeedsNoPrimaryProduction)
{
    Model model = testing::tenPercentChain();
    model.removeFleet(0);  // the top's production is now unused (EE = 0)
    const BalanceSheet sheet = solveBalance(model);
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);
    const SystemIndicators s = systemIndicators(model, sheet, buildFlowNetwork(model, sheet));
    EXPECT_EQ(s.totalCatch, 0.0);
    EXPECT_EQ(s.catchPpr, 0.0);
    EXPECT_TRUE(std::isnan(s.catchMeanTl));
}

// System omnivory index (Christensen & Pauly 1993, ICLARM Conf Proc 26: consumers'
// omnivory weighted by the logarithm of their intake; definition as recalled from
// memory) and the intake-weighted variant (this project's own), on a three-consumer web,
// worked by hand: herbivore eats plants (TL 2, OI 0, intake 20); omnivore eats half
// plants, half herbivores (TL 2.5, OI 0.5 (1-1.5)^2 + 0.5 (2-1.5)^2 = 0.25, intake 4);
// top eats half herbivores, half omnivores (TL 3.25, OI 0.5 (2-2.25)^2 + 0.5 (2.5-2.25)^2
// = 0.0625, intake 2).
FlowNetwork threeConsumerWeb(double scale)
{
    const double s = scale;
    return testing::handNetwork({{"Plants", NodeRole::Producer, 10, 100 * s, 0, 78 * s, 100 * s},
                                 {"Herbivore", NodeRole::Consumer, 4, 0, 0, 17 * s, 3 * s},
                                 {"Omnivore", NodeRole::Consumer, 2, 0, 0, 3 * s, 1 * s},
                                 {"Top", NodeRole::Consumer, 1, 0, 0.5 * s, 1.5 * s, 0.5 * s}},
                                {{0, 1, 20 * s}, {0, 2, 2 * s}, {1, 2, 2 * s}, {1, 3, 1 * s}, {2, 3, 1 * s}});
}

TEST(Indicators, SystemOmnivoryPublishedAndIntakeWeightedOnThreeConsumers)
{
    const SystemIndicators s = systemIndicators(threeConsumerWeb(1.0));
    const double published = (0.0 * std::log(20.0) + 0.25 * std::log(4.0) + 0.0625 * std::log(2.0)) /
                             (std::log(20.0) + std::log(4.0) + std::log(2.0));
    EXPECT_NEAR(s.systemOmnivory, published, 1e-15);
    EXPECT_NEAR(s.omnivoryIntakeWeighted, (0.25 * 4 + 0.0625 * 2) / 26.0, 1e-15);
    EXPECT_TRUE(std::isnan(s.catchPpr));
}

TEST(Indicators, PublishedSystemOmnivoryDependsOnUnitsTheIntakeWeightedOneDoesNot)
{
    // The same web in units 100 times smaller: intakes 0.2, 0.04, 0.02, all logs negative.
    const SystemIndicators big = systemIndicators(threeConsumerWeb(1.0)), small = systemIndicators(threeConsumerWeb(0.01));
    const double published = (0.25 * std::log(0.04) + 0.0625 * std::log(0.02)) /
                             (std::log(0.2) + std::log(0.04) + std::log(0.02));
    EXPECT_NEAR(small.systemOmnivory, published, 1e-15);
    EXPECT_GT(std::abs(small.systemOmnivory - big.systemOmnivory), 1e-3);
    EXPECT_NEAR(small.omnivoryIntakeWeighted, big.omnivoryIntakeWeighted, 1e-15);
}

TEST(Indicators, NetworkWithoutRecognisableProducersHasNoTppFigures)
{
    // Every living node takes food from another (a SCOR network of consumers fed by a
    // detritus pool, say): no producer can be told apart, so TPP and its ratios are
    // undefined (NaN), not 0, until the user names the producers.
    FlowNetwork net = threeConsumerWeb(1.0);
    net.roles[0] = NodeRole::Consumer;
    net.flows(3, 0) = 0.1;  // plants now "eat" something: no node without intake
    const SystemIndicators before = systemIndicators(net);
    EXPECT_FALSE(before.producersIdentified);
    EXPECT_TRUE(std::isnan(before.totalPrimaryProduction));
    EXPECT_TRUE(std::isnan(before.tppOverR));
    EXPECT_TRUE(std::isnan(before.tppOverB));
    EXPECT_EQ(assignProducers(net, {"Plants", "Kelp"}), std::vector<std::string>{"Kelp"});
    EXPECT_EQ(net.roles[0], NodeRole::Producer);
    const SystemIndicators after = systemIndicators(net);
    EXPECT_TRUE(after.producersIdentified);
    EXPECT_NEAR(after.totalPrimaryProduction, 100.0, 1e-12);
}

}  // namespace
}  // namespace tl
