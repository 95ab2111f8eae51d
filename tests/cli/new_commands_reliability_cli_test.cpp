// Issue 12, points 1, 2 and 12, held against the commands that landed after the issue's
// first fixes (ensemble, ensemble-merge, compare, sensitivity, reconcile, fieldwork and
// the report export): a project that cannot be written is still read by each of them and
// never called damaged, and a command that would write into it says why it cannot; on a
// full disk every writer fails with the cause named, keeps the previous output byte for
// byte and leaves no temporary file behind.
#include <gtest/gtest.h>
#include <sched.h>
#include <sys/mount.h>

#include <filesystem>
#include <string>

#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

const fs::path kSamples = TL_SAMPLES_DIR;
const fs::path kSurvey = kSamples / "reservoir_survey";
std::string q(const fs::path& p) { return shellQuoted(p.string()); }

void makeReadOnly(const fs::path& p)
{
    using fs::perms;
    fs::permissions(p, fs::is_directory(p) ? perms::owner_read | perms::owner_exec | perms::group_read |
                                                 perms::group_exec | perms::others_read | perms::others_exec
                                           : perms::owner_read | perms::group_read | perms::others_read);
}

std::string biomassInto(const fs::path& project)
{
    return "fieldwork biomass --hauls " + q(kSurvey / "hauls.csv") + " --taxa " + q(kSurvey / "taxa.csv") +
           " --compartment 'Roach adults' --catchability 0.5 --into " + q(project) + " --scenario baseline";
}

TEST(NewCommandsReliability, AReadOnlyProjectIsReadByEveryNewCommandAndNeverCalledDamaged)
{
    ScratchDir dir("ro_new_commands");
    const fs::path share = dir / "share";
    const fs::path file = share / "reservoir.tledger";
    fs::create_directory(share);
    fs::permissions(dir.path(), fs::perms::all);  // the unprivileged user writes its outputs here
    fs::copy_file(kSamples / "reservoir.tledger", file);
    makeReadOnly(file);
    makeReadOnly(share);
    const std::string before = slurp(file);
    const std::string p = q(file);

    struct Case {
        std::string command;
        bool reads;  // true: the command's work is reading; false: it must write into the project
    };
    const std::vector<Case> cases = {
        {"ensemble " + p + " --scenario baseline --draws 300 --seed 4", true},
        {"compare " + p + " --scenarios 'baseline,doubled net effort'", true},
        {"sensitivity " + p + " --scenario baseline", true},
        {"export " + p + " --scenarios 'baseline,invasive mussel' --format html --out " + q(dir / "report.html"), true},
        {"reconcile " + p + " --scenario 'invasive mussel'", false},
        {biomassInto(file), false},
    };
    for (const Case& c : cases) {
        const CliRun run = runTledger(c.command, true);
        EXPECT_EQ(run.err.find("damaged"), std::string::npos) << c.command << "\n" << run.err;
        if (c.reads) {
            EXPECT_TRUE(run.exitCode == 0 || run.exitCode == 1) << c.command << " -> " << run.exitCode << "\n" << run.err;
        } else {
            EXPECT_EQ(run.exitCode, 2) << c.command << "\n" << run.err;
            EXPECT_NE(run.err.find("cannot be written"), std::string::npos) << c.command << "\n" << run.err;
        }
        EXPECT_NE(run.err.find("read-only"), std::string::npos) << c.command << "\n" << run.err;
    }
    EXPECT_TRUE(fs::exists(dir / "report.html"));
    EXPECT_EQ(slurp(file), before);
    EXPECT_FALSE(fs::exists(file.string() + "-wal"));
    EXPECT_FALSE(fs::exists(file.string() + "-shm"));
    fs::permissions(share, fs::perms::owner_all);
}

// Defect 6 for the new commands: with --json, a scenario that cannot be run still gives
// its status and problems as JSON (exit 2 stays: nothing was computed).
TEST(NewCommandsReliability, EnsembleAndReconcileJsonOfAnUnsolvableScenarioHaveStatusAndProblems)
{
    ScratchDir dir("unsolvable_new");
    const fs::path model = dir / "model";
    fs::create_directory(model);
    writeText(model / "compartments.csv",
              "name,kind,biomass,pb,qb,ee,pq,unassim,biomass_accum,net_emigration,detritus_import\n"
              "Algae,producer,10,100,,,,,,,\n"
              "Grazer,consumer,,,40,,,,,,\n"  // B, P/B and EE unknown: cannot be solved
              "Detritus,detritus,,,,,,,,,\n");
    writeText(model / "diet.csv", "predator,Algae,Detritus\nGrazer,0.8,0.2\n");
    for (const std::string& command :
         {"ensemble " + q(model) + " --draws 50 --seed 1 --json",
          "reconcile " + q(model) + " --scenario model --save-as " + q(dir / "out") + " --json"}) {
        const CliRun run = runTledger(command);
        EXPECT_EQ(run.exitCode, 2) << command << "\n" << run.err;
        ASSERT_FALSE(run.out.empty()) << command << "\n" << run.err;
        const nlohmann::json j = run.json();
        EXPECT_EQ(j.at("status"), "invalid") << command;
        ASSERT_FALSE(j.at("problems").empty()) << command;
        EXPECT_EQ(j.at("problems")[0].at("code"), "underdetermined-compartment") << command;
        EXPECT_EQ(j.at("problems")[0].at("compartment"), "Grazer") << command;
        EXPECT_TRUE(j.contains("message")) << command;
    }
    EXPECT_FALSE(fs::exists(dir / "out"));
}

