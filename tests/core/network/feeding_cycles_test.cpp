// Feeding-cycle removal (Ulanowicz 1983) and the trophic aggregation built on it
// (Ulanowicz & Kemp 1979; Ulanowicz 1995): hand-worked small webs, the enumeration
// budget, and the effective trophic levels of the published networks of the enaR data
// collection (Borrett & Lau 2014, Methods Ecol Evol 5:1206) against the figures of
// enaR's trophic aggregation (enaTroAgg, which removes feeding cycles first), copied
// from shared/reference/reference.json into tests/fixtures/reference/expected_etl.tsv.
#include "core/network/feeding_cycles.h"

#include <cmath>
#include <fstream>
#include <iostream>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "tests/support/network_models.h"
#include "tests/support/test_support.h"

#include "core/io/scor.h"
#include "core/network/flow_network.h"
#include "core/network/level_decomposition.h"

namespace tl {
namespace {

TEST(FeedingCycles, TwoCompartmentLoopLosesItsWeakArcFromEveryArc)
{
    // A -> B 4, B -> A 1, input to A 10: one cycle A -> B -> A, weak arc B -> A (1).
    // Removing it takes 1 from each arc of the cycle (worked by hand).
    Eigen::MatrixXd f(2, 2);
    f << 0, 4, 1, 0;
    const FeedingCycleRemoval r = removeFeedingCycles(f, Eigen::Vector2d(10, 0));
    EXPECT_DOUBLE_EQ(r.residual(0, 1), 3.0);
    EXPECT_DOUBLE_EQ(r.residual(1, 0), 0.0);
    EXPECT_EQ(r.cycles, 1u);
    EXPECT_EQ(r.nexuses, 1u);
    EXPECT_TRUE(r.complete);
}

TEST(FeedingCycles, CannibalismIsRemovedWhole)
{
    Eigen::MatrixXd f(2, 2);
    f << 0, 5, 0, 0.25;
    const FeedingCycleRemoval r = removeFeedingCycles(f, Eigen::Vector2d(5, 0));
    EXPECT_DOUBLE_EQ(r.residual(1, 1), 0.0);
    EXPECT_DOUBLE_EQ(r.residual(0, 1), 5.0);
    EXPECT_DOUBLE_EQ(r.removed(1, 1), 0.25);
}

TEST(FeedingCycles, NexusSharesTheWeakArcByCycleProbability)
{
    // Nodes 0,1,2; input 10 to node 0. Arcs: 0->1 6, 0->2 4, 1->2 3, 2->0 2, 1->0 1.5.
    // Throughflows (living intake + input), fixed at the start: T0 = 13.5, T1 = 6, T2 = 7.
    // Worked by hand:
    //  1. weak arc 1->0 (1.5); its nexus is the one cycle 1->0->1, so 0->1 and 1->0 each
    //     lose 1.5: 0->1 = 4.5, 1->0 = 0;
    //  2. weak arc 2->0 (2); its nexus: 2->0->2 with weight w1 = g20 g02 and 2->0->1->2
    //     with w2 = g20 g01 g12 (g_ij = F_ij / T_i of the original flows); arc 0->2 loses
    //     2 w1/(w1+w2), arcs 0->1 and 1->2 lose 2 w2/(w1+w2), arc 2->0 is emptied.
    Eigen::MatrixXd f(3, 3);
    f << 0, 6, 4, 1.5, 0, 3, 2, 0, 0;
    const FeedingCycleRemoval r = removeFeedingCycles(f, Eigen::Vector3d(10, 0, 0));
    const double g20 = 2.0 / 7.0, g02 = 4.0 / 13.5, g01 = 6.0 / 13.5, g12 = 3.0 / 6.0;
    const double w1 = g20 * g02, w2 = g20 * g01 * g12;
    EXPECT_NEAR(r.residual(1, 0), 0.0, 1e-15);
    EXPECT_NEAR(r.residual(2, 0), 0.0, 1e-15);
    EXPECT_NEAR(r.residual(0, 2), 4.0 - 2.0 * w1 / (w1 + w2), 1e-14);
    EXPECT_NEAR(r.residual(0, 1), 6.0 - 1.5 - 2.0 * w2 / (w1 + w2), 1e-14);
    EXPECT_NEAR(r.residual(1, 2), 3.0 - 2.0 * w2 / (w1 + w2), 1e-14);
    EXPECT_EQ(r.nexuses, 2u);
    EXPECT_EQ(r.cycles, 3u);
}

TEST(FeedingCycles, BudgetStopsAnExplosiveEnumerationAndSaysSo)
{
    // A complete digraph of 10 compartments has about a million simple cycles.
    const int n = 10;
    Eigen::MatrixXd f = Eigen::MatrixXd::Constant(n, n, 1.0);
    for (int i = 0; i < n; ++i) f(i, i) = 0.0;
    for (int i = 0; i < n; ++i) f(i, (i + 1) % n) = 2.0;
    const FeedingCycleRemoval r = removeFeedingCycles(f, Eigen::VectorXd::Ones(n), 1000);
    EXPECT_FALSE(r.complete);
    EXPECT_GT(r.cycles, 1000u);
}

TEST(FeedingCycles, AcyclicWebIsUntouched)
{
    Eigen::MatrixXd f(3, 3);
    f << 0, 5, 1, 0, 0, 2, 0, 0, 0;
    const FeedingCycleRemoval r = removeFeedingCycles(f, Eigen::Vector3d(6, 0, 0));
    EXPECT_EQ(r.residual, f);
    EXPECT_EQ(r.cycles, 0u);
}

using testing::readTsv;

TEST(FeedingCycles, EffectiveTrophicLevelsMatchThePublishedAggregationOn44Networks)
{
    const std::string reference = std::string(TL_FIXTURES_DIR) + "/reference";
    std::map<std::string, std::vector<double>> expected;
    for (const auto& row : readTsv(reference + "/expected_etl.tsv")) expected[row[0]].push_back(std::stod(row[2]));
    ASSERT_EQ(expected.size(), 44u);
    double worst = 0.0;
    std::string worstWhere;
    for (const auto& [slug, etl] : expected) {
        const ScorReadResult read = readScorFile(reference + "/scor/" + slug + ".scor");
        ASSERT_TRUE(read.network.has_value()) << slug;
        const FlowNetwork net = flowNetworkFromScor(*read.network);
        const LevelDecomposition d = decomposeLevels(net);
        ASSERT_TRUE(d.cycleRemoval.complete) << slug;
        const Eigen::VectorXd got = d.effectiveTrophicLevels();
        ASSERT_EQ(static_cast<std::size_t>(got.size()), etl.size()) << slug;
        for (std::size_t i = 0; i < etl.size(); ++i) {
            const double diff = std::abs(got[static_cast<Eigen::Index>(i)] - etl[i]);
            EXPECT_LE(diff, 1e-6) << slug << " node " << i + 1 << " (" << net.names[i] << "): " << got[static_cast<Eigen::Index>(i)]
                                  << " vs " << etl[i];
            if (diff > worst) {
                worst = diff;
                worstWhere = slug + " node " + std::to_string(i + 1);
            }
        }
    }
    std::cout << "[ etl      ] worst absolute difference " << worst << " at " << worstWhere << "\n";
}

TEST(FeedingCycles, CannibalismNoLongerSpreadsAConsumerOverManyLevels)
{
    // Producer 0 -> consumer 1 (100), consumer 1 eats itself (5): kept, the cannibal's
    // chains run on for ever (level I, II, III, ...); removed, it is at level II only.
    const FlowNetwork net = testing::handNetwork(
        {{"Alga", NodeRole::Producer, 10, 100, 0, 0, 100}, {"Snail", NodeRole::Consumer, 5, 0, 0, 105, 10}},
        {{0, 1, 100}, {1, 1, 5}});
    const LevelDecomposition kept = decomposeLevels(net, 30, FeedingCycles::Kept);
    const LevelDecomposition removed = decomposeLevels(net);
    EXPECT_GT(kept.combined.share(1, 2), 0.0);                  // some of the snail at level III
    EXPECT_NEAR(removed.combined.share(1, 1), 1.0, 1e-15);      // all of it at level II
    EXPECT_NEAR(removed.effectiveTrophicLevels()[1], 2.0, 1e-15);
    EXPECT_GT(kept.effectiveTrophicLevels()[1], 2.0);
}

}  // namespace
}  // namespace tl
