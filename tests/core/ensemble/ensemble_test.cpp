// The ensemble run (core/ensemble/ensemble.h): reproducible for any thread count, slices
// that merge into exactly the one-run result, draws judged as solveBalance judges them,
// kept draws that are the draws, and the partial result's round trip.
#include <algorithm>
#include <atomic>
#include <map>
#include <set>

#include <gtest/gtest.h>

#include "core/balance/solver.h"
#include "core/ensemble/ensemble.h"
#include "core/ensemble/ensemble_report.h"
#include "core/model/problem_codes.h"
#include "tests/bench/synthetic_model.h"
#include "tests/support/test_support.h"

namespace tl::ensemble {
namespace {

using tl::testing::fixtureModel;

// The invented demo lagoon (sample_projects/lagoon): 32 compartments, balanced at its
// point values, graded confidence, two fleets.
// With the project's CVs per grade (A-D: 10, 25, 50, 80 %; ungraded values count as C)
// about 2 % of its draws balance; the tests narrow the CVs (5-20 %) so that most of
// them do and every output is summarised over many draws.
Model lagoon()
{
    Model m = fixtureModel(std::filesystem::path(TL_SAMPLES_DIR) / "lagoon");
    m.rules.cvByGrade = {0.05, 0.10, 0.15, 0.20};
    return m;
}

EnsembleSettings settings(std::uint64_t draws, unsigned threads)
{
    EnsembleSettings s;
    s.draws = draws;
    s.seed = 20261202;
    s.threads = threads;
    s.dietCv = 0.1;
    return s;
}

TEST(EnsembleInputs, EachDietRowDrawsWithItsOwnConfidence)
{
    // Order: a per-run CV for the row, then the row's data confidence, then the run's
    // diet CV for rows without one (ensemble_inputs.h).
    Model model = lagoon();
    std::vector<std::size_t> rows;  // consumers with two or more non-zero shares
    for (std::size_t j = 0; j < model.size(); ++j)
        if (model.compartment(j).kind == CompartmentKind::Consumer && model.dietRow(j).size() >= 2) rows.push_back(j);
    ASSERT_GE(rows.size(), 3u);
    model.compartment(rows[0]).dietConfidence.grade = Confidence::Grade::D;  // 0.20 in lagoon()
    model.compartment(rows[1]).dietConfidence.cv = 0.33;
    model.compartment(rows[2]).dietConfidence.cv = 0.33;
    EnsembleSettings s = settings(10, 1);
    s.dietCvOf[rows[2]] = 0.05;
    const BalancePlan plan = BalancePlan::build(model);
    const EnsembleInputs inputs = EnsembleInputs::build(model, plan, s);
    std::map<std::size_t, double> expectedCv = {{rows[0], 0.20}, {rows[1], 0.33}, {rows[2], 0.05}};
    int checked = 0;
    for (const DrawnDietRow& row : inputs.dietRows()) {
        const auto& shares = row.distribution.shares();
        const double largest = *std::max_element(shares.begin(), shares.end());
        const auto it = expectedCv.find(row.predator);
        const double cv = it != expectedCv.end() ? it->second : *s.dietCv;
        EXPECT_DOUBLE_EQ(row.distribution.concentration(), DirichletRow::concentrationFor(largest, cv))
            << model.compartment(row.predator).name;
        if (it == expectedCv.end()) continue;
        // The row's own CV must make a difference here (not both at the concentration floor).
        EXPECT_NE(DirichletRow::concentrationFor(largest, cv), DirichletRow::concentrationFor(largest, *s.dietCv));
        ++checked;
    }
    EXPECT_EQ(checked, 3);
}

TEST(Ensemble, SameSeedGivesTheSameBitsFor1_2And4Threads)
{
    const Model model = lagoon();
    for (const Analyses analyses : {Analyses{}, Analyses{true, true, true}}) {
        const std::uint64_t draws = analyses.levels ? 300 : 3000;
        const EnsembleRun one = runEnsemble(model, [&] { auto s = settings(draws, 1); s.analyses = analyses; return s; }());
        ASSERT_TRUE(one.ran());
        EXPECT_EQ(one.statistics.drawsRun, draws);
        EXPECT_GT(one.statistics.balanced, 0u);
        EXPECT_LT(one.statistics.balanced, draws) << "the demo's grade C and D inputs break the balance sometimes";
        for (unsigned threads : {2u, 4u}) {
            auto s = settings(draws, threads);
            s.analyses = analyses;
            const EnsembleRun many = runEnsemble(model, s);
            EXPECT_TRUE(many.statistics == one.statistics) << threads << " threads";
            EXPECT_EQ(ensembleJson(many.statistics), ensembleJson(one.statistics)) << threads << " threads";
        }
    }
}

TEST(Ensemble, SlicesMergeIntoExactlyTheOneRunResult)
{
    const Model model = lagoon();
    EnsembleSettings whole = settings(2000, 2);
    whole.analyses.trophicLevels = true;
    const EnsembleRun all = runEnsemble(model, whole);
    ASSERT_TRUE(all.ran());
    // Three uneven slices, merged in an order other than theirs, via their partial JSON.
    const std::vector<DrawRange> slices = {{1500, 1999}, {0, 666}, {667, 1499}};
    std::optional<EnsembleStatistics> merged;
    for (const DrawRange& r : slices) {
        EnsembleSettings s = whole;
        s.range = r;
        s.threads = 1;
        const EnsembleRun part = runEnsemble(model, s);
        ASSERT_TRUE(part.ran());
        EXPECT_FALSE(part.statistics.complete());
        Problems problems;
        auto read = readPartialJson(partialJson(part.statistics), "slice", problems);
        ASSERT_TRUE(read) << (problems.empty() ? "" : problems[0].message);
        EXPECT_TRUE(*read == part.statistics) << "partial JSON round trip";
        if (!merged) merged = *read;
        else {
            std::string why;
            ASSERT_TRUE(merged->merge(*read, &why)) << why;
        }
    }
    EXPECT_TRUE(merged->complete());
    EXPECT_TRUE(*merged == all.statistics);
    EXPECT_EQ(ensembleJson(*merged), ensembleJson(all.statistics));
}

TEST(Ensemble, MergeRefusesOverlapsAndOtherEnsembles)
{
    const Model model = lagoon();
    EnsembleSettings s = settings(400, 1);
    s.range = DrawRange{0, 199};
    const EnsembleStatistics a = runEnsemble(model, s).statistics;
    s.range = DrawRange{150, 399};
    const EnsembleStatistics overlapping = runEnsemble(model, s).statistics;
    s.range = DrawRange{200, 399};
    s.seed += 1;
    const EnsembleStatistics otherSeed = runEnsemble(model, s).statistics;
    s.seed -= 1;
    s.shape = Shape::Uniform;
    const EnsembleStatistics otherShape = runEnsemble(model, s).statistics;
    std::string why;
    EnsembleStatistics m = a;
    EXPECT_FALSE(m.merge(overlapping, &why));
    EXPECT_NE(why.find("overlap"), std::string::npos) << why;
    EXPECT_FALSE(m.merge(otherSeed, &why));
    EXPECT_FALSE(m.merge(otherShape, &why));
    EXPECT_TRUE(m == a) << "a refused merge changes nothing";
}

// Independent of the ensemble's fast checks: each draw written into a copy of the
// scenario and solved the full way; its status and the compartments its error problems
// name must match the ensemble's counts.
void expectDrawsJudgedAsSolveBalance(const Model& model, const EnsembleSettings& s, std::uint64_t minBalanced,
                                     std::uint64_t maxBalanced)
{
    const EnsembleRun run = runEnsemble(model, s);
    ASSERT_TRUE(run.ran());
    const BalancePlan plan = BalancePlan::build(model);
    const EnsembleInputs inputs = EnsembleInputs::build(model, plan, s);
    BalanceInputs in = inputs.pointInputs();
    std::vector<double> values(inputs.size());
    std::uint64_t balanced = 0;
    std::vector<std::uint64_t> breaks(model.size(), 0);
    for (std::uint64_t d = 0; d < s.draws; ++d) {
        inputs.draw(s.seed, d, in, values.data());
        Model drawn = model;
        inputs.applyToModel(values.data(), drawn);
        const BalanceSheet sheet = solveBalance(drawn);
        balanced += sheet.status == BalanceStatus::Balanced;
        std::set<std::size_t> broken;
        for (const Problem& p : sheet.problems)
            if (p.severity == Severity::Error) broken.insert(*model.indexOf(p.compartment));
        for (std::size_t i : broken) ++breaks[i];
    }
    EXPECT_EQ(run.statistics.balanced, balanced);
    EXPECT_GE(balanced, minBalanced) << "some draws balance";
    EXPECT_LE(balanced, maxBalanced) << "some draws break the balance";
    for (std::size_t i = 0; i < model.size(); ++i) EXPECT_EQ(run.statistics.breaks[i].any, breaks[i]) << model.compartment(i).name;
}

TEST(Ensemble, DrawsAreJudgedAsSolveBalanceJudgesThem)
{
    expectDrawsJudgedAsSolveBalance(lagoon(), settings(400, 1), 20, 380);
    // The invented reservoir: unbalanced at its point values (two EE just above 1).
    Model reservoir = fixtureModel(std::filesystem::path(TL_SAMPLES_DIR) / "reservoir");
    reservoir.rules.cvByGrade = {0.05, 0.10, 0.15, 0.20};
    {
        SCOPED_TRACE("reservoir");
        expectDrawsJudgedAsSolveBalance(reservoir, settings(400, 2), 1, 399);
    }
    // Synthetic webs whose unknowns couple equations: unknown B (dense LU), unknown Q/B
    // and P/Q standing in (least squares, solved P/B and Q/B checked for sign).
    for (const bench::UnknownMix mix : {bench::UnknownMix::EEBiomass, bench::UnknownMix::EEQbPq}) {
        Model web = bench::syntheticModel(40, mix, 3).model;
        web.rules.cvByGrade = {0.1, 0.1, 0.1, 0.1};
        SCOPED_TRACE(std::string(bench::mixKey(mix)));
        // ee-qb-pq has more equations than unknowns (a fully given prey pins a Q/B): once
        // its inputs are drawn, that prey's equation no longer closes, so no draw
        // balances (equation-residual), as solveBalance says too.
        expectDrawsJudgedAsSolveBalance(web, settings(300, 2), mix == bench::UnknownMix::EEQbPq ? 0 : 1, 299);
    }
}

TEST(Ensemble, KeptDrawsAreTheBalancedDrawsInOrderWithTheirSolvedValues)
{
    const Model model = lagoon();
    EnsembleSettings s = settings(300, 2);
    s.keepBalancedDraws = true;
    s.analyses.trophicLevels = true;
    const EnsembleRun run = runEnsemble(model, s);
    const KeptDraws& kept = run.kept;
    ASSERT_EQ(kept.draw.size(), run.statistics.balanced);
    ASSERT_GT(kept.draw.size(), 20u);
    ASSERT_EQ(static_cast<std::size_t>(kept.inputs.cols()), kept.inputNames.size());
    ASSERT_EQ(static_cast<std::size_t>(kept.outputs.cols()), kept.outputNames.size());
    EXPECT_TRUE(std::is_sorted(kept.draw.begin(), kept.draw.end()));
    // Check a few rows against the full solve of the same draw.
    const BalancePlan plan = BalancePlan::build(model);
    const EnsembleInputs inputs = EnsembleInputs::build(model, plan, s);
    BalanceInputs in = inputs.pointInputs();
    std::vector<double> values(inputs.size());
    for (std::size_t r = 0; r < kept.draw.size(); r += 37) {
        inputs.draw(s.seed, kept.draw[r], in, values.data());
        for (std::size_t c = 0; c < values.size(); ++c) EXPECT_EQ(kept.inputs(static_cast<Eigen::Index>(r), static_cast<Eigen::Index>(c)), values[c]);
        Model drawn = model;
        inputs.applyToModel(values.data(), drawn);
        const BalanceSheet sheet = solveBalance(drawn);
        ASSERT_EQ(sheet.status, BalanceStatus::Balanced);
        for (std::size_t k = 0; k < kept.outputNames.size(); ++k) {
            const std::string& name = kept.outputNames[k];
            const auto dot = name.rfind('.');
            const CompartmentBalance& row = sheet.rows[*model.indexOf(name.substr(0, dot))];
            const std::string q = name.substr(dot + 1);
            const double expected = q == "biomass" ? row.biomass : q == "pb" ? row.pb : q == "qb" ? row.qb : q == "ee" ? row.ee
                                  : q == "pq" ? row.pq : row.tl;
            EXPECT_NEAR(kept.outputs(static_cast<Eigen::Index>(r), static_cast<Eigen::Index>(k)), expected, 1e-9 * std::abs(expected))
                << name << " of draw " << kept.draw[r];
        }
    }
    const std::string csv = keptDrawsCsv(kept);
    EXPECT_EQ(static_cast<std::size_t>(std::count(csv.begin(), csv.end(), '\n')), kept.draw.size() + 1);
}

TEST(Ensemble, RefusesBadSettingsAndStopsWhenCancelled)
{
    const Model model = lagoon();
    EXPECT_FALSE(runEnsemble(model, settings(0, 1)).ran());
    EnsembleSettings s = settings(100, 1);
    s.range = DrawRange{50, 100};
    EXPECT_FALSE(runEnsemble(model, s).ran());
    std::atomic<bool> cancel{true};
    const EnsembleRun cancelled = runEnsemble(model, settings(100000, 2), &cancel);
    ASSERT_TRUE(cancelled.ran());
    EXPECT_TRUE(cancelled.statistics.cancelled);
    EXPECT_LT(cancelled.statistics.drawsRun, 100000u);
    std::uint64_t lastDone = 0, calls = 0;
    runEnsemble(model, settings(500, 2), nullptr, [&](std::uint64_t done, std::uint64_t total) {
        EXPECT_EQ(total, 500u);
        EXPECT_GE(done, lastDone);
        lastDone = done;
        ++calls;
    });
    EXPECT_EQ(lastDone, 500u);
    EXPECT_GE(calls, 1u);
}

// Kept draws are held in memory: a run that could keep more than kMaxKeptNumbers is
// refused before any draw, naming how many draws of this scenario fit (issue 12, item 11).
TEST(Ensemble, KeepingMoreDrawsThanMemoryAllowsIsRefusedUpFrontNamingWhatFits)
{
    const Model model = lagoon();
    EnsembleSettings s = settings(kMaxKeptNumbers, 2);  // at least one number per draw: over the limit
    s.keepBalancedDraws = true;
    const EnsembleRun refused = runEnsemble(model, s);
    ASSERT_FALSE(refused.ran());
    EXPECT_EQ(refused.statistics.drawsRun, 0u);
    ASSERT_EQ(refused.problems.size(), 1u);
    EXPECT_EQ(refused.problems[0].code, code::kEnsembleSettings);
    EnsembleSettings small = settings(50, 1);
    small.keepBalancedDraws = true;
    const KeptDraws kept = runEnsemble(model, small).kept;
    const std::uint64_t perDraw = kept.inputNames.size() + kept.outputNames.size() + 1;
    EXPECT_NE(refused.problems[0].message.find("at most " + std::to_string(kMaxKeptNumbers / perDraw) + " draws"),
              std::string::npos)
        << refused.problems[0].message;
    // The same count without kept draws streams its statistics and is not refused
    // (cancelled at once: only the refusal is under test).
    s.keepBalancedDraws = false;
    std::atomic<bool> cancel{true};
    EXPECT_TRUE(runEnsemble(model, s, &cancel).ran());
}

TEST(Ensemble, OutputsAreSummarisedOverBalancedDrawsAroundThePointEstimate)
{
    const Model model = lagoon();
    const EnsembleRun run = runEnsemble(model, settings(4000, 2));
    const BalanceSheet point = solveBalance(model);
    const EnsembleStatistics& st = run.statistics;
    for (std::size_t k = 0; k < st.outputNames.size(); ++k) {
        const std::string& name = st.outputNames[k];
        if (name.ends_with(".biomass")) {
            const double b = point.rows[*model.indexOf(name.substr(0, name.size() - 8))].biomass;
            const PercentileSummary p = st.outputs[k].summary();
            ASSERT_TRUE(p.p2_5 && p.p97_5 && p.p50);
            EXPECT_LE(*p.p2_5, *p.p50);
            EXPECT_LE(*p.p50, *p.p97_5);
            // A wide band: the point value lies inside the 95 % interval of the balanced draws.
            EXPECT_LE(*p.p2_5, b) << name;
            EXPECT_GE(*p.p97_5, b) << name;
            EXPECT_EQ(st.outputs[k].count(), st.balanced);
        }
    }
}

}  // namespace
}  // namespace tl::ensemble
