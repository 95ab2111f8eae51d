#include "core/model/text.h"

#include <gtest/gtest.h>

#include <random>

namespace tl {
namespace {

TEST(ParseNumber, AcceptsDecimalAndExponentForms)
{
    EXPECT_EQ(parseNumber("12.5"), 12.5);
    EXPECT_EQ(parseNumber(" 1e-3 "), 1e-3);
    EXPECT_EQ(parseNumber("+4"), 4.0);
    EXPECT_EQ(parseNumber("-0.25"), -0.25);
}

TEST(ParseNumber, RejectsTextNanInfAndCommaDecimal)
{
    for (const char* bad : {"", " ", "abc", "nan", "NaN", "inf", "-inf", "1,5", "1.5x", "0x10", "1e999"})
        EXPECT_EQ(parseNumber(bad), std::nullopt) << bad;
}

TEST(FormatNumber, RoundTripsExactly)
{
    std::mt19937_64 rng(42);
    std::uniform_real_distribution<double> u(-1e6, 1e6);
    for (int k = 0; k < 1000; ++k) {
        const double v = u(rng) * std::pow(10.0, static_cast<int>(rng() % 20) - 10);
        ASSERT_EQ(parseNumber(formatNumber(v)), v);
    }
    EXPECT_EQ(formatNumber(0.1), "0.1");
    EXPECT_EQ(formatNumber(2.0), "2");
    EXPECT_EQ(formatNumber(20.0), "20");
    EXPECT_EQ(formatNumber(150000.0), "150000");
    EXPECT_EQ(formatNumber(0.00025), "0.00025");
    EXPECT_EQ(formatNumber(-1.5e-9), "-1.5e-09");
}

}  // namespace
}  // namespace tl
