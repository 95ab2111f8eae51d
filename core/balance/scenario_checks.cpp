#include "core/balance/scenario_checks.h"

#include <set>
#include <tuple>

#include "core/model/validation.h"

namespace tl {

Problems scenarioChecks(const Model& model, const BalanceSheet& sheet)
{
    Problems checks = validateModel(model);
    std::set<std::tuple<std::string, std::string, std::string>> found;  // by validation
    for (const Problem& p : checks) found.emplace(p.code, p.compartment, p.prey);
    for (const Problem& p : sheet.problems)
        if (!found.count({p.code, p.compartment, p.prey})) checks.push_back(p);
    return checks;
}

}  // namespace tl
