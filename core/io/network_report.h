// Reports of a network analysis (core/network/network_analysis.h): the JSON of
// `tledger network --json` (DESIGN.md 5.3; keys are stable: add, never rename) and the
// readable tables with units. Outputs of a harvested scenario carry the
// decision-support notice (core/io/balance_report.h).
#pragma once

#include <cstddef>
#include <string>

#include "core/network/network_analysis.h"

namespace tl {

// The mixed-trophic-impact matrix grows as n x n (about 45 bytes a value in the JSON:
// 1.8 MB at 200 compartments, 45 MB at 1 000). Up to kImpactMatrixJsonLimit
// compartments the JSON carries it; above, `mti.values` is null and `mti.omitted` says
// why, unless `impactMatrix` asks for it (tledger network --json --impact-matrix).
inline constexpr std::size_t kImpactMatrixJsonLimit = 200;

struct NetworkJsonOptions {
    bool impactMatrix = false;  // write mti.values whatever the size
};

std::string networkReportJson(const NetworkAnalysis& analysis, const NetworkJsonOptions& options = {});
std::string networkReportTables(const NetworkAnalysis& analysis);

}  // namespace tl
