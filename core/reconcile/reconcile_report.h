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
// What was asked of a reconcile, kept with its stored run: {"scenario", "move": [keys],
// "pins": ["COMPARTMENT.key"], "bounds": [{"input", "low", "high"}], "ee_max"/"ee_min":
// [{"compartment", "value"}], "pq_range": [{"compartment", "low", "high"}], "diet_cv",
// "catch_cv", "max_factor"}.
std::string reconcileSettingsJson(const Model& original, const ReconcileOptions& options, const std::string& scenario);
std::string reconcileText(const Model& original, const ReconcileResult& result, const std::string& scenario,
                          const std::optional<std::string>& savedAs);

}  // namespace tl
