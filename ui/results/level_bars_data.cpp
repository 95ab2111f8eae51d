#include "ui/results/level_bars_data.h"

#include <algorithm>
#include <cmath>

namespace tl::ui {
namespace {

double nodeQuantity(const FlowNetwork& net, std::size_t j, LevelQuantity q)
{
    double v = 0.0;
    switch (q) {
    case LevelQuantity::Throughput: v = net.throughflow(j); break;
    case LevelQuantity::Biomass: v = j < net.stocks.size() ? net.stocks[j] : 0.0; break;
    case LevelQuantity::Production: v = j < net.production.size() ? net.production[j] : 0.0; break;
    }
    return std::isfinite(v) ? v : 0.0;
}

double binQuantity(const TrophicLevelBin& bin, LevelQuantity q)
{
    switch (q) {
    case LevelQuantity::Throughput: return bin.throughput;
    case LevelQuantity::Biomass: return bin.biomass;
    case LevelQuantity::Production: return bin.production;
    }
    return 0.0;
}

}  // namespace

const ChainDecomposition& chainsOf(const LevelDecomposition& d, LevelChains chains)
{
    switch (chains) {
    case LevelChains::FromProducers: return d.fromProducers;
    case LevelChains::FromDetritus: return d.fromDetritus;
    case LevelChains::Combined: break;
    }
    return d.combined;
}

LevelBarsData levelBarsData(const FlowNetwork& network, const LevelDecomposition& decomposition,
                            LevelQuantity quantity, LevelChains chains, double cut)
{
    const ChainDecomposition& c = chainsOf(decomposition, chains);
    LevelBarsData data;
    data.meanTe = c.meanTe;
    data.primaryProductionConsumed = decomposition.primaryProductionConsumed;
    data.detritusInflowConsumed = decomposition.detritusInflowConsumed;
    const auto levels = static_cast<Eigen::Index>(c.levels.size());
    const auto nodes = std::min<Eigen::Index>(c.share.rows(), static_cast<Eigen::Index>(network.size()));
    double largest = 0.0;
    for (Eigen::Index k = 0; k < levels; ++k) {
        const TrophicLevelBin& bin = c.levels[static_cast<std::size_t>(k)];
        LevelStack stack;
        stack.level = bin.level;
        stack.total = binQuantity(bin, quantity);
        stack.te = bin.te;
        for (Eigen::Index j = 0; j < nodes && k < c.share.cols(); ++j) {
            const double v = c.share(j, k) * nodeQuantity(network, static_cast<std::size_t>(j), quantity);
            if (v != 0.0) stack.segments.push_back({static_cast<std::size_t>(j), v, 0.0});
        }
        for (auto& s : stack.segments) s.share = stack.total != 0.0 ? s.value / stack.total : 0.0;
        data.grandTotal += stack.total;
        largest = std::max(largest, std::abs(stack.total));
        data.stacks.push_back(std::move(stack));
    }
    while (data.stacks.size() > 1 && std::abs(data.stacks.back().total) < cut * largest) {
        data.stacks.pop_back();
        ++data.droppedLevels;
    }
    return data;
}

}  // namespace tl::ui
