// PRCC over an ensemble's kept draws (core/sensitivity/ensemble_prcc.h): a planted strong
// driver ranks first; one diet share per drawn row is left out (and named), so no input
// is collinear; the outputs asked for, in their order.
#include <cmath>

#include <gtest/gtest.h>

#include "core/sensitivity/ensemble_prcc.h"
#include "tests/core/sensitivity/sensitivity_models.h"

namespace tl {
namespace {

// The invented hand-worked pond with every value known to 2 % except the grazer's EE
// (CV 60 %): the grazer's B is solved as (Q_pike 0.5 + Y) / (P/B EE), so EE drives it
// (and through it the algae's EE) far more than anything else.
ensemble::KeptDraws plantedDriverDraws(std::uint64_t draws)
{
    Model m = testing::handPond();
    m.rules.cvByGrade = {0.02, 0.02, 0.02, 0.02};
    m.compartment(1).confidenceOf(Param::EE).cv = 0.6;
    ensemble::EnsembleSettings s;
    s.draws = draws;
    s.seed = 42;
    s.threads = 2;
    s.dietCv = 0.02;
    s.catchCv = 0.02;
    s.keepBalancedDraws = true;
    s.analyses.trophicLevels = true;
    const ensemble::EnsembleRun run = ensemble::runEnsemble(m, s);
    EXPECT_TRUE(run.ran());
    return run.kept;
}

TEST(EnsemblePrcc, APlantedStrongDriverRanksFirst)
{
    const ensemble::KeptDraws kept = plantedDriverDraws(3000);
    ASSERT_GT(kept.draw.size(), 1000u);  // EE above 1 breaks a draw; most stay
    const EnsemblePrcc prcc = prccOfKeptDraws(kept, {"Grazer.biomass", "Algae.ee", "Pike.tl"});
    ASSERT_EQ(prcc.table.outputNames, (std::vector<std::string>{"Grazer.biomass", "Algae.ee", "Pike.tl"}));
    for (std::size_t o = 0; o < 2; ++o) {
        const PrccResult& r = prcc.table.outputs[o];
        Eigen::Index strongest = 0;
        r.coefficient.cwiseAbs().maxCoeff(&strongest);
        EXPECT_EQ(prcc.table.inputNames[static_cast<std::size_t>(strongest)], "Grazer.ee") << prcc.table.outputNames[o];
        EXPECT_LT(r.coefficient[strongest], -0.9) << prcc.table.outputNames[o];  // more EE, less B needed
        EXPECT_LT(r.pValue[strongest], 1e-12);
    }
    // Pike's TL depends on its diet only: the grazer's EE has no monotone effect on it.
    const PrccResult& tl = prcc.table.outputs[2];
    const auto ee = std::find(prcc.table.inputNames.begin(), prcc.table.inputNames.end(), "Grazer.ee") -
                    prcc.table.inputNames.begin();
    EXPECT_LT(std::abs(tl.coefficient[ee]), 0.1);
}

TEST(EnsemblePrcc, OneShareOfEachDrawnDietRowIsLeftOutSoNoneIsCollinear)
{
    const ensemble::KeptDraws kept = plantedDriverDraws(800);
    ASSERT_EQ(kept.dietColumns.size(), 2u);  // the grazer's and the pike's rows
    const EnsemblePrcc prcc = prccOfKeptDraws(kept);
    EXPECT_EQ(prcc.leftOut, (std::vector<std::string>{"Grazer.diet:Detritus", "Pike.diet:import"}));
    EXPECT_EQ(prcc.table.inputNames.size(), kept.inputNames.size() - 2);
    for (const std::string& gone : prcc.leftOut)
        EXPECT_EQ(std::count(prcc.table.inputNames.begin(), prcc.table.inputNames.end(), gone), 0);
    // Every output of the draws, and no input is flagged collinear for any of them.
    EXPECT_EQ(prcc.table.outputNames, kept.outputNames);
    for (const PrccResult& r : prcc.table.outputs)
        for (PrccNote n : r.note) EXPECT_NE(n, PrccNote::Collinear);
    // Keeping every share makes the grazer's two shares (x and 1 - x) exactly collinear.
    const PrccTable all = prccTable(kept.inputNames, kept.inputs, {"Algae.ee"}, kept.outputs.col(
        std::find(kept.outputNames.begin(), kept.outputNames.end(), "Algae.ee") - kept.outputNames.begin()));
    const auto share = std::find(kept.inputNames.begin(), kept.inputNames.end(), "Grazer.diet:Algae") - kept.inputNames.begin();
    EXPECT_EQ(all.outputs[0].note[static_cast<std::size_t>(share)], PrccNote::Collinear);
}

}  // namespace
}  // namespace tl
