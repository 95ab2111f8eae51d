// Empirical equations for M and Q/B (sources of each coefficient in
// core/fieldwork/empirical_equations.h); the hand calculations below apply them step by
// step. Published numbers: Pauly 1980 against the M values Kenchington (2014) printed
// for three stocks (below). Then et al. 2015: no published worked example with numbers
// was found; it is checked against values printed, rounded to two decimals, in a
// third-party R script for white sturgeon (Blue-Matter/SJR_sturgeon,
// 02_biological_parameters.R: M 0.13 at tmax 51, 0.16 at 43; 0.06 at L∞ 264 cm, K 0.04).
// Palomares & Pauly 1998: nothing found; its coefficients are from memory and only the
// hand calculation checks them.
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
    ASSERT_EQ(e.inputs.size(), 3u);
    // Each input shows its unit and the (approximate) range of the equation's data.
    EXPECT_EQ(e.inputs[0], "L∞ 30 cm (data about 2 to 250 cm)");
    EXPECT_EQ(e.inputs[2], "T 20 °C (data about 5 to 30 °C)");
}

TEST(EmpiricalEquations, Pauly1980ReproducesKenchington2014)
{
    // Kenchington, T.J. 2014. Natural mortality estimators for information-limited
    // fisheries. Fish and Fisheries 15:533-562: M by "Pauly (1980) length equation",
    // printed to two decimals, for three stocks. Read as reproduced in the test file of
    // the FSA R package (fishR-Core-Team/FSA, tests/testthat, "metaM() matches results
    // from Kenchington (2014)"), not from the paper itself.
    struct Stock {
        const char* name;
        double linf, k, t, published;
    };
    const Stock stocks[] = {{"Chesapeake Bay anchovy", 12.93, 0.23, 17.0, 0.69},
                            {"Norwegian fjord lanternfish", 8.306, 0.204, 8.0, 0.51},
                            {"Ria Formosa seahorse", 19.76, 0.571, 19.0, 1.16}};
    for (const Stock& s : stocks) {
        const Estimate e = paulyNaturalMortality(s.linf, s.k, s.t);
        ASSERT_TRUE(e.valid) << s.name;
        EXPECT_NEAR(std::round(e.value * 100.0) / 100.0, s.published, 1e-9) << s.name << ": M = " << e.value;
    }
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

TEST(EmpiricalEquations, NoUncertaintyGivenMeansNoCv)
{
    const Estimate e = thenMortalityFromMaxAge(10.0);
    EXPECT_FALSE(e.cv);
    EXPECT_FALSE(e.ciLow);
    ASSERT_FALSE(e.assumptions.empty());
    EXPECT_NE(e.assumptions[0].find("no CV"), std::string::npos);
    // An SE of an input the equation does not take is no uncertainty of its result.
    EquationUncertainty u;
    u.linfSe = 5.0;
    EXPECT_FALSE(thenMortalityFromMaxAge(10.0, u).cv);
}

TEST(EmpiricalEquations, DeltaMethodCvHandCalculation)
{
    // Then tmax equation, tmax 10 ± 2 years (CV 0.2), no residual:
    //   Var(ln tmax) = ln(1 + 0.2^2) = 0.0392207; sigma = 0.916 x sqrt(0.0392207) = 0.181406
    //   CV(M) = sqrt(exp(sigma^2) - 1) = 0.182909
    //   95 % interval: 0.59440 x exp(± 1.959964 x 0.181406) = 0.41658 to 0.84824
    EquationUncertainty u;
    u.tmaxSe = 2.0;
    const Estimate e = thenMortalityFromMaxAge(10.0, u);
    ASSERT_TRUE(e.valid);
    const double sigma = 0.916 * std::sqrt(std::log(1.04));
    EXPECT_NEAR(sigma, 0.181406, 1e-6);
    ASSERT_TRUE(e.cv);
    EXPECT_NEAR(*e.cv, std::sqrt(std::exp(sigma * sigma) - 1.0), 1e-12);
    EXPECT_NEAR(*e.cv, 0.182909, 1e-6);
    ASSERT_TRUE(e.ciLow && e.ciHigh);
    EXPECT_NEAR(*e.ciLow, e.value * std::exp(-1.959964 * sigma), 1e-6);
    EXPECT_NEAR(*e.ciHigh, e.value * std::exp(1.959964 * sigma), 1e-6);
    EXPECT_NEAR(*e.ciLow, 0.41659, 1e-4);
    EXPECT_NEAR(*e.ciHigh, 0.84824, 1e-4);

    // Adding a residual SD of 0.3 on ln M: sigma^2 = 0.181406^2 + 0.09.
    u.residualSdLn = 0.3;
    const Estimate withResidual = thenMortalityFromMaxAge(10.0, u);
    EXPECT_NEAR(*withResidual.cv, std::sqrt(std::exp(sigma * sigma + 0.09) - 1.0), 1e-12);
    EXPECT_DOUBLE_EQ(withResidual.value, e.value);  // the value stays the equation's (median)

    // Pauly: the three exponents weight the three log-CVs.
    EquationUncertainty p;
    p.linfSe = 3.0;        // of 30 cm: CV 0.1
    p.kSe = 0.1;           // of 0.5: CV 0.2
    p.temperatureSe = 1.0; // of 20 °C: CV 0.05
    p.ciLevel = 0.9;
    const Estimate pauly = paulyNaturalMortality(30.0, 0.5, 20.0, p);
    const double v = 0.279 * 0.279 * std::log(1.01) + 0.6543 * 0.6543 * std::log(1.04) + 0.4634 * 0.4634 * std::log(1.0025);
    EXPECT_NEAR(*pauly.cv, std::sqrt(std::expm1(v)), 1e-12);
    EXPECT_NEAR(*pauly.ciHigh, pauly.value * std::exp(1.644854 * std::sqrt(v)), 1e-6);
    EXPECT_DOUBLE_EQ(pauly.ciLevel, 0.9);
}

TEST(EmpiricalEquations, ConsumptionTemperatureAndAspectRatioEnterLinearly)
{
    // d ln(Q/B)/dT = ln 10 x 1965 / 288.15^2 = 0.054493 per °C; d ln(Q/B)/dA = ln 10 x 0.083 = 0.191115.
    EquationUncertainty u;
    u.temperatureSe = 2.0;
    u.aspectRatioSe = 0.3;
    const Estimate e = palomaresPaulyConsumption(1000.0, 15.0, 1.5, FeedingType::Carnivore, u);
    ASSERT_TRUE(e.valid);
    const double dT = std::log(10.0) * 1965.0 / (288.15 * 288.15);
    EXPECT_NEAR(dT, 0.054493, 1e-6);
    const double v = dT * dT * 4.0 + std::pow(std::log(10.0) * 0.083 * 0.3, 2);
    EXPECT_NEAR(*e.cv, std::sqrt(std::expm1(v)), 1e-12);
}

TEST(EmpiricalEquations, NegativeStandardErrorIsRefused)
{
    EquationUncertainty u;
    u.kSe = -0.1;
    const Estimate e = thenMortalityFromGrowth(40.0, 0.3, u);
    EXPECT_FALSE(e.valid);
    ASSERT_FALSE(e.problems.empty());
    EXPECT_EQ(e.problems[0].code, code::kFieldworkInvalidInput);
    EXPECT_NE(e.problems[0].message.find("SE of K"), std::string::npos);
    u.kSe = 0.0;
    u.residualSdLn = NAN;
    EXPECT_FALSE(thenMortalityFromGrowth(40.0, 0.3, u).valid);
}

TEST(EmpiricalEquations, NormalQuantile)
{
    EXPECT_NEAR(normalTwoSided(0.95), 1.959963985, 1e-8);
    EXPECT_NEAR(normalTwoSided(0.90), 1.644853627, 1e-8);
    EXPECT_NEAR(normalTwoSided(0.99), 2.575829304, 1e-8);
}

}  // namespace
}  // namespace tl::fieldwork
