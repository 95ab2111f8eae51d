// Local elasticities of a scenario's outputs with respect to its inputs at the point
// estimate (DESIGN.md 3.7): e = d ln(output) / d ln(input), the relative change of an
// output per relative change of an input (a 1 % rise of the input moves the output by
// about e %).
//
// Inputs (each only where the scenario gives it and it is not 0):
//   B, P/B, Q/B, EE, U, net emigration E and biomass accumulation BA of living
//   compartments; P/Q where it stands in for P/B or Q/B or ties them; a compartment's
//   total catch (every fleet's landings and discards of it scaled together); a detritus
//   pool's import; every non-zero diet share, import included. A diet row must stay
//   on its simplex, so a diet entry moves along
//       DC_k(t) = DC_k e^t,   DC_l(t) = DC_l (S - DC_k e^t) / (S - DC_k)   (l != k),
//   S the row sum: the other entries of the row, import included, give up the change
//   in proportion to their share and the row sum is kept. A predator with a single
//   diet entry has no such path; its entry is not an input.
//
// Outputs: the value each living compartment solves for (B, P/B, Q/B or EE), the EE of
// every living compartment and detritus pool (EE_d = consumption / inflow), P/Q and TL
// of every consumer.
//
// Methods, recorded per output:
//   Analytic: the balance equations G(x, theta) = 0 (solver.h) are linear in the
//     unknowns x, so implicit differentiation gives dx/dtheta = -J^-1 dG/dtheta with J =
//     dG/dx, one sparse LU for all inputs. EE, P/Q and detritus EE follow by the chain
//     rule from their closed forms; TL = 1 + D'^T TL (trophic_level.h) differentiates to
//     (I - D'^T) dTL = dD'^T TL, one more sparse LU.
//   CentralDifference: (y(theta e^h) - y(theta e^-h)) / (2 h y), each side a full
//     solveBalance. Used for every output when the scenario's system is over-determined
//     (a fully given compartment checks a coupled unknown: the solver's least-squares
//     answer has no simple implicit derivative), or when asked (ElasticityOptions).
// An elasticity is NaN where the output is 0 at the point (no relative change) or is
// itself undefined (a TL in a closed feeding loop).
#pragma once

#include <cstddef>
#include <limits>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <Eigen/Dense>

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"

namespace tl {

enum class SensitivityInputKind {
    Biomass, PB, QB, EE, PQ, Catch, Diet, Unassim, NetEmigration, BiomassAccum, DetritusImport
};
// "biomass", "pb", "qb", "ee", "pq", "catch", "diet", and the CSV keys "unassim",
// "net_emigration", "biomass_accum", "detritus_import".
std::string_view inputKindKey(SensitivityInputKind k);

// Prey index of a diet input that is the `import` column.
inline constexpr std::size_t kImportPrey = std::numeric_limits<std::size_t>::max();

struct SensitivityInput {
    SensitivityInputKind kind = SensitivityInputKind::Biomass;
    std::size_t compartment = 0;  // the predator for a diet entry
    std::size_t prey = 0;         // diet only: prey index or kImportPrey
    double value = 0.0;           // at the point estimate
};

enum class SensitivityOutputKind { Biomass, PB, QB, EE, PQ, TL };
std::string_view outputKindKey(SensitivityOutputKind k);  // "biomass", "pb", "qb", "ee", "pq", "tl"
// Accepts the keys above and "b" for biomass (the reconcile command's spelling).
std::optional<SensitivityOutputKind> parseOutputKind(std::string_view key);

enum class DerivativeMethod { Analytic, CentralDifference };
std::string_view methodKey(DerivativeMethod m);  // "analytic", "central_difference"

struct SensitivityOutput {
    SensitivityOutputKind kind = SensitivityOutputKind::EE;
    std::size_t compartment = 0;
    double value = 0.0;  // at the point estimate
    bool solved = false; // the value is one the balance solves for
    DerivativeMethod method = DerivativeMethod::Analytic;
};

// "Perch.biomass", "Perch.tl": the output names of the CLI and its JSON.
std::string outputName(const Model& model, const SensitivityOutput& output);
// "Perch.pb", "Perch.catch", "Perch.diet:Roach", "Perch.diet:import".
std::string inputName(const Model& model, const SensitivityInput& input);

struct ElasticityOptions {
    bool forceCentralDifferences = false;
    double logStep = 1e-5;  // h of the central differences, on ln(input)
    // Restrict the outputs to these (empty: all); see findOutput.
    std::vector<std::pair<std::size_t, SensitivityOutputKind>> only;
    // The outputs x inputs matrix is dense: above this many entries (400 MB) nothing is
    // computed and `error` says to choose outputs (a 1000-compartment synthetic web has
    // 3 074 outputs and 10 376 inputs: 3.2e7).
    std::size_t maxEntries = 50'000'000;
};

struct ElasticityResult {
    BalanceStatus status = BalanceStatus::Invalid;  // of the point estimate
    std::string error;       // why nothing was computed (status Invalid, or too large); empty otherwise
    bool tooLarge = false;   // refused by ElasticityOptions::maxEntries
    std::string methodNote;  // why central differences were used, if they were
    double logStep = 0.0;
    std::vector<SensitivityInput> inputs;
    std::vector<SensitivityOutput> outputs;
    Eigen::MatrixXd elasticity;  // outputs x inputs
};

// Every input and output of the scenario as listed above (no values of derivatives).
std::vector<SensitivityInput> sensitivityInputs(const Model& model);
std::vector<SensitivityOutput> sensitivityOutputs(const Model& model, const BalanceSheet& sheet);

// The output (compartment, kind) among sensitivityOutputs, or nullopt.
std::optional<SensitivityOutput> findOutput(const Model& model, const BalanceSheet& sheet, std::size_t compartment,
                                            SensitivityOutputKind kind);

ElasticityResult computeElasticities(const Model& model, const ElasticityOptions& options = {});

// The model with one input moved to input.value * e^logStep along its path (the
// simplex path for a diet entry, every fleet's landings and discards for catch).
Model perturbedModel(const Model& model, const SensitivityInput& input, double logStep);

// An output's value in a solved sheet (NaN when not applicable).
double outputValue(const BalanceSheet& sheet, const SensitivityOutput& output);

}  // namespace tl
