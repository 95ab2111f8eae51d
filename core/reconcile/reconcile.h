// reconcile: solve a ReconcileProblem (core/reconcile/reconcile_problem.h) with NLopt's
// SLSQP (Kraft 1988, DFVLR-FB 88-28; Kraft 1994 ACM TOMS 20:262), analytic gradients,
// starting from the point estimate (every multiplier 1, every diet as given).
//
//   1. A start that already satisfies every constraint is the answer: the objective is
//      never negative and is 0 there. Nothing is changed.
//   2. Otherwise SLSQP on f(x) under g(x) <= 0, h(x) = 0 and the bounds, over a working
//      set: the variables of the constraints violated at the start, then, round by
//      round, of every constraint active at the answer, until the set stops growing. A
//      variable in no active constraint keeps its start value at a local optimum (its
//      objective gradient is 0 there), so the answer is a KKT point of the whole
//      problem while SLSQP (dense, cost ~ cube of the variable count) sees only the
//      inputs near the imbalance. SLSQP works on scaled variables y = (x - x0) / (CV s),
//      in which the objective is sum y^2. A working set too large for dense SLSQP
//      (ReconcileOptions::slsqpFreeVariableLimit) is solved by NLopt's augmented
//      Lagrangian with L-BFGS first, SLSQP polishing only if a constraint still fails.
//   3. When that ends with a constraint still violated (the model is infeasible within
//      its pins and bounds, or SLSQP stalled), the elastic form: every model constraint
//      gets a slack t_k >= 0 (g_k - t_k <= 0; for an equality, |h_k| <= t_k) and the
//      objective becomes f + rho sum_k t_k with rho = kElasticPenalty, an exact penalty:
//      it returns the least-violating point and names the constraints whose slack stays
//      positive as the conflict, with the pins, bounds and fixed kinds of input that
//      hold them there (the suggestions what to relax).
// The adjusted model is then solved by the mass-balance solver (solveBalance) and its
// status reported: the balance, not the optimiser, decides "balanced".
#pragma once

#include <atomic>
#include <functional>
#include <string>
#include <vector>

#include "core/balance/balance_sheet.h"
#include "core/reconcile/reconcile_problem.h"

namespace tl {

struct ReconcileChange {
    std::size_t compartment = 0;
    AdjustParam param = AdjustParam::Biomass;
    std::size_t prey = 0;         // diet changes
    double before = 0.0, after = 0.0;
    double percent = 0.0;         // 100 (after - before) / before
    std::string confidence;       // where the CV comes from
    double cv = 0.0;
    double objectiveShare = 0.0;  // this change's term over the objective
};

struct ReconcileConflict {
    std::string constraint;      // "EE of Roach juveniles <= 1"
    std::string compartment;
    ConstraintKind kind = ConstraintKind::EEMax;
    double violation = 0.0;      // scaled (relative to the compartment's production)
    std::vector<std::string> relax;  // "unpin Roach juveniles.b", "let qb move (--move)", ...
};

enum class ReconcileStatus {
    Unchanged,       // already balanced: nothing to change
    Balanced,        // a change found that satisfies every constraint
    LeastViolating,  // infeasible: the least-violating change, with the conflict named
    Invalid,         // the problem could not be built (see problems)
    Cancelled        // stopped on request (ReconcileControl::cancel): nothing changed
};
std::string_view reconcileStatusKey(ReconcileStatus s);  // "unchanged", "balanced", ...

struct ReconcileResult {
    ReconcileStatus status = ReconcileStatus::Invalid;
    Problems problems;
    Model adjusted;                       // the inputs after reconcile (unchanged when Invalid)
    BalanceStatus balanceAfter = BalanceStatus::Invalid;  // solveBalance(adjusted).status
    double objective = 0.0;               // f at the answer (without the elastic penalty)
    int evaluations = 0;                  // NLopt objective evaluations, both phases
    bool elastic = false;                 // the elastic phase ran
    std::string solverResult;             // NLopt's result code of the last phase
    double largestViolation = 0.0;        // scaled constraints (relative to production)
    double seconds = 0.0;                 // wall time of build + solve
    std::size_t variableCount = 0, constraintCount = 0;
    std::size_t freeVariables = 0;        // variables in the final working set
    int workingSetRounds = 0;             // SLSQP runs until the working set stopped growing
    std::vector<ReconcileChange> changes;        // ranked: largest share of the objective first
    std::vector<std::string> binding;            // active constraints and bounds at the answer
    std::vector<ReconcileConflict> conflicts;    // LeastViolating only
    std::vector<double> eeBefore, eeAfter;       // per compartment (NaN where undefined)
};

// Penalty per unit of scaled violation in the elastic phase (our choice: far above any
// weighted change of a plausible model, so violation is removed first).
inline constexpr double kElasticPenalty = 1e4;
// A scaled constraint counts as satisfied within this, and as binding within it of 0.
inline constexpr double kReconcileTolerance = 1e-7;

// How far a running reconcile has come, for a caller on another thread. SLSQP cannot
// say how many iterations remain, so this is a count, not a fraction.
struct ReconcileProgress {
    int round = 0;                 // working-set round (1-based); the elastic phase follows the last
    bool elastic = false;          // the elastic (least-violating) phase is running
    int evaluations = 0;           // objective evaluations so far, all phases
    std::size_t freeVariables = 0; // variables SLSQP moves in this phase
};

// Optional control of a run from another thread (the workbench runs reconcile off its
// GUI thread). `cancel` is read at every evaluation: once set, SLSQP is stopped (NLopt's
// forced stop) and the result is Cancelled with the model unchanged. `progress` is
// called on the solving thread at the start of each phase and every
// kProgressEvery evaluations; it must be cheap and thread-safe.
struct ReconcileControl {
    const std::atomic<bool>* cancel = nullptr;
    std::function<void(const ReconcileProgress&)> progress;
};
inline constexpr int kProgressEvery = 20;

ReconcileResult reconcile(const Model& model, const ReconcileOptions& options = {}, const ReconcileControl& control = {});

// The source note written on every changed value: method, date, value before.
std::string reconcileSourceNote(const std::string& date, double before, const std::string& previous);

// A new scenario's model from a result: the adjusted model with a source note on every
// changed B, P/B and Q/B (date as ISO 8601). Diet and catch have no source field; the
// scenario description lists them (reconcileDescription).
Model annotatedReconcileModel(const Model& original, const ReconcileResult& result, const std::string& date);
std::string reconcileDescription(const Model& original, const ReconcileResult& result, const std::string& fromScenario);

}  // namespace tl
