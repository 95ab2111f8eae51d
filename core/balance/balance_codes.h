// Stable Problem codes reported by the balance solver and the trophic-level step.
// Tests, the CLI's JSON and the Checks view match on these strings: add, never rename.
#pragma once

#include <string>
#include <string_view>

#include "core/model/problem.h"

namespace tl::code {

// Structure (status Invalid).
inline constexpr std::string_view kUnderdetermined = "underdetermined-compartment";  // two or more unknowns
inline constexpr std::string_view kSingularSystem = "singular-system";               // one per compartment involved
inline constexpr std::string_view kInvalidValue = "invalid-value";                   // a value the solve cannot use
// Numerics (warning).
inline constexpr std::string_view kIllConditioned = "ill-conditioned-system";
// Breaches of balance (status Unbalanced).
inline constexpr std::string_view kEquationResidual = "equation-residual";     // an equation does not close
inline constexpr std::string_view kEEAboveMax = "ee-above-max";                // EE > rules.eeMax
inline constexpr std::string_view kNegativeRespiration = "negative-respiration";  // consumer R < 0
inline constexpr std::string_view kNegativeValue = "negative-value";           // solved B, P/B, Q/B or EE < 0
inline constexpr std::string_view kDetritusEEAboveOne = "detritus-ee-above-one";  // pool consumed beyond inflow
// Rules of thumb (warning).
inline constexpr std::string_view kPQOutOfRange = "pq-out-of-range";           // consumer P/Q outside [pqMin, pqMax]
inline constexpr std::string_view kPQInconsistent = "pq-inconsistent";         // given P/Q != P/B / Q/B
inline constexpr std::string_view kNoDetritusPool = "no-detritus-pool";
inline constexpr std::string_view kRoutingFromPoolIgnored = "routing-from-pool-ignored";
// Trophic levels (warning).
inline constexpr std::string_view kTLFromImport = "tl-from-import";            // no modelled prey: TL set to 2
inline constexpr std::string_view kTLUndefined = "tl-undefined";               // feeding loop with no basal food

// A solver Problem (no file location, no prey, no fleet).
inline Problem makeProblem(std::string_view code, Severity severity, std::string compartment,
                           std::string_view parameter, std::string message, std::string hint = {})
{
    Problem p;
    p.code = std::string(code);
    p.severity = severity;
    p.compartment = std::move(compartment);
    p.parameter = std::string(parameter);
    p.message = std::move(message);
    p.hint = std::move(hint);
    return p;
}

}  // namespace tl::code
