// reconcile_bench: time reconcile (core/reconcile, NLopt SLSQP with analytic gradients)
// on invented synthetic webs (tests/bench/synthetic_model.h, mix "ee") made unbalanced
// on purpose, and beside it scipy's SLSQP (tests/crosscheck/reconcile_scipy.py, an
// independent formulation of the same problem) timed in the same run. Prints figures;
// asserts nothing about speed (targets: 50 compartments under 1 s, 200 under 10 s).
//
//   reconcile_bench [--sizes 50,200] [--seed 1] [--scipy PATH] [--scipy-timeout SECONDS]
//                   [--no-scipy] [--slsqp-limit FREE_VARIABLES]
//
// --slsqp-limit: working sets above this many free variables go to AUGLAG + L-BFGS
// first (ReconcileOptions::slsqpFreeVariableLimit, default 300); a huge value gives
// the dense-SLSQP-only figures of before (93 s CPU at 200 compartments).
//
// Imbalance: the biomass of every fifth consumer (at least ten) is tripled, so that its
// prey are over-eaten; the EE violations counted by the balance solver are printed.
#include <chrono>
#include <ctime>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

#include <sys/wait.h>

#include "core/balance/solver.h"
#include "core/reconcile/reconcile.h"
#include "tests/bench/synthetic_model.h"
#include "tests/core/reconcile/reconcile_problem_json.h"
#include "tests/support/test_support.h"

namespace {

using namespace tl;

Model unbalanced(std::size_t n, std::uint64_t seed)
{
    Model m = bench::syntheticModel(n, bench::UnknownMix::EE, seed).model;
    std::size_t tripled = 0, consumer = 0;
    for (std::size_t i = 0; i < m.size(); ++i) {
        Compartment& c = m.compartment(i);
        if (c.kind != CompartmentKind::Consumer || !c.value(Param::Biomass)) continue;
        if (consumer++ % 5 == 0 || tripled < 10) {
            *c.value(Param::Biomass) *= 3.0;
            ++tripled;
        }
    }
    return m;
}

std::size_t eeViolations(const Model& m)
{
    const BalanceSheet s = solveBalance(m);
    std::size_t count = 0;
    for (std::size_t i = 0; i < m.size(); ++i)
        if (m.compartment(i).isLiving() && s.rows[i].ee > m.rules.eeMax) ++count;
    return count;
}

}  // namespace

int main(int argc, char** argv)
{
    std::vector<std::size_t> sizes = {50, 200};
    std::uint64_t seed = 1;
    std::string scipy = TL_RECONCILE_SCIPY;
    int scipyTimeout = 300;
    bool runScipy = true;
    std::size_t slsqpLimit = ReconcileOptions{}.slsqpFreeVariableLimit;
    for (int a = 1; a < argc; ++a) {
        const std::string arg = argv[a];
        if (arg == "--sizes" && a + 1 < argc) {
            sizes = tl::bench::parseSizes(argv[++a]);
        } else if (arg == "--seed" && a + 1 < argc) {
            seed = std::stoull(argv[++a]);
        } else if (arg == "--scipy" && a + 1 < argc) {
            scipy = argv[++a];
        } else if (arg == "--scipy-timeout" && a + 1 < argc) {
            scipyTimeout = std::stoi(argv[++a]);
        } else if (arg == "--slsqp-limit" && a + 1 < argc) {
            slsqpLimit = std::stoul(argv[++a]);
        } else if (arg == "--no-scipy") {
            runScipy = false;
        } else {
            std::fprintf(stderr, "usage: reconcile_bench [--sizes 50,200] [--seed 1] [--scipy PATH] "
                                 "[--scipy-timeout SECONDS] [--no-scipy] [--slsqp-limit FREE_VARIABLES]\n");
            return 2;
        }
    }
    const tl::testing::ScratchDir dir("reconcile_bench");
    std::printf("%6s %9s %6s %9s %10s %8s %7s %14s %9s %12s %10s %12s %s\n", "n", "violations", "vars", "cons", "C++ s", "C++ cpu",
                "evals/free/rounds", "objective", "status", "scipy s", "scipy it", "scipy obj", "scipy note");
    for (std::size_t n : sizes) {
        const Model m = unbalanced(n, seed);
        const std::size_t violations = eeViolations(m);
        ReconcileOptions o;  // b, pb, qb and diet move
        o.slsqpFreeVariableLimit = slsqpLimit;
        const auto t0 = std::chrono::steady_clock::now();
        const std::clock_t c0 = std::clock();
        const ReconcileResult r = reconcile(m, o);
        const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        const double cpu = static_cast<double>(std::clock() - c0) / CLOCKS_PER_SEC;

        std::string scipySeconds = "-", scipyIterations = "-", scipyObjective = "-", note = "not run";
        if (runScipy) {
            const auto problem = dir.path() / ("problem" + std::to_string(n) + ".json");
            const auto out = dir.path() / ("scipy" + std::to_string(n) + ".json");
            tl::testing::writeText(problem, tl::testing::reconcileProblemJson(m, o));
            const std::string cmd = "timeout " + std::to_string(scipyTimeout) + " /usr/bin/python3 " +
                                    tl::testing::shellQuoted(scipy) + " " + tl::testing::shellQuoted(problem.string()) +
                                    " > " + tl::testing::shellQuoted(out.string());
            const auto p0 = std::chrono::steady_clock::now();
            const int status = std::system(cmd.c_str());
            const double wall = std::chrono::duration<double>(std::chrono::steady_clock::now() - p0).count();
            if (WIFEXITED(status) && WEXITSTATUS(status) == 0) {
                const auto j = nlohmann::json::parse(tl::testing::slurp(out));
                char buf[64];
                std::snprintf(buf, sizeof buf, "%.3f", j.at("seconds").get<double>());
                scipySeconds = buf;
                scipyIterations = std::to_string(j.at("iterations").get<int>());
                std::snprintf(buf, sizeof buf, "%.6g", j.at("objective").get<double>());
                scipyObjective = buf;
                std::snprintf(buf, sizeof buf, "minimize only; %.1f s with start-up", wall);
                note = buf;
            } else {
                scipySeconds = ">" + std::to_string(scipyTimeout);
                note = "stopped at the timeout";
            }
        }
        std::printf("%6zu %9zu %6zu %9zu %10.3f %8.3f %7s %14.9g %9s %12s %10s %12s %s\n", n, violations, r.variableCount,
                    r.constraintCount, seconds, cpu,
                    (std::to_string(r.evaluations) + "/" + std::to_string(r.freeVariables) + "/" +
                     std::to_string(r.workingSetRounds)).c_str(),
                    r.objective,
                    std::string(reconcileStatusKey(r.status)).c_str(), scipySeconds.c_str(), scipyIterations.c_str(),
                    scipyObjective.c_str(), note.c_str());
        std::fflush(stdout);
    }
    std::printf("scipy: scipy.optimize.minimize(method=\"SLSQP\"), analytic objective gradient, constraint Jacobians "
                "by scipy's finite differences (the script states the problem independently of the C++).\n");
    return 0;
}
