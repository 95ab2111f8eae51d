// Shared by the benchmark programs: the sizes, mixes and seed of the table (issue 9),
// the synthetic models generated once per process, and memory figures.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <functional>
#include <string>

#include <benchmark/benchmark.h>

#include "tests/bench/synthetic_model.h"

namespace tl::bench {

// The seed of every benchmark model; run_benchmarks.py passes the same one to
// tl_make_synthetic so the C++, CLI and NumPy figures are on identical models.
inline constexpr std::uint64_t kSeed = 20261202;
inline constexpr std::array<std::size_t, 5> kSizes = {10, 50, 200, 1000, 5000};
inline constexpr std::array<UnknownMix, 3> kMixes = {UnknownMix::EE, UnknownMix::EEBiomass, UnknownMix::EEQbPq};

// syntheticModel(n, mix, kSeed), generated at the first request and kept.
const SyntheticModel& cachedModel(std::size_t n, UnknownMix mix);

// Benchmark name "<what>/<mix>/<n>" (the smoke tests filter on "/10$").
std::string benchName(const char* what, UnknownMix mix, std::size_t n);

// Skips (state.SkipWithError, saying why) a benchmark whose one call at size n would
// take over kSkipAboveSeconds of CPU, predicted with cubic growth (dense factorisations
// and inverses) from one call at the next smaller size of kSizes, timed here once per
// process. Returns true when skipped. Keeps a run of the whole table to minutes when a
// dense method meets 5000 compartments.
inline constexpr double kSkipAboveSeconds = 30.0;
bool skipIfTooSlow(benchmark::State& state, const std::string& what, std::size_t n,
                   const std::function<void(std::size_t)>& oneCall);

double peakRssMiB();     // getrusage: the process's peak resident set so far
double currentRssMiB();  // /proc/self/statm: resident now

}  // namespace tl::bench
