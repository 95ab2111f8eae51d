#include "core/model/text.h"

#include <charconv>
#include <cmath>

namespace tl {

std::string_view trim(std::string_view s)
{
    const auto isSpace = [](char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n'; };
    while (!s.empty() && isSpace(s.front())) s.remove_prefix(1);
    while (!s.empty() && isSpace(s.back())) s.remove_suffix(1);
    return s;
}

std::optional<double> parseNumber(std::string_view s)
{
    s = trim(s);
    if (s.empty()) return std::nullopt;
    if (s.front() == '+') s.remove_prefix(1);
    double v = 0;
    const auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), v, std::chars_format::general);
    if (ec != std::errc{} || ptr != s.data() + s.size() || !std::isfinite(v)) return std::nullopt;
    return v;
}

std::string formatNumber(double v)
{
    // std::to_chars gives the shortest text that reads back exactly, independent of
    // the C locale (the GUI sets one, and "%g" would then write a decimal comma).
    // Plain decimals for the magnitudes people type (20, not 2e+01); exponent form
    // only for very small or very large values.
    char buf[64];
    const double a = std::fabs(v);
    const auto format = (a == 0.0 || (a >= 1e-5 && a < 1e15)) ? std::chars_format::fixed : std::chars_format::scientific;
    const auto result = std::to_chars(buf, buf + sizeof buf, v, format);
    return std::string(buf, result.ptr);
}

}  // namespace tl
