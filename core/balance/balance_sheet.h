// BalanceSheet: the solved state of one scenario (DESIGN.md 3.2), the input of every
// analysis and view. Values are in the project's units; NaN where not applicable.
#pragma once

#include <limits>
#include <string>
#include <vector>

#include "core/model/compartment.h"
#include "core/model/param_set.h"
#include "core/model/problem.h"

namespace tl {

inline constexpr double kNotApplicable = std::numeric_limits<double>::quiet_NaN();

enum class BalanceStatus {
    Balanced,    // solved, and every check passed (EE <= EE max, R >= 0, no negative values)
    Unbalanced,  // solved, but some compartment breaks a balance condition
    Invalid      // could not be solved (inputs missing, under-determined or singular)
};
std::string_view statusKey(BalanceStatus s);  // "balanced", "unbalanced", "invalid"

struct CompartmentBalance {
    std::string name;
    CompartmentKind kind = CompartmentKind::Consumer;
    // Completed inputs (given or solved).
    double biomass = kNotApplicable, pb = kNotApplicable, qb = kNotApplicable, ee = kNotApplicable;
    double pq = kNotApplicable, unassim = kNotApplicable;
    ParamSet solved;  // which of the above were solved rather than given

    // Derived flows (currency/area/year) and rates (/year).
    double production = kNotApplicable;     // P = B P/B
    double consumption = kNotApplicable;    // Q = B Q/B
    double respiration = kNotApplicable;    // R = Q(1-U) - P
    double egestion = kNotApplicable;       // U Q
    double flowToDetritus = kNotApplicable; // (1-EE)P + U Q + dead discards
    double predation = kNotApplicable;      // sum_j B_j (Q/B)_j DC_ij
    double catchTotal = 0.0;                // Y: landings + dead discards
    double biomassAccum = 0.0, netEmigration = 0.0;
    double m0 = kNotApplicable, m2 = kNotApplicable, f = kNotApplicable, z = kNotApplicable;
    double netEfficiency = kNotApplicable;  // P / (Q (1-U))
    double rb = kNotApplicable, pr = kNotApplicable;  // R/B, P/R
    double tl = kNotApplicable, oi = kNotApplicable;  // trophic level, omnivory index
    // Living: B P/B EE - (predation + Y + E + BA), ~0 when the equation closes.
    double residual = kNotApplicable;

    // Detritus pools only.
    double detritusInflow = kNotApplicable, detritusConsumption = kNotApplicable;
    double detritusExport = kNotApplicable;  // inflow - consumption - accumulation
};

struct BalanceSheet {
    BalanceStatus status = BalanceStatus::Invalid;
    std::vector<CompartmentBalance> rows;  // same order as Model::compartments()
    Problems problems;
    // Conditioning of the equilibrated system, about 1 / condition number (1 when
    // nothing was unknown; see BalanceValues::conditioning): small means the solved
    // values are fragile.
    double conditioning = kNotApplicable;
};

}  // namespace tl
