// EnsembleSummary (core/ensemble/ensemble_summary.h): the summary JSON read back gives the
// run's own figures; the histogram's bars keep every value and put each one within one
// fine bin of where an exact histogram puts it.
#include <cmath>
#include <random>

#include <gtest/gtest.h>

#include "core/ensemble/ensemble.h"
#include "core/ensemble/ensemble_report.h"
#include "core/ensemble/ensemble_summary.h"
#include "tests/support/test_support.h"

namespace tl::ensemble {
namespace {

EnsembleRun lagoonRun(std::uint64_t draws)
{
    // The invented demo lagoon with narrow CVs, so that most draws balance (as in ensemble_test).
    Model m = tl::testing::fixtureModel(std::filesystem::path(TL_SAMPLES_DIR) / "lagoon");
    m.rules.cvByGrade = {0.05, 0.10, 0.15, 0.20};
    EnsembleSettings s;
    s.draws = draws;
    s.seed = 11;
    s.dietCv = 0.1;
    s.analyses.trophicLevels = true;
    return runEnsemble(m, s);
}

TEST(EnsembleSummary, ReadsBackTheRunsOwnFigures)
{
    const EnsembleRun run = lagoonRun(2000);
    ASSERT_TRUE(run.ran());
    const EnsembleStatistics& st = run.statistics;
    std::string why;
    const auto summary = readEnsembleSummary(ensembleJson(st), &why);
    ASSERT_TRUE(summary) << why;
    EXPECT_EQ(summary->draws, st.drawsRun);
    EXPECT_EQ(summary->balanced, st.balanced);
    EXPECT_DOUBLE_EQ(summary->balancedShare, st.balancedShare());
    EXPECT_EQ(summary->seed, "11");
    ASSERT_EQ(summary->outputs.size(), st.outputs.size());
    for (std::size_t k = 0; k < st.outputs.size(); ++k) {
        const OutputSummary& o = summary->outputs[k];
        const PercentileSummary p = st.outputs[k].summary();
        EXPECT_EQ(o.name, st.outputNames[k]);
        EXPECT_EQ(o.count, st.outputs[k].count());
        ASSERT_EQ(o.p2_5.has_value(), p.p2_5.has_value()) << o.name;
        if (p.p2_5) {
            EXPECT_DOUBLE_EQ(*o.p2_5, *p.p2_5) << o.name;
            EXPECT_DOUBLE_EQ(*o.p50, *p.p50) << o.name;
            EXPECT_DOUBLE_EQ(*o.p97_5, *p.p97_5) << o.name;
        }
    }
    std::uint64_t breakers = 0;
    for (const BreakCounts& b : st.breaks) breakers += b.any > 0;
    EXPECT_EQ(summary->breakers.size(), breakers) << "the compartments that broke a draw";
    for (std::size_t k = 1; k < summary->breakers.size(); ++k)
        EXPECT_GE(summary->breakers[k - 1].draws, summary->breakers[k].draws) << "most frequent first";
    EXPECT_GT(breakers, 0u);

    const auto ee = interval95(*summary, st.outputNames.front().substr(0, st.outputNames.front().rfind('.')),
                               st.outputNames.front().substr(st.outputNames.front().rfind('.') + 1));
    ASSERT_TRUE(ee);
    EXPECT_DOUBLE_EQ(ee->low, *st.outputs.front().summary().p2_5);
    EXPECT_DOUBLE_EQ(ee->high, *st.outputs.front().summary().p97_5);
    EXPECT_FALSE(interval95(*summary, "no such compartment", "ee"));
}

TEST(EnsembleSummary, RefusesTextThatIsNoSummary)
{
    std::string why;
    EXPECT_FALSE(readEnsembleSummary("{not json", &why));
    EXPECT_EQ(why, "not a JSON object");
    EXPECT_FALSE(readEnsembleSummary(R"({"draws": 3})", &why));
    EXPECT_NE(why.find("outputs"), std::string::npos);
}

// An exact histogram of the same values, with the same bars, in the test itself.
std::vector<std::uint64_t> exactBars(const std::vector<double>& values, double low, double width, int bars)
{
    std::vector<std::uint64_t> out(static_cast<std::size_t>(bars), 0);
    for (double v : values) {
        const int k = std::clamp(static_cast<int>(std::floor((v - low) / width)), 0, bars - 1);
        ++out[static_cast<std::size_t>(k)];
    }
    return out;
}

TEST(EnsembleSummary, HistogramBarsKeepEveryValueAndMisplaceOnlyNearEdges)
{
    std::mt19937_64 rng(5);
    std::lognormal_distribution<double> lognormal(std::log(3.0), 0.4);
    std::vector<double> values(20000);
    OutputStatistics st(OutputStatistics::scaleExponentOf(3.0));
    for (double& v : values) {
        v = lognormal(rng);
        st.add(v);
    }
    for (int bars : {1, 7, 30}) {
        const HistogramBars h = histogramBars(st, bars);
        ASSERT_EQ(h.counts.size(), std::size_t(bars));
        EXPECT_DOUBLE_EQ(h.low, st.min());
        EXPECT_NEAR(h.low + bars * h.width, st.max(), 1e-12 * st.max());
        std::uint64_t total = 0;
        for (auto c : h.counts) total += c;
        EXPECT_EQ(total, values.size()) << bars << " bars";
        const auto exact = exactBars(values, h.low, h.width, bars);
        for (int k = 0; k < bars; ++k) {
            // Values within one fine bin (relative 2^-7) of the bar's edges may sit on either side.
            std::uint64_t nearEdge = 0;
            for (double v : values)
                for (double edge : {h.low + k * h.width, h.low + (k + 1) * h.width})
                    nearEdge += std::abs(v - edge) <= std::ldexp(std::abs(v), -7);
            const auto diff = static_cast<std::int64_t>(h.counts[std::size_t(k)]) - static_cast<std::int64_t>(exact[std::size_t(k)]);
            EXPECT_LE(std::abs(diff), static_cast<std::int64_t>(nearEdge)) << "bar " << k << " of " << bars;
        }
    }
}

TEST(EnsembleSummary, HistogramOfOneValueIsOneBar)
{
    OutputStatistics st(OutputStatistics::scaleExponentOf(2.0));
    for (int k = 0; k < 5; ++k) st.add(2.0);
    const HistogramBars h = histogramBars(st, 10);
    ASSERT_EQ(h.counts.size(), 1u);
    EXPECT_EQ(h.counts[0], 5u);
    EXPECT_EQ(h.width, 0.0);
    EXPECT_TRUE(histogramBars(OutputStatistics(0), 10).counts.empty());
}

}  // namespace
}  // namespace tl::ensemble
