#include "core/compare/scenario_comparison.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>

#include "core/balance/solver.h"
#include "core/model/names.h"
#include "core/model/text.h"

namespace tl {
namespace {

constexpr double kRelativeTolerance = 1e-9;  // see the header: round-off is not a change

std::string shortNumber(double v)
{
    char text[32];
    std::snprintf(text, sizeof text, "%.6g", v);
    return text;
}

std::string shownValue(const std::optional<double>& v) { return v ? shortNumber(*v) : std::string("-"); }

std::string confidenceText(const Confidence& c)
{
    if (c.cv) return "CV " + shortNumber(*c.cv);
    return std::string(gradeKey(c.grade));
}

// Names in order of first appearance over all scenarios, matched by nameKey; per name,
// its index in each scenario (or none).
struct NameUnion {
    std::vector<std::string> names;                             // as first written
    std::vector<std::vector<std::optional<std::size_t>>> where;  // [name][scenario]
};

template <typename NamesOf>
NameUnion unionOfNames(std::size_t scenarios, NamesOf namesOf)
{
    NameUnion u;
    std::map<std::string, std::size_t> byKey;
    for (std::size_t s = 0; s < scenarios; ++s) {
        const std::vector<std::string> names = namesOf(s);
        for (std::size_t i = 0; i < names.size(); ++i) {
            const std::string key = nameKey(names[i]);
            auto [it, fresh] = byKey.emplace(key, u.names.size());
            if (fresh) {
                u.names.push_back(names[i]);
                u.where.emplace_back(scenarios);
            }
            u.where[it->second][s] = i;
        }
    }
    return u;
}

bool allEqual(const std::vector<std::optional<double>>& v)
{
    return std::all_of(v.begin(), v.end(), [&](const auto& x) { return x == v.front(); });
}

template <typename T>
bool allEqualT(const std::vector<T>& v)
{
    return std::all_of(v.begin(), v.end(), [&](const T& x) { return x == v.front(); });
}

// A numeric input row (diet share, routing, harvest): 0 where it is not there.
void addNumericRow(std::vector<InputDifference>& out, const std::string& compartment, std::string item, std::string label,
                   std::vector<std::optional<double>> values)
{
    if (allEqual(values)) return;
    InputDifference d;
    d.compartment = compartment;
    d.item = std::move(item);
    d.label = std::move(label);
    for (const auto& v : values) d.shown.push_back(shownValue(v));
    d.values = std::move(values);
    d.valueDiffers = true;
    out.push_back(std::move(d));
}

std::vector<InputDifference> compareInputs(const std::vector<const Scenario*>& sc)
{
    const std::size_t n = sc.size();
    std::vector<InputDifference> out;
    const auto modelOf = [&](std::size_t s) -> const Model& { return sc[s]->model; };
    const NameUnion comps = unionOfNames(n, [&](std::size_t s) {
        std::vector<std::string> names;
        for (const Compartment& c : modelOf(s).compartments()) names.push_back(c.name);
        return names;
    });
    const NameUnion fleets = unionOfNames(n, [&](std::size_t s) {
        std::vector<std::string> names;
        for (const Fleet& f : modelOf(s).fleets()) names.push_back(f.name);
        return names;
    });
    // The index in scenario s of the compartment with this union index.
    const auto compIn = [&](std::size_t u, std::size_t s) { return comps.where[u][s]; };

    for (std::size_t u = 0; u < comps.names.size(); ++u) {
        const std::string& name = comps.names[u];
        bool everywhere = true;
        for (std::size_t s = 0; s < n; ++s) everywhere = everywhere && compIn(u, s).has_value();
        if (!everywhere) {
            InputDifference d;
            d.compartment = name;
            d.item = "compartment";
            d.label = "Compartment";
            for (std::size_t s = 0; s < n; ++s)
                d.shown.push_back(compIn(u, s) ? std::string(kindKey(modelOf(s).compartment(*compIn(u, s)).kind)) : "absent");
            d.valueDiffers = true;
            out.push_back(std::move(d));
            continue;  // its parameters are not listed again
        }
        const auto comp = [&](std::size_t s) -> const Compartment& { return modelOf(s).compartment(*compIn(u, s)); };
        {
            std::vector<std::string> kinds;
            for (std::size_t s = 0; s < n; ++s) kinds.emplace_back(kindKey(comp(s).kind));
            if (!allEqualT(kinds)) {
                InputDifference d;
                d.compartment = name;
                d.item = "kind";
                d.label = "Kind";
                d.shown = kinds;
                d.valueDiffers = true;
                out.push_back(std::move(d));
            }
        }
        for (Param p : kAllParams) {
            InputDifference d;
            d.compartment = name;
            d.item = std::string(paramKey(p));
            d.label = std::string(paramSymbol(p));
            for (std::size_t s = 0; s < n; ++s) {
                const Compartment& c = comp(s);
                d.values.push_back(c.value(p));
                d.shown.push_back(shownValue(c.value(p)));
                d.sources.push_back(c.confidenceOf(p).source);
                d.confidence.push_back(confidenceText(c.confidenceOf(p)));
            }
            d.valueDiffers = !allEqual(d.values);
            d.sourceDiffers = !allEqualT(d.sources);
            d.confidenceDiffers = !allEqualT(d.confidence);
            if (d.valueDiffers || d.sourceDiffers || d.confidenceDiffers) out.push_back(std::move(d));
        }
        // Diet: every prey any scenario gives this predator, plus import.
        const NameUnion prey = unionOfNames(n, [&](std::size_t s) {
            std::vector<std::string> names;
            for (const GridEntry& e : modelOf(s).dietRow(*compIn(u, s)))
                names.push_back(modelOf(s).compartment(e.col).name);
            return names;
        });
        for (std::size_t q = 0; q < prey.names.size(); ++q) {
            std::vector<std::optional<double>> shares;
            for (std::size_t s = 0; s < n; ++s)
                shares.emplace_back(prey.where[q][s] ? modelOf(s).diet(*compIn(u, s), *prey.where[q][s]) : 0.0);
            addNumericRow(out, name, "diet:" + prey.names[q], "Diet share of " + prey.names[q], std::move(shares));
        }
        {
            std::vector<std::optional<double>> shares;
            for (std::size_t s = 0; s < n; ++s) shares.emplace_back(modelOf(s).dietImport(*compIn(u, s)));
            addNumericRow(out, name, "diet:import", "Diet share imported", std::move(shares));
        }
        // Detritus routing, as the balance uses it (default: all to the first pool).
        const NameUnion pools = unionOfNames(n, [&](std::size_t s) {
            std::vector<std::string> names;
            for (std::size_t d : modelOf(s).detritusPools()) names.push_back(modelOf(s).compartment(d).name);
            return names;
        });
        for (std::size_t q = 0; q < pools.names.size(); ++q) {
            std::vector<std::optional<double>> shares;
            for (std::size_t s = 0; s < n; ++s) {
                const auto at = pools.where[q][s];  // index among the scenario's pools
                const std::vector<std::size_t> poolsHere = modelOf(s).detritusPools();
                shares.emplace_back(at ? modelOf(s).effectiveRouting(*compIn(u, s), poolsHere[*at]) : 0.0);
            }
            addNumericRow(out, name, "routing:" + pools.names[q], "Detritus routed to " + pools.names[q],
                          std::move(shares));
        }
        // Harvest of this compartment, fleet by fleet.
        for (std::size_t f = 0; f < fleets.names.size(); ++f) {
            std::vector<std::optional<double>> landings, discards, survival;
            for (std::size_t s = 0; s < n; ++s) {
                const auto at = fleets.where[f][s];
                const std::size_t i = *compIn(u, s);
                const Fleet* fleet = at ? &modelOf(s).fleet(*at) : nullptr;
                // A fleet absent from a scenario has no entries there ("-"), not zeros.
                const auto entry = [&](const std::vector<double>& v) -> std::optional<double> {
                    if (!fleet) return std::nullopt;
                    return i < v.size() ? v[i] : 0.0;
                };
                landings.push_back(entry(fleet ? fleet->landings : std::vector<double>{}));
                discards.push_back(entry(fleet ? fleet->discards : std::vector<double>{}));
                survival.push_back(entry(fleet ? fleet->discardSurvival : std::vector<double>{}));
            }
            // Where the fleet is absent and takes nothing of this compartment where it is
            // present, the fleet's own row (below) says all there is.
            const auto nothingTaken = [](const std::vector<std::optional<double>>& v) {
                return std::all_of(v.begin(), v.end(), [](const auto& x) { return !x || *x == 0.0; });
            };
            if (nothingTaken(landings)) landings.assign(n, 0.0);
            if (nothingTaken(discards)) discards.assign(n, 0.0);
            if (nothingTaken(survival)) survival.assign(n, 0.0);
            const std::string& fleetName = fleets.names[f];
            addNumericRow(out, name, "landings:" + fleetName, "Landings by " + fleetName, std::move(landings));
            addNumericRow(out, name, "discards:" + fleetName, "Discards by " + fleetName, std::move(discards));
            addNumericRow(out, name, "discard_survival:" + fleetName, "Discard survival, " + fleetName,
                          std::move(survival));
        }
    }
    // Fleets as a whole: present or not, and where their dead discards go.
    for (std::size_t f = 0; f < fleets.names.size(); ++f) {
        const std::string& fleetName = fleets.names[f];
        std::vector<std::string> present, pool;
        for (std::size_t s = 0; s < n; ++s) {
            const auto at = fleets.where[f][s];
            present.emplace_back(at ? "present" : "absent");
            const auto p = at ? modelOf(s).fleet(*at).discardPool : std::nullopt;
            pool.push_back(!at ? "-" : p ? modelOf(s).compartment(*p).name : "first detritus pool");
        }
        const auto addText = [&](std::string item, std::string label, std::vector<std::string> shown) {
            InputDifference d;
            d.item = std::move(item);
            d.label = std::move(label);
            d.shown = std::move(shown);
            d.valueDiffers = true;
            out.push_back(std::move(d));
        };
        if (!allEqualT(present)) addText("fleet:" + fleetName, "Fleet " + fleetName, present);
        else if (!allEqualT(pool)) addText("discard_pool:" + fleetName, "Discard pool of " + fleetName, pool);
    }
    return out;
}

// --- outputs ----------------------------------------------------------------------

enum class UnitKind { None, Biomass, Flow, Rate };

std::string unitText(UnitKind k, const Units& u)
{
    switch (k) {
    case UnitKind::Biomass: return u.biomass();
    case UnitKind::Flow: return u.flow();
    case UnitKind::Rate: return u.rate();
    case UnitKind::None: break;
    }
    return "";
}

struct CompartmentQuantity {
    const char* key;
    const char* label;
    UnitKind unit;
    double CompartmentBalance::*field;
};

// The solve JSON's keys where it has them (DESIGN 5.3).
constexpr CompartmentQuantity kCompartmentQuantities[] = {
    {"biomass", "B", UnitKind::Biomass, &CompartmentBalance::biomass},
    {"pb", "P/B", UnitKind::Rate, &CompartmentBalance::pb},
    {"qb", "Q/B", UnitKind::Rate, &CompartmentBalance::qb},
    {"ee", "EE", UnitKind::None, &CompartmentBalance::ee},
    {"pq", "P/Q", UnitKind::None, &CompartmentBalance::pq},
    {"tl", "TL", UnitKind::None, &CompartmentBalance::tl},
    {"oi", "Omnivory index", UnitKind::None, &CompartmentBalance::oi},
    {"production", "P", UnitKind::Flow, &CompartmentBalance::production},
    {"consumption", "Q", UnitKind::Flow, &CompartmentBalance::consumption},
    {"respiration", "R", UnitKind::Flow, &CompartmentBalance::respiration},
    {"flow_to_detritus", "Flow to detritus", UnitKind::Flow, &CompartmentBalance::flowToDetritus},
    {"predation", "Predation", UnitKind::Flow, &CompartmentBalance::predation},
    {"catch", "Catch", UnitKind::Flow, &CompartmentBalance::catchTotal},
    {"m2", "Predation mortality M2", UnitKind::Rate, &CompartmentBalance::m2},
    {"f", "Fishing mortality F", UnitKind::Rate, &CompartmentBalance::f},
    {"m0", "Other mortality M0", UnitKind::Rate, &CompartmentBalance::m0},
    {"detritus_inflow", "Detritus inflow", UnitKind::Flow, &CompartmentBalance::detritusInflow},
    {"detritus_consumption", "Detritus consumed", UnitKind::Flow, &CompartmentBalance::detritusConsumption},
    {"detritus_export", "Detritus exported", UnitKind::Flow, &CompartmentBalance::detritusExport},
};

struct SystemQuantity {
    const char* key;
    const char* label;
    UnitKind unit;
    double (*get)(const NetworkAnalysis&);
};

// Keys as in `tledger network --json`.
constexpr SystemQuantity kSystemQuantities[] = {
    {"tst", "Total system throughput (TST)", UnitKind::Flow, [](const NetworkAnalysis& a) { return a.indicators.tst; }},
    {"tstp", "TST with boundary flows (TSTp)", UnitKind::Flow, [](const NetworkAnalysis& a) { return a.indicators.tstp; }},
    {"total_primary_production", "Total primary production", UnitKind::Flow,
     [](const NetworkAnalysis& a) { return a.indicators.totalPrimaryProduction; }},
    {"total_respiration", "Total respiration", UnitKind::Flow, [](const NetworkAnalysis& a) { return a.indicators.totalRespiration; }},
    {"tpp_over_r", "TPP / R", UnitKind::None, [](const NetworkAnalysis& a) { return a.indicators.tppOverR; }},
    {"tpp_over_b", "TPP / B", UnitKind::Rate, [](const NetworkAnalysis& a) { return a.indicators.tppOverB; }},
    {"total_biomass", "Total living biomass", UnitKind::Biomass, [](const NetworkAnalysis& a) { return a.indicators.totalLivingBiomass; }},
    {"fci", "Finn cycling index", UnitKind::None, [](const NetworkAnalysis& a) { return a.indicators.fci; }},
    {"apl", "Average path length", UnitKind::None, [](const NetworkAnalysis& a) { return a.indicators.apl; }},
    {"ami", "Average mutual information (bits)", UnitKind::None, [](const NetworkAnalysis& a) { return a.indicators.ami; }},
    {"ascendency", "Ascendency (flow x bits)", UnitKind::Flow, [](const NetworkAnalysis& a) { return a.indicators.ascendency; }},
    {"capacity", "Development capacity (flow x bits)", UnitKind::Flow, [](const NetworkAnalysis& a) { return a.indicators.capacity; }},
    {"overhead", "Overhead (flow x bits)", UnitKind::Flow, [](const NetworkAnalysis& a) { return a.indicators.overhead; }},
    {"connectance", "Connectance, all internal flows", UnitKind::None, [](const NetworkAnalysis& a) { return a.indicators.connectance; }},
    {"food_web_connectance", "Food-web connectance", UnitKind::None,
     [](const NetworkAnalysis& a) { return a.indicators.foodWebConnectance; }},
    {"system_omnivory", "System omnivory index", UnitKind::None, [](const NetworkAnalysis& a) { return a.indicators.systemOmnivory; }},
    {"total_catch", "Total catch", UnitKind::Flow, [](const NetworkAnalysis& a) { return a.indicators.totalCatch; }},
    {"catch_mean_tl", "Mean trophic level of the catch (landings)", UnitKind::None,
     [](const NetworkAnalysis& a) { return a.indicators.catchMeanTl; }},
    {"catch_ppr_share_of_tpp", "PPR of the catch / (TPP + detritus inflow)", UnitKind::None,
     [](const NetworkAnalysis& a) { return a.indicators.catchPprShareOfTpp; }},
    {"mean_te", "Mean transfer efficiency, levels II-IV", UnitKind::None,
     [](const NetworkAnalysis& a) { return a.levels.combined.meanTe; }},
    {"primary_production_consumed", "Share of primary production consumed", UnitKind::None,
     [](const NetworkAnalysis& a) { return a.levels.primaryProductionConsumed; }},
    {"detritus_inflow_consumed", "Share of detritus inflow consumed", UnitKind::None,
     [](const NetworkAnalysis& a) { return a.levels.detritusInflowConsumed; }},
};

void fillDifferences(ComparedOutput& o)
{
    const double ref = o.values.front();
    o.differences.assign(o.values.size(), OutputDifference{});
    o.differences[0] = OutputDifference{0.0, 0.0, false, std::nullopt};
    for (std::size_t s = 1; s < o.values.size(); ++s) {
        const double x = o.values[s];
        OutputDifference& d = o.differences[s];
        const bool refHas = !std::isnan(ref), xHas = !std::isnan(x);
        if (!refHas || !xHas) {
            d.differs = refHas != xHas;  // a value in one and none in the other
            continue;
        }
        d.absolute = x - ref;
        if (std::isinf(x) || std::isinf(ref)) {
            d.differs = x != ref;
            d.absolute = x == ref ? 0.0 : kNotApplicable;
            continue;
        }
        d.differs = std::abs(d.absolute) > kRelativeTolerance * std::max(std::abs(x), std::abs(ref));
        if (!d.differs) d.absolute = 0.0;
        if (ref != 0.0) d.percent = 100.0 * d.absolute / std::abs(ref);
        else if (!d.differs) d.percent = 0.0;
    }
}

}  // namespace

bool ComparedOutput::differs() const
{
    return std::any_of(differences.begin(), differences.end(), [](const OutputDifference& d) { return d.differs; });
}

std::string ComparedOutput::key() const { return subject.empty() ? quantity : subject + "." + quantity; }

std::size_t ScenarioComparison::differingOutputs() const
{
    return static_cast<std::size_t>(std::count_if(outputs.begin(), outputs.end(), [](const ComparedOutput& o) { return o.differs(); }));
}

ScenarioComparison compareScenarios(const std::vector<const Scenario*>& scenarios, const AnalysisOptions& options)
{
    ScenarioComparison c;
    const std::size_t n = scenarios.size();
    if (n == 0) return c;
    c.units = scenarios.front()->model.units;
    for (const Scenario* s : scenarios) {
        c.scenarios.push_back(s->name);
        c.sheets.push_back(solveBalance(s->model));
        c.analyses.push_back(analyseNetwork(s->model, c.sheets.back(), options));
    }
    c.inputs = compareInputs(scenarios);

    // Compartment outputs, in the union order of the compartments.
    const NameUnion comps = unionOfNames(n, [&](std::size_t s) {
        std::vector<std::string> names;
        for (const CompartmentBalance& row : c.sheets[s].rows) names.push_back(row.name);
        return names;
    });
    for (std::size_t u = 0; u < comps.names.size(); ++u) {
        for (const CompartmentQuantity& q : kCompartmentQuantities) {
            ComparedOutput o;
            o.group = OutputGroup::Compartment;
            o.subject = comps.names[u];
            o.quantity = q.key;
            o.label = q.label;
            o.unit = unitText(q.unit, c.units);
            bool anyValue = false;
            for (std::size_t s = 0; s < n; ++s) {
                const auto at = comps.where[u][s];
                const double v = at ? c.sheets[s].rows[*at].*q.field : kNotApplicable;
                anyValue = anyValue || !std::isnan(v);
                o.values.push_back(v);
            }
            if (!anyValue) continue;  // not applicable to this compartment anywhere (detritus P/B, ...)
            fillDifferences(o);
            c.outputs.push_back(std::move(o));
        }
    }

    // Integer trophic levels (combined chains).
    int levels = 0;
    for (const NetworkAnalysis& a : c.analyses)
        if (a.available()) levels = std::max(levels, a.levels.levelCount());
    struct LevelQuantity {
        const char* key;
        const char* label;
        UnitKind unit;
        double TrophicLevelBin::*field;
    };
    constexpr LevelQuantity kLevelQuantities[] = {
        {"throughput", "Throughput", UnitKind::Flow, &TrophicLevelBin::throughput},
        {"biomass", "Biomass", UnitKind::Biomass, &TrophicLevelBin::biomass},
        {"production", "Production", UnitKind::Flow, &TrophicLevelBin::production},
        {"catch", "Catch", UnitKind::Flow, &TrophicLevelBin::catchTotal},
        {"te", "Transfer efficiency", UnitKind::None, &TrophicLevelBin::te},
    };
    for (int k = 1; k <= levels; ++k) {
        for (const LevelQuantity& q : kLevelQuantities) {
            if (k == 1 && std::string_view(q.key) == "te") continue;  // not defined at level I
            ComparedOutput o;
            o.group = OutputGroup::Level;
            o.subject = levelName(k);
            o.quantity = q.key;
            o.label = q.label;
            o.unit = unitText(q.unit, c.units);
            for (std::size_t s = 0; s < n; ++s) {
                const NetworkAnalysis& a = c.analyses[s];
                const bool has = a.available() && k <= a.levels.levelCount();
                o.values.push_back(has ? a.levels.combined.levels[static_cast<std::size_t>(k - 1)].*q.field : kNotApplicable);
            }
            fillDifferences(o);
            c.outputs.push_back(std::move(o));
        }
    }

    for (const SystemQuantity& q : kSystemQuantities) {
        ComparedOutput o;
        o.group = OutputGroup::System;
        o.quantity = q.key;
        o.label = q.label;
        o.unit = unitText(q.unit, c.units);
        for (std::size_t s = 0; s < n; ++s)
            o.values.push_back(c.analyses[s].available() ? q.get(c.analyses[s]) : kNotApplicable);
        fillDifferences(o);
        c.outputs.push_back(std::move(o));
    }
    return c;
}

std::vector<const Scenario*> pickScenarios(const Project& project, const std::vector<std::string>& names,
                                           std::string& error)
{
    error.clear();
    std::vector<const Scenario*> picked;
    std::vector<std::string> unknown, repeated;
    for (const std::string& name : names) {
        const Scenario* found = nullptr;
        for (const Scenario& s : project.scenarios)
            if (sameName(s.name, name)) found = &s;
        if (!found) unknown.push_back(name);
        else if (std::find(picked.begin(), picked.end(), found) != picked.end()) repeated.push_back(name);
        else picked.push_back(found);
    }
    const auto quoted = [](const std::vector<std::string>& list) {
        std::string text;
        for (const std::string& s : list) text += (text.empty() ? "'" : ", '") + s + "'";
        return text;
    };
    if (!unknown.empty()) {
        error = (unknown.size() == 1 ? "no scenario named " : "no scenarios named ") + quoted(unknown) +
                "; the project has " + quoted(project.scenarioNames());
    } else if (!repeated.empty()) {
        error = "scenario " + quoted(repeated) + " is named twice; name each scenario once";
    } else if (picked.size() < 2) {
        error = "a comparison needs at least two scenarios (the project has " + quoted(project.scenarioNames()) + ")";
    }
    if (!error.empty()) picked.clear();
    return picked;
}

std::vector<std::string> splitScenarioList(std::string_view list)
{
    std::vector<std::string> out;
    std::size_t start = 0;
    while (start <= list.size()) {
        const std::size_t comma = std::min(list.find(',', start), list.size());
        const std::string item(trim(list.substr(start, comma - start)));
        if (!item.empty()) out.push_back(item);
        start = comma + 1;
    }
    return out;
}

std::vector<const ComparedOutput*> largestRelativeChanges(const ScenarioComparison& comparison, std::size_t s,
                                                          std::size_t count)
{
    std::vector<const ComparedOutput*> rows;
    for (const ComparedOutput& o : comparison.outputs)
        if (o.group == OutputGroup::Compartment && s < o.differences.size() && o.differences[s].differs &&
            std::isfinite(o.differences[s].percent))
            rows.push_back(&o);
    std::stable_sort(rows.begin(), rows.end(), [s](const ComparedOutput* a, const ComparedOutput* b) {
        return std::abs(a->differences[s].percent) > std::abs(b->differences[s].percent);
    });
    if (rows.size() > count) rows.resize(count);
    return rows;
}

double sameSignShare(std::span<const double> reference, std::span<const double> other, double pointDifference)
{
    if (!(pointDifference != 0.0) || std::isnan(pointDifference)) return kNotApplicable;
    std::size_t pairs = 0, same = 0;
    for (std::size_t k = 0; k < std::min(reference.size(), other.size()); ++k) {
        if (!std::isfinite(reference[k]) || !std::isfinite(other[k])) continue;
        ++pairs;
        const double d = other[k] - reference[k];
        if ((d > 0.0 && pointDifference > 0.0) || (d < 0.0 && pointDifference < 0.0)) ++same;
    }
    return pairs == 0 ? kNotApplicable : static_cast<double>(same) / static_cast<double>(pairs);
}

std::size_t attachEnsembleAgreement(ScenarioComparison& comparison, const EnsembleDrawLookup& lookup)
{
    if (!lookup || comparison.scenarios.empty()) return 0;
    std::size_t filled = 0;
    for (ComparedOutput& o : comparison.outputs) {
        const std::string key = o.key();
        const auto reference = lookup(comparison.scenarios.front(), key);
        if (!reference) continue;
        for (std::size_t s = 1; s < comparison.scenarios.size() && s < o.differences.size(); ++s) {
            const auto other = lookup(comparison.scenarios[s], key);
            if (!other || other->size() != reference->size()) continue;
            o.differences[s].sameSignShare = sameSignShare(*reference, *other, o.differences[s].absolute);
            ++filled;
        }
    }
    return filled;
}

}  // namespace tl
