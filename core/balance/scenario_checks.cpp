#include "core/balance/scenario_checks.h"

#include <set>
#include <tuple>

#include "core/model/plausible_ranges.h"
#include "core/model/validation.h"

namespace tl {

Problems scenarioChecks(const Model& model, const BalanceSheet& sheet)
{
    Problems checks = validateModel(model);
    const Problems implausible = implausibleValues(model);  // warnings: typing slips such as B = 1e300
    checks.insert(checks.end(), implausible.begin(), implausible.end());
    std::set<std::tuple<std::string, std::string, std::string>> found;  // by validation
    for (const Problem& p : checks) found.emplace(p.code, p.compartment, p.prey);
    for (const Problem& p : sheet.problems)
        if (!found.count({p.code, p.compartment, p.prey})) checks.push_back(p);
    return checks;
}

ScenarioState scenarioState(const Model& model, const BalanceSheet& sheet, const Problems& checks)
{
    if (model.size() == 0) return ScenarioState::NoCompartments;
    if (sheet.status == BalanceStatus::Invalid || hasErrors(validateModel(model))) return ScenarioState::Incomplete;
    if (sheet.status == BalanceStatus::Unbalanced || hasErrors(checks)) return ScenarioState::NotBalanced;
    return ScenarioState::Balanced;
}

BalanceSheet reportedSheet(const Model& model, BalanceSheet sheet)
{
    Problems checks = scenarioChecks(model, sheet);
    switch (scenarioState(model, sheet, checks)) {
    case ScenarioState::Balanced: sheet.status = BalanceStatus::Balanced; break;
    case ScenarioState::NotBalanced: sheet.status = BalanceStatus::Unbalanced; break;
    case ScenarioState::NoCompartments:
    case ScenarioState::Incomplete: sheet.status = BalanceStatus::Invalid; break;
    }
    sheet.problems = std::move(checks);
    return sheet;
}

}  // namespace tl
