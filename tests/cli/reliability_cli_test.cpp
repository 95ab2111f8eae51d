// Issue 12 as a user meets it on the command line: a project that cannot be written is
// still solved, checked, analysed and exported (read-only, saying so, never "damaged");
// a project of a newer version says it opened read-only; `network --json` prints its
// status and problems when the scenario cannot be solved; no "inf" or "nan" in any text
// output; an overflowing input is refused with its cell named.
#include <gtest/gtest.h>
#include <sqlite3.h>
#include <unistd.h>

#include <filesystem>
#include <regex>
#include <string>

#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

const fs::path kSamples = TL_SAMPLES_DIR;

CliRun runUnprivileged(const std::string& args) { return runTledger(args, true); }

void makeReadOnly(const fs::path& p)
{
    using fs::perms;
    fs::permissions(p, fs::is_directory(p) ? perms::owner_read | perms::owner_exec | perms::group_read |
                                                 perms::group_exec | perms::others_read | perms::others_exec
                                           : perms::owner_read | perms::group_read | perms::others_read);
}

// A copy of a sample project in a folder of its own, both left read-only.
struct ReadOnlyCopy {
    ScratchDir dir{"ro_project"};
    fs::path folder = dir / "share";
    fs::path file = folder / "reservoir.tledger";
    explicit ReadOnlyCopy(const fs::path& from = kSamples / "reservoir.tledger")
    {
        fs::create_directory(folder);
        fs::permissions(dir.path(), fs::perms::owner_all | fs::perms::group_read | fs::perms::group_exec |
                                        fs::perms::others_read | fs::perms::others_exec);
        fs::copy_file(from, file);
        makeReadOnly(file);
        makeReadOnly(folder);
    }
    ~ReadOnlyCopy() { fs::permissions(folder, fs::perms::owner_all); }
};

// A project of an older schema on a read-only share is read at its own version, not
// migrated (which would need writing) and not refused.
TEST(ReliabilityCli, AnOlderProjectOnAReadOnlyShareIsReadWithoutMigrating)
{
    ReadOnlyCopy copy(fs::path(TL_FIXTURES_DIR) / "store" / "v1_project.tledger");
    const std::string before = slurp(copy.file);
    const CliRun run = runUnprivileged("solve " + shellQuoted(copy.file.string()) + " --scenario spring");
    EXPECT_TRUE(run.exitCode == 0 || run.exitCode == 1) << run.exitCode << "\n" << run.err;
    EXPECT_NE(run.out.find("perch"), std::string::npos) << run.out;
    EXPECT_NE(run.err.find("opened read-only"), std::string::npos) << run.err;
    EXPECT_EQ(run.err.find("schema"), std::string::npos) << run.err;
    EXPECT_EQ(slurp(copy.file), before);
}

TEST(ReliabilityCli, AReadOnlyProjectIsSolvedCheckedAnalysedAndExported)
{
    ReadOnlyCopy copy;
    const std::string before = slurp(copy.file);
    const std::string file = shellQuoted(copy.file.string()) + " --scenario baseline";
    ScratchDir out("ro_out");
    fs::permissions(out.path(), fs::perms::all);  // where the unprivileged user may write the export
    const fs::path exported = out / "baseline.json";
    for (const std::string& command : {"solve " + file, "solve " + file + " --json", "check " + file,
                                       "network " + file,
                                       "export " + file + " --format json --out " + shellQuoted(exported.string())}) {
        const CliRun run = runUnprivileged(command);
        EXPECT_TRUE(run.exitCode == 0 || run.exitCode == 1) << command << " -> " << run.exitCode << "\n" << run.err;
        EXPECT_TRUE(!run.out.empty() || command.starts_with("export")) << command;
        EXPECT_EQ(run.err.find("damaged"), std::string::npos) << command << "\n" << run.err;
        EXPECT_NE(run.err.find("opened read-only"), std::string::npos) << command << "\n" << run.err;
    }
    EXPECT_TRUE(fs::exists(exported));
    EXPECT_EQ(slurp(copy.file), before);
    EXPECT_FALSE(fs::exists(copy.file.string() + "-wal"));
    EXPECT_FALSE(fs::exists(copy.file.string() + "-shm"));
}

