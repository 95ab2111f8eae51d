// tledger compare PROJECT --scenarios A,B[,C...] [--json] [--keep-feeding-cycles]
// Two or more scenarios of one project side by side (issue 16; DESIGN 5.2): the inputs
// that differ and every output with its absolute and percent difference against the
// first scenario named (core/compare). JSON keys: DEVELOPERS.md, "tledger compare".
// Exit 0 when every scenario balances, 1 when one does not (its figures are shown as
// they stand), 2 for bad usage, a MODEL that does not open or a scenario name the
// project lacks.
#include <iostream>
#include <string>

#include "app/tledger/commands.h"
#include "app/tledger/options.h"
#include "core/compare/comparison_report.h"
#include "core/compare/scenario_comparison.h"
#include "core/store/model_source.h"

namespace tl::cli {

int cmdCompare(const Args& args)
{
    const auto opts = parseOptions(args, {"--scenarios"}, {"--json", "--keep-feeding-cycles"}, "compare", std::cerr);
    if (!opts) return 2;
    const auto list = opts->value("--scenarios");
    if (opts->positional.size() != 1 || !list) {
        std::cerr << "tledger compare: usage: tledger compare PROJECT --scenarios A,B[,C...] [--json]\n";
        return 2;
    }
    const std::filesystem::path path = opts->positional[0];
    ModelSource source = readModelSource(path, {std::nullopt, OpenMode::ReadOnly});
    for (const Problem& p : source.problems)
        std::cerr << (p.severity == Severity::Error ? "" : "warning: ") << p.describe()
                  << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
    if (!source.project) return 2;
    std::string error;
    const auto picked = pickScenarios(*source.project, splitScenarioList(*list), error);
    if (picked.empty()) {
        std::cerr << "tledger compare: " << path.string() << ": " << error << '\n';
        return 2;
    }
    AnalysisOptions options;
    if (opts->has("--keep-feeding-cycles")) options.feedingCycles = FeedingCycles::Kept;
    const ScenarioComparison comparison = compareScenarios(picked, options);
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
