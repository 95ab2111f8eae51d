#include "core/io/impact_colour_ramp.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>

namespace tl {
namespace {

// From 0 outwards to the strongest impact (the darkest class of the scheme is left out:
// values written on it would need more contrast than small cells give).
constexpr std::array<std::uint32_t, 5> kPurples = {0xffffff, 0xe7d4e8, 0xc2a5cf, 0x9970ab, 0x762a83};
constexpr std::array<std::uint32_t, 5> kGreens = {0xffffff, 0xd9f0d3, 0xa6dba0, 0x5aae61, 0x1b7837};

std::uint8_t channel(std::uint32_t a, std::uint32_t b, int shift, double t)
{
    const double lo = static_cast<double>((a >> shift) & 0xffu), hi = static_cast<double>((b >> shift) & 0xffu);
    return static_cast<std::uint8_t>(std::lround(lo + (hi - lo) * t));
}

}  // namespace

RampColour impactRampColour(double value, double range)
{
    if (!std::isfinite(value) || !(range > 0) || !std::isfinite(range) || value == 0) return {};
    const double t = std::min(1.0, std::abs(value) / range) * static_cast<double>(kPurples.size() - 1);
    const auto& ramp = value < 0 ? kPurples : kGreens;
    const std::size_t k = std::min<std::size_t>(static_cast<std::size_t>(t), ramp.size() - 2);
    const double f = t - static_cast<double>(k);
    return {channel(ramp[k], ramp[k + 1], 16, f), channel(ramp[k], ramp[k + 1], 8, f), channel(ramp[k], ramp[k + 1], 0, f)};
}

std::string hexColour(RampColour c)
{
    char text[8];
    std::snprintf(text, sizeof text, "#%02x%02x%02x", static_cast<unsigned>(c.red), static_cast<unsigned>(c.green),
                  static_cast<unsigned>(c.blue));
    return text;
}

}  // namespace tl
