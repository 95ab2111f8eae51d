// The tledger subcommands (DESIGN.md 5.2). Each lives in its own cmd_<name>.cpp and
// returns the process exit code: 0 success, 1 model problems reported, 2 bad input
// or usage (the message names the file, line and column or the cell).
#pragma once

#include <string>
#include <vector>

namespace tl::cli {

using Args = std::vector<std::string>;  // the arguments after the subcommand name

int cmdSolve(const Args& args);
int cmdCheck(const Args& args);
int cmdNetwork(const Args& args);
int cmdImport(const Args& args);
int cmdExport(const Args& args);
int cmdReconcile(const Args& args);
int cmdSensitivity(const Args& args);
int cmdCompare(const Args& args);
int cmdEnsemble(const Args& args);
int cmdEnsembleMerge(const Args& args);
int cmdFieldwork(const Args& args);

}  // namespace tl::cli
