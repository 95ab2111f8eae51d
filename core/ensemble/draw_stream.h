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
//   normal      ziggurat method with 128 layers (Marsaglia & Tsang 2000 J Stat Softw
//               5(8)) in the form of Doornik 2005 ("An improved ziggurat method to
//               generate normal random samples"): the layer from 7 low bits and the
//               uniform from the 53 high bits of one 64-bit number, so they are
//               independent; the tail beyond R by Marsaglia's 1964 method. Constants
//               R = 3.442619855899, V = 9.91256303526217e-3 from those papers (from
//               memory; the test checks the normal's quantiles and moments). A profile of
//               the ensemble put a third of its time in the logarithms of the polar method
//               used before.
//   gamma(a)    Marsaglia & Tsang 2000 (ACM TOMS 26:363); a < 1 by the boost
//               G(a) = G(a + 1) U^(1/a) of the same paper.
#pragma once

#include <cmath>
#include <cstdint>

namespace tl::ensemble {

// Layers of the ziggurat (computed once at start-up).
struct ZigguratTables {
    static constexpr int kLayers = 128;
    static constexpr double kR = 3.442619855899;
    static constexpr double kV = 9.91256303526217e-3;
    double x[kLayers + 1];  // x[0] = V / f(R) (the base strip), x[1] = R, ..., x[128] = 0
    double ratio[kLayers];  // x[i + 1] / x[i]
    ZigguratTables()
    {
        double f = std::exp(-0.5 * kR * kR);
        x[0] = kV / f;
        x[1] = kR;
        x[kLayers] = 0.0;
        for (int i = 2; i < kLayers; ++i) {
            x[i] = std::sqrt(-2.0 * std::log(kV / x[i - 1] + f));
            f = std::exp(-0.5 * x[i] * x[i]);
        }
        for (int i = 0; i < kLayers; ++i) ratio[i] = x[i + 1] / x[i];
    }
};
inline const ZigguratTables kZiggurat;

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
        const ZigguratTables& z = kZiggurat;
        for (;;) {
            const std::uint64_t bits = next();
            const double u = 2.0 * (static_cast<double>(bits >> 11) * 0x1.0p-53) - 1.0;
            const int i = static_cast<int>(bits & 0x7f);
            if (std::abs(u) < z.ratio[i]) return u * z.x[i];  // inside the layer's rectangle
            if (i == 0) {  // the base strip's tail beyond R (Marsaglia 1964)
                double x, y;
                do {
                    x = std::log(uniformOpen0()) / ZigguratTables::kR;
                    y = std::log(uniformOpen0());
                } while (-2.0 * y < x * x);
                return u < 0.0 ? x - ZigguratTables::kR : ZigguratTables::kR - x;
            }
            const double x = u * z.x[i];  // the wedge: accept under the curve
            const double f0 = std::exp(-0.5 * (z.x[i] * z.x[i] - x * x));
            const double f1 = std::exp(-0.5 * (z.x[i + 1] * z.x[i + 1] - x * x));
            if (f1 + uniform01() * (f0 - f1) < 1.0) return x;
        }
    }

    // Gamma(shape a, scale 1), a > 0.
    double gamma(double a) { return gamma(GammaShape(a)); }

    // The constants of Marsaglia & Tsang's method for one shape, computed once for a
    // shape drawn again and again (Dirichlet rows).
    struct GammaShape {
        double d = 0, c = 0, inverseA = 0;  // inverseA: 1/a when a < 1 (the boost), else 0
        GammaShape() = default;
        explicit GammaShape(double a)
        {
            const double b = a < 1.0 ? a + 1.0 : a;
            d = b - 1.0 / 3.0;
            c = 1.0 / std::sqrt(9.0 * d);
            inverseA = a < 1.0 ? 1.0 / a : 0.0;
        }
    };

    double gamma(const GammaShape& g)
    {
        const double value = gammaAtLeastOne(g.d, g.c);
        return g.inverseA == 0.0 ? value : value * std::pow(uniformOpen0(), g.inverseA);
    }

private:
    double gammaAtLeastOne(double d, double c)
    {
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

    std::uint64_t state_;
};

}  // namespace tl::ensemble
