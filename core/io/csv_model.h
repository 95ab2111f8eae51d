// CSV model folder (DESIGN.md 5.1): compartments.csv, diet.csv, and optionally
// harvest.csv and detritus_routing.csv. UTF-8, RFC 4180 quoting, '.' decimal mark.
// Every malformed input becomes a Problem naming file, line, column and what was
// expected; the reader never throws and never returns a half-read model.
//
// Locations: line = physical line (1-based) where the cell starts; column = the
// cell's field number (1-based), as a spreadsheet counts columns. A problem of a whole
// line (a header without a required column, a NUL byte) names its line and column 1 or
// the field it is in; a finding about a compartment with no row of its own in the file
// concerned (a consumer without a diet row) is placed on its row in compartments.csv.
//
// Formula guard: every text cell the writer writes that a spreadsheet would run as a
// formula (leading '=', '+', '-', '@', tab or CR) gets an apostrophe in front, and the
// reader drops it again; numbers are never guarded (core/io/csv_table.h, guardFormula).
//
// Beyond the four files of the contract, two optional files carry what a Model holds
// and the contract has no column for, so that a write/read round trip loses nothing:
//   confidence.csv  compartment,parameter,grade,cv,source   (data confidence, DESIGN 3.1)
//   settings.csv    key,value   (units: currency, area, time; check rules: ee_max,
//                   pq_min, pq_max, diet_sum_tolerance, cv_grade_a .. cv_grade_d)
// and harvest.csv may add the columns discard_survival (fraction of discards that
// survive, 0..1) and discard_pool (the detritus pool receiving a fleet's dead
// discards; one value per fleet). A harvest row with a fleet and no compartment
// declares a fleet that has no catch yet.
//
// diet.csv may come in long form instead: header `predator,prey,share`, one row per
// non-zero entry (prey may be `import`); the reader tells the forms apart by the header.
// A predator's entries may be spread over the file; the row-sum finding is placed on the
// predator's first line.
//
// What the reader checks: the files' structure (header, cell counts, quoting,
// encoding), numbers and names (known, unique), and then every check of the inputs
// by validateModel (core/model/validation.h), placed on the cell concerned. Its
// errors (a diet row or a source's routing that does not sum to 1, a consumer
// without a diet, a producer or detritus pool given a diet, negative values, ...)
// mean no model is returned; its warnings (e.g. no detritus pool) leave the model
// returned. Checks of the solution (EE > 1, P/Q range) belong to the solver.
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

// diet.csv in wide form (a column per prey) or long form (predator,prey,share; one row
// per non-zero entry). The reader tells them apart by the header; the writer picks wide
// form up to kWideDietMaxCompartments, where a spreadsheet still shows the matrix, and
// long form above, where the matrix would be mostly empty cells (n x n of them).
enum class DietForm { Automatic, Wide, Long };
inline constexpr std::size_t kWideDietMaxCompartments = 60;

struct CsvWriteOptions {
    DietForm dietForm = DietForm::Automatic;
};

// Writes compartments.csv, diet.csv, harvest.csv, detritus_routing.csv,
// confidence.csv and settings.csv into `folder` (created if missing), each
// atomically (temporary file, then rename). An optional file with nothing to say is
// not written, and one left from an earlier write is removed, so no stale file
// survives. Numbers are written
// in their shortest exact form, so readCsvModel(writeCsvModel(m)) == m. Returns
// problems (e.g. unwritable folder, a name the reader would refuse).
Problems writeCsvModel(const Model& model, const std::filesystem::path& folder, const CsvWriteOptions& options = {});

}  // namespace tl
