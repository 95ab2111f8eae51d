// tledger check MODEL [--scenario NAME] [--json]: every input problem and rule-of-thumb
// diagnostic of a scenario, without the balance sheet. Exit 1 if any error is found
// or the model does not balance; warnings alone leave it at 0.
#include <filesystem>
#include <iostream>
#include <sstream>

#include "app/tledger/commands.h"
#include "app/tledger/load_model.h"
#include "app/tledger/options.h"
#include "core/balance/solver.h"
#include "core/io/balance_report.h"
#include "core/balance/scenario_checks.h"

namespace tl::cli {

int cmdCheck(const Args& args)
{
    const auto opts = parseOptions(args, {"--scenario"}, {"--json"}, "check", std::cerr);
    if (!opts) return 2;
    if (opts->positional.size() != 1) {
        std::cerr << "tledger check: expected one MODEL (a CSV folder or a .tledger project)\n";
        return 2;
    }
    // A CSV reader's warnings come back from validateModel below; print them only for a
    // failed load. A project's notes (opened read-only, newer version) are always printed.
    std::ostringstream loadMessages;
    const auto model = loadModelForCli(opts->positional[0], opts->value("--scenario"), loadMessages);
    std::error_code ec;
    if (!model || !std::filesystem::is_directory(opts->positional[0], ec)) std::cerr << loadMessages.str();
    if (!model) return 2;

    const BalanceSheet sheet = solveBalance(*model);
    const Problems problems = scenarioChecks(*model, sheet);
    if (opts->has("--json")) {
        std::cout << problemsJson(problems);
    } else {
        std::cout << "Checks: balance status " << statusKey(sheet.status) << "\n\n" << problemsTable(problems);
    }
    return hasErrors(problems) || sheet.status != BalanceStatus::Balanced ? 1 : 0;
}

}  // namespace tl::cli
