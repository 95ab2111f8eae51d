// The readable text and the JSON of a fieldwork estimate (tledger fieldwork; the GUI's
// preview reads the same strings). JSON keys are a contract (add, never rename):
//   quantity, value, unit, cv, ci_low, ci_high, ci_level, method, inputs[], assumptions[],
//   warnings[{code, message}], notice
//   biomass:   strata[{name, area_km2, weight, hauls, mean_kg_per_km2, sd_kg_per_km2}],
//              density_kg_per_km2, se_kg_per_km2, degrees_of_freedom, taxa[]
//   Z, catch curve: points[{from_cm, to_cm, count, age, dt, ln_c_dt, usable, selected}],
//              slope, intercept, slope_se, r2
//   Z, mean length: cut_off_cm, mean_length_cm, sd_cm, fish
//   diet:      predator, summary, method, ci_level, samples, stomachs, empty_stomachs, left_out_share,
//              grade, shares[{prey, share, mean_of_proportions, pooled, cv, ci_low, ci_high}]
// Values missing (no CV for an empirical equation) are null.
#pragma once

#include <string>

#include "core/fieldwork/estimate.h"
#include "core/fieldwork/length_mortality.h"
#include "core/fieldwork/stomach_diet.h"
#include "core/fieldwork/swept_area.h"
#include "core/io/json_writer.h"

namespace tl::fieldwork {

// Keys of the estimate into an object the writer has open.
void writeEstimateJson(JsonWriter& w, const Estimate& e);
void writeSweptAreaJson(JsonWriter& w, const SweptAreaResult& r);
void writeCatchCurveJson(JsonWriter& w, const CatchCurveResult& r);
void writeMeanLengthJson(JsonWriter& w, const MeanLengthResult& r);
void writeDietJson(JsonWriter& w, const StomachDiet& d);

// "P/B = 1.23 /year (CV 0.12; 95 % CI 0.95 to 1.51)" then method, inputs, assumptions,
// warnings, one per line.
std::string estimateText(const Estimate& e);
std::string sweptAreaTable(const SweptAreaResult& r);
std::string catchCurveTable(const CatchCurveResult& r);  // every class, '*' on the regressed ones
std::string dietText(const StomachDiet& d);

}  // namespace tl::fieldwork
