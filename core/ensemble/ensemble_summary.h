// EnsembleSummary: what a finished ensemble says, in the form the workbench shows it:
// read back from the summary JSON (ensemble_report.h's ensembleJson, the text the CLI
// and the workbench store beside a scenario), so a run just made and a run stored last
// month are shown by the same code. Plus the two small computations a page needs that
// are not formatting: a histogram of one output with equal-width bars (from the
// statistics' fine bins), and the 95 % interval of a compartment's quantity.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/ensemble/output_statistics.h"

namespace tl::ensemble {

struct OutputSummary {
    std::string name;  // "Perch.ee", "system.te_II"
    std::optional<double> p2_5, p25, p50, p75, p97_5, mean, min, max;
    std::uint64_t count = 0, undefined = 0;
    bool outOfWindow = false;
};

struct BreakerSummary {
    std::string compartment;
    std::uint64_t draws = 0;
    double share = 0.0;  // of the draws run
    std::uint64_t eeAboveMax = 0, negativeRespiration = 0, negativeValue = 0, residual = 0, detritusOverConsumed = 0;
};

struct EnsembleSummary {
    std::uint64_t draws = 0, totalDraws = 0, balanced = 0;
    double balancedShare = 0.0;
    std::string seed;  // as the JSON has it (a number, or text beyond 2^53)
    std::string shape;
    std::vector<std::string> analyses;
    bool cancelled = false, complete = false;
    std::vector<OutputSummary> outputs;   // in the run's order
    std::vector<BreakerSummary> breakers; // most frequent first (as stored)

    const OutputSummary* find(std::string_view name) const;
};

// Reads ensembleJson text. Nothing is returned when the text is not JSON of that shape
// (*why says what is wrong).
std::optional<EnsembleSummary> readEnsembleSummary(std::string_view json, std::string* why = nullptr);

// The middle 95 % of a compartment's quantity ("Perch", "ee"), when the summary has it
// with both ends defined.
struct Interval {
    double low = 0.0, high = 0.0;
};
std::optional<Interval> interval95(const EnsembleSummary& summary, std::string_view compartment, std::string_view quantity);

// A histogram of one output in `bars` equal-width bars over [min, max]. Each fine bin of
// the statistics (at most 0.78 % wide, output_statistics.h) goes whole to the bar that
// holds its midpoint (clamped to [min, max]), so the bars' counts add up to count()
// exactly and a value is misplaced by at most one fine bin's width. A single distinct
// value gives one bar of zero width.
struct HistogramBars {
    double low = 0.0, width = 0.0;  // bar k spans [low + k width, low + (k+1) width]
    std::vector<std::uint64_t> counts;
};
HistogramBars histogramBars(const OutputStatistics& statistics, int bars);

}  // namespace tl::ensemble
