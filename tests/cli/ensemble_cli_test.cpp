// `tledger ensemble` and `tledger ensemble-merge` as a user runs them (DESIGN.md 5.2,
// 5.3): the JSON contract, reproducibility across --threads, the run stored beside its
// scenario, slices merged into exactly one run (also through the Slurm array script run
// locally as Slurm would run it), and bad input refused with exit 2 and a message that
// names what is wrong. Models are copies of the invented samples (sample_projects/).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <string>

#include "core/store/project_file.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

const std::string kSamples = std::string(TL_SAMPLES_DIR) + "/";
const std::string kLagoon = shellQuoted(kSamples + "lagoon");  // CSV folder: nothing is stored
const fs::path kSourceRoot = fs::path(TL_FIXTURES_DIR).parent_path().parent_path();

TEST(EnsembleCli, JsonHasTheContractKeysAndThreadsDoNotChangeIt)
{
    const CliRun one = runTledger("ensemble " + kLagoon + " --draws 3000 --seed 11 --threads 1 --diet-cv 0.1 --json");
    ASSERT_EQ(one.exitCode, 0) << one.err;
    const nlohmann::json j = one.json();
    for (const char* key : {"draws", "balanced_share", "seed", "outputs"}) EXPECT_TRUE(j.contains(key)) << key;  // DESIGN 5.3
    EXPECT_EQ(j.at("draws"), 3000);
    EXPECT_EQ(j.at("seed"), 11);
    EXPECT_GT(j.at("balanced_share").get<double>(), 0.0);
    ASSERT_TRUE(j.at("outputs").contains("cockles.biomass"));
    for (const char* key : {"p2_5", "p25", "p50", "p75", "p97_5", "mean"})
        EXPECT_TRUE(j.at("outputs").at("cockles.biomass").at(key).is_number()) << key;
    EXPECT_TRUE(j.contains("balance_breakers"));
    EXPECT_TRUE(j.at("notice").get<std::string>().find("does not replace") != std::string::npos);

    const CliRun two = runTledger("ensemble " + kLagoon + " --draws 3000 --seed 11 --threads 2 --diet-cv 0.1 --json");
    EXPECT_EQ(two.out, one.out) << "same seed, 2 threads: the same bytes";
    const CliRun other = runTledger("ensemble " + kLagoon + " --draws 3000 --seed 12 --threads 2 --diet-cv 0.1 --json");
    EXPECT_NE(other.out, one.out) << "another seed, other draws";
}

TEST(EnsembleCli, TableAndKeptDrawsAndTheRunStoredInTheProject)
{
    const ScratchDir dir("ensemble_cli");
    const fs::path project = dir.path() / "lagoon.tledger";
    fs::copy_file(kSamples + "lagoon.tledger", project);
    const fs::path csv = dir.path() / "kept.csv";
    const CliRun run = runTledger("ensemble " + shellQuoted(project.string()) +
                                  " --scenario baseline --draws 500 --seed 3 --diet-cv 0.1 --analyses tl --keep-draws " +
                                  shellQuoted(csv.string()));
    ASSERT_EQ(run.exitCode, 0) << run.err;
    EXPECT_NE(run.out.find("Over the balanced draws"), std::string::npos) << run.out;
    EXPECT_NE(run.out.find("cockles.tl"), std::string::npos);
    EXPECT_NE(run.out.find("does not replace"), std::string::npos);
    const std::string kept = slurp(csv);
    EXPECT_EQ(kept.rfind("draw,", 0), 0u) << kept.substr(0, 80);

    auto opened = ProjectFile::open(project, OpenMode::ReadOnly);
    ASSERT_TRUE(opened.file);
    const auto runs = opened.file->listRuns();
    ASSERT_TRUE(runs.value);
    ASSERT_EQ(runs.value->size(), 1u);
    const StoredRun& stored = runs.value->front();
    EXPECT_EQ(stored.scenario, "baseline");
    EXPECT_EQ(stored.kind, "ensemble");
    EXPECT_EQ(nlohmann::json::parse(stored.settingsJson).at("draws"), 500);
    EXPECT_EQ(nlohmann::json::parse(stored.summaryJson).at("draws"), 500);
    const std::size_t keptRows = static_cast<std::size_t>(std::count(kept.begin(), kept.end(), '\n')) - 1;
    EXPECT_EQ(nlohmann::json::parse(stored.summaryJson).at("balanced_draws").get<std::size_t>(), keptRows);

    const CliRun again = runTledger("ensemble " + shellQuoted(project.string()) +
                                    " --scenario baseline --draws 3000 --seed 3 --diet-cv 0.1 --no-store");
    EXPECT_EQ(again.exitCode, 0) << again.err;  // with the project's own CVs about 1 % of the draws balance
    EXPECT_EQ(ProjectFile::open(project, OpenMode::ReadOnly).file->listRuns().value->size(), 1u) << "--no-store";
}

