// tl_make_synthetic: writes a synthetic benchmark model (synthetic_model.h; invented
// numbers) as a CSV model folder through the project's own writer (core/io/csv_model.h).
//   tl_make_synthetic --size N --mix ee|ee-biomass|ee-qb-pq --seed S --out DIR [--truth]
// --truth writes the model with every value given instead of the mix's unknowns.
#include <cstdio>
#include <cstdlib>
#include <string>
#include <string_view>

#include "core/io/csv_model.h"
#include "tests/bench/synthetic_model.h"

namespace {

int usage(const char* why)
{
    std::fprintf(stderr,
                 "tl_make_synthetic: %s\n"
                 "usage: tl_make_synthetic --size N --mix ee|ee-biomass|ee-qb-pq --seed S --out DIR [--truth]\n",
                 why);
    return 2;
}

}  // namespace

int main(int argc, char** argv)
{
    std::size_t size = 0;
    std::uint64_t seed = 1;
    std::optional<tl::bench::UnknownMix> mix = tl::bench::UnknownMix::EE;
    std::string out;
    bool truth = false;
    for (int a = 1; a < argc; ++a) {
        const std::string_view arg = argv[a];
        const bool hasValue = a + 1 < argc;
        if (arg == "--truth") truth = true;
        else if (arg == "--size" && hasValue) size = std::strtoull(argv[++a], nullptr, 10);
        else if (arg == "--seed" && hasValue) seed = std::strtoull(argv[++a], nullptr, 10);
        else if (arg == "--mix" && hasValue) mix = tl::bench::parseMix(argv[++a]);
        else if (arg == "--out" && hasValue) out = argv[++a];
        else return usage(("unexpected argument '" + std::string(arg) + "'").c_str());
    }
    if (size < 10) return usage("--size must be at least 10");
    if (!mix) return usage("--mix must be ee, ee-biomass or ee-qb-pq");
    if (out.empty()) return usage("--out DIR is required");

    const tl::bench::SyntheticModel s = tl::bench::syntheticModel(size, *mix, seed);
    const tl::Problems problems = tl::writeCsvModel(truth ? s.truth : s.model, out);
    for (const tl::Problem& p : problems) std::fprintf(stderr, "%s\n", p.describe().c_str());
    if (tl::hasErrors(problems)) return 1;
    std::printf("%s: %zu compartments, mix %s, seed %llu: %zu equations, %zu unknowns "
                "(EE %zu, B %zu, Q/B %zu, P/Q for P/B %zu, P/Q for Q/B %zu, fully given %zu)\n",
                out.c_str(), size, std::string(tl::bench::mixKey(*mix)).c_str(), static_cast<unsigned long long>(seed),
                s.expectedEquations, s.expectedUnknowns, s.hiddenEE, s.hiddenBiomass, s.hiddenQB, s.pbFromPQ, s.qbFromPQ,
                s.fullyGiven);
    return 0;
}
