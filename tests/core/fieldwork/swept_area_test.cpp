// Swept-area biomass (Sparre & Venema 1998, 13.1) against hand calculations written
// out below, unstratified and stratified (Cochran 1977, ch. 5). No published worked
// example with its numbers is used: none is remembered well enough to quote. The
// interval's t quantile with fractional df is compared with scipy in
// tests/crosscheck/fieldwork_crosscheck_test.cpp.
#include <gtest/gtest.h>

#include <cmath>
#include <set>

#include "core/fieldwork/student_t.h"
#include "core/fieldwork/swept_area.h"
#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

TaxonMapping mapping(std::initializer_list<std::pair<const char*, const char*>> entries)
{
    TaxonMapping m;
    for (const auto& [taxon, compartment] : entries) {
        m.compartmentOf[taxon] = compartment;
        m.cellOf[taxon] = CellRef{"taxa.csv", 2, 2};
    }
    return m;
}

TEST(SweptArea, UnstratifiedHandCalculation)
{
    // Haul 3 caught only bream: it counts as 0 for roach.
    const auto read = parseHauls("station,haul,date,swept_area_km2,taxon,catch_kg\n"
                                 "A,1,2026-06-01,0.02,roach,10\n"
                                 "B,1,2026-06-01,0.025,roach,5\n"
                                 "C,1,2026-06-01,0.02,bream,7\n"
                                 "D,1,2026-06-01,0.04,roach,6\n"
                                 "D,1,2026-06-01,0.04,rudd,2\n"
                                 "D,1,2026-06-01,0.04,bream,1\n",
                                 "hauls.csv");
    ASSERT_TRUE(read.value);
    SweptAreaOptions o;
    o.catchability = 0.5;
    const SweptAreaResult r = sweptAreaBiomass(*read.value, mapping({{"roach", "Roach"}, {"rudd", "Roach"}, {"bream", "Bream"}}),
                                               "Roach", {}, o);
    ASSERT_TRUE(r.estimate.valid);
    // cpua (kg/km²): 10/0.02 = 500, 5/0.025 = 200, 0/0.02 = 0, (6+2)/0.04 = 200; mean 225.
    // deviations 275, -25, -225, -25: squares sum 127500, s² = 127500/3 = 42500.
    // b = 225 / X1 = 450 kg/km² = 0.45 t/km²; SE = sqrt(42500/4) / 0.5 kg/km².
    const double se = std::sqrt(42500.0 / 4.0) / 0.5 / 1000.0;
    EXPECT_NEAR(r.estimate.value, 0.45, 1e-12);
    EXPECT_NEAR(r.strata[0].meanKgPerKm2, 225.0, 1e-9);
    EXPECT_NEAR(r.strata[0].sdKgPerKm2, std::sqrt(42500.0), 1e-9);
    EXPECT_NEAR(*r.estimate.cv, se / 0.45, 1e-12);
    EXPECT_DOUBLE_EQ(r.degreesOfFreedom, 3.0);
    // t(0.975, 3) = 3.1824 (table): the lower limit 0.45 - 3.18 x 0.206 is below 0, kept at 0.
    EXPECT_NEAR(*r.estimate.ciHigh, 0.45 + 3.182446305 * se, 1e-8);
    EXPECT_EQ(*r.estimate.ciLow, 0.0);
    EXPECT_EQ(r.estimate.quantity, "B");
    ASSERT_EQ(r.taxa.size(), 2u);  // roach and rudd
    bool statesX1 = false;
    for (const std::string& a : r.estimate.assumptions) statesX1 |= a.find("X1 = 0.5") != std::string::npos;
    EXPECT_TRUE(statesX1) << "catchability is stated as an assumption";
}

TEST(SweptArea, StratifiedHandCalculation)
{
    // Stratum north (30 km²): cpua 100, 200, 300; south (10 km²): 1000, 1400 (kg/km², 0.01 km² hauls).
    const auto read = parseHauls("station,haul,date,stratum,swept_area_km2,taxon,catch_kg\n"
                                 "N1,1,2026-06-01,north,0.01,perch,1\n"
                                 "N2,1,2026-06-01,north,0.01,perch,2\n"
                                 "N3,1,2026-06-01,north,0.01,perch,3\n"
                                 "S1,1,2026-06-01,south,0.01,perch,10\n"
                                 "S2,1,2026-06-01,south,0.01,perch,14\n",
                                 "hauls.csv");
    ASSERT_TRUE(read.value);
    const auto strata = parseStrata("stratum,area_km2\nnorth,30\nsouth,10\n", "strata.csv");
    ASSERT_TRUE(strata.value);
    const SweptAreaResult r = sweptAreaBiomass(*read.value, mapping({{"perch", "Perch"}}), "Perch", *strata.value);
    ASSERT_TRUE(r.estimate.valid) << r.estimate.problems[0].describe();
    // W = 0.75, 0.25. Means 200, 1200; s² 10000, 80000. b = 0.75 x 200 + 0.25 x 1200 = 450.
    // Var = 0.75² x 10000 / 3 + 0.25² x 80000 / 2 = 1875 + 2500 = 4375.
    // df = 4375² / (1875² / 2 + 2500² / 1) = 19140625 / 8007812.5 = 2.3902...
    EXPECT_NEAR(r.densityKgPerKm2, 450.0, 1e-9);
    EXPECT_NEAR(r.seKgPerKm2, std::sqrt(4375.0), 1e-9);
    EXPECT_NEAR(r.degreesOfFreedom, 19140625.0 / 8007812.5, 1e-9);
    EXPECT_NEAR(*r.estimate.cv, std::sqrt(4375.0) / 450.0, 1e-12);
    const double t = studentTTwoSided(0.95, 19140625.0 / 8007812.5);
    EXPECT_NEAR(*r.estimate.ciHigh, (450.0 + t * std::sqrt(4375.0)) / 1000.0, 1e-12);
    ASSERT_EQ(r.strata.size(), 2u);
    EXPECT_DOUBLE_EQ(r.strata[0].weight, 0.75);
    // Unstratified, the same hauls give the plain mean (1+2+3+10+14)/5/0.01 = 600 kg/km².
    const SweptAreaResult plain = sweptAreaBiomass(*read.value, mapping({{"perch", "Perch"}}), "Perch", {});
    EXPECT_NEAR(plain.densityKgPerKm2, 600.0, 1e-9);
}

