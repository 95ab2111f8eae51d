// The impact matrix's colour ramp (core/io/impact_colour_ramp.h), shared by the
// workbench's impact table and the report's SVG. Anchor colours: ColorBrewer PRGn
// (Brewer, Hatchard & Harrower 2003; hex values recalled from memory).
#include <gtest/gtest.h>

#include <cmath>
#include <limits>

#include "core/io/impact_colour_ramp.h"

namespace tl {
namespace {

constexpr RampColour kWhite{255, 255, 255};

TEST(ImpactColourRamp, ZeroNanInfiniteAndEmptyRangeAreWhite)
{
    EXPECT_EQ(impactRampColour(0.0, 1.0), kWhite);
    EXPECT_EQ(impactRampColour(std::nan(""), 1.0), kWhite);
    EXPECT_EQ(impactRampColour(std::numeric_limits<double>::infinity(), 1.0), kWhite);
    EXPECT_EQ(impactRampColour(0.5, 0.0), kWhite);
    EXPECT_EQ(impactRampColour(0.5, -1.0), kWhite);
    EXPECT_EQ(impactRampColour(0.5, std::nan("")), kWhite);
}

TEST(ImpactColourRamp, EndsAndClassBoundariesAreTheSchemeColours)
{
    EXPECT_EQ(hexColour(impactRampColour(-1.0, 1.0)), "#762a83");
    EXPECT_EQ(hexColour(impactRampColour(1.0, 1.0)), "#1b7837");
    EXPECT_EQ(hexColour(impactRampColour(-0.25, 1.0)), "#e7d4e8");
    EXPECT_EQ(hexColour(impactRampColour(0.5, 1.0)), "#a6dba0");
    EXPECT_EQ(hexColour(impactRampColour(0.75, 1.0)), "#5aae61");
    // Beyond the range: clamped to the end colour.
    EXPECT_EQ(impactRampColour(-7.0, 1.0), impactRampColour(-1.0, 1.0));
    EXPECT_EQ(impactRampColour(7.0, 1.0), impactRampColour(1.0, 1.0));
}

TEST(ImpactColourRamp, LinearBetweenClassesAndOnlyTheRatioMatters)
{
    // Half way from white to #d9f0d3: (255+217)/2, (255+240)/2 rounded away from 0, (255+211)/2.
    EXPECT_EQ(impactRampColour(0.125, 1.0), (RampColour{236, 248, 233}));
    EXPECT_EQ(impactRampColour(0.5, 2.0), impactRampColour(0.25, 1.0));
    EXPECT_EQ(impactRampColour(-3.0, 12.0), impactRampColour(-0.25, 1.0));
}

TEST(ImpactColourRamp, DarkerWithStrengthAndSignByHue)
{
    const auto lightness = [](RampColour c) { return int(c.red) + int(c.green) + int(c.blue); };
    for (double v : {0.1, 0.3, 0.6, 0.9}) {
        const RampColour neg = impactRampColour(-v, 1.0), pos = impactRampColour(v, 1.0);
        EXPECT_GT(neg.red, neg.green) << v;   // purple: red and blue over green
        EXPECT_GT(neg.blue, neg.green) << v;
        EXPECT_GT(pos.green, pos.red) << v;   // green over red and blue
        EXPECT_GT(pos.green, pos.blue) << v;
        EXPECT_LT(lightness(impactRampColour(-(v + 0.05), 1.0)), lightness(neg)) << v;
        EXPECT_LT(lightness(impactRampColour(v + 0.05, 1.0)), lightness(pos)) << v;
    }
}

TEST(ImpactColourRamp, HexIsLowerCaseSixDigits)
{
    EXPECT_EQ(hexColour({0, 10, 255}), "#000aff");
    EXPECT_EQ(hexColour(kWhite), "#ffffff");
}

}  // namespace
}  // namespace tl
