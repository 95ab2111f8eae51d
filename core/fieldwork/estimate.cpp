#include "core/fieldwork/estimate.h"

#include <cmath>
#include <cstdio>

#include "core/model/problem_codes.h"
#include "core/model/text.h"

namespace tl::fieldwork {

std::string shortNumber(double v)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.4g", v);
    return buffer;
}

Estimate newEstimate(std::string quantity, std::string unit, double ciLevel)
{
    Estimate e;
    e.quantity = std::move(quantity);
    e.unit = std::move(unit);
    e.ciLevel = ciLevel;
    return e;
}

std::string labelled(std::string_view label, double v, std::string_view unit)
{
    std::string out(label);
    out.append(" ").append(shortNumber(v));
    if (!unit.empty()) out.append(" ").append(unit);
    return out;
}

std::string sourceNote(const Estimate& e, const std::string& date)
{
    std::string note = "fieldwork " + date + ": " + e.quantity + " by " + e.method;
    if (!e.inputs.empty()) {
        note += "; inputs: ";
        for (std::size_t k = 0; k < e.inputs.size(); ++k) note += (k ? ", " : "") + e.inputs[k];
    }
    if (e.cv) note += "; CV " + shortNumber(*e.cv);
    if (e.ciLow && e.ciHigh)
        note += "; " + shortNumber(e.ciLevel * 100) + " % CI " + shortNumber(*e.ciLow) + " to " + shortNumber(*e.ciHigh);
    for (const std::string& a : e.assumptions) note += "; assumed: " + a;
    return note;
}

Problems writeEstimate(Model& model, std::size_t compartment, Param param, const Estimate& e, const std::string& date)
{
    Problems problems;
    Compartment& c = model.compartment(compartment);
    auto refuse = [&](std::string message) {
        Problem p;
        p.code = code::kFieldworkTarget;
        p.compartment = c.name;
        p.parameter = std::string(paramKey(param));
        p.message = std::move(message);
        problems.push_back(std::move(p));
        return problems;
    };
    if (!e.valid || !std::isfinite(e.value) || e.value < 0.0)
        return refuse("there is no usable estimate to write into " + std::string(paramSymbol(param)) + " of " + c.name);
    if (param != Param::Biomass && param != Param::PB && param != Param::QB)
        return refuse("fieldwork writes B, P/B or Q/B, not " + std::string(paramSymbol(param)));
    if (!c.isLiving()) return refuse(c.name + " is a detritus pool; survey estimates fill living compartments");
    if (param == Param::QB && c.kind == CompartmentKind::Producer)
        return refuse(c.name + " is a producer; producers have no consumption (Q/B)");

    Confidence& conf = c.confidenceOf(param);
    std::string note = sourceNote(e, date);
    if (const auto& before = c.value(param)) note += "; before: " + formatNumber(*before);
    if (!conf.source.empty()) note += "; earlier source: " + conf.source;
    if (!c.value(param) && c.value(Param::EE) && (param == Param::Biomass || c.value(Param::Biomass))) {
        Problem p;
        p.code = code::kFieldworkNothingUnknown;
        p.severity = Severity::Warning;
        p.compartment = c.name;
        p.parameter = std::string(paramKey(param));
        p.message = std::string(paramSymbol(param)) + " of " + c.name +
                    " was left for the balance to solve, and its EE is given: with both given nothing is left unknown and the "
                    "balance only checks the equation";
        p.hint = "Clear the EE of " + c.name + " to let the balance solve it instead.";
        problems.push_back(std::move(p));
    }
    c.value(param) = e.value;
    conf.source = std::move(note);
    conf.cv = e.cv;
    if (!e.cv) conf.grade = Confidence::Grade::C;
    return problems;
}

}  // namespace tl::fieldwork
