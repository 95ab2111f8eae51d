// Mixed trophic impact (Ulanowicz & Puccia 1990, Coenoses 5:7) and keystone index
// (Libralato et al. 2006, Ecol Model 195:153), worked by hand.
#include <cmath>

#include <gtest/gtest.h>

#include "core/balance/solver.h"
#include "core/network/keystone.h"
#include "core/network/mixed_trophic_impact.h"
#include "tests/support/network_models.h"

namespace tl {
namespace {

FlowNetwork chain(bool withFleet)
{
    // Plants -> Grazers -> Carnivores (invented values); grazers also lose to detritus,
    // which is not predation (there is no detritus node here: the loss is an export).
    FlowNetwork net = testing::handNetwork({{"Plants", NodeRole::Producer, 10, 100, 90, 0, 100},
                                            {"Grazers", NodeRole::Consumer, 2, 0, 4, 2, 6},
                                            {"Carnivores", NodeRole::Consumer, 1, 0, 0, 2, 0.8}},
                                           {{0, 1, 10}, {1, 2, 4}});
    net.fleetLandings = Eigen::MatrixXd::Zero(withFleet ? 1 : 0, 3);
    net.fleetDeadDiscards = Eigen::MatrixXd::Zero(withFleet ? 1 : 0, 3);
    if (withFleet) {
        net.fleetNames = {"Trawl"};
        net.fleetLandings(0, 1) = 1.5;
        net.fleetDeadDiscards(0, 1) = 0.5;
        net.fleetLandings(0, 2) = 6;
    }
    return net;
}

// Direct impacts, rows act on columns: d(Plants, Grazers) = 1, d(Grazers, Carnivores) = 1;
// f(Grazers, Plants) = 1 (all of the plants' predation losses), f(Carnivores, Grazers) = 1:
//       Q = [  0  1  0 ]     I - Q = [ 1 -1  0 ]    det(I - Q) = 1(1 + 1) + 1(1 - 0) = 3
//           [ -1  0  1 ]             [ 1  1 -1 ]
//           [  0 -1  0 ]             [ 0  1  1 ]
// adj(I - Q) = [2 1 1; -1 1 1; 1 -1 2], so (I - Q)^-1 = adj / 3 and
//   M = (I - Q)^-1 - I = [ -1/3  1/3  1/3 ;  -1/3 -2/3  1/3 ;  1/3 -1/3 -1/3 ].
// Carnivores help plants (+1/3, a cascade) and plants help carnivores (+1/3).
TEST(MixedTrophicImpact, ThreeCompartmentChainByHand)
{
    const MixedTrophicImpact mti = mixedTrophicImpact(chain(false));
    ASSERT_FALSE(mti.singular);
    const double q[3][3] = {{0, 1, 0}, {-1, 0, 1}, {0, -1, 0}};
    const double m[3][3] = {{-1.0 / 3, 1.0 / 3, 1.0 / 3}, {-1.0 / 3, -2.0 / 3, 1.0 / 3}, {1.0 / 3, -1.0 / 3, -1.0 / 3}};
    for (int i = 0; i < 3; ++i)
        for (int j = 0; j < 3; ++j) {
            EXPECT_NEAR(mti.direct(i, j), q[i][j], 1e-15) << i << "," << j;
            EXPECT_NEAR(mti.total(i, j), m[i][j], 1e-14) << i << "," << j;
        }
}

// With a fleet taking 2 grazers (1.5 landed + 0.5 dead discards) and 6 carnivores:
// grazers' losses = 4 to carnivores + 2 to the fleet, so f(Carnivores, Grazers) = 4/6 and
// f(Trawl, Grazers) = 2/6; carnivores lose only to the fleet: f(Trawl, Carnivores) = 1;
// the fleet's "diet" is its catch: d(Grazers, Trawl) = 2/8, d(Carnivores, Trawl) = 6/8.
TEST(MixedTrophicImpact, FleetIsAnImpactingRowAndColumn)
{
    const MixedTrophicImpact mti = mixedTrophicImpact(chain(true));
    ASSERT_EQ(mti.names.size(), 4u);
    EXPECT_EQ(mti.names[3], "Trawl");
    EXPECT_EQ(mti.nodeCount, 3u);
    EXPECT_NEAR(mti.direct(2, 1), -4.0 / 6.0, 1e-15);        // carnivores on grazers: d = 0, f = 4/6
    EXPECT_NEAR(mti.direct(1, 2), 1.0, 1e-15);               // grazers on carnivores: d = 1, f = 0
    EXPECT_NEAR(mti.direct(3, 1), -2.0 / 6.0, 1e-15);
    EXPECT_NEAR(mti.direct(3, 2), -1.0, 1e-15);
    EXPECT_NEAR(mti.direct(1, 3), 2.0 / 8.0, 1e-15);
    EXPECT_NEAR(mti.direct(2, 3), 6.0 / 8.0, 1e-15);
    EXPECT_EQ(mti.direct(3, 3), 0.0);
    EXPECT_EQ(mti.direct(0, 3), 0.0);
    // M satisfies (I - Q)(M + I) = I.
    const Eigen::MatrixXd I = Eigen::MatrixXd::Identity(4, 4);
    EXPECT_LT(((I - mti.direct) * (mti.total + I) - I).cwiseAbs().maxCoeff(), 1e-13);
}

// Keystone index on the chain's M: eps_i = sqrt(1/9 + 1/9) = sqrt(2)/3 for all three;
// p = 10/13, 2/13, 1/13, so KS = log10(sqrt(2)/3 (1 - p)): carnivores rank first.
TEST(Keystone, ChainByHand)
{
    const FlowNetwork net = chain(false);
    const std::vector<KeystoneEntry> ks = keystoneIndices(net, mixedTrophicImpact(net));
    ASSERT_EQ(ks.size(), 3u);
    const double eps = std::sqrt(2.0) / 3.0;
    const double p[3] = {10.0 / 13, 2.0 / 13, 1.0 / 13};
    for (int i = 0; i < 3; ++i) {
        EXPECT_NEAR(ks[i].overallEffect, eps, 1e-14);
        EXPECT_NEAR(ks[i].biomassShare, p[i], 1e-15);
        EXPECT_NEAR(ks[i].keystoneIndex, std::log10(eps * (1 - p[i])), 1e-13);
    }
    EXPECT_EQ(ks[2].rank, 1);
    EXPECT_EQ(ks[1].rank, 2);
    EXPECT_EQ(ks[0].rank, 3);
}

}  // namespace
}  // namespace tl

