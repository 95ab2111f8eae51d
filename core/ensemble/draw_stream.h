// DrawStream: the random numbers of one ensemble draw, a pure function of (seed, draw
// index), so that a draw gives the same inputs whichever thread, slice or machine runs
// it (DESIGN.md 3.7: results do not depend on thread count; slices merge exactly).
//
// Generator: SplitMix64 (Steele, Lea & Flood 2014, "Fast splittable pseudorandom number
// generators", OOPSLA '14): state += golden gamma; output = finaliser(state). It is a
// counter-based generator: the k-th number of a stream is finaliser(start + k gamma). The
// start of draw d's stream is the finaliser applied to the seed and d, which decorrelates
// neighbouring draw indices (the finaliser is a bijection with full avalanche). Not a
// cryptographic generator; its moments are checked by input_distribution_test.
//
// Continuous variates (all deterministic given the stream; they use only +, *, /, sqrt,
// log, exp, pow of the C++ library, so one binary gives the same bits on every run):
//   uniform01   53 high bits / 2^53, in [0, 1)
//   normal      Marsaglia polar method (Marsaglia & Bray 1964 SIAM Rev 6:260)
//   gamma(a)    Marsaglia & Tsang 2000 (ACM TOMS 26:363); a < 1 by the boost
//               G(a) = G(a + 1) U^(1/a) of the same paper.
#pragma once

#include <cmath>
#include <cstdint>

namespace tl::ensemble {

inline constexpr std::uint64_t kGoldenGamma = 0x9e3779b97f4a7c15ULL;

// The SplitMix64 output function (a bijection of 64-bit words).
inline constexpr std::uint64_t splitMixFinalise(std::uint64_t z)
{
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    return z ^ (z >> 31);
}

class DrawStream {
public:
    // `purpose` separates independent uses of the same (seed, draw) (inputs, a pilot ...).
    DrawStream(std::uint64_t seed, std::uint64_t draw, std::uint64_t purpose = 0)
        : state_(splitMixFinalise(splitMixFinalise(seed + kGoldenGamma) ^ (draw * 0xd1b54a32d192ed03ULL) ^
                                  (purpose * 0xaef17502108ef2d9ULL)))
    {
    }

    std::uint64_t next()
    {
        state_ += kGoldenGamma;
        return splitMixFinalise(state_);
    }

    double uniform01() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }
    // In (0, 1]: for logarithms.
    double uniformOpen0() { return (static_cast<double>(next() >> 11) + 1.0) * 0x1.0p-53; }

    double normal()
    {
        for (;;) {
            const double u = 2.0 * uniform01() - 1.0;
            const double v = 2.0 * uniform01() - 1.0;
            const double s = u * u + v * v;
            if (s > 0.0 && s < 1.0) return u * std::sqrt(-2.0 * std::log(s) / s);  // the pair's second value is dropped
        }
    }

    // Gamma(shape a, scale 1), a > 0.
    double gamma(double a)
    {
        if (a < 1.0) return gamma(a + 1.0) * std::pow(uniformOpen0(), 1.0 / a);
        const double d = a - 1.0 / 3.0;
        const double c = 1.0 / std::sqrt(9.0 * d);
        for (;;) {
            double x, v;
            do {
                x = normal();
                v = 1.0 + c * x;
            } while (v <= 0.0);
            v = v * v * v;
            const double u = uniformOpen0();
            if (u < 1.0 - 0.0331 * (x * x) * (x * x)) return d * v;
            if (std::log(u) < 0.5 * x * x + d * (1.0 - v + std::log(v))) return d * v;
        }
    }

private:
    std::uint64_t state_;
};

}  // namespace tl::ensemble
