// tledger ensemble MODEL [--scenario NAME] --draws N --seed S [--threads T]
//                  [--draw-range FIRST:LAST] [--analyses balance,tl,levels,indicators]
//                  [--shape lognormal|truncated-normal|uniform|triangular] [--diet-cv CV]
//                  [--shape-of COMPARTMENT.PARAM=SHAPE ...]
//                  [--keep-draws FILE.csv] [--out FILE] [--no-store] [--json]
//                  [--hold-flow-terms] [--catch-cv CV]
// tledger ensemble-merge PART... [--partial] [--out FILE] [--json]
// (DESIGN 3.7, 5.2, 5.3; core/ensemble). A whole run prints the summary (table, or JSON
// with --json) and, for a .tledger project, stores its settings and summary beside the
// scenario (--no-store: not). A slice (--draw-range) writes its sufficient statistics as
// partial JSON; ensemble-merge adds slices into exactly the one-run result (--partial:
// the merged slices as partial JSON again, for merging in stages).
// Exit: 0 ran, 1 no draw balanced (or cancelled by Ctrl-C), 2 bad input or usage.
#include <unistd.h>

#include <algorithm>
#include <charconv>
#include <csignal>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <thread>

#include "app/tledger/commands.h"
#include "app/tledger/options.h"
#include "core/ensemble/ensemble.h"
#include "core/ensemble/ensemble_report.h"
#include "core/io/atomic_file.h"
#include "core/io/balance_report.h"
#include "core/io/csv_table.h"
#include "core/model/problem_codes.h"
#include "core/model/text.h"
#include "core/store/model_source.h"
#include "core/store/project_file.h"

