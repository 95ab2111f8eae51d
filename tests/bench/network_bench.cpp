// Network analysis timings (issue 9): level decomposition (Ulanowicz 1995) and the
// system indicators (ENA, DESIGN 3.5) of the balanced synthetic models
// (synthetic_model.h) of 10 to 5000 compartments, plus the flow network they start
// from; and, as before, every analysis on the largest reference network (Florida Bay,
// 125 compartments; data of the enaR collection, Borrett & Lau 2014). Prints figures;
// asserts nothing.
//   network_bench [--benchmark_filter=level_decomposition/]
// One sheet per size: the three mixes solve to the same balanced sheet (the
// generator's truth, solved here with every value given), so the network and its
// analyses are the same for all three and are run once, named after mix "ee".
// An analysis that would take over 30 s of CPU at a size (predicted from the size
// below with cubic growth, the cost of its dense matrix inverses) is skipped, saying why.
#include <benchmark/benchmark.h>

#include <map>
#include <memory>
#include <string>

#include "core/balance/solver.h"
#include "core/io/scor.h"
#include "core/network/flow_network.h"
#include "core/network/flow_trophic_level.h"
#include "core/network/indicators.h"
#include "core/network/keystone.h"
#include "core/network/level_decomposition.h"
#include "core/network/mixed_trophic_impact.h"
#include "tests/bench/bench_support.h"

namespace {

using namespace tl::bench;

struct Solved {
    tl::BalanceSheet sheet;
    tl::FlowNetwork network;
};

const Solved& solved(std::size_t n)
{
    static std::map<std::size_t, std::unique_ptr<Solved>> cache;
    auto& slot = cache[n];
    if (!slot) {
        const tl::Model& m = cachedModel(n, UnknownMix::EE).truth;  // every value given: the solve only checks
        tl::BalanceSheet sheet = tl::solveBalance(m);
        tl::FlowNetwork network = tl::buildFlowNetwork(m, sheet);
        slot = std::make_unique<Solved>(Solved{std::move(sheet), std::move(network)});
    }
    return *slot;
}

template <typename Analysis>
void runAnalysis(benchmark::State& state, const char* what, std::size_t n, const Analysis& analysis)
{
    for (std::size_t s : kSizes)
        if (s < n) (void)solved(s);  // the probe of skipIfTooSlow times the analysis alone
    if (skipIfTooSlow(state, what, n, analysis)) return;
    (void)solved(n);
    for (auto _ : state) analysis(n);
}

void levelDecomposition(benchmark::State& state, std::size_t n)
{
    runAnalysis(state, "levels", n, [](std::size_t size) {
        const tl::LevelDecomposition d = tl::decomposeLevels(solved(size).network);
        benchmark::DoNotOptimize(d.combined.meanTe);
    });
}

void indicators(benchmark::State& state, std::size_t n)
{
    runAnalysis(state, "indicators", n, [](std::size_t size) {
        const Solved& s = solved(size);
        const tl::SystemIndicators ind = tl::systemIndicators(cachedModel(size, UnknownMix::EE).truth, s.sheet, s.network);
        benchmark::DoNotOptimize(ind.ascendency);
    });
}

void flowNetwork(benchmark::State& state, std::size_t n)
{
    runAnalysis(state, "flow_network", n, [](std::size_t size) {
        const tl::FlowNetwork net = tl::buildFlowNetwork(cachedModel(size, UnknownMix::EE).truth, solved(size).sheet);
        benchmark::DoNotOptimize(net.flows.data());
    });
}

// The reference network: every analysis, as the earlier hand-timed bench reported.
const tl::FlowNetwork* floridaBay(std::string* why)
{
    static const std::string path = std::string(TL_FIXTURES_DIR) + "/reference/scor/florida_bay_dry.scor";
    static const tl::ScorReadResult read = tl::readScorFile(path);
    static const std::unique_ptr<tl::FlowNetwork> net =
        read.network ? std::make_unique<tl::FlowNetwork>(tl::flowNetworkFromScor(*read.network)) : nullptr;
    if (!net && why) *why = read.problems.empty() ? "cannot read " + path : read.problems.front().describe();
    return net.get();
}

template <typename F>
void onFloridaBay(benchmark::State& state, const F& f)
{
    std::string why;
    const tl::FlowNetwork* net = floridaBay(&why);
    if (!net) {
        state.SkipWithError(why.c_str());
        return;
    }
    for (auto _ : state) f(*net);
}

}  // namespace

int main(int argc, char** argv)
{
    for (std::size_t n : kSizes) {
        benchmark::RegisterBenchmark(benchName("flow_network", UnknownMix::EE, n).c_str(), flowNetwork, n)
            ->Unit(benchmark::kMicrosecond);
        benchmark::RegisterBenchmark(benchName("level_decomposition", UnknownMix::EE, n).c_str(), levelDecomposition, n)
            ->Unit(benchmark::kMicrosecond);
        benchmark::RegisterBenchmark(benchName("indicators", UnknownMix::EE, n).c_str(), indicators, n)
            ->Unit(benchmark::kMicrosecond);
    }
    benchmark::RegisterBenchmark("florida_bay/read_scor", [](benchmark::State& state) {
        const std::string path = std::string(TL_FIXTURES_DIR) + "/reference/scor/florida_bay_dry.scor";
        for (auto _ : state) benchmark::DoNotOptimize(tl::readScorFile(path).network.has_value());
    })->Unit(benchmark::kMicrosecond);
    benchmark::RegisterBenchmark("florida_bay/indicators", [](benchmark::State& state) {
        onFloridaBay(state, [](const tl::FlowNetwork& net) { benchmark::DoNotOptimize(tl::systemIndicators(net).ascendency); });
    })->Unit(benchmark::kMicrosecond);
    benchmark::RegisterBenchmark("florida_bay/flow_trophic_levels", [](benchmark::State& state) {
        onFloridaBay(state, [](const tl::FlowNetwork& net) { benchmark::DoNotOptimize(tl::flowTrophicLevels(net).tl[0]); });
    })->Unit(benchmark::kMicrosecond);
    benchmark::RegisterBenchmark("florida_bay/level_decomposition", [](benchmark::State& state) {
        onFloridaBay(state, [](const tl::FlowNetwork& net) { benchmark::DoNotOptimize(tl::decomposeLevels(net).combined.meanTe); });
    })->Unit(benchmark::kMicrosecond);
    benchmark::RegisterBenchmark("florida_bay/impacts_and_keystone", [](benchmark::State& state) {
        onFloridaBay(state, [](const tl::FlowNetwork& net) {
            const tl::MixedTrophicImpact m = tl::mixedTrophicImpact(net);
            benchmark::DoNotOptimize(tl::keystoneIndices(net, m).size());
        });
    })->Unit(benchmark::kMicrosecond);
    benchmark::Initialize(&argc, argv);
    if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
    benchmark::RunSpecifiedBenchmarks();
    benchmark::Shutdown();
    return 0;
}
