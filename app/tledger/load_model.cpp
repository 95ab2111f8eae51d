#include "app/tledger/load_model.h"

#include "core/store/model_source.h"

namespace tl::cli {

std::optional<Model> loadModelForCli(const std::filesystem::path& path, const std::optional<std::string>& scenario,
                                     std::ostream& err)
{
    StoreResult<Scenario> loaded = readScenarioSource(path, scenario);
    for (const Problem& p : loaded.problems)
        err << (p.severity == Severity::Error ? "" : "warning: ") << p.describe() << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
    if (!loaded.value) return std::nullopt;
    return std::move(loaded.value->model);
}

}  // namespace tl::cli
