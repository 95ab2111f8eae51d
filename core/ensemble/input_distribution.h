// InputDistribution: the distribution one uncertain input is drawn from in an ensemble
// (DESIGN.md 3.7), set by its point value m (the value the scenario holds) and its CV c
// (from its data confidence: explicit CV, else the project's CV of its grade).
//
//   Lognormal        ln X ~ N(mu, s^2), s^2 = ln(1 + c^2), mu = ln m - s^2 / 2:
//                    mean m and CV c exactly, at any c (the default: positive and
//                    right-skewed like most rates and stocks; common practice, no source).
//   TruncatedNormal  N(m, (c m)^2) truncated at 0 (drawn by rejection). Truncation raises
//                    the mean and lowers the CV slightly; truncatedMoments gives both
//                    (Johnson, Kotz & Balakrishnan 1994, Continuous Univariate
//                    Distributions vol. 1, ch. 13; formulae from memory, checked against
//                    scipy.stats.truncnorm in input_distribution_test).
//   Uniform          on [m - a, m + a], a = sqrt(3) c m (sd of a uniform = a / sqrt 3).
//   Triangular       symmetric about mode m on [m - a, m + a], a = sqrt(6) c m.
//   For Uniform and Triangular the half-width is capped at m so that no draw is
//   negative: the CV they realise is then at most 1/sqrt 3 (0.577) or 1/sqrt 6 (0.408);
//   effectiveCv() says what is drawn (this project's choice).
// A point value <= 0 or a CV <= 0 is drawn as the constant m.
//
// Diet rows: DirichletRow draws one predator's shares (modelled prey and import) from
// Dirichlet(alpha0 p_1, ..., alpha0 p_K) with p the scenario's shares, so E[x_k] = p_k and
// Var[x_k] = p_k (1 - p_k) / (alpha0 + 1) (Kotz, Balakrishnan & Johnson 2000, Continuous
// Multivariate Distributions vol. 1, ch. 49). The concentration alpha0 follows the row's
// confidence: the CV c is given to the row's largest share p_max,
//   alpha0 = (1 - p_max) / (p_max c^2) - 1, at least kMinConcentration
// (this project's convention). Shares that are 0 stay 0 (the diet's pattern is kept);
// a row of one share does not vary. Drawn by normalised gamma variates.
#pragma once

#include <cstdint>
#include <optional>
#include <string_view>
#include <vector>

#include "core/ensemble/draw_stream.h"

namespace tl::ensemble {

enum class Shape : std::uint8_t { Lognormal, TruncatedNormal, Uniform, Triangular };
std::string_view shapeKey(Shape s);  // "lognormal", "truncated-normal", "uniform", "triangular"
std::optional<Shape> parseShape(std::string_view key);

class InputDistribution {
public:
    InputDistribution() = default;
    InputDistribution(Shape shape, double value, double cv);

    double draw(DrawStream& s) const;

    Shape shape() const { return shape_; }
    double value() const { return value_; }  // the point value m
    double cv() const { return cv_; }        // the CV asked for
    double effectiveCv() const;              // Uniform / Triangular after the cap; else cv()
    bool constant() const { return constant_; }
    // Mean and standard deviation of the distribution drawn (analytic).
    double mean() const;
    double sd() const;

private:
    Shape shape_ = Shape::Lognormal;
    double value_ = 0.0, cv_ = 0.0;
    double p1_ = 0.0, p2_ = 0.0;  // lognormal mu, s; normal mean, sd; uniform/triangular half-width, unused
    bool constant_ = true;
};

// Mean and sd of N(mu, sigma^2) truncated to [0, inf).
struct Moments {
    double mean = 0.0, sd = 0.0;
};
Moments truncatedNormalMoments(double mu, double sigma);

inline constexpr double kMinConcentration = 1.0;

class DirichletRow {
public:
    DirichletRow() = default;
    // shares: the row's non-zero shares (any order; they are normalised to sum 1).
    DirichletRow(std::vector<double> shares, double cv);

    // Writes one draw of the shares into out (same order, same size); sums to 1.
    void draw(DrawStream& s, double* out) const;

    std::size_t size() const { return shares_.size(); }
    double concentration() const { return alpha0_; }
    const std::vector<double>& shares() const { return shares_; }
    bool constant() const { return shares_.size() < 2 || alpha0_ == 0.0; }

    static double concentrationFor(double largestShare, double cv);

private:
    std::vector<double> shares_;
    std::vector<DrawStream::GammaShape> gammas_;  // of alpha0 p_k, precomputed
    double alpha0_ = 0.0;
};

}  // namespace tl::ensemble
