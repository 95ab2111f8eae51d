// Mass-balance throughput (issue 9): the allocation-free numeric step
// (BalancePlan::solve, what the ensemble calls per draw), the full solveBalance
// (plan + step + checks + derived outputs + trophic levels), and the full solve of a
// caller that keeps its buffers (solveBalance(model, scratch)) on the synthetic models
// (synthetic_model.h) of 10 to 5000 compartments in the three unknown mixes, plus
// the memory of one full solve of 5000 compartments. Prints figures; asserts nothing.
//   balance_bench [--benchmark_filter=solve_balance/ee/] [--benchmark_format=json]
// Counters: equations and unknowns of A x = b; balanced = 1 when the sheet balanced
// (the synthetic models should); peak_rss_mib = the process's peak resident set.
// A size whose one call would take over 30 s of CPU is skipped, saying why
// (bench_support.h).
#include <benchmark/benchmark.h>

#include "core/balance/balance_plan.h"
#include "core/balance/solver.h"
#include "tests/bench/bench_support.h"

namespace {

using namespace tl::bench;

void numericStep(benchmark::State& state, std::size_t n, UnknownMix mix)
{
    const auto oneCall = [mix](std::size_t size) {
        const tl::Model& m = cachedModel(size, mix).model;
        const tl::BalancePlan plan = tl::BalancePlan::build(m);
        tl::BalanceWorkspace ws = plan.makeWorkspace();
        tl::BalanceValues out = plan.makeValues();
        plan.solve(tl::BalanceInputs::fromModel(m), ws, out);
    };
    if (skipIfTooSlow(state, benchName("numeric_step", mix, 0), n, oneCall)) return;
    const SyntheticModel& s = cachedModel(n, mix);
    const tl::BalancePlan plan = tl::BalancePlan::build(s.model);
    if (plan.hasStructuralErrors()) {
        state.SkipWithError("the plan has structural errors");
        return;
    }
    const tl::BalanceInputs in = tl::BalanceInputs::fromModel(s.model);
    tl::BalanceWorkspace ws = plan.makeWorkspace();
    tl::BalanceValues out = plan.makeValues();
    for (auto _ : state) {
        plan.solve(in, ws, out);
        benchmark::DoNotOptimize(out.ee.data());
        benchmark::ClobberMemory();
    }
    state.counters["equations"] = static_cast<double>(plan.equationCount());
    state.counters["unknowns"] = static_cast<double>(plan.unknownCount());
    state.counters["solved"] = out.status == tl::NumericStatus::Solved;
}

void fullSolve(benchmark::State& state, std::size_t n, UnknownMix mix)
{
    const auto oneCall = [mix](std::size_t size) { benchmark::DoNotOptimize(tl::solveBalance(cachedModel(size, mix).model).rows.data()); };
    if (skipIfTooSlow(state, benchName("solve_balance", mix, 0), n, oneCall)) return;
    const SyntheticModel& s = cachedModel(n, mix);
    const double before = currentRssMiB();
    tl::BalanceStatus status = tl::BalanceStatus::Invalid;
    for (auto _ : state) {
        const tl::BalanceSheet sheet = tl::solveBalance(s.model);
        status = sheet.status;
        benchmark::DoNotOptimize(sheet.rows.data());
    }
    state.counters["balanced"] = status == tl::BalanceStatus::Balanced;
    state.counters["rss_before_mib"] = before;
    state.counters["peak_rss_mib"] = peakRssMiB();
}

// The full solve called again and again with its buffers kept in a BalanceScratch (what
// reconcile or a re-solve after each edit pays per call).
void fullSolveKept(benchmark::State& state, std::size_t n, UnknownMix mix)
{
    tl::BalanceScratch scratch;
    const auto oneCall = [mix, &scratch](std::size_t size) {
        benchmark::DoNotOptimize(tl::solveBalance(cachedModel(size, mix).model, scratch).rows.data());
    };
    if (skipIfTooSlow(state, benchName("solve_balance_kept", mix, 0), n, oneCall)) return;
    const SyntheticModel& s = cachedModel(n, mix);
    tl::BalanceStatus status = tl::BalanceStatus::Invalid;
    for (auto _ : state) {
        const tl::BalanceSheet sheet = tl::solveBalance(s.model, scratch);
        status = sheet.status;
        benchmark::DoNotOptimize(sheet.rows.data());
    }
    state.counters["balanced"] = status == tl::BalanceStatus::Balanced;
}

// One solve of the largest model in a process of its own (run it alone with
// --benchmark_filter=^solve_memory/): the peak resident set of model + solve. Never
// skipped: it is the memory figure of issue 9, however long the solve takes.
void solveMemory(benchmark::State& state, std::size_t n, UnknownMix mix)
{
    const SyntheticModel& s = cachedModel(n, mix);
    const double before = currentRssMiB();
    for (auto _ : state) {
        const tl::BalanceSheet sheet = tl::solveBalance(s.model);
        benchmark::DoNotOptimize(sheet.rows.data());
    }
    state.counters["rss_before_mib"] = before;
    state.counters["peak_rss_mib"] = peakRssMiB();
}

}  // namespace

int main(int argc, char** argv)
{
    for (std::size_t n : kSizes)
        for (UnknownMix mix : kMixes) {
            benchmark::RegisterBenchmark(benchName("numeric_step", mix, n).c_str(), numericStep, n, mix)
                ->Unit(benchmark::kMicrosecond);
            benchmark::RegisterBenchmark(benchName("solve_balance", mix, n).c_str(), fullSolve, n, mix)
                ->Unit(benchmark::kMicrosecond);
            benchmark::RegisterBenchmark(benchName("solve_balance_kept", mix, n).c_str(), fullSolveKept, n, mix)
                ->Unit(benchmark::kMicrosecond);
        }
    for (UnknownMix mix : kMixes)
        benchmark::RegisterBenchmark(benchName("solve_memory", mix, 5000).c_str(), solveMemory, 5000, mix)
            ->Unit(benchmark::kMillisecond)
            ->Iterations(1);
    benchmark::Initialize(&argc, argv);
    if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
    benchmark::RunSpecifiedBenchmarks();
    benchmark::Shutdown();
    return 0;
}
