// `tledger network` as a user runs it (DESIGN.md 5.2, 5.3): keys of the JSON contract,
// readable tables with the decision-support line, exit codes 0/1/2, and bad SCOR input
// named by file, line and column.
#include <gtest/gtest.h>

#include <sys/wait.h>
#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

namespace tl {
namespace {

namespace fs = std::filesystem;

struct CliRun {
    int exitCode = -1;
    std::string out, err;
};

std::string slurp(const fs::path& p)
{
    std::ifstream in(p, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

std::string quoted(const std::string& s)
{
    std::string q = "'";
    for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
    return q + "'";
}

CliRun runNetwork(const std::string& args)
{
    const fs::path dir = fs::temp_directory_path() / ("tl_cli_network_" + std::to_string(::getpid()));
    fs::create_directories(dir);
    const std::string cmd = quoted(TL_TLEDGER_EXE) + " network " + args + " >" + quoted((dir / "out").string()) +
                            " 2>" + quoted((dir / "err").string());
    const int status = std::system(cmd.c_str());
    CliRun run;
    run.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
    run.out = slurp(dir / "out");
    run.err = slurp(dir / "err");
    fs::remove_all(dir);
    return run;
}

const std::string kScor = std::string(TL_FIXTURES_DIR) + "/reference/scor/";
const std::string kNotice =
    "Model output supports, and does not replace, stock assessment, local regulation and licensed professional "
    "judgement.";

TEST(NetworkCli, ScorJsonHasTheContractKeys)
{
    // Lake Findley (Richey et al. 1978, Science 202:1183): TST 50.7 by hand from the file
    // (sum of internal flows 29.4 plus imports 21.3).
    const CliRun run = runNetwork("--scor " + quoted(kScor + "lake_findley.scor") + " --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    for (const char* key : {"\"tst\"", "\"tstp\"", "\"boundary_input\"", "\"fci\"", "\"apl\"", "\"ami\"",
                            "\"ascendency\"", "\"capacity\"", "\"overhead\"", "\"connectance\"", "\"links\"",
                            "\"tl\"", "\"levels\"", "\"level\"", "\"throughput\"", "\"biomass\"", "\"te\"", "\"mti\"",
                            "\"rows\"", "\"cols\"", "\"values\""})
        EXPECT_NE(run.out.find(key), std::string::npos) << key;
    EXPECT_NE(run.out.find("\"tst\": 50.7,"), std::string::npos) << run.out.substr(0, 200);
    EXPECT_NE(run.out.find("\"links\": 6,"), std::string::npos);
    EXPECT_NE(run.out.find("\"ZOOPLANKTON\": 2.13636"), std::string::npos);
}

TEST(NetworkCli, ScorTablesWithoutCatchHaveNoCatchSection)
{
    const CliRun run = runNetwork("--scor " + quoted(kScor + "oyster_reef.scor"));
    ASSERT_EQ(run.exitCode, 0) << run.err;
    EXPECT_NE(run.out.find("Finn cycling index"), std::string::npos);
    EXPECT_NE(run.out.find("Level decomposition"), std::string::npos);
    EXPECT_EQ(run.out.find("Primary production required"), std::string::npos);
}

TEST(NetworkCli, ModelTablesShowCatchWithTheNotice)
{
    const CliRun run = runNetwork(quoted(std::string(TL_FIXTURES_DIR) + "/csv_models/pond"));
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
    const CliRun run = runNetwork("--scor " + quoted(bad.string()) + " --json");
    fs::remove(bad);
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find(bad.string() + ":13:7:"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("negative"), std::string::npos) << run.err;
    EXPECT_TRUE(run.out.empty());
}

TEST(NetworkCli, UsageErrorsExitTwo)
{
    EXPECT_EQ(runNetwork("").exitCode, 2);
    EXPECT_EQ(runNetwork("--scor " + quoted(kScor + "lake_findley.scor") + " some_model").exitCode, 2);
    EXPECT_EQ(runNetwork("--frobnicate").exitCode, 2);
    const CliRun missing = runNetwork("/nonexistent/model_folder");
    EXPECT_EQ(missing.exitCode, 2);
    EXPECT_NE(missing.err.find("/nonexistent/model_folder"), std::string::npos);
}

}  // namespace
}  // namespace tl
