// Empirical equations for natural mortality M and consumption Q/B (DESIGN.md 3.8). Each
// result lists its inputs with units, the range of the data the equation was fitted to,
// and a warning (fieldwork-outside-range) for every input outside it.
//
// Coefficients, and where each was checked (tests/core/fieldwork/empirical_equations_test.cpp):
//   Pauly 1980 (J Cons Int Explor Mer 39:175), 175 stocks, his length equation (eq. 11):
//       log10 M = -0.0066 - 0.279 log10 L∞ + 0.6543 log10 K + 0.4634 log10 T
//       L∞ total length in cm, K per year, T mean annual water temperature in °C.
//       Checked against the M values Kenchington (2014, Fish Fish 15:533) printed for
//       three stocks (read as reproduced in the FSA R package's test of metaM()), and the
//       same coefficients appear in two independent R packages (FSA metaM, TropFishR).
//   Then et al. 2015 (ICES J Mar Sci 72:82), the two they recommend (their Table 3,
//   lines 3 and 6, as the FSA R package labels them):
//       M = 4.899 tmax^-0.916                (tmax: oldest age observed, years)
//       M = 4.118 K^0.73 L∞^-0.33            (L∞ in cm, K per year)
//       No worked example with numbers was found; coefficients agree with FSA metaM.
//   Palomares & Pauly 1998 (Mar Freshw Res 49:447), FROM MEMORY (no source text found):
//       log10 Q/B = 7.964 - 0.204 log10 W∞ - 1.965 T' + 0.083 A + 0.532 h + 0.398 d
//       W∞ asymptotic wet weight (g), T' = 1000 / (T + 273.15) with T in °C, A the aspect
//       ratio of the caudal fin (height² / surface), h = 1 for herbivores, d = 1 for
//       detritivores (both 0 for carnivores).
// The fitted ranges are APPROXIMATE, from memory of the papers' data sets, and are said
// to be so in every warning.
//
// Uncertainty (EquationUncertainty): the inputs may carry a standard error, and the
// equation a residual error (SD of the natural log of the result about the fitted line;
// none of the sources at hand states one, so it is the caller's to give). It is
// propagated on the log scale by the delta method (first order):
//     Var(ln y) = sum_i (d ln y / d u_i)^2 Var(u_i) + residualSdLn^2
// with u_i = ln x_i for an input that enters as a power (L∞, K, T in Pauly's equation,
// tmax, W∞), taken as lognormal with median x_i and CV SE_i / x_i, so
// Var(ln x_i) = ln(1 + CV_i^2); and u_i = x_i itself, normal with SD SE_i, for an input
// that enters otherwise (A linearly in log10 Q/B; T through 1 / Kelvin). For the three
// M equations ln M is exactly linear in the ln x_i, so the result is exactly lognormal;
// for Q/B the temperature term is linearised at T. The value stays the equation's
// (the median), the interval is value x exp(± z sigma) and the CV is that of a
// lognormal, sqrt(exp(sigma^2) - 1). Inputs are taken as independent (a correlation of
// L∞ and K, usual in growth fits, is not included; said in the result). Checked against
// a numpy Monte Carlo of the same distributions (tests/crosscheck).
#pragma once

#include "core/fieldwork/estimate.h"

namespace tl::fieldwork {

// Standard errors of the inputs, in each input's own unit (0: taken as known), and the
// equation's residual error. All zero: the estimate carries no CV (writeEstimate then
// sets grade C, this project's convention).
struct EquationUncertainty {
    double linfSe = 0.0;         // cm
    double kSe = 0.0;            // per year
    double temperatureSe = 0.0;  // °C
    double tmaxSe = 0.0;         // years
    double winfSe = 0.0;         // g
    double aspectRatioSe = 0.0;
    double residualSdLn = 0.0;   // SD of ln(result) about the equation
    double ciLevel = 0.95;

    bool any() const
    {
        return linfSe > 0 || kSe > 0 || temperatureSe > 0 || tmaxSe > 0 || winfSe > 0 || aspectRatioSe > 0 ||
               residualSdLn > 0;
    }
};

Estimate paulyNaturalMortality(double linfCm, double k, double temperatureC, const EquationUncertainty& u = {});
Estimate thenMortalityFromMaxAge(double tmaxYears, const EquationUncertainty& u = {});
Estimate thenMortalityFromGrowth(double linfCm, double k, const EquationUncertainty& u = {});

enum class FeedingType { Carnivore, Herbivore, Detritivore };
Estimate palomaresPaulyConsumption(double winfGrams, double temperatureC, double aspectRatio, FeedingType feeding,
                                   const EquationUncertainty& u = {});

// Two-sided standard normal quantile z_{0.5 + level/2} (0.95 -> 1.95996).
double normalTwoSided(double level);

}  // namespace tl::fieldwork
