#include "app/tledger/load_model.h"

#include <system_error>

#include "core/io/csv_model.h"
#include "core/store/project_file.h"

namespace tl::cli {

std::optional<Model> loadModelForCli(const std::filesystem::path& path, const std::optional<std::string>& scenario,
                                     std::ostream& err)
{
    std::error_code ec;
    if (!std::filesystem::exists(path, ec)) {
        err << path.string() << ": no such file or folder (expected a CSV model folder or a .tledger project)\n";
        return std::nullopt;
    }
    if (std::filesystem::is_directory(path, ec)) {
        (void)scenario;  // a CSV folder holds exactly one scenario
        CsvReadResult read = readCsvModel(path);
        for (const Problem& p : read.problems)
            err << (p.severity == Severity::Error ? "" : "warning: ") << p.describe() << '\n';
        return std::move(read.model);
    }
    // A file: a .tledger project (the store refuses anything else, naming the file).
    StoreResult<Scenario> loaded = loadScenarioFromFile(path, scenario);
    for (const Problem& p : loaded.problems)
        err << (p.severity == Severity::Error ? "" : "warning: ") << p.describe() << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
    if (!loaded.value) return std::nullopt;
    return std::move(loaded.value->model);
}

}  // namespace tl::cli
