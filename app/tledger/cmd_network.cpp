// tledger network MODEL [--scenario NAME] [--json [--impact-matrix]] [--keep-feeding-cycles]
// tledger network --scor FILE [--producers A,B] [--json [--impact-matrix]] [--keep-feeding-cycles]
// Trophic structure, level decomposition, mixed trophic impact and system indicators
// of a solved scenario or of a plain SCOR flow network (DESIGN 3.3-3.5, 5.2, 5.3).
#include <iostream>
#include <string>

#include "app/tledger/commands.h"
#include "app/tledger/load_model.h"
#include "app/tledger/options.h"
#include "core/balance/solver.h"
#include "core/io/balance_report.h"
#include "core/io/network_report.h"
#include "core/io/scor.h"
#include "core/model/text.h"
#include "core/network/network_analysis.h"

namespace tl::cli {
namespace {

// --keep-feeding-cycles: the labelled alternative to the published aggregation;
// --producers A,B: the producers of a SCOR network, when its flows cannot tell them.
AnalysisOptions analysisOptions(const ParsedOptions& opts)
{
    AnalysisOptions options;
    if (opts.has("--keep-feeding-cycles")) options.feedingCycles = FeedingCycles::Kept;
    if (const auto list = opts.value("--producers")) {
        std::string name;
        for (char c : *list + ",") {
            if (c != ',') {
                name += c;
                continue;
            }
            const std::string trimmed = std::string(trim(name));
            if (!trimmed.empty()) options.producers.push_back(trimmed);
            name.clear();
        }
    }
    return options;
}

// --impact-matrix: the impact matrix in the JSON at any size (kImpactMatrixJsonLimit).
NetworkJsonOptions jsonOptions(const ParsedOptions& opts)
{
    return NetworkJsonOptions{opts.has("--impact-matrix")};
}

int fromModel(const ParsedOptions& opts)
{
    const auto model = loadModelForCli(opts.positional[0], opts.value("--scenario"), std::cerr);
    if (!model) return 2;
    const BalanceSheet sheet = solveBalance(*model);
    // Without a flow network there is no analysis; --json still prints its status and
    // problems, as `solve --json` does (issue 12).
    const auto unavailable = [&](const std::string& why) {
        Problems errors;
        for (const Problem& p : sheet.problems)
            if (p.severity == Severity::Error) errors.push_back(p);
        for (const Problem& p : errors) std::cerr << p.describe() << '\n';
        std::cerr << "tledger network: " << why << '\n';
        if (opts.has("--json")) std::cout << statusJson(statusKey(sheet.status), errors, why);
        return 1;
    };
    if (sheet.status == BalanceStatus::Invalid)
        return unavailable("the scenario cannot be solved, so it has no flow network (run `tledger check` for all problems)");
    const NetworkAnalysis r = analyseNetwork(*model, sheet, analysisOptions(opts));
    if (!r.available()) return unavailable("the scenario has no compartments, so it has no flow network");
    for (const Problem& p : r.network.adjustments) std::cerr << "warning: " << p.describe() << '\n';
    std::cout << (opts.has("--json") ? networkReportJson(r, jsonOptions(opts)) : networkReportTables(r));
    if (sheet.status != BalanceStatus::Balanced) {
        std::cerr << "tledger network: the scenario does not balance; figures describe its flows as they stand "
                     "(run `tledger solve` for the problems)\n";
        return 1;
    }
    return 0;
}

int fromScor(const ParsedOptions& opts, const std::string& file)
{
    const ScorReadResult read = readScorFile(file);
    for (const Problem& p : read.problems) std::cerr << p.describe() << '\n';
    if (!read.network) return 2;
    const NetworkAnalysis r = analyseNetwork(*read.network, analysisOptions(opts));
    for (const std::string& name : r.unknownProducers)
        std::cerr << "tledger network: --producers names '" << name << "', which is no living node of " << file << "\n";
    if (!r.unknownProducers.empty()) return 2;
    if (!opts.has("--json")) std::cout << "Network: " << read.network->title << " (units as the title states)\n\n";
    std::cout << (opts.has("--json") ? networkReportJson(r, jsonOptions(opts)) : networkReportTables(r));
    return 0;
}

}  // namespace

int cmdNetwork(const Args& args)
{
    const auto opts = parseOptions(args, {"--scenario", "--scor", "--producers"}, {"--json", "--keep-feeding-cycles", "--impact-matrix"},
                                   "network", std::cerr);
    if (!opts) return 2;
    if (opts->has("--impact-matrix") && !opts->has("--json")) {
        std::cerr << "tledger network: --impact-matrix goes with --json (the tables print the matrix up to 16 "
                     "compartments)\n";
        return 2;
    }
    if (opts->value("--producers") && !opts->value("--scor")) {
        std::cerr << "tledger network: --producers is for SCOR networks; a scenario's producers are its compartments' kind\n";
        return 2;
    }
    if (const auto scor = opts->value("--scor")) {
        if (!opts->positional.empty() || opts->value("--scenario")) {
            std::cerr << "tledger network: --scor FILE takes no MODEL and no --scenario\n";
            return 2;
        }
        return fromScor(*opts, *scor);
    }
    if (opts->positional.size() != 1) {
        std::cerr << "tledger network: expected one MODEL (a CSV folder or a .tledger project), or --scor FILE\n";
        return 2;
    }
    return fromModel(*opts);
}

}  // namespace tl::cli
