#include "core/reconcile/reconcile.h"

#include <algorithm>
#include <chrono>
#include <memory>
#include <utility>
#include <cmath>
#include <set>
#include <stdexcept>

#include <nlopt.hpp>

#include "core/balance/solver.h"
#include "core/io/text_table.h"
#include "core/model/problem_codes.h"
#include "core/model/text.h"

namespace tl {
namespace {

// Inequalities are asked to hold with this much to spare, so that the balance's own
// checks (kBoundTolerance) pass on the adjusted model after rounding (our choice).
// NLopt's feasibility tolerance must cover the margin: NLopt 2.7 returns the last point
// it deems feasible, and with a tolerance below the margin that is an early iterate,
// not the optimum SLSQP converged to.
constexpr double kInequalityMargin = 1e-8;
constexpr double kInequalityTolerance = 1.5e-8;
constexpr double kEqualityTolerance = 1e-10;
// Working set: a constraint within this of its bound counts as active; rounds at most.
constexpr double kActiveSlack = 1e-6;
constexpr int kMaxWorkingSetRounds = 50;

// One phase of the solve over a working set: the free variables (the others stay at
// their value in `base`) and the constraints that involve at least one of them, plus one
// slack per relaxed row in the elastic phase. Caches the last evaluation (NLopt asks
// for f, g and h at one x).
// SLSQP sees each free variable scaled, y_k = (x_k - x0_k) sqrt(w_k) / s_k (scale 1 for
// a value the balance solves), so that f = sum y_k^2 has Hessian 2I: SLSQP's
// quasi-Newton matrix starts as the identity, which then already matches the objective
// and leaves only the constraints' curvature to learn (far fewer iterations when the
// weights span grades A to D and diet fractions of a few percent).
class Phase {
public:
    struct Row {
        std::size_t constraint;
        double sign;  // +1: g (or h); -1: -h (the other side of an elastic equality)
        int slack;    // -1 outside the elastic phase
    };

    Phase(const ReconcileProblem& problem, bool elastic, std::vector<int> freeVariables,
          const std::vector<char>& includedRows, const Eigen::VectorXd& base, const ReconcileControl& control,
          ReconcileProgress progress)
        : pr_(problem), free_(std::move(freeVariables)), nf_(free_.size()), full_(base), control_(control),
          progress_(progress)
    {
        columnOf_.assign(pr_.variableCount(), -1);
        scale_.resize(nf_);
        for (std::size_t k = 0; k < nf_; ++k) {
            const ReconcileVariable& v = pr_.variables()[static_cast<std::size_t>(free_[k])];
            columnOf_[static_cast<std::size_t>(free_[k])] = static_cast<int>(k);
            scale_[k] = v.weight > 0.0 ? v.scale / std::sqrt(v.weight) : 1.0;
        }
        int slacks = 0;
        for (std::size_t c : pr_.inequalities())
            if (includedRows[c]) inequalityRows_.push_back({c, 1.0, elastic ? slacks++ : -1});
        for (std::size_t c : pr_.equalities()) {
            if (!includedRows[c]) continue;
            if (elastic && pr_.constraints()[c].kind == ConstraintKind::EEGiven) {
                inequalityRows_.push_back({c, 1.0, slacks});
                inequalityRows_.push_back({c, -1.0, slacks++});
            } else {
                equalityRows_.push_back({c, 1.0, -1});
            }
        }
        slackCount_ = static_cast<std::size_t>(slacks);
        jac_.resize(pr_.constraints().size() * nf_);
        gradFull_.resize(pr_.variableCount());
        progress_.elastic = elastic;
        progress_.freeVariables = nf_;
        evaluationsBefore_ = progress_.evaluations;
        if (control_.progress) control_.progress(progress_);
    }

    std::size_t dimension() const { return nf_ + slackCount_; }
    const std::vector<int>& freeVariables() const { return free_; }
    const std::vector<Row>& inequalityRows() const { return inequalityRows_; }
    const std::vector<Row>& equalityRows() const { return equalityRows_; }
    int evaluations() const { return evaluations_; }

    // The full variable vector for a point y of this phase, and back.
    const Eigen::VectorXd& expand(const double* y)
    {
        for (std::size_t k = 0; k < nf_; ++k) full_[free_[k]] = start(k) + scale_[k] * y[k];
        return full_;
    }
    double toPhase(std::size_t k, double x) const { return (x - start(k)) / scale_[k]; }