TEST(EnsembleCli, NoBalancedDrawExitsWith1AndNamesTheBreakers)
{
    // The invented reservoir's baseline leaves two EE just above 1 on purpose.
    const CliRun run = runTledger("ensemble " + shellQuoted(kSamples + "reservoir.tledger") +
                                  " --scenario baseline --draws 300 --seed 1 --no-store");
    EXPECT_EQ(run.exitCode, 1) << run.err;
    EXPECT_NE(run.out.find("No draw balanced"), std::string::npos) << run.out;
    EXPECT_NE(run.out.find("Compartments that most often break the balance"), std::string::npos);
    const CliRun json = runTledger("ensemble " + shellQuoted(kSamples + "reservoir.tledger") +
                                   " --scenario baseline --draws 300 --seed 1 --no-store --json");
    EXPECT_EQ(json.exitCode, 1);
    const nlohmann::json j = json.json();
    EXPECT_EQ(j.at("balanced_share"), 0.0);
    EXPECT_TRUE(j.at("outputs").begin()->at("p50").is_null());
    EXPECT_FALSE(j.at("balance_breakers").empty());
}

TEST(EnsembleCli, ShapeOfOneParameterIsDrawnFromThatShape)
{
    // Uniform on [m - sqrt(3) c m, m + sqrt(3) c m]: every kept draw of cockles' biomass
    // lies inside; lognormal draws of 2000 would leave it.
    const ScratchDir dir("ensemble_shape");
    const fs::path csv = dir.path() / "kept.csv";
    const CliRun run = runTledger("ensemble " + kLagoon + " --draws 2000 --seed 4 --diet-cv 0.1 --shape-of 'cockles.biomass=uniform'"
                                  " --keep-draws " + shellQuoted(csv.string()));
    ASSERT_NE(run.exitCode, 2) << run.err;
    const std::string text = slurp(csv);
    const std::string header = text.substr(0, text.find('\n'));
    std::size_t column = 0, at = 0;
    for (std::size_t next; (next = header.find(',', at)) != std::string::npos && header.substr(at, next - at) != "cockles.biomass"; at = next + 1)
        ++column;
    ASSERT_NE(header.find("cockles.biomass"), std::string::npos);
    const auto model = readFixtureModel(kSamples + "lagoon");
    ASSERT_TRUE(model);
    const Compartment& cockles = model->compartment(*model->indexOf("cockles"));
    const double m = *cockles.value(Param::Biomass);
    ASSERT_EQ(cockles.confidenceOf(Param::Biomass).grade, Confidence::Grade::B);  // CV 0.25
    const double half = std::min(std::sqrt(3.0) * 0.25 * m, m);
    std::size_t checked = 0;
    for (std::size_t line = text.find('\n') + 1; line < text.size(); line = text.find('\n', line) + 1) {
        std::size_t c = 0, start = line;
        while (c < column) {
            start = text.find(',', start) + 1;
            ++c;
        }
        const double v = std::stod(text.substr(start, text.find_first_of(",\n", start) - start));
        EXPECT_GE(v, m - half - 1e-9);
        EXPECT_LE(v, m + half + 1e-9);
        ++checked;
    }
    EXPECT_GT(checked, 5u);
}

