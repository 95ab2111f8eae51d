// Reports of `tledger sensitivity` (DESIGN.md 5.2): the JSON (keys stable: add, never
// rename) and a readable table, each output's elasticities ranked by magnitude.
//
// JSON: {"scenario", "status": "balanced"|"unbalanced", "method_note", "log_step",
//        "diet_path", "input_count", "output_count",
//        "outputs": [{"output": "C.param", "compartment", "quantity", "value", "solved",
//                     "method": "analytic"|"central_difference", "note",
//                     "elasticities": [{"input": "C.param" or "C.diet:PREY", "compartment",
//                                       "parameter", "prey", "value", "elasticity"}]}],
//        "inputs": [{"input", "compartment", "parameter", "prey", "value"}],
//        "prcc": null | {"method", "outputs": [{"output", "draws", "degrees_of_freedom",
//                 "drivers": [{"input", "prcc", "p_value"}],
//                 "undefined": [{"input", "reason"}]}]},
//        "notice"}
// "elasticities" lists every defined elasticity above 1e-12 in magnitude (smaller ones are
// rounding residue), largest magnitude first
// (`top` keeps the first K); "prey" is null except for diet entries ("import" for the
// import share); "note" says why an output has none (its value is 0). "prcc" is null until
// the ensemble provides draws (the seam of `--prcc`).
#pragma once

#include <cstddef>
#include <optional>
#include <string>

#include "core/model/model.h"
#include "core/sensitivity/elasticity.h"
#include "core/sensitivity/prcc.h"

namespace tl {

struct SensitivityReportOptions {
    std::string scenario;
    std::optional<std::size_t> top;  // elasticities (and PRCC drivers) per output; all when unset
    const PrccTable* prcc = nullptr;  // partial rank correlations over draws, when there are any
};

std::string sensitivityJson(const Model& model, const ElasticityResult& result, const SensitivityReportOptions& options);
std::string sensitivityText(const Model& model, const ElasticityResult& result, const SensitivityReportOptions& options);

// The readable PRCC tables (the text's last part when options.prcc is set).
std::string prccText(const PrccTable& table, std::optional<std::size_t> top);

// The sentence the reports give for the diet path (elasticity.h).
extern const char* const kDietPathNote;

}  // namespace tl
