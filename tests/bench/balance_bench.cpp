// Throughput of the mass balance: the allocation-free numeric step (BalancePlan::solve,
// what the ensemble calls per draw) and the full solveBalance (plan + step + checks +
// derived outputs + trophic levels), on invented random models of 20, 50 and 150
// compartments with every EE unknown (square system, LU) and with half of the living
// compartments fully given (overdetermined, QR). Prints figures; asserts nothing.
// Rates are per second of this process's CPU time (std::clock), so that a machine
// shared with other jobs does not deflate them; wall-clock rates are shown beside.
#include <chrono>
#include <cstdio>
#include <ctime>
#include <fstream>
#include <string>

#include "core/balance/balance_plan.h"
#include "core/balance/solver.h"
#include "tests/core/balance/random_model.h"

namespace {

using Clock = std::chrono::steady_clock;

struct Rate {
    double perCpuSecond, perWallSecond;
};

// Runs f repeatedly for at least `seconds` of CPU time.
template <typename F>
Rate rate(F&& f, double seconds = 0.5)
{
    long calls = 0;
    const auto wallStart = Clock::now();
    const std::clock_t cpuStart = std::clock();
    double cpu = 0;
    do {
        for (int k = 0; k < 16; ++k) f();
        calls += 16;
        cpu = static_cast<double>(std::clock() - cpuStart) / CLOCKS_PER_SEC;
    } while (cpu < seconds);
    const double wall = std::chrono::duration<double>(Clock::now() - wallStart).count();
    return {static_cast<double>(calls) / cpu, static_cast<double>(calls) / wall};
}

tl::Model benchModel(std::size_t n, bool square)
{
    tl::Model m = tl::testing::randomConsistentModel(n, 4242 + n);
    std::size_t k = 0;
    for (std::size_t i : m.living())
        if (square || k++ % 2 == 0) m.compartment(i).value(tl::Param::EE).reset();
    return m;
}

}  // namespace

int main()
{
    std::string load;
    std::getline(std::ifstream("/proc/loadavg"), load);
    std::printf("load average: %s\n", load.c_str());
    std::printf("%-6s %-14s %5s %9s %24s %24s\n", "n", "system", "rows", "unknowns", "numeric step /cpu-s (wall)",
                "solveBalance /cpu-s (wall)");
    for (std::size_t n : {20, 50, 150}) {
        for (bool square : {true, false}) {
            const tl::Model m = benchModel(n, square);
            const tl::BalancePlan plan = tl::BalancePlan::build(m);
            const tl::BalanceInputs in = tl::BalanceInputs::fromModel(m);
            tl::BalanceWorkspace ws = plan.makeWorkspace();
            tl::BalanceValues out = plan.makeValues();
            double sink = 0;
            const Rate numeric = rate([&] {
                plan.solve(in, ws, out);
                sink += out.ee[0];
            });
            const Rate full = rate([&] { sink += tl::solveBalance(m).rows[0].ee; });
            std::printf("%-6zu %-14s %5zu %9zu %15.0f (%7.0f) %15.0f (%7.0f)%s\n", n,
                        square ? "square (LU)" : "overdet. (QR)", plan.equationCount(), plan.unknownCount(),
                        numeric.perCpuSecond, numeric.perWallSecond, full.perCpuSecond, full.perWallSecond,
                        sink == 0.12345 ? " " : "");
        }
    }
    return 0;
}
