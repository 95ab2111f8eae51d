// Diet from stomach contents: mean of proportions and pooled (Hyslop 1980), against a
// hand calculation written out here; the bootstrap's CV and interval for their
// properties (reproducible, zero for identical stomachs, containing the estimate).
#include <gtest/gtest.h>

#include <cmath>

#include "core/fieldwork/stomach_diet.h"
#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

TaxonMapping taxa()
{
    const auto read = parseTaxa("taxon,compartment\nperch,Perch\npike,Pike\nroach,Roach\nmidge,Chironomids\n"
                                "unidentified,\nbeetle,import\n",
                                "taxa.csv");
    return *read.value;
}

const char* kStomachs =
    "sample,predator,prey,amount,stomachs\n"
    "s1,perch,roach,2,1\n"
    "s1,perch,midge,2,1\n"
    "s2,perch,roach,1,1\n"
    "s3,perch,,0,1\n"
    "s4,perch,roach,1,3\n"
    "s4,perch,midge,5,3\n"
    "s4,perch,unidentified,2,3\n"
    "p1,pike,perch,30,1\n";

TEST(StomachDiet, HandCalculation)
{
    const auto read = parseStomachs(kStomachs, "stomachs.csv");
    ASSERT_TRUE(read.value);
    const StomachDiet d = dietFromStomachs(*read.value, taxa(), "Perch");
    ASSERT_TRUE(d.valid);
    // Proportions of mapped prey per sample: s1 roach 1/2, midge 1/2 (1 stomach); s2 roach 1 (1);
    // s3 empty; s4 roach 1/6, midge 5/6 (3 stomachs; unidentified left out).
    // Mean of proportions, each stomach once: roach (0.5 + 1 + 3/6) / 5 = 0.4, midge (0.5 + 2.5) / 5 = 0.6.
    // Pooled: roach (2 + 1 + 1) / 11 = 4/11, midge (2 + 5) / 11 = 7/11.
    ASSERT_EQ(d.shares.size(), 2u);
    EXPECT_EQ(d.shares[0].prey, "Chironomids");
    EXPECT_NEAR(d.shares[0].share, 0.6, 1e-12);
    EXPECT_NEAR(d.shares[1].share, 0.4, 1e-12);
    EXPECT_NEAR(d.shares[0].pooled, 7.0 / 11.0, 1e-12);
    EXPECT_NEAR(d.shares[1].pooled, 4.0 / 11.0, 1e-12);
    EXPECT_EQ(d.samples, 4);
    EXPECT_EQ(d.stomachs, 6);
    EXPECT_EQ(d.emptyStomachs, 1);
    EXPECT_NEAR(d.leftOutShare, 2.0 / 13.0, 1e-12);
    EXPECT_EQ(d.grade, Confidence::Grade::D);  // 5 non-empty stomachs
    ASSERT_EQ(d.warnings.size(), 1u);         // the unidentified share is said

    DietOptions pooled;
    pooled.summary = DietSummary::Pooled;
    const StomachDiet p = dietFromStomachs(*read.value, taxa(), "Perch", pooled);
    EXPECT_NEAR(p.shares[0].share, 7.0 / 11.0, 1e-12);

    // Bootstrap: reproducible with the seed, an interval around the estimate, and a CV above 0.
    const StomachDiet again = dietFromStomachs(*read.value, taxa(), "Perch");
    EXPECT_EQ(again.shares[0].cv, d.shares[0].cv);
    EXPECT_GT(d.shares[0].cv, 0.0);
    EXPECT_LE(d.shares[0].ciLow, d.shares[0].share);
    EXPECT_GE(d.shares[0].ciHigh, d.shares[0].share);
    EXPECT_NE(dietNote(d, "2026-12-02").find("Chironomids 0.6"), std::string::npos);
}

TEST(StomachDiet, IdenticalStomachsHaveNoSpreadAndImportIsAColumn)
{
    std::string text = "sample,predator,prey,amount\n";
    for (int s = 0; s < 20; ++s)
        text += std::to_string(s) + ",pike,perch,3\n" + std::to_string(s) + ",pike,beetle,1\n";
    const auto read = parseStomachs(text, "s.csv");
    ASSERT_TRUE(read.value);
    const StomachDiet d = dietFromStomachs(*read.value, taxa(), "Pike");
    ASSERT_TRUE(d.valid);
    EXPECT_NEAR(d.shares[0].share, 0.75, 1e-12);
    EXPECT_EQ(d.shares[1].prey, "import");
    EXPECT_NEAR(d.shares[0].cv, 0.0, 1e-12);
    EXPECT_EQ(d.grade, Confidence::Grade::C);  // 20 stomachs
    EXPECT_EQ(gradeFromStomachs(50), Confidence::Grade::B);
    EXPECT_EQ(gradeFromStomachs(200), Confidence::Grade::A);
}

TEST(StomachDiet, UnknownTaxaAndEmptyStomachsAreRefusedByName)
{
    const auto read = parseStomachs("sample,predator,prey,amount\n1,perch,gudgeon,2\n2,zander,roach,1\n", "s.csv");
    ASSERT_TRUE(read.value);
    const StomachDiet d = dietFromStomachs(*read.value, taxa(), "Perch");
    EXPECT_FALSE(d.valid);
    ASSERT_EQ(d.problems.size(), 2u);
    EXPECT_EQ(d.problems[0].code, code::kSurveyUnknownTaxon);
    EXPECT_EQ(d.problems[0].location->line, 2);
    EXPECT_EQ(d.problems[0].location->column, 3);  // the prey cell
    EXPECT_EQ(d.problems[1].location->column, 2);  // the predator cell

    const auto empty = parseStomachs("sample,predator,prey,amount\n1,perch,,0\n", "s.csv");
    const StomachDiet none = dietFromStomachs(*empty.value, taxa(), "Perch");
    EXPECT_FALSE(none.valid);
    EXPECT_EQ(none.problems[0].code, code::kFieldworkTooFewData);
}

}  // namespace
}  // namespace tl::fieldwork
