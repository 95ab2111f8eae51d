// Keystone index (Libralato, Christensen & Pauly 2006, Ecol Model 195:153):
//   eps_i = sqrt( sum_{j != i} m_ij^2 )        overall effect of i (m from mixed trophic impact)
//   KS_i  = log10( eps_i (1 - p_i) ),  p_i = B_i / sum of living biomass.
// Computed for living nodes; the sum runs over living nodes j (detritus and fleets left
// out, as the index measures effects on the living community). High KS = large effect
// for a small biomass.
#pragma once

#include <cstddef>
#include <vector>

#include "core/network/mixed_trophic_impact.h"

namespace tl {

struct KeystoneEntry {
    std::size_t node = 0;
    double overallEffect = 0.0;   // eps_i
    double biomassShare = 0.0;    // p_i
    double keystoneIndex = 0.0;   // KS_i (-inf when eps_i = 0)
    int rank = 0;                 // 1 = highest KS
};

std::vector<KeystoneEntry> keystoneIndices(const FlowNetwork& network, const MixedTrophicImpact& mti);

}  // namespace tl