TEST(ReliabilityCli, ImportIntoAReadOnlyProjectIsRefusedWithTheReason)
{
    ReadOnlyCopy copy;
    const std::string before = slurp(copy.file);
    const CliRun run = runUnprivileged("import " + shellQuoted((kSamples / "reservoir").string()) + " --into " +
                                       shellQuoted(copy.file.string()) + " --scenario again");
    EXPECT_EQ(run.exitCode, 2) << run.err;
    EXPECT_EQ(run.err.find("damaged"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("read-only"), std::string::npos) << run.err;
    EXPECT_EQ(slurp(copy.file), before);
}

// Defect 8: a newer schema is read, and the reader is told.
TEST(ReliabilityCli, ANewerProjectSaysItOpenedReadOnly)
{
    ScratchDir dir("newer");
    const fs::path file = dir / "newer.tledger";
    fs::copy_file(kSamples / "reservoir.tledger", file);
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(file.c_str(), &db), SQLITE_OK);
    ASSERT_EQ(sqlite3_exec(db, "PRAGMA user_version = 9999", nullptr, nullptr, nullptr), SQLITE_OK);
    sqlite3_close(db);
    const CliRun run = runTledger("solve " + shellQuoted(file.string()) + " --scenario baseline --json");
    EXPECT_TRUE(run.exitCode == 0 || run.exitCode == 1) << run.err;
    EXPECT_NO_THROW((void)run.json());
    EXPECT_NE(run.err.find("opened read-only"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("newer version"), std::string::npos) << run.err;
}

// Defect 6: `network --json` on a scenario that cannot be solved prints status and problems.
TEST(ReliabilityCli, NetworkJsonOfAnUnsolvableScenarioHasStatusAndProblems)
{
    ScratchDir dir("unsolvable");
    writeText(dir / "compartments.csv",
              "name,kind,biomass,pb,qb,ee,pq,unassim,biomass_accum,net_emigration,detritus_import\n"
              "Algae,producer,10,100,,,,,,,\n"
              "Grazer,consumer,,,40,,,,,,\n"  // B, P/B and EE unknown: cannot be solved
              "Detritus,detritus,,,,,,,,,\n");
    writeText(dir / "diet.csv", "predator,Algae,Detritus\nGrazer,0.8,0.2\n");
    const CliRun run = runTledger("network " + shellQuoted(dir.path().string()) + " --json");
    EXPECT_EQ(run.exitCode, 1) << run.err;
    ASSERT_FALSE(run.out.empty()) << run.err;
    const nlohmann::json j = run.json();
    EXPECT_EQ(j.at("status"), "invalid");
    ASSERT_FALSE(j.at("problems").empty());
    EXPECT_EQ(j.at("problems")[0].at("code"), "underdetermined-compartment");
    EXPECT_EQ(j.at("problems")[0].at("compartment"), "Grazer");
    EXPECT_TRUE(j.contains("message"));
}

const std::regex kNonFinite("(^|[^A-Za-z])-?(inf|nan|infinity)([^A-Za-z]|$)", std::regex::icase);

// Defect 7: the published networks whose keystone index is log10(0) print "undefined"
// with the reason, never "-inf" (11 of the 58 reference networks did).
TEST(ReliabilityCli, NoInfinityOrNanInNetworkTablesOfTheReferenceNetworks)
{
    std::size_t networks = 0, undefined = 0;
    for (const auto& e : fs::directory_iterator(fs::path(TL_FIXTURES_DIR) / "reference/scor")) {
        const CliRun run = runTledger("network --scor " + shellQuoted(e.path().string()));
        ASSERT_EQ(run.exitCode, 0) << e.path() << "\n" << run.err;
        ++networks;
        EXPECT_FALSE(std::regex_search(run.out, kNonFinite)) << e.path().filename();
        if (run.out.find("Keystone index undefined for") != std::string::npos) ++undefined;
    }
    EXPECT_EQ(networks, 58u);
    EXPECT_GT(undefined, 0u) << "the note on undefined keystone indices was never needed";
}

// Defect 7: an input that would overflow is refused, naming its cell.
TEST(ReliabilityCli, AnOverflowingBiomassIsRefusedWithItsCell)
{
    ScratchDir dir("overflow");
    writeText(dir / "compartments.csv",
              "name,kind,biomass,pb,qb,ee,pq,unassim,biomass_accum,net_emigration,detritus_import\n"
              "Algae,producer,1e308,100,,,,,,,\n"
              "Grazer,consumer,5,10,40,,,,,,\n"
              "Detritus,detritus,,,,,,,,,\n");
    writeText(dir / "diet.csv", "predator,Algae,Detritus\nGrazer,0.8,0.2\n");
    for (const char* command : {"network", "solve", "check"}) {
        const CliRun run = runTledger(std::string(command) + " " + shellQuoted(dir.path().string()));
        EXPECT_EQ(run.exitCode, 2) << command << "\n" << run.err;
        EXPECT_NE(run.err.find("compartments.csv:2:3:"), std::string::npos) << command << "\n" << run.err << run.out;
        EXPECT_FALSE(std::regex_search(run.out + run.err, kNonFinite)) << command << "\n" << run.out << run.err;
    }
}

}  // namespace
}  // namespace tl::testing
