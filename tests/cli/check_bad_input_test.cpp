// The CLI on bad CSV folders (DESIGN.md 5.2): `tledger check` exits 2 and names the file,
// line and column on stderr; `tledger export` exits 2 and writes nothing. The fixtures
// and expected locations are those of the library test (tests/core/io/bad_csv_cases.h).
#include <gtest/gtest.h>

#include <filesystem>
#include <string>

#include "tests/core/io/bad_csv_cases.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

using fixtures::BadCsvCase;

fs::path fixture(const BadCsvCase& c) { return fs::path(TL_FIXTURES_DIR) / "bad_csv" / c.folder; }

// What describe() puts in front of the message: "file:line:column: ", or less when
// the line or column is not known.
std::string expectedPrefix(const BadCsvCase& c)
{
    std::string s(c.file);
    if (c.line > 0) {
        s.append(":").append(std::to_string(c.line));
        if (c.column > 0) s.append(":").append(std::to_string(c.column));
    }
    s.append(": ");
    return s;
}

class CliBadCsv : public ::testing::TestWithParam<BadCsvCase> {};

TEST_P(CliBadCsv, CheckExitsTwoAndNamesTheCell)
{
    const BadCsvCase& c = GetParam();
    const CliRun r = runTledger("check " + shellQuoted(fixture(c).string()));
    EXPECT_EQ(r.exitCode, 2) << "stderr:\n" << r.err;
    EXPECT_NE(r.err.find(expectedPrefix(c)), std::string::npos)
        << "stderr should contain '" << expectedPrefix(c) << "'; it is:\n" << r.err;
}

TEST_P(CliBadCsv, ExportExitsTwoAndWritesNothing)
{
    const BadCsvCase& c = GetParam();
    ScratchDir scratch("export_" + std::string(c.folder));
    const fs::path out = scratch / "out";
    const CliRun r = runTledger("export " + shellQuoted(fixture(c).string()) + " --scenario x --format csv --out " +
                                 shellQuoted(out.string()));
    EXPECT_EQ(r.exitCode, 2) << "stderr:\n" << r.err;
    EXPECT_FALSE(fs::exists(out)) << "export of a bad folder left " << out;
    EXPECT_FALSE(r.err.empty()) << "a refused export must say why";
}

std::string caseName(const ::testing::TestParamInfo<BadCsvCase>& info) { return std::string(info.param.folder); }

INSTANTIATE_TEST_SUITE_P(Fixtures, CliBadCsv, ::testing::ValuesIn(fixtures::badCsvCases()), caseName);

TEST(CliGoodCsv, CheckAcceptsThePondFixture)
{
    const fs::path pond = fs::path(TL_FIXTURES_DIR) / "csv_models" / "pond";
    const CliRun r = runTledger("check " + shellQuoted(pond.string()));
    EXPECT_NE(r.exitCode, 2) << "a well-formed folder is not bad input; stderr:\n" << r.err;
    EXPECT_EQ(r.err.find("compartments.csv:"), std::string::npos) << r.err;
    EXPECT_EQ(r.err.find("diet.csv:"), std::string::npos) << r.err;
}

}  // namespace
}  // namespace tl::testing
