// The report's view of stored runs (core/io/stored_run_summary.h): an ensemble run read
// back from the very JSON core/ensemble writes (figures equal to its statistics), a
// reconcile run's changes, and JSON that cannot be read named instead of shown raw.
// Project: the invented lagoon sample (sample_projects/README.md).
#include "core/io/stored_run_summary.h"

#include <gtest/gtest.h>

#include "core/ensemble/ensemble.h"
#include "core/ensemble/ensemble_report.h"
#include "core/io/html_report.h"
#include "core/io/text_table.h"
#include "core/store/model_source.h"
#include "tests/support/test_support.h"

namespace tl {
namespace {

namespace fs = std::filesystem;

Project lagoon()
{
    ModelSource source = readModelSource(fs::path(TL_SAMPLES_DIR) / "lagoon.tledger");
    if (!source.project) ADD_FAILURE() << "lagoon.tledger does not open";
    return source.project ? std::move(*source.project) : Project{};
}

ensemble::EnsembleStatistics runOn(const Model& model, bool systemOutputs)
{
    ensemble::EnsembleSettings settings;
    settings.draws = 400;
    settings.seed = 11;
    settings.analyses.levels = settings.analyses.indicators = systemOutputs;
    const ensemble::EnsembleRun run = ensemble::runEnsemble(model, settings);
    EXPECT_TRUE(run.ran());
    return run.statistics;
}

StoredRun storedEnsemble(const std::string& scenario, const ensemble::EnsembleStatistics& stats)
{
    return {0, scenario, "ensemble", "{}", ensemble::ensembleJson(stats), "2026-12-02T10:00:00Z"};
}

std::size_t outputIndex(const ensemble::EnsembleStatistics& stats, const std::string& name)
{
    for (std::size_t k = 0; k < stats.outputNames.size(); ++k)
        if (stats.outputNames[k] == name) return k;
    ADD_FAILURE() << name << " is not an output";
    return 0;
}

TEST(StoredRunSummary, EnsembleFiguresAreTheRunsOwn)
{
    const Project project = lagoon();
    const Scenario& s = *project.findScenario("clam raking closed");
    const ensemble::EnsembleStatistics stats = runOn(s.model, true);
    ASSERT_GT(stats.balanced, 0u) << "the test needs some balanced draws";
    const EnsembleRunSummary e = readEnsembleRun(storedEnsemble(s.name, stats));
    ASSERT_TRUE(e.error.empty()) << e.error;
    EXPECT_EQ(e.draws, 400);
    EXPECT_EQ(e.seed, "11");
    EXPECT_EQ(e.balancedDraws, static_cast<long long>(stats.balanced));
    EXPECT_DOUBLE_EQ(e.balancedShare, stats.balancedShare());
    EXPECT_TRUE(e.complete);
    EXPECT_FALSE(e.cancelled);
    // Every key output the run holds, in the table's order; TE in percent.
    ASSERT_EQ(e.keyOutputs.size(), kKeyEnsembleOutputs.size()) << "the lagoon has a catch: every key output is there";
    for (std::size_t r = 0; r < e.keyOutputs.size(); ++r) {
        const EnsembleRunSummary::Row& row = e.keyOutputs[r];
        EXPECT_EQ(row.output, kKeyEnsembleOutputs[r].output);
        const ensemble::PercentileSummary p = stats.outputs[outputIndex(stats, row.output)].summary();
        const double scale = row.unit == KeyOutputUnit::Percent ? 100.0 : 1.0;
        ASSERT_TRUE(row.p50 && p.p50) << row.output;
        EXPECT_NEAR(*row.p50, scale * *p.p50, 1e-12 * std::abs(scale * *p.p50)) << row.output;
        EXPECT_NEAR(*row.p2_5, scale * *p.p2_5, 1e-12 * std::abs(scale * *p.p2_5)) << row.output;
        EXPECT_NEAR(*row.p97_5, scale * *p.p97_5, 1e-12 * std::abs(scale * *p.p97_5)) << row.output;
        EXPECT_EQ(row.count, static_cast<long long>(stats.balanced));
    }
    // Balance breakers, most often first, with the run's counts.
    ASSERT_FALSE(e.breakers.empty());
    for (std::size_t k = 1; k < e.breakers.size(); ++k) EXPECT_GE(e.breakers[k - 1].draws, e.breakers[k].draws);
    std::uint64_t most = 0;
    for (const ensemble::BreakCounts& b : stats.breaks) most = std::max(most, b.any);
    EXPECT_EQ(e.breakers.front().draws, static_cast<long long>(most));
}

TEST(StoredRunSummary, WithoutSystemOutputsTheEeOfTheFirstCompartments)
{
    const Project project = lagoon();
    const Scenario& s = *project.findScenario("clam raking closed");
    const ensemble::EnsembleStatistics stats = runOn(s.model, false);
    const EnsembleRunSummary e = readEnsembleRun(storedEnsemble(s.name, stats));
    ASSERT_EQ(e.keyOutputs.size(), kMostEeRows);
    EXPECT_EQ(e.keyOutputs.front().output, s.model.compartment(0).name + ".ee") << "in the run's own order";
    EXPECT_EQ(e.keyOutputs.size() + e.outputsLeftOut, s.model.size());
}

TEST(StoredRunSummary, ReportShowsATableNotTheJson)
{
    Project project = lagoon();
    const Scenario& s = *project.findScenario("clam raking closed");
    const ensemble::EnsembleStatistics stats = runOn(s.model, true);
    project.runs.push_back(storedEnsemble(s.name, stats));
    project.runs.push_back({0, s.name, "ensemble", "{}", "{\"draws\": 10, \"outp", "2026-12-01T00:00:00Z"});
    project.runs.push_back({0, s.name, "future kind", "{}", "{}", "2026-11-30T00:00:00Z"});
    ReportOptions o;
    o.scenarios = {s.name};
    const std::string html = makeHtmlReport(project, o).html;
    EXPECT_EQ(html.find("\"balanced_share\""), std::string::npos) << "no raw JSON";
    EXPECT_EQ(html.find("<pre>"), std::string::npos);
    const auto at = html.find("<h3>Ensemble of 2026-12-02</h3>");
    ASSERT_NE(at, std::string::npos);
    EXPECT_NE(html.find("400 draws, seed 11", at), std::string::npos);
    EXPECT_NE(html.find("balanced in " + std::to_string(stats.balanced) + " draws", at), std::string::npos);
    const ensemble::PercentileSummary te = stats.outputs[outputIndex(stats, "system.mean_te")].summary();
    EXPECT_NE(html.find("<td class=\"text\">Mean TE, levels II-IV</td><td class=\"text\">%</td><td>" +
                            displayNumber(100 * *te.p2_5) + "</td><td>" + displayNumber(100 * *te.p50) + "</td>", at),
              std::string::npos);
    EXPECT_NE(html.find("Only " + std::to_string(stats.balanced) + " draws balanced", at), std::string::npos)
        << "few balanced draws are said to be few";
    // The broken run is named, not shown; the unknown kind is mentioned.
    EXPECT_NE(html.find("<h3>Ensemble of 2026-12-01</h3>\n<p><em>the stored ensemble run&#39;s summary is not valid JSON"),
              std::string::npos);
    EXPECT_NE(html.find("A stored future kind run of 2026-11-30 is kept in the project"), std::string::npos);
    // Runs of other scenarios stay out of this scenario's section.
    project.runs.push_back(storedEnsemble("baseline", stats));
    const std::string again = makeHtmlReport(project, o).html;
    EXPECT_EQ(again.find("Ensemble of", again.find("Ensemble of 2026-12-01") + 5), std::string::npos);
}

TEST(StoredRunSummary, ReconcileChangesAndBadJson)
{
    StoredRun run{0, "b reconciled", "reconcile", "{}",
                  R"({"status": "balanced", "balance_after": "balanced", "scenario": "b", "saved_as": "b reconciled",
                      "changes": [{"compartment": "perch", "parameter": "qb", "prey": null, "before": 6.2, "after": 5.1,
                                   "percent_change": -17.7, "confidence": "grade B", "cv": 0.2, "objective_share": 0.9},
                                  {"compartment": "perch", "parameter": "diet", "prey": "roach", "before": 0.35,
                                   "after": 0.3, "percent_change": -14.3, "confidence": "diet CV 0.5"}]})",
                  "2026-12-02T00:00:00Z"};
    const ReconcileRunSummary r = readReconcileRun(run);
    ASSERT_TRUE(r.error.empty()) << r.error;
    EXPECT_EQ(r.from, "b");
    EXPECT_EQ(r.status, "balanced");
    ASSERT_EQ(r.changes.size(), 2u);
    EXPECT_EQ(r.changes[0].parameter, "qb");
    EXPECT_EQ(r.changes[0].prey, "");
    EXPECT_DOUBLE_EQ(r.changes[0].after, 5.1);
    EXPECT_EQ(r.changes[1].prey, "roach");
    EXPECT_DOUBLE_EQ(r.changes[1].percent, -14.3);

    run.summaryJson = "[1, 2]";
    EXPECT_NE(readReconcileRun(run).error.find("not a JSON object"), std::string::npos);
    run.summaryJson = "{\"status\": \"balanced\"}";
    EXPECT_NE(readReconcileRun(run).error.find("lacks its 'changes'"), std::string::npos);
    run.summaryJson = "";
    EXPECT_NE(readReconcileRun(run).error.find("not valid JSON"), std::string::npos);
    run.kind = "ensemble";
    run.summaryJson = "{\"draws\": 3}";
    EXPECT_NE(readEnsembleRun(run).error.find("lacks 'draws' or 'outputs'"), std::string::npos);
}

}  // namespace
}  // namespace tl
