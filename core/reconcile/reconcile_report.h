// Reconcile reports for the CLI (`tledger reconcile`, DESIGN.md 5.2): the JSON (keys
// stable: add, never rename) and a readable text with the ranked changes, binding
// constraints and, for an infeasible model, the conflict and what to relax.
//
// JSON: {"status": "unchanged"|"balanced"|"least_violating"|"invalid",
//        "balance_after", "scenario", "saved_as", "objective", "evaluations", "elastic",
//        "solver_result", "largest_violation", "seconds", "variables", "constraints",
//        "changes": [{"compartment", "parameter", "prey", "before", "after",
//                     "percent_change", "confidence", "cv", "objective_share"}],
//        "binding": [text], "conflicts": [{"constraint", "compartment", "kind",
//                     "violation", "relax": [text]}],
//        "ee": [{"compartment", "before", "after"}], "problems": [...], "notice"}
#pragma once

#include <optional>
#include <string>

#include "core/reconcile/reconcile.h"

namespace tl {

std::string reconcileJson(const Model& original, const ReconcileResult& result, const std::string& scenario,
                          const std::optional<std::string>& savedAs);
std::string reconcileText(const Model& original, const ReconcileResult& result, const std::string& scenario,
                          const std::optional<std::string>& savedAs);

}  // namespace tl
