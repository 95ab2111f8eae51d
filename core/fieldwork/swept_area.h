// Swept-area biomass (Sparre & Venema 1998, FAO Fish Tech Pap 306/1, section 13.1).
//
// Catch per unit area of haul i: cpua_i = C_i / a_i (kg/km²), with C_i the catch of the
// compartment's taxa and a_i the area the net swept (tow length x wing spread). A haul
// that caught none of them counts as cpua 0. The biomass density is
//
//     b = mean(cpua) / X1
//
// with X1 the fraction of the fish in the net's path that is retained (catchability;
// 1 - X1 is the escapement). X1 is NOT estimated from the data: it is an assumption,
// stated in every result (Sparre & Venema discuss values between 0.5 and 1.0; from
// memory, no page number). Stratified (strata with areas A_h, weights W_h = A_h / sum A):
//
//     b = sum_h W_h mean_h / X1,   Var(b) = sum_h W_h^2 s_h^2 / n_h / X1^2
//
// (stratified random sampling, Cochran 1977, Sampling Techniques, ch. 5). The interval
// uses Student's t with n - 1 degrees of freedom, or, stratified, Satterthwaite's
// effective degrees of freedom (Cochran 1977, eq. 5.16, from memory):
// df = (sum g_h s_h^2)^2 / sum (g_h s_h^2)^2 / (n_h - 1), g_h = W_h^2 / n_h.
// The CV is the sampling CV, SE / b; the uncertainty of X1 is not in it.
#pragma once

#include <string>
#include <vector>

#include "core/fieldwork/estimate.h"
#include "core/fieldwork/survey_tables.h"

namespace tl::fieldwork {

struct SweptAreaOptions {
    double catchability = 1.0;  // X1, the retained fraction of fish in the net's path, (0, 1]
    double ciLevel = 0.95;
};

struct StratumEstimate {
    std::string name;      // empty when unstratified
    double areaKm2 = 0.0;  // 0 when unstratified
    double weight = 1.0;   // W_h
    int hauls = 0;
    double meanKgPerKm2 = 0.0, sdKgPerKm2 = 0.0;  // of cpua, before X1
};

struct SweptAreaResult {
    Estimate estimate;                  // B in t wet weight/km² (the density)
    std::vector<StratumEstimate> strata;
    double densityKgPerKm2 = 0.0;       // b, after X1
    double seKgPerKm2 = 0.0;
    double degreesOfFreedom = 0.0;
    std::vector<std::string> taxa;      // the taxa counted for the compartment
};

// `strata` empty: unstratified, even when the hauls name strata (then each stratum is
// reported but pooled with equal weight per haul). Otherwise every haul's stratum must
// be listed and every listed stratum needs at least two hauls (for its variance).
// Catches of taxa mapped to other compartments are ignored; a catch of a taxon the
// mapping lacks is an error at its cell (it might belong to the compartment).
SweptAreaResult sweptAreaBiomass(const HaulSurvey& survey, const TaxonMapping& mapping, const std::string& compartment,
                                 const std::vector<Stratum>& strata, const SweptAreaOptions& options = {});

}  // namespace tl::fieldwork
