// sensitivity_bench: time the local elasticities (core/sensitivity/elasticity.h) of
// invented synthetic webs (tests/bench/synthetic_model.h), analytic and by central
// differences, beside NumPy central differences (tests/bench/numpy_elasticity.py: every
// input moved both ways, each side a dense NumPy solve) timed in the same run, and
// compare the values (NumPy's step h = 1e-6 on ln(input): its truncation error grows
// with h^2 times the third derivative, and a solved Q/B found as a small difference of
// large flows can have elasticities near 1000, where h = 1e-5 is off by 6e-5 relative).
// Prints figures; asserts nothing about speed. Exit 1 when C++ and
// NumPy disagree by more than 1e-5 (relative, plus 1e-5: the rounding of a difference
// quotient at h = 1e-6 reaches 1e-6 on 200 compartments) on an elasticity both define.
//
//   sensitivity_bench [--sizes 50,100] [--mix ee-biomass] [--seed 1] [--numpy PATH] [--no-numpy]
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <map>
#include <string>
#include <vector>

#include <sys/wait.h>

#include "core/io/csv_model.h"
#include "core/sensitivity/elasticity.h"
#include "tests/bench/synthetic_model.h"
#include "tests/support/test_support.h"

namespace {

using namespace tl;

struct Timing {
    double wall = 0.0, cpu = 0.0;  // median seconds per call
    int calls = 0;
};

// Median of repeated calls for at least `seconds` (and at least 3 calls).
template <typename F>
Timing timeIt(F&& call, double seconds)
{
    std::vector<double> walls, cpus;
    double total = 0.0;
    while (total < seconds || walls.size() < 3) {
        const auto t0 = std::chrono::steady_clock::now();
        const std::clock_t c0 = std::clock();
        call();
        walls.push_back(std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count());
        cpus.push_back(static_cast<double>(std::clock() - c0) / CLOCKS_PER_SEC);
        total += walls.back();
        if (walls.size() >= 500) break;
    }
    auto median = [](std::vector<double> v) {
        std::nth_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(v.size() / 2), v.end());
        return v[v.size() / 2];
    };
    return {median(walls), median(cpus), static_cast<int>(walls.size())};
}

}  // namespace

