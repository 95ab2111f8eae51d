// The registry of problem codes (core/model/problem_codes.h): every code once, each
// with a sentence; every code the validation, the solver and the CSV reader report on
// the bad-input fixtures is registered; one code never means two things.
#include <gtest/gtest.h>

#include <fstream>
#include <regex>
#include <set>
#include <sstream>

#include "core/balance/scenario_checks.h"
#include "core/balance/solver.h"
#include "core/model/problem_codes.h"
#include "core/model/validation.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

TEST(ProblemCodes, EachCodeOnceWithASentence)
{
    std::set<std::string_view> seen;
    for (const ProblemCodeInfo& info : problemCodes()) {
        EXPECT_TRUE(seen.insert(info.code).second) << info.code << " is registered twice";
        EXPECT_GT(info.explanation.size(), 15u) << info.code;
        EXPECT_EQ(info.explanation.back(), '.') << info.code;
        EXPECT_EQ(findProblemCode(info.code), &info);
    }
    EXPECT_EQ(findProblemCode("no-such-code"), nullptr);
}

TEST(ProblemCodes, NegativeInputAndNegativeSolvedValueAreTwoCodes)
{
    EXPECT_STRNE(code::kNegativeValue, code::kNegativeSolvedValue);
    EXPECT_EQ(check::kNegativeValue, code::kNegativeValue);  // validation's name for the same constant
}

// Every problem the CSV reader, validation and the solver report for each bad-input
// fixture (tests/fixtures/bad_csv) and the readable fixture models has a registered
// code, with the registry's severity unless the reader says otherwise for a reason.
TEST(ProblemCodes, EveryReportedCodeIsRegistered)
{
    std::size_t problems = 0;
    std::vector<fs::path> folders;
    for (const auto& e : fs::directory_iterator(fs::path(TL_FIXTURES_DIR) / "bad_csv"))
        if (e.is_directory()) folders.push_back(e.path());
    for (const char* good : {"csv_models/pond", "csv_models/pond_quirks", "csv_every_file"})
        folders.push_back(fs::path(TL_FIXTURES_DIR) / good);
    ASSERT_GT(folders.size(), 20u);
    for (const fs::path& folder : folders) {
        CsvReadResult read = readCsvModel(folder);
        Problems all = read.problems;
        if (read.model) {
            const Problems checks = scenarioChecks(*read.model, solveBalance(*read.model));
            all.insert(all.end(), checks.begin(), checks.end());
        }
        for (const Problem& p : all) {
            ++problems;
            EXPECT_NE(findProblemCode(p.code), nullptr) << folder.filename() << ": " << p.code << " is not registered";
        }
    }
    EXPECT_GT(problems, 30u);
}

// The sources name codes only through the registry's constants (code::k...): a quoted
// code, or anything shaped like a reader's code ("csv-...", "scor-...", "store-..."),
// outside core/model/problem_codes.* fails here, so a new code cannot slip in without
// an entry in the table. And every constant of the header is in the table.
TEST(ProblemCodes, SourcesUseTheRegistryConstants)
{
    const fs::path source = fs::path(TL_FIXTURES_DIR).parent_path().parent_path();
    ASSERT_TRUE(fs::exists(source / "core/model/problem_codes.h")) << source;
    const std::regex literal("\"([a-z0-9]+(-[a-z0-9]+)+)\"");
    const std::regex readerShaped("(csv|scor|store|reconcile)-.*");
    std::size_t files = 0;
    for (const char* area : {"core", "app", "ui"}) {
        for (const auto& e : fs::recursive_directory_iterator(source / area)) {
            const std::string ext = e.path().extension().string();
            if (!e.is_regular_file() || (ext != ".cpp" && ext != ".h")) continue;
            if (e.path().filename().string().starts_with("problem_codes.")) continue;
            ++files;
            std::istringstream lines(slurp(e.path()));
            std::string line;
            for (int n = 1; std::getline(lines, line); ++n) {
                const std::string code = line.substr(0, line.find("//"));  // comments may quote a code
                for (std::sregex_iterator m(code.begin(), code.end(), literal), end; m != end; ++m) {
                    const std::string text = (*m)[1];
                    EXPECT_FALSE(findProblemCode(text) || std::regex_match(text, readerShaped))
                        << fs::relative(e.path(), source).string() << ":" << n << ": \"" << text
                        << "\" is a problem code written inline; use (or add) its code::k... constant";
                }
            }
        }
    }
    EXPECT_GT(files, 100u);

    const std::regex constant("inline constexpr const char\\* (k\\w+) = \"([^\"]+)\";");
    const std::string header = slurp(source / "core/model/problem_codes.h");
    std::size_t constants = 0;
    for (std::sregex_iterator m(header.begin(), header.end(), constant), end; m != end; ++m, ++constants)
        EXPECT_NE(findProblemCode((*m)[2].str()), nullptr) << "code::" << (*m)[1] << " is not in the registry's table";
    EXPECT_EQ(constants, problemCodes().size()) << "every registered code has exactly one constant";
}

}  // namespace
}  // namespace tl::testing
