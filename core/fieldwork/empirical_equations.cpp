#include "core/fieldwork/empirical_equations.h"

#include <cmath>

#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

struct Input {
    const char* name;
    double value;
    const char* unit;
    double low, high;  // approximate range of the equation's data (from memory)
    bool positive = true;
};

// Lists the inputs and checks them: a value that is not a finite positive number is an
// error; one outside the fitted range a warning naming the range.
bool checkInputs(Estimate& e, std::initializer_list<Input> inputs, const char* dataSet)
{
    bool ok = true;
    for (const Input& in : inputs) {
        e.inputs.push_back(labelled(in.name, in.value, in.unit));
        Problem p;
        p.parameter = in.name;
        if (!std::isfinite(in.value) || (in.positive && !(in.value > 0.0))) {
            p.code = code::kFieldworkInvalidInput;
            p.message = std::string(in.name) + " must be a positive number" + (*in.unit ? std::string(" (") + in.unit + ")" : "") +
                        ", found " + shortNumber(in.value);
            e.problems.push_back(std::move(p));
            ok = false;
        } else if (in.value < in.low || in.value > in.high) {
            p.code = code::kFieldworkOutsideRange;
            p.severity = Severity::Warning;
            p.message = std::string(in.name) + " = " + shortNumber(in.value) + " " + in.unit +
                        " lies outside the data the equation was fitted to (" + dataSet + ": about " +
                        shortNumber(in.low) + " to " + shortNumber(in.high) + " " + in.unit +
                        ", an approximate range from memory); the estimate is an extrapolation";
            e.warnings.push_back(std::move(p));
        }
    }
    return ok;
}

Estimate started(const char* quantity, const char* method)
{
    Estimate e = newEstimate(quantity, "/year");
    e.method = method;
    e.assumptions.push_back("empirical equation: no sampling CV (grade C, this project's convention)");
    return e;
}

}  // namespace

Estimate paulyNaturalMortality(double linfCm, double k, double temperatureC)
{
    Estimate e = started("M", "Pauly 1980 empirical equation (L∞, K, T)");
    if (!checkInputs(e,
                     {{"L∞", linfCm, "cm", 2.0, 250.0},
                      {"K", k, "/year", 0.05, 3.0},
                      {"T", temperatureC, "°C", 5.0, 30.0}},
                     "Pauly 1980, 175 stocks"))
        return e;
    e.value = std::pow(10.0, -0.0066 - 0.279 * std::log10(linfCm) + 0.6543 * std::log10(k) +
                                 0.4634 * std::log10(temperatureC));
    e.valid = true;
    return e;
}

Estimate thenMortalityFromMaxAge(double tmaxYears)
{
    Estimate e = started("M", "Then et al. 2015 maximum-age equation (tmax)");
    if (!checkInputs(e, {{"tmax", tmaxYears, "years", 1.0, 150.0}}, "Then et al. 2015, 226 species"))
        return e;
    e.value = 4.899 * std::pow(tmaxYears, -0.916);
    e.valid = true;
    return e;
}

Estimate thenMortalityFromGrowth(double linfCm, double k)
{
    Estimate e = started("M", "Then et al. 2015 growth equation (L∞, K)");
    if (!checkInputs(e, {{"L∞", linfCm, "cm", 3.0, 400.0}, {"K", k, "/year", 0.02, 3.0}},
                     "Then et al. 2015, 226 species"))
        return e;
    e.value = 4.118 * std::pow(k, 0.73) * std::pow(linfCm, -0.33);
    e.valid = true;
    return e;
}

Estimate palomaresPaulyConsumption(double winfGrams, double temperatureC, double aspectRatio, FeedingType feeding)
{
    Estimate e = started("Q/B", "Palomares & Pauly 1998 empirical equation (W∞, T, A, food)");
    // Temperature may be 0 °C or below in cold water; only the Kelvin value must be positive.
    if (!checkInputs(e,
                     {{"W∞", winfGrams, "g", 1.0, 50000.0},
                      {"T", temperatureC, "°C", 0.0, 30.0, false},
                      {"A", aspectRatio, "", 0.5, 7.5}},
                     "Palomares & Pauly 1998, 108 populations of 38 species"))
        return e;
    if (!(temperatureC > -273.15)) {
        Problem p;
        p.code = code::kFieldworkInvalidInput;
        p.message = "T must be a temperature above absolute zero";
        e.problems.push_back(std::move(p));
        return e;
    }
    const double tPrime = 1000.0 / (temperatureC + 273.15);
    const double h = feeding == FeedingType::Herbivore ? 1.0 : 0.0;
    const double d = feeding == FeedingType::Detritivore ? 1.0 : 0.0;
    e.inputs.push_back(std::string("food ") +
                       (feeding == FeedingType::Herbivore     ? "herbivore (h = 1)"
                        : feeding == FeedingType::Detritivore ? "detritivore (d = 1)"
                                                              : "carnivore (h = d = 0)"));
    e.value = std::pow(10.0, 7.964 - 0.204 * std::log10(winfGrams) - 1.965 * tPrime + 0.083 * aspectRatio + 0.532 * h +
                                 0.398 * d);
    e.valid = true;
    return e;
}

}  // namespace tl::fieldwork
