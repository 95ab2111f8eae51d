// Level bars data: the stacks the level-bars chart draws, taken from the core's
// decomposition into integer trophic levels (core/network/level_decomposition.h,
// Ulanowicz 1995). For level k the segment of node j is s_jk x q_j, with s_jk the
// node's share at level k and q_j its throughput T_j, biomass B_j or production P_j;
// the stack total is the core's per-level figure (the segments add up to it).
// No science here beyond that product; plain C++, no Qt.
#pragma once

#include <cstddef>
#include <vector>

#include "core/network/flow_network.h"
#include "core/network/level_decomposition.h"

namespace tl::ui {

enum class LevelQuantity { Throughput, Biomass, Production };
enum class LevelChains { Combined, FromProducers, FromDetritus };

struct LevelSegment {
    std::size_t node = 0;
    double value = 0.0;  // currency/area (biomass) or currency/area/time
    double share = 0.0;  // of the stack total
};

struct LevelStack {
    int level = 1;        // 1 = I
    double total = 0.0;   // the core's per-level figure for the quantity
    double te = 0.0;      // transfer efficiency of this level (to the next), NaN if none
    std::vector<LevelSegment> segments;  // nodes with a non-zero part, in node order
};

struct LevelBarsData {
    std::vector<LevelStack> stacks;  // level I first; trailing levels below the cut dropped
    double meanTe = 0.0;             // geometric mean TE of levels II-IV (core), or NaN
    // Level I has no TE (core/network/level_decomposition.h); these stand in its place.
    double primaryProductionConsumed = 0.0, detritusInflowConsumed = 0.0;
    double grandTotal = 0.0;         // sum over all levels of the decomposition (none dropped)
    int droppedLevels = 0;           // trailing levels whose total is below `cut` x the largest
};

const ChainDecomposition& chainsOf(const LevelDecomposition& d, LevelChains chains);

// `cut`: trailing levels smaller than cut x the largest level are left out of `stacks`
// (their amount still counts in grandTotal); 0 keeps every level.
LevelBarsData levelBarsData(const FlowNetwork& network, const LevelDecomposition& decomposition,
                            LevelQuantity quantity, LevelChains chains, double cut = 1e-4);

}  // namespace tl::ui
