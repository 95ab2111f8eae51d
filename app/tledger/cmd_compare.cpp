// tledger compare PROJECT --scenarios A,B[,C...] [--json] [--keep-feeding-cycles]
//                [--ensemble N --seed S | --ensemble stored] [--threads T]
// Two or more scenarios of one project side by side (issue 16; DESIGN 5.2): the inputs
// that differ and every output with its absolute and percent difference against the
// first scenario named (core/compare). JSON keys: DEVELOPERS.md, "tledger compare".
// With --ensemble, each scenario's ensemble of N draws (seed S, the same for all: paired
// draws) says whether each difference exceeds the uncertainty: the share of paired draws
// in which it keeps its sign (core/compare/ensemble_agreement.h). `--ensemble stored` takes
// the settings of each scenario's latest stored ensemble run (`tledger ensemble` on the
// project) and draws them again: a draw is a pure function of (scenario, seed, index), so
// nothing per draw needs storing. The runs must share their settings (paired draws), and
// a scenario changed since its run is named (its shares are from its current values).
// Exit 0 when every scenario balances, 1 when one does not (its figures are shown as
// they stand), 2 for bad usage, a MODEL that does not open or a scenario name the
// project lacks.
#include <charconv>
#include <iostream>
#include <string>
#include <thread>

#include "app/tledger/commands.h"
#include "app/tledger/options.h"
#include "core/compare/comparison_report.h"
#include "core/io/balance_report.h"
#include "core/compare/ensemble_agreement.h"
#include "core/compare/scenario_comparison.h"
#include "core/store/model_source.h"

namespace tl::cli {
namespace {

constexpr const char* kUsage =
    "usage: tledger compare PROJECT --scenarios A,B[,C...] [--json] [--keep-feeding-cycles]\n"
    "                       [--ensemble N --seed S | --ensemble stored] [--threads T]\n";

std::optional<std::uint64_t> wholeNumber(const std::string& text)
{
    std::uint64_t n = 0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), n);
    if (ec != std::errc() || end != text.data() + text.size()) return std::nullopt;
    return n;
}

std::optional<unsigned> threadsOption(const ParsedOptions& opts)
{
    const auto t = opts.value("--threads");
    if (!t) return std::max(1u, std::thread::hardware_concurrency());
    const auto tv = wholeNumber(*t);
    if (!tv || *tv == 0 || *tv > 256) {
        std::cerr << "tledger compare: --threads '" << *t << "': expected a whole number from 1 to 256\n";
        return std::nullopt;
    }
    return static_cast<unsigned>(*tv);
}

// The ensemble settings of --ensemble N --seed S, or a message on std::cerr and nothing.
std::optional<ensemble::EnsembleSettings> ensembleSettings(const ParsedOptions& opts)
{
    const auto draws = opts.value("--ensemble");
    const auto seed = opts.value("--seed");
    if (!draws || !seed) {
        std::cerr << "tledger compare: --ensemble N needs --seed S (the same seed pairs the scenarios' draws)\n" << kUsage;
        return std::nullopt;
    }
    ensemble::EnsembleSettings s;
    const auto n = wholeNumber(*draws);
    if (!n || *n == 0 || *n > 10000000) {
        std::cerr << "tledger compare: --ensemble '" << *draws << "': expected a number of draws from 1 to 10000000\n";
        return std::nullopt;
    }
    const auto sv = wholeNumber(*seed);
    if (!sv) {
        std::cerr << "tledger compare: --seed '" << *seed << "': expected a whole number from 0 to 18446744073709551615\n";
        return std::nullopt;
    }
    s.draws = *n;
    s.seed = *sv;
    return s;
}

}  // namespace

int cmdCompare(const Args& args)
{
    const auto opts = parseOptions(args, {"--scenarios", "--ensemble", "--seed", "--threads"},
                                   {"--json", "--keep-feeding-cycles"}, "compare", std::cerr);
    if (!opts) return 2;
    const auto list = opts->value("--scenarios");
    if (opts->positional.size() != 1 || !list) {
        std::cerr << "tledger compare: expected one PROJECT and --scenarios\n" << kUsage;
        return 2;
    }
    const bool stored = opts->value("--ensemble") == "stored";
    if (stored && opts->value("--seed")) {
        std::cerr << "tledger compare: --ensemble stored takes the seed of the stored runs; leave out --seed\n" << kUsage;
        return 2;
    }
    std::optional<ensemble::EnsembleSettings> agreement;
    std::optional<unsigned> threads;
    if (opts->value("--ensemble") || opts->value("--seed") || opts->value("--threads")) {
        threads = threadsOption(*opts);
        if (!threads) return 2;
        if (!stored) {
            agreement = ensembleSettings(*opts);
            if (!agreement) return 2;
        }
    }
    const std::filesystem::path path = opts->positional[0];
    ModelSource source = readModelSource(path, {std::nullopt, OpenMode::ReadOnly});
    for (const Problem& p : source.problems)
        std::cerr << (p.severity == Severity::Error ? "" : "warning: ") << p.describe()
                  << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
    // A project or scenario that cannot be compared: the message on stderr and, with --json,
    // the status JSON that solve, network and ensemble print (issue 12, defect 6), exit 2.
    const auto cannotCompare = [&](const Problems& problems, const std::string& why) {
        std::cerr << "tledger compare: " << why << '\n';
        if (opts->has("--json")) std::cout << statusJson("invalid", problems, why);
        return 2;
    };
    if (!source.project) return cannotCompare(source.problems, path.string() + " cannot be read as a project");
    std::string error;
    const auto picked = pickScenarios(*source.project, splitScenarioList(*list), error);
    if (picked.empty()) return cannotCompare({}, path.string() + ": " + error);
    AnalysisOptions options;
    if (opts->has("--keep-feeding-cycles")) options.feedingCycles = FeedingCycles::Kept;
    if (stored) {
        std::string error;
        std::vector<std::string> warnings;
        agreement = storedEnsembleSettings(*source.project, picked, error, warnings);
        for (const std::string& w : warnings) std::cerr << "warning: " << w << '\n';
        if (!agreement) return cannotCompare({}, path.string() + ": " + error);
    }
    if (agreement) agreement->threads = *threads;
    ScenarioComparison comparison = compareScenarios(picked, options);
    if (agreement) {
        const EnsembleAgreementRun run = attachEnsembleRuns(comparison, picked, *agreement);
        for (const Problem& p : run.problems) std::cerr << p.describe() << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
        if (!run.problems.empty()) return cannotCompare(run.problems, "the ensembles cannot be run, so no same-sign shares");
        if (comparison.ensemble && comparison.ensemble->paired < 10)
            std::cerr << "tledger compare: only " << comparison.ensemble->paired << " of " << agreement->draws
                      << " draws balance in every scenario; the same-sign shares rest on few draws\n";
    }
    std::cout << (opts->has("--json") ? comparisonJson(comparison) : comparisonTables(comparison));
    int code = 0;
    for (std::size_t s = 0; s < comparison.scenarios.size(); ++s) {
        if (comparison.sheets[s].status == BalanceStatus::Balanced) continue;
        std::cerr << "tledger compare: scenario '" << comparison.scenarios[s] << "' "
                  << (comparison.sheets[s].status == BalanceStatus::Invalid
                          ? "cannot be solved; its outputs are not available"
                          : "does not balance; its figures describe its flows as they stand")
                  << " (run `tledger check` on it for the problems)\n";
        code = 1;
    }
    return code;
}

}  // namespace tl::cli
