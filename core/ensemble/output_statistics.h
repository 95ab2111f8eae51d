// OutputStatistics: the streaming, exactly mergeable summary of one ensemble output
// (DESIGN.md 3.7): count, mean, min, max and a histogram from which the percentiles
// (2.5, 25, 50, 75, 97.5) are read. Memory does not grow with the number of draws.
//
// Why not P^2 or a t-digest: their state depends on the order of the values, so two
// slices of an ensemble could not be merged into exactly the one-run result. Here every
// part of the state is merged by integer addition or by min / max, which are associative
// and commutative, so any split of the draws (threads, slices, machines) merges to the
// same bits.
//
//   Histogram  fixed bins on the IEEE-754 representation: a bin is one binary exponent
//              and the top 7 bits of the mantissa, so each bin spans at most 2^-7 (0.78 %)
//              of the values in it. The exponents kept in bins run from e0 - 20 to
//              e0 + 19, e0 the exponent of the output's point estimate (or 0), i.e.
//              magnitudes from about 1e-6 to 5e5 times the point value; smaller and
//              larger magnitudes, zero and each sign have one bin each. Bins are stored
//              in blocks of 128, allocated when first used (a typical output touches a
//              handful).
//   Percentile p: the nearest-rank sample percentile, rank r = ceil(p n) of the n values
//              (Hyndman & Fan 1996 Am Stat 50:361, definition 1), located exactly in its
//              bin by the counts, then interpolated linearly inside the bin and clamped
//              to the exact min and max. Accuracy bound: the reported value lies in the
//              same bin as the exact sample percentile, so its relative error is at most
//              2^-7 (0.78 %) inside the exponent window; a percentile that falls in an
//              out-of-window bin is reported as that bin's bound clamped to min / max and
//              flagged (outOfWindow()).
//   Mean       the sum kept in fixed point: each value rounded to a multiple of
//              2^(e0 - 50) (about 1e-15 of the point value) and added into a 128-bit
//              integer; a value too large for that (beyond 2^(e0 + 50)) is counted as
//              saturated and the mean is then reported as not available.
// NaN values (an undefined trophic level, say) are counted apart and left out of both.
#pragma once

#include <array>
#include <cmath>
#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace tl::ensemble {

// GCC/Clang's 128-bit integers (__extension__: not ISO C++, so -Wpedantic would warn).
__extension__ typedef __int128 Int128;
__extension__ typedef unsigned __int128 UInt128;

struct PercentileSummary {
    std::optional<double> p2_5, p25, p50, p75, p97_5, mean;
    bool outOfWindow = false;  // some percentile fell outside the exponent window
};

class OutputStatistics {
public:
    static constexpr int kMantissaBits = 7;
    static constexpr int kBinsPerExponent = 1 << kMantissaBits;
    static constexpr int kExponentsBelow = 20, kExponentsAbove = 20;  // around e0
    static constexpr int kExponents = kExponentsBelow + kExponentsAbove;
    static constexpr int kWindowBins = kExponents * kBinsPerExponent;
    // Global bin order (increasing value): negative beyond window, negative window
    // (largest magnitude first), negative tiny, zero, positive tiny, positive window,
    // positive beyond window.
    static constexpr int kBinCount = 2 * kWindowBins + 5;
    static constexpr int kFixedPointBits = 50;   // quantum 2^(e0 - 50)
    static constexpr int kSaturationBits = 100;  // |v| 2^(50 - e0) below 2^100 is summed

    OutputStatistics() = default;
    // e0: binary exponent of the point estimate (frexp); see scaleExponentOf.
    explicit OutputStatistics(int scaleExponent)
        : e0_(scaleExponent), scale_(std::ldexp(1.0, kFixedPointBits - scaleExponent)) {}
    static int scaleExponentOf(double pointValue);

    void add(double v);
    // Adds another output's statistics (same scale exponent required; returns false if not).
    bool merge(const OutputStatistics& other);

    int scaleExponent() const { return e0_; }
    std::uint64_t count() const { return count_; }  // values counted (NaN excluded)
    std::uint64_t nanCount() const { return nan_; }
    std::uint64_t saturated() const { return saturated_; }
    double min() const { return min_; }
    double max() const { return max_; }
    Int128 fixedSum() const { return sum_; }

    PercentileSummary summary() const;
    // The percentile at rank ceil(perMille n / 1000) (perMille: 25 for 2.5 %).
    std::optional<double> percentile(int perMille, bool* outOfWindow = nullptr) const;
    std::optional<double> mean() const;

    // Bin of a value and the value range [low, high] of a bin, for this scale.
    int binOf(double v) const;
    std::pair<double, double> binRange(int bin) const;
    // Non-zero bins in increasing order, for the partial result.
    std::vector<std::pair<int, std::uint64_t>> nonZeroBins() const;
    // Rebuilds statistics from a partial result (the inverse of the accessors above).
    static std::optional<OutputStatistics> fromParts(int scaleExponent, std::uint64_t count, std::uint64_t nan,
                                                     std::uint64_t saturated, double min, double max, Int128 sum,
                                                     const std::vector<std::pair<int, std::uint64_t>>& bins);

    bool operator==(const OutputStatistics& o) const;

private:
    std::uint64_t& binRef(int bin);
    std::uint64_t binCount(int bin) const;

    int e0_ = 0;
    double scale_ = 0x1.0p50;  // 2^(50 - e0): exact, so v * scale_ == ldexp(v, 50 - e0)
    std::uint64_t count_ = 0, nan_ = 0, saturated_ = 0;
    double min_ = 0.0, max_ = 0.0;
    Int128 sum_ = 0;
    static constexpr int kBlocks = (kBinCount + kBinsPerExponent - 1) / kBinsPerExponent;
    std::array<std::int16_t, kBlocks> blockOf_ = make_unset();
    std::vector<std::uint64_t> blocks_;  // kBinsPerExponent counts per allocated block

    static constexpr std::array<std::int16_t, kBlocks> make_unset()
    {
        std::array<std::int16_t, kBlocks> a{};
        for (auto& x : a) x = -1;
        return a;
    }
};

// Decimal text of a 128-bit integer and back (JSON has no 128-bit numbers).
std::string int128ToString(Int128 v);
std::optional<Int128> int128FromString(const std::string& s);

}  // namespace tl::ensemble
