// Plausible ranges of entered values (issue 13): a value far above them, in the
// project's units, is most likely a slip of the keyboard or of the units (B = 1e300),
// so it is warned about — never refused, never changed. The limits are wide enough
// for any lake, reservoir or coastal water (common practice, no source):
//   B                       1e6  currency/area   (a million tonnes per km² in t/km²)
//   P/B, Q/B                1e4  per time unit
//   BA, E, detritus import,
//   landings, discards      1e7  currency/area/time
#pragma once

#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl {

struct PlausibleRanges {
    double biomassMax = 1e6;
    double rateMax = 1e4;
    double flowMax = 1e7;
};

// One warning (code implausible-value) per entered value whose magnitude exceeds its limit.
Problems implausibleValues(const Model& model, const PlausibleRanges& ranges = {});

}  // namespace tl
