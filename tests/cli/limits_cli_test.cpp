// Limits as `tledger` shows them: the help lists the limits of core/model/limits.h, and
// `network --json` writes the n x n impact matrix above kImpactMatrixJsonLimit
// compartments only when --impact-matrix asks for it.
#include <gtest/gtest.h>

#include <string>

#include "core/io/network_report.h"
#include "core/model/limits.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

// An invented, balanced chain of `n` nodes in SCOR: node 1 takes an import of 1000,
// respires 900 and passes 100 along the chain to the last node, which is non-living
// and exports it.
std::string chainScor(std::size_t n)
{
    const auto index = [](std::size_t k) {
        std::string s = std::to_string(k);
        return std::string(3 - s.size(), ' ') + s;
    };
    std::string text = "invented chain for the limit test\n" + index(n) + index(n - 1) + "\n";
    for (std::size_t k = 1; k <= n; ++k) text += "node " + std::to_string(k) + "\n";
    for (std::size_t k = 1; k <= n; ++k) text += index(k) + " 1\n";
    text += " -1\n" + index(1) + " 1000\n -1\n" + index(n) + " 100\n -1\n" + index(1) + " 900\n -1\n";
    for (std::size_t k = 1; k < n; ++k) text += index(k) + index(k + 1) + " 100\n";
    return text + " -1 -1\n";
}

TEST(LimitsCli, HelpListsTheLimits)
{
    const CliRun run = runTledger("--help");
    ASSERT_EQ(run.exitCode, 0);
    for (const std::string& shown :
         {limits::groupedNumber(limits::kMaxCompartments) + "\ncompartments",
          std::to_string(limits::kMaxFleets) + " fleets",
          limits::groupedNumber(limits::kMaxDietEntries) + " non-zero diet shares",
          std::to_string(limits::kMaxNameLength) + " characters",
          limits::byteSize(limits::kMaxCsvFileBytes) + " per CSV file",
          limits::byteSize(limits::kMaxScorFileBytes) + " per SCOR file",
          "above " + std::to_string(kImpactMatrixJsonLimit) + " compartments"})
        EXPECT_NE(run.out.find(shown), std::string::npos) << shown << "\n" << run.out;
}

TEST(LimitsCli, ImpactMatrixAboveTheLimitOnlyWhenAskedFor)
{
    ScratchDir dir("limits_cli");
    const std::size_t n = kImpactMatrixJsonLimit + 1;
    writeText(dir / "chain.scor", chainScor(n));
    const std::string scor = "network --scor " + shellQuoted((dir / "chain.scor").string()) + " --json";

    const CliRun plain = runTledger(scor);
    ASSERT_EQ(plain.exitCode, 0) << plain.err;
    const nlohmann::json mti = plain.json().at("mti");
    EXPECT_EQ(mti.at("rows").size(), n);
    EXPECT_TRUE(mti.at("values").is_null());
    EXPECT_NE(mti.at("omitted").get<std::string>().find("--impact-matrix"), std::string::npos);

    const CliRun asked = runTledger(scor + " --impact-matrix");
    ASSERT_EQ(asked.exitCode, 0) << asked.err;
    const nlohmann::json full = asked.json().at("mti");
    ASSERT_EQ(full.at("values").size(), n);
    EXPECT_EQ(full.at("values").at(0).size(), n);
    EXPECT_FALSE(full.contains("omitted"));
    EXPECT_GT(asked.out.size(), plain.out.size() + n * n);  // the n x n values, at least a byte each
}

TEST(LimitsCli, ImpactMatrixUpToTheLimitByDefault)
{
    ScratchDir dir("limits_cli");
    writeText(dir / "chain.scor", chainScor(kImpactMatrixJsonLimit));
    const CliRun run = runTledger("network --scor " + shellQuoted((dir / "chain.scor").string()) + " --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    EXPECT_EQ(run.json().at("mti").at("values").size(), kImpactMatrixJsonLimit);
}

TEST(LimitsCli, ImpactMatrixFlagNeedsJson)
{
    const CliRun run = runTledger("network --scor " + shellQuoted(std::string(TL_FIXTURES_DIR) +
                                                                   "/reference/scor/lake_findley.scor") +
                                  " --impact-matrix");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("--impact-matrix goes with --json"), std::string::npos) << run.err;
}

}  // namespace
}  // namespace tl::testing
