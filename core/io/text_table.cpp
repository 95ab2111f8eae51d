#include "core/io/text_table.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace tl {
namespace {

// Display width of UTF-8 text: count code points, not bytes (names may hold "²" or "é").
std::size_t displayWidth(const std::string& s)
{
    return static_cast<std::size_t>(std::count_if(s.begin(), s.end(), [](char c) {
        return (static_cast<unsigned char>(c) & 0xC0) != 0x80;
    }));
}

}  // namespace

void TextTable::addColumn(std::string header, Align align)
{
    headers_.push_back(std::move(header));
    aligns_.push_back(align);
}

void TextTable::addRow(std::vector<std::string> cells)
{
    cells.resize(headers_.size());
    rows_.push_back(std::move(cells));
}

std::string TextTable::render() const
{
    std::vector<std::size_t> width(headers_.size());
    for (std::size_t c = 0; c < headers_.size(); ++c) {
        width[c] = displayWidth(headers_[c]);
        for (const auto& row : rows_) width[c] = std::max(width[c], displayWidth(row[c]));
    }
    std::string out;
    const auto emit = [&](const std::vector<std::string>& cells) {
        std::string line;
        for (std::size_t c = 0; c < cells.size(); ++c) {
            const std::string pad(width[c] - displayWidth(cells[c]), ' ');
            if (c > 0) line += "  ";
            line += aligns_[c] == Align::Right ? pad + cells[c] : cells[c] + pad;
        }
        while (!line.empty() && line.back() == ' ') line.pop_back();
        out += line + '\n';
    };
    emit(headers_);
    std::vector<std::string> rule;
    for (std::size_t c = 0; c < headers_.size(); ++c) rule.emplace_back(width[c], '-');
    emit(rule);
    for (const auto& row : rows_) emit(row);
    return out;
}

std::string displayNumber(double v)
{
    if (std::isnan(v)) return "-";
    if (std::isinf(v)) return "undefined";  // never "inf": the table's note says why
    char buf[32];
    const double a = std::fabs(v);
    if (a != 0.0 && (a < 1e-3 || a >= 1e6)) std::snprintf(buf, sizeof buf, "%.3e", v);
    else std::snprintf(buf, sizeof buf, "%.4g", v);
    return buf;
}

}  // namespace tl
