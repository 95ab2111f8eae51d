#include "core/model/plausible_ranges.h"

#include <cmath>
#include <string>

#include "core/model/problem_codes.h"
#include "core/model/text.h"

namespace tl {
namespace {

std::string limitText(double v) { return formatNumber(v); }

}  // namespace

Problems implausibleValues(const Model& model) { return implausibleValues(model, model.rules.plausible); }

Problems implausibleValues(const Model& model, const PlausibleRanges& ranges)
{
    Problems out;
    auto warn = [&out](std::string compartment, std::string parameter, std::string message, std::string hint) {
        Problem p;
        p.code = code::kImplausibleValue;
        p.severity = Severity::Warning;
        p.compartment = std::move(compartment);
        p.parameter = std::move(parameter);
        p.message = std::move(message);
        p.hint = std::move(hint);
        out.push_back(std::move(p));
    };
    const std::string hint = "check the digits and the units; the plausible ranges are wide, so such a value is most "
                             "likely a slip (it is kept as entered)";
    for (std::size_t i = 0; i < model.size(); ++i) {
        const Compartment& c = model.compartment(i);
        for (Param p : kAllParams) {
            const auto& v = c.value(p);
            double limit = 0.0;
            std::string unit;
            switch (p) {
            case Param::Biomass: limit = ranges.biomassMax, unit = model.units.biomass(); break;
            case Param::PB:
            case Param::QB: limit = ranges.rateMax, unit = model.units.rate(); break;
            case Param::BiomassAccum:
            case Param::NetEmigration:
            case Param::DetritusImport: limit = ranges.flowMax, unit = model.units.flow(); break;
            default: continue;  // EE, P/Q and U are fractions, checked by validation
            }
            if (!v || !(std::abs(*v) > limit)) continue;
            warn(c.name, std::string(paramKey(p)),
                 std::string(paramSymbol(p)) + " of '" + c.name + "' is " + formatNumber(*v) + " " + unit +
                     ", beyond the plausible " + (p == Param::BiomassAccum || p == Param::NetEmigration ? "±" : "") +
                     limitText(limit) + " " + unit,
                 hint);
        }
    }
    for (const Fleet& f : model.fleets())
        for (std::size_t i = 0; i < model.size(); ++i)
            for (const auto* amounts : {&f.landings, &f.discards})
                if (i < amounts->size() && std::abs((*amounts)[i]) > ranges.flowMax) {
                    warn(model.compartment(i).name, "harvest",
                         std::string(amounts == &f.landings ? "landings" : "discards") + " of '" +
                             model.compartment(i).name + "' by " + f.name + " are " + formatNumber((*amounts)[i]) + " " +
                             model.units.flow() + ", beyond the plausible " + limitText(ranges.flowMax) + " " +
                             model.units.flow(),
                         hint);
                    out.back().fleet = f.name;
                }
    return out;
}

}  // namespace tl
