#include "core/fieldwork/student_t.h"

#include <cmath>
#include <limits>

namespace tl::fieldwork {
namespace {

// Continued fraction of the incomplete beta function (Numerical Recipes 6.4, betacf).
double betaContinuedFraction(double a, double b, double x)
{
    constexpr double kTiny = 1e-300;
    const double qab = a + b, qap = a + 1.0, qam = a - 1.0;
    double c = 1.0, d = 1.0 - qab * x / qap;
    if (std::abs(d) < kTiny) d = kTiny;
    d = 1.0 / d;
    double h = d;
    for (int m = 1; m <= 1000; ++m) {
        const int m2 = 2 * m;
        double aa = m * (b - m) * x / ((qam + m2) * (a + m2));
        d = 1.0 + aa * d;
        if (std::abs(d) < kTiny) d = kTiny;
        c = 1.0 + aa / c;
        if (std::abs(c) < kTiny) c = kTiny;
        d = 1.0 / d;
        h *= d * c;
        aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
        d = 1.0 + aa * d;
        if (std::abs(d) < kTiny) d = kTiny;
        c = 1.0 + aa / c;
        if (std::abs(c) < kTiny) c = kTiny;
        d = 1.0 / d;
        const double del = d * c;
        h *= del;
        if (std::abs(del - 1.0) < 1e-15) break;
    }
    return h;
}

// Regularised incomplete beta I_x(a, b).
double incompleteBeta(double a, double b, double x)
{
    if (x <= 0.0) return 0.0;
    if (x >= 1.0) return 1.0;
    const double lnFront = std::lgamma(a + b) - std::lgamma(a) - std::lgamma(b) + a * std::log(x) + b * std::log1p(-x);
    const double front = std::exp(lnFront);
    if (x < (a + 1.0) / (a + b + 2.0)) return front * betaContinuedFraction(a, b, x) / a;
    return 1.0 - front * betaContinuedFraction(b, a, 1.0 - x) / b;
}

}  // namespace

double studentTCdf(double t, double df)
{
    if (!(df > 0.0) || std::isnan(t)) return std::numeric_limits<double>::quiet_NaN();
    const double x = df / (df + t * t);
    const double tail = 0.5 * incompleteBeta(df / 2.0, 0.5, x);  // P(T > |t|)
    return t >= 0.0 ? 1.0 - tail : tail;
}

double studentTQuantile(double p, double df)
{
    if (!(p > 0.0 && p < 1.0) || !(df > 0.0)) return std::numeric_limits<double>::quiet_NaN();
    if (p == 0.5) return 0.0;
    // Bracket: the t quantile grows without bound as df -> 0; widen until it is inside.
    double lo = -1.0, hi = 1.0;
    while (studentTCdf(lo, df) > p) lo *= 2.0;
    while (studentTCdf(hi, df) < p) hi *= 2.0;
    for (int k = 0; k < 200 && hi - lo > 1e-13 * std::max(1.0, std::abs(hi)); ++k) {
        const double mid = 0.5 * (lo + hi);
        (studentTCdf(mid, df) < p ? lo : hi) = mid;
    }
    return 0.5 * (lo + hi);
}

}  // namespace tl::fieldwork
