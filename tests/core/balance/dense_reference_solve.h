// Test-only reference: the mass balance solved the plain way, as the project did before
// the structured solver — the full system A x = b over every unknown (one row per
// living compartment, one column per unknown, EE and P/B included), dense, equilibrated,
// partial-pivot LU when square and column-pivoted QR least squares otherwise. Slow and
// obviously right; the structured BalancePlan::solve must agree with it.
#pragma once

#include <cstddef>
#include <set>

#include "core/balance/balance_plan.h"

namespace tl::testing {

struct DenseReference {
    BalanceValues values;                    // status, conditioning of the full A, every value
    std::set<std::size_t> singularInvolved;  // when Singular: null-space support of A (and zero rows if square)
};

// plan decides which value is unknown where (unchanged by the structured solver).
DenseReference denseReferenceSolve(const Model& model, const BalancePlan& plan);

}  // namespace tl::testing
