// Mass-balance solver (Polovina 1984; Christensen & Pauly 1992), DESIGN.md 3.2:
//   B_i (P/B)_i EE_i = sum_j B_j (Q/B)_j DC_ij + Y_i + E_i + BA_i   for each living i.
// At most one of B, P/B, Q/B, EE is unknown per compartment (P/Q may stand in for P/B
// or Q/B), so the unknowns enter linearly and the system is one A x = b.
//
// Split in two steps for reuse by the ensemble:
//   BalancePlan::build(model)  structural: which value is unknown where, the sparsity
//                              of A, the workspace sizes (allocates);
//   plan.solve(inputs, ws, out) numeric: fills and factorises A, writes the values;
//                              does not allocate once the workspace is sized.
// solveBalance(model) does both and adds the checks and derived outputs.
#pragma once

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"

namespace tl {

BalanceSheet solveBalance(const Model& model);

}  // namespace tl
