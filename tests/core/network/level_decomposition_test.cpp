// Level decomposition (trophic aggregation, Ulanowicz 1995) and transfer efficiency.
#include <cmath>

#include <gtest/gtest.h>

#include "core/balance/solver.h"
#include "core/network/flow_network.h"
#include "core/network/flow_trophic_level.h"
#include "core/network/level_decomposition.h"
#include "tests/support/network_models.h"

namespace tl {
namespace {

// Four-level chain, 10 % transfer at each step (common practice, no source): TE = 0.10 at
// every level of the producer-based chains and at II-IV combined; every compartment's
// throughput sits at exactly one integer level.
TEST(LevelDecomposition, TenPercentChainHasTenPercentAtEveryLevel)
{
    const auto [model, sheet, net] = testing::solvedScenario(testing::tenPercentChain());
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced) << (sheet.problems.empty() ? "" : sheet.problems[0].message);
    const LevelDecomposition levels = decomposeLevels(net);

    ASSERT_EQ(levels.levelCount(), 4);
    for (int k = 1; k < 4; ++k) {
        EXPECT_NEAR(levels.fromProducers.levels[k].te, 0.10, 1e-12) << "level " << k + 1;
        EXPECT_NEAR(levels.combined.levels[k].te, 0.10, 1e-12) << "level " << k + 1;
    }
    // No transfer efficiency at level I (it mixes producers and detritus); instead the
    // grazed share of primary production, 100 of 1000, and of detritus inflow, none.
    for (const ChainDecomposition* c : {&levels.fromProducers, &levels.fromDetritus, &levels.combined})
        EXPECT_TRUE(std::isnan(c->levels[0].te));
    EXPECT_NEAR(levels.primaryProductionConsumed, 0.1, 1e-12);
    EXPECT_NEAR(levels.detritusInflowConsumed, 0.0, 1e-15);
    // Production ratio P_(k+1) / P_k, each compartment at one level: from the sheet.
    for (int k = 0; k < 3; ++k)
        EXPECT_NEAR(levels.combined.levels[k].productionRatio, sheet.rows[k + 1].production / sheet.rows[k].production,
                    1e-12) << "level " << k + 1;
    EXPECT_TRUE(std::isnan(levels.combined.levels[3].productionRatio));
    EXPECT_DOUBLE_EQ(levels.combined.levels[0].biomassDetritus, net.stocks[4]);
    EXPECT_NEAR(levels.fromProducers.meanTe, 0.10, 1e-12);
    EXPECT_NEAR(levels.combined.meanTe, 0.10, 1e-12);

    // Throughput 1000, 100, 10, 1 (algae P, then each consumer's Q); biomass 100, 10, 1, 0.1.
    const double throughput[] = {1000, 100, 10, 1}, biomass[] = {100, 10, 1, 0.1};
    for (int k = 0; k < 4; ++k) {
        EXPECT_NEAR(levels.fromProducers.levels[k].throughput, throughput[k], 1e-9);
        EXPECT_NEAR(levels.fromProducers.levels[k].biomass, biomass[k], 1e-12);
    }
    EXPECT_NEAR(levels.combined.levels[3].catchTotal, 0.1, 1e-12);

    // Integer levels: each compartment's shares are one 1 and zeros.
    const int expectedLevel[] = {1, 2, 3, 4, 1};
    for (Eigen::Index j = 0; j < 5; ++j)
        for (Eigen::Index k = 0; k < 4; ++k)
            EXPECT_EQ(levels.combined.share(j, k), k + 1 == expectedLevel[j] ? 1.0 : 0.0) << net.names[j] << " " << k;

