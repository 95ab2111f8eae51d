#include "core/network/keystone.h"

#include <algorithm>
#include <cmath>

namespace tl {

std::vector<KeystoneEntry> keystoneIndices(const FlowNetwork& net, const MixedTrophicImpact& mti)
{
    const std::size_t n = net.size();
    double livingBiomass = 0.0;
    for (std::size_t i = 0; i < n; ++i)
        if (net.isLiving(i)) livingBiomass += net.stocks[i];

    std::vector<KeystoneEntry> out;
    for (std::size_t i = 0; i < n; ++i) {
        if (!net.isLiving(i)) continue;
        double sumSquares = 0.0;
        for (std::size_t j = 0; j < n; ++j) {
            if (j == i || !net.isLiving(j)) continue;
            const double m = mti.total(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j));
            sumSquares += m * m;
        }
        KeystoneEntry e;
        e.node = i;
        e.overallEffect = std::sqrt(sumSquares);
        e.biomassShare = livingBiomass > 0.0 ? net.stocks[i] / livingBiomass : 0.0;
        e.keystoneIndex = std::log10(e.overallEffect * (1.0 - e.biomassShare));
        out.push_back(e);
    }
    std::vector<std::size_t> order(out.size());
    for (std::size_t k = 0; k < order.size(); ++k) order[k] = k;
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        const double ka = out[a].keystoneIndex, kb = out[b].keystoneIndex;
        if (std::isnan(ka)) return false;
        if (std::isnan(kb)) return true;
        return ka > kb;
    });
    for (std::size_t r = 0; r < order.size(); ++r) out[order[r]].rank = static_cast<int>(r) + 1;
    return out;
}

}  // namespace tl
