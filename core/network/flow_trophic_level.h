// Effective trophic levels on a flow network (the flow-weighted form of DESIGN.md 3.3;
// the convention of shared/reference/reference.json meta.conventions "TL"):
//   TL_j = 1 + sum_i (F_ij / sum_k F_kj) TL_i   over internal flows, self-loops included,
// with non-living nodes and nodes that take nothing from other nodes fixed at TL = 1.
// Solved as one linear system (I - A^T) TL = 1 with A_ij = F_ij / sum_k F_kj on the free
// nodes, not by iteration. For solved scenarios use BalanceSheet rows' tl (diet-based,
// core/balance/trophic_level.h); this one serves plain flow networks such as SCOR files.
#pragma once

#include <vector>

#include "core/network/flow_network.h"

namespace tl {

struct FlowTrophicLevels {
    std::vector<double> tl;           // per node
    std::vector<double> omnivory;     // OI_j = sum_i (TL_i - (TL_j - 1))^2 a_ij (Pauly et al. 1993); 0 when fixed
    std::vector<bool> fixedAtOne;     // detritus, producers and nodes without intake from others
    bool singular = false;            // a closed feeding loop with no way out (TL undefined): tl = NaN
};

FlowTrophicLevels flowTrophicLevels(const FlowNetwork& network);

}  // namespace tl
