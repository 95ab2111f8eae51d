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
//        "prcc": null | {"method", "ensemble": null | {"draws", "seed", "balanced_draws",
//                 "left_out", "held_at_point_value"}, "outputs": [{"output", "draws", "degrees_of_freedom",
//                 "drivers": [{"input", "prcc", "p_value"}],
//                 "undefined": [{"input", "reason"}]}]},
//        "notice"}
// "elasticities" lists every defined elasticity above 1e-12 in magnitude (smaller ones are
// rounding residue), largest magnitude first
// (`top` keeps the first K); "prey" is null except for diet entries ("import" for the
// import share); "note" says why an output has none (its value is 0). "prcc" is null
// without `--prcc`; with it, "ensemble" says which draws fed it and "left_out" names the
// diet share left out of each drawn row (core/sensitivity/ensemble_prcc.h says why).
#pragma once

#include <cstddef>
#include <cstdint>
#include <vector>
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
    // Where prcc's draws come from, when an ensemble fed them.
    struct PrccEnsemble {
        std::uint64_t draws = 0, seed = 0, balanced = 0;
        std::vector<std::string> leftOut;
        std::string held;
    };
    const PrccEnsemble* prccEnsemble = nullptr;
};

std::string sensitivityJson(const Model& model, const ElasticityResult& result, const SensitivityReportOptions& options);
std::string sensitivityText(const Model& model, const ElasticityResult& result, const SensitivityReportOptions& options);

// The readable PRCC tables (the text's last part when options.prcc is set).
std::string prccText(const PrccTable& table, std::optional<std::size_t> top);
std::string prccText(const PrccTable& table, std::optional<std::size_t> top, const SensitivityReportOptions::PrccEnsemble* source);

// The sentence the reports give for the diet path (elasticity.h).
extern const char* const kDietPathNote;

}  // namespace tl
