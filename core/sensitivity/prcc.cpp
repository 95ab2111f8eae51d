#include "core/sensitivity/prcc.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

namespace tl {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
// Below this reciprocal condition number the ranked covariance is treated as singular
// and the step-by-step regressions take over (this project's choice).
constexpr double kConditioningFloor = 1e-10;
// A residual this small a share of its column's spread means the other inputs determine
// the input exactly (this project's choice; rank data are integers or half-integers).
constexpr double kCollinearShare = 1e-9;

Eigen::VectorXd centred(const Eigen::VectorXd& v) { return v.array() - v.mean(); }

// Continued fraction of the incomplete beta function, evaluated by the modified Lentz
// method (Lentz 1976 Appl Opt 15:668; Thompson & Barnett 1986 J Comput Phys 64:490):
// I_x(a, b) = x^a (1-x)^b / (a B(a, b)) / (1 + d1 / (1 + d2 / (1 + ...))), with
// d_{2m+1} = -(a+m)(a+b+m) x / ((a+2m)(a+2m+1)), d_{2m} = m(b-m) x / ((a+2m-1)(a+2m)).
double incompleteBetaFraction(double a, double b, double x)
{
    constexpr double tiny = 1e-300, eps = 1e-16;
    double c = 1.0, d = 1.0 - (a + b) * x / (a + 1.0);
    if (std::abs(d) < tiny) d = tiny;
    d = 1.0 / d;
    double f = d;
    for (int m = 1; m <= 10000; ++m) {
        const double dm = static_cast<double>(m);
        const double even = dm * (b - dm) * x / ((a + 2.0 * dm - 1.0) * (a + 2.0 * dm));
        const double odd = -(a + dm) * (a + b + dm) * x / ((a + 2.0 * dm) * (a + 2.0 * dm + 1.0));
        for (const double coefficient : {even, odd}) {
            d = 1.0 + coefficient * d;
            if (std::abs(d) < tiny) d = tiny;
            c = 1.0 + coefficient / c;
            if (std::abs(c) < tiny) c = tiny;
            d = 1.0 / d;
            f *= c * d;
        }
        if (std::abs(c * d - 1.0) < eps) break;
    }
    return f;
}

// Regularized incomplete beta I_x(a, b), using the symmetry I_x(a,b) = 1 - I_{1-x}(b,a)
// where the fraction converges slowly (x > (a+1)/(a+b+2)).
double regularizedIncompleteBeta(double a, double b, double x)
{
    if (x <= 0.0) return 0.0;
    if (x >= 1.0) return 1.0;
    const double logFront = std::lgamma(a + b) - std::lgamma(a) - std::lgamma(b) + a * std::log(x) + b * std::log1p(-x);
    if (x < (a + 1.0) / (a + b + 2.0)) return std::exp(logFront) * incompleteBetaFraction(a, b, x) / a;
    return 1.0 - std::exp(logFront) * incompleteBetaFraction(b, a, 1.0 - x) / b;
}

double pearson(const Eigen::VectorXd& a, const Eigen::VectorXd& b)
{
    const Eigen::VectorXd ca = centred(a), cb = centred(b);
    const double denominator = std::sqrt(ca.squaredNorm() * cb.squaredNorm());
    return denominator > 0.0 ? ca.dot(cb) / denominator : kNaN;
}

// Two-sided p-values of the defined coefficients (prcc.h).
void addSignificance(PrccResult& result, std::size_t kept)
{
    result.degreesOfFreedom = static_cast<double>(result.draws) - 2.0 - (static_cast<double>(kept) - 1.0);
    for (Eigen::Index j = 0; j < result.coefficient.size(); ++j) {
        const double r = result.coefficient[j];
        if (!std::isfinite(r) || result.degreesOfFreedom <= 0.0) continue;
        result.pValue[j] = std::abs(r) >= 1.0 ? 0.0
                                              : studentTwoSidedP(r * std::sqrt(result.degreesOfFreedom / (1.0 - r * r)),
                                                                 result.degreesOfFreedom);
    }
}

}  // namespace

double studentTwoSidedP(double t, double df)
{
    if (!std::isfinite(t)) return std::isnan(t) ? kNaN : 0.0;
    return regularizedIncompleteBeta(0.5 * df, 0.5, df / (df + t * t));
}

const char* prccNoteKey(PrccNote note)
{
    switch (note) {
    case PrccNote::Defined: return "";
    case PrccNote::ConstantInput: return "constant_input";
    case PrccNote::ConstantOutput: return "constant_output";
    case PrccNote::Collinear: return "collinear";
    case PrccNote::TooFewDraws: return "too_few_draws";
    }
    return "";
}

Eigen::VectorXd averageRanks(const Eigen::Ref<const Eigen::VectorXd>& values)
{
    const auto n = values.size();
    std::vector<Eigen::Index> order(static_cast<std::size_t>(n));
    std::iota(order.begin(), order.end(), Eigen::Index{0});
    std::stable_sort(order.begin(), order.end(), [&](Eigen::Index a, Eigen::Index b) { return values[a] < values[b]; });
    Eigen::VectorXd ranks(n);
    for (Eigen::Index start = 0; start < n;) {
        Eigen::Index end = start + 1;
        while (end < n && values[order[static_cast<std::size_t>(end)]] == values[order[static_cast<std::size_t>(start)]]) ++end;
        const double mid = 0.5 * static_cast<double>(start + 1 + end);  // mean of ranks start+1 .. end
        for (Eigen::Index k = start; k < end; ++k) ranks[order[static_cast<std::size_t>(k)]] = mid;
        start = end;
    }
    return ranks;
}

