// The Checks of a scenario: every problem of its inputs (validateModel) followed by the
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

}  // namespace tl
