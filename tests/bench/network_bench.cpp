// Network analysis timings: prints figures, asserts nothing (speed targets stay out of
// the timed unit tests). Runs every analysis on the largest reference network (Florida
// Bay, 125 compartments; data of the enaR collection, Borrett & Lau 2014) and on
// invented random webs of growing size.
//   ninja network_bench && tests/bench/network_bench [path/to/florida_bay_dry.scor]
#include <chrono>
#include <cstdio>
#include <random>
#include <string>

#include "core/io/scor.h"
#include "core/network/flow_network.h"
#include "core/network/flow_trophic_level.h"
#include "core/network/indicators.h"
#include "core/network/keystone.h"
#include "core/network/level_decomposition.h"
#include "core/network/mixed_trophic_impact.h"

namespace {

template <typename F>
double millisecondsPerCall(F&& f, int repeats)
{
    const auto start = std::chrono::steady_clock::now();
    for (int r = 0; r < repeats; ++r) f();
    const auto end = std::chrono::steady_clock::now();
    return std::chrono::duration<double, std::milli>(end - start).count() / repeats;
}

void benchNetwork(const char* label, const tl::FlowNetwork& net, int repeats)
{
    volatile double sink = 0;
    const double ind = millisecondsPerCall([&] { sink = sink + tl::systemIndicators(net).ascendency; }, repeats);
    const double tl = millisecondsPerCall([&] { sink = sink + tl::flowTrophicLevels(net).tl[0]; }, repeats);
    const double lv = millisecondsPerCall([&] { sink = sink + tl::decomposeLevels(net).combined.meanTe; }, repeats);
    const double mti = millisecondsPerCall(
        [&] {
            const tl::MixedTrophicImpact m = tl::mixedTrophicImpact(net);
            sink = sink + tl::keystoneIndices(net, m).size();
        },
        repeats);
    std::printf("%-28s n=%4zu  indicators %8.3f ms  TL %8.3f ms  levels %8.3f ms  MTI+keystone %8.3f ms\n", label,
                net.size(), ind, tl, lv, mti);
}

// Invented random web: 10 % producers, 5 % detritus, each consumer eats 2-6 random nodes.
tl::FlowNetwork randomWeb(std::size_t n, unsigned seed)
{
    std::mt19937 rng(seed);
    std::uniform_real_distribution<double> u(0.1, 10.0);
    tl::FlowNetwork net;
    const std::size_t producers = std::max<std::size_t>(1, n / 10), detritus = std::max<std::size_t>(1, n / 20);
    for (std::size_t i = 0; i < n; ++i) {
        std::string name = "n";
        name += std::to_string(i);
        net.names.push_back(name);
        net.roles.push_back(i < producers ? tl::NodeRole::Producer
                            : i >= n - detritus ? tl::NodeRole::Detritus
                                                : tl::NodeRole::Consumer);
        net.stocks.push_back(u(rng));
        net.imports.push_back(i < producers ? 100 * u(rng) : 0.0);
        net.foodImport.push_back(0.0);
        net.exports.push_back(u(rng));
        net.respiration.push_back(net.roles.back() == tl::NodeRole::Consumer ? u(rng) : 0.0);
        net.production.push_back(u(rng));
    }
    const auto N = static_cast<Eigen::Index>(n);
    net.flows = Eigen::MatrixXd::Zero(N, N);
    std::uniform_int_distribution<std::size_t> pick(0, n - 1), count(2, 6);
    for (std::size_t j = producers; j < n - detritus; ++j)
        for (std::size_t k = count(rng); k > 0; --k)
            net.flows(static_cast<Eigen::Index>(pick(rng)), static_cast<Eigen::Index>(j)) += u(rng);
    for (std::size_t i = 0; i < n - detritus; ++i)
        net.flows(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(n - 1)) += u(rng);
    net.fleetLandings = Eigen::MatrixXd::Zero(0, N);
    net.fleetDeadDiscards = Eigen::MatrixXd::Zero(0, N);
    return net;
}

}  // namespace

int main(int argc, char** argv)
{
    const std::string path = argc > 1 ? argv[1] : std::string(TL_FIXTURES_DIR) + "/reference/scor/florida_bay_dry.scor";
    const tl::ScorReadResult read = tl::readScorFile(path);
    if (read.network) {
        const double ms = millisecondsPerCall([&] { (void)tl::readScorFile(path); }, 20);
        std::printf("read %s: %.3f ms\n", path.c_str(), ms);
        benchNetwork("Florida Bay (dry season)", tl::flowNetworkFromScor(*read.network), 20);
    } else {
        for (const tl::Problem& p : read.problems) std::printf("%s\n", p.describe().c_str());
    }
    for (std::size_t n : {50, 100, 200, 400}) benchNetwork("random web (invented)", randomWeb(n, 7), n >= 200 ? 3 : 10);
    return 0;
}