TEST(SweptArea, RefusesWhatItCannotEstimate)
{
    const auto read = parseHauls("station,haul,date,stratum,swept_area_km2,taxon,catch_kg\n"
                                 "N1,1,2026-06-01,north,0.01,perch,1\n"
                                 "N2,1,2026-06-01,north,0.01,perch,2\n"
                                 "S1,1,2026-06-01,south,0.01,perch,10\n"
                                 "E1,1,2026-06-01,east,0.01,ruffe,1\n",
                                 "hauls.csv");
    ASSERT_TRUE(read.value);
    const auto strata = parseStrata("stratum,area_km2\nnorth,30\nsouth,10\n", "strata.csv");
    // ruffe is not mapped: an error at its taxon cell (line 5, column 6).
    SweptAreaResult r = sweptAreaBiomass(*read.value, mapping({{"perch", "Perch"}}), "Perch", *strata.value);
    EXPECT_FALSE(r.estimate.valid);
    ASSERT_FALSE(r.estimate.problems.empty());
    EXPECT_EQ(r.estimate.problems[0].code, code::kSurveyUnknownTaxon);
    EXPECT_EQ(r.estimate.problems[0].location->line, 5);
    EXPECT_EQ(r.estimate.problems[0].location->column, 6);
    // Mapped: the east haul has no listed stratum, and south has one haul only.
    r = sweptAreaBiomass(*read.value, mapping({{"perch", "Perch"}, {"ruffe", ""}}), "Perch", *strata.value);
    EXPECT_FALSE(r.estimate.valid);
    std::set<std::string> codes;
    for (const Problem& p : r.estimate.problems) codes.insert(p.code);
    EXPECT_TRUE(codes.count(code::kSurveyUnknownStratum));
    EXPECT_TRUE(codes.count(code::kFieldworkTooFewData));
    // Catchability outside (0, 1].
    SweptAreaOptions o;
    o.catchability = 1.5;
    r = sweptAreaBiomass(*read.value, mapping({{"perch", "Perch"}, {"ruffe", ""}}), "Perch", {}, o);
    EXPECT_FALSE(r.estimate.valid);
    EXPECT_EQ(r.estimate.problems[0].code, code::kFieldworkInvalidInput);
    // A compartment no taxon maps to.
    r = sweptAreaBiomass(*read.value, mapping({{"perch", "Perch"}, {"ruffe", ""}}), "Pike", {});
    EXPECT_FALSE(r.estimate.valid);
}

// Issue 12, defect 7: a swept area near 0 (or a tiny catchability) divided a catch into
// infinity, reported as a valid "B = undefined" with "inf kg/km²" among its inputs.
TEST(SweptArea, AnOverflowingCatchPerAreaIsRefusedNamingTheSmallestArea)
{
    const auto read = parseHauls("station,haul,date,swept_area_km2,taxon,catch_kg\n"
                                 "A,1,2026-06-01,0.02,perch,5\n"
                                 "B,1,2026-06-01,1e-320,perch,1e30\n",
                                 "hauls.csv");
    ASSERT_TRUE(read.value);
    const SweptAreaResult r = sweptAreaBiomass(*read.value, mapping({{"perch", "Perch"}}), "Perch", {});
    EXPECT_FALSE(r.estimate.valid);
    ASSERT_FALSE(r.estimate.problems.empty());
    EXPECT_EQ(r.estimate.problems[0].code, code::kFieldworkInvalidInput);
    ASSERT_TRUE(r.estimate.problems[0].location);
    EXPECT_EQ(r.estimate.problems[0].location->line, 3);
    // A catchability near 0 with ordinary hauls: the same refusal.
    const auto ordinary = parseHauls("station,haul,date,swept_area_km2,taxon,catch_kg\n"
                                     "A,1,2026-06-01,0.02,perch,5\nB,1,2026-06-01,0.02,perch,7\n",
                                     "hauls.csv");
    SweptAreaOptions o;
    o.catchability = 1e-320;
    EXPECT_FALSE(sweptAreaBiomass(*ordinary.value, mapping({{"perch", "Perch"}}), "Perch", {}, o).estimate.valid);
}

}  // namespace
}  // namespace tl::fieldwork
