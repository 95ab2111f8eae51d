// Ensemble: Monte Carlo draws of a scenario's uncertain inputs, each solved, summarised
// by streaming statistics (DESIGN.md 3.7, issue 15).
//
//   inputs     ensemble_inputs.h (distributions from data confidence; Dirichlet diets)
//   random     draw_stream.h: draw d of seed s is a pure function of (s, d), so a draw
//              is the same whichever thread, slice or machine computes it
//   solve      the balance plan's numeric step (BalancePlan::solve, allocation-free) on
//              the drawn inputs, one workspace per thread; a draw is "balanced" by the
//              same error checks as solveBalance (EE <= EE max, R >= 0, no negative
//              solved value, equations close, detritus not over-consumed), each counted
//              against the compartment that breaks it (breakers)
//   outputs    over the balanced draws (the ones a modeller would accept): B, P/B, EE of
//              living compartments, Q/B and P/Q of consumers, EE of detritus pools; with
//              "tl" the consumers' trophic levels; with "levels" the transfer efficiency
//              of levels II-V and their geometric mean (II-IV), and the shares of primary
//              production and detritus inflow consumed; with "indicators" the system
//              indicators. Named "<compartment>.<quantity>" or "system.<quantity>".
//   statistics output_statistics.h: count, mean, min, max, histogram percentiles; every
//              part merges by integer addition or min / max, so threads, slices and
//              their merge give the same bits (EnsembleStatistics::merge).
//   threads    a std::thread pool takes chunks of draws from an atomic counter; the
//              caller's thread reports progress and watches the cancel flag.
#pragma once

#include <atomic>
#include <cstdint>
#include <functional>
#include <string>
#include <vector>

#include <Eigen/Dense>

#include "core/ensemble/ensemble_inputs.h"
#include "core/ensemble/output_statistics.h"
#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl::ensemble {

// Draws in which one compartment breaks a balance condition (a draw may break several).
struct BreakCounts {
    std::uint64_t any = 0;
    std::uint64_t eeAboveMax = 0, negativeRespiration = 0, negativeValue = 0, residual = 0, detritusOverConsumed = 0;
    bool operator==(const BreakCounts&) const = default;
    BreakCounts& operator+=(const BreakCounts& o);
};

// The sufficient statistics of draws of one ensemble: everything the summary needs, and
// nothing that depends on how the draws were split.
struct EnsembleStatistics {
    std::string fingerprint;  // hex; slices of different ensembles never merge
    std::uint64_t seed = 0, totalDraws = 0;
    Analyses analyses;
    std::string shape;  // default input shape (descriptive; in the fingerprint through the inputs)
    std::vector<DrawRange> ranges;  // draws covered: sorted, adjacent ranges joined
    std::uint64_t drawsRun = 0, solved = 0, balanced = 0, singular = 0;
    std::vector<std::string> compartments;
    std::vector<BreakCounts> breaks;  // per compartment
    std::vector<std::string> outputNames;
    std::vector<OutputStatistics> outputs;
    std::vector<std::string> inputNames;  // the drawn inputs (descriptive)
    bool flowTermsHeld = false;           // EnsembleSettings::holdFlowTerms (ensemble_inputs.h)
    bool cancelled = false;

    bool complete() const { return ranges.size() == 1 && ranges[0].first == 0 && ranges[0].last + 1 == totalDraws; }
    double balancedShare() const { return drawsRun ? static_cast<double>(balanced) / static_cast<double>(drawsRun) : 0.0; }
    // Adds another slice. Refused (false, *why says which) when the slices come from
    // different ensembles, overlap, or one of them was cancelled.
    bool merge(const EnsembleStatistics& other, std::string* why = nullptr);
    bool operator==(const EnsembleStatistics&) const = default;
};

// Most numbers (draw index, inputs and outputs of every draw asked for) one run may keep:
// 2^27, 1 GiB of doubles and about 5 GiB at the peak of writing them as CSV.
inline constexpr std::uint64_t kMaxKeptNumbers = std::uint64_t{1} << 27;

// Balanced draws kept on request: one row per draw, in draw order; a plain matrix for
// global sensitivity (PRCC) and for CSV export.
struct KeptDraws {
    std::vector<std::string> inputNames, outputNames;
    // Per diet row drawn, its input columns [first, first + count): a row's shares sum to
    // its entered total, so a regression on inputs drops one of them (sensitivity PRCC).
    std::vector<std::pair<std::size_t, std::size_t>> dietColumns;
    std::vector<std::uint64_t> draw;
    Eigen::MatrixXd inputs;   // draws x inputs
    Eigen::MatrixXd outputs;  // draws x outputs
};

struct EnsembleRun {
    Problems problems;  // why the ensemble could not run (empty when it ran)
    EnsembleStatistics statistics;
    KeptDraws kept;
    bool ran() const { return !hasErrors(problems); }
};

// done draws of total, called on the caller's thread about every 100 ms and at the end.
using EnsembleProgress = std::function<void(std::uint64_t done, std::uint64_t total)>;

// Runs settings.range (or all settings.draws draws). Refuses (problems) a scenario the
// balance cannot plan (structural errors), a draw count of 0, a range outside the draws
// or of more than 2^32 - 1 draws.
EnsembleRun runEnsemble(const Model& model, const EnsembleSettings& settings,
                        const std::atomic<bool>* cancel = nullptr, const EnsembleProgress& progress = {});

// The fingerprint runEnsemble would give (EnsembleStatistics::fingerprint) without running
// a draw: whether a stored run still describes the scenario. Empty when the scenario's
// balance cannot be planned.
std::string ensembleFingerprint(const Model& model, const EnsembleSettings& settings);

}  // namespace tl::ensemble