PrccResult partialRankCorrelation(const Eigen::MatrixXd& allDraws, const Eigen::VectorXd& allOutput,
                                  const PrccOptions& options)
{
    const Eigen::Index inputs = allDraws.cols();
    PrccResult result;
    result.coefficient = Eigen::VectorXd::Constant(inputs, kNaN);
    result.pValue = Eigen::VectorXd::Constant(inputs, kNaN);
    result.note.assign(static_cast<std::size_t>(inputs), PrccNote::Defined);
    if (allOutput.size() != allDraws.rows()) {
        result.note.assign(static_cast<std::size_t>(inputs), PrccNote::TooFewDraws);
        return result;
    }
    // Draws with a value that is not finite (a draw that did not solve) are left out.
    std::vector<Eigen::Index> rows;
    for (Eigen::Index r = 0; r < allDraws.rows(); ++r)
        if (std::isfinite(allOutput[r]) && allDraws.row(r).allFinite()) rows.push_back(r);
    const auto n = static_cast<Eigen::Index>(rows.size());
    result.draws = rows.size();
    Eigen::MatrixXd draws(n, inputs);
    Eigen::VectorXd output(n);
    for (Eigen::Index r = 0; r < n; ++r) {
        draws.row(r) = allDraws.row(rows[static_cast<std::size_t>(r)]);
        output[r] = allOutput[rows[static_cast<std::size_t>(r)]];
    }

    // Rank every column; constant columns (and the output) have nothing to rank.
    const Eigen::VectorXd rankedOutput = averageRanks(output);
    const bool outputConstant = n == 0 || (output.array() == output[0]).all();
    std::vector<Eigen::Index> kept;
    for (Eigen::Index j = 0; j < inputs; ++j) {
        if (n == 0 || (draws.col(j).array() == draws(0, j)).all()) result.note[static_cast<std::size_t>(j)] = PrccNote::ConstantInput;
        else kept.push_back(j);
    }
    if (outputConstant) {
        for (Eigen::Index j : kept) result.note[static_cast<std::size_t>(j)] = PrccNote::ConstantOutput;
        return result;
    }
    const auto p = static_cast<Eigen::Index>(kept.size());
    if (n < p + 3) {
        for (Eigen::Index j : kept) result.note[static_cast<std::size_t>(j)] = PrccNote::TooFewDraws;
        return result;
    }
    // Z = [ranked kept inputs, ranked output], centred.
    Eigen::MatrixXd z(n, p + 1);
    for (Eigen::Index k = 0; k < p; ++k) z.col(k) = centred(averageRanks(draws.col(kept[static_cast<std::size_t>(k)])));
    z.col(p) = centred(rankedOutput);

    if (!options.viaResiduals) {
        const Eigen::MatrixXd covariance = z.transpose() * z;
        const Eigen::LLT<Eigen::MatrixXd> llt(covariance);
        if (llt.info() == Eigen::Success && llt.rcond() > kConditioningFloor) {
            const Eigen::MatrixXd precision = llt.solve(Eigen::MatrixXd::Identity(p + 1, p + 1));
            for (Eigen::Index k = 0; k < p; ++k)
                result.coefficient[kept[static_cast<std::size_t>(k)]] =
                    -precision(k, p) / std::sqrt(precision(k, k) * precision(p, p));
            addSignificance(result, kept.size());
            return result;
        }
    }

    // Step by step: regress out the other kept inputs from the input and from the output.
    result.viaResiduals = true;
    for (Eigen::Index k = 0; k < p; ++k) {
        const auto j = kept[static_cast<std::size_t>(k)];
        Eigen::MatrixXd others(n, p - 1);
        for (Eigen::Index m = 0, c = 0; m < p; ++m)
            if (m != k) others.col(c++) = z.col(m);
        Eigen::VectorXd rx = z.col(k), ry = z.col(p);
        if (p > 1) {
            const Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(others);
            // Least-squares fits (the rank-revealing solve leaves dependent columns out).
            rx -= others * qr.solve(rx);
            ry -= others * qr.solve(ry);
        }
        if (rx.norm() <= kCollinearShare * z.col(k).norm()) {
            result.note[static_cast<std::size_t>(j)] = PrccNote::Collinear;
            continue;
        }
        result.coefficient[j] = pearson(rx, ry);
    }
    addSignificance(result, kept.size());
    return result;
}

PrccTable prccTable(const std::vector<std::string>& inputNames, const Eigen::MatrixXd& inputs,
                    const std::vector<std::string>& outputNames, const Eigen::MatrixXd& outputs)
{
    PrccTable table{inputNames, outputNames, {}};
    table.outputs.reserve(static_cast<std::size_t>(outputs.cols()));
    for (Eigen::Index o = 0; o < outputs.cols(); ++o)
        table.outputs.push_back(partialRankCorrelation(inputs, outputs.col(o)));
    return table;
}

}  // namespace tl
