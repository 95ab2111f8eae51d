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
#include "core/model/problem_codes.h"

namespace tl {

// The codes produced here are tl::code::k... of the registry (core/model/problem_codes.h);
// `check::` is the name the validation tests and readers have always used for them.
namespace check {
using namespace code;
}  // namespace check

// The largest magnitude an input may have (B, a rate, a catch, an import). Flows are
// products of two or three inputs and the network indices multiply flows again, so a
// value near the largest double (1e308) would overflow to infinity; 1e30 leaves room for
// that in any unit a model uses (this project's own limit; common practice, no source).
inline constexpr double kMaxInputMagnitude = 1e30;

// All problems of `model`, in compartment order within each group of checks
// (names, parameters, diet, routing, harvest, model-wide). Never throws.
Problems validateModel(const Model& model);

}  // namespace tl
