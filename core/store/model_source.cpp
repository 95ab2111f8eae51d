#include "core/store/model_source.h"

#include <algorithm>
#include <system_error>

#include "core/io/csv_model.h"
#include "core/model/problem_codes.h"
#include "core/model/text.h"
#include "core/store/project_file_detail.h"

namespace tl {
namespace fs = std::filesystem;
namespace {

std::string quotedNames(const Project& project)
{
    std::string names;
    for (const std::string& n : project.scenarioNames()) names += (names.empty() ? "'" : ", '") + n + "'";
    return names;
}

std::optional<std::string> givenName(const std::optional<std::string>& scenario)
{
    if (!scenario || trim(*scenario).empty()) return std::nullopt;
    return std::string(trim(*scenario));
}

void readCsvFolder(const fs::path& path, const std::optional<std::string>& name, ModelSource& out)
{
    out.csvFolder = true;
    CsvReadResult read = readCsvModel(path);
    out.problems = std::move(read.problems);
    if (!read.model) return;
    const fs::path folder = path.filename().empty() ? path.parent_path() : path;
    Project project;
    project.info.title = folder.filename().string();
    project.info.units = read.model->units;
    project.info.rules = read.model->rules;
    Scenario s;
    s.name = name.value_or(folder.filename().string());
    s.description = "Read from the CSV model folder " + folder.filename().string();
    s.model = std::move(*read.model);
    project.scenarios.push_back(std::move(s));
    out.project = std::move(project);
}

void readProjectFile(const fs::path& path, const ModelSourceOptions& options, ModelSource& out)
{
    ProjectOpenResult opened = ProjectFile::open(path, options.mode);
    if (!opened.file) {
        out.problems = std::move(opened.problems);
        return;
    }
    out.readOnly = opened.readOnly;
    if (options.mode == OpenMode::ReadWrite) out.readOnlyReason = opened.readOnlyReason;
    if (opened.readOnly && out.readOnlyReason.empty() && opened.readOnlyReason != "opened read-only on request")
        out.readOnlyReason = opened.readOnlyReason;
    // Every note is passed on, even when read-only was asked for: a reader is told that
    // the file is newer than this program, or cannot be written (issue 12).
    for (Problem& p : opened.problems) out.problems.push_back(std::move(p));
    StoreResult<Project> loaded = opened.file->load();
    out.problems.insert(out.problems.end(), loaded.problems.begin(), loaded.problems.end());
    if (!loaded.value) return;
    Project project = std::move(*loaded.value);
    if (const auto name = givenName(options.scenario)) {
        const Scenario* chosen = project.findScenario(*name);
        if (!chosen) {
            const std::string names = quotedNames(project);
            out.problems.push_back(store::detail::fileProblem(path, code::kStoreUnknownScenario,
                                               "has no scenario named '" + *name + "' (it has " +
                                                   (names.empty() ? "none" : names) + ")"));
            return;
        }
        Scenario keep = *chosen;
        project.scenarios = {std::move(keep)};
        std::erase_if(project.runs, [&](const StoredRun& r) { return r.scenario != project.scenarios[0].name; });
    }
    out.project = std::move(project);
}

}  // namespace

ModelSource readModelSource(const fs::path& path, const ModelSourceOptions& options)
{
    ModelSource out;
    std::error_code ec;
    if (!fs::exists(path, ec)) {
        out.problems.push_back(store::detail::fileProblem(path, code::kStoreNotFound,
                                           "no such file or folder (expected a CSV model folder or a .tledger project)"));
        return out;
    }
    if (fs::is_directory(path, ec)) readCsvFolder(path, givenName(options.scenario), out);
    else readProjectFile(path, options, out);  // the store refuses anything that is not a project, naming the file
    return out;
}

StoreResult<Scenario> readScenarioSource(const fs::path& path, const std::optional<std::string>& scenario)
{
    ModelSource source = readModelSource(path, {scenario, OpenMode::ReadOnly});
    StoreResult<Scenario> result;
    result.problems = std::move(source.problems);
    if (!source.project) return result;
    std::vector<Scenario>& scenarios = source.project->scenarios;
    if (scenarios.size() == 1) {
        result.value = std::move(scenarios.front());
    } else if (scenarios.empty()) {
        result.problems.push_back(store::detail::fileProblem(path, code::kStoreNoScenario, "holds no scenario yet",
                                              "Import one with: tledger import CSV_FOLDER --into PROJECT --scenario NAME"));
    } else {
        result.problems.push_back(store::detail::fileProblem(path, code::kStoreScenarioNeeded,
                                              "holds " + std::to_string(scenarios.size()) + " scenarios (" +
                                                  quotedNames(*source.project) + "); say which one",
                                              "Add --scenario NAME."));
    }
    return result;
}

}  // namespace tl
