// The new scenario a reconcile result becomes, shared by `tledger reconcile` and the
// workbench's Reconcile dialog so that both write the same thing: the adjusted inputs
// with a source note on every changed B, P/B and Q/B (annotatedReconcileModel), the
// scenario it came from as parent, the date, the flow-map layout, and a description
// that lists the diet and catch changes (which have no source field). Reconcile never
// writes over a scenario: the name is always one the project does not have.
#pragma once

#include <string>

#include "core/reconcile/reconcile.h"
#include "core/store/project.h"

namespace tl {

// "<base> reconciled", then "<base> reconciled 2", "... 3": the first name `project` lacks.
std::string freeReconciledName(const Project& project, const std::string& base);

// The scenario made from `result` (Balanced or LeastViolating) of `from`, named `name`,
// dated `date` (ISO 8601 UTC).
Scenario reconciledScenario(const Scenario& from, const ReconcileResult& result, const std::string& name,
                            const std::string& date);

// The run kept with the new scenario `made` (kind "reconcile", on `made`): settings as
// reconcileSettingsJson, summary as `tledger reconcile --json` (reconcile_report.h), so
// that a report lists the changes with their before and after values.
StoredRun reconcileRun(const Scenario& from, const ReconcileResult& result, const ReconcileOptions& options,
                       const std::string& made, const std::string& date);

}  // namespace tl
