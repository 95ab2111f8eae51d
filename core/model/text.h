// Small text helpers shared by readers and writers (no locale, no Qt).
#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace tl {

std::string_view trim(std::string_view s);

// Parses a finite decimal number with '.' as the decimal mark, the whole field
// (after trimming). Rejects empty text, "nan", "inf", hex and trailing garbage.
std::optional<double> parseNumber(std::string_view s);

// Offset of the first byte that does not belong to a well-formed UTF-8 sequence, or
// npos when the whole text is valid UTF-8 (readers refuse such text with its place).
std::size_t firstInvalidUtf8(std::string_view s);

// Shortest text that reads back to the same double ("%.17g" trimmed): used by writers
// so that a round trip through text is exact.
std::string formatNumber(double v);

}  // namespace tl
