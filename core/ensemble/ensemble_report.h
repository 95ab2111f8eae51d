// Ensemble results as text: the JSON of `tledger ensemble --json` (DESIGN.md 5.3, keys
// only ever added), the readable table, the partial result of a slice (sufficient
// statistics, read back by `tledger ensemble-merge`), the kept draws as CSV, and the
// settings stored with a run in a project.
//
// Everything here is a function of EnsembleStatistics alone (never of thread count or
// of how the draws were split), so a merged result prints the same bytes as one run.
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "core/ensemble/ensemble.h"
#include "core/model/problem.h"

namespace tl::ensemble {

inline constexpr const char* kPartialFormat = "tledger-ensemble-partial";
inline constexpr int kPartialVersion = 1;
// What the ensemble holds at the point value (ensemble_inputs.h), said in every report.
inline constexpr const char* kHeldFixed = "catch, U, BA, E, detritus import and detritus routing";

std::string ensembleJson(const EnsembleStatistics& stats);
std::string ensembleTable(const EnsembleStatistics& stats);

std::string partialJson(const EnsembleStatistics& stats);
// `file` names the source in problems. Nothing is returned when the text is not a
// partial result of this format (problems say what is wrong).
std::optional<EnsembleStatistics> readPartialJson(std::string_view text, const std::string& file, Problems& problems);

// Header: draw, the drawn inputs, the outputs; one row per kept draw, shortest exact numbers.
std::string keptDrawsCsv(const KeptDraws& kept);

std::string ensembleSettingsJson(const EnsembleSettings& settings, const std::string& scenario);

}  // namespace tl::ensemble
