// Quantiles of Student's t distribution, for confidence intervals of means and
// regression slopes (two-sided: t_{1-alpha/2, df}). Computed from the regularised
// incomplete beta function (continued fraction, Lentz's method; Press et al. 2007,
// Numerical Recipes 3rd ed., 6.4) and inverted by bisection on the CDF, which is
// monotone: slow next to a closed form but exact to 1e-12 and only called once per
// estimate. Checked against scipy.stats.t.ppf (tests/core/fieldwork).
#pragma once

namespace tl::fieldwork {

// P(T <= t) for T ~ Student t with `df` > 0 degrees of freedom (df may be fractional,
// as Satterthwaite's approximation gives).
double studentTCdf(double t, double df);

// The t with P(T <= t) = p, 0 < p < 1.
double studentTQuantile(double p, double df);

// Half-width multiplier of a two-sided interval of level `level` (0.95 -> t_{0.975}).
inline double studentTTwoSided(double level, double df) { return studentTQuantile(0.5 + level / 2.0, df); }

}  // namespace tl::fieldwork
