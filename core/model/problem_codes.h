// The registry of problem codes: every Problem::code the program reports, each with
// its usual severity and one sentence a user understands. The Checks panel shows the
// sentence beside a problem and Help lists the whole table. Tests, the CLI's JSON and
// scripts match on the code strings: add codes, never rename or reuse one; one code
// means one thing (a negative input and a negative solved value are two codes).
//
// Codes are grouped by who reports them: validation of inputs (core/model/validation),
// the balance solver and trophic levels (core/balance), the flow network
// (core/network), CSV model folders (csv-*), SCOR files (scor-*) and project files
// (store-*).
#pragma once

#include <span>
#include <string_view>

#include "core/model/problem.h"

namespace tl {

namespace code {
// --- inputs (core/model/validation) --------------------------------------------------
inline constexpr const char* kEmptyName = "empty-name";
inline constexpr const char* kDuplicateName = "duplicate-name";
inline constexpr const char* kNegativeValue = "negative-value";  // an INPUT below zero
inline constexpr const char* kUnassimOutOfRange = "unassim-out-of-range";
inline constexpr const char* kProducerConsumes = "producer-consumes";
inline constexpr const char* kDetritusRate = "detritus-rate";
inline constexpr const char* kImportOnLiving = "detritus-import-on-living";
inline constexpr const char* kDietSum = "diet-sum";
inline constexpr const char* kDietFraction = "diet-fraction-out-of-range";
inline constexpr const char* kDietOfNonConsumer = "diet-of-non-consumer";
inline constexpr const char* kRoutingSum = "routing-sum";
inline constexpr const char* kRoutingFraction = "routing-fraction-out-of-range";
inline constexpr const char* kRoutingToLiving = "routing-to-non-detritus";
inline constexpr const char* kNegativeLandings = "landings-negative";
inline constexpr const char* kNegativeDiscards = "discards-negative";
inline constexpr const char* kDiscardSurvival = "discard-survival-out-of-range";
inline constexpr const char* kCatchFromDetritus = "catch-from-detritus";
inline constexpr const char* kDiscardPool = "discard-pool-not-detritus";
inline constexpr const char* kEmptyFleetName = "empty-fleet-name";
inline constexpr const char* kDuplicateFleet = "duplicate-fleet";
inline constexpr const char* kNoDetritusPool = "no-detritus-pool";  // also found by the solver: reported once
// The one sentence for a scenario without a detritus pool: validation and the solver
// both find it, and the Checks panel and the Balance sheet must not word it twice.
inline constexpr const char* kNoDetritusPoolMessage =
    "The model has no detritus pool, so egestion, other mortality and dead discards have nowhere to go.";
inline constexpr const char* kNoDetritusPoolHint = "Add a compartment of kind detritus.";
inline constexpr const char* kImplausibleValue = "implausible-value";  // above the rules' plausible range (warning)
// --- balance (core/balance) ----------------------------------------------------------
// Structure (status Invalid).
inline constexpr const char* kUnderdetermined = "underdetermined-compartment";  // two or more unknowns
inline constexpr const char* kSingularSystem = "singular-system";               // one per compartment involved
inline constexpr const char* kInvalidValue = "invalid-value";                   // a value the solve cannot use
// Numerics (warning).
inline constexpr const char* kIllConditioned = "ill-conditioned-system";
// Breaches of balance (status Unbalanced).
inline constexpr const char* kEquationResidual = "equation-residual";         // an equation does not close
inline constexpr const char* kEEAboveMax = "ee-above-max";                    // EE > rules.eeMax
inline constexpr const char* kNegativeRespiration = "negative-respiration";   // consumer R < 0
inline constexpr const char* kNegativeSolvedValue = "negative-solved-value";  // a SOLVED B, P/B, Q/B or EE < 0
inline constexpr const char* kDetritusEEAboveOne = "detritus-ee-above-one";   // pool consumed beyond inflow
// Rules of thumb (warning).
inline constexpr const char* kPQOutOfRange = "pq-out-of-range";    // consumer P/Q outside [pqMin, pqMax]
inline constexpr const char* kPQInconsistent = "pq-inconsistent";  // given P/Q != P/B / Q/B
inline constexpr const char* kRoutingFromPoolIgnored = "routing-from-pool-ignored";
// Trophic levels (warning).
inline constexpr const char* kTLFromImport = "tl-from-import";  // no modelled prey: TL set to 2
inline constexpr const char* kTLUndefined = "tl-undefined";     // feeding loop with no basal food
// --- flow network (core/network) -----------------------------------------------------
inline constexpr const char* kNetworkShortfallImport = "network-shortfall-import";
}  // namespace code

struct ProblemCodeInfo {
    std::string_view code;
    Severity severity;             // as usually reported (a few readers lower or raise it; see the sentence)
    std::string_view explanation;  // one sentence for the user
};

// Every code, grouped as above, each once.
std::span<const ProblemCodeInfo> problemCodes();
// The entry of `code`, or nullptr for a code the registry does not know.
const ProblemCodeInfo* findProblemCode(std::string_view code);

}  // namespace tl