// Every --json command answers in JSON when it cannot go on, not only solve, network,
// ensemble and reconcile: fieldwork on a damaged survey table, compare on an unknown scenario.
TEST(NewCommandsReliability, FieldworkAndCompareJsonOnBadInputHaveStatusAndProblems)
{
    ScratchDir dir("bad_input_json");
    const fs::path hauls = dir / "hauls.csv";
    writeText(hauls,
              "station,haul,date,stratum,gear,tow_length_km,wing_spread_m,taxon,catch_kg\n"
              "D01,1,2026-07-01,dam basin,bottom trawl,1.67,14.0,roach adult,lots\n");
    const CliRun fieldwork = runTledger("fieldwork biomass --hauls " + q(hauls) + " --taxa " + q(kSurvey / "taxa.csv") +
                                        " --compartment 'Roach adults' --json");
    EXPECT_EQ(fieldwork.exitCode, 2) << fieldwork.err;
    ASSERT_FALSE(fieldwork.out.empty()) << fieldwork.err;
    const nlohmann::json f = fieldwork.json();
    EXPECT_EQ(f.at("status"), "invalid");
    ASSERT_FALSE(f.at("problems").empty());
    EXPECT_EQ(f.at("problems")[0].at("location").at("line"), 2);  // the bad catch_kg cell, named
    EXPECT_EQ(f.at("problems")[0].at("location").at("column"), 9);

    const CliRun compare = runTledger("compare " + q(kSamples / "reservoir.tledger") +
                                      " --scenarios baseline,'no such scenario' --json");
    EXPECT_EQ(compare.exitCode, 2) << compare.err;
    ASSERT_FALSE(compare.out.empty()) << compare.err;
    const nlohmann::json c = compare.json();
    EXPECT_EQ(c.at("status"), "invalid");
    EXPECT_NE(c.at("message").get<std::string>().find("no such scenario"), std::string::npos) << c.dump();
}

// What a full disk must leave: the previous output unchanged and no temporary beside it.
struct FullDiskCase {
    std::string name;     // what the case is, for the messages
    std::string command;  // tledger arguments
    fs::path output;      // the file (or folder) it would replace; empty: none
    bool storeOnly = false;  // the command's own output goes to stdout; only storing into the project fails
};

// Fills the file system of `folder` to the last block.
void fillDisk(const fs::path& folder)
{
    std::FILE* f = std::fopen((folder / "filler").c_str(), "wb");
    if (!f) return;
    const std::string block(4096, 'x');
    while (std::fwrite(block.data(), 1, block.size(), f) == block.size() && std::fflush(f) == 0) {
    }
    std::fclose(f);
}

std::string snapshot(const fs::path& p)
{
    if (!fs::is_directory(p)) return fs::exists(p) ? slurp(p) : std::string("(absent)");
    std::string all;
    for (const auto& e : fs::directory_iterator(p)) all += e.path().filename().string() + ":" + slurp(e.path()) + "\n";
    return all;
}

