// The exchange with the independent scipy reconcile (tests/crosscheck/reconcile_scipy.py):
// a model's RAW inputs (given values only, no solved value, no EE computed here), the
// CVs by the rule of DESIGN 3.7 (explicit CV, else the grade's, else grade C), which
// inputs move, pins and bounds. The script states the equations itself.
#pragma once

#include <string>

#include <nlohmann/json.hpp>

#include "core/model/model.h"
#include "core/reconcile/reconcile_problem.h"

namespace tl::testing {

inline double cvOf(const Model& m, std::size_t i, Param p)
{
    const Confidence& c = m.compartment(i).confidenceOf(p);
    if (c.cv && *c.cv > 0.0) return *c.cv;
    if (c.grade != Confidence::Grade::None) return m.rules.cvByGrade[static_cast<std::size_t>(c.grade) - 1];
    return m.rules.cvByGrade[2];
}

inline std::string reconcileProblemJson(const Model& m, const ReconcileOptions& o)
{
    using nlohmann::json;
    auto opt = [](const std::optional<double>& v) { return v ? json(*v) : json(nullptr); };
    json j;
    const auto pools = m.detritusPools();
    json comps = json::array(), cv = json::object(), discards = json::array();
    for (std::size_t i = 0; i < m.size(); ++i) {
        const Compartment& c = m.compartment(i);
        comps.push_back({{"name", c.name}, {"kind", std::string(kindKey(c.kind))},
                         {"biomass", opt(c.value(Param::Biomass))}, {"pb", opt(c.value(Param::PB))},
                         {"qb", opt(c.value(Param::QB))}, {"ee", opt(c.value(Param::EE))},
                         {"pq", opt(c.value(Param::PQ))}, {"unassim", c.isLiving() ? c.unassimilatedOrDefault() : 0.0},
                         {"ba", c.valueOr(Param::BiomassAccum, 0.0)}, {"e", c.valueOr(Param::NetEmigration, 0.0)},
                         {"import", c.isLiving() ? 0.0 : c.valueOr(Param::DetritusImport, 0.0)},
                         {"catch", m.totalCatch(i)}});
        cv[std::to_string(i) + ".b"] = cvOf(m, i, Param::Biomass);
        cv[std::to_string(i) + ".pb"] = cvOf(m, i, Param::PB);
        cv[std::to_string(i) + ".qb"] = cvOf(m, i, Param::QB);
        if (m.deadDiscards(i) > 0.0) discards.push_back({i, pools.front(), m.deadDiscards(i)});
    }
    json diet = json::array(), routing = json::array();
    for (std::size_t p = 0; p < m.size(); ++p)
        for (const auto& [prey, dc] : m.dietRow(p)) diet.push_back({p, prey, dc});
    for (std::size_t i = 0; i < m.size(); ++i)
        if (m.compartment(i).isLiving())
            for (std::size_t d : pools)
                if (const double r = m.effectiveRouting(i, d); r > 0.0) routing.push_back({i, d, r});
    json pins = json::array(), bounds = json::object(), eeMax = json::object(), eeMin = json::object();
    for (const auto& [i, p] : o.pins) pins.push_back({i, std::string(adjustKey(p))});
    for (const auto& [key, b] : o.bounds)
        bounds[std::to_string(key.first) + "." + std::string(adjustKey(key.second))] = {opt(b.lower), opt(b.upper)};
    for (const auto& [i, v] : o.eeMax) eeMax[std::to_string(i)] = v;
    for (const auto& [i, v] : o.eeMin) eeMin[std::to_string(i)] = v;
    j["compartments"] = comps;
    j["diet"] = diet;
    j["routing"] = routing;
    j["discards_to_pool"] = discards;
    j["cv"] = cv;
    j["diet_cv"] = o.dietCv;
    j["catch_cv"] = o.catchCv;
    j["move"] = {{"b", o.moveBiomass}, {"pb", o.movePB}, {"qb", o.moveQB}, {"diet", o.moveDiet}, {"catch", o.moveCatch}};
    j["pins"] = pins;
    j["bounds"] = bounds;
    j["ee_max_default"] = m.rules.eeMax;
    j["ee_max"] = eeMax;
    j["ee_min"] = eeMin;
    j["pq_min"] = m.rules.pqMin;
    j["pq_max"] = m.rules.pqMax;
    j["max_factor"] = o.maxFactor;
    return j.dump();
}

}  // namespace tl::testing
