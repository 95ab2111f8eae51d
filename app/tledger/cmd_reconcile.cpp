// tledger reconcile MODEL --scenario NAME [--save-as NEW] [--move b,pb,qb,diet,catch]
//                   [--pin COMPARTMENT.PARAM ...] [--bound COMPARTMENT.PARAM=LOW:HIGH ...]
//                   [--ee-max COMPARTMENT=V ...] [--ee-min COMPARTMENT=V ...]
//                   [--pq-range COMPARTMENT=LOW:HIGH ...] [--json]
// (DESIGN 3.6, 5.2): the smallest confidence-weighted change to a scenario's inputs that
// balances it (core/reconcile), written as a NEW scenario, never over the old one.
//
//   a .tledger project  the adjusted scenario is added to the project (one transaction)
//                       as NEW, default "<NAME> reconciled" (then "... 2", "... 3"); a
//                       NEW the project already has is refused.
//   a CSV model folder  --save-as names a new CSV model folder (it must not exist); it is
//                       built beside its final place and renamed in, so it appears whole.
// In a project the run (settings, changes) is stored with the new scenario (kind
// "reconcile"), which the report reads. An already balanced scenario is not copied. A least-violating answer (exit 1) is saved
// too, its description starting "NOT balanced", so that it can be inspected.
// Exit: 0 balanced (or already balanced), 1 only a least-violating solution, 2 bad input.
#include <filesystem>
#include <iostream>
#include <system_error>

#include "app/tledger/commands.h"
#include "app/tledger/options.h"
#include "core/io/atomic_file.h"
#include "core/io/balance_report.h"
#include "core/io/csv_model.h"
#include "core/model/text.h"
#include "core/reconcile/reconcile_report.h"
#include "core/reconcile/reconciled_scenario.h"
#include "core/store/model_source.h"
#include "core/store/project_file.h"

