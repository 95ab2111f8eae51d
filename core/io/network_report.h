// Reports of a network analysis (core/network/network_analysis.h): the JSON of
// `tledger network --json` (DESIGN.md 5.3; keys are stable: add, never rename) and the
// readable tables with units. Outputs of a harvested scenario carry the
// decision-support notice (core/io/balance_report.h).
#pragma once

#include <string>

#include "core/network/network_analysis.h"

namespace tl {

std::string networkReportJson(const NetworkAnalysis& analysis);
std::string networkReportTables(const NetworkAnalysis& analysis);

}  // namespace tl
