// Comparison of two or more scenarios of one project (issue 16): every input that
// differs, and every output side by side with its difference from the first scenario
// named (the reference). Reviewers set a baseline beside management scenarios.
//
// Matching: compartments, prey, fleets and pools are matched by name up to capitals and
// spaces (core/model/names.h), so a rename of case alone is not a change. A compartment
// absent from a scenario is one input difference ("compartment"); its own parameters
// are not listed again, and its outputs are NaN (not available) there.
//
// Differences of scenario s against the reference r (common practice, no source):
//   absolute   d = x_s - x_r
//   percent    100 d / |x_r|; 0 when both are 0; NaN (undefined) when x_r = 0 and d != 0
//   differs    |d| > 1e-9 max(|x_s|, |x_r|), or a value in one and none in the other;
//              the relative tolerance keeps round-off of two solves of equal inputs
//              from counting as a change.
// Outputs come from the balance sheet (core/balance) and the network analysis
// (core/network/network_analysis.h): nothing is computed here that those do not.
//
// Ensembles (DESIGN 3.7) are being built apart: `attachEnsembleAgreement` takes paired
// draws through a lookup and fills, per difference, the share of paired draws (same seed,
// same draw index) in which the difference keeps the sign of the point estimate's.
#pragma once

#include <cstddef>
#include <functional>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "core/balance/balance_sheet.h"
#include "core/network/network_analysis.h"
#include "core/store/project.h"

namespace tl {

// One input of one compartment (or fleet) that is not the same in every scenario.
struct InputDifference {
    std::string compartment;  // empty for an input of a fleet as a whole
    std::string item;         // stable key: "compartment", "kind", "biomass", "pb", ..., "diet:<prey>",
                              // "diet:import", "routing:<pool>", "landings:<fleet>", "discards:<fleet>",
                              // "discard_survival:<fleet>", "fleet:<fleet>", "discard_pool:<fleet>"
    std::string label;        // for people: "B", "Diet share of Perch", "Landings by gill nets", ...
    std::vector<std::string> shown;             // per scenario, as a person reads it ("-" for none)
    std::vector<std::optional<double>> values;  // per scenario; numeric items only
    std::vector<std::string> sources;           // per scenario: the source note (parameters only)
    std::vector<std::string> confidence;        // per scenario: "B", "CV 0.3", "" (parameters only)
    bool valueDiffers = false, sourceDiffers = false, confidenceDiffers = false;
};

// One output difference of one scenario against the reference.
struct OutputDifference {
    double absolute = kNotApplicable;
    double percent = kNotApplicable;  // NaN: undefined (reference 0) or not available
    bool differs = false;
    // Share of paired ensemble draws in which the difference has the point estimate's
    // sign; empty without ensembles (see attachEnsembleAgreement).
    std::optional<double> sameSignShare;
};

enum class OutputGroup { Compartment, Level, System };

// One output quantity side by side.
struct ComparedOutput {
    OutputGroup group = OutputGroup::Compartment;
    std::string subject;   // compartment name; "II", "III", ... for levels; empty for the system
    std::string quantity;  // stable key: "biomass", "ee", "tl", "te", "tst", ... (as in the solve/network JSON)
    std::string label;     // for people: "B", "EE", "Total system throughput (TST)"
    std::string unit;      // "" when dimensionless
    std::vector<double> values;                // per scenario; NaN where not available
    std::vector<OutputDifference> differences;  // per scenario; [0], the reference, is all zero
    bool differs() const;
    // "<subject>.<quantity>" ("Perch.ee", "II.te", "tst"): the ensemble's output key.
    std::string key() const;
};

struct ScenarioComparison {
    std::vector<std::string> scenarios;  // [0] is the reference
    std::vector<BalanceSheet> sheets;    // per scenario
    std::vector<NetworkAnalysis> analyses;
    Units units;  // of the reference

    std::vector<InputDifference> inputs;   // only those that differ
    std::vector<ComparedOutput> outputs;   // every compartment quantity, level and indicator

    std::size_t differingOutputs() const;
};

// Compares the scenarios in the order given (the first is the reference). Solves each
// and runs its network analysis; a scenario that cannot be solved keeps NaN outputs.
ScenarioComparison compareScenarios(const std::vector<const Scenario*>& scenarios, const AnalysisOptions& options = {});

// The scenarios of `project` named in `names`, in that order. Empty, with `error` set to
// a sentence that names the unknown or repeated names and lists those the project
// has, when a name is not one of them (matched as sameName does) or fewer than two
// distinct scenarios are named.
std::vector<const Scenario*> pickScenarios(const Project& project, const std::vector<std::string>& names,
                                           std::string& error);

// "A,B, C" -> {"A", "B", "C"} (trimmed; empty items dropped).
std::vector<std::string> splitScenarioList(std::string_view list);

// The compartment outputs of scenario `s` (>= 1) with the largest finite |percent|
// difference, largest first; at most `count`. What a "largest changes" chart shows.
std::vector<const ComparedOutput*> largestRelativeChanges(const ScenarioComparison& comparison, std::size_t s,
                                                          std::size_t count);

// --- ensemble seam -------------------------------------------------------------------
// Paired draws of one output: draw k of both scenarios comes from the same seed and draw
// index. Returns the share of pairs (both finite) whose difference other_k - reference_k
// has the sign of `pointDifference`; NaN when no pair is finite or the point difference
// is 0 (no sign to keep).
double sameSignShare(std::span<const double> reference, std::span<const double> other, double pointDifference);

// The draws of output `key` (ComparedOutput::key) in scenario `scenario`, or nothing.
using EnsembleDrawLookup =
    std::function<std::optional<std::vector<double>>(std::string_view scenario, std::string_view key)>;

// Fills OutputDifference::sameSignShare wherever the lookup has draws for both the
// reference and the scenario (of equal count). Returns how many differences it filled.
std::size_t attachEnsembleAgreement(ScenarioComparison& comparison, const EnsembleDrawLookup& lookup);

}  // namespace tl