int main(int argc, char** argv)
{
    std::vector<std::size_t> sizes = {50};
    bench::UnknownMix mix = bench::UnknownMix::EEBiomass;
    std::uint64_t seed = 1;
    std::string numpy = TL_NUMPY_ELASTICITY;
    bool runNumpy = true;
    for (int a = 1; a < argc; ++a) {
        const std::string arg = argv[a];
        if (arg == "--sizes" && a + 1 < argc) {
            sizes = tl::bench::parseSizes(argv[++a]);
        } else if (arg == "--mix" && a + 1 < argc && bench::parseMix(argv[a + 1])) {
            mix = *bench::parseMix(argv[++a]);
        } else if (arg == "--seed" && a + 1 < argc) {
            seed = std::stoull(argv[++a]);
        } else if (arg == "--numpy" && a + 1 < argc) {
            numpy = argv[++a];
        } else if (arg == "--no-numpy") {
            runNumpy = false;
        } else {
            std::fprintf(stderr, "usage: sensitivity_bench [--sizes 50,100] [--mix ee|ee-biomass|ee-qb-pq] [--seed 1] "
                                 "[--numpy PATH] [--no-numpy]\n");
            return 2;
        }
    }
    const tl::testing::ScratchDir dir("sensitivity_bench");
    int disagreements = 0;
    std::printf("%5s %-10s %6s %7s %12s %12s %12s %12s %8s %9s %12s\n", "n", "mix", "inputs", "outputs", "C++ analytic",
                "(cpu)", "C++ central", "NumPy central", "NumPy/C++", "compared", "max |diff|");
    for (std::size_t n : sizes) {
        const Model m = bench::syntheticModel(n, mix, seed).model;
        ElasticityResult analytic;
        const Timing ta = timeIt([&] { analytic = computeElasticities(m); }, 1.0);
        ElasticityOptions central;
        central.forceCentralDifferences = true;
        ElasticityResult byDifferences;
        const Timing tc = timeIt([&] { byDifferences = computeElasticities(m, central); }, 1.0);
        if (!analytic.error.empty()) {
            std::printf("%5zu: %s\n", n, analytic.error.c_str());
            continue;
        }

        std::string numpySeconds = "-", ratio = "-", compared = "-", maxDiff = "-";
        if (runNumpy) {
            const auto folder = dir.path() / ("model" + std::to_string(n));
            const auto out = dir.path() / ("numpy" + std::to_string(n) + ".json");
            writeCsvModel(m, folder);
            const std::string cmd = "/usr/bin/python3 " + tl::testing::shellQuoted(numpy) + " " +
                                    tl::testing::shellQuoted(folder.string()) + " --step 1e-6 > " +
                                    tl::testing::shellQuoted(out.string());
            const int status = std::system(cmd.c_str());
            if (WIFEXITED(status) && WEXITSTATUS(status) == 0) {
                const auto j = nlohmann::json::parse(tl::testing::slurp(out));
                const double seconds = j.at("timing").at("seconds").get<double>();
                char buf[64];
                std::snprintf(buf, sizeof buf, "%.4f s", seconds);
                numpySeconds = buf;
                std::snprintf(buf, sizeof buf, "%.0fx", seconds / ta.wall);
                ratio = buf;
                std::map<std::string, std::size_t> inputColumn, outputRow;
                for (std::size_t k = 0; k < j.at("inputs").size(); ++k) inputColumn[j.at("inputs")[k]] = k;
                for (std::size_t o = 0; o < j.at("outputs").size(); ++o) outputRow[j.at("outputs")[o]] = o;
                double worst = 0.0;
                std::size_t count = 0;
                for (std::size_t o = 0; o < analytic.outputs.size(); ++o) {
                    const auto row = outputRow.find(outputName(m, analytic.outputs[o]));
                    if (row == outputRow.end()) continue;
                    for (std::size_t k = 0; k < analytic.inputs.size(); ++k) {
                        const auto col = inputColumn.find(inputName(m, analytic.inputs[k]));
                        if (col == inputColumn.end()) continue;
                        const auto& cell = j.at("elasticity")[row->second][col->second];
                        const double ours = analytic.elasticity(static_cast<Eigen::Index>(o), static_cast<Eigen::Index>(k));
                        if (cell.is_null() || !std::isfinite(ours)) continue;
                        const double diff = std::abs(ours - cell.get<double>());
                        worst = std::max(worst, diff);
                        if (diff > 1e-5 + 1e-5 * std::abs(ours) && ++disagreements <= 5)
                            std::printf("      disagree: %s / %s: C++ %.10g, NumPy %.10g\n",
                                        outputName(m, analytic.outputs[o]).c_str(),
                                        inputName(m, analytic.inputs[k]).c_str(), ours, cell.get<double>());
                        ++count;
                    }
                }
                compared = std::to_string(count);
                std::snprintf(buf, sizeof buf, "%.2g", worst);
                maxDiff = buf;
            } else {
                numpySeconds = "failed";
            }
        }
        char a[32], ac[32], c[32];
        std::snprintf(a, sizeof a, "%.4f s", ta.wall);
        std::snprintf(ac, sizeof ac, "%.4f s", ta.cpu);
        std::snprintf(c, sizeof c, "%.4f s", tc.wall);
        std::printf("%5zu %-10s %6zu %7zu %12s %12s %12s %12s %8s %9s %12s\n", n, std::string(bench::mixKey(mix)).c_str(),
                    analytic.inputs.size(), analytic.outputs.size(), a, ac, c, numpySeconds.c_str(), ratio.c_str(),
                    compared.c_str(), maxDiff.c_str());
        if (!analytic.methodNote.empty()) std::printf("      note: %s\n", analytic.methodNote.c_str());
        std::fflush(stdout);
    }
    std::printf("Times: median wall seconds of one call computing every elasticity (C++: computeElasticities; NumPy: "
                "numpy_elasticity.py after reading the folder, 2 dense solves per input, h = 1e-6). max |diff|: C++ analytic "
                "against NumPy central differences over the elasticities both define.\n");
    if (disagreements > 0) {
        std::printf("%d elasticities disagree by more than 1e-5 + 1e-5 relative\n", disagreements);
        return 1;
    }
    return 0;
}
