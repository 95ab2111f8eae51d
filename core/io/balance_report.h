// Balance-sheet reports for the CLI: the JSON of DESIGN.md 5.3 (`tledger solve --json`,
// keys stable: add, never rename) and readable tables with units.
#pragma once

#include <string>
#include <string_view>

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"

namespace tl {

// One line for every printed or exported result that could steer harvest or water use.
inline constexpr const char* kDecisionSupportNotice =
    "Model output supports, and does not replace, stock assessment, local regulation and "
    "licensed professional judgement.";

std::string balanceSheetJson(const BalanceSheet& sheet);
std::string problemsJson(const Problems& problems);  // {"status": ..., "problems": [...]} for check
// {"status": ..., "problems": [...], "message": ...}: what a command prints with --json
// when it has no result to give (tledger network on a scenario that cannot be solved).
std::string statusJson(std::string_view status, const Problems& problems, std::string_view message);

std::string balanceSheetTable(const BalanceSheet& sheet, const Units& units);
std::string problemsTable(const Problems& problems);

}  // namespace tl