namespace tl::cli {
namespace {

using namespace tl::ensemble;

constexpr const char* kUsage =
    "usage: tledger ensemble MODEL [--scenario NAME] --draws N --seed S [--threads T]\n"
    "                        [--draw-range FIRST:LAST] [--analyses balance,tl,levels,indicators]\n"
    "                        [--shape lognormal|truncated-normal|uniform|triangular] [--diet-cv CV]\n"
    "                        [--shape-of COMPARTMENT.PARAM=SHAPE ...]\n"
    "                        [--keep-draws FILE.csv] [--out FILE] [--no-store] [--json]\n"
    "                        [--hold-flow-terms] [--catch-cv CV]\n"
    "       tledger ensemble-merge PART... [--partial] [--out FILE] [--json]\n";

std::atomic<bool> gInterrupted{false};
extern "C" void onInterrupt(int) { gInterrupted.store(true); }

void printProblems(const Problems& problems)
{
    for (const Problem& p : problems)
        std::cerr << (p.severity == Severity::Error ? "" : "warning: ") << p.describe()
                  << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
}

std::optional<std::uint64_t> parseCount(const std::string& text)
{
    const std::string t(trim(text));
    std::uint64_t v = 0;
    const auto [end, ec] = std::from_chars(t.data(), t.data() + t.size(), v);
    if (ec != std::errc{} || end != t.data() + t.size() || t.empty()) return std::nullopt;
    return v;
}

// Writes text to --out FILE (atomically) or to standard output.
bool emit(const std::optional<std::string>& out, const std::string& text, const char* command)
{
    if (!out || *out == "-") {
        std::cout << text;
        return true;
    }
    if (const auto error = writeFileAtomically(*out, text)) {
        std::cerr << "tledger " << command << ": cannot write " << *out << ": " << *error << '\n';
        return false;
    }
    return true;
}

// "[=====>      ]  42 %  12 345 / 30 000 draws" on one line of a terminal.
void drawProgress(std::uint64_t done, std::uint64_t total)
{
    constexpr int width = 40;
    const double share = total ? static_cast<double>(done) / static_cast<double>(total) : 1.0;
    const int filled = static_cast<int>(share * width);
    std::string bar(static_cast<std::size_t>(filled), '=');
    bar.resize(width, ' ');
    std::fprintf(stderr, "\r[%s] %3d %%  %llu / %llu draws", bar.c_str(), static_cast<int>(share * 100.0),
                 static_cast<unsigned long long>(done), static_cast<unsigned long long>(total));
    if (done >= total) std::fputc('\n', stderr);
    std::fflush(stderr);
}

int usageError(const std::string& message)
{
    std::cerr << "tledger ensemble: " << message << '\n' << kUsage;
    return 2;
}

}  // namespace

int cmdEnsemble(const Args& rawArgs)
{
    // --shape-of repeats: pulled out before the other options are parsed.
    Args args;
    std::vector<std::string> shapeOf;
    for (std::size_t k = 0; k < rawArgs.size(); ++k) {
        if (rawArgs[k] == "--shape-of") {
            if (k + 1 >= rawArgs.size()) return usageError("--shape-of needs COMPARTMENT.PARAM=SHAPE");
            shapeOf.push_back(rawArgs[++k]);
        } else if (rawArgs[k].rfind("--shape-of=", 0) == 0) {
            shapeOf.push_back(rawArgs[k].substr(11));
        } else {
            args.push_back(rawArgs[k]);
        }
    }
    const auto opts = parseOptions(args,
                                   {"--scenario", "--draws", "--seed", "--threads", "--draw-range", "--analyses",
                                    "--shape", "--diet-cv", "--keep-draws", "--out", "--catch-cv"},
                                   {"--json", "--no-store", "--hold-flow-terms"}, "ensemble", std::cerr);
    if (!opts) return 2;
    if (opts->positional.size() != 1) return usageError("expected one MODEL (a CSV folder or a .tledger project)");

    EnsembleSettings settings;
    const auto draws = opts->value("--draws");
    const auto seed = opts->value("--seed");
    if (!draws) return usageError("--draws N is required (the number of draws, e.g. 10000)");
    if (!seed) return usageError("--seed S is required (any whole number; the same seed gives the same result)");
    const auto n = parseCount(*draws);
    if (!n || *n == 0) return usageError("--draws '" + *draws + "': expected a whole number of at least 1");
    settings.draws = *n;
    const auto s = parseCount(*seed);
    if (!s) return usageError("--seed '" + *seed + "': expected a whole number from 0 to 18446744073709551615");
    settings.seed = *s;
    settings.threads = std::max(1u, std::thread::hardware_concurrency());
    if (const auto t = opts->value("--threads")) {
        const auto v = parseCount(*t);
        if (!v || *v == 0 || *v > 1024) return usageError("--threads '" + *t + "': expected a whole number from 1 to 1024");
        settings.threads = static_cast<unsigned>(*v);
    }
    if (const auto r = opts->value("--draw-range")) {
        const auto colon = r->find(':');
        const auto first = colon == std::string::npos ? std::nullopt : parseCount(r->substr(0, colon));
        const auto last = colon == std::string::npos ? std::nullopt : parseCount(r->substr(colon + 1));
        if (!first || !last || *first > *last || *last >= settings.draws)
            return usageError("--draw-range '" + *r + "': expected FIRST:LAST, whole numbers with 0 <= FIRST <= LAST < " +
                              std::to_string(settings.draws) + " (draws are numbered from 0; both ends included)");
        settings.range = DrawRange{*first, *last};
    }
    if (const auto a = opts->value("--analyses")) {
        std::string bad;
        const auto analyses = parseAnalyses(*a, &bad);
        if (!analyses)
            return usageError("--analyses '" + *a + "': unknown analysis '" + bad +
                              "' (expected a comma list of balance, tl, levels, indicators)");
        settings.analyses = *analyses;
    }
    if (const auto sh = opts->value("--shape")) {
        const auto shape = parseShape(trim(*sh));
        if (!shape) return usageError("--shape '" + *sh + "': expected lognormal, truncated-normal, uniform or triangular");
        settings.shape = *shape;
    }
    if (const auto cv = opts->value("--diet-cv")) {
        const auto v = parseNumber(trim(*cv));
        if (!v || !(*v >= 0.0) || !(*v <= 10.0)) return usageError("--diet-cv '" + *cv + "': expected a CV from 0 to 10 (0.3 = 30 %)");
        settings.dietCv = *v;
    }
    if (const auto cv = opts->value("--catch-cv")) {
        const auto v = parseNumber(trim(*cv));
        if (!v || !(*v >= 0.0) || !(*v <= 10.0)) return usageError("--catch-cv '" + *cv + "': expected a CV from 0 to 10 (0.3 = 30 %)");
        settings.catchCv = *v;
    }
    settings.holdFlowTerms = opts->has("--hold-flow-terms");
    const auto keep = opts->value("--keep-draws");
    settings.keepBalancedDraws = keep.has_value();
    if (keep && settings.range)
        return usageError("--keep-draws is for a whole run; a slice (--draw-range) writes sufficient statistics only");

    const std::filesystem::path path = opts->positional[0];
    ModelSourceOptions sourceOptions;
    if (const auto name = opts->value("--scenario"); name && !trim(*name).empty()) sourceOptions.scenario = std::string(trim(*name));
    ModelSource source = readModelSource(path, sourceOptions);
    printProblems(source.problems);
    if (!source.project) return 2;
    if (source.project->scenarios.size() != 1) {
        std::cerr << "tledger ensemble: " << path.string() << " has several scenarios; choose one with --scenario NAME (";
        for (std::size_t k = 0; k < source.project->scenarios.size(); ++k)
            std::cerr << (k ? ", " : "") << "'" << source.project->scenarios[k].name << "'";
        std::cerr << ")\n";
        return 2;
    }
    const Scenario& scenario = source.project->scenarios.front();
    for (const std::string& text : shapeOf) {
        const auto eq = text.rfind('=');
        const auto dot = eq == std::string::npos ? std::string::npos : text.rfind('.', eq);
        const auto shape = eq == std::string::npos ? std::nullopt : parseShape(trim(text.substr(eq + 1)));
        const auto index = dot == std::string::npos ? std::nullopt : scenario.model.indexOf(trim(text.substr(0, dot)));
        const auto param = dot == std::string::npos ? std::nullopt : parseParamKey(trim(text.substr(dot + 1, eq - dot - 1)));
        const bool drawnParam = param.has_value();  // every parameter may be drawn (U, BA, E, import: flow terms)
        if (!shape || !index || !drawnParam)
            return usageError("--shape-of '" + text + "': expected COMPARTMENT.PARAM=SHAPE with a compartment of scenario '" +
                              scenario.name + "', PARAM one of biomass, pb, qb, ee, pq, unassim, biomass_accum, net_emigration, detritus_import and SHAPE one of lognormal, "
                              "truncated-normal, uniform, triangular");
        settings.shapeOf[{*index, *param}] = *shape;
    }

    const bool terminal = ::isatty(STDERR_FILENO) == 1;
    EnsembleProgress progress;
    if (terminal) progress = drawProgress;
    std::signal(SIGINT, onInterrupt);
    const EnsembleRun run = runEnsemble(scenario.model, settings, &gInterrupted, progress);
    std::signal(SIGINT, SIG_DFL);
    if (!run.ran()) {
        printProblems(run.problems);
        const bool settingsOnly = std::all_of(run.problems.begin(), run.problems.end(),
                                              [](const Problem& p) { return p.code == code::kEnsembleSettings; });
        const std::string why = settingsOnly ? "these run settings are refused (see above); the scenario itself can be run"
                                             : "scenario '" + scenario.name + "' of " + path.string() + " cannot be run";
        std::cerr << "tledger ensemble: " << why << "\n";
        // --json still prints its status and problems, as solve and network do (issue 12).
        if (opts->has("--json")) std::cout << statusJson("invalid", run.problems, why);
        return 2;
    }
    const EnsembleStatistics& stats = run.statistics;
    if (stats.cancelled) std::cerr << "tledger ensemble: interrupted after " << stats.drawsRun << " draws; the figures cover those only\n";

    if (settings.range) {
        if (stats.cancelled) {
            std::cerr << "tledger ensemble: an interrupted slice is not written (it could not be merged); run it again\n";
            return 1;
        }
        return emit(opts->value("--out"), partialJson(stats), "ensemble") ? 0 : 2;
    }
    if (keep) {
        if (const auto error = writeFileAtomically(*keep, keptDrawsCsv(run.kept))) {
            std::cerr << "tledger ensemble: cannot write --keep-draws " << *keep << ": " << *error << '\n';
            return 2;
        }
    }
    const std::string json = ensembleJson(stats);
    if (!emit(opts->value("--out"), opts->has("--json") ? json : ensembleTable(stats), "ensemble")) return 2;

    // Store the run beside its scenario (projects only; a whole, finished run).
    if (!source.csvFolder && !opts->has("--no-store") && !stats.cancelled) {
        ProjectOpenResult opened = ProjectFile::open(path, OpenMode::ReadWrite);
        if (!opened.file || opened.readOnly) {
            std::cerr << "warning: the run is not stored: " << path.string() << " cannot be written"
                      << (opened.readOnlyReason.empty() ? "" : " (" + opened.readOnlyReason + ")") << '\n';
        } else {
            StoredRun stored;
            stored.scenario = scenario.name;
            stored.kind = "ensemble";
            stored.settingsJson = ensembleSettingsJson(settings, scenario.name);
            stored.summaryJson = json;
            stored.created = utcNowIso8601();
            const auto added = opened.file->addRun(stored);
            if (!added.value) {
                printProblems(added.problems);
                std::cerr << "warning: the run is not stored in " << path.string() << '\n';
            } else if (terminal) {
                std::cerr << "Stored as run " << *added.value << " of scenario '" << scenario.name << "' in " << path.string() << '\n';
            }
        }
    }
    return stats.balanced == 0 || stats.cancelled ? 1 : 0;
}

int cmdEnsembleMerge(const Args& args)
{
    const auto opts = parseOptions(args, {"--out"}, {"--json", "--partial"}, "ensemble-merge", std::cerr);
    if (!opts) return 2;
    if (opts->positional.empty()) {
        std::cerr << "tledger ensemble-merge: expected one or more PART files (written by tledger ensemble --draw-range)\n"
                  << kUsage;
        return 2;
    }
    std::optional<EnsembleStatistics> merged;
    for (const std::string& file : opts->positional) {
        std::error_code ec;
        if (!std::filesystem::is_regular_file(file, ec)) {
            std::cerr << "tledger ensemble-merge: " << file << ": no such file\n";
            return 2;
        }
        Problems problems;
        const std::optional<std::string> text = [&]() -> std::optional<std::string> {
            std::FILE* f = std::fopen(file.c_str(), "rb");
            if (!f) return std::nullopt;
            std::string t;
            char buf[65536];
            for (std::size_t got; (got = std::fread(buf, 1, sizeof buf, f)) > 0;) t.append(buf, got);
            std::fclose(f);
            return t;
        }();
        if (!text) {
            std::cerr << "tledger ensemble-merge: " << file << ": cannot be read\n";
            return 2;
        }
        auto part = readPartialJson(*text, file, problems);
        if (!part) {
            printProblems(problems);
            return 2;
        }
        if (!merged) {
            merged = std::move(*part);
            continue;
        }
        std::string why;
        if (!merged->merge(*part, &why)) {
            std::cerr << "tledger ensemble-merge: " << file << " cannot be merged with the files before it: " << why << '\n';
            return 2;
        }
    }
    if (opts->has("--partial")) return emit(opts->value("--out"), partialJson(*merged), "ensemble-merge") ? 0 : 2;
    if (!merged->complete())
        std::cerr << "warning: the parts cover draws of " << merged->totalDraws
                  << " only in part; the summary is of the draws they hold\n";
    const std::string text = opts->has("--json") ? ensembleJson(*merged) : ensembleTable(*merged);
    if (!emit(opts->value("--out"), text, "ensemble-merge")) return 2;
    return merged->balanced == 0 ? 1 : 0;
}

}  // namespace tl::cli
