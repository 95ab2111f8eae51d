// Empirical equations for natural mortality M and consumption Q/B (DESIGN.md 3.8). Each
// result lists its inputs with units, the range of the data the equation was fitted to,
// and a warning (fieldwork-outside-range) for every input outside it. None of them has
// a sampling CV: the estimate carries none (writeEstimate then sets grade C).
//
// Coefficients are from memory of the papers; the two of Then et al. agree with
// third-party code seen while writing this (R scripts using 4.899 and 4.118, 0.73,
// 0.33). The fitted ranges are APPROXIMATE, from memory of the papers' data sets, and
// are said to be so in every warning.
//
//   Pauly 1980 (J Cons Int Explor Mer 39:175), 175 stocks:
//       log10 M = -0.0066 - 0.279 log10 L∞ + 0.6543 log10 K + 0.4634 log10 T
//       L∞ total length in cm, K per year, T mean annual water temperature in °C.
//   Then et al. 2015 (ICES J Mar Sci 72:82), the two they recommend:
//       M = 4.899 tmax^-0.916                (tmax: oldest age observed, years)
//       M = 4.118 K^0.73 L∞^-0.33            (L∞ in cm, K per year)
//   Palomares & Pauly 1998 (Mar Freshw Res 49:447):
//       log10 Q/B = 7.964 - 0.204 log10 W∞ - 1.965 T' + 0.083 A + 0.532 h + 0.398 d
//       W∞ asymptotic wet weight (g), T' = 1000 / (T + 273.15) with T in °C, A the aspect
//       ratio of the caudal fin (height² / surface), h = 1 for herbivores, d = 1 for
//       detritivores (both 0 for carnivores).
#pragma once

#include "core/fieldwork/estimate.h"

namespace tl::fieldwork {

Estimate paulyNaturalMortality(double linfCm, double k, double temperatureC);
Estimate thenMortalityFromMaxAge(double tmaxYears);
Estimate thenMortalityFromGrowth(double linfCm, double k);

enum class FeedingType { Carnivore, Herbivore, Detritivore };
Estimate palomaresPaulyConsumption(double winfGrams, double temperatureC, double aspectRatio, FeedingType feeding);

}  // namespace tl::fieldwork
