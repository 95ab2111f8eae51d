// The survey readers (core/fieldwork/survey_tables.h): good files read as written, and
// every malformed file gives an error that names the file, line and column of the
// cell at fault (the program's CSV rules, core/io/csv_sheet.h).
#include <gtest/gtest.h>

#include "core/fieldwork/survey_tables.h"
#include "core/model/problem_codes.h"
#include "tests/support/test_support.h"

namespace tl::fieldwork {
namespace {

// The one error expected, at line:column of `file`.
::testing::AssertionResult errorAt(const Problems& problems, const std::string& file, const char* code, int line,
                                   int column)
{
    std::string all;
    for (const Problem& p : problems) all += "\n  " + p.code + " " + p.describe();
    for (const Problem& p : problems)
        if (p.severity == Severity::Error && p.code == code && p.location && p.location->file == file &&
            p.location->line == line && p.location->column == column)
            return ::testing::AssertionSuccess();
    return ::testing::AssertionFailure() << "no " << code << " at " << file << ":" << line << ":" << column << " in"
                                         << (all.empty() ? " (none)" : all);
}

constexpr const char* kHaulHeader = "station,haul,date,stratum,swept_area_km2,taxon,catch_kg,count\n";

TEST(SurveyTables, ReadsHaulsWithZeroCatchHaulsAndTowLengths)
{
    const auto read = parseHauls(std::string(kHaulHeader) +
                                     "S1,1,2026-06-01,north,0.02,roach,10,40\n"
                                     "S1,1,2026-06-01,north,0.02,bream,3,\n"
                                     "S2,1,2026-06-01,north,0.025,,0,\n",
                                 "hauls.csv");
    ASSERT_TRUE(read.value) << (read.problems.empty() ? "" : read.problems[0].describe());
    EXPECT_EQ(read.value->hauls.size(), 2u);
    EXPECT_EQ(read.value->catches.size(), 3u);
    EXPECT_TRUE(read.value->stratified);
    EXPECT_DOUBLE_EQ(read.value->hauls[1].sweptAreaKm2, 0.025);
    EXPECT_EQ(read.value->catches[0].count, 40.0);
    EXPECT_FALSE(read.value->catches[1].count);

    // Tow length (km) x wing spread (m) / 1000 = km²: 2 km x 12.5 m = 0.025 km².
    const auto towed = parseHauls("station,haul,date,tow_length_km,wing_spread_m,taxon,catch_kg\n"
                                  "S1,1,2026-06-01,2,12.5,roach,1\n",
                                  "t.csv");
    ASSERT_TRUE(towed.value);
    EXPECT_DOUBLE_EQ(towed.value->hauls[0].sweptAreaKm2, 0.025);

    // 29 February of a leap year is a day (2024, and 2000 as a multiple of 400).
    for (const char* day : {"2024-02-29", "2000-02-29", "2026-12-31"})
        EXPECT_TRUE(parseHauls(std::string("station,haul,date,swept_area_km2,taxon,catch_kg\nS1,1,") + day +
                                   ",0.02,roach,1\n",
                               "d.csv")
                        .value)
            << day;
    EXPECT_FALSE(parseHauls("station,haul,date,swept_area_km2,taxon,catch_kg\nS1,1,1900-02-29,0.02,roach,1\n", "d.csv")
                     .value);
}

TEST(SurveyTables, EachMalformedHaulFileNamesTheCell)
{
    struct Case {
        const char* what;
        std::string text;
        const char* code;
        int line, column;
    };
    const std::string h = kHaulHeader;
    const std::string ok = "S1,1,2026-06-01,north,0.02,roach,10,\n";
    const std::vector<Case> cases = {
        {"catch not a number", h + ok + "S1,2,2026-06-01,north,0.02,roach,ten,\n", code::kCsvNumber, 3, 7},
        {"catch with a decimal comma, quoted", h + "S1,1,2026-06-01,north,0.02,roach,\"1,5\",\n", code::kCsvNumber, 2, 7},
        {"negative catch", h + "S1,1,2026-06-01,north,0.02,roach,-1,\n", code::kSurveyValue, 2, 7},
        {"empty catch", h + "S1,1,2026-06-01,north,0.02,roach,,\n", code::kCsvMissingValue, 2, 7},
        {"swept area zero", h + "S1,1,2026-06-01,north,0,roach,1,\n", code::kSurveyValue, 2, 5},
        {"swept area missing", h + "S1,1,2026-06-01,north,,roach,1,\n", code::kCsvMissingValue, 2, 5},
        {"date in a local format", h + "S1,1,01/06/2026,north,0.02,roach,1,\n", code::kSurveyValue, 2, 3},
        {"month 13", h + "S1,1,2026-13-01,north,0.02,roach,1,\n", code::kSurveyValue, 2, 3},
        {"30 February", h + "S1,1,2026-02-30,north,0.02,roach,1,\n", code::kSurveyValue, 2, 3},
        {"29 February of a common year", h + "S1,1,2026-02-29,north,0.02,roach,1,\n", code::kSurveyValue, 2, 3},
        {"empty station", h + ",1,2026-06-01,north,0.02,roach,1,\n", code::kCsvMissingValue, 2, 1},
        {"haul with two swept areas", h + ok + "S1,1,2026-06-01,north,0.03,bream,1,\n", code::kSurveyInconsistent, 3, 5},
        {"haul in two strata", h + ok + "S1,1,2026-06-01,south,0.02,bream,1,\n", code::kSurveyInconsistent, 3, 4},
        {"haul on two dates", h + ok + "S1,1,2026-06-02,north,0.02,bream,1,\n", code::kSurveyInconsistent, 3, 3},
        {"taxon twice in a haul", h + ok + "S1,1,2026-06-01,north,0.02,roach,2,\n", code::kCsvDuplicateRow, 3, 6},
        {"catch without a taxon", h + "S1,1,2026-06-01,north,0.02,,4,\n", code::kCsvMissingValue, 2, 6},
        {"row with an extra cell", h + "S1,1,2026-06-01,north,0.02,roach,1,5,x\n", code::kCsvRowCells, 2, 9},
        {"negative count", h + "S1,1,2026-06-01,north,0.02,roach,1,-3\n", code::kSurveyValue, 2, 8},
        {"a haul without its stratum", h + ok + "S2,1,2026-06-01,,0.02,roach,1,\n", code::kSurveyUnknownStratum, 3, 1},
        {"no catch column", "station,haul,date,swept_area_km2,taxon\nS1,1,2026-06-01,0.02,roach\n",
         code::kCsvMissingColumn, 1, 1},
        {"no swept area columns", "station,haul,date,taxon,catch_kg\nS1,1,2026-06-01,roach,1\n", code::kCsvMissingColumn,
         1, 1},
        {"unknown column", "station,haul,date,swept_area_km2,taxon,catch_kg,weight\nS1,1,2026-06-01,0.02,roach,1,2\n",
         code::kCsvUnknownColumn, 1, 7},
        {"semicolons", "station;haul;date\n", code::kCsvHeader, 1, 1},
        {"header only", h, code::kCsvNoRows, 1, 1},
        {"unclosed quote", h + "S1,1,2026-06-01,north,0.02,\"roach,1,\n", code::kCsvQuote, 2, 6},
    };
    for (const Case& c : cases) {
        const auto read = parseHauls(c.text, "hauls.csv");
        EXPECT_FALSE(read.value) << c.what;
        EXPECT_TRUE(errorAt(read.problems, "hauls.csv", c.code, c.line, c.column)) << c.what;
    }
}

TEST(SurveyTables, EachMalformedLengthStomachStrataOrTaxaFileNamesTheCell)
{
    const std::string l = "taxon,length_from_cm,length_to_cm,count\n";
    EXPECT_TRUE(errorAt(parseLengths(l + "perch,12,10,4\n", "l.csv").problems, "l.csv", code::kSurveyValue, 2, 3));
    EXPECT_TRUE(errorAt(parseLengths(l + "perch,10,12,-4\n", "l.csv").problems, "l.csv", code::kSurveyValue, 2, 4));
    EXPECT_TRUE(errorAt(parseLengths(l + "perch,10,12,4\nperch,11,13,2\n", "l.csv").problems, "l.csv",
                        code::kSurveyInconsistent, 3, 2));
    EXPECT_TRUE(errorAt(parseLengths(l + "perch,10,12,4\nperch,x,13,2\n", "l.csv").problems, "l.csv", code::kCsvNumber,
                        3, 2));
    // Classes of different taxa may overlap; a class of one taxon may start where another ends.
    const auto fine = parseLengths(l + "perch,10,12,4\nroach,10,12,2\nperch,12,14,1\n", "l.csv");
    ASSERT_TRUE(fine.value);
    EXPECT_EQ(fine.value->size(), 3u);

    const std::string s = "sample,predator,prey,amount,stomachs\n";
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,roach,2,1\n1,pike,roach,1,1\n", "s.csv").problems, "s.csv",
                        code::kSurveyInconsistent, 3, 2));
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,roach,2,1.5\n", "s.csv").problems, "s.csv", code::kSurveyValue, 2, 5));
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,roach,2,0\n", "s.csv").problems, "s.csv", code::kSurveyValue, 2, 5));
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,roach,2,2\n1,perch,midge,1,3\n", "s.csv").problems, "s.csv",
                        code::kSurveyInconsistent, 3, 5));
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,,2,1\n", "s.csv").problems, "s.csv", code::kCsvMissingValue, 2, 3));
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,roach,2,1\n1,perch,roach,1,1\n", "s.csv").problems, "s.csv",
                        code::kCsvDuplicateRow, 3, 3));
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,roach,-2,1\n", "s.csv").problems, "s.csv", code::kSurveyValue, 2, 4));
    const auto stomachs = parseStomachs("sample,predator,prey,amount\n1,perch,roach,2\n2,perch,,0\n", "s.csv");
    ASSERT_TRUE(stomachs.value);  // the stomachs column is optional (1 each); an empty stomach reads
    EXPECT_EQ((*stomachs.value)[1].prey, "");

    const std::string st = "stratum,area_km2\n";
    EXPECT_TRUE(errorAt(parseStrata(st + "north,0\n", "st.csv").problems, "st.csv", code::kSurveyValue, 2, 2));
    EXPECT_TRUE(errorAt(parseStrata(st + "north,3\nnorth,4\n", "st.csv").problems, "st.csv", code::kCsvDuplicateRow, 3, 1));

    const std::string t = "taxon,compartment\n";
    EXPECT_TRUE(errorAt(parseTaxa(t + "roach,Roach\nroach,Bream\n", "t.csv").problems, "t.csv", code::kCsvDuplicateRow, 3, 1));
    const auto taxa = parseTaxa(t + "roach,Roach\nmidge,\nbeetle,import\nbream,bream\n", "t.csv");
    ASSERT_TRUE(taxa.value);
    const Problems unknown = checkMappingCompartments(*taxa.value, {"Roach", "Bream"});
    ASSERT_EQ(unknown.size(), 1u);  // "bream" only: the empty mapping and import are fine
    EXPECT_TRUE(errorAt(unknown, "t.csv", code::kSurveyUnknownCompartment, 5, 2));
    EXPECT_NE(unknown[0].hint.find("'Bream'"), std::string::npos);
}

