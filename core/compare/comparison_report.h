// Reports of a scenario comparison (core/compare/scenario_comparison.h): the JSON of
// `tledger compare --json` (keys stable: add, never rename; listed in DEVELOPERS.md) and
// the readable tables with units. Both carry the decision-support notice.
#pragma once

#include <string>

#include "core/compare/scenario_comparison.h"

namespace tl {

std::string comparisonJson(const ScenarioComparison& comparison);
// Readable tables: the inputs that differ, the outputs that differ (with absolute and
// percent differences against the reference) and every system indicator.
std::string comparisonTables(const ScenarioComparison& comparison);

// "compartment", "level", "system": the JSON's `group`.
std::string_view outputGroupKey(OutputGroup group);
// "+12.5 %", "-3 %", "undefined" (reference 0), "-" (not available), "0 %".
std::string percentText(const OutputDifference& d);

}  // namespace tl