namespace tl::cli {
namespace {

constexpr const char* kUsage =
    "usage: tledger reconcile MODEL --scenario NAME [--save-as NEW] [--move b,pb,qb,diet,catch]\n"
    "                         [--pin COMPARTMENT.PARAM ...] [--bound COMPARTMENT.PARAM=LOW:HIGH ...]\n"
    "                         [--ee-max COMPARTMENT=V ...] [--ee-min COMPARTMENT=V ...]\n"
    "                         [--pq-range COMPARTMENT=LOW:HIGH ...] [--json]\n";

// Pulls every `--name value` of a repeatable option out of args.
std::vector<std::string> takeRepeated(Args& args, const std::string& name, bool& missingValue)
{
    std::vector<std::string> values;
    Args rest;
    for (std::size_t k = 0; k < args.size(); ++k) {
        if (args[k] != name) {
            rest.push_back(args[k]);
        } else if (k + 1 < args.size()) {
            values.push_back(args[++k]);
        } else {
            missingValue = true;
        }
    }
    args = std::move(rest);
    return values;
}

// "COMPARTMENT.PARAM", split at the last '.' (names may hold dots).
std::optional<std::pair<std::size_t, AdjustParam>> parseInput(const Model& model, const std::string& text,
                                                               const char* option)
{
    const auto dot = text.rfind('.');
    if (dot == std::string::npos) {
        std::cerr << "tledger reconcile: " << option << " '" << text
                  << "': expected COMPARTMENT.PARAM with PARAM one of b, pb, qb, catch, diet\n";
        return std::nullopt;
    }
    const std::string name(trim(text.substr(0, dot)));
    const auto param = parseAdjustKey(trim(text.substr(dot + 1)));
    const auto index = model.indexOf(name);
    if (!index) {
        std::cerr << "tledger reconcile: " << option << " '" << text << "': the scenario has no compartment named '"
                  << name << "'\n";
        return std::nullopt;
    }
    if (!param) {
        std::cerr << "tledger reconcile: " << option << " '" << text << "': unknown parameter '" << text.substr(dot + 1)
                  << "' (expected b, pb, qb, catch or diet)\n";
        return std::nullopt;
    }
    return std::pair{*index, *param};
}

std::optional<double> parseBoundNumber(const std::string& text, bool& ok)
{
    const std::string t(trim(text));
    if (t.empty()) return std::nullopt;
    const auto v = parseNumber(t);
    if (!v || !(*v > 0.0)) ok = false;
    return v;
}

std::vector<std::string> splitCommas(const std::string& list)
{
    std::vector<std::string> items;
    std::size_t start = 0;
    for (std::size_t comma; (comma = list.find(',', start)) != std::string::npos; start = comma + 1)
        items.push_back(list.substr(start, comma - start));
    items.push_back(list.substr(start));
    return items;
}

bool applyMoves(const std::string& list, ReconcileOptions& o)
{
    o.moveBiomass = o.movePB = o.moveQB = o.moveDiet = o.moveCatch = false;
    for (const std::string& item : splitCommas(list)) {
        const auto p = parseAdjustKey(trim(item));
        if (!p) {
            std::cerr << "tledger reconcile: --move '" << list << "': unknown kind '" << item
                      << "' (expected a comma list of b, pb, qb, diet, catch)\n";
            return false;
        }
        switch (*p) {
        case AdjustParam::Biomass: o.moveBiomass = true; break;
        case AdjustParam::PB: o.movePB = true; break;
        case AdjustParam::QB: o.moveQB = true; break;
        case AdjustParam::Diet: o.moveDiet = true; break;
        case AdjustParam::Catch: o.moveCatch = true; break;
        }
    }
    return true;
}

void printProblems(const Problems& problems)
{
    for (const Problem& p : problems) std::cerr << p.describe() << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
}

}  // namespace

int cmdReconcile(const Args& rawArgs)
{
    Args args = rawArgs;
    bool missing = false;
    const std::vector<std::string> pins = takeRepeated(args, "--pin", missing);
    const std::vector<std::string> bounds = takeRepeated(args, "--bound", missing);
    const std::vector<std::string> eeMax = takeRepeated(args, "--ee-max", missing);
    const std::vector<std::string> eeMin = takeRepeated(args, "--ee-min", missing);
    const std::vector<std::string> pqRange = takeRepeated(args, "--pq-range", missing);
    if (missing) {
        std::cerr << "tledger reconcile: --pin, --bound, --ee-max, --ee-min and --pq-range need a value\n" << kUsage;
        return 2;
    }
    const auto opts = parseOptions(args, {"--scenario", "--save-as", "--move"}, {"--json"}, "reconcile", std::cerr);
    if (!opts) return 2;
    const auto scenarioName = opts->value("--scenario");
    if (opts->positional.size() != 1 || !scenarioName || trim(*scenarioName).empty()) {
        std::cerr << kUsage;
        return 2;
    }
    const std::filesystem::path path = opts->positional[0];
    std::error_code ec;
    const bool folder = std::filesystem::is_directory(path, ec);
    const auto saveAs = opts->value("--save-as");
    if (folder && !saveAs) {
        std::cerr << "tledger reconcile: " << path.string()
                  << " is a CSV model folder: give --save-as NEW_FOLDER for the reconciled model (never written over "
                     "the original)\n";
        return 2;
    }
    if (saveAs && trim(*saveAs).empty()) {
        std::cerr << "tledger reconcile: --save-as needs a name\n";
        return 2;
    }

    ModelSourceOptions sourceOptions;
    sourceOptions.scenario = std::string(trim(*scenarioName));
    ModelSource source = readModelSource(path, sourceOptions);
    printProblems(source.problems);
    if (!source.project || source.project->scenarios.size() != 1) return 2;
    const Scenario& scenario = source.project->scenarios.front();
    const Model& model = scenario.model;

    ReconcileOptions o;
    if (const auto moves = opts->value("--move"); moves && !applyMoves(*moves, o)) return 2;
    for (const std::string& pin : pins) {
        const auto input = parseInput(model, pin, "--pin");
        if (!input) return 2;
        o.pins.push_back(*input);
    }
    for (const std::string& bound : bounds) {
        const auto eq = bound.find('=');
        const auto colon = bound.find(':', eq == std::string::npos ? 0 : eq);
        if (eq == std::string::npos || colon == std::string::npos) {
            std::cerr << "tledger reconcile: --bound '" << bound << "': expected COMPARTMENT.PARAM=LOW:HIGH (either may be empty)\n";
            return 2;
        }
        const auto input = parseInput(model, bound.substr(0, eq), "--bound");
        if (!input) return 2;
        bool ok = true;
        ValueBounds vb{parseBoundNumber(bound.substr(eq + 1, colon - eq - 1), ok), parseBoundNumber(bound.substr(colon + 1), ok)};
        if (!ok) {
            std::cerr << "tledger reconcile: --bound '" << bound << "': LOW and HIGH must be positive numbers ('.' decimal mark)\n";
            return 2;
        }
        o.bounds[*input] = vb;
    }

    // COMPARTMENT=V or COMPARTMENT=LOW:HIGH, split at the last '='.
    auto perCompartment = [&](const std::string& text, const char* option, bool range, double& low, double& high) {
        const auto eq = text.rfind('=');
        const auto index = eq == std::string::npos ? std::nullopt : model.indexOf(trim(text.substr(0, eq)));
        std::optional<double> a, b;
        if (eq != std::string::npos) {
            const std::string rest = text.substr(eq + 1);
            const auto colon = rest.find(':');
            if (range && colon != std::string::npos) {
                a = parseNumber(trim(rest.substr(0, colon)));
                b = parseNumber(trim(rest.substr(colon + 1)));
            } else if (!range) {
                a = b = parseNumber(trim(rest));
            }
        }
        if (!index || !a || !b || !(*a > 0.0) || !(*b >= *a)) {
            std::cerr << "tledger reconcile: " << option << " '" << text << "': expected COMPARTMENT="
                      << (range ? "LOW:HIGH (0 < LOW <= HIGH)" : "V (V > 0)") << " naming a compartment of the scenario\n";
            return std::optional<std::size_t>{};
        }
        low = *a;
        high = *b;
        return std::optional<std::size_t>{*index};
    };
    for (const auto& [list, option] : {std::pair{&eeMax, "--ee-max"}, std::pair{&eeMin, "--ee-min"}}) {
        for (const std::string& text : *list) {
            double low = 0.0, high = 0.0;
            const auto i = perCompartment(text, option, false, low, high);
            if (!i) return 2;
            (std::string(option) == "--ee-max" ? o.eeMax : o.eeMin)[*i] = low;
        }
    }
    for (const std::string& text : pqRange) {
        double low = 0.0, high = 0.0;
        const auto i = perCompartment(text, "--pq-range", true, low, high);
        if (!i) return 2;
        o.pqRange[*i] = {low, high};
    }

    const ReconcileResult result = reconcile(model, o);
    if (result.status == ReconcileStatus::Invalid) {
        printProblems(result.problems);
        const std::string why = "scenario '" + scenario.name + "' of " + path.string() + " cannot be reconciled; nothing was written";
        std::cerr << "tledger reconcile: " << why << "\n";
        // --json still prints its status and problems, as solve and network do (issue 12).
        if (opts->has("--json")) std::cout << statusJson("invalid", result.problems, why);
        return 2;
    }

    // Write the new scenario (not for an unchanged one).
    std::optional<std::string> savedAs;
    if (result.status != ReconcileStatus::Unchanged) {
        Scenario out = reconciledScenario(scenario, result, scenario.name, utcNowIso8601());
        if (folder) {
            const std::filesystem::path target = *saveAs;
            if (std::filesystem::exists(target, ec)) {
                std::cerr << "tledger reconcile: --save-as " << target.string()
                          << " already exists; reconcile never writes over a model (choose a new folder)\n";
                return 2;
            }
            const std::filesystem::path temp = temporaryBeside(target);
            Problems written = writeCsvModel(out.model, temp);
            if (hasErrors(written) || (std::filesystem::rename(temp, target, ec), ec)) {
                printProblems(written);
                std::filesystem::remove_all(temp, ec);
                std::cerr << "tledger reconcile: could not write " << target.string() << "\n";
                return 2;
            }
            savedAs = target.string();
        } else {
            ProjectOpenResult opened = ProjectFile::open(path, OpenMode::ReadWrite);
            printProblems(opened.problems);
            if (!opened.file || opened.readOnly) {
                std::cerr << "tledger reconcile: " << path.string() << " cannot be written"
                          << (opened.readOnlyReason.empty() ? "" : " (" + opened.readOnlyReason + ")") << "\n";
                return 2;
            }
            StoreResult<Project> all = opened.file->load();
            if (!all.value) {
                printProblems(all.problems);
                return 2;
            }
            out.name = saveAs ? std::string(trim(*saveAs)) : freeReconciledName(*all.value, scenario.name);
            if (all.value->findScenario(out.name)) {
                std::cerr << "tledger reconcile: " << path.string() << " already has a scenario named '" << out.name
                          << "'; reconcile never overwrites one (choose another --save-as)\n";
                return 2;
            }
            const Problems created = opened.file->createScenario(out);
            if (hasErrors(created)) {
                printProblems(created);
                return 2;
            }
            savedAs = out.name;
            // The changes, kept with the new scenario for reports (a run of kind "reconcile").
            const auto stored = opened.file->addRun(reconcileRun(scenario, result, o, out.name, out.created));
            if (!stored.value) {
                printProblems(stored.problems);
                std::cerr << "warning: the reconcile run is not stored in " << path.string()
                          << " (the new scenario is; its source notes name the changes)\n";
            }
        }
    }

    std::cout << (opts->has("--json") ? reconcileJson(model, result, scenario.name, savedAs)
                                      : reconcileText(model, result, scenario.name, savedAs));
    const bool balanced = result.status != ReconcileStatus::LeastViolating && result.balanceAfter == BalanceStatus::Balanced;
    return balanced ? 0 : 1;
}

}  // namespace tl::cli