TEST(EnsembleCli, SlicesMergeIntoTheBytesOfOneRun)
{
    const ScratchDir dir("ensemble_slices");
    const std::string common = "ensemble " + kLagoon + " --draws 1000 --seed 5 --diet-cv 0.1 --analyses tl";
    const CliRun whole = runTledger(common + " --json");
    ASSERT_EQ(whole.exitCode, 0) << whole.err;
    std::string parts;
    int index = 0;
    for (const char* range : {"0:399", "400:400", "401:999"}) {
        const fs::path part = dir.path() / ("part_" + std::to_string(index++) + ".json");
        const CliRun slice = runTledger(common + " --draw-range " + range + " --out " + shellQuoted(part.string()));
        ASSERT_EQ(slice.exitCode, 0) << slice.err;
        parts.append(" ").append(shellQuoted(part.string()));
    }
    const CliRun merged = runTledger("ensemble-merge" + parts + " --json");
    ASSERT_EQ(merged.exitCode, 0) << merged.err;
    EXPECT_EQ(merged.out, whole.out);
    // In stages: the first two parts merged into one part, then that with the third.
    const std::string p0 = shellQuoted((dir.path() / "part_0.json").string());
    const std::string p1 = shellQuoted((dir.path() / "part_1.json").string());
    const std::string p2 = shellQuoted((dir.path() / "part_2.json").string());
    const std::string staged = shellQuoted((dir.path() / "staged.json").string());
    ASSERT_EQ(runTledger("ensemble-merge " + p0 + " " + p1 + " --partial --out " + staged).exitCode, 0);
    EXPECT_EQ(runTledger("ensemble-merge " + p2 + " " + staged + " --json").out, whole.out);
    // A part given twice overlaps itself.
    const CliRun overlap = runTledger("ensemble-merge" + parts + parts.substr(0, parts.find(' ', 1)) + " --json");
    EXPECT_EQ(overlap.exitCode, 2);
    EXPECT_NE(overlap.err.find("overlap"), std::string::npos) << overlap.err;
}

TEST(EnsembleCli, TheLargestSeedSurvivesSlicesAndJson)
{
    const ScratchDir dir("ensemble_seed");
    const std::string common = "ensemble " + kLagoon + " --draws 200 --seed 18446744073709551615 --diet-cv 0.1";
    const CliRun whole = runTledger(common + " --json");
    ASSERT_NE(whole.exitCode, 2) << whole.err;
    EXPECT_EQ(whole.json().at("seed"), "18446744073709551615") << "beyond 2^53 the seed is text";
    const std::string a = shellQuoted((dir.path() / "a.json").string()), b = shellQuoted((dir.path() / "b.json").string());
    ASSERT_EQ(runTledger(common + " --draw-range 0:99 --out " + a).exitCode, 0);
    ASSERT_EQ(runTledger(common + " --draw-range 100:199 --out " + b).exitCode, 0);
    EXPECT_EQ(runTledger("ensemble-merge " + b + " " + a + " --json").out, whole.out);
}

TEST(EnsembleCli, SlurmArrayScriptRunLocallyMergesIntoOneRun)
{
    const fs::path script = kSourceRoot / "app/cluster/ensemble_array.sbatch";
    ASSERT_TRUE(fs::exists(script)) << script;
    const ScratchDir dir("ensemble_slurm");
    const fs::path out = dir.path() / "parts";
    const int tasks = 4;
    for (int t = 0; t < tasks; ++t) {
        // As Slurm runs array task t of --array=0-3: its id, the count and the first id.
        const std::string cmd = "SLURM_ARRAY_TASK_ID=" + std::to_string(t) + " SLURM_ARRAY_TASK_COUNT=" +
                                std::to_string(tasks) + " SLURM_ARRAY_TASK_MIN=0 SLURM_CPUS_PER_TASK=2 TLEDGER=" +
                                shellQuoted(TL_TLEDGER_EXE) + " bash " + shellQuoted(script.string()) + " " + kLagoon +
                                " lagoon 1001 9 " + shellQuoted(out.string()) + " --diet-cv 0.1 >" +
                                shellQuoted((dir.path() / "log").string()) + " 2>&1";
        ASSERT_EQ(std::system(cmd.c_str()), 0) << slurp(dir.path() / "log");
    }
    std::string parts;
    for (int t = 0; t < tasks; ++t) {
        char name[32];
        std::snprintf(name, sizeof name, "part_%06d.json", t);
        ASSERT_TRUE(fs::exists(out / name)) << name;
        parts.append(" ").append(shellQuoted((out / name).string()));
    }
    const CliRun merged = runTledger("ensemble-merge" + parts + " --json");
    ASSERT_EQ(merged.exitCode, 0) << merged.err;
    const CliRun whole = runTledger("ensemble " + kLagoon + " --scenario lagoon --draws 1001 --seed 9 --diet-cv 0.1 --json");
    EXPECT_EQ(merged.out, whole.out);
    EXPECT_EQ(merged.json().at("draws"), 1001);
}

