// Converting a biomass density between currencies (DESIGN.md 2: a project declares its
// currency, wet weight, carbon or energy, and its area) with factors the user can edit,
// each carrying its source. Survey estimates come out in t wet weight/km²; a project
// kept in g C/m² or kJ/m² gets them converted before they are written.
//
// Default factors (edit them per taxon group when better values are known):
//   carbon: 0.1 g C per g wet weight, i.e. the 1:10 carbon to wet weight ratio common
//           for fish and invertebrates (common practice, no source; a 1:9 ratio is
//           also used in the literature, from memory);
//   energy: 5 kJ per g wet weight, a round figure for fish flesh (common practice, no
//           source; fish range from about 3 to 8 kJ/g wet weight, from memory).
#pragma once

#include <optional>
#include <string>

#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl::fieldwork {

enum class Currency { WetWeight, Carbon, Energy };

struct ConversionFactors {
    double carbonPerWetWeight = 0.1;  // g C per g wet weight
    std::string carbonSource = "1:10 carbon to wet weight (common practice, no source)";
    double kilojoulePerWetWeight = 5.0;  // kJ per g wet weight
    std::string energySource = "5 kJ per g wet weight (common practice, no source)";
};

// A biomass unit "<mass> <currency>/<area>" as the project's Units give it: a mass
// scale in grams (t, kg, g, mg; kJ, J, MJ for energy), a currency and an area in km².
struct BiomassUnit {
    Currency currency = Currency::WetWeight;
    double gramsOrKilojoules = 1e6;  // per unit of mass (t = 1e6 g; kJ = 1)
    double areaKm2 = 1.0;            // per unit of area (m² = 1e-6 km²)
};

// Reads Units::currency ("t wet weight", "g C", "kJ", "g ww", "kg carbon", ...) and
// Units::area ("km²", "km2", "m²", "ha"); nullopt with a problem naming what was not
// understood.
std::optional<BiomassUnit> parseBiomassUnit(const Units& units, Problems& problems);

// `value` in `from` expressed in `to`.
double convertBiomass(double value, const BiomassUnit& from, const BiomassUnit& to, const ConversionFactors& f);

// The unit of survey estimates: t wet weight per km².
inline BiomassUnit tonnesWetWeightPerKm2() { return {}; }

// "0.1 g C per g wet weight (...)": the factor used between two currencies, for the note;
// empty when none was needed.
std::string conversionNote(Currency from, Currency to, const ConversionFactors& f);

}  // namespace tl::fieldwork
