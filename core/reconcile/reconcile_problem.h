// ReconcileProblem: the smallest confidence-weighted change to a scenario's inputs that
// balances it (DESIGN.md 3.6), written as a smooth constrained least-squares problem
//
//   minimise   f(x) = sum_k w_k ((x_k - x0_k) / s_k)^2,   w_k = 1 / CV_k^2
//   subject to g(x) <= 0, h(x) = 0, lower <= x <= upper.
//
// Variables (each one "moving" input of the scenario):
//   B, P/B, Q/B, catch   x = ln(value / value at start): a log-multiplier, s = 1, x0 = 0,
//                        so f counts (ln m / CV)^2, about (relative change / CV)^2;
//   diet fraction DC_ij  x = DC_ij itself on its simplex (explicit linear equality
//                        sum_i DC_ij = the row's prey sum at start, 0 <= DC_ij <= 1),
//                        s = x0 = DC_ij at start, so f counts (relative change / CV)^2
//                        as for the other inputs. Only entries that are non-zero move:
//                        reconcile never invents a feeding link, and imported food stays.
//   Explicit simplex constraints rather than a softmax: the constraints stay linear,
//   entries can reach 0, f stays quadratic in them, and an independent solver can
//   state the same problem with no change of variables (tests/crosscheck).
// A value the scenario leaves unknown (solved by the balance) is also a variable, with
// weight 0, started at its solved value; the balance equation of a compartment whose
// EE is given (or whose values are all given) then becomes an equality constraint. That
// is the balance solve written as constraints: at every feasible point the unknowns are
// exactly what the solver would return, and every constraint stays an explicit
// polynomial in the variables, so its gradient is exact and cheap (one pass over the
// diet entries). P/B given through P/Q (P/Q stand-in) shares Q/B's variable, and Q/B
// through P/Q shares P/B's: the given P/Q is kept.
//
// Constraints, for each living i with P_i = B_i P/B_i, Q_j = B_j Q/B_j and the demand on
// i's production D_i = sum_j DC_ij Q_j + Y_i + E_i + BA_i (Polovina 1984; Christensen &
// Pauly 1992; DESIGN 3.2), each divided by a positive scale fixed at the start:
//   EE unknown:    D_i - EE_max,i P_i <= 0        (EE_i = D_i / P_i <= EE_max)
//                  EE_min,i P_i - D_i <= 0        (only when an EE_min is set)
//   EE given:      D_i - EE_i P_i = 0             (the balance equation)
//   consumers:     ln P/Q_min - (ln P/B - ln Q/B) <= 0, ln P/B - ln Q/B - ln P/Q_max <= 0,
//                  R >= 0:  ln P/B - ln Q/B - ln(1 - U) <= 0   (R = Q(1-U) - P)
//   detritus d:    sum_j DC_dj Q_j - inflow_d <= 0, with
//                  inflow_d = import_d + sum_i route_id ((1-EE_i) P_i + U_i Q_i) + discards_d
//                  and (1-EE_i) P_i = P_i - D_i  (detritus pools not over-consumed)
//   diet rows:     sum_i DC_ij - (row prey sum at start) = 0
// No core/ Qt: plain C++ and Eigen.
#pragma once

#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include <Eigen/Dense>

#include "core/balance/balance_plan.h"
#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl {

// The inputs reconcile may change.
enum class AdjustParam { Biomass, PB, QB, Catch, Diet };
inline constexpr std::size_t kAdjustParamCount = 5;
std::string_view adjustKey(AdjustParam p);      // "b", "pb", "qb", "catch", "diet"
std::string_view adjustSymbol(AdjustParam p);   // "B", "P/B", "Q/B", "catch", "diet"
std::optional<AdjustParam> parseAdjustKey(std::string_view key);  // also "biomass"

struct ValueBounds {
    std::optional<double> lower, upper;  // absolute values, in the model's units
};

struct ReconcileOptions {
    // Which kinds of input may move (DESIGN 3.6). Catch is off unless asked for: landings
    // are usually the best-known figure and are set by regulation.
    bool moveBiomass = true, movePB = true, moveQB = true, moveDiet = true, moveCatch = false;
    // Inputs held at their value: (compartment, parameter); Diet pins a predator's row.
    std::vector<std::pair<std::size_t, AdjustParam>> pins;
    // User bounds on given values (not on diet fractions).
    std::map<std::pair<std::size_t, AdjustParam>, ValueBounds> bounds;
    // Per compartment overrides; defaults from Model::rules (EE max, P/Q range).
    std::map<std::size_t, double> eeMax, eeMin;
    std::map<std::size_t, std::pair<double, double>> pqRange;
    // CVs where the model has no confidence: a parameter without grade or CV counts as
    // grade C; diet shares of a row without a diet confidence, and catch, use these
    // (this project's convention, editable).
    double dietCv = 0.5;
    double catchCv = 0.25;
    // No input moves by more than this factor either way (keeps logs finite; our choice).
    double maxFactor = 1000.0;
    // Solver choice, not part of the problem: a working set of more free variables than
    // this is solved by NLopt's augmented Lagrangian with L-BFGS first, because dense
    // SLSQP costs about n^3 per iteration (core/reconcile/reconcile.cpp, runPhase).
    // Tests and the benchmark move it to compare the two on the same problem.
    std::size_t slsqpFreeVariableLimit = 300;
};