TEST(EnsembleCli, BadInputExitsWith2AndSaysWhatIsWrong)
{
    struct Case {
        std::string args, expected;
    };
    const ScratchDir dir("ensemble_bad");
    writeText(dir.path() / "not_a_part.json", "{\"hello\": 1}");
    writeText(dir.path() / "broken.json", "{\"format\": ");
    const std::vector<Case> cases = {
        {"ensemble " + kLagoon + " --seed 1", "--draws N is required"},
        {"ensemble " + kLagoon + " --draws 100", "--seed S is required"},
        {"ensemble " + kLagoon + " --draws 0 --seed 1", "--draws '0'"},
        {"ensemble " + kLagoon + " --draws ten --seed 1", "--draws 'ten'"},
        {"ensemble " + kLagoon + " --draws 100 --seed -3", "--seed '-3'"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --threads 0", "--threads '0'"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --draw-range 50:10", "--draw-range '50:10'"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --draw-range 0:100", "LAST < 100"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --analyses balance,webs", "unknown analysis 'webs'"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --shape normal", "--shape 'normal'"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --diet-cv -1", "--diet-cv '-1'"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --draw-range 0:9 --keep-draws x.csv", "--keep-draws is for a whole run"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --frobnicate", "--frobnicate"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --shape-of cockles.biomass=gaussian", "--shape-of 'cockles.biomass=gaussian'"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --shape-of nobody.pb=uniform", "--shape-of 'nobody.pb=uniform'"},
        {"ensemble " + kLagoon + " --draws 100 --seed 1 --shape-of cockles.unassim=uniform", "PARAM one of biomass"},
        {"ensemble /nonexistent/model --draws 100 --seed 1", "/nonexistent/model"},
        {"ensemble " + shellQuoted(kSamples + "lagoon.tledger") + " --draws 100 --seed 1", "choose one with --scenario"},
        {"ensemble-merge", "expected one or more PART"},
        {"ensemble-merge " + shellQuoted((dir.path() / "missing.json").string()), "missing.json: no such file"},
        {"ensemble-merge " + shellQuoted((dir.path() / "not_a_part.json").string()), "not_a_part.json: not a partial ensemble result"},
        {"ensemble-merge " + shellQuoted((dir.path() / "broken.json").string()), "broken.json: not JSON"},
    };
    for (const Case& c : cases) {
        const CliRun run = runTledger(c.args);
        EXPECT_EQ(run.exitCode, 2) << c.args << "\n" << run.err;
        EXPECT_NE(run.err.find(c.expected), std::string::npos) << c.args << "\nstderr: " << run.err;
        EXPECT_TRUE(run.out.empty()) << c.args;
    }

    // Parts of two different ensembles.
    const fs::path a = dir.path() / "a.json", b = dir.path() / "b.json";
    ASSERT_EQ(runTledger("ensemble " + kLagoon + " --draws 100 --seed 1 --draw-range 0:49 --out " + shellQuoted(a.string())).exitCode, 0);
    ASSERT_EQ(runTledger("ensemble " + kLagoon + " --draws 100 --seed 2 --draw-range 50:99 --out " + shellQuoted(b.string())).exitCode, 0);
    const CliRun mixed = runTledger("ensemble-merge " + shellQuoted(a.string()) + " " + shellQuoted(b.string()));
    EXPECT_EQ(mixed.exitCode, 2);
    EXPECT_NE(mixed.err.find("b.json cannot be merged"), std::string::npos) << mixed.err;
    EXPECT_NE(mixed.err.find("another ensemble"), std::string::npos) << mixed.err;
}

}  // namespace
}  // namespace tl::testing
