// Estimate: one model parameter worked out from survey data or an empirical equation,
// with its uncertainty and a record of how it was made (DESIGN.md 3.8). Every estimator
// of core/fieldwork returns one; writeEstimate puts it into a compartment's parameter
// with its CV and a source note (method, inputs, date), as reconcile annotates the
// values it changes.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl::fieldwork {

struct Estimate {
    std::string quantity;            // what it estimates: "B", "Z", "M", "Q/B", ...
    double value = 0.0;
    std::string unit;                // "t wet weight/km²", "/year", ...
    std::optional<double> cv;        // coefficient of variation (sampling), when one is known
    std::optional<double> ciLow, ciHigh;
    double ciLevel = 0.95;           // of [ciLow, ciHigh]
    std::string method;              // "swept area (Sparre & Venema 1998), 3 strata"
    std::vector<std::string> inputs;       // "L∞ = 42 cm", "hauls = 18", ...
    std::vector<std::string> assumptions;  // stated, never hidden: "catchability X1 = 0.5 (assumed)"
    Problems warnings;               // e.g. an input outside an equation's fitted range
    bool valid = false;              // false: `problems` say why there is no value
    Problems problems;               // errors that prevented the estimate
};

// An estimate of `quantity` in `unit` not yet made (valid false).
Estimate newEstimate(std::string quantity, std::string unit, double ciLevel = 0.95);

// "fieldwork 2026-12-02T...Z: <method>; inputs: ...; CV 0.12; 95 % CI 3.1-5.2; assumed: ..."
std::string sourceNote(const Estimate& e, const std::string& date);

// The parameters an estimate may fill (P/B from Z, Q/B from the consumption equation,
// B from swept area): refuses a parameter the compartment's kind does not take
// (a detritus pool's P/B, a producer's Q/B). On success sets the value, the explicit CV
// (when the estimate has one; otherwise the CV is cleared and grade C set, this
// project's convention for an empirical equation without a sampling CV) and the
// source note, keeping the earlier value and source in the note. A value the balance
// solved before (empty) while EE is given leaves the compartment with nothing unknown:
// written all the same, with a warning (fieldwork-nothing-unknown) saying to clear EE.
Problems writeEstimate(Model& model, std::size_t compartment, Param param, const Estimate& e, const std::string& date);

// A number as the notes print it (4 significant digits).
std::string shortNumber(double v);
// "<label> <number> <unit>" for an input list ("L∞ 42 cm"; no unit: "<label> <number>").
std::string labelled(std::string_view label, double v, std::string_view unit);

}  // namespace tl::fieldwork
