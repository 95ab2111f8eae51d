#include "core/fieldwork/unit_conversion.h"

#include <algorithm>
#include <cctype>

#include "core/fieldwork/estimate.h"
#include "core/model/problem_codes.h"
#include "core/model/text.h"

namespace tl::fieldwork {
namespace {

std::string lower(std::string_view s)
{
    std::string out(trim(s));
    std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return out;
}

// Grams (or kJ) per g wet weight in currency c.
double perWetGram(Currency c, const ConversionFactors& f)
{
    switch (c) {
    case Currency::WetWeight: return 1.0;
    case Currency::Carbon: return f.carbonPerWetWeight;
    case Currency::Energy: return f.kilojoulePerWetWeight;
    }
    return 1.0;
}

}  // namespace

std::optional<BiomassUnit> parseBiomassUnit(const Units& units, Problems& problems)
{
    BiomassUnit u;
    const std::string c = lower(units.currency);
    const std::string first = c.substr(0, c.find(' '));
    const std::string rest = c.find(' ') == std::string::npos ? std::string() : std::string(trim(c.substr(c.find(' '))));
    bool ok = true;
    if (first == "kj" || first == "j" || first == "mj") {
        u.currency = Currency::Energy;
        u.gramsOrKilojoules = first == "kj" ? 1.0 : first == "j" ? 1e-3 : 1e3;
        ok = rest.empty();
    } else {
        const double scale = first == "t" ? 1e6 : first == "kg" ? 1e3 : first == "g" ? 1.0 : first == "mg" ? 1e-3 : 0.0;
        u.gramsOrKilojoules = scale;
        if (scale == 0.0) ok = false;
        if (rest == "wet weight" || rest == "ww" || rest == "wet" || rest == "wet mass")
            u.currency = Currency::WetWeight;
        else if (rest == "c" || rest == "carbon")
            u.currency = Currency::Carbon;
        else
            ok = false;
    }
    const std::string a = lower(units.area);
    if (a == "km²" || a == "km2" || a == "km^2") u.areaKm2 = 1.0;
    else if (a == "m²" || a == "m2" || a == "m^2") u.areaKm2 = 1e-6;
    else if (a == "ha") u.areaKm2 = 1e-2;
    else ok = false;
    if (ok) return u;
    Problem p;
    p.code = code::kFieldworkTarget;
    p.message = "the project's biomass unit '" + units.biomass() +
                "' is not one the fieldwork conversion knows (mass t, kg, g or mg with 'wet weight' or 'C', or kJ; "
                "area km², m² or ha)";
    problems.push_back(std::move(p));
    return std::nullopt;
}

double convertBiomass(double value, const BiomassUnit& from, const BiomassUnit& to, const ConversionFactors& f)
{
    const double wetGramsPerKm2 = value * from.gramsOrKilojoules / perWetGram(from.currency, f) / from.areaKm2;
    return wetGramsPerKm2 * perWetGram(to.currency, f) * to.areaKm2 / to.gramsOrKilojoules;
}

std::string conversionNote(Currency from, Currency to, const ConversionFactors& f)
{
    if (from == to) return {};
    std::string note;
    for (Currency c : {from, to}) {
        if (c == Currency::Carbon) note += (note.empty() ? "" : "; ") + shortNumber(f.carbonPerWetWeight) + " g C per g wet weight (" + f.carbonSource + ")";
        if (c == Currency::Energy) note += (note.empty() ? "" : "; ") + shortNumber(f.kilojoulePerWetWeight) + " kJ per g wet weight (" + f.energySource + ")";
    }
    return note;
}

}  // namespace tl::fieldwork
