// The registry of problem codes (core/model/problem_codes.h): every code once, each
// with a sentence; every code the validation, the solver and the CSV reader report on
// the bad-input fixtures is registered; one code never means two things.
#include <gtest/gtest.h>

#include <set>

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

}  // namespace
}  // namespace tl::testing
