// Empirical equations for M and Q/B. The coefficients are from memory of the papers
// (said in core/fieldwork/empirical_equations.h); the hand calculations below apply
// them step by step. Then et al. 2015 is also checked against values printed, rounded to
// two decimals, in a third-party R script for white sturgeon (Blue-Matter/SJR_sturgeon,
// 02_biological_parameters.R: M 0.13 at tmax 51, 0.16 at 43; 0.06 at L∞ 264 cm, K 0.04).
#include <gtest/gtest.h>

#include <cmath>

#include "core/fieldwork/empirical_equations.h"
#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

TEST(EmpiricalEquations, Pauly1980HandCalculation)
{
    // L∞ 30 cm, K 0.5/year, T 20 °C:
    // log10 M = -0.0066 - 0.279 x 1.47712 + 0.6543 x (-0.30103) + 0.4634 x 1.30103 = -0.01278
    const Estimate e = paulyNaturalMortality(30.0, 0.5, 20.0);
    ASSERT_TRUE(e.valid);
    EXPECT_NEAR(e.value, std::pow(10.0, -0.0066 - 0.279 * std::log10(30.0) + 0.6543 * std::log10(0.5) +
                                            0.4634 * std::log10(20.0)),
                1e-12);
    EXPECT_NEAR(e.value, 0.9710, 1e-4);
    EXPECT_TRUE(e.warnings.empty());
    EXPECT_FALSE(e.cv);
    EXPECT_EQ(e.inputs.size(), 3u);
}

TEST(EmpiricalEquations, Then2015AgainstHandAndThirdPartyValues)
{
    EXPECT_NEAR(thenMortalityFromMaxAge(10.0).value, 4.899 * std::pow(10.0, -0.916), 1e-12);  // 0.5944
    EXPECT_NEAR(thenMortalityFromMaxAge(10.0).value, 0.5944, 1e-4);
    EXPECT_NEAR(thenMortalityFromMaxAge(51.0).value, 0.13, 0.005);
    EXPECT_NEAR(thenMortalityFromMaxAge(43.0).value, 0.16, 0.005);
    EXPECT_NEAR(thenMortalityFromGrowth(264.0, 0.04).value, 0.06, 0.005);
    EXPECT_NEAR(thenMortalityFromGrowth(230.0, 0.06).value, 0.09, 0.005);
    // L∞ 40 cm, K 0.3: 4.118 x 0.3^0.73 x 40^-0.33
    EXPECT_NEAR(thenMortalityFromGrowth(40.0, 0.3).value, 4.118 * std::pow(0.3, 0.73) * std::pow(40.0, -0.33), 1e-12);
}

TEST(EmpiricalEquations, PalomaresPauly1998HandCalculation)
{
    // W∞ 1000 g, T 15 °C (T' = 1000/288.15 = 3.47042), A 1.5, carnivore:
    // log10 Q/B = 7.964 - 0.204 x 3 - 1.965 x 3.47042 + 0.083 x 1.5 = 0.65713 -> Q/B = 4.540
    const Estimate e = palomaresPaulyConsumption(1000.0, 15.0, 1.5, FeedingType::Carnivore);
    ASSERT_TRUE(e.valid);
    EXPECT_NEAR(e.value, std::pow(10.0, 7.964 - 0.612 - 1.965 * 1000.0 / 288.15 + 0.1245), 1e-12);
    EXPECT_NEAR(e.value, 4.540, 1e-3);
    // Herbivores and detritivores eat more: x 10^0.532 and x 10^0.398.
    EXPECT_NEAR(palomaresPaulyConsumption(1000.0, 15.0, 1.5, FeedingType::Herbivore).value / e.value,
                std::pow(10.0, 0.532), 1e-12);
    EXPECT_NEAR(palomaresPaulyConsumption(1000.0, 15.0, 1.5, FeedingType::Detritivore).value / e.value,
                std::pow(10.0, 0.398), 1e-12);
    EXPECT_TRUE(palomaresPaulyConsumption(1000.0, -1.0, 1.5, FeedingType::Carnivore).valid);  // cold water is allowed
}

TEST(EmpiricalEquations, WarnOutsideTheFittedRangeAndRefuseNonsense)
{
    const Estimate warm = paulyNaturalMortality(30.0, 0.5, 35.0);
    ASSERT_TRUE(warm.valid);
    ASSERT_EQ(warm.warnings.size(), 1u);
    EXPECT_EQ(warm.warnings[0].code, code::kFieldworkOutsideRange);
    EXPECT_EQ(warm.warnings[0].severity, Severity::Warning);
    EXPECT_NE(warm.warnings[0].message.find("approximate"), std::string::npos);
    EXPECT_EQ(thenMortalityFromMaxAge(0.5).warnings.size(), 1u);
    EXPECT_EQ(palomaresPaulyConsumption(1e7, 15.0, 1.5, FeedingType::Carnivore).warnings.size(), 1u);

    const Estimate bad = paulyNaturalMortality(-30.0, 0.5, 20.0);
    EXPECT_FALSE(bad.valid);
    EXPECT_EQ(bad.problems[0].code, code::kFieldworkInvalidInput);
    EXPECT_FALSE(thenMortalityFromGrowth(40.0, 0.0).valid);
    EXPECT_FALSE(paulyNaturalMortality(30.0, 0.5, NAN).valid);
}

}  // namespace
}  // namespace tl::fieldwork
