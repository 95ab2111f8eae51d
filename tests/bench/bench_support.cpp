#include "tests/bench/bench_support.h"

#include <sys/resource.h>
#include <unistd.h>

#include <cmath>
#include <cstdio>
#include <ctime>
#include <fstream>
#include <map>
#include <memory>
#include <utility>

namespace tl::bench {

const SyntheticModel& cachedModel(std::size_t n, UnknownMix mix)
{
    static std::map<std::pair<std::size_t, UnknownMix>, std::unique_ptr<SyntheticModel>> cache;
    auto& slot = cache[{n, mix}];
    if (!slot) slot = std::make_unique<SyntheticModel>(syntheticModel(n, mix, kSeed));
    return *slot;
}

std::string benchName(const char* what, UnknownMix mix, std::size_t n)
{
    return std::string(what) + "/" + std::string(mixKey(mix)) + "/" + std::to_string(n);
}

bool skipIfTooSlow(benchmark::State& state, const std::string& what, std::size_t n,
                   const std::function<void(std::size_t)>& oneCall)
{
    static std::map<std::pair<std::string, std::size_t>, double> timed;  // CPU seconds of one call
    std::size_t below = 0;
    for (std::size_t s : kSizes)
        if (s < n) below = s;
    if (below == 0) return false;
    auto it = timed.find({what, below});
    if (it == timed.end()) {
        const std::clock_t start = std::clock();
        oneCall(below);
        const double seconds = static_cast<double>(std::clock() - start) / CLOCKS_PER_SEC;
        it = timed.emplace(std::pair{what, below}, seconds).first;
    }
    const double predicted = it->second * std::pow(static_cast<double>(n) / static_cast<double>(below), 3.0);
    state.counters["predicted_s"] = predicted;
    if (predicted <= kSkipAboveSeconds) return false;
    char why[200];
    std::snprintf(why, sizeof why,
                  "skipped: one call predicted to take %.0f s of CPU (%.3g s at %zu compartments, cubic growth)", predicted,
                  it->second, below);
    state.SkipWithError(why);
    return true;
}

double peakRssMiB()
{
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return static_cast<double>(usage.ru_maxrss) / 1024.0;  // Linux: KiB
}

double currentRssMiB()
{
    long pages = 0, resident = 0;
    std::ifstream("/proc/self/statm") >> pages >> resident;
    return static_cast<double>(resident) * static_cast<double>(sysconf(_SC_PAGESIZE)) / (1024.0 * 1024.0);
}

}  // namespace tl::bench
