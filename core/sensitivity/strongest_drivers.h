// The strongest drivers of one output: its local elasticities (elasticity.h) at the point
// estimate, largest magnitude first, for a tornado chart. An output named as the ensemble
// and the CLI name it ("Perch.ee"); a given value is not an output (nothing depends on
// it) and gets a message saying so.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "core/model/model.h"
#include "core/sensitivity/elasticity.h"

namespace tl {

struct Driver {
    std::string input;  // "Perch.pb", "Perch.diet:Roach"
    double elasticity = 0.0;
};

struct StrongestDrivers {
    std::string output;
    std::string error;  // why there are none (unknown output, a given value, does not solve)
    std::string note;   // the method, and why central differences were used if they were
    std::vector<Driver> drivers;  // |elasticity| descending; NaN and |e| < 1e-12 left out
};

// `output`: "COMPARTMENT.QUANTITY" (quantity biomass, pb, qb, ee, pq, tl). At most `top`.
StrongestDrivers strongestDrivers(const Model& model, const std::string& output, std::size_t top);

}  // namespace tl