TEST(NewCommandsReliability, OnAFullDiskEveryNewWriterKeepsThePreviousOutputAndNamesTheCause)
{
    ScratchDir dir("full_disk_writers");
    const fs::path disk = dir / "small disk";
    fs::create_directory(disk);
    // A slice written on a disk with room, for ensemble-merge.
    const fs::path part = dir / "part.json";
    const fs::path sample = kSamples / "reservoir.tledger";
    const std::string baseline = q(sample) + " --scenario baseline";
    ASSERT_EQ(runTledger("ensemble " + baseline + " --draws 200 --seed 2 --draw-range 0:99 --out " + q(part)).exitCode, 0);

    const fs::path project = disk / "reservoir.tledger";
    std::vector<FullDiskCase> cases = {
        {"ensemble --out", "ensemble " + baseline + " --draws 300 --seed 3 --out " + q(disk / "ensemble.txt"),
         disk / "ensemble.txt"},
        {"ensemble --keep-draws", "ensemble " + baseline + " --draws 300 --seed 3 --no-store --keep-draws " +
                                      q(disk / "kept.csv"),
         disk / "kept.csv"},
        {"ensemble slice", "ensemble " + baseline + " --draws 200 --seed 2 --draw-range 100:199 --out " +
                               q(disk / "part2.json"),
         disk / "part2.json"},
        {"ensemble-merge --out", "ensemble-merge " + q(part) + " --json --out " + q(disk / "merged.json"),
         disk / "merged.json"},
        {"report html", "export " + q(sample) + " --scenarios 'baseline,invasive mussel' --format html --out " +
                            q(disk / "report.html"),
         disk / "report.html"},
        {"export json", "export " + baseline + " --format json --out " + q(disk / "baseline.json"), disk / "baseline.json"},
        {"export csv into a folder", "export " + baseline + " --format csv --out " + q(disk / "csv"), disk / "csv"},
        {"reconcile into the project", "reconcile " + q(project) + " --scenario 'invasive mussel'", project},
        {"fieldwork --into", biomassInto(project), project},
        {"ensemble stored in the project", "ensemble " + q(project) + " --scenario baseline --draws 300 --seed 5", project,
         true},
    };
#ifdef TL_HAVE_FIGURE_PROGRAM
    cases.push_back({"report pdf", "export " + q(sample) + " --scenarios 'baseline,invasive mussel' --format pdf --out " +
                                       q(disk / "report.pdf"),
                     disk / "report.pdf"});
#endif

    const std::string report = runInChild(
        [&] {
            std::string fails;
            // The previous outputs: a short text each, a project, and a CSV folder.
            fs::copy_file(sample, project);
            for (const FullDiskCase& c : cases)
                if (c.output != project && c.output != disk / "csv") writeText(c.output, "previous " + c.name + "\n");
            if (runTledger("export " + baseline + " --format csv --out " + q(disk / "csv")).exitCode != 0)
                return std::string("could not write the previous CSV folder");
            fillDisk(disk);
            for (const FullDiskCase& c : cases) {
                const std::string before = snapshot(c.output);
                const CliRun run = runTledger(c.command);
                const std::string what = c.name + " (exit " + std::to_string(run.exitCode) + "): " + run.err + "\n";
                if (c.storeOnly) {
                    if (run.exitCode == 2) fails += "failed as a whole: " + what;
                    if (run.err.find("not stored") == std::string::npos) fails += "does not say the run was not stored: " + what;
                } else if (run.exitCode != 2) {
                    fails += "did not fail: " + what;
                }
                if (run.err.find("damaged") != std::string::npos) fails += "a full disk called damage: " + what;
                const bool named = run.err.find("No space left") != std::string::npos ||
                                   run.err.find("disk is full") != std::string::npos ||
                                   run.err.find("disk full") != std::string::npos;
                if (!named) fails += "the cause is not named: " + what;
                if (snapshot(c.output) != before) fails += "the previous output changed: " + what;
            }
            // A nearly full disk: room for the start of a report (about 300 kB as HTML,
            // 3 MB as PDF) but not all of it. A writer that does not check its writes
            // would leave a cut-short report in place of the previous one.
            fs::resize_file(disk / "filler", fs::file_size(disk / "filler") - 64 * 1024);
            for (const FullDiskCase& c : cases) {
                if (!c.name.starts_with("report")) continue;
                const std::string before = snapshot(c.output);
                const CliRun run = runTledger(c.command);
                const std::string what = c.name + " on a nearly full disk (exit " + std::to_string(run.exitCode) + "): " + run.err + "\n";
                if (run.exitCode != 2) fails += "did not fail: " + what;
                if (run.err.find("No space left") == std::string::npos) fails += "the cause is not named: " + what;
                if (snapshot(c.output) != before) fails += "the previous output changed: " + what;
            }
            for (const auto& e : fs::directory_iterator(disk))
                if (e.path().filename().string().find(".tmp-") != std::string::npos)
                    fails += "a temporary was left: " + e.path().filename().string() + "\n";
            return fails;
        },
        [&]() -> std::string {
            // A mount namespace of this child alone: the tmpfs vanishes with it.
            if (::unshare(CLONE_NEWNS) != 0 || ::mount(nullptr, "/", nullptr, MS_REC | MS_PRIVATE, nullptr) != 0 ||
                ::mount("tmpfs", disk.c_str(), "tmpfs", 0, "size=2m") != 0)
                return "SKIP";
            return {};
        },
        false);
    if (report == "SKIP") GTEST_SKIP() << "this machine does not allow mounting a tmpfs (needs root with CAP_SYS_ADMIN)";
    EXPECT_EQ(report, "");
}

}  // namespace
}  // namespace tl::testing
