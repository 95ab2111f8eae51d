#include "core/io/stored_run_summary.h"

#include <algorithm>
#include <map>

#include <nlohmann/json.hpp>

namespace tl {
namespace {

using Json = nlohmann::ordered_json;  // keeps the outputs in the order the run wrote them

std::optional<double> number(const Json& object, const char* key)
{
    const auto it = object.find(key);
    if (it == object.end() || !it->is_number()) return std::nullopt;
    return it->get<double>();
}

std::string text(const Json& object, const char* key)
{
    const auto it = object.find(key);
    if (it == object.end()) return {};
    if (it->is_string()) return it->get<std::string>();
    if (it->is_number_integer()) return std::to_string(it->get<long long>());
    if (it->is_number_unsigned()) return std::to_string(it->get<unsigned long long>());
    return {};
}

long long integer(const Json& object, const char* key)
{
    const auto v = number(object, key);
    return v ? static_cast<long long>(*v) : 0;
}

bool flag(const Json& object, const char* key, bool otherwise)
{
    const auto it = object.find(key);
    return it != object.end() && it->is_boolean() ? it->get<bool>() : otherwise;
}

// The summary JSON as an object, or why not.
std::optional<Json> parseObject(const StoredRun& run, std::string& error)
{
    Json j = Json::parse(run.summaryJson, nullptr, false);
    if (j.is_discarded()) {
        error = "the stored " + run.kind + " run's summary is not valid JSON";
        return std::nullopt;
    }
    if (!j.is_object()) {
        error = "the stored " + run.kind + " run's summary is not a JSON object";
        return std::nullopt;
    }
    return j;
}

}  // namespace

const std::vector<KeyEnsembleOutput> kKeyEnsembleOutputs = {
    {"system.te_II", "TE, level II", KeyOutputUnit::Percent},
    {"system.te_III", "TE, level III", KeyOutputUnit::Percent},
    {"system.te_IV", "TE, level IV", KeyOutputUnit::Percent},
    {"system.mean_te", "Mean TE, levels II-IV", KeyOutputUnit::Percent},
    {"system.primary_production_consumed", "Share of primary production consumed", KeyOutputUnit::None},
    {"system.tst", "Total system throughput", KeyOutputUnit::Flow},
    {"system.fci", "Finn cycling index", KeyOutputUnit::None},
    {"system.apl", "Average path length", KeyOutputUnit::None},
    {"system.total_biomass", "Total living biomass", KeyOutputUnit::Biomass},
    {"system.system_omnivory", "System omnivory index", KeyOutputUnit::None},
    {"system.catch_mean_tl", "Mean trophic level of the catch", KeyOutputUnit::None},
};

EnsembleRunSummary readEnsembleRun(const StoredRun& run)
{
    EnsembleRunSummary s;
    const auto j = parseObject(run, s.error);
    if (!j) return s;
    if (!j->contains("draws") || !j->contains("outputs") || !(*j)["outputs"].is_object()) {
        s.error = "the stored ensemble run's summary lacks 'draws' or 'outputs'";
        return s;
    }
    s.draws = integer(*j, "draws");
    s.balancedDraws = integer(*j, "balanced_draws");
    s.totalDraws = integer(*j, "total_draws");
    s.balancedShare = number(*j, "balanced_share").value_or(0.0);
    s.seed = text(*j, "seed");
    s.shape = text(*j, "shape");
    s.complete = flag(*j, "complete", true);
    s.cancelled = flag(*j, "cancelled", false);
    const Json& outputs = (*j)["outputs"];
    for (const KeyEnsembleOutput& key : kKeyEnsembleOutputs) {
        const auto it = outputs.find(key.output);
        if (it == outputs.end() || !it->is_object()) continue;
        EnsembleRunSummary::Row row{key.output, key.label, key.unit, number(*it, "p2_5"), number(*it, "p50"),
                                    number(*it, "p97_5"), number(*it, "mean"), integer(*it, "count")};
        // TE is a fraction in the JSON; the table shows percent like the rest of the report.
        if (row.unit == KeyOutputUnit::Percent)
            for (std::optional<double>* v : {&row.p2_5, &row.p50, &row.p97_5, &row.mean})
                if (*v) **v *= 100.0;
        s.keyOutputs.push_back(std::move(row));
    }
    // A run without the level and indicator analyses: the EE of each compartment, the
    // balance condition the draws are tested against.
    if (s.keyOutputs.empty())
        for (const auto& [name, o] : outputs.items()) {
            const std::string suffix = ".ee";
            if (!o.is_object() || name.size() <= suffix.size() || name.compare(name.size() - suffix.size(), suffix.size(), suffix) != 0)
                continue;
            if (s.keyOutputs.size() == kMostEeRows) {
                ++s.outputsLeftOut;
                continue;
            }
            s.keyOutputs.push_back({name, "EE, " + name.substr(0, name.size() - suffix.size()), KeyOutputUnit::None,
                                    number(o, "p2_5"), number(o, "p50"), number(o, "p97_5"), number(o, "mean"), integer(o, "count")});
        }
    if (const auto it = j->find("balance_breakers"); it != j->end() && it->is_array())
        for (const Json& b : *it)
            if (b.is_object() && integer(b, "draws") > 0)
                s.breakers.push_back({text(b, "compartment"), integer(b, "draws"), number(b, "share").value_or(0.0)});
    std::stable_sort(s.breakers.begin(), s.breakers.end(), [](const auto& a, const auto& b) { return a.draws > b.draws; });
    return s;
}

ReconcileRunSummary readReconcileRun(const StoredRun& run)
{
    ReconcileRunSummary s;
    const auto j = parseObject(run, s.error);
    if (!j) return s;
    const auto changes = j->find("changes");
    if (changes == j->end() || !changes->is_array()) {
        s.error = "the stored reconcile run's summary lacks its 'changes'";
        return s;
    }
    s.from = text(*j, "scenario");
    s.status = text(*j, "status");
    s.balanceAfter = text(*j, "balance_after");
    for (const Json& c : *changes) {
        if (!c.is_object()) continue;
        s.changes.push_back({text(c, "compartment"), text(c, "parameter"), text(c, "prey"), number(c, "before").value_or(0.0),
                             number(c, "after").value_or(0.0), number(c, "percent_change").value_or(0.0),
                             text(c, "confidence")});
    }
    return s;
}

}  // namespace tl
