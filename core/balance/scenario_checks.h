// The Checks of a scenario: every problem of its inputs (validateModel, then the
// values beyond their plausible range, core/model/plausible_ranges.h) followed by the
// balance solver's findings, each problem reported once. The workbench's Checks panel
// and `tledger check` both show this list.
//
// "Once": a solver problem is left out when validation already reported the same code
// for the same compartment and prey (the two may name a different parameter for it,
// as for a scenario without a detritus pool).
#pragma once

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl {

Problems scenarioChecks(const Model& model, const BalanceSheet& sheet);

// What a scenario is, in one word for the status bar (issue 13): balanced only when
// its inputs are valid, the balance solved and no check is an error.
enum class ScenarioState {
    NoCompartments,  // nothing entered yet
    Incomplete,      // an input is missing or wrong (validation error), or the solve could not run
    NotBalanced,     // solved from valid inputs, but a balance condition fails (EE above max, R < 0, ...)
    Balanced
};
// `checks` is scenarioChecks(model, sheet).
ScenarioState scenarioState(const Model& model, const BalanceSheet& sheet, const Problems& checks);

// The sheet as `tledger solve` reports a scenario (DESIGN 5.3 keys unchanged): its
// problems are the whole Checks list, and its status is "balanced" only in the
// Balanced state; "invalid" when the inputs are incomplete or wrong (an empty diet, a
// diet summing to 0.3), "unbalanced" when solved but a balance condition fails.
BalanceSheet reportedSheet(const Model& model, BalanceSheet sheet);

}  // namespace tl
