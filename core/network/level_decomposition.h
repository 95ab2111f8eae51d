// Decomposition of a food web into integer trophic levels ("trophic aggregation",
// Ulanowicz 1995, in Patten & Jorgensen (eds) Complex Ecology, book details from memory;
// after Lindeman 1942,
// Ecology 23:399). DESIGN.md 3.3.
//
// Producers and detritus pools are at level I. A consumer j with feeding fractions
//   a_ij = F_ij / sum_k F_kj   (internal intake only: food imports renormalised away,
//                               as for the trophic level, so sum_k k s_jk = TL_j)
// has the share s_jk of its activity at level k given by the food chains of length k:
//   s_j1 = 1 for producers and detritus,  s_j,k+1 = sum_i a_ij s_ik  for consumers.
// A consumer that eats nothing from the modelled nodes (imported food only) sits at
// level II, its food counted as level-I food (as core/balance/trophic_level.h does);
// it is counted with the producer-based chains.
// Feeding cycles among living compartments are removed first (cycle analysis, Ulanowicz
// 1983; feeding_cycles.h), as the published aggregation does: the shares a_ij come from
// the residual flows, so every chain is finite and a 5 % cannibalism no longer spreads
// a compartment over a dozen levels. Keeping the cycles is a labelled option
// (FeedingCycles::Kept, this project's earlier convention): chains through cycles are
// then infinite, the series is cut once less than 1e-12 of every node is left and the
// remainder is put in the last level kept. Flows passed up, catch and exports are the
// network's own (cycled flow included) in both cases.
// Effective trophic level of the aggregation: ETL_j = sum_k k s_jk (Ulanowicz 1995).
// With s, per level k (sums over nodes j):
//   throughput_k = sum_j s_jk T_j, likewise biomass, production and catch,
//   passedUp_k   = sum_{i, consumer j} s_ik F_ij       (food reaching level k+1),
//   export_k     = sum_j s_jk (export_j - landings_j)  (other usable exports),
//   TE_k         = (passedUp_k + catch_k + export_k) / throughput_k,  for k >= II only.
// Level I mixes producers and detritus, and transfer efficiency through detritus is not
// defined (unconsumed detritus leaving the system would count as "transferred"), so TE
// at level I is NaN; in its place, each named:
//   primaryProductionConsumed = sum_{producer i, consumer j} F_ij / TPP,
//   detritusInflowConsumed    = sum_{pool d, consumer j} F_dj / sum_d T_d.
// Labelled alternative, the production ratio that limnologists compute:
//   productionRatio_k = P_{k+1} / P_k  (production apportioned to levels like throughput).
// Level-I biomass is shown with producers and detritus apart (biomassDetritus): a
// detritus stock can dominate the bar.
// Computed three times: chains starting at producers (s seeded only at producers),
// chains starting at detritus, and combined (their sum). Mean TE = geometric mean of
// TE at levels II-IV (common practice, no source); NaN when one of them is missing.
// Common practice: TE mostly lies within 5-20 %, about 10 % on average (Lindeman 1942;
// Pauly & Christensen 1995, Nature 374:255).
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "core/network/feeding_cycles.h"
#include "core/network/flow_network.h"

namespace tl {

// How the aggregation treats feeding cycles among living compartments.
enum class FeedingCycles {
    Removed,  // removed first (Ulanowicz 1983, 1995): the published method, the default
    Kept      // kept: chains through cycles followed to their end (project's own option)
};

struct TrophicLevelBin {
    int level = 1;  // 1 = I
    double throughput = 0.0, biomass = 0.0, production = 0.0, catchTotal = 0.0;
    double biomassDetritus = 0.0;  // the part of `biomass` in detritus pools (level I only)
    double passedUp = 0.0, exportOther = 0.0;
    double te = 0.0;               // NaN at level I and when throughput is 0
    double productionRatio = 0.0;  // P_{k+1} / P_k; NaN at the last level or when unknown
};

struct ChainDecomposition {
    std::vector<TrophicLevelBin> levels;  // levels[k-1] is level k
    Eigen::MatrixXd share;                // nodes x levels: s_jk (rows of consumers sum to 1)
    double meanTe = 0.0;                  // geometric mean of TE II-IV, or NaN
};

struct LevelDecomposition {
    ChainDecomposition fromProducers, fromDetritus, combined;
    FeedingCycles cycles = FeedingCycles::Removed;
    // Level I instead of a transfer efficiency (see above); NaN without TPP or detritus inflow.
    double primaryProductionConsumed = 0.0, detritusInflowConsumed = 0.0;
    FeedingCycleRemoval cycleRemoval;  // what was removed (empty when cycles are kept)
    // ETL_j = sum_k k s_jk over the combined chains (1 for producers and detritus).
    Eigen::VectorXd effectiveTrophicLevels() const;
    // Stack a level bar by node: combined.share(j, k-1) * throughput_j (or biomass_j ...).
    int levelCount() const { return static_cast<int>(combined.levels.size()); }
};

// The name of integer level k as the trade writes it: "I", "II", ... "XX", then digits.
std::string levelName(int level);

// maxLevels bounds the series (deep or cyclic webs); the remainder lands in the last level.
LevelDecomposition decomposeLevels(const FlowNetwork& network, int maxLevels = 30,
                                   FeedingCycles cycles = FeedingCycles::Removed);

}  // namespace tl
