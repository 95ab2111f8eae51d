#include "ui/analysis/impact_colour_map.h"

#include <array>
#include <cmath>

namespace tl::ui {
namespace {

// From 0 outwards to the strongest impact (the darkest class of the scheme is left out:
// values written on it would need more contrast than small cells give).
constexpr std::array<QRgb, 5> kPurples = {0xffffff, 0xe7d4e8, 0xc2a5cf, 0x9970ab, 0x762a83};
constexpr std::array<QRgb, 5> kGreens = {0xffffff, 0xd9f0d3, 0xa6dba0, 0x5aae61, 0x1b7837};

QColor mix(QRgb a, QRgb b, double t)
{
    const auto lerp = [t](int x, int y) { return static_cast<int>(std::lround(x + (y - x) * t)); };
    return QColor(lerp(qRed(a), qRed(b)), lerp(qGreen(a), qGreen(b)), lerp(qBlue(a), qBlue(b)));
}

}  // namespace

QColor impactColour(double value, double range)
{
    if (!std::isfinite(value) || !(range > 0) || value == 0) return Qt::white;
    const double t = std::min(1.0, std::abs(value) / range) * (kPurples.size() - 1);
    const auto& ramp = value < 0 ? kPurples : kGreens;
    const std::size_t k = std::min<std::size_t>(static_cast<std::size_t>(t), ramp.size() - 2);
    return mix(ramp[k], ramp[k + 1], t - static_cast<double>(k));
}

QColor textColourOn(const QColor& background)
{
    const double luminance = 0.299 * background.redF() + 0.587 * background.greenF() + 0.114 * background.blueF();
    return luminance > 0.55 ? Qt::black : Qt::white;
}

}  // namespace tl::ui
