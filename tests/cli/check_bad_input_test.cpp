// The CLI on bad CSV folders (DESIGN.md 5.2): `tledger check` exits 2 and names the file,
// line and column on stderr; `tledger export` exits 2 and writes nothing. The fixtures
// and expected locations are those of the library test (tests/core/io/bad_csv_cases.h).
#include <gtest/gtest.h>

#include <sys/wait.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include "tests/core/io/bad_csv_cases.h"

namespace tl {
namespace {

namespace fs = std::filesystem;
using fixtures::BadCsvCase;

struct CliRun {
    int exitCode = -1;
    std::string out, err;
};

std::string shellQuoted(const std::string& s)
{
    std::string q = "'";
    for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
    return q + "'";
}

std::string slurp(const fs::path& p)
{
    std::ifstream in(p, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

// A fresh, empty scratch folder for one test, removed by the destructor.
struct ScratchDir {
    fs::path path;
    explicit ScratchDir(const std::string& tag)
    {
        path = fs::temp_directory_path() / ("tl_cli_" + tag + "_" + std::to_string(::getpid()));
        fs::remove_all(path);
        fs::create_directories(path);
    }
    ~ScratchDir()
    {
        std::error_code ec;
        fs::remove_all(path, ec);
    }
};

CliRun runTledger(const std::string& args, const ScratchDir& scratch)
{
    const fs::path out = scratch.path / "stdout.txt", err = scratch.path / "stderr.txt";
    const std::string command = shellQuoted(TL_TLEDGER_EXE) + " " + args + " >" + shellQuoted(out.string()) + " 2>" +
                                shellQuoted(err.string());
    const int status = std::system(command.c_str());
    CliRun r;
    r.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
    r.out = slurp(out);
    r.err = slurp(err);
    return r;
}

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
    ScratchDir scratch("check_" + std::string(c.folder));
    const CliRun r = runTledger("check " + shellQuoted(fixture(c).string()), scratch);
    EXPECT_EQ(r.exitCode, 2) << "stderr:\n" << r.err;
    EXPECT_NE(r.err.find(expectedPrefix(c)), std::string::npos)
        << "stderr should contain '" << expectedPrefix(c) << "'; it is:\n" << r.err;
}

TEST_P(CliBadCsv, ExportExitsTwoAndWritesNothing)
{
    const BadCsvCase& c = GetParam();
    ScratchDir scratch("export_" + std::string(c.folder));
    const fs::path out = scratch.path / "out";
    const CliRun r = runTledger("export " + shellQuoted(fixture(c).string()) + " --scenario x --format csv --out " +
                                 shellQuoted(out.string()),
                             scratch);
    EXPECT_EQ(r.exitCode, 2) << "stderr:\n" << r.err;
    EXPECT_FALSE(fs::exists(out)) << "export of a bad folder left " << out;
    EXPECT_FALSE(r.err.empty()) << "a refused export must say why";
}

std::string caseName(const ::testing::TestParamInfo<BadCsvCase>& info) { return std::string(info.param.folder); }

INSTANTIATE_TEST_SUITE_P(Fixtures, CliBadCsv, ::testing::ValuesIn(fixtures::badCsvCases()), caseName);

TEST(CliGoodCsv, CheckAcceptsThePondFixture)
{
    ScratchDir scratch("check_pond");
    const fs::path pond = fs::path(TL_FIXTURES_DIR) / "csv_models" / "pond";
    const CliRun r = runTledger("check " + shellQuoted(pond.string()), scratch);
    EXPECT_NE(r.exitCode, 2) << "a well-formed folder is not bad input; stderr:\n" << r.err;
    EXPECT_EQ(r.err.find("compartments.csv:"), std::string::npos) << r.err;
    EXPECT_EQ(r.err.find("diet.csv:"), std::string::npos) << r.err;
}

}  // namespace
}  // namespace tl
