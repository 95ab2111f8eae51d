// Validation: the structural and semantic checks of a Model's inputs, before any
// solving (DESIGN.md 2, "errors are values"). Each finding is a Problem naming the
// compartment, the parameter (a paramKey, or "diet", "routing", "harvest"), the prey
// or detritus pool (`prey`) and the fleet (`fleet`) where relevant, with a message a
// survey crew can act on and a hint. Used by the CSV reader (which adds file
// locations) and by the workbench's Checks panel.
//
// What is checked, and why:
// - names: empty or duplicated names make diet, harvest and routing ambiguous;
// - signs: B, P/B, Q/B, EE, P/Q, detritus import, diet fractions, routing fractions,
//   landings and discards cannot be negative (they are amounts or shares of amounts);
//   BA and E may be negative (biomass loss, net immigration);
// - U in [0, 1): the unassimilated share of consumption (Q = P + R + U Q, DESIGN 3.2);
// - kinds: producers do not consume (no Q/B, P/Q or diet); detritus pools have no
//   production or consumption rates (no P/B, Q/B, EE, P/Q), and only detritus pools
//   receive imports of detritus, routed detritus and no catch;
// - diet rows: each consumer's fractions, `import` included, sum to 1 within
//   rules.dietSumTolerance (Christensen & Pauly 1992: DC_ij are shares of j's diet);
// - routing: a source with explicit routing sends fractions summing to 1, to detritus
//   pools only;
// - harvest: discard survival is a fraction in [0, 1]; a fleet's discard pool is a
//   detritus pool;
// - a model with living compartments or discards but no detritus pool has nowhere to
//   send egestion and mortality (a warning: the balance still solves).
#pragma once

#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl {

// Stable problem codes produced here (the GUI and the CSV reader key on them).
namespace check {
inline constexpr const char* kEmptyName = "empty-name";
inline constexpr const char* kDuplicateName = "duplicate-name";
inline constexpr const char* kNegativeValue = "negative-value";
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
inline constexpr const char* kNoDetritusPool = "no-detritus-pool";
}  // namespace check

// All problems of `model`, in compartment order within each group of checks
// (names, parameters, diet, routing, harvest, model-wide). Never throws.
Problems validateModel(const Model& model);

}  // namespace tl
