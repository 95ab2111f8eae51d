// What the report shows of a project's stored runs (StoredRun, core/store/project.h),
// read from the JSON their writers keep and never changed here:
//   kind "ensemble"   summary = `tledger ensemble --json` (core/ensemble/ensemble_report.h:
//                     draws, seed, balanced_share, balanced_draws, outputs{name: {p2_5, p50,
//                     p97_5, mean, count}}, balance_breakers, shape, complete, cancelled);
//                     settings = ensembleSettingsJson.
//   kind "reconcile"  summary = `tledger reconcile --json` (core/reconcile/reconcile_report.h:
//                     status, balance_after, scenario, saved_as, changes[{compartment,
//                     parameter, prey, before, after, percent_change, confidence}]); stored
//                     on the new scenario by `tledger reconcile` and the Reconcile dialog.
// A run whose JSON cannot be read gives a summary with `error` set (the report says so
// and goes on); nothing here throws.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/store/project.h"

namespace tl {

enum class KeyOutputUnit { Percent, Flow, Biomass, None };
inline constexpr std::size_t kMostEeRows = 12;

struct EnsembleRunSummary {
    struct Row {
        std::string output;  // the ensemble's output name, e.g. "system.mean_te"
        std::string label;   // for reading, e.g. "Mean TE, levels II-IV"
        KeyOutputUnit unit = KeyOutputUnit::None;  // Percent: the stored fraction times 100
        std::optional<double> p2_5, p50, p97_5, mean;
        long long count = 0;  // balanced draws the percentiles cover
    };
    struct Breaker {
        std::string compartment;
        long long draws = 0;
        double share = 0.0;
    };
    long long draws = 0, balancedDraws = 0, totalDraws = 0;
    double balancedShare = 0.0;
    std::string seed;  // as stored (a number, or text beyond 2^53)
    std::string shape;
    bool complete = true, cancelled = false;
    // The system outputs of kKeyEnsembleOutputs the run holds, in that order; a run without
    // them (analyses balance and tl only): the EE of the first kMostEeRows compartments.
    std::vector<Row> keyOutputs;
    std::size_t outputsLeftOut = 0;  // EE rows beyond kMostEeRows
    std::vector<Breaker> breakers;   // compartments breaking the balance in some draw, most often first
    std::string error;               // non-empty: the stored JSON could not be read
};

// System outputs shown in the report's ensemble table, in order: output name and label.
struct KeyEnsembleOutput {
    const char* output;
    const char* label;
    KeyOutputUnit unit;
};
extern const std::vector<KeyEnsembleOutput> kKeyEnsembleOutputs;

EnsembleRunSummary readEnsembleRun(const StoredRun& run);

struct ReconcileRunSummary {
    struct Change {
        std::string compartment, parameter, prey;  // prey: diet changes only
        double before = 0.0, after = 0.0, percent = 0.0;
        std::string confidence;
    };
    std::string from;           // the scenario reconciled
    std::string status;         // "balanced" | "least_violating" | ...
    std::string balanceAfter;   // status key of the balance after the changes
    std::vector<Change> changes;
    std::string error;
};

ReconcileRunSummary readReconcileRun(const StoredRun& run);

}  // namespace tl
