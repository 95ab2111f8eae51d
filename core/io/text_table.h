// TextTable: aligned plain-text tables for the CLI's readable output. Numbers are
// right-aligned, text left-aligned; widths follow the content.
#pragma once

#include <string>
#include <vector>

namespace tl {

class TextTable {
public:
    enum class Align { Left, Right };

    void addColumn(std::string header, Align align = Align::Right);
    void addRow(std::vector<std::string> cells);  // one cell per column
    std::string render() const;

private:
    std::vector<std::string> headers_;
    std::vector<Align> aligns_;
    std::vector<std::vector<std::string>> rows_;
};

// A number for display: 4 significant digits, plain or scientific as fits; "-" for NaN
// (not applicable), "undefined" for an infinity (the report beside it says why): no
// "inf" or "nan" ever reaches text output (issue 12).
std::string displayNumber(double v);

}  // namespace tl
