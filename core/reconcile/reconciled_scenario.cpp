#include "core/reconcile/reconciled_scenario.h"

#include <algorithm>

#include "core/model/names.h"
#include "core/reconcile/reconcile_report.h"

namespace tl {

std::string freeReconciledName(const Project& project, const std::string& base)
{
    // Taken means the same name to a person (core/model/names.h), as the shelf checks it.
    auto taken = [&project](const std::string& name) {
        return std::any_of(project.scenarios.begin(), project.scenarios.end(),
                           [&name](const Scenario& s) { return sameName(s.name, name); });
    };
    std::string name = base + " reconciled";
    for (int k = 2; taken(name); ++k) name = base + " reconciled " + std::to_string(k);
    return name;
}

Scenario reconciledScenario(const Scenario& from, const ReconcileResult& result, const std::string& name,
                            const std::string& date)
{
    Scenario out;
    out.name = name;
    out.model = annotatedReconcileModel(from.model, result, date);
    out.parent = from.name;
    out.created = date;
    out.layout = from.layout;
    out.description = reconcileDescription(from.model, result, from.name);
    return out;
}

StoredRun reconcileRun(const Scenario& from, const ReconcileResult& result, const ReconcileOptions& options,
                       const std::string& made, const std::string& date)
{
    StoredRun run;
    run.scenario = made;
    run.kind = "reconcile";
    run.settingsJson = reconcileSettingsJson(from.model, options, from.name);
    run.summaryJson = reconcileJson(from.model, result, from.name, made);
    run.created = date;
    return run;
}

}  // namespace tl
