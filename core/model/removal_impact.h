// What removing compartments takes with it, so the workbench can ask before it does
// (issue 13): the predators kept whose diets lose a share (and how large), the fleets
// whose catch of them goes, and the routing and discards that named a removed pool.
// Removing is always undoable; this only says what changes.
#pragma once

#include <string>
#include <vector>

#include "core/model/model.h"

namespace tl {

struct RemovalImpact {
    struct DietLoss {
        std::string predator;
        double share = 0.0;               // of the predator's diet, import included
        std::vector<std::string> prey;    // the removed prey it ate
    };
    std::vector<DietLoss> diets;                  // predators kept, in compartment order
    std::vector<std::string> fleetsCatching;      // fleets with landings or discards of a removed one
    std::vector<std::string> fleetsDiscardingTo;  // fleets whose discard pool is removed
    std::vector<std::string> routedTo;            // compartments kept whose routing names a removed pool

    bool empty() const
    {
        return diets.empty() && fleetsCatching.empty() && fleetsDiscardingTo.empty() && routedTo.empty();
    }
};

// `removed`: compartment indices (any order, duplicates ignored).
RemovalImpact removalImpact(const Model& model, const std::vector<std::size_t>& removed);

}  // namespace tl
