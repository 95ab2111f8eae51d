#include "core/fieldwork/empirical_equations.h"

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

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
        // The input with the range of the equation's data, so that the note shows it too.
        e.inputs.push_back(labelled(in.name, in.value, in.unit) + " (data about " + shortNumber(in.low) + " to " +
                           shortNumber(in.high) + (*in.unit ? std::string(" ") + in.unit : std::string()) + ")");
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
    return e;
}

// One source of uncertainty of ln(result): d ln y / d u times the SD of u (see the header).
struct Term {
    const char* name;
    double se;        // as given, in the input's unit
    const char* unit;
    double slope;     // d ln y / d u
    double sdOfU;     // SD of u: sqrt(ln(1 + CV^2)) for a lognormal input, SE for a normal one
};

// A power-law input, lognormal with median `value` and CV se / value.
Term powerTerm(const char* name, double value, double se, const char* unit, double exponent)
{
    const double cv = se / value;
    return {name, se, unit, exponent, std::sqrt(std::log1p(cv * cv))};
}

// Sets the CV and the interval from the terms and the residual error (delta method on
// the log scale), or, when nothing is uncertain, says that there is no CV. A standard
// error that is negative or not a number is an error.
bool propagate(Estimate& e, const std::vector<Term>& terms, const EquationUncertainty& u)
{
    bool ok = true;
    auto refuse = [&](const std::string& what, double v) {
        Problem p;
        p.code = code::kFieldworkInvalidInput;
        p.parameter = what;
        p.message = what + " must be zero or a positive number, found " + shortNumber(v);
        e.problems.push_back(std::move(p));
        ok = false;
    };
    for (const Term& t : terms)
        if (!std::isfinite(t.se) || t.se < 0.0) refuse(std::string("SE of ") + t.name, t.se);
    if (!std::isfinite(u.residualSdLn) || u.residualSdLn < 0.0) refuse("residual SD (ln scale)", u.residualSdLn);
    if (!(u.ciLevel > 0.0 && u.ciLevel < 1.0)) refuse("confidence level", u.ciLevel);
    if (!ok) return false;

    // Only the inputs this equation uses count: an SE of an input it does not take adds nothing.
    const bool uncertain = u.residualSdLn > 0.0 || std::any_of(terms.begin(), terms.end(), [](const Term& t) {
                               return t.se > 0.0;
                           });
    if (!uncertain) {
        e.assumptions.push_back(
            "empirical equation without input SEs or residual error: no CV (grade C, this project's convention)");
        return true;
    }
    double variance = u.residualSdLn * u.residualSdLn;
    for (const Term& t : terms) {
        if (!(t.se > 0.0)) continue;
        variance += t.slope * t.slope * t.sdOfU * t.sdOfU;
        e.inputs.push_back(labelled(std::string("SE of ") + t.name, t.se, t.unit));
    }
    const double sigma = std::sqrt(variance);
    const double z = normalTwoSided(u.ciLevel);
    e.cv = std::sqrt(std::expm1(variance));
    e.ciLevel = u.ciLevel;
    e.ciLow = e.value * std::exp(-z * sigma);
    e.ciHigh = e.value * std::exp(z * sigma);
    e.assumptions.push_back("CV and interval by the delta method on ln " + e.quantity + " (SD " + shortNumber(sigma) +
                            "), power-law inputs lognormal, others normal, inputs independent");
    if (u.residualSdLn > 0.0)
        e.inputs.push_back(labelled("residual SD of ln " + e.quantity, u.residualSdLn, ""));
    else
        e.assumptions.push_back("the equation's own residual error is not included (none given)");
    return true;
}

}  // namespace

Estimate paulyNaturalMortality(double linfCm, double k, double temperatureC, const EquationUncertainty& u)
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
    e.valid = propagate(e,
                        {powerTerm("L∞", linfCm, u.linfSe, "cm", -0.279), powerTerm("K", k, u.kSe, "/year", 0.6543),
                         powerTerm("T", temperatureC, u.temperatureSe, "°C", 0.4634)},
                        u);
    return e;
}

Estimate thenMortalityFromMaxAge(double tmaxYears, const EquationUncertainty& u)
{
    Estimate e = started("M", "Then et al. 2015 maximum-age equation (tmax)");
    if (!checkInputs(e, {{"tmax", tmaxYears, "years", 1.0, 150.0}}, "Then et al. 2015, 226 species"))
        return e;
    e.value = 4.899 * std::pow(tmaxYears, -0.916);
    e.valid = propagate(e, {powerTerm("tmax", tmaxYears, u.tmaxSe, "years", -0.916)}, u);
    return e;
}

Estimate thenMortalityFromGrowth(double linfCm, double k, const EquationUncertainty& u)
{
    Estimate e = started("M", "Then et al. 2015 growth equation (L∞, K)");
    if (!checkInputs(e, {{"L∞", linfCm, "cm", 3.0, 400.0}, {"K", k, "/year", 0.02, 3.0}},
                     "Then et al. 2015, 226 species"))
        return e;
    e.value = 4.118 * std::pow(k, 0.73) * std::pow(linfCm, -0.33);
    e.valid = propagate(e, {powerTerm("L∞", linfCm, u.linfSe, "cm", -0.33), powerTerm("K", k, u.kSe, "/year", 0.73)}, u);
    return e;
}

Estimate palomaresPaulyConsumption(double winfGrams, double temperatureC, double aspectRatio, FeedingType feeding,
                                   const EquationUncertainty& u)
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
    // d ln(Q/B)/dT = ln 10 x 1.965 x 1000 / (T + 273.15)^2; d ln(Q/B)/dA = ln 10 x 0.083.
    const double kelvin = temperatureC + 273.15;
    e.valid = propagate(e,
                        {powerTerm("W∞", winfGrams, u.winfSe, "g", -0.204),
                         {"T", u.temperatureSe, "°C", std::log(10.0) * 1965.0 / (kelvin * kelvin), u.temperatureSe},
                         {"A", u.aspectRatioSe, "", std::log(10.0) * 0.083, u.aspectRatioSe}},
                        u);
    return e;
}

double normalTwoSided(double level)
{
    // Bisection on the normal CDF, 0.5 erfc(-x / sqrt 2), which is monotone: exact to
    // 1e-12 and called once per estimate.
    const double p = 0.5 + level / 2.0;
    double lo = -40.0, hi = 40.0;
    for (int i = 0; i < 200 && hi - lo > 1e-13; ++i) {
        const double mid = 0.5 * (lo + hi);
        (0.5 * std::erfc(-mid / std::sqrt(2.0)) < p ? lo : hi) = mid;
    }
    return 0.5 * (lo + hi);
}

}  // namespace tl::fieldwork