// Issue 12, defect 7, found by fuzz_survey: a pooled count of 1e308 stomachs was read
// (and turned into a negative int), and numbers near the largest double were accepted,
// so sums overflowed to infinity. Both are refused at their cell now.
TEST(SurveyTables, OverflowingNumbersAndStomachCountsAreRefusedAtTheirCell)
{
    const std::string s = "sample,predator,prey,amount,stomachs\n";
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,roach,2,1e308\n", "s.csv").problems, "s.csv", code::kValueTooLarge, 2, 5));
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,roach,2,3000000\n", "s.csv").problems, "s.csv", code::kSurveyValue, 2, 5));
    EXPECT_TRUE(parseStomachs(s + "1,perch,roach,2,1000000\n", "s.csv").value.has_value()) << "the largest count allowed";
    EXPECT_TRUE(errorAt(parseStomachs(s + "1,perch,roach,1e308,1\n", "s.csv").problems, "s.csv", code::kValueTooLarge, 2, 4));
    EXPECT_TRUE(errorAt(parseHauls(std::string(kHaulHeader) + "A,1,2026-07-01,,0.02,roach,1e31,\n", "h.csv").problems,
                        "h.csv", code::kValueTooLarge, 2, 7));
    EXPECT_TRUE(errorAt(parseLengths("taxon,length_from_cm,length_to_cm,count\nroach,10,12,1e300\n", "l.csv").problems,
                        "l.csv", code::kValueTooLarge, 2, 4));
    EXPECT_TRUE(parseHauls(std::string(kHaulHeader) + "A,1,2026-07-01,,0.02,roach,1e30,\n", "h.csv").value.has_value())
        << "1e30 itself is accepted, as in the model's own files";
}

TEST(SurveyTables, MissingFileIsAnErrorNamingIt)
{
    const auto read = readHauls("/no/such/folder/hauls.csv");
    EXPECT_FALSE(read.value);
    ASSERT_FALSE(read.problems.empty());
    EXPECT_EQ(read.problems[0].code, code::kCsvUnreadable);
    EXPECT_NE(read.problems[0].describe().find("/no/such/folder/hauls.csv"), std::string::npos);
}

}  // namespace
}  // namespace tl::fieldwork
