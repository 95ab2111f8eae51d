#include "ui/analysis/impact_colour_map.h"

#include "core/io/impact_colour_ramp.h"

namespace tl::ui {

QColor impactColour(double value, double range)
{
    const RampColour c = impactRampColour(value, range);
    return QColor(c.red, c.green, c.blue);
}

QColor textColourOn(const QColor& background)
{
    // Rec. 601 luma weights (common practice, no source).
    const double luminance = 0.299 * background.redF() + 0.587 * background.greenF() + 0.114 * background.blueF();
    return luminance > 0.55 ? Qt::black : Qt::white;
}

}  // namespace tl::ui
