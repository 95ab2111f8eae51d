// Every bad-input fixture (tests/fixtures/bad_csv/, listed in bad_csv_cases.h) must be
// refused by readCsvModel: no model, and an error whose location points at the cell
// (file, line, column) with a message that says what was expected.
#include <gtest/gtest.h>

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <string>

#include "core/io/csv_model.h"
#include "tests/core/io/bad_csv_cases.h"

namespace tl {
namespace {

using fixtures::BadCsvCase;

std::string lower(std::string_view s)
{
    std::string out(s);
    std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return std::tolower(c); });
    return out;
}

bool matches(const Problem& p, const BadCsvCase& c)
{
    if (p.severity != Severity::Error || !p.location) return false;
    if (std::filesystem::path(p.location->file).filename() != c.file) return false;
    if (p.location->line != c.line || p.location->column != c.column) return false;
    const std::string message = lower(p.message);
    return std::all_of(c.words.begin(), c.words.end(),
                       [&](std::string_view w) { return message.find(lower(w)) != std::string::npos; });
}

class BadCsv : public ::testing::TestWithParam<BadCsvCase> {};

TEST_P(BadCsv, RefusedWithTheCellNamed)
{
    const BadCsvCase& c = GetParam();
    const std::filesystem::path folder = std::filesystem::path(TL_FIXTURES_DIR) / "bad_csv" / c.folder;
    ASSERT_TRUE(std::filesystem::is_directory(folder)) << folder;

    const CsvReadResult result = readCsvModel(folder);
    EXPECT_FALSE(result.model.has_value()) << "a bad folder must not give a model";
    EXPECT_TRUE(hasErrors(result.problems));
    const bool found = std::any_of(result.problems.begin(), result.problems.end(),
                                   [&](const Problem& p) { return matches(p, c); });
    std::string all;
    for (const Problem& p : result.problems) all += "  [" + std::string(severityKey(p.severity)) + "] " + p.describe() + "\n";
    EXPECT_TRUE(found) << "expected an error at " << c.file << ":" << c.line << ":" << c.column
                       << " mentioning the expected words; got:\n" << all;
    for (const Problem& p : result.problems) {
        EXPECT_FALSE(p.message.empty()) << p.code;
        EXPECT_TRUE(p.location.has_value()) << "reader problem without location: " << p.message;
    }
}

std::string caseName(const ::testing::TestParamInfo<BadCsvCase>& info) { return std::string(info.param.folder); }

INSTANTIATE_TEST_SUITE_P(Fixtures, BadCsv, ::testing::ValuesIn(fixtures::badCsvCases()), caseName);

TEST(BadCsvFixtures, AtLeastTwentyCasesAllPresent)
{
    EXPECT_GE(fixtures::badCsvCases().size(), 20u);
    // Every fixture folder on disk is listed, so none is silently left untested.
    std::size_t onDisk = 0;
    for (const auto& entry : std::filesystem::directory_iterator(std::filesystem::path(TL_FIXTURES_DIR) / "bad_csv")) {
        if (!entry.is_directory()) continue;
        ++onDisk;
        const std::string name = entry.path().filename().string();
        EXPECT_TRUE(std::any_of(fixtures::badCsvCases().begin(), fixtures::badCsvCases().end(),
                                [&](const BadCsvCase& c) { return c.folder == name; }))
            << name << " is not listed in bad_csv_cases.h";
    }
    EXPECT_EQ(onDisk, fixtures::badCsvCases().size());
}

}  // namespace
}  // namespace tl
