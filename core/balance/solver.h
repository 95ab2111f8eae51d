// Mass-balance solver (Polovina 1984 Coral Reefs 3:1; Christensen & Pauly 1992 Ecol
// Model 61:169), DESIGN.md 3.2:
//   B_i (P/B)_i EE_i = sum_j B_j (Q/B)_j DC_ij + Y_i + E_i + BA_i   for each living i.
// At most one of B, P/B, Q/B, EE is unknown per compartment (P/Q may stand in for P/B
// or Q/B), so the unknowns enter linearly and the system is one A x = b.
//
// Split in two steps for reuse by the ensemble (core/balance/balance_plan.h):
//   BalancePlan::build(model)  structural: which value is unknown where, the shape
//                              of A, the workspace sizes (allocates);
//   plan.solve(inputs, ws, out) numeric: fills and factorises A, writes the values;
//                              does not allocate once the workspace is sized.
// solveBalance(model) does both and adds the checks (codes in balance_codes.h), the
// derived outputs (R = Q(1-U) - P, M0 = P/B (1-EE), M2, F, ...) and the trophic
// levels (trophic_level.h).
#pragma once

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"

namespace tl {

// Relative tolerances of the checks (this project's choices, no source):
// an equation closes when |residual| <= kResidualTolerance x its larger side;
// EE, detritus EE and R are allowed kBoundTolerance of rounding past their bound.
inline constexpr double kResidualTolerance = 1e-6;
inline constexpr double kBoundTolerance = 1e-9;
// Conditioning (BalanceSheet::conditioning) under which a solved system is flagged
// ill-conditioned (warning): relative errors of the solved values may reach 1e-8.
inline constexpr double kIllConditioned = 1e-8;

BalanceSheet solveBalance(const Model& model);

// The same, reusing the buffers in `scratch` (balance_plan.h) from an earlier call: for
// callers that solve many times. The sheet is identical to solveBalance(model)'s.
struct BalanceScratch;
BalanceSheet solveBalance(const Model& model, BalanceScratch& scratch);

class BalancePlan;
struct BalanceValues;
// The sheet of a numeric step's solved values (status Solved): derived outputs, trophic
// levels and every check. solveBalance ends with it; tests use it to hold another
// numeric step (the dense reference) to the same checks.
BalanceSheet balanceSheetFromValues(const Model& model, const BalancePlan& plan, const BalanceValues& values);

}  // namespace tl
