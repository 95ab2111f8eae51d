// `tledger network` as a user runs it (DESIGN.md 5.2, 5.3): keys of the JSON contract,
// readable tables with the decision-support line, exit codes 0/1/2, and bad SCOR input
// named by file, line and column.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <string>

#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

CliRun runNetwork(const std::string& args) { return runTledger("network " + args); }

const std::string kScor = std::string(TL_FIXTURES_DIR) + "/reference/scor/";
const std::string kNotice =
    "Model output supports, and does not replace, stock assessment, local regulation and licensed professional "
    "judgement.";

TEST(NetworkCli, ScorJsonHasTheContractKeys)
{
    // Lake Findley (Richey et al. 1978, Science 202:1183): TST 50.7 by hand from the file
    // (sum of internal flows 29.4 plus imports 21.3).
    const CliRun run = runNetwork("--scor " + shellQuoted(kScor + "lake_findley.scor") + " --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const nlohmann::json j = run.json();
    for (const char* key : {"tst", "tstp", "boundary_input", "fci", "apl", "ami", "ascendency", "capacity", "overhead",
                            "connectance", "links", "tl", "levels", "mti"})
        EXPECT_TRUE(j.contains(key)) << key;
    for (const char* key : {"level", "throughput", "biomass", "te"}) EXPECT_TRUE(j.at("levels").at(0).contains(key)) << key;
    for (const char* key : {"rows", "cols", "values"}) EXPECT_TRUE(j.at("mti").contains(key)) << key;
    EXPECT_DOUBLE_EQ(j.at("tst").get<double>(), 50.7);
    EXPECT_EQ(j.at("links").get<int>(), 6);
    EXPECT_NEAR(j.at("tl").at("ZOOPLANKTON").get<double>(), 2.13636, 5e-6);
    EXPECT_EQ(j.at("source").get<std::string>(), "scor");
    EXPECT_FALSE(j.contains("status"));  // a SCOR network has no balance status
}

// Issue conventions: TE is not defined at level I (consumed shares instead), TPP figures
// are null when no producer can be told apart, and the user can name the producers.
TEST(NetworkCli, ScorWithoutProducersHasNullTppUntilTheyAreNamed)
{
    // Lake Findley's living nodes (zooplankton, benthos) both feed on detritus.
    const std::string file = shellQuoted(kScor + "lake_findley.scor");
    const CliRun run = runNetwork("--scor " + file + " --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const nlohmann::json j = run.json();
    EXPECT_FALSE(j.at("producers_identified").get<bool>());
    EXPECT_TRUE(j.at("total_primary_production").is_null());
    EXPECT_TRUE(j.at("tpp_over_r").is_null());
    EXPECT_TRUE(j.contains("tpp_note"));
    EXPECT_TRUE(j.at("levels").at(0).at("te").is_null());
    EXPECT_EQ(j.at("feeding_cycles").get<std::string>(), "removed");
    for (const char* key : {"food_web_connectance", "omnivory_intake_weighted", "detritus_inflow_consumed", "etl"})
        EXPECT_TRUE(j.contains(key)) << key;

    const CliRun named = runNetwork("--scor " + file + " --producers ZOOPLANKTON --json");
    ASSERT_EQ(named.exitCode, 0) << named.err;
    EXPECT_TRUE(named.json().at("producers_identified").get<bool>());
    // TPP is now defined: the named producer's boundary input, which the file gives as
    // none (its inputs enter the two detritus nodes).
    EXPECT_TRUE(named.json().at("total_primary_production").is_number());
    EXPECT_EQ(named.json().at("total_primary_production").get<double>(), 0.0);

    const CliRun wrong = runNetwork("--scor " + file + " --producers KELP");
    EXPECT_EQ(wrong.exitCode, 2);
    EXPECT_NE(wrong.err.find("'KELP'"), std::string::npos) << wrong.err;
}

TEST(NetworkCli, FeedingCyclesRemovedByDefaultAndKeptOnRequest)
{
    const std::string model = shellQuoted(std::string(TL_FIXTURES_DIR) + "/csv_models/pond");
    const CliRun removed = runNetwork(model + " --json"), kept = runNetwork(model + " --json --keep-feeding-cycles");
    ASSERT_LE(removed.exitCode, 1) << removed.err;
    ASSERT_LE(kept.exitCode, 1) << kept.err;
    EXPECT_EQ(removed.json().at("feeding_cycles").get<std::string>(), "removed");
    EXPECT_EQ(kept.json().at("feeding_cycles").get<std::string>(), "kept");
    EXPECT_TRUE(removed.json().at("levels").at(0).at("te").is_null());
    EXPECT_EQ(runNetwork(model + " --producers Alga").exitCode, 2);  // --producers is for SCOR networks
}

TEST(NetworkCli, ScorTablesWithoutCatchHaveNoCatchSection)
{
    const CliRun run = runNetwork("--scor " + shellQuoted(kScor + "oyster_reef.scor"));
    ASSERT_EQ(run.exitCode, 0) << run.err;
    EXPECT_NE(run.out.find("Finn cycling index"), std::string::npos);
    EXPECT_NE(run.out.find("Level decomposition"), std::string::npos);
    EXPECT_EQ(run.out.find("Primary production required"), std::string::npos);
}

TEST(NetworkCli, ModelTablesShowCatchWithTheNotice)
{
    const CliRun run = runNetwork(shellQuoted(std::string(TL_FIXTURES_DIR) + "/csv_models/pond"));
    ASSERT_LE(run.exitCode, 1) << run.err;  // 0 balanced, 1 unbalanced but analysed
    EXPECT_NE(run.out.find("Primary production required (PPR)"), std::string::npos);
    EXPECT_NE(run.out.find(kNotice), std::string::npos);
    EXPECT_NE(run.out.find("Mean TE (geometric mean of levels II-IV)"), std::string::npos);
}

TEST(NetworkCli, BadScorNamesFileLineAndColumn)
{
    const fs::path bad = fs::temp_directory_path() / ("tl_bad_" + std::to_string(::getpid()) + ".scor");
    {
        std::ofstream out(bad);
        out << "bad\n  2  1\nA\nB\n  1 1\n  2 1\n -1\n  1 5\n -1\n -1\n  1 2\n -1\n  1  2 -3\n -1 -1\n";
    }
    const CliRun run = runNetwork("--scor " + shellQuoted(bad.string()) + " --json");
    fs::remove(bad);
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find(bad.string() + ":13:7:"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("negative"), std::string::npos) << run.err;
    EXPECT_TRUE(run.out.empty());
}

TEST(NetworkCli, UsageErrorsExitTwo)
{
    EXPECT_EQ(runNetwork("").exitCode, 2);
    EXPECT_EQ(runNetwork("--scor " + shellQuoted(kScor + "lake_findley.scor") + " some_model").exitCode, 2);
    EXPECT_EQ(runNetwork("--frobnicate").exitCode, 2);
    const CliRun missing = runNetwork("/nonexistent/model_folder");
    EXPECT_EQ(missing.exitCode, 2);
    EXPECT_NE(missing.err.find("/nonexistent/model_folder"), std::string::npos);
}

}  // namespace
}  // namespace tl::testing
