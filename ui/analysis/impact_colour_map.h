// Diverging purple–green colour map for impacts (DESIGN.md 4): purple for negative,
// white for 0, green for positive, on a range symmetric around zero. The anchor colours
// are the purple–green diverging scheme of ColorBrewer (Brewer, Hatchard & Harrower 2003,
// Cartogr Geogr Inf Sci 30:5; hex values and citation recalled from memory), which is
// listed there as colour-blind safe; the centre is pure white rather than the scheme's
// near-white so that "no impact" reads as blank paper.
#pragma once

#include <QColor>

namespace tl::ui {

// Colour of `value` on the range [-range, +range] (clamped); white for 0, NaN or range <= 0.
QColor impactColour(double value, double range);
// Black or white, whichever reads better on `background`.
QColor textColourOn(const QColor& background);

}  // namespace tl::ui
