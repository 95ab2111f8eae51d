// Uses of a compartment's production; see production_uses.h.
#include "core/balance/production_uses.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <limits>

namespace tl {

PredatorIndex predatorIndex(const Model& model)
{
    PredatorIndex index(model.size());
    for (std::size_t j = 0; j < model.size(); ++j)
        if (model.compartment(j).kind == CompartmentKind::Consumer)
            for (const auto& [prey, dc] : model.dietRow(j)) index[prey].emplace_back(j, dc);
    return index;
}

std::vector<ProductionUse> productionUses(const Model& model, const BalanceSheet& sheet, std::size_t i)
{
    return productionUses(model, sheet, i, predatorIndex(model));
}

std::vector<ProductionUse> productionUses(const Model& model, const BalanceSheet& sheet, std::size_t i,
                                          const PredatorIndex& predators)
{
    std::vector<ProductionUse> uses;
    if (i >= model.size() || i >= sheet.rows.size() || !model.compartment(i).isLiving()) return uses;
    const double production = sheet.rows[i].production;
    const auto share = [production](double amount) {
        return production > 0.0 ? amount / production : std::numeric_limits<double>::quiet_NaN();
    };
    for (const auto& [j, dc] : predators[i]) {
        const double eaten = dc * sheet.rows[j].consumption;
        if (!(eaten != 0.0)) continue;
        uses.push_back({ProductionUse::Kind::Predator, model.compartment(j).name, j, eaten, share(eaten)});
    }
    for (std::size_t f = 0; f < model.fleets().size(); ++f) {
        const Fleet& fleet = model.fleet(f);
        const double caught = fleet.landings[i] + fleet.discards[i] * (1.0 - fleet.discardSurvival[i]);
        if (caught != 0.0) uses.push_back({ProductionUse::Kind::Fleet, fleet.name, f, caught, share(caught)});
    }
    const Compartment& c = model.compartment(i);
    if (const double e = c.valueOr(Param::NetEmigration, 0.0); e != 0.0)
        uses.push_back({ProductionUse::Kind::NetEmigration, "", i, e, share(e)});
    if (const double ba = c.valueOr(Param::BiomassAccum, 0.0); ba != 0.0)
        uses.push_back({ProductionUse::Kind::BiomassAccumulation, "", i, ba, share(ba)});
    std::stable_sort(uses.begin(), uses.end(), [](const ProductionUse& a, const ProductionUse& b) {
        return a.amount != b.amount ? a.amount > b.amount : a.name < b.name;
    });
    return uses;
}

std::string describeLargestUses(const std::vector<ProductionUse>& uses, std::size_t count)
{
    std::string out;
    for (std::size_t k = 0; k < uses.size() && k < count; ++k) {
        const ProductionUse& u = uses[k];
        if (!out.empty()) out += ", ";
        out += u.kind == ProductionUse::Kind::NetEmigration         ? std::string("net emigration")
               : u.kind == ProductionUse::Kind::BiomassAccumulation ? std::string("biomass accumulation")
                                                                    : u.name;
        if (std::isfinite(u.shareOfProduction)) {
            char buf[32];
            const auto end = std::to_chars(buf, buf + sizeof buf, std::round(u.shareOfProduction * 100.0),
                                           std::chars_format::fixed, 0).ptr;
            out += ' ';  // appended piece by piece: GCC 12 warns falsely (-Wrestrict) on " " + s + " %"
            out.append(buf, end);
            out += " %";
        }
    }
    return out;
}

}  // namespace tl
