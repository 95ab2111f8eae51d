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


// One warning (code implausible-value) per entered value whose magnitude exceeds its
// limit: the model's own rules (model.rules.plausible, editable per project), or `ranges`.
Problems implausibleValues(const Model& model);
Problems implausibleValues(const Model& model, const PlausibleRanges& ranges);

}  // namespace tl
