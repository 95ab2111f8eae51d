// Input distributions of the ensemble; the formulas and their sources are in the header.
#include "core/ensemble/input_distribution.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace tl::ensemble {
namespace {

constexpr double kSqrt3 = 1.7320508075688772;
constexpr double kSqrt6 = 2.4494897427831781;
constexpr double kInvSqrt2Pi = 0.3989422804014327;

double standardNormalPdf(double x) { return kInvSqrt2Pi * std::exp(-0.5 * x * x); }
double standardNormalCdf(double x) { return 0.5 * std::erfc(-x / std::sqrt(2.0)); }

}  // namespace

std::string_view shapeKey(Shape s)
{
    switch (s) {
    case Shape::Lognormal: return "lognormal";
    case Shape::TruncatedNormal: return "truncated-normal";
    case Shape::Uniform: return "uniform";
    case Shape::Triangular: return "triangular";
    }
    return "";
}

std::optional<Shape> parseShape(std::string_view key)
{
    for (Shape s : {Shape::Lognormal, Shape::TruncatedNormal, Shape::Uniform, Shape::Triangular})
        if (shapeKey(s) == key) return s;
    return std::nullopt;
}

InputDistribution::InputDistribution(Shape shape, double value, double cv) : shape_(shape), value_(value), cv_(cv)
{
    constant_ = !(value > 0.0) || !(cv > 0.0) || !std::isfinite(value) || !std::isfinite(cv);
    if (constant_) return;
    switch (shape) {
    case Shape::Lognormal: {
        const double s2 = std::log1p(cv * cv);
        p1_ = std::log(value) - 0.5 * s2;
        p2_ = std::sqrt(s2);
        break;
    }
    case Shape::TruncatedNormal:
        p1_ = value;
        p2_ = cv * value;
        break;
    case Shape::Uniform: p1_ = std::min(kSqrt3 * cv * value, value); break;
    case Shape::Triangular: p1_ = std::min(kSqrt6 * cv * value, value); break;
    }
}

double InputDistribution::draw(DrawStream& s) const
{
    if (constant_) return value_;
    switch (shape_) {
    case Shape::Lognormal: return std::exp(p1_ + p2_ * s.normal());
    case Shape::TruncatedNormal:
        for (;;) {
            const double x = p1_ + p2_ * s.normal();
            if (x >= 0.0) return x;
        }
    case Shape::Uniform: return value_ + p1_ * (2.0 * s.uniform01() - 1.0);
    case Shape::Triangular:  // the sum of two uniforms on [-a/2, a/2] is triangular on [-a, a]
        return value_ + p1_ * (s.uniform01() + s.uniform01() - 1.0);
    }
    return value_;
}

double InputDistribution::effectiveCv() const
{
    if (constant_) return 0.0;
    switch (shape_) {
    case Shape::Uniform: return p1_ / (kSqrt3 * value_);
    case Shape::Triangular: return p1_ / (kSqrt6 * value_);
    case Shape::TruncatedNormal: return truncatedNormalMoments(p1_, p2_).sd / truncatedNormalMoments(p1_, p2_).mean;
    case Shape::Lognormal: break;
    }
    return cv_;
}

double InputDistribution::mean() const
{
    if (shape_ == Shape::TruncatedNormal && !constant_) return truncatedNormalMoments(p1_, p2_).mean;
    return value_;
}

double InputDistribution::sd() const
{
    if (constant_) return 0.0;
    if (shape_ == Shape::TruncatedNormal) return truncatedNormalMoments(p1_, p2_).sd;
    return effectiveCv() * value_;
}

Moments truncatedNormalMoments(double mu, double sigma)
{
    // alpha = (0 - mu) / sigma; lambda = phi(alpha) / (1 - Phi(alpha)) (inverse Mills ratio).
    const double alpha = -mu / sigma;
    const double lambda = standardNormalPdf(alpha) / standardNormalCdf(-alpha);
    const double mean = mu + sigma * lambda;
    const double var = sigma * sigma * (1.0 + alpha * lambda - lambda * lambda);
    return {mean, std::sqrt(var)};
}

double DirichletRow::concentrationFor(double largestShare, double cv)
{
    if (!(cv > 0.0) || !(largestShare > 0.0) || largestShare >= 1.0) return 0.0;
    return std::max(kMinConcentration, (1.0 - largestShare) / (largestShare * cv * cv) - 1.0);
}

DirichletRow::DirichletRow(std::vector<double> shares, double cv) : shares_(std::move(shares))
{
    const double sum = std::accumulate(shares_.begin(), shares_.end(), 0.0);
    if (sum > 0.0)
        for (double& p : shares_) p /= sum;
    const double largest = shares_.empty() ? 0.0 : *std::max_element(shares_.begin(), shares_.end());
    alpha0_ = shares_.size() < 2 ? 0.0 : concentrationFor(largest, cv);
    if (alpha0_ > 0.0)
        for (double p : shares_) gammas_.emplace_back(alpha0_ * p);
}

void DirichletRow::draw(DrawStream& s, double* out) const
{
    const std::size_t k = shares_.size();
    if (k < 2 || alpha0_ == 0.0) {
        std::copy(shares_.begin(), shares_.end(), out);
        return;
    }
    double sum = 0.0;
    for (std::size_t i = 0; i < k; ++i) {
        out[i] = s.gamma(gammas_[i]);
        sum += out[i];
    }
    if (!(sum > 0.0)) {  // every gamma underflowed (tiny shares and concentration): keep the point
        std::copy(shares_.begin(), shares_.end(), out);
        return;
    }
    const double inverse = 1.0 / sum;  // one division: the row sums to 1 within rounding
    for (std::size_t i = 0; i < k; ++i) out[i] *= inverse;
}

}  // namespace tl::ensemble
