// Ensemble throughput (issue 15's benchmark; not a test): draws per second of
// tl::ensemble::runEnsemble on a synthetic food web (tests/bench/synthetic_model.h,
// invented numbers) with every diet row drawn, at three depths of output:
//   balance     solved values, EE, P/Q, balanced share, breakers   (target 200 000 /s)
//   tl          + trophic level of every consumer                   (target 100 000 /s)
//   network     + TE by level and system indicators                 (target   5 000 /s)
// on all the machine's cores (--threads, default 2), printed beside the NumPy batched
// ensemble (tests/bench/numpy_ensemble.py) doing the same draws on the same model,
// which this program writes as a CSV folder. Wall-clock time of whole runs; the best of
// --rounds runs is reported (a shared machine only ever slows a run down).
//
//   ensemble_bench [--size 50] [--mix ee] [--draws 200000] [--threads 2] [--rounds 3]
//                  [--cv 0.1] [--diet-cv 0.1] [--no-numpy] [--tiers balance,tl,network]
//
// CVs: every drawn value gets --cv (set as the project's CV for every grade) and every
// diet row --diet-cv; at 10 % most draws of the synthetic web balance, so the outputs
// (computed for balanced draws only) are paid for on most draws; the balanced share is
// printed beside each figure.
#include <chrono>
#include <ctime>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <string_view>
#include <thread>

#include "core/ensemble/ensemble.h"
#include "core/io/csv_model.h"
#include "tests/bench/synthetic_model.h"

namespace {

using namespace tl;
using namespace tl::ensemble;

struct Options {
    std::size_t size = 50;
    bench::UnknownMix mix = bench::UnknownMix::EE;
    std::uint64_t draws = 200000;
    unsigned threads = 2;
    int rounds = 3;
    double cv = 0.1, dietCv = 0.1;
    bool numpy = true;
    std::string tiers = "balance,tl,network";
};

struct Figure {
    double seconds = 0, cpuSeconds = 0;
    double balancedShare = 0;
};

double processCpuSeconds()
{
    timespec t{};
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t);
    return static_cast<double>(t.tv_sec) + 1e-9 * static_cast<double>(t.tv_nsec);
}

Figure timeRun(const Model& model, EnsembleSettings s, int rounds)
{
    Figure best{1e300, 1e300, 0};
    for (int r = 0; r < rounds; ++r) {
        const auto t0 = std::chrono::steady_clock::now();
        const double c0 = processCpuSeconds();
        const EnsembleRun run = runEnsemble(model, s);
        const double dt = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        best.cpuSeconds = std::min(best.cpuSeconds, processCpuSeconds() - c0);
        if (!run.ran()) {
            std::fprintf(stderr, "ensemble_bench: the model cannot be run: %s\n", run.problems.front().message.c_str());
            std::exit(1);
        }
        if (dt < best.seconds) {
            best.seconds = dt;
            best.balancedShare = run.statistics.balancedShare();
        }
    }
    return best;
}

std::string runNumpy(const std::filesystem::path& folder, const Options& o, const std::string& tier, std::uint64_t draws)
{
    const std::string cmd = "/usr/bin/python3 " TL_NUMPY_ENSEMBLE " '" + folder.string() + "' --draws " + std::to_string(draws) +
                            " --cv " + std::to_string(o.cv) + " --diet-cv " + std::to_string(o.dietCv) + " --tier " + tier +
                            " --rounds " + std::to_string(o.rounds) + " 2>&1";
    std::string out;
    if (FILE* p = popen(cmd.c_str(), "r")) {
        char buf[4096];
        for (std::size_t n; (n = std::fread(buf, 1, sizeof buf, p)) > 0;) out.append(buf, n);
        pclose(p);
    }
    while (!out.empty() && out.back() == '\n') out.pop_back();
    return out;
}

}  // namespace

