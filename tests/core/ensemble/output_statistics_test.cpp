// Streaming statistics of an ensemble output (core/ensemble/output_statistics.h):
// percentiles within the stated bound of the exact sample percentiles, the mean of the
// fixed-point sum, and merges that give the same bits in any order.
#include <algorithm>
#include <cmath>
#include <vector>

#include <gtest/gtest.h>

#include "core/ensemble/draw_stream.h"
#include "core/ensemble/output_statistics.h"

namespace tl::ensemble {
namespace {

std::vector<double> lognormalSample(std::size_t n, double mu, double s, std::uint64_t seed)
{
    std::vector<double> x(n);
    for (std::size_t k = 0; k < n; ++k) {
        DrawStream d(seed, k);
        x[k] = std::exp(mu + s * d.normal());
    }
    return x;
}

// Nearest-rank percentile (Hyndman & Fan 1996, definition 1) of the sorted sample.
double nearestRank(std::vector<double> x, int perMille)
{
    std::sort(x.begin(), x.end());
    const std::size_t n = x.size();
    const std::size_t rank = std::max<std::size_t>(1, (static_cast<std::size_t>(perMille) * n + 999) / 1000);
    return x[rank - 1];
}

TEST(OutputStatistics, PercentilesLieWithinOneBinOfTheExactSamplePercentiles)
{
    for (double scale : {1e-4, 0.37, 1.0, 2500.0}) {
        std::vector<double> x = lognormalSample(20001, 0.0, 0.6, 3);
        for (double& v : x) v *= scale;
        OutputStatistics s(OutputStatistics::scaleExponentOf(scale));
        for (double v : x) s.add(v);
        for (int pm : {25, 250, 500, 750, 975}) {
            const double exact = nearestRank(x, pm);
            const double got = *s.percentile(pm);
            // Stated bound: relative error at most 2^-7 (the bin width relative to its values).
            EXPECT_LE(std::abs(got - exact), std::abs(exact) / 128.0) << "scale " << scale << " per mille " << pm;
            const auto [lo, hi] = s.binRange(s.binOf(exact));
            EXPECT_TRUE(got >= lo && got <= hi) << "same bin as the exact percentile";
        }
        double sum = 0;
        for (double v : x) sum += v;
        EXPECT_NEAR(*s.mean(), sum / static_cast<double>(x.size()), 1e-12 * std::abs(sum / static_cast<double>(x.size())));
        EXPECT_EQ(s.min(), *std::min_element(x.begin(), x.end()));
        EXPECT_EQ(s.max(), *std::max_element(x.begin(), x.end()));
    }
}

TEST(OutputStatistics, NegativeZeroAndOutOfWindowValuesAreOrderedAndFlagged)
{
    OutputStatistics s(0);
    for (double v : {-3.0, -0.5, 0.0, -0.0, 0.25, 1e-30, 1e30, 2.0}) s.add(v);
    s.add(std::nan(""));
    EXPECT_EQ(s.count(), 8u);
    EXPECT_EQ(s.nanCount(), 1u);
    EXPECT_EQ(*s.percentile(500), 0.0);
    EXPECT_EQ(s.min(), -3.0);
    EXPECT_EQ(s.max(), 1e30);
    bool out = false;
    EXPECT_EQ(*s.percentile(1000, &out), 1e30);
    EXPECT_TRUE(out);
    // Bins are in increasing value order.
    double previous = -INFINITY;
    for (const auto& [bin, c] : s.nonZeroBins()) {
        const auto [lo, hi] = s.binRange(bin);
        EXPECT_GE(lo, previous);
        previous = lo;
        (void)c;
        (void)hi;
    }
}

TEST(OutputStatistics, AnySplitMergesToTheSameBits)
{
    const std::vector<double> x = lognormalSample(5000, 1.0, 1.2, 11);
    const int e0 = OutputStatistics::scaleExponentOf(2.7);
    OutputStatistics whole(e0);
    for (double v : x) whole.add(v);
    for (std::size_t cut : {0u, 1u, 1234u, 4999u}) {
        OutputStatistics a(e0), b(e0);
        for (std::size_t k = 0; k < x.size(); ++k) (k < cut ? a : b).add(x[k]);
        OutputStatistics ab = a, ba = b;
        ASSERT_TRUE(ab.merge(b));
        ASSERT_TRUE(ba.merge(a));
        EXPECT_TRUE(ab == whole) << "cut " << cut;
        EXPECT_TRUE(ba == whole) << "cut " << cut;
        EXPECT_EQ(*ab.mean(), *whole.mean());
        EXPECT_EQ(*ba.percentile(25), *whole.percentile(25));
    }
    OutputStatistics other(e0 + 1);
    EXPECT_FALSE(other.merge(whole)) << "different scales cannot merge";
}

TEST(OutputStatistics, PartsRoundTripAndInt128Text)
{
    OutputStatistics s(3);
    for (double v : lognormalSample(300, 2.0, 0.3, 5)) s.add(v);
    const auto back = OutputStatistics::fromParts(s.scaleExponent(), s.count(), s.nanCount(), s.saturated(), s.min(),
                                                  s.max(), s.fixedSum(), s.nonZeroBins());
    ASSERT_TRUE(back);
    EXPECT_TRUE(*back == s);
    auto bins = s.nonZeroBins();
    bins.back().second += 1;
    EXPECT_FALSE(OutputStatistics::fromParts(3, s.count(), 0, 0, s.min(), s.max(), s.fixedSum(), bins))
        << "bins that do not add up to the count are refused";
    for (Int128 v : {Int128(0), Int128(-1), Int128(1234567890123456789LL) * 1000000007, -(Int128(1) << 126)}) {
        EXPECT_TRUE(int128FromString(int128ToString(v)) == v) << int128ToString(v);
    }
    EXPECT_FALSE(int128FromString("12a"));
    EXPECT_FALSE(int128FromString(""));
    EXPECT_FALSE(int128FromString("-"));
}

}  // namespace
}  // namespace tl::ensemble
