#include "app/tledger/load_model.h"

#include <system_error>

#include "core/io/csv_model.h"

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
        for (const Problem& p : read.problems) err << p.describe() << '\n';
        return std::move(read.model);
    }
    err << path.string() << ": not a CSV model folder (project files are not supported by this build yet)\n";
    return std::nullopt;
}

}  // namespace tl::cli