    // Detritus: inflow = non-grazed algae 900 + egestion 0.2 x (100 + 10 + 1) = 922.2, none
    // eaten, all exported: its chains hold level I only.
    EXPECT_NEAR(levels.fromDetritus.levels[0].throughput, 922.2, 1e-9);
    EXPECT_EQ(levels.fromDetritus.levels[1].throughput, 0.0);
}

// Omnivore eating half producer, half herbivore (invented): half its throughput at
// level II, half at level III; the mean level equals its trophic level 2.5.
TEST(LevelDecomposition, OmnivoreSplitsOverTwoLevels)
{
    const FlowNetwork net = testing::omnivoreWeb(60, 14);
    const LevelDecomposition d = decomposeLevels(net);
    ASSERT_EQ(d.levelCount(), 3);
    EXPECT_DOUBLE_EQ(d.combined.share(2, 1), 0.5);
    EXPECT_DOUBLE_EQ(d.combined.share(2, 2), 0.5);
    // Level II throughput: herbivore 20 + half the omnivore's 4; level III: 2.
    EXPECT_DOUBLE_EQ(d.combined.levels[1].throughput, 22.0);
    EXPECT_DOUBLE_EQ(d.combined.levels[2].throughput, 2.0);
    // Passed up from II: herbivore's 2 to the omnivore; TE II = 2 / 22 (half of the
    // omnivore's export 0.5 is at level II: (2 + 0.25) / 22).
    EXPECT_DOUBLE_EQ(d.combined.levels[1].te, (2.0 + 0.25) / 22.0);
    const FlowTrophicLevels tl = flowTrophicLevels(net);
    double meanLevel = 0;
    for (Eigen::Index k = 0; k < 3; ++k) meanLevel += static_cast<double>(k + 1) * d.combined.share(2, k);
    EXPECT_DOUBLE_EQ(meanLevel, tl.tl[2]);
    EXPECT_DOUBLE_EQ(tl.tl[2], 2.5);
}

// With feeding cycles kept (the labelled option), cannibalism makes chains of every
// length: the series is cut and its remainder kept, so the shares still sum to 1 and
// their mean is still the trophic level.
TEST(LevelDecomposition, KeptFeedingCycleKeepsSharesAndMeanLevel)
{
    const auto [model, sheet, net] = testing::solvedScenario(testing::richWeb());
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);
    const FlowTrophicLevels tl = flowTrophicLevels(net);
    const LevelDecomposition shallow = decomposeLevels(net, 6, FeedingCycles::Kept),
                             d = decomposeLevels(net, 30, FeedingCycles::Kept);
    ASSERT_EQ(shallow.levelCount(), 6);
    for (std::size_t j = 0; j < net.size(); ++j) {
        const Eigen::Index J = static_cast<Eigen::Index>(j);
        EXPECT_NEAR(shallow.combined.share.row(J).sum(), 1.0, 1e-12) << net.names[j];
        EXPECT_NEAR(d.combined.share.row(J).sum(), 1.0, 1e-12) << net.names[j];
        double mean = 0, meanShallow = 0;
        for (Eigen::Index k = 0; k < d.combined.share.cols(); ++k) mean += static_cast<double>(k + 1) * d.combined.share(J, k);
        for (Eigen::Index k = 0; k < 6; ++k) meanShallow += static_cast<double>(k + 1) * shallow.combined.share(J, k);
        // The remainder sits at the last level kept, so a cut series gives a lower bound
        // on the mean level; with the default depth the cut-off chains are negligible.
        EXPECT_LE(meanShallow, tl.tl[j] + 1e-12) << net.names[j];
        EXPECT_NEAR(mean, tl.tl[j], 1e-10) << net.names[j];
        EXPECT_NEAR(tl.tl[j], sheet.rows[j].tl, 1e-12) << net.names[j] << " flow TL vs diet TL";
    }
    // Producer- plus detritus-based shares make the combined ones.
    EXPECT_LT((d.fromProducers.share + d.fromDetritus.share - d.combined.share).cwiseAbs().maxCoeff(), 1e-15);
    // Throughput over levels adds up to the throughflow of all nodes.
    double total = 0, perLevel = 0;
    for (std::size_t j = 0; j < net.size(); ++j) total += net.throughflow(j);
    for (const auto& bin : d.combined.levels) perLevel += bin.throughput;
    EXPECT_NEAR(perLevel, total, 1e-9 * total);
}

// With feeding cycles removed first (the default, the published method), chains are
// finite: every consumer's shares sum to 1 within a few levels, no cut is needed, the
// mean level is the aggregation's ETL, and throughput over levels still adds up.
TEST(LevelDecomposition, RemovedFeedingCyclesGiveFiniteChains)
{
    const auto [model, sheet, net] = testing::solvedScenario(testing::richWeb());
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);
    const LevelDecomposition d = decomposeLevels(net);
    ASSERT_EQ(d.cycles, FeedingCycles::Removed);
    EXPECT_GT(d.cycleRemoval.cycles, 0u) << "the rich web has cannibalism";
    EXPECT_LT(d.levelCount(), 8);
    const Eigen::VectorXd etl = d.effectiveTrophicLevels();
    for (std::size_t j = 0; j < net.size(); ++j) {
        const Eigen::Index J = static_cast<Eigen::Index>(j);
        EXPECT_NEAR(d.combined.share.row(J).sum(), 1.0, 1e-12) << net.names[j];
        EXPECT_GE(etl[J], 1.0) << net.names[j];
    }
    double total = 0, perLevel = 0;
    for (std::size_t j = 0; j < net.size(); ++j) total += net.throughflow(j);
    for (const auto& bin : d.combined.levels) perLevel += bin.throughput;
    EXPECT_NEAR(perLevel, total, 1e-9 * total);
}

}  // namespace
}  // namespace tl
