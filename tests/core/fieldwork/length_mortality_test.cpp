// Z from lengths: Beverton & Holt (1956) mean length and the length-converted catch
// curve (Pauly 1983; Sparre & Venema 1998, 4.4.3), against hand calculations written
// out here and against data constructed from a known Z. No published worked example
// with its numbers is used (none is remembered well enough to quote). The regression
// and its interval are compared with scipy.stats.linregress in
// tests/crosscheck/fieldwork_crosscheck_test.cpp.
#include <gtest/gtest.h>

#include <cmath>
#include <regex>

#include "core/fieldwork/fieldwork_report.h"
#include "core/fieldwork/length_mortality.h"
#include "core/fieldwork/student_t.h"
#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

std::vector<LengthClass> classes(std::initializer_list<std::array<double, 3>> rows)
{
    std::vector<LengthClass> out;
    for (const auto& r : rows) out.push_back({"perch", r[0], r[1], r[2], {}});
    return out;
}

TEST(MeanLengthZ, HandCalculation)
{
    const auto c = classes({{10, 12, 5}, {12, 14, 20}, {14, 16, 15}, {16, 18, 10}, {18, 20, 5}});
    const MeanLengthResult r = meanLengthZ(c, {30.0, 0.4});
    ASSERT_TRUE(r.estimate.valid);
    // The mode is 12-14 cm, so L' = 12. Fish >= 12 cm: midpoints 13, 15, 17, 19 x 20, 15, 10, 5
    // = 750 cm over 50 fish: Lmean = 15. Z = 0.4 (30 - 15) / (15 - 12) = 2.0.
    EXPECT_DOUBLE_EQ(r.cutOffCm, 12.0);
    EXPECT_NEAR(r.meanLengthCm, 15.0, 1e-12);
    EXPECT_NEAR(r.estimate.value, 2.0, 1e-12);
    // sum n x mid² = 3380 + 3375 + 2890 + 1805 = 11450; s² = (11450 - 50 x 225) / 49 = 200/49;
    // SE(Lmean) = sqrt(200/49/50) = 2/7. dZ/dLmean = 0.4 (12 - 30) / 3² = -0.8.
    // CV = 0.8 x (2/7) / 2 = 0.1142857.
    EXPECT_NEAR(*r.estimate.cv, 0.8 * (2.0 / 7.0) / 2.0, 1e-12);
    // Interval: Z at Lmean +- t(0.975, 49) x 2/7, mapped through the equation.
    const double t = studentTQuantile(0.975, 49);
    const auto z = [](double lm) { return 0.4 * (30 - lm) / (lm - 12); };
    EXPECT_NEAR(*r.estimate.ciLow, z(15 + t * 2 / 7.0), 1e-12);
    EXPECT_NEAR(*r.estimate.ciHigh, z(15 - t * 2 / 7.0), 1e-12);
    EXPECT_LT(*r.estimate.ciLow, 2.0);
    EXPECT_GT(*r.estimate.ciHigh, 2.0);

    // A cut-off given: L' = 14, fish >= 14: (225 + 170 + 95) / 30 = 16.333; Z = 0.4 x 13.667 / 2.333.
    const MeanLengthResult given = meanLengthZ(c, {30.0, 0.4}, 14.0);
    EXPECT_NEAR(given.estimate.value, 0.4 * (30 - 490.0 / 30) / (490.0 / 30 - 14), 1e-12);
}

TEST(MeanLengthZ, RefusesImpossibleInputs)
{
    const auto c = classes({{10, 12, 5}, {12, 14, 20}, {14, 16, 15}});
    // L∞ below the mean length.
    MeanLengthResult r = meanLengthZ(c, {13.0, 0.4});
    EXPECT_FALSE(r.estimate.valid);
    EXPECT_EQ(r.estimate.problems[0].code, code::kFieldworkInvalidInput);
    r = meanLengthZ(c, {30.0, -0.4});
    EXPECT_FALSE(r.estimate.valid);
    r = meanLengthZ(c, {30.0, 0.4}, 16.0);  // no fish at or above 16 cm
    EXPECT_FALSE(r.estimate.valid);
    EXPECT_EQ(r.estimate.problems[0].code, code::kFieldworkTooFewData);
}

// Counts built from a known Z on the catch curve's own model: C_i = dt_i exp(a - Z t_i).
std::vector<LengthClass> curveWithKnownZ(double z, double linf, double k, double a)
{
    std::vector<LengthClass> out;
    for (double from = 4; from < 40; from += 4) {
        const double to = from + 4;
        const double dt = std::log((linf - from) / (linf - to)) / k;
        const double age = -std::log(1 - (from + 2) / linf) / k;
        out.push_back({"roach", from, to, dt * std::exp(a - z * age), {}});
    }
    return out;
}