    double objective(const double* x, double* grad)
    {
        // NLopt's C++ wrapper turns this exception into its forced stop (nlopt.hpp).
        if (control_.cancel && control_.cancel->load(std::memory_order_relaxed)) throw nlopt::forced_stop();
        ++evaluations_;
        if (control_.progress && evaluations_ % kProgressEvery == 0) {
            progress_.evaluations = evaluationsBefore_ + evaluations_;
            control_.progress(progress_);
        }
        double f = pr_.objective(expand(x), grad ? gradFull_.data() : nullptr);
        if (grad)
            for (std::size_t k = 0; k < nf_; ++k) grad[k] = scale_[k] * gradFull_[static_cast<std::size_t>(free_[k])];
        for (std::size_t k = 0; k < slackCount_; ++k) {
            f += kElasticPenalty * x[nf_ + k];
            if (grad) grad[nf_ + k] = kElasticPenalty;
        }
        return f;
    }

    void rows(const std::vector<Row>& which, double margin, unsigned m, double* result, const double* x, double* grad)
    {
        refresh(x, grad != nullptr);
        const std::size_t n = dimension();
        for (unsigned r = 0; r < m; ++r) {
            const Row& row = which[r];
            result[r] = row.sign * values_[static_cast<Eigen::Index>(row.constraint)] + margin;
            if (row.slack >= 0) result[r] -= x[nf_ + static_cast<std::size_t>(row.slack)];
            if (!grad) continue;
            double* out = grad + static_cast<std::size_t>(r) * n;
            const double* in = jac_.data() + row.constraint * nf_;
            for (std::size_t k = 0; k < nf_; ++k) out[k] = row.sign * scale_[k] * in[k];
            std::fill(out + nf_, out + n, 0.0);
            if (row.slack >= 0) out[nf_ + static_cast<std::size_t>(row.slack)] = -1.0;
        }
    }

    // Largest violation of this phase's rows at y (0 when every row holds).
    double largestRowViolation(const double* y)
    {
        refresh(y, false);
        double worst = 0.0;
        for (const Row& row : inequalityRows_)
            worst = std::max(worst, row.sign * values_[static_cast<Eigen::Index>(row.constraint)]);
        for (const Row& row : equalityRows_)
            worst = std::max(worst, std::abs(values_[static_cast<Eigen::Index>(row.constraint)]));
        return worst;
    }

private:
    double start(std::size_t k) const { return pr_.variables()[static_cast<std::size_t>(free_[k])].start; }

    void refresh(const double* x, bool needJacobian)
    {
        // `evaluated_`: with no free variable every x looks the same as the empty cache,
        // so the first call must still evaluate (found when AUGLAG, which asks for
        // values without gradients first, read values_ before anything filled it).
        const bool same = evaluated_ && std::equal(cachedX_.begin(), cachedX_.end(), x);
        if (same && (haveJacobian_ || !needJacobian)) return;
        evaluated_ = true;
        cachedX_.assign(x, x + nf_);
        pr_.evaluate(expand(x), values_, needJacobian ? jac_.data() : nullptr, &columnOf_, nf_);
        haveJacobian_ = needJacobian;
    }