int main(int argc, char** argv)
{
    Options o;
    for (int a = 1; a < argc; ++a) {
        const std::string_view arg = argv[a];
        const bool v = a + 1 < argc;
        if (arg == "--size" && v) o.size = std::strtoull(argv[++a], nullptr, 10);
        else if (arg == "--mix" && v) o.mix = bench::parseMix(argv[++a]).value_or(bench::UnknownMix::EE);
        else if (arg == "--draws" && v) o.draws = std::strtoull(argv[++a], nullptr, 10);
        else if (arg == "--threads" && v) o.threads = static_cast<unsigned>(std::strtoul(argv[++a], nullptr, 10));
        else if (arg == "--rounds" && v) o.rounds = std::atoi(argv[++a]);
        else if (arg == "--cv" && v) o.cv = std::strtod(argv[++a], nullptr);
        else if (arg == "--diet-cv" && v) o.dietCv = std::strtod(argv[++a], nullptr);
        else if (arg == "--tiers" && v) o.tiers = argv[++a];
        else if (arg == "--no-numpy") o.numpy = false;
        else {
            std::fprintf(stderr, "ensemble_bench: unknown argument '%s'\n", argv[a]);
            return 2;
        }
    }
    if (o.size < 10 || o.draws == 0 || o.threads == 0 || o.rounds < 1) {
        std::fprintf(stderr, "ensemble_bench: --size >= 10, --draws, --threads, --rounds >= 1\n");
        return 2;
    }
    Model model = bench::syntheticModel(o.size, o.mix, 20261202).model;
    model.rules.cvByGrade = {o.cv, o.cv, o.cv, o.cv};
    const std::filesystem::path folder = std::filesystem::temp_directory_path() /
                                         ("tl_ensemble_bench_" + std::to_string(o.size) + "_" + std::string(bench::mixKey(o.mix)));
    std::filesystem::remove_all(folder);
    writeCsvModel(model, folder);

    std::printf("Ensemble throughput: %zu compartments (synthetic, mix %s), every given B, P/B, Q/B and every diet row drawn\n",
                o.size, std::string(bench::mixKey(o.mix)).c_str());
    std::printf("CV %.3g, diet CV %.3g; draws per run %llu; best of %d runs; wall clock; machine cores %u\n\n", o.cv, o.dietCv,
                static_cast<unsigned long long>(o.draws), o.rounds, std::thread::hardware_concurrency());
    std::printf("draws/s: wall clock of the whole run; per CPU s: draws per second of process CPU time (what one\n"
                "core gives when the machine is shared; the 2-core figure of an idle machine is at most twice it)\n\n");
    std::printf("%-9s %-8s %10s %12s %12s %9s   %s\n", "tier", "threads", "draws", "draws/s", "per CPU s", "balanced",
                "NumPy batched (same model, same tier)");
    struct Tier {
        const char* name;
        Analyses analyses;
        std::uint64_t divisor;  // fewer draws for the costly tier
        double target;
    };
    const Tier tiers[] = {{"balance", {}, 1, 200000}, {"tl", {true, false, false}, 1, 100000},
                          {"network", {true, true, true}, 20, 5000}};
    for (const Tier& t : tiers) {
        if (o.tiers.find(t.name) == std::string::npos) continue;
        const std::uint64_t draws = std::max<std::uint64_t>(1, o.draws / t.divisor);
        std::string numpy = o.numpy ? runNumpy(folder, o, t.name, draws) : "(skipped)";
        for (unsigned threads : {1u, o.threads}) {
            EnsembleSettings s;
            s.draws = draws;
            s.seed = 7;
            s.threads = threads;
            s.analyses = t.analyses;
            s.dietCv = o.dietCv;
            const Figure f = timeRun(model, s, o.rounds);
            const double rate = static_cast<double>(draws) / f.seconds;
            std::printf("%-9s %-8u %10llu %12.0f %12.0f %8.1f%%   %s\n", t.name, threads, static_cast<unsigned long long>(draws),
                        rate, static_cast<double>(draws) / f.cpuSeconds, 100.0 * f.balancedShare,
                        threads == o.threads ? numpy.c_str() : "");
            if (threads == o.threads)
                std::printf("%-9s target %.0f draws/s on %u threads: %s\n", "", t.target, o.threads, rate >= t.target ? "met" : "MISSED");
            if (o.threads == 1) break;
        }
    }
    std::filesystem::remove_all(folder);
    return 0;
}