TEST(CatchCurve, RecoversAKnownZ)
{
    std::vector<LengthClass> c = curveWithKnownZ(1.2, 50.0, 0.3, 8.0);
    // Make the first two classes not fully recruited (fewer fish than the line predicts):
    // the default selection starts after the peak.
    c[0].count *= 0.05;
    c[1].count *= 0.2;
    const CatchCurveResult r = lengthConvertedCatchCurve(c, {50.0, 0.3});
    ASSERT_TRUE(r.estimate.valid) << r.estimate.problems[0].describe();
    EXPECT_NEAR(r.estimate.value, 1.2, 1e-10);
    EXPECT_NEAR(r.slopeSe, 0.0, 1e-8);
    EXPECT_NEAR(r.r2, 1.0, 1e-12);
    ASSERT_EQ(r.points.size(), 9u);
    // ln(C/dt) = 8 - 1.2 t is highest at class 3 (index 2) once the first two are cut down,
    // so the default regression uses classes 4-9.
    EXPECT_FALSE(r.points[2].selected);
    EXPECT_TRUE(r.points[3].selected);
    EXPECT_EQ(r.used, 6);
    // Hand check of one point: class 8-12 cm, L∞ 50, K 0.3:
    // dt = ln(42/38)/0.3 = 0.33362 years; age at 10 cm = -ln(0.8)/0.3 = 0.74381 years.
    EXPECT_NEAR(r.points[1].dt, std::log(42.0 / 38.0) / 0.3, 1e-12);
    EXPECT_NEAR(r.points[1].age, -std::log(0.8) / 0.3, 1e-12);
}

TEST(CatchCurve, SelectedPointsAndRefusals)
{
    std::vector<LengthClass> c = curveWithKnownZ(0.8, 50.0, 0.3, 6.0);
    c[4].count *= 1.5;  // noise on one point
    const CatchCurveResult chosen = lengthConvertedCatchCurve(c, {50.0, 0.3}, {1, 2, 3, 5, 6});
    ASSERT_TRUE(chosen.estimate.valid);
    EXPECT_NEAR(chosen.estimate.value, 0.8, 1e-10);  // the noisy point left out
    const CatchCurveResult noisy = lengthConvertedCatchCurve(c, {50.0, 0.3}, {1, 2, 3, 4, 5, 6});
    EXPECT_GT(noisy.slopeSe, 0.0);
    EXPECT_LT(*noisy.estimate.ciLow, noisy.estimate.value);

    EXPECT_FALSE(lengthConvertedCatchCurve(c, {50.0, 0.3}, {1, 2}).estimate.valid);      // 2 points
    EXPECT_FALSE(lengthConvertedCatchCurve(c, {50.0, 0.3}, {1, 2, 30}).estimate.valid);  // no class 31
    // A class reaching L∞ has no age: L∞ = 30 cuts classes from 28 cm on.
    const CatchCurveResult shortLinf = lengthConvertedCatchCurve(c, {30.0, 0.3}, {});
    EXPECT_FALSE(shortLinf.points.back().usable);
    // Rising points: no mortality to read.
    std::vector<LengthClass> rising = classes({{10, 12, 1}, {12, 14, 5}, {14, 16, 20}, {16, 18, 80}});
    const CatchCurveResult up = lengthConvertedCatchCurve(rising, {50.0, 0.3}, {0, 1, 2, 3});
    EXPECT_FALSE(up.estimate.valid);
    EXPECT_EQ(up.estimate.problems[0].code, code::kFieldworkInvalidInput);
}

// Issue 12, defect 7: with an enormous L∞ every class's time in class rounds to 0 and
// ln(C/dt) is infinite; such points are not usable, and no message or table shows a NaN
// or an infinity (it printed "slope -nan" and an r² of 1 over undefined points).
TEST(CatchCurve, AnEnormousLinfGivesNoPointsAndNoNanInTheMessages)
{
    const std::vector<LengthClass> c = curveWithKnownZ(0.8, 50.0, 0.3, 6.0);
    const std::regex nonFinite("(^|[^A-Za-z])-?(inf|nan|infinity)([^A-Za-z]|$)", std::regex::icase);
    for (const std::vector<std::size_t>& chosen : {std::vector<std::size_t>{}, std::vector<std::size_t>{1, 2, 3}}) {
        const CatchCurveResult r = lengthConvertedCatchCurve(c, {1e300, 0.3}, chosen);
        EXPECT_FALSE(r.estimate.valid);
        ASSERT_FALSE(r.estimate.problems.empty());
        for (const CatchCurvePoint& p : r.points) EXPECT_FALSE(p.usable) << p.fromCm;
        for (const Problem& p : r.estimate.problems) EXPECT_FALSE(std::regex_search(p.message, nonFinite)) << p.message;
        EXPECT_FALSE(std::regex_search(catchCurveTable(r), nonFinite)) << catchCurveTable(r);
    }
}

}  // namespace
}  // namespace tl::fieldwork
