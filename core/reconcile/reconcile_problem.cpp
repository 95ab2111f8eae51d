#include "core/reconcile/reconcile_problem.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <set>

#include "core/io/text_table.h"
#include "core/model/problem_codes.h"

namespace tl {
namespace {

constexpr std::array<std::string_view, kAdjustParamCount> kAdjustKeys = {"b", "pb", "qb", "catch", "diet"};
constexpr std::array<std::string_view, kAdjustParamCount> kAdjustSymbols = {"B", "P/B", "Q/B", "catch", "diet"};

Param modelParam(AdjustParam p)
{
    switch (p) {
    case AdjustParam::Biomass: return Param::Biomass;
    case AdjustParam::PB: return Param::PB;
    default: return Param::QB;
    }
}

Problem optionProblem(const Model& model, std::size_t i, std::string message)
{
    Problem p;
    p.code = code::kReconcileOption;
    p.compartment = i < model.size() ? model.compartment(i).name : "";
    p.message = std::move(message);
    return p;
}

}  // namespace

std::string_view adjustKey(AdjustParam p) { return kAdjustKeys[static_cast<std::size_t>(p)]; }
std::string_view adjustSymbol(AdjustParam p) { return kAdjustSymbols[static_cast<std::size_t>(p)]; }
std::optional<AdjustParam> parseAdjustKey(std::string_view key)
{
    if (key == "biomass") return AdjustParam::Biomass;
    for (std::size_t k = 0; k < kAdjustParamCount; ++k)
        if (kAdjustKeys[k] == key) return static_cast<AdjustParam>(k);
    return std::nullopt;
}

std::string_view constraintKey(ConstraintKind k)
{
    switch (k) {
    case ConstraintKind::EEMax: return "ee_max";
    case ConstraintKind::EEMin: return "ee_min";
    case ConstraintKind::EEGiven: return "ee_given";
    case ConstraintKind::PQMin: return "pq_min";
    case ConstraintKind::PQMax: return "pq_max";
    case ConstraintKind::RespirationNonNegative: return "respiration_non_negative";
    case ConstraintKind::DetritusSupply: return "detritus_supply";
    case ConstraintKind::DietSum: return "diet_sum";
    }
    return "";
}

std::string ReconcileConstraint::describe(const Model& model) const
{
    const std::string& name = model.compartment(compartment).name;
    const std::string b = displayNumber(bound);
    switch (kind) {
    case ConstraintKind::EEMax: return "EE of " + name + " <= " + b;
    case ConstraintKind::EEMin: return "EE of " + name + " >= " + b;
    case ConstraintKind::EEGiven: return "EE of " + name + " = " + b + " (given)";
    case ConstraintKind::PQMin: return "P/Q of " + name + " >= " + b;
    case ConstraintKind::PQMax: return "P/Q of " + name + " <= " + b;
    case ConstraintKind::RespirationNonNegative: return "respiration of " + name + " >= 0";
    case ConstraintKind::DetritusSupply: return "consumption of " + name + " <= its inflow";
    case ConstraintKind::DietSum: return "diet of " + name + " sums to " + b;
    }
    return {};
}

// Values at x, shared by the objective, the constraints and the reports.
struct ReconcileProblem::Flows {
    Eigen::VectorXd b, pb, qb, y;  // inputs at x
    Eigen::VectorXd q, p;          // Q = B Q/B, P = B P/B
    Eigen::VectorXd predation;     // sum_j DC_ij Q_j (pools: their consumption)
    Eigen::VectorXd demand;        // predation + Y + E + BA (living)
};

namespace {

double valueAt(const Eigen::VectorXd& x, int var, double v0) { return var < 0 ? v0 : v0 * std::exp(x[var]); }

// CV of a given value and the words that say where it comes from.
std::pair<double, std::string> confidenceCv(const Compartment& c, Param p, const BalanceRules& rules)
{
    const Confidence& conf = c.confidenceOf(p);
    if (conf.cv && *conf.cv > 0.0) return {*conf.cv, "CV " + displayNumber(*conf.cv)};
    if (conf.grade != Confidence::Grade::None) {
        const auto g = static_cast<std::size_t>(conf.grade) - 1;
        return {rules.cvByGrade[g], "grade " + std::string(gradeKey(conf.grade))};
    }
    return {rules.cvByGrade[2], "no grade (C assumed)"};
}

}  // namespace

ReconcileProblem ReconcileProblem::build(const Model& model, const ReconcileOptions& options)
{
    ReconcileProblem pr;
    const std::size_t n = model.size();
    pr.n_ = n;

    // 1. The balance at the point estimate gives the start of every unknown.
    const BalancePlan plan = BalancePlan::build(model);
    if (plan.hasStructuralErrors()) {
        pr.problems_ = plan.problems();
        Problem p;
        p.code = code::kReconcileUnsolvable;
        p.message = "the scenario cannot be balanced as it stands (see the problems above); reconcile changes "
                    "values, not which values are unknown";
        pr.problems_.push_back(std::move(p));
        return pr;
    }
    const BalanceInputs in = BalanceInputs::fromModel(model);
    BalanceWorkspace ws = plan.makeWorkspace();
    BalanceValues v = plan.makeValues();
    plan.solve(in, ws, v);
    if (v.status != NumericStatus::Solved) {
        Problem p;
        p.code = code::kReconcileUnsolvable;
        p.message = "the balance equations of the scenario are singular; reconcile needs a solvable scenario";
        pr.problems_.push_back(std::move(p));
        return pr;
    }

    pr.kinds_.resize(n);
    pr.b0_ = v.biomass;
    pr.pb0_ = v.pb;
    pr.qb0_ = v.qb;
    pr.y0_ = in.catchTotal;
    pr.e_ = in.netEmigration;
    pr.ba_ = in.biomassAccum;
    pr.u_ = in.unassim;
    pr.import_ = in.detritusImport;
    pr.routing_ = in.routing;
    pr.discardsToPool_ = in.discardsToPool;
    pr.vb_.assign(n, -1);
    pr.vp_.assign(n, -1);
    pr.vq_.assign(n, -1);
    pr.vy_.assign(n, -1);
    pr.dietByPredator_.assign(n, {});

    std::set<std::pair<std::size_t, AdjustParam>> pinned;
    for (const auto& [i, p] : options.pins) {
        if (i >= n) {
            pr.problems_.push_back(optionProblem(model, i, "a pin names a compartment the scenario does not have"));
            continue;
        }
        pinned.insert({i, p});
    }
    for (const auto& [key, bounds] : options.bounds) {
        if (key.first >= n || key.second == AdjustParam::Diet) {
            pr.problems_.push_back(optionProblem(model, key.first, "bounds apply to B, P/B, Q/B or catch only"));
        } else if (bounds.lower && bounds.upper && *bounds.lower > *bounds.upper) {
            pr.problems_.push_back(optionProblem(model, key.first,
                                                 "the lower bound on " + std::string(adjustSymbol(key.second)) +
                                                     " is above its upper bound"));
        } else if ((bounds.lower && !(*bounds.lower > 0.0)) || (bounds.upper && !(*bounds.upper > 0.0))) {
            pr.problems_.push_back(optionProblem(model, key.first, "bounds must be positive numbers"));
        }
    }
    const double logFactor = std::log(options.maxFactor);

    auto addLogVariable = [&](std::size_t i, AdjustParam p, double value0, bool solved) {
        ReconcileVariable var;
        var.compartment = i;
        var.param = p;
        var.value0 = value0;
        var.solved = solved;
        var.lower = -logFactor;
        var.upper = logFactor;
        if (solved) {
            var.confidence = "solved by the balance";
        } else if (p == AdjustParam::Catch) {
            var.cv = options.catchCv;
            var.confidence = "catch CV " + displayNumber(options.catchCv);
        } else {
            std::tie(var.cv, var.confidence) = confidenceCv(model.compartment(i), modelParam(p), model.rules);
        }
        var.weight = solved ? 0.0 : 1.0 / (var.cv * var.cv);
        if (const auto it = options.bounds.find({i, p}); it != options.bounds.end()) {
            if (it->second.lower && *it->second.lower > 0.0)
                var.lower = std::max(var.lower, std::log(*it->second.lower / value0));
            if (it->second.upper && *it->second.upper > 0.0)
                var.upper = std::min(var.upper, std::log(*it->second.upper / value0));
        }
        pr.vars_.push_back(std::move(var));
        return static_cast<int>(pr.vars_.size() - 1);
    };

    // 2. Log-multiplier variables on B, P/B, Q/B and catch.
    for (std::size_t i = 0; i < n; ++i) {
        const Compartment& c = model.compartment(i);
        pr.kinds_[i] = c.kind;
        if (!c.isLiving()) {
            pr.pools_.push_back(i);
            continue;
        }
        pr.living_.push_back(i);
        const bool consumer = c.kind == CompartmentKind::Consumer;
        const Unknown unknown = plan.unknownOf(i);
        const PqStandIn standIn = plan.pqStandInOf(i);
        const auto ii = static_cast<Eigen::Index>(i);
        const double b0 = v.biomass[ii], pb0 = v.pb[ii], qb0 = v.qb[ii];
        if (!(b0 > 0.0) || !(pb0 > 0.0) || (consumer && !(qb0 > 0.0)) || !std::isfinite(b0 * pb0 * (consumer ? qb0 : 1.0))) {
            Problem p;
            p.code = code::kReconcileUnsolvable;
            p.compartment = c.name;
            p.message = "the balance gives " + c.name + " B = " + displayNumber(b0) + ", P/B = " + displayNumber(pb0) +
                        (consumer ? ", Q/B = " + displayNumber(qb0) : std::string()) +
                        "; reconcile works on positive values (multipliers)";
            p.hint = "give the values that the balance solves as negative, or make another value the unknown";
            pr.problems_.push_back(std::move(p));
            continue;
        }
        auto movable = [&](AdjustParam p, bool kindMoves) { return kindMoves && !pinned.count({i, p}); };

        if (unknown == Unknown::Biomass)
            pr.vb_[i] = addLogVariable(i, AdjustParam::Biomass, b0, true);
        else if (movable(AdjustParam::Biomass, options.moveBiomass))
            pr.vb_[i] = addLogVariable(i, AdjustParam::Biomass, b0, false);

        // P/B and Q/B, one of which may stand on the other through a given P/Q.
        const bool pbTied = standIn == PqStandIn::PBFromPQ || unknown == Unknown::QBTiedPB;
        const bool qbTied = standIn == PqStandIn::QBFromPQ;
        if (!pbTied) {
            if (unknown == Unknown::PB)
                pr.vp_[i] = addLogVariable(i, AdjustParam::PB, pb0, true);
            else if (movable(AdjustParam::PB, options.movePB) && !(qbTied && pinned.count({i, AdjustParam::QB})))
                pr.vp_[i] = addLogVariable(i, AdjustParam::PB, pb0, false);
        }
        if (consumer && !qbTied) {
            if (unknown == Unknown::QB || unknown == Unknown::QBTiedPB)
                pr.vq_[i] = addLogVariable(i, AdjustParam::QB, qb0, true);
            else if (movable(AdjustParam::QB, options.moveQB) && !(pbTied && pinned.count({i, AdjustParam::PB})))
                pr.vq_[i] = addLogVariable(i, AdjustParam::QB, qb0, false);
        }
        if (pbTied) pr.vp_[i] = pr.vq_[i];
        if (qbTied) pr.vq_[i] = pr.vp_[i];

        if (pr.y0_[ii] > 0.0 && movable(AdjustParam::Catch, options.moveCatch))
            pr.vy_[i] = addLogVariable(i, AdjustParam::Catch, pr.y0_[ii], false);
    }
    if (!pr.ok()) return pr;

    // 3. Diet fractions of the predators whose diet moves (at least two non-zero prey).
    std::vector<std::pair<std::size_t, double>> dietSums;  // predator, prey sum
    for (std::size_t j = 0; j < n; ++j) {
        if (model.compartment(j).kind != CompartmentKind::Consumer) continue;
        const auto row = model.dietRow(j);
        const bool moves = options.moveDiet && !pinned.count({j, AdjustParam::Diet}) &&
                           std::count_if(row.begin(), row.end(), [](const GridEntry& e) { return e.value > 0.0; }) >= 2;
        double sum = 0.0;
        // Each share weighs by its row's data confidence (Compartment::dietConfidence),
        // else by the options' diet CV.
        const Confidence& rowConfidence = model.compartment(j).dietConfidence;
        const auto statedRowCv = statedCv(rowConfidence, model.rules);
        const double rowCv = statedRowCv.value_or(options.dietCv);
        const std::string rowLabel =
            !statedRowCv ? "diet CV " + displayNumber(options.dietCv) + " (no confidence given)"
            : rowConfidence.cv && *rowConfidence.cv > 0.0 ? "diet CV " + displayNumber(rowCv)
                                                          : "diet grade " + std::string(gradeKey(rowConfidence.grade));
        for (const auto& [prey, dc] : row) {
            DietEntry entry{prey, dc, -1};
            if (moves && dc > 0.0) {
                ReconcileVariable var;
                var.compartment = j;
                var.param = AdjustParam::Diet;
                var.prey = prey;
                var.start = dc;
                var.scale = dc;
                var.value0 = dc;
                var.cv = rowCv;
                var.weight = 1.0 / (rowCv * rowCv);
                var.lower = 0.0;
                var.upper = 1.0;
                var.confidence = rowLabel;
                pr.vars_.push_back(std::move(var));
                entry.var = static_cast<int>(pr.vars_.size() - 1);
                sum += dc;
            }
            pr.dietByPredator_[j].push_back(entry);
        }
        if (moves) dietSums.push_back({j, sum});
    }

    pr.preyIndex_.assign(n, {});
    for (std::size_t j = 0; j < n; ++j)
        for (std::size_t k = 0; k < pr.dietByPredator_[j].size(); ++k)
            pr.preyIndex_[pr.dietByPredator_[j][k].prey].push_back({j, k});

    // 4. Constraints, scaled at the start so that each is about 1 in size.
    const Eigen::VectorXd x0 = pr.startPoint();
    Flows f;
    pr.computeFlows(x0, f);
    auto add = [&](ConstraintKind kind, std::size_t i, double bound, double scale, bool equality) {
        pr.cons_.push_back({kind, i, bound, scale > 0.0 && std::isfinite(scale) ? scale : 1.0, equality});
        (equality ? pr.equalities_ : pr.inequalities_).push_back(pr.cons_.size() - 1);
    };
    for (std::size_t i : pr.living_) {
        const auto ii = static_cast<Eigen::Index>(i);
        const double scale = std::max(f.p[ii], std::abs(f.demand[ii]));
        const Unknown unknown = plan.unknownOf(i);
        if (unknown == Unknown::EE) {
            const auto maxIt = options.eeMax.find(i);
            add(ConstraintKind::EEMax, i, maxIt != options.eeMax.end() ? maxIt->second : model.rules.eeMax, scale, false);
            if (const auto minIt = options.eeMin.find(i); minIt != options.eeMin.end())
                add(ConstraintKind::EEMin, i, minIt->second, scale, false);
        } else {
            add(ConstraintKind::EEGiven, i, in.ee[ii], scale, true);
        }
        if (pr.kinds_[i] != CompartmentKind::Consumer) continue;
        // Linear in the log variables; a ratio that no variable moves is left to the Checks.
        if (pr.vp_[i] == pr.vq_[i]) continue;
        const auto range = options.pqRange.count(i) ? options.pqRange.at(i)
                                                    : std::pair{model.rules.pqMin, model.rules.pqMax};
        add(ConstraintKind::PQMin, i, range.first, 1.0, false);
        add(ConstraintKind::PQMax, i, range.second, 1.0, false);
        if (pr.u_[ii] < 1.0) add(ConstraintKind::RespirationNonNegative, i, 1.0 - pr.u_[ii], 1.0, false);
    }
    for (std::size_t d : pr.pools_) {
        const auto dd = static_cast<Eigen::Index>(d);
        if (!(f.predation[dd] > 0.0)) {
            bool eatenByMovingDiet = false;
            for (const auto& entries : pr.dietByPredator_)
                for (const DietEntry& e : entries) eatenByMovingDiet |= e.prey == d && e.var >= 0;
            if (!eatenByMovingDiet) continue;
        }
        Eigen::VectorXd values;
        add(ConstraintKind::DetritusSupply, d, 1.0, 1.0, false);
        pr.evaluate(x0, values, nullptr);  // inflow at start sets the scale
        const double inflow = f.predation[dd] - values[static_cast<Eigen::Index>(pr.cons_.size() - 1)];
        pr.cons_.back().scale = std::max({std::abs(inflow), f.predation[dd], 1e-12});
    }
    for (const auto& [j, sum] : dietSums) add(ConstraintKind::DietSum, j, sum, 1.0, true);
    return pr;
}

Eigen::VectorXd ReconcileProblem::startPoint() const
{
    Eigen::VectorXd x(static_cast<Eigen::Index>(vars_.size()));
    for (std::size_t k = 0; k < vars_.size(); ++k) x[static_cast<Eigen::Index>(k)] = vars_[k].start;
    return x;
}

int ReconcileProblem::variableOf(std::size_t i, AdjustParam p) const
{
    switch (p) {
    case AdjustParam::Biomass: return vb_[i];
    case AdjustParam::PB: return vp_[i];
    case AdjustParam::QB: return vq_[i];
    case AdjustParam::Catch: return vy_[i];
    case AdjustParam::Diet: return -1;
    }
    return -1;
}

void ReconcileProblem::computeFlows(const Eigen::VectorXd& x, Flows& f) const
{
    const auto n = static_cast<Eigen::Index>(n_);
    f.b.setZero(n);
    f.pb.setZero(n);
    f.qb.setZero(n);
    f.y.setZero(n);
    f.q.setZero(n);
    f.p.setZero(n);
    f.predation.setZero(n);
    f.demand.setZero(n);
    for (std::size_t i : living_) {
        const auto ii = static_cast<Eigen::Index>(i);
        f.b[ii] = valueAt(x, vb_[i], b0_[ii]);
        f.pb[ii] = valueAt(x, vp_[i], pb0_[ii]);
        f.qb[ii] = kinds_[i] == CompartmentKind::Consumer ? valueAt(x, vq_[i], qb0_[ii]) : 0.0;
        f.y[ii] = valueAt(x, vy_[i], y0_[ii]);
        f.p[ii] = f.b[ii] * f.pb[ii];
        f.q[ii] = f.b[ii] * f.qb[ii];
    }
    for (std::size_t j = 0; j < n_; ++j) {
        const double qj = f.q[static_cast<Eigen::Index>(j)];
        for (const DietEntry& e : dietByPredator_[j])
            f.predation[static_cast<Eigen::Index>(e.prey)] += (e.var < 0 ? e.dc0 : x[e.var]) * qj;
    }
    for (std::size_t i : living_) {
        const auto ii = static_cast<Eigen::Index>(i);
        f.demand[ii] = f.predation[ii] + f.y[ii] + e_[ii] + ba_[ii];
    }
}

double ReconcileProblem::objective(const Eigen::VectorXd& x, double* grad) const
{
    double sum = 0.0;
    for (std::size_t k = 0; k < vars_.size(); ++k) {
        const ReconcileVariable& var = vars_[k];
        const double z = (x[static_cast<Eigen::Index>(k)] - var.start) / var.scale;
        sum += var.weight * z * z;
        if (grad) grad[k] = 2.0 * var.weight * z / var.scale;
    }
    return sum;
}

void ReconcileProblem::evaluate(const Eigen::VectorXd& x, Eigen::VectorXd& values, double* jac,
                                const std::vector<int>* columnOf, std::size_t width) const
{
    Flows f;
    computeFlows(x, f);
    const std::size_t nv = columnOf ? width : vars_.size();
    values.resize(static_cast<Eigen::Index>(cons_.size()));
    if (jac) std::fill(jac, jac + cons_.size() * nv, 0.0);

    // Gradient helpers: each adds coef x d(quantity)/dx into one Jacobian row. A value
    // v0 exp(x_k) has derivative itself; tied P/B and Q/B share a variable, so their
    // contributions add up as the chain rule wants.
    auto addTo = [columnOf](double* row, int var, double amount) {
        if (var >= 0 && columnOf) var = (*columnOf)[static_cast<std::size_t>(var)];
        if (var >= 0) row[var] += amount;
    };
    auto addConsumption = [&](double* row, std::size_t j, double coef) {  // Q_j = B_j Q/B_j
        const double q = f.q[static_cast<Eigen::Index>(j)];
        addTo(row, vb_[j], coef * q);
        addTo(row, vq_[j], coef * q);
    };
    auto addProduction = [&](double* row, std::size_t i, double coef) {  // P_i = B_i P/B_i
        const double p = f.p[static_cast<Eigen::Index>(i)];
        addTo(row, vb_[i], coef * p);
        addTo(row, vp_[i], coef * p);
    };
    // Predation on i: sum_j DC_ij Q_j, through the predators' entries on i.
    auto addPredation = [&](double* row, std::size_t i, double coef) {
        for (const auto& [j, k] : preyIndex_[i]) {
            const DietEntry& e = dietByPredator_[j][k];
            const double dc = e.var < 0 ? e.dc0 : x[e.var];
            addConsumption(row, j, coef * dc);
            addTo(row, e.var, coef * f.q[static_cast<Eigen::Index>(j)]);
        }
    };
    auto addDemand = [&](double* row, std::size_t i, double coef) {
        addPredation(row, i, coef);
        addTo(row, vy_[i], coef * f.y[static_cast<Eigen::Index>(i)]);
    };

    for (std::size_t c = 0; c < cons_.size(); ++c) {
        const ReconcileConstraint& con = cons_[c];
        const std::size_t i = con.compartment;
        const auto ii = static_cast<Eigen::Index>(i);
        const double s = con.scale;
        double* row = jac ? jac + c * nv : nullptr;
        double g = 0.0;
        switch (con.kind) {
        case ConstraintKind::EEMax:
        case ConstraintKind::EEGiven:  // D_i - EE P_i (<= 0 or = 0)
            g = (f.demand[ii] - con.bound * f.p[ii]) / s;
            if (row) {
                addDemand(row, i, 1.0 / s);
                addProduction(row, i, -con.bound / s);
            }
            break;
        case ConstraintKind::EEMin:  // EE_min P_i - D_i <= 0
            g = (con.bound * f.p[ii] - f.demand[ii]) / s;
            if (row) {
                addDemand(row, i, -1.0 / s);
                addProduction(row, i, con.bound / s);
            }
            break;
        case ConstraintKind::PQMin:  // ln P/Q_min - ln P/B + ln Q/B <= 0
        case ConstraintKind::PQMax:  // ln P/B - ln Q/B - ln bound <= 0
        case ConstraintKind::RespirationNonNegative: {
            const double logPQ = std::log(f.pb[ii] / f.qb[ii]);
            const double sign = con.kind == ConstraintKind::PQMin ? -1.0 : 1.0;
            g = sign * (logPQ - std::log(con.bound));
            if (row) {
                addTo(row, vp_[i], sign);
                addTo(row, vq_[i], -sign);
            }
            break;
        }
        case ConstraintKind::DetritusSupply: {
            // consumption_d - inflow_d, inflow_d = import + sum_i r_id (P_i - D_i + U_i Q_i) + discards.
            double inflow = import_[ii];
            for (SparseColumns::InnerIterator it(routing_, ii); it; ++it) {
                const auto src = static_cast<std::size_t>(it.index());
                const double r = it.value();
                inflow += r * (f.p[it.index()] - f.demand[it.index()] + u_[it.index()] * f.q[it.index()]);
                if (row) {
                    addProduction(row, src, -r / s);
                    addDemand(row, src, r / s);
                    addConsumption(row, src, -r * u_[it.index()] / s);
                }
            }
            for (SparseColumns::InnerIterator it(discardsToPool_, ii); it; ++it) {
                const auto src = static_cast<std::size_t>(it.index());
                const double scaled = vy_[src] < 0 ? it.value() : it.value() * std::exp(x[vy_[src]]);
                inflow += scaled;
                if (row) addTo(row, vy_[src], -scaled / s);
            }
            g = (f.predation[ii] - inflow) / s;
            if (row) addPredation(row, i, 1.0 / s);
            break;
        }
        case ConstraintKind::DietSum: {
            double sum = 0.0;
            for (const DietEntry& e : dietByPredator_[i])
                if (e.var >= 0) {
                    sum += x[e.var];
                    if (row) addTo(row, e.var, 1.0);
                }
            g = sum - con.bound;
            break;
        }
        }
        values[static_cast<Eigen::Index>(c)] = g;
    }
}

double ReconcileProblem::largestViolation(const Eigen::VectorXd& values) const
{
    double worst = 0.0;
    for (std::size_t c = 0; c < cons_.size(); ++c) {
        const double g = values[static_cast<Eigen::Index>(c)];
        worst = std::max(worst, cons_[c].equality ? std::abs(g) : g);
    }
    return worst;
}

std::vector<double> ReconcileProblem::ecotrophicEfficiencies(const Eigen::VectorXd& x) const
{
    Flows f;
    computeFlows(x, f);
    std::vector<double> ee(n_, std::numeric_limits<double>::quiet_NaN());
    for (std::size_t i : living_) {
        const auto ii = static_cast<Eigen::Index>(i);
        ee[i] = f.demand[ii] / f.p[ii];
    }
    for (std::size_t d : pools_) {
        const auto dd = static_cast<Eigen::Index>(d);
        double inflow = import_[dd];
        for (SparseColumns::InnerIterator it(routing_, dd); it; ++it)
            inflow += it.value() * (f.p[it.index()] - f.demand[it.index()] + u_[it.index()] * f.q[it.index()]);
        for (SparseColumns::InnerIterator it(discardsToPool_, dd); it; ++it) {
            const int var = vy_[static_cast<std::size_t>(it.index())];
            inflow += var < 0 ? it.value() : it.value() * std::exp(x[var]);
        }
        ee[d] = inflow > 0.0 ? f.predation[dd] / inflow : std::numeric_limits<double>::quiet_NaN();
    }
    return ee;
}

Model ReconcileProblem::applyTo(const Model& model, const Eigen::VectorXd& x) const
{
    Model out = model;
    for (std::size_t k = 0; k < vars_.size(); ++k) {
        const ReconcileVariable& var = vars_[k];
        if (var.solved) continue;  // stays unknown: the balance solves it again
        const double xk = x[static_cast<Eigen::Index>(k)];
        Compartment& c = out.compartment(var.compartment);
        switch (var.param) {
        case AdjustParam::Biomass:
        case AdjustParam::PB:
        case AdjustParam::QB: {
            // A value given through P/Q is not written: the variable is the other ratio's.
            auto& slot = c.value(modelParam(var.param));
            if (slot) slot = var.value0 * std::exp(xk);
            break;
        }
        case AdjustParam::Catch: {
            const double m = std::exp(xk);
            for (std::size_t fl = 0; fl < out.fleets().size(); ++fl) {
                Fleet& fleet = out.fleet(fl);
                fleet.landings[var.compartment] *= m;
                fleet.discards[var.compartment] *= m;
            }
            break;
        }
        case AdjustParam::Diet: out.setDiet(var.compartment, var.prey, std::max(0.0, xk)); break;
        }
    }
    return out;
}

}  // namespace tl
