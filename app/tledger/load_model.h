// Loads the MODEL argument of a tledger command by the one rule of
// core/store/model_source.h (a CSV model folder, or a .tledger project with --scenario
// NAME). Problems are printed to `err` as "file:line:column: message"; nothing is
// returned if the model cannot be used.
#pragma once

#include <filesystem>
#include <optional>
#include <ostream>
#include <string>

#include "core/model/model.h"

namespace tl::cli {

std::optional<Model> loadModelForCli(const std::filesystem::path& path, const std::optional<std::string>& scenario,
                                     std::ostream& err);

}  // namespace tl::cli
