// tledger solve MODEL [--scenario NAME] [--json]: the balance sheet (DESIGN 5.2, 5.3).
#include <iostream>

#include "app/tledger/commands.h"
#include "app/tledger/load_model.h"
#include "app/tledger/options.h"
#include "core/balance/scenario_checks.h"
#include "core/balance/solver.h"
#include "core/io/balance_report.h"

namespace tl::cli {

int cmdSolve(const Args& args)
{
    const auto opts = parseOptions(args, {"--scenario"}, {"--json"}, "solve", std::cerr);
    if (!opts) return 2;
    if (opts->positional.size() != 1) {
        std::cerr << "tledger solve: expected one MODEL (a CSV folder or a .tledger project)\n";
        return 2;
    }
    const auto model = loadModelForCli(opts->positional[0], opts->value("--scenario"), std::cerr);
    if (!model) return 2;

    // Reported as the workbench's status bar judges it: balanced only when valid too.
    const BalanceSheet sheet = reportedSheet(*model, solveBalance(*model));
    std::cout << (opts->has("--json") ? balanceSheetJson(sheet) : balanceSheetTable(sheet, model->units));
    return sheet.status == BalanceStatus::Balanced ? 0 : 1;
}

}  // namespace tl::cli
