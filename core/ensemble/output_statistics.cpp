// Streaming, exactly mergeable statistics of one ensemble output; the scheme and its
// accuracy bound are described in the header.
#include "core/ensemble/output_statistics.h"

#include <algorithm>
#include <bit>
#include <cmath>
#include <limits>

namespace tl::ensemble {
namespace {

constexpr int kNegBeyond = 0;
constexpr int kNegWindow = 1;
constexpr int kNegTiny = 1 + OutputStatistics::kWindowBins;
constexpr int kZero = kNegTiny + 1;
constexpr int kPosTiny = kZero + 1;
constexpr int kPosWindow = kPosTiny + 1;
constexpr int kPosBeyond = kPosWindow + OutputStatistics::kWindowBins;
static_assert(kPosBeyond + 1 == OutputStatistics::kBinCount);

}  // namespace

int OutputStatistics::scaleExponentOf(double pointValue)
{
    if (!std::isfinite(pointValue) || pointValue == 0.0) return 0;
    int e = 0;
    std::frexp(std::abs(pointValue), &e);
    return e;
}

int OutputStatistics::binOf(double v) const
{
    // Fast path on the IEEE-754 fields (normal numbers): exponent e of frexp is the
    // biased exponent - 1022, the mantissa bin is the top 7 of the 52 fraction bits.
    const auto bits = std::bit_cast<std::uint64_t>(v);
    const int biased = static_cast<int>((bits >> 52) & 0x7ff);
    if (biased != 0 && biased != 0x7ff) {
        const int idx = biased - 1022 - (e0_ - kExponentsBelow);
        const bool negative = (bits >> 63) != 0;
        if (idx < 0) return negative ? kNegTiny : kPosTiny;
        if (idx >= kExponents) return negative ? kNegBeyond : kPosBeyond;
        const int mb = static_cast<int>((bits >> (52 - kMantissaBits)) & (kBinsPerExponent - 1));
        if (!negative) return kPosWindow + idx * kBinsPerExponent + mb;
        return kNegWindow + (kExponents - 1 - idx) * kBinsPerExponent + (kBinsPerExponent - 1 - mb);
    }
    if (v == 0.0) return kZero;
    const bool negative = v < 0.0;
    const double a = std::abs(v);
    if (std::isinf(a)) return negative ? kNegBeyond : kPosBeyond;
    int e = 0;
    const double m = std::frexp(a, &e);  // a = m 2^e, m in [0.5, 1)
    const int idx = e - (e0_ - kExponentsBelow);
    if (idx < 0) return negative ? kNegTiny : kPosTiny;
    if (idx >= kExponents) return negative ? kNegBeyond : kPosBeyond;
    const int mb = static_cast<int>((m - 0.5) * (2 * kBinsPerExponent));  // exact: m - 0.5 loses no bit
    if (!negative) return kPosWindow + idx * kBinsPerExponent + mb;
    return kNegWindow + (kExponents - 1 - idx) * kBinsPerExponent + (kBinsPerExponent - 1 - mb);
}

std::pair<double, double> OutputStatistics::binRange(int bin) const
{
    const double inf = std::numeric_limits<double>::infinity();
    const double tiny = std::ldexp(0.5, e0_ - kExponentsBelow);
    const double beyond = std::ldexp(0.5, e0_ + kExponentsAbove);
    auto positive = [&](int idx, int mb) {
        const int e = e0_ - kExponentsBelow + idx;
        return std::pair{std::ldexp(0.5 + mb / double(2 * kBinsPerExponent), e),
                         std::ldexp(0.5 + (mb + 1) / double(2 * kBinsPerExponent), e)};
    };
    if (bin == kNegBeyond) return {-inf, -beyond};
    if (bin == kNegTiny) return {-tiny, 0.0};
    if (bin == kZero) return {0.0, 0.0};
    if (bin == kPosTiny) return {0.0, tiny};
    if (bin == kPosBeyond) return {beyond, inf};
    if (bin >= kPosWindow) {
        const int k = bin - kPosWindow;
        return positive(k / kBinsPerExponent, k % kBinsPerExponent);
    }
    const int k = bin - kNegWindow;
    const auto [lo, hi] = positive(kExponents - 1 - k / kBinsPerExponent, kBinsPerExponent - 1 - k % kBinsPerExponent);
    return {-hi, -lo};
}

std::uint64_t& OutputStatistics::binRef(int bin)
{
    const int block = bin / kBinsPerExponent;
    if (blockOf_[static_cast<std::size_t>(block)] < 0) {
        blockOf_[static_cast<std::size_t>(block)] = static_cast<std::int16_t>(blocks_.size() / kBinsPerExponent);
        blocks_.resize(blocks_.size() + kBinsPerExponent, 0);
    }
    return blocks_[static_cast<std::size_t>(blockOf_[static_cast<std::size_t>(block)]) * kBinsPerExponent +
                   static_cast<std::size_t>(bin % kBinsPerExponent)];
}

std::uint64_t OutputStatistics::binCount(int bin) const
{
    const std::int16_t b = blockOf_[static_cast<std::size_t>(bin / kBinsPerExponent)];
    return b < 0 ? 0 : blocks_[static_cast<std::size_t>(b) * kBinsPerExponent + static_cast<std::size_t>(bin % kBinsPerExponent)];
}

void OutputStatistics::add(double v)
{
    if (std::isnan(v)) {
        ++nan_;
        return;
    }
    v += 0.0;  // -0 becomes +0, so that min and max do not depend on the order of equal values
    if (count_ == 0) {
        min_ = max_ = v;
    } else {
        min_ = std::min(min_, v);
        max_ = std::max(max_, v);
    }
    ++count_;
    ++binRef(binOf(v));
    const double scaled = v * scale_;  // a power of two: exact, as ldexp(v, 50 - e0)
    if (std::abs(scaled) < 0x1.0p62) {
        sum_ += static_cast<Int128>(std::llrint(scaled));  // round to nearest even, as nearbyint
        return;
    }
    const double x = std::nearbyint(std::ldexp(v, kFixedPointBits - e0_));
    if (std::abs(x) < 0x1.0p100)
        sum_ += static_cast<Int128>(x);
    else
        ++saturated_;
}

bool OutputStatistics::merge(const OutputStatistics& o)
{
    if (o.e0_ != e0_) return false;
    if (o.count_ > 0) {
        min_ = count_ == 0 ? o.min_ : std::min(min_, o.min_);
        max_ = count_ == 0 ? o.max_ : std::max(max_, o.max_);
    }
    count_ += o.count_;
    nan_ += o.nan_;
    saturated_ += o.saturated_;
    sum_ += o.sum_;
    for (int block = 0; block < kBlocks; ++block) {
        const std::int16_t b = o.blockOf_[static_cast<std::size_t>(block)];
        if (b < 0) continue;
        for (int k = 0; k < kBinsPerExponent; ++k) {
            const std::uint64_t c = o.blocks_[static_cast<std::size_t>(b) * kBinsPerExponent + static_cast<std::size_t>(k)];
            if (c) binRef(block * kBinsPerExponent + k) += c;
        }
    }
    return true;
}

std::optional<double> OutputStatistics::percentile(int perMille, bool* outOfWindow) const
{
    if (count_ == 0) return std::nullopt;
    const std::uint64_t rank = std::max<std::uint64_t>(1, (static_cast<std::uint64_t>(perMille) * count_ + 999) / 1000);
    std::uint64_t before = 0;
    for (int block = 0; block < kBlocks; ++block) {
        const std::int16_t b = blockOf_[static_cast<std::size_t>(block)];
        if (b < 0) continue;
        for (int k = 0; k < kBinsPerExponent; ++k) {
            const std::uint64_t c = blocks_[static_cast<std::size_t>(b) * kBinsPerExponent + static_cast<std::size_t>(k)];
            if (before + c < rank) {
                before += c;
                continue;
            }
            const int bin = block * kBinsPerExponent + k;
            const auto [lo, hi] = binRange(bin);
            const double low = std::max(lo, min_), high = std::min(hi, max_);
            const bool inWindow = (bin >= kNegWindow && bin < kNegTiny) || (bin >= kPosWindow && bin < kPosBeyond);
            if (!inWindow && bin != kZero && outOfWindow) *outOfWindow = true;
            if (!inWindow) return bin < kZero ? (bin == kNegBeyond ? low : high) : (bin == kPosBeyond ? high : low);
            const double t = (static_cast<double>(rank - before) - 0.5) / static_cast<double>(c);
            return std::clamp(lo + t * (hi - lo), low, high);
        }
    }
    return max_;  // not reached: the counts add up to count_
}

std::optional<double> OutputStatistics::mean() const
{
    if (count_ == 0 || saturated_ > 0) return std::nullopt;
    return std::ldexp(static_cast<double>(sum_) / static_cast<double>(count_), e0_ - kFixedPointBits);
}

PercentileSummary OutputStatistics::summary() const
{
    PercentileSummary s;
    s.p2_5 = percentile(25, &s.outOfWindow);
    s.p25 = percentile(250, &s.outOfWindow);
    s.p50 = percentile(500, &s.outOfWindow);
    s.p75 = percentile(750, &s.outOfWindow);
    s.p97_5 = percentile(975, &s.outOfWindow);
    s.mean = mean();
    return s;
}

std::vector<std::pair<int, std::uint64_t>> OutputStatistics::nonZeroBins() const
{
    std::vector<std::pair<int, std::uint64_t>> out;
    for (int bin = 0; bin < kBinCount; ++bin)
        if (const std::uint64_t c = binCount(bin)) out.emplace_back(bin, c);
    return out;
}

std::optional<OutputStatistics> OutputStatistics::fromParts(int scaleExponent, std::uint64_t count, std::uint64_t nan,
                                                            std::uint64_t saturated, double min, double max, Int128 sum,
                                                            const std::vector<std::pair<int, std::uint64_t>>& bins)
{
    OutputStatistics s(scaleExponent);
    std::uint64_t total = 0;
    int previous = -1;
    for (const auto& [bin, c] : bins) {
        if (bin <= previous || bin >= kBinCount || c == 0) return std::nullopt;
        previous = bin;
        s.binRef(bin) = c;
        total += c;
    }
    if (total != count || saturated > count || (count > 0 && !(min <= max))) return std::nullopt;
    s.count_ = count;
    s.nan_ = nan;
    s.saturated_ = saturated;
    s.min_ = count ? min : 0.0;
    s.max_ = count ? max : 0.0;
    s.sum_ = sum;
    return s;
}

bool OutputStatistics::operator==(const OutputStatistics& o) const
{
    return e0_ == o.e0_ && count_ == o.count_ && nan_ == o.nan_ && saturated_ == o.saturated_ && sum_ == o.sum_ &&
           std::bit_cast<std::uint64_t>(min_) == std::bit_cast<std::uint64_t>(o.min_) &&
           std::bit_cast<std::uint64_t>(max_) == std::bit_cast<std::uint64_t>(o.max_) && nonZeroBins() == o.nonZeroBins();
}

std::string int128ToString(Int128 v)
{
    const bool negative = v < 0;
    UInt128 u = negative ? static_cast<UInt128>(0) - static_cast<UInt128>(v)
                                   : static_cast<UInt128>(v);
    std::string digits;
    do {
        digits.push_back(static_cast<char>('0' + static_cast<int>(u % 10)));
        u /= 10;
    } while (u != 0);
    if (negative) digits.push_back('-');
    return std::string(digits.rbegin(), digits.rend());
}

std::optional<Int128> int128FromString(const std::string& s)
{
    std::size_t k = 0;
    const bool negative = !s.empty() && s[0] == '-';
    if (negative) k = 1;
    if (k >= s.size() || s.size() - k > 39) return std::nullopt;
    UInt128 u = 0;
    const UInt128 limit = static_cast<UInt128>(1) << 127;
    for (; k < s.size(); ++k) {
        if (s[k] < '0' || s[k] > '9') return std::nullopt;
        u = u * 10 + static_cast<unsigned>(s[k] - '0');
        if (u > limit) return std::nullopt;
    }
    if (!negative && u == limit) return std::nullopt;
    return negative ? static_cast<Int128>(static_cast<UInt128>(0) - u) : static_cast<Int128>(u);
}

}  // namespace tl::ensemble
