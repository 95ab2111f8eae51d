// CSV model folder (DESIGN.md 5.1): compartments.csv, diet.csv, and optionally
// harvest.csv and detritus_routing.csv. UTF-8, RFC 4180 quoting, '.' decimal mark.
// Every malformed input becomes a Problem naming file, line, column and what was
// expected; the reader never throws and never returns a half-read model.
#pragma once

#include <filesystem>
#include <optional>

#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl {

struct CsvReadResult {
    std::optional<Model> model;  // empty when any error was found
    Problems problems;           // errors and warnings, each with its FileLocation
};

CsvReadResult readCsvModel(const std::filesystem::path& folder);

// Writes the four files into `folder` (created if missing), each atomically
// (temporary file, then rename). Returns problems (e.g. unwritable folder).
Problems writeCsvModel(const Model& model, const std::filesystem::path& folder);

}  // namespace tl
