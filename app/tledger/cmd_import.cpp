// tledger import SOURCE --into PROJECT --scenario NAME [--description TEXT] [--parent NAME]
//                [--title TEXT] [--notes TEXT] [--replace]
// (DESIGN 5.2): reads a CSV model folder (or a SCOR flow network) and stores it as a
// scenario of a .tledger project, creating the project when it does not exist. Bad
// input exits 2 with the file, line and column, and the project is not touched.
// --parent records the scenario this one derives from; --title and --notes apply when
// the project is created.
#include <iostream>
#include <system_error>

#include "app/tledger/commands.h"
#include "app/tledger/options.h"
#include "core/io/csv_model.h"
#include "core/io/scor.h"
#include "core/model/text.h"
#include "core/store/project_file.h"
#include "core/store/scor_import.h"

namespace tl::cli {
namespace {

void printProblems(const Problems& problems)
{
    for (const Problem& p : problems) std::cerr << p.describe() << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
}

}  // namespace

int cmdImport(const Args& args)
{
    const auto opts =
        parseOptions(args, {"--into", "--scenario", "--description", "--parent", "--title", "--notes"}, {"--replace"},
                     "import", std::cerr);
    if (!opts) return 2;
    const auto into = opts->value("--into");
    const auto name = opts->value("--scenario");
    if (opts->positional.size() != 1 || !into || !name || trim(*name).empty()) {
        std::cerr << "tledger import: usage: tledger import CSV_FOLDER|SCOR_FILE --into PROJECT --scenario NAME"
                     " [--description TEXT] [--parent NAME] [--title TEXT] [--notes TEXT] [--replace]\n";
        return 2;
    }
    const std::filesystem::path source = opts->positional[0];
    const std::filesystem::path project = *into;

    // 1. Read the source completely before touching the project.
    std::error_code ec;
    Scenario scenario;
    scenario.name = std::string(trim(*name));
    scenario.description = opts->value("--description").value_or("");
    scenario.parent = std::string(trim(opts->value("--parent").value_or("")));
    if (std::filesystem::is_directory(source, ec)) {
        CsvReadResult read = readCsvModel(source);
        printProblems(read.problems);
        if (!read.model) {
            std::cerr << "tledger import: " << source.string() << " was not imported; " << project.string()
                      << " is unchanged\n";
            return 2;
        }
        scenario.model = std::move(*read.model);
        if (scenario.description.empty()) scenario.description = "imported from " + source.filename().string();
    } else if (std::filesystem::is_regular_file(source, ec)) {
        ScorReadResult read = readScorFile(source);
        printProblems(read.problems);
        if (!read.network) {
            std::cerr << "tledger import: " << source.string()
                      << " is neither a CSV model folder nor a readable SCOR file; " << project.string()
                      << " is unchanged\n";
            return 2;
        }
        ScorImport converted = modelFromScor(*read.network, source.string());
        printProblems(converted.problems);
        if (!converted.model) {
            std::cerr << "tledger import: " << source.string() << " was not imported; " << project.string()
                      << " is unchanged\n";
            return 2;
        }
        scenario.model = std::move(*converted.model);
        if (scenario.description.empty())
            scenario.description = "flow network imported from " + source.filename().string() +
                                   (read.network->title.empty() ? "" : " (" + read.network->title + ")");
    } else {
        std::cerr << source.string() << ": no such CSV model folder or SCOR file\n";
        return 2;
    }

    // 2. Store it: a new project, a new scenario, or (with --replace) a new version of one.
    if (!std::filesystem::exists(project, ec)) {
        Project p;
        p.info.title = opts->value("--title").value_or(project.stem().string());
        p.info.notes = opts->value("--notes").value_or("");
        p.info.units = scenario.model.units;
        p.info.rules = scenario.model.rules;
        p.scenarios.push_back(scenario);
        auto created = ProjectFile::create(project, p);
        printProblems(created.problems);
        if (!created.file) return 2;
    } else {
        auto opened = ProjectFile::open(project, OpenMode::ReadWrite);
        printProblems(opened.problems);
        if (!opened.file) return 2;
        if (opened.readOnly) {
            std::cerr << project.string() << ": cannot import into it: " << opened.readOnlyReason << '\n';
            return 2;
        }
        auto info = opened.file->load();
        if (!info.value) {
            printProblems(info.problems);
            return 2;
        }
        if (info.value->info.units != scenario.model.units)
            std::cerr << project.string() << ": note: the project's units (" << info.value->info.units.biomass()
                      << ") are kept; " << source.string() << " declared " << scenario.model.units.biomass() << '\n';
        if (!scenario.parent.empty() && !info.value->findScenario(scenario.parent)) {
            std::cerr << project.string() << ": --parent '" << scenario.parent
                      << "' is not a scenario of this project; nothing was changed\n";
            return 2;
        }
        const Scenario* existing = info.value->findScenario(scenario.name);
        const bool exists = existing != nullptr;
        if (existing) {  // --replace renews the inputs; what was not given on the line is kept
            if (!opts->value("--description")) scenario.description = existing->description;
            if (!opts->value("--parent")) scenario.parent = existing->parent;
            scenario.layout = existing->layout;
        }
        if (exists && !opts->has("--replace")) {
            std::cerr << project.string() << ": already has a scenario named '" << scenario.name
                      << "'; nothing was changed. Choose another --scenario, or add --replace to overwrite it.\n";
            return 2;
        }
        const Problems problems = exists ? opened.file->saveScenario(scenario) : opened.file->createScenario(scenario);
        printProblems(problems);
        if (hasErrors(problems)) return 2;
    }
    std::cout << "imported " << scenario.model.size() << " compartments from " << source.string() << " into "
              << project.string() << " as scenario '" << scenario.name << "'\n";
    return 0;
}

}  // namespace tl::cli
