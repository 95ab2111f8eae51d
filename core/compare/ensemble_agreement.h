// Ensemble agreement of a comparison (issue 16 point 1, DESIGN 3.7): does each difference
// exceed the uncertainty? One ensemble per scenario, all with the same settings and seed,
// so draw d of every scenario comes from the same random stream (common random numbers:
// core/ensemble/draw_stream.h). Draws balanced in every scenario are paired by draw
// index; for each output, the share of pairs whose difference has the sign of the point
// difference is the OutputDifference::sameSignShare (scenario_comparison.h).
//
// Pairing is tight when the scenarios draw the same inputs in the same order (a changed
// value, catch, diet share or confidence): then input k of draw d is the same quantile in
// both. A scenario that draws other inputs (a value given in one and solved in the other,
// a new compartment) shifts the stream after the first input that differs; its draws are
// still paired by index but less alike, and the share moves toward what independent draws
// would give (stated, not corrected).
//
// Keys: the ensemble's "<compartment>.<quantity>" are the comparison's; "system.te_II" is
// "II.te", "system.<indicator>" is "<indicator>". Outputs the ensemble does not compute
// (flows such as P, Q, catch; levels' throughput) keep no share (JSON null).
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "core/compare/scenario_comparison.h"
#include "core/ensemble/ensemble.h"

namespace tl {

// The comparison's key of an ensemble output name (see above).
std::string comparisonKeyOf(std::string_view ensembleOutput);

struct EnsembleAgreementRun {
    Problems problems;     // why an ensemble could not run (then nothing is filled)
    std::size_t filled = 0;  // differences given a share
};

// Runs the ensembles (settings.keepBalancedDraws and the analyses tl, levels and
// indicators are switched on) and fills comparison.ensemble and every sameSignShare the
// draws allow. `scenarios` are those compared, in the comparison's order.
EnsembleAgreementRun attachEnsembleRuns(ScenarioComparison& comparison, const std::vector<const Scenario*>& scenarios,
                                        ensemble::EnsembleSettings settings, const std::atomic<bool>* cancel = nullptr);

// The settings of the latest stored ensemble run (kind "ensemble") of each scenario, when
// they agree in draws, seed, shape, CVs and held inputs (paired draws need that). Running
// them again gives the stored draws: a draw is a pure function of (scenario, seed, index),
// so nothing per draw is stored. Nothing, with `error` a sentence naming the scenario,
// when one has no stored run, its settings cannot be read, or they disagree. `warnings`
// names a scenario changed since its run (fingerprint differs; its draws then come from
// its current values).
std::optional<ensemble::EnsembleSettings> storedEnsembleSettings(const Project& project,
                                                                 const std::vector<const Scenario*>& scenarios,
                                                                 std::string& error, std::vector<std::string>& warnings);

}  // namespace tl
