// Food-web and catch indicators of a solved scenario.
#include <cmath>

#include <gtest/gtest.h>

#include "core/balance/solver.h"
#include "core/network/flow_network.h"
#include "core/network/indicators.h"
#include "tests/core/network/test_models.h"

namespace tl {
namespace {

// Primary production required (Pauly & Christensen 1995, Nature 374:255) on the 10 %
// chain, by hand: per unit production a grazer needs Q/P = 10 units of algae, a predator
// 10 x 10, the top 1000; the catch of 0.1 top needs 100 = 10 % of TPP 1000.
TEST(Indicators, PrimaryProductionRequiredForTheCatchByHand)
{
    const Model model = testing::tenPercentChain();
    const BalanceSheet sheet = solveBalance(model);
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced);
    const SystemIndicators s = systemIndicators(model, sheet, buildFlowNetwork(model, sheet));
    ASSERT_EQ(s.pprPerUnitProduction.size(), 5u);
    EXPECT_NEAR(s.pprPerUnitProduction[1], 10.0, 1e-12);
    EXPECT_NEAR(s.pprPerUnitProduction[2], 100.0, 1e-10);
    EXPECT_NEAR(s.pprPerUnitProduction[3], 1000.0, 1e-9);
    EXPECT_NEAR(s.totalCatch, 0.1, 1e-15);
    EXPECT_NEAR(s.catchPpr, 100.0, 1e-9);
    EXPECT_NEAR(s.catchPprShareOfTpp, 0.1, 1e-12);
    EXPECT_NEAR(s.catchMeanTl, 4.0, 1e-12);
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

// System omnivory on a web with an omnivore: intake-weighted mean of OI (this project's
// convention), here one consumer with OI = 0.25 (TL 2.5, prey at 1 and 2).
TEST(Indicators, SystemOmnivoryOfAnOmnivore)
{
    const FlowNetwork net = testing::omnivoreWeb(78, 16);
    const SystemIndicators s = systemIndicators(net);
    // OI = 0.5 (1 - 1.5)^2 + 0.5 (2 - 1.5)^2 = 0.25 for the omnivore (intake 4), 0 for the
    // herbivore (intake 20): SOI = 4 x 0.25 / 24.
    EXPECT_NEAR(s.systemOmnivory, 1.0 / 24.0, 1e-15);
    EXPECT_TRUE(std::isnan(s.catchPpr));
}

}  // namespace
}  // namespace tl
