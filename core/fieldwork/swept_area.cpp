#include "core/fieldwork/swept_area.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "core/fieldwork/student_t.h"
#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

Problem plainProblem(const char* code, const std::string& compartment, std::string message)
{
    Problem p;
    p.code = code;
    p.compartment = compartment;
    p.message = std::move(message);
    return p;
}

void meanAndSd(const std::vector<double>& xs, double& mean, double& sd)
{
    mean = 0.0;
    for (double x : xs) mean += x;
    mean /= static_cast<double>(xs.size());
    double ss = 0.0;
    for (double x : xs) ss += (x - mean) * (x - mean);
    sd = xs.size() > 1 ? std::sqrt(ss / static_cast<double>(xs.size() - 1)) : 0.0;
}

}  // namespace

SweptAreaResult sweptAreaBiomass(const HaulSurvey& survey, const TaxonMapping& mapping, const std::string& compartment,
                                 const std::vector<Stratum>& strata, const SweptAreaOptions& options)
{
    SweptAreaResult out;
    out.estimate = newEstimate("B", "t wet weight/km²", options.ciLevel);
    Estimate& e = out.estimate;
    Problems& problems = e.problems;

    if (!(options.catchability > 0.0 && options.catchability <= 1.0)) {
        problems.push_back(plainProblem(code::kFieldworkInvalidInput, compartment,
                                        "catchability X1 must lie in (0, 1], found " + shortNumber(options.catchability)));
        return out;
    }
    for (const auto& [taxon, c] : mapping.compartmentOf)
        if (c == compartment) out.taxa.push_back(taxon);
    if (out.taxa.empty()) {
        problems.push_back(plainProblem(code::kSurveyUnknownTaxon, compartment,
                                        "no taxon of the mapping belongs to compartment '" + compartment + "'"));
        return out;
    }

    // Catch of the compartment per haul.
    std::vector<double> catchKg(survey.hauls.size(), 0.0);
    for (const HaulCatch& c : survey.catches) {
        if (c.taxon.empty()) continue;
        const auto it = mapping.compartmentOf.find(c.taxon);
        if (it == mapping.compartmentOf.end()) {
            problems.push_back(surveyProblem(code::kSurveyUnknownTaxon, c.taxonCell,
                                             "taxon '" + c.taxon + "' is not in the taxon mapping",
                                             "Add it to taxa.csv, with an empty compartment if it is not modelled."));
            continue;
        }
        if (it->second == compartment) catchKg[c.haul] += c.catchKg;
    }
    if (hasErrors(problems)) return out;

    // Group hauls: by listed stratum, or all in one group.
    std::map<std::string, std::vector<double>> groups;
    if (strata.empty()) {
        for (std::size_t h = 0; h < survey.hauls.size(); ++h)
            groups[""].push_back(catchKg[h] / survey.hauls[h].sweptAreaKm2);
    } else {
        std::set<std::string> listed;
        for (const Stratum& s : strata) listed.insert(s.name);
        for (std::size_t h = 0; h < survey.hauls.size(); ++h) {
            const Haul& haul = survey.hauls[h];
            if (!listed.count(haul.stratum)) {
                problems.push_back(surveyProblem(code::kSurveyUnknownStratum, haul.where,
                                                 "haul '" + haul.haul + "' at station '" + haul.station +
                                                     "' is in stratum '" + haul.stratum +
                                                     "', which the strata file does not list"));
                continue;
            }
            groups[haul.stratum].push_back(catchKg[h] / haul.sweptAreaKm2);
        }
        for (const Stratum& s : strata)
            if (groups[s.name].size() < 2)
                problems.push_back(surveyProblem(code::kFieldworkTooFewData, s.where,
                                                 "stratum '" + s.name + "' has " + std::to_string(groups[s.name].size()) +
                                                     " haul(s); its variance needs at least 2"));
    }
    if (strata.empty() && survey.hauls.size() < 2)
        problems.push_back(plainProblem(code::kFieldworkTooFewData, compartment,
                                        "the survey has " + std::to_string(survey.hauls.size()) +
                                            " haul(s); a mean and its interval need at least 2"));
    if (hasErrors(problems)) return out;

    double totalArea = 0.0;
    for (const Stratum& s : strata) totalArea += s.areaKm2;
    double mean = 0.0, variance = 0.0, dfNumerator = 0.0, dfDenominator = 0.0;
    int hauls = 0;
    auto addStratum = [&](const std::string& name, double area, double weight, const std::vector<double>& cpua) {
        StratumEstimate s;
        s.name = name;
        s.areaKm2 = area;
        s.weight = weight;
        s.hauls = static_cast<int>(cpua.size());
        meanAndSd(cpua, s.meanKgPerKm2, s.sdKgPerKm2);
        const double n = static_cast<double>(cpua.size());
        const double g = weight * weight / n;
        mean += weight * s.meanKgPerKm2;
        variance += g * s.sdKgPerKm2 * s.sdKgPerKm2;
        dfNumerator += g * s.sdKgPerKm2 * s.sdKgPerKm2;
        const double term = g * s.sdKgPerKm2 * s.sdKgPerKm2;
        dfDenominator += term * term / (n - 1.0);
        hauls += s.hauls;
        out.strata.push_back(std::move(s));
    };
    if (strata.empty()) {
        addStratum("", 0.0, 1.0, groups[""]);
    } else {
        for (const Stratum& s : strata) addStratum(s.name, s.areaKm2, s.areaKm2 / totalArea, groups[s.name]);
    }
    const double x1 = options.catchability;
    out.densityKgPerKm2 = mean / x1;
    out.seKgPerKm2 = std::sqrt(variance) / x1;
    out.degreesOfFreedom = strata.empty() ? hauls - 1.0
                           : dfDenominator > 0.0 ? dfNumerator * dfNumerator / dfDenominator
                                                 : static_cast<double>(hauls - static_cast<int>(strata.size()));
    const double t = studentTTwoSided(options.ciLevel, out.degreesOfFreedom);

    e.value = out.densityKgPerKm2 / 1000.0;  // kg/km² -> t/km²
    const double se = out.seKgPerKm2 / 1000.0;
    if (!std::isfinite(e.value) || !std::isfinite(se) || !std::isfinite(e.value + t * se)) {
        // A swept area near 0 (or a catchability near 0) divides a catch into infinity:
        // refused, naming the smallest area, rather than reported as "undefined" (issue 12).
        const auto smallest = std::min_element(survey.hauls.begin(), survey.hauls.end(),
                                               [](const Haul& a, const Haul& b) { return a.sweptAreaKm2 < b.sweptAreaKm2; });
        e.problems.push_back(surveyProblem(code::kFieldworkInvalidInput, smallest->where,
                                           "the catch per swept area is beyond the range of numbers; the smallest "
                                           "swept area is " + shortNumber(smallest->sweptAreaKm2) + " km² (haul '" +
                                               smallest->haul + "' at station '" + smallest->station +
                                               "') and the catchability " + shortNumber(x1),
                                           "Check the swept areas (km², e.g. 0.02 for a 1.5 km tow with a 14 m net) "
                                           "and the catchability."));
        return out;
    }
    if (e.value > 0.0) e.cv = se / e.value;
    e.ciLow = std::max(0.0, e.value - t * se);
    e.ciHigh = e.value + t * se;
    e.method = strata.empty() ? "swept area (Sparre & Venema 1998), " + std::to_string(hauls) + " hauls"
                              : "swept area (Sparre & Venema 1998), stratified: " + std::to_string(strata.size()) +
                                    " strata, " + std::to_string(hauls) + " hauls (Cochran 1977)";
    std::string taxa;
    for (const std::string& tx : out.taxa) taxa += (taxa.empty() ? "" : "+") + tx;
    e.inputs.push_back("taxa " + taxa);
    e.inputs.push_back("hauls " + std::to_string(hauls));
    if (!strata.empty()) e.inputs.push_back("stratum area " + shortNumber(totalArea) + " km²");
    e.inputs.push_back("mean catch per area " + shortNumber(mean) + " kg/km²");
    e.assumptions.push_back("catchability X1 = " + shortNumber(x1) + " (retained fraction of fish in the net's path; " +
                            "not estimated from the hauls, and its uncertainty is not in the CV)");
    if (e.value == 0.0) {
        Problem p = plainProblem(code::kFieldworkTooFewData, compartment,
                                 "no haul caught any of " + taxa + ": the swept-area biomass is 0");
        p.severity = Severity::Warning;
        e.warnings.push_back(std::move(p));
    }
    e.valid = true;
    return out;
}

}  // namespace tl::fieldwork