enum class ConstraintKind { EEMax, EEMin, EEGiven, PQMin, PQMax, RespirationNonNegative, DetritusSupply, DietSum };
std::string_view constraintKey(ConstraintKind k);  // "ee_max", "ee_min", ...

struct ReconcileVariable {
    std::size_t compartment = 0;
    AdjustParam param = AdjustParam::Biomass;
    std::size_t prey = 0;      // diet variables: the prey compartment
    double start = 0.0;        // x0
    double scale = 1.0;        // s
    double weight = 0.0;       // 1 / CV^2; 0 for a value the balance solves
    double cv = 0.0;
    double value0 = 0.0;       // the input's value at start (diet: the fraction)
    double lower = 0.0, upper = 0.0;  // on x
    bool solved = false;       // the scenario leaves this value unknown
    std::string confidence;    // "grade B", "CV 0.3", "default grade C", "diet CV 0.5"
};

struct ReconcileConstraint {
    ConstraintKind kind = ConstraintKind::EEMax;
    std::size_t compartment = 0;
    double bound = 0.0;        // EE max/min, EE given, P/Q bound, 1-U
    double scale = 1.0;        // the constraint is divided by it
    bool equality = false;
    std::string describe(const Model& model) const;  // "EE of Roach adults <= 1"
};

class ReconcileProblem {
public:
    // Builds the variables and constraints of a scenario. Problems: a scenario the
    // balance cannot solve (structure, singular), bad options. Nothing is built then.
    static ReconcileProblem build(const Model& model, const ReconcileOptions& options);

    const Problems& problems() const { return problems_; }
    bool ok() const { return !hasErrors(problems_); }

    std::size_t variableCount() const { return vars_.size(); }
    const std::vector<ReconcileVariable>& variables() const { return vars_; }
    const std::vector<ReconcileConstraint>& constraints() const { return cons_; }
    std::size_t inequalityCount() const { return inequalities_.size(); }
    std::size_t equalityCount() const { return equalities_.size(); }
    const std::vector<std::size_t>& inequalities() const { return inequalities_; }  // indices into constraints()
    const std::vector<std::size_t>& equalities() const { return equalities_; }
    Eigen::VectorXd startPoint() const;

    // f(x) and, when grad is non-null, its gradient (size variableCount()).
    double objective(const Eigen::VectorXd& x, double* grad) const;
    // Every constraint value (in constraints() order; <= 0 or = 0 when satisfied) and,
    // when jac is non-null, the row-major Jacobian (constraints() x variables()). With
    // columnOf (one entry per variable: its column, or -1 to leave it out) the Jacobian
    // has `width` columns instead: the solver's working set of variables.
    void evaluate(const Eigen::VectorXd& x, Eigen::VectorXd& values, double* jac,
                  const std::vector<int>* columnOf = nullptr, std::size_t width = 0) const;
    // Largest violation of the scaled constraints: max(g, 0) and |h|.
    double largestViolation(const Eigen::VectorXd& values) const;

    // Index of a compartment's variable for B, P/B, Q/B or catch, or -1 (fixed).
    int variableOf(std::size_t compartment, AdjustParam p) const;
    // The model with the inputs at x: B, P/B, Q/B and catch multipliers on given values
    // (values the scenario leaves unknown stay unknown), diet fractions replaced.
    Model applyTo(const Model& model, const Eigen::VectorXd& x) const;

    // Flows at x for reporting: EE_i = D_i / P_i (living) and consumption / inflow (pools).
    std::vector<double> ecotrophicEfficiencies(const Eigen::VectorXd& x) const;

private:
    struct Flows;
    void computeFlows(const Eigen::VectorXd& x, Flows& f) const;

    std::size_t n_ = 0;
    std::vector<CompartmentKind> kinds_;
    std::vector<std::size_t> living_, pools_;
    // Start values (completed by the balance solve) and their variables (-1: fixed).
    Eigen::VectorXd b0_, pb0_, qb0_, y0_, e_, ba_, u_, import_;
    std::vector<int> vb_, vp_, vq_, vy_;
    // Diet: per predator column j, its entries (prey, fraction at start, variable or -1).
    struct DietEntry { std::size_t prey; double dc0; int var; };
    std::vector<std::vector<DietEntry>> dietByPredator_;
    // Per prey: (predator, index into dietByPredator_[predator]) of every entry on it.
    std::vector<std::vector<std::pair<std::size_t, std::size_t>>> preyIndex_;
    SparseColumns routing_, discardsToPool_;
    std::vector<ReconcileVariable> vars_;
    std::vector<ReconcileConstraint> cons_;
    std::vector<std::size_t> inequalities_, equalities_;
    Problems problems_;
};

}  // namespace tl
