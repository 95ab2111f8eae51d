// Partial rank correlation coefficients (core/sensitivity/prcc.h; Marino et al. 2008 J
// Theor Biol 254:178): ranks with ties, exact cases, both computations agreeing, and
// the undefined cases (constant input or output, collinear inputs, too few draws).
// The independent numpy/scipy check is tests/crosscheck/prcc_crosscheck_test.cpp.
#include <cmath>
#include <random>

#include <gtest/gtest.h>

#include "core/sensitivity/prcc.h"

namespace tl {
namespace {

Eigen::MatrixXd randomDraws(std::uint32_t seed, Eigen::Index rows, Eigen::Index cols)
{
    std::mt19937 rng(seed);
    std::uniform_real_distribution<double> u(0.0, 1.0);
    Eigen::MatrixXd x(rows, cols);
    for (Eigen::Index r = 0; r < rows; ++r)
        for (Eigen::Index c = 0; c < cols; ++c) x(r, c) = u(rng);
    return x;
}

TEST(Prcc, RanksAverageTies)
{
    Eigen::VectorXd v(6);
    v << 3.0, 1.0, 3.0, 2.0, 3.0, -1.0;
    Eigen::VectorXd expected(6);
    expected << 5.0, 2.0, 5.0, 3.0, 5.0, 1.0;  // the three 3s share ranks 4, 5, 6
    EXPECT_EQ(averageRanks(v), expected);
}

TEST(Prcc, OutputMonotoneInOneInputGivesOne)
{
    const Eigen::MatrixXd x = randomDraws(1, 200, 4);
    // y depends on input 2 only, through a monotone non-linear function: its ranks are
    // input 2's ranks, so the residuals are equal (PRCC 1); decreasing gives -1.
    const Eigen::VectorXd up = x.col(2).array().exp().pow(3.0);
    const Eigen::VectorXd down = -x.col(2).array().log();
    EXPECT_NEAR(partialRankCorrelation(x, up).coefficient[2], 1.0, 1e-12);
    EXPECT_NEAR(partialRankCorrelation(x, down).coefficient[2], -1.0, 1e-12);
}

TEST(Prcc, InvariantUnderMonotoneTransformsOfTheInputs)
{
    const Eigen::MatrixXd x = randomDraws(2, 300, 5);
    Eigen::VectorXd y = x.col(0) * 2.0 - x.col(1) + 0.3 * x.col(3).array().square().matrix();
    y += 0.2 * randomDraws(3, 300, 1).col(0);
    Eigen::MatrixXd moved = x;
    moved.col(0) = x.col(0).array().exp();
    moved.col(1) = x.col(1).array().pow(5.0);
    const PrccResult a = partialRankCorrelation(x, y), b = partialRankCorrelation(moved, y);
    for (Eigen::Index j = 0; j < 5; ++j) EXPECT_NEAR(a.coefficient[j], b.coefficient[j], 1e-12);
    EXPECT_GT(a.coefficient[0], 0.8);
    EXPECT_LT(a.coefficient[1], -0.5);
    EXPECT_LT(std::abs(a.coefficient[4]), 0.2);  // no effect
}

TEST(Prcc, PrecisionIdentityEqualsTheResidualRegressions)
{
    for (std::uint32_t seed = 10; seed < 15; ++seed) {
        Eigen::MatrixXd x = randomDraws(seed, 150, 6);
        x.col(5) = (x.col(5) * 4.0).array().floor();  // heavy ties: four values
        const Eigen::VectorXd y = x.col(0) + x.col(1).array().sqrt().matrix() - 0.5 * x.col(5) +
                                  0.4 * randomDraws(seed + 100, 150, 1).col(0);
        const PrccResult fast = partialRankCorrelation(x, y);
        PrccOptions o;
        o.viaResiduals = true;
        const PrccResult slow = partialRankCorrelation(x, y, o);
        EXPECT_FALSE(fast.viaResiduals);
        EXPECT_TRUE(slow.viaResiduals);
        for (Eigen::Index j = 0; j < 6; ++j) EXPECT_NEAR(fast.coefficient[j], slow.coefficient[j], 1e-10) << seed;
    }
}

TEST(Prcc, ConstantInputIsUndefinedAndLeftOutOfTheOthers)
{
    const Eigen::MatrixXd x = randomDraws(4, 100, 3);
    const Eigen::VectorXd y = x.col(0) - x.col(2) + 0.3 * randomDraws(5, 100, 1).col(0);
    Eigen::MatrixXd withConstant(100, 4);
    withConstant << x.col(0), Eigen::VectorXd::Constant(100, 7.0), x.col(1), x.col(2);
    const PrccResult r = partialRankCorrelation(withConstant, y), plain = partialRankCorrelation(x, y);
    EXPECT_TRUE(std::isnan(r.coefficient[1]));
    EXPECT_EQ(r.note[1], PrccNote::ConstantInput);
    EXPECT_NEAR(r.coefficient[0], plain.coefficient[0], 1e-12);
    EXPECT_NEAR(r.coefficient[2], plain.coefficient[1], 1e-12);
    EXPECT_NEAR(r.coefficient[3], plain.coefficient[2], 1e-12);
}

TEST(Prcc, ConstantOutputLeavesEveryInputUndefined)
{
    const PrccResult r = partialRankCorrelation(randomDraws(6, 50, 3), Eigen::VectorXd::Constant(50, 1.0));
    for (Eigen::Index j = 0; j < 3; ++j) {
        EXPECT_TRUE(std::isnan(r.coefficient[j]));
        EXPECT_EQ(r.note[static_cast<std::size_t>(j)], PrccNote::ConstantOutput);
    }
}

TEST(Prcc, DuplicatedInputIsCollinear)
{
    Eigen::MatrixXd x = randomDraws(7, 80, 3);
    x.col(2) = x.col(0).array().exp();  // same ranks as input 0
    const Eigen::VectorXd y = x.col(0) + x.col(1);
    const PrccResult r = partialRankCorrelation(x, y);
    EXPECT_TRUE(r.viaResiduals);  // the ranked covariance is singular
    EXPECT_EQ(r.note[0], PrccNote::Collinear);
    EXPECT_EQ(r.note[2], PrccNote::Collinear);
    EXPECT_EQ(r.note[1], PrccNote::Defined);
    EXPECT_GT(r.coefficient[1], 0.5);
}

// Student's t two-sided tail against its closed forms: df = 1 is the Cauchy distribution,
// P(|T| >= t) = 1 - 2 atan(t) / pi; df = 2 gives 1 - t / sqrt(2 + t^2) (textbook results).
TEST(Prcc, StudentTailMatchesClosedForms)
{
    const double pi = std::acos(-1.0);
    for (double t : {0.0, 0.1, 0.5, 1.0, 2.5, 10.0, 300.0}) {
        EXPECT_NEAR(studentTwoSidedP(t, 1.0), 1.0 - 2.0 * std::atan(t) / pi, 1e-13) << t;
        EXPECT_NEAR(studentTwoSidedP(-t, 2.0), 1.0 - t / std::sqrt(2.0 + t * t), 1e-13) << t;
    }
    // Far tail, relative: df = 2, t = 1e4: 1 - t / sqrt(2 + t^2) ~ 1 / t^2.
    EXPECT_NEAR(studentTwoSidedP(1e4, 2.0) / 1e-8, 1.0, 1e-6);
}

TEST(Prcc, SignificanceFollowsStrengthAndDraws)
{
    const Eigen::MatrixXd x = randomDraws(12, 200, 3);
    const Eigen::VectorXd y = x.col(0) + 0.05 * x.col(1) + 0.3 * randomDraws(13, 200, 1).col(0);
    const PrccResult r = partialRankCorrelation(x, y);
    EXPECT_EQ(r.draws, 200u);
    EXPECT_EQ(r.degreesOfFreedom, 200.0 - 2.0 - 2.0);
    EXPECT_LT(r.pValue[0], 1e-20);  // the strong driver
    EXPECT_GT(r.pValue[2], 0.001);   // no effect
    const double rr = r.coefficient[0], df = r.degreesOfFreedom;
    EXPECT_DOUBLE_EQ(r.pValue[0], studentTwoSidedP(rr * std::sqrt(df / (1.0 - rr * rr)), df));
}

TEST(Prcc, TooFewDrawsAndNonFiniteDraws)
{
    const PrccResult few = partialRankCorrelation(randomDraws(8, 5, 3), randomDraws(9, 5, 1).col(0));
    for (PrccNote n : few.note) EXPECT_EQ(n, PrccNote::TooFewDraws);
    // A draw that did not solve (NaN output) is left out: same as without that row.
    Eigen::MatrixXd x = randomDraws(10, 60, 2);
    Eigen::VectorXd y = x.col(0) - 0.5 * x.col(1) + 0.2 * randomDraws(11, 60, 1).col(0);
    const PrccResult whole = partialRankCorrelation(x.topRows(59), y.head(59));
    y[59] = std::nan("");
    const PrccResult holed = partialRankCorrelation(x, y);
    for (Eigen::Index j = 0; j < 2; ++j) EXPECT_NEAR(holed.coefficient[j], whole.coefficient[j], 1e-12);
}

}  // namespace
}  // namespace tl