    const ReconcileProblem& pr_;
    std::vector<int> free_;
    std::size_t nf_;
    std::vector<int> columnOf_;
    std::vector<double> scale_;
    Eigen::VectorXd full_;
    const ReconcileControl& control_;
    ReconcileProgress progress_;
    int evaluationsBefore_ = 0;
    std::size_t slackCount_ = 0;
    std::vector<Row> inequalityRows_, equalityRows_;
    std::vector<double> cachedX_;
    Eigen::VectorXd values_;
    std::vector<double> jac_, gradFull_;
    bool haveJacobian_ = false;
    bool evaluated_ = false;
    int evaluations_ = 0;
};

double objectiveCallback(unsigned, const double* x, double* grad, void* data)
{
    return static_cast<Phase*>(data)->objective(x, grad);
}
void inequalityCallback(unsigned m, double* result, unsigned, const double* x, double* grad, void* data)
{
    auto* phase = static_cast<Phase*>(data);
    phase->rows(phase->inequalityRows(), kInequalityMargin, m, result, x, grad);
}
void equalityCallback(unsigned m, double* result, unsigned, const double* x, double* grad, void* data)
{
    auto* phase = static_cast<Phase*>(data);
    phase->rows(phase->equalityRows(), 0.0, m, result, x, grad);
}

// One NLopt run of a phase from the point xs (in the phase's variables; updated in
// place); returns NLopt's result text.
std::string optimisePhase(nlopt::algorithm algorithm, Phase& phase, const std::vector<double>& lower,
                          const std::vector<double>& upper, std::vector<double>& xs)
{
    const std::size_t n = phase.dimension();
    // Everything inside the try: NLopt also refuses a problem while it is being set up
    // (more equality rows than variables: "too many equality constraints"), and the
    // caller then goes on to the elastic phase rather than failing.
    try {
        nlopt::opt opt(algorithm, static_cast<unsigned>(n));
        if (algorithm == nlopt::AUGLAG) {
            // The inner solves see f + the augmented-Lagrangian terms, bounds only.
            nlopt::opt inner(nlopt::LD_LBFGS, static_cast<unsigned>(n));
            inner.set_ftol_rel(1e-14);
            inner.set_xtol_rel(1e-12);
            inner.set_maxeval(5000);
            opt.set_local_optimizer(inner);
        }
        opt.set_lower_bounds(lower);
        opt.set_upper_bounds(upper);
        opt.set_min_objective(objectiveCallback, &phase);
        if (!phase.inequalityRows().empty())
            opt.add_inequality_mconstraint(inequalityCallback, &phase,
                                           std::vector<double>(phase.inequalityRows().size(), kInequalityTolerance));
        if (!phase.equalityRows().empty())
            opt.add_equality_mconstraint(equalityCallback, &phase,
                                         std::vector<double>(phase.equalityRows().size(), kEqualityTolerance));
        opt.set_ftol_rel(1e-12);
        opt.set_xtol_rel(1e-12);
        opt.set_maxeval(20000);
        double f = 0.0;
        const nlopt::result r = opt.optimize(xs, f);
        return nlopt_result_to_string(static_cast<nlopt_result>(r));
    } catch (const nlopt::roundoff_limited&) {
        return "ROUNDOFF_LIMITED";  // xs holds the last point reached
    } catch (const nlopt::forced_stop&) {
        return "FORCED_STOP";  // cancelled (ReconcileControl::cancel)
    } catch (const std::runtime_error& e) {
        return std::string("FAILURE: ") + e.what();
    } catch (const std::invalid_argument& e) {
        return std::string("INVALID_ARGS: ") + e.what();
    }
}

// Runs one phase from the full point x (updated in place: its free variables move);
// returns NLopt's result text. Slacks start where they make every row hold.
//
// SLSQP's step is a dense least-squares problem in all free variables (cost about n^3
// per iteration): 1245 free variables (the 200-compartment benchmark) took 93 s of CPU
// in 34 evaluations. A working set above ReconcileOptions::slsqpFreeVariableLimit free
// variables is therefore
// solved by NLopt's augmented Lagrangian (AUGLAG: Conn, Gould & Toint 1991, SIAM J.
// Numer. Anal. 28:545; Birgin & Martinez 2008, Optim. Methods Softw. 23:177) with
// L-BFGS inner solves, O(n) per step; SLSQP then polishes from its point only when a
// row still breaks its tolerance. On the benchmark webs (seeds 1-3, 20-200
// compartments) both reach the same objective to 9 digits. The elastic phase and small
// working sets keep SLSQP, which the scipy cross-check follows exactly.
std::string runPhase(const ReconcileProblem& pr, Phase& phase, Eigen::VectorXd& x, std::size_t slsqpLimit)
{
    const std::size_t n = phase.dimension();
    const std::vector<int>& free = phase.freeVariables();
    std::vector<double> lower(n, 0.0), upper(n, HUGE_VAL), xs(n, 0.0);
    for (std::size_t k = 0; k < free.size(); ++k) {
        const ReconcileVariable& v = pr.variables()[static_cast<std::size_t>(free[k])];
        lower[k] = phase.toPhase(k, v.lower);
        upper[k] = phase.toPhase(k, v.upper);
        xs[k] = std::clamp(phase.toPhase(k, x[free[k]]), lower[k], upper[k]);
    }
    const bool elastic = n > free.size();
    if (elastic) {
        Eigen::VectorXd values;
        pr.evaluate(phase.expand(xs.data()), values, nullptr);
        for (const Phase::Row& row : phase.inequalityRows())
            if (row.slack >= 0) {
                double& t = xs[free.size() + static_cast<std::size_t>(row.slack)];
                t = std::max(t, row.sign * values[static_cast<Eigen::Index>(row.constraint)] + 1e-6);
            }
    }
    if (n == 0) return "nothing can move";  // no input of this phase is free to change
    std::string text;
    if (!elastic && free.size() > slsqpLimit) {
        text = "AUGLAG " + optimisePhase(nlopt::AUGLAG, phase, lower, upper, xs);
        if (text == "AUGLAG FORCED_STOP" || phase.largestRowViolation(xs.data()) <= kReconcileTolerance) {
            x = phase.expand(xs.data());
            return text;
        }
        text += ", then ";
    }
    text += optimisePhase(nlopt::LD_SLSQP, phase, lower, upper, xs);
    x = phase.expand(xs.data());
    return text;
}

std::string inputName(const Model& model, std::size_t i, AdjustParam p)
{
    return model.compartment(i).name + "." + std::string(adjustKey(p));
}

bool isPinned(const ReconcileOptions& options, std::size_t i, AdjustParam p)
{
    return std::find(options.pins.begin(), options.pins.end(), std::pair{i, p}) != options.pins.end();
}

bool kindMoves(const ReconcileOptions& o, AdjustParam p)
{
    switch (p) {
    case AdjustParam::Biomass: return o.moveBiomass;
    case AdjustParam::PB: return o.movePB;
    case AdjustParam::QB: return o.moveQB;
    case AdjustParam::Catch: return o.moveCatch;
    case AdjustParam::Diet: return o.moveDiet;
    }
    return false;
}

// What holds a violated constraint in place: the inputs it involves that are pinned,
// of a kind not allowed to move, or at a bound; an EE given or an EE bound.
std::vector<std::string> relaxSuggestions(const Model& model, const ReconcileProblem& pr, const ReconcileOptions& options,
                                          const ReconcileConstraint& con, const Eigen::VectorXd& x)
{
    std::vector<std::pair<std::size_t, AdjustParam>> inputs;
    const std::size_t i = con.compartment;
    switch (con.kind) {
    case ConstraintKind::EEMax:
    case ConstraintKind::EEMin:
    case ConstraintKind::EEGiven:
    case ConstraintKind::DetritusSupply:
        if (model.compartment(i).isLiving()) {
            inputs.push_back({i, AdjustParam::Biomass});
            inputs.push_back({i, AdjustParam::PB});
            if (model.totalCatch(i) > 0.0) inputs.push_back({i, AdjustParam::Catch});
        }
        for (std::size_t j = 0; j < model.size(); ++j)
            if (model.diet(j, i) > 0.0) {
                inputs.push_back({j, AdjustParam::Biomass});
                inputs.push_back({j, AdjustParam::QB});
                inputs.push_back({j, AdjustParam::Diet});
            }
        break;
    case ConstraintKind::PQMin:
    case ConstraintKind::PQMax:
    case ConstraintKind::RespirationNonNegative:
        inputs.push_back({i, AdjustParam::PB});
        inputs.push_back({i, AdjustParam::QB});
        break;
    case ConstraintKind::DietSum: break;
    }
    std::vector<std::string> out;
    auto note = [&](std::string s) {
        if (std::find(out.begin(), out.end(), s) == out.end()) out.push_back(std::move(s));
    };
    switch (con.kind) {
    case ConstraintKind::EEMax: note("raise the EE maximum of " + model.compartment(i).name); break;
    case ConstraintKind::EEGiven: note("leave the EE of " + model.compartment(i).name + " unknown"); break;
    case ConstraintKind::PQMin:
    case ConstraintKind::PQMax: note("widen the P/Q range of " + model.compartment(i).name); break;
    default: break;
    }
    for (const auto& [c, p] : inputs) {
        if (isPinned(options, c, p)) {
            note("unpin " + inputName(model, c, p));
        } else if (!kindMoves(options, p)) {
            note("let " + std::string(adjustKey(p)) + " move (--move)");
        } else if (const int var = pr.variableOf(c, p); var >= 0) {
            const ReconcileVariable& v = pr.variables()[static_cast<std::size_t>(var)];
            const double xv = x[var];
            if (!v.solved && (xv <= v.lower + 1e-9 || xv >= v.upper - 1e-9))
                note("widen the bound on " + inputName(model, c, p));
        }
    }
    return out;
}

}  // namespace

std::string_view reconcileStatusKey(ReconcileStatus s)
{
    switch (s) {
    case ReconcileStatus::Unchanged: return "unchanged";
    case ReconcileStatus::Balanced: return "balanced";
    case ReconcileStatus::LeastViolating: return "least_violating";
    case ReconcileStatus::Invalid: return "invalid";
    case ReconcileStatus::Cancelled: return "cancelled";
    }
    return "";
}

ReconcileResult reconcile(const Model& model, const ReconcileOptions& options, const ReconcileControl& control)
{
    const auto t0 = std::chrono::steady_clock::now();
    ReconcileResult result;
    result.adjusted = model;
    auto cancelled = [&control] { return control.cancel && control.cancel->load(); };
    auto cancelledResult = [&] {
        ReconcileResult stopped;
        stopped.status = ReconcileStatus::Cancelled;
        stopped.adjusted = model;
        stopped.problems = result.problems;
        stopped.evaluations = result.evaluations;
        stopped.solverResult = "FORCED_STOP";
        stopped.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        return stopped;
    };
    const ReconcileProblem pr = ReconcileProblem::build(model, options);
    result.problems = pr.problems();
    if (!pr.ok()) return result;
    result.variableCount = pr.variableCount();
    result.constraintCount = pr.constraints().size();

    const Eigen::VectorXd x0 = pr.startPoint();
    result.eeBefore = pr.ecotrophicEfficiencies(x0);
    Eigen::VectorXd values;
    pr.evaluate(x0, values, nullptr);

    // The start holds when every inequality does and every equality closes to rounding
    // (an unknown B solved by the balance leaves its equation at ~1e-16, not 0).
    bool startHolds = true;
    for (std::size_t c = 0; c < pr.constraints().size(); ++c) {
        const double g = values[static_cast<Eigen::Index>(c)];
        startHolds &= pr.constraints()[c].equality ? std::abs(g) <= 1e-12 : g <= 0.0;
    }
    Eigen::VectorXd x = x0;
    if (startHolds) {
        result.status = ReconcileStatus::Unchanged;
        result.solverResult = "start satisfies every constraint";
    } else {
        // Working set. At a local optimum a variable that appears in no active constraint
        // keeps its start value (its objective gradient is 0 there and no multiplier
        // pulls it), so SLSQP, whose cost grows with the cube of the variable count,
        // runs on the variables of the violated and active constraints only: start with
        // those of the constraints violated at the start and the equalities, solve, add
        // the variables of the constraints active at the answer, and repeat until none
        // is added. The answer is then a KKT point of the whole problem.
        const std::size_t nv = pr.variableCount(), nc = pr.constraints().size();
        std::vector<std::vector<int>> pattern(nc);  // variables of each constraint
        {
            std::vector<double> jac(nc * nv);
            Eigen::VectorXd v;
            pr.evaluate(x0, v, jac.data());
            for (std::size_t c = 0; c < nc; ++c)
                for (std::size_t k = 0; k < nv; ++k)
                    if (jac[c * nv + k] != 0.0) pattern[c].push_back(static_cast<int>(k));
        }
        std::vector<char> isFree(nv, 0), included(nc, 0);
        auto freeVariablesOf = [&](std::size_t c) {
            bool added = false;
            for (int k : pattern[c]) added |= !std::exchange(isFree[static_cast<std::size_t>(k)], 1);
            return added;
        };
        auto activeOrViolated = [&](std::size_t c, double slack) {
            const ReconcileConstraint& con = pr.constraints()[c];
            return con.equality || values[static_cast<Eigen::Index>(c)] > -slack;
        };
        auto violated = [&](std::size_t c) {
            const double g = values[static_cast<Eigen::Index>(c)];
            return pr.constraints()[c].equality ? std::abs(g) > kReconcileTolerance : g > 0.0;
        };
        for (std::size_t c = 0; c < nc; ++c)
            if (violated(c)) freeVariablesOf(c);
        Phase* last = nullptr;
        std::vector<std::unique_ptr<Phase>> phases;
        for (int round = 0; round < kMaxWorkingSetRounds; ++round) {
            std::vector<int> free;
            for (std::size_t k = 0; k < nv; ++k)
                if (isFree[k]) free.push_back(static_cast<int>(k));
            for (std::size_t c = 0; c < nc; ++c) {
                included[c] = 0;
                for (int k : pattern[c]) included[c] |= isFree[static_cast<std::size_t>(k)];
            }
            phases.push_back(std::make_unique<Phase>(pr, false, std::move(free), included, x, control,
                                                     ReconcileProgress{round + 1, false, result.evaluations, 0}));
            last = phases.back().get();
            result.solverResult = runPhase(pr, *last, x, options.slsqpFreeVariableLimit);
            if (cancelled()) return cancelledResult();
            result.evaluations += last->evaluations();
            ++result.workingSetRounds;
            pr.evaluate(x, values, nullptr);
            // Equalities bind wherever they involve a free variable (a diet row's sum
            // frees the predator's other diet entries); a constraint that involves none
            // is unchanged since the start, so only a violated one counts.
            bool grew = false;
            for (std::size_t c = 0; c < nc; ++c)
                if ((included[c] && activeOrViolated(c, kActiveSlack)) || violated(c)) grew |= freeVariablesOf(c);
            if (!grew) break;
        }
        result.freeVariables = last ? last->freeVariables().size() : 0;
        if (pr.largestViolation(values) > kReconcileTolerance) {
            // 3. Elastic phase on the same working set, slacks starting feasible.
            for (std::size_t c = 0; c < nc; ++c)
                if (violated(c)) freeVariablesOf(c);
            std::vector<int> free;
            for (std::size_t k = 0; k < nv; ++k)
                if (isFree[k]) free.push_back(static_cast<int>(k));
            for (std::size_t c = 0; c < nc; ++c) {
                included[c] = pattern[c].empty() && activeOrViolated(c, 0.0);
                for (int k : pattern[c]) included[c] |= isFree[static_cast<std::size_t>(k)];
            }
            Phase elastic(pr, true, std::move(free), included, x, control,
                          ReconcileProgress{result.workingSetRounds, true, result.evaluations, 0});
            result.solverResult = runPhase(pr, elastic, x, options.slsqpFreeVariableLimit);
            if (cancelled()) return cancelledResult();
            result.evaluations += elastic.evaluations();
            result.elastic = true;
            pr.evaluate(x, values, nullptr);
        }
        result.status = pr.largestViolation(values) > kReconcileTolerance ? ReconcileStatus::LeastViolating
                                                                          : ReconcileStatus::Balanced;
    }

    result.objective = pr.objective(x, nullptr);
    result.largestViolation = std::max(0.0, pr.largestViolation(values));
    result.adjusted = pr.applyTo(model, x);
    const BalanceSheet after = solveBalance(result.adjusted);
    result.balanceAfter = after.status;
    result.eeAfter.resize(model.size());
    for (std::size_t i = 0; i < model.size(); ++i) result.eeAfter[i] = after.rows[i].ee;

    // Ranked changes.
    for (std::size_t k = 0; k < pr.variableCount(); ++k) {
        const ReconcileVariable& v = pr.variables()[k];
        const double xk = x[static_cast<Eigen::Index>(k)];
        const double z = (xk - v.start) / v.scale;
        if (v.solved || std::abs(z) <= 1e-9) continue;
        ReconcileChange ch;
        ch.compartment = v.compartment;
        ch.param = v.param;
        ch.prey = v.prey;
        ch.before = v.value0;
        ch.after = v.param == AdjustParam::Diet ? std::max(0.0, xk) : v.value0 * std::exp(xk);
        ch.percent = 100.0 * (ch.after - ch.before) / ch.before;
        ch.confidence = v.confidence;
        ch.cv = v.cv;
        ch.objectiveShare = result.objective > 0.0 ? v.weight * z * z / result.objective : 0.0;
        result.changes.push_back(std::move(ch));
    }
    std::stable_sort(result.changes.begin(), result.changes.end(),
                     [](const ReconcileChange& a, const ReconcileChange& b) { return a.objectiveShare > b.objectiveShare; });

    // Binding constraints and bounds; conflicts.
    for (std::size_t c = 0; c < pr.constraints().size(); ++c) {
        const ReconcileConstraint& con = pr.constraints()[c];
        const double g = values[static_cast<Eigen::Index>(c)];
        const bool violated = con.equality ? std::abs(g) > kReconcileTolerance : g > kReconcileTolerance;
        if (result.status == ReconcileStatus::LeastViolating && violated) {
            ReconcileConflict conflict;
            conflict.constraint = con.describe(model);
            conflict.compartment = model.compartment(con.compartment).name;
            conflict.kind = con.kind;
            conflict.violation = con.equality ? std::abs(g) : g;
            conflict.relax = relaxSuggestions(model, pr, options, con, x);
            result.conflicts.push_back(std::move(conflict));
        } else if (!con.equality && result.status != ReconcileStatus::Unchanged && g >= -1e-6) {
            result.binding.push_back(con.describe(model));
        }
    }
    if (result.status != ReconcileStatus::Unchanged)
        for (std::size_t k = 0; k < pr.variableCount(); ++k) {
            const ReconcileVariable& v = pr.variables()[k];
            const double xk = x[static_cast<Eigen::Index>(k)];
            const std::string& name = model.compartment(v.compartment).name;
            if (v.param == AdjustParam::Diet) {
                if (xk <= 1e-9) result.binding.push_back(name + " no longer eats " + model.compartment(v.prey).name);
            } else if (xk <= v.lower + 1e-9 || xk >= v.upper - 1e-9) {
                result.binding.push_back(std::string(adjustSymbol(v.param)) + " of " + name + " at its " +
                                         (xk <= v.lower + 1e-9 ? "lower" : "upper") + " bound");
            }
        }
    for (const ReconcileConflict& conflict : result.conflicts) {
        Problem p;
        p.code = code::kReconcileConflict;
        p.compartment = conflict.compartment;
        p.message = conflict.constraint + " cannot hold within the pins and bounds";
        for (const std::string& s : conflict.relax) p.hint += (p.hint.empty() ? "" : "; ") + s;
        result.problems.push_back(std::move(p));
    }
    result.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    return result;
}

std::string reconcileSourceNote(const std::string& date, double before, const std::string& previous)
{
    std::string note = "reconciled " + date + " (smallest confidence-weighted change, SLSQP); before: " +
                       formatNumber(before);
    if (!previous.empty()) note += "; earlier source: " + previous;
    return note;
}

Model annotatedReconcileModel(const Model& original, const ReconcileResult& result, const std::string& date)
{
    Model out = result.adjusted;
    for (const ReconcileChange& ch : result.changes) {
        if (ch.param == AdjustParam::Diet || ch.param == AdjustParam::Catch) continue;
        const Param p = ch.param == AdjustParam::Biomass ? Param::Biomass : ch.param == AdjustParam::PB ? Param::PB : Param::QB;
        if (!original.compartment(ch.compartment).value(p)) continue;  // given through P/Q: not written
        Confidence& conf = out.compartment(ch.compartment).confidenceOf(p);
        conf.source = reconcileSourceNote(date, ch.before, original.compartment(ch.compartment).confidenceOf(p).source);
    }
    return out;
}

std::string reconcileDescription(const Model& original, const ReconcileResult& result, const std::string& fromScenario)
{
    std::string text = "reconciled from '" + fromScenario + "': smallest confidence-weighted change (SLSQP), " +
                       std::to_string(result.changes.size()) + " inputs changed, objective " +
                       displayNumber(result.objective);
    if (result.status == ReconcileStatus::LeastViolating) text += "; NOT balanced: least-violating solution";
    for (const ReconcileChange& ch : result.changes) {
        if (ch.param != AdjustParam::Diet && ch.param != AdjustParam::Catch) continue;
        const std::string& name = original.compartment(ch.compartment).name;
        text += "; " + (ch.param == AdjustParam::Diet ? "diet of " + name + " on " + original.compartment(ch.prey).name
                                                      : "catch of " + name) +
                " before: " + formatNumber(ch.before);
    }
    return text;
}

}  // namespace tl
