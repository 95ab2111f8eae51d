// The impact matrix's colour scale, in one place for the workbench's table
// (ui/analysis/impact_colour_map.h wraps it as QColor) and the report's SVG
// (core/io/report_svg.cpp): purple for negative, white for 0, green for positive, on a
// range symmetric around zero. The anchor colours are the purple-green diverging scheme
// of ColorBrewer (Brewer, Hatchard & Harrower 2003, Cartogr Geogr Inf Sci 30:5; hex values
// and citation recalled from memory), listed there as colour-blind safe; the centre is
// pure white rather than the scheme's near-white so that "no impact" reads as blank paper.
#pragma once

#include <cstdint>
#include <string>

namespace tl {

struct RampColour {
    std::uint8_t red = 255, green = 255, blue = 255;
    bool operator==(const RampColour&) const = default;
};

// Colour of `value` on [-range, +range] (clamped), linear between the scheme's classes;
// white for 0, NaN, infinite values or range <= 0.
RampColour impactRampColour(double value, double range);
// "#rrggbb" (lower case), as SVG and HTML take it.
std::string hexColour(RampColour c);

}  // namespace tl
