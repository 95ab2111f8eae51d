// Who takes a compartment's production: each predator's consumption of it
// (DC_ij Q_j), each fleet's catch of it (landings + dead discards), net emigration and
// biomass accumulation, each as an amount and as a share of the compartment's
// production P_i (DESIGN.md 3.2). Their sum over P_i is EE_i, so when EE_i > 1 the
// largest uses say where to look first; the balance sheet shows the whole list for the
// selected compartment ("who eats it").
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"

namespace tl {

struct ProductionUse {
    enum class Kind { Predator, Fleet, NetEmigration, BiomassAccumulation };
    Kind kind = Kind::Predator;
    std::string name;        // predator or fleet name; empty for E and BA
    std::size_t index = 0;   // compartment index (predator) or fleet index
    double amount = 0.0;     // currency/area/year
    double shareOfProduction = 0.0;  // amount / P_i; NaN when P_i is not positive
};

// The predators of every compartment (prey -> (predator, DC)), built once in
// O(diet entries) for callers that ask about many compartments.
using PredatorIndex = std::vector<std::vector<std::pair<std::size_t, double>>>;
PredatorIndex predatorIndex(const Model& model);

// Uses of compartment i's production in a solved sheet (every row filled), largest
// first (ties by name). Empty for detritus pools; uses of zero are left out.
std::vector<ProductionUse> productionUses(const Model& model, const BalanceSheet& sheet, std::size_t i,
                                          const PredatorIndex& predators);
std::vector<ProductionUse> productionUses(const Model& model, const BalanceSheet& sheet, std::size_t i);

// "Perch juveniles 41 %, Zander juveniles 22 %, Commercial gillnets 9 %": the largest
// `count` uses with their shares of production, for messages.
std::string describeLargestUses(const std::vector<ProductionUse>& uses, std::size_t count = 3);

}  // namespace tl
