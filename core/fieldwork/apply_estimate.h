// Putting fieldwork results into a scenario: one place for what the CLI (tledger
// fieldwork --into) and the workbench's Fieldwork dialog both do, so that they write the
// same values, CVs and notes.
#pragma once

#include <string>

#include "core/fieldwork/estimate.h"
#include "core/fieldwork/stomach_diet.h"
#include "core/fieldwork/unit_conversion.h"
#include "core/model/model.h"

namespace tl::fieldwork {

// The estimate as it will be written into `param` of `model`: B converted from
// t wet weight/km² into the model's biomass unit (value and interval; the factor named
// in the assumptions); M turned into P/B = Z = M + F at steady state (Allen 1971) with
// F = catch / B of the compartment. Problems when that cannot be done (unknown unit, no
// B for F).
Problems prepareForParameter(const Model& model, std::size_t compartment, Param param, Estimate& e,
                             const ConversionFactors& factors = {});

// prepareForParameter, then writeEstimate. Nothing changes on an error.
Problems applyEstimate(Model& model, std::size_t compartment, Param param, Estimate e, const std::string& date,
                       const ConversionFactors& factors = {}, Estimate* written = nullptr);

// Replaces the diet row of `predator` (a consumer) by the shares, import included, and
// appends the note (dietNote) to `description`. Every prey must be a compartment of the
// model (or "import"). Nothing changes on an error.
Problems applyDiet(Model& model, std::string& description, std::size_t predator, const StomachDiet& diet,
                   const std::string& date);

}  // namespace tl::fieldwork
