// Total mortality Z from the lengths of the catch, and P/B = Z at steady state
// (Allen 1971, J Fish Res Board Can 28:1573: in a population at equilibrium with
// exponential mortality and von Bertalanffy growth, production over mean biomass
// equals the total mortality rate).
//
// Mean length (Beverton & Holt 1956; Sparre & Venema 1998, 4.5):
//     Z = K (L∞ - Lmean) / (Lmean - L')
// with L' the smallest length fully represented in the catch (the cut-off) and Lmean the
// mean length of the fish of length L' and above (class midpoints). Its interval maps
// the t interval of Lmean (SE = sd / sqrt(N), N fish) through the equation, which is
// monotone decreasing in Lmean; the CV is the delta-method SE over Z. K and L∞ are taken
// as known (their own uncertainty is not in the CV; stated).
//
// Length-converted catch curve (Pauly 1983, 1984; Sparre & Venema 1998, 4.4.3):
// for each length class [L1, L2) the time a fish takes to grow through it,
//     dt = (1/K) ln((L∞ - L1) / (L∞ - L2)),
// and its relative age at the class midpoint, t = -(1/K) ln(1 - Lmid / L∞) (t0 = 0: it
// only shifts the ages, not the slope). The points (t, ln(C / dt)) of the fully
// recruited classes fall on a line of slope -Z; Z = -slope from ordinary least squares,
// its interval slope +- t_{n-2} SE(slope). Classes reaching L∞ have no age and are left
// out. Default points: from the class after the highest ln(C/dt) (the peak is not fully
// recruited) to the last class with fish; the caller may choose others.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/fieldwork/estimate.h"
#include "core/fieldwork/survey_tables.h"

namespace tl::fieldwork {

struct GrowthParameters {
    double linfCm = 0.0;  // L∞, asymptotic length (cm, total length)
    double k = 0.0;       // von Bertalanffy K, per year
};

struct MeanLengthResult {
    Estimate estimate;      // Z, per year
    double cutOffCm = 0.0;  // L'
    double meanLengthCm = 0.0, sdCm = 0.0;
    double fish = 0.0;      // N, fish of length >= L'
};

// `cutOffCm` absent: the lower limit of the class with the most fish (common practice,
// no source: the mode is taken as the first fully recruited length).
MeanLengthResult meanLengthZ(const std::vector<LengthClass>& classes, const GrowthParameters& growth,
                             std::optional<double> cutOffCm = std::nullopt, double ciLevel = 0.95);

struct CatchCurvePoint {
    double fromCm = 0.0, toCm = 0.0, count = 0.0;
    double age = 0.0;        // relative age at the midpoint (years)
    double dt = 0.0;         // years spent in the class
    double lnCdt = 0.0;      // ln(count / dt); meaningless when count is 0
    bool usable = false;     // count > 0 and toCm < L∞
    bool selected = false;   // used in the regression
};

struct CatchCurveResult {
    Estimate estimate;  // Z, per year
    std::vector<CatchCurvePoint> points;  // every class, in length order
    double slope = 0.0, intercept = 0.0, slopeSe = 0.0, r2 = 0.0;
    int used = 0;
};

// `selected`: indices into the classes of the taxon (as returned in points) to regress;
// empty: the default described above.
CatchCurveResult lengthConvertedCatchCurve(const std::vector<LengthClass>& classes, const GrowthParameters& growth,
                                           const std::vector<std::size_t>& selected = {}, double ciLevel = 0.95);

// The classes of one taxon, in length order.
std::vector<LengthClass> classesOf(const std::vector<LengthClass>& all, const std::string& taxon);

}  // namespace tl::fieldwork
