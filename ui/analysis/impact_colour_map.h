// The impact matrix's colour scale as QColor: core/io/impact_colour_ramp.h (purple
// negative, white 0, green positive; the report's SVG uses the same ramp).
#pragma once

#include <QColor>

namespace tl::ui {

// Colour of `value` on the range [-range, +range] (clamped); white for 0, NaN or range <= 0.
QColor impactColour(double value, double range);
// Black or white, whichever reads better on `background`.
QColor textColourOn(const QColor& background);

}  // namespace tl::ui
