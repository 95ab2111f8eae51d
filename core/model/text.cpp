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

// Offset of the first byte that does not belong to a well-formed UTF-8 sequence
// (Unicode 15, table 3-7: no overlong forms, no surrogates, nothing above U+10FFFF),
// or npos when the whole text is valid.
std::size_t firstInvalidUtf8(std::string_view s)
{
    const auto byte = [&](std::size_t k) { return static_cast<unsigned char>(s[k]); };
    std::size_t i = 0;
    while (i < s.size()) {
        const unsigned char c = byte(i);
        if (c < 0x80) { ++i; continue; }
        std::size_t len = 0;
        unsigned char lo = 0x80, hi = 0xBF;  // allowed range of the second byte
        if (c >= 0xC2 && c <= 0xDF) len = 2;
        else if (c >= 0xE0 && c <= 0xEF) {
            len = 3;
            if (c == 0xE0) lo = 0xA0;
            if (c == 0xED) hi = 0x9F;
        } else if (c >= 0xF0 && c <= 0xF4) {
            len = 4;
            if (c == 0xF0) lo = 0x90;
            if (c == 0xF4) hi = 0x8F;
        } else return i;
        if (i + len > s.size()) return i;
        if (byte(i + 1) < lo || byte(i + 1) > hi) return i;
        for (std::size_t k = 2; k < len; ++k)
            if (byte(i + k) < 0x80 || byte(i + k) > 0xBF) return i;
        i += len;
    }
    return std::string_view::npos;
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