namespace tl {
namespace {

// From a solved scenario: d is the diet fraction as entered (imported food counts in the
// denominator, so it is DC exactly); f uses predation and catch (landings + dead discards).
TEST(MixedTrophicImpact, ScenarioUsesDietFractionsAndCatch)
{
    const auto [model, sheet, net] = testing::solvedScenario(testing::richWeb());
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);
    const MixedTrophicImpact mti = mixedTrophicImpact(net);
    ASSERT_EQ(mti.names.size(), 9u);  // 8 compartments + 1 fleet
    // Zooplankton (2) on planktivores (4): d = DC = 0.7, f = 0 (zooplankton does not eat
    // planktivores).
    EXPECT_NEAR(mti.direct(2, 4), 0.7, 1e-12);
    // Planktivores (4) on zooplankton (2): zooplankton's losses to predators are
    // benthos 180 x 0.1 = 18 and planktivores 18 x 0.7 = 12.6: f = 12.6 / 30.6, d = 0.
    EXPECT_NEAR(mti.direct(4, 2), -12.6 / 30.6, 1e-12);
    // The fleet (8) on planktivores: their losses are piscivores 2 x 0.6 = 1.2 and catch
    // 0.3 + 0.05 dead discards: f = 0.35 / 1.55. Planktivores in the fleet's "diet":
    // 0.35 of its 0.45 catch.
    EXPECT_NEAR(mti.direct(8, 4), -0.35 / 1.55, 1e-12);
    EXPECT_NEAR(mti.direct(4, 8), 0.35 / 0.45, 1e-12);
    // Detritus (6) takes the composition of its inflow; phytoplankton's share of it:
    const double inflow = net.throughflow(6);
    EXPECT_NEAR(mti.direct(0, 6), net.flows(0, 6) / inflow, 1e-12);
}

}  // namespace
}  // namespace tl
