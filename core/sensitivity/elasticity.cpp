#include "core/sensitivity/elasticity.h"

#include <cmath>

#include <Eigen/SparseCore>
#include <Eigen/SparseLU>

#include "core/balance/balance_plan.h"
#include "core/balance/solver.h"
#include "core/balance/trophic_level.h"

namespace tl {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
using SparseMatrix = Eigen::SparseMatrix<double>;

// A given, finite, non-zero value: one that has a relative change.
bool isGivenAndNonZero(const std::optional<double>& v) { return v && *v != 0.0 && std::isfinite(*v); }

// d ln(y) from dy = dy/d ln(theta): NaN where y is 0 or undefined.
double relative(double dy, double y) { return y != 0.0 && std::isfinite(y) ? dy / y : kNaN; }

// Whether P/Q takes part in the solve (balance_plan.cpp: it stands in for a missing
// P/B or Q/B, or ties the two when both are missing).
bool pqIsUsed(const Compartment& c)
{
    return c.kind == CompartmentKind::Consumer && c.value(Param::PQ) &&
           (!c.value(Param::PB) || !c.value(Param::QB));
}

// The point estimate and what the derivatives need of it.
struct Point {
    const Model& model;
    const BalancePlan& plan;
    const BalanceInputs& in;
    Eigen::VectorXd b, pb, qb, ee, pq;  // completed values; Q/B 0 for producers and pools
    Eigen::VectorXd production, consumption;
    Eigen::VectorXd detritusConsumption, detritusInflow;
    // The diet by prey rows (in.diet is by predator columns), for a pool's consumption.
    Eigen::SparseMatrix<double, Eigen::RowMajor> dietByPrey;
};

// Derivatives of the completed values along one input's path, per unit of ln(input).
struct Tangent {
    Eigen::VectorXd dB, dPB, dQB, dEE, dY, dDeadDiscards;
    Eigen::VectorXd dDemand;  // E + BA: demand on a compartment's production besides predation and catch
    Eigen::VectorXd dU;       // unassimilated fraction (egestion goes to detritus)
    Eigen::VectorXd dImport;  // a pool's external import
    // A diet path: the predator and the change of each of its modelled prey entries (the
    // import share enters no equation; TL leaves it out).
    std::optional<std::size_t> dietPredator;
    std::vector<std::pair<std::size_t, double>> dDiet;
    bool movesImportOnly = false;  // the path of the import share itself

    explicit Tangent(Eigen::Index n)
        : dB(Eigen::VectorXd::Zero(n)), dPB(Eigen::VectorXd::Zero(n)), dQB(Eigen::VectorXd::Zero(n)),
          dEE(Eigen::VectorXd::Zero(n)), dY(Eigen::VectorXd::Zero(n)), dDeadDiscards(Eigen::VectorXd::Zero(n)),
          dDemand(Eigen::VectorXd::Zero(n)), dU(Eigen::VectorXd::Zero(n)), dImport(Eigen::VectorXd::Zero(n))
    {
    }
    void clear()
    {
        for (Eigen::VectorXd* v : {&dB, &dPB, &dQB, &dEE, &dY, &dDeadDiscards, &dDemand, &dU, &dImport}) v->setZero();
        dietPredator.reset();
        dDiet.clear();
        movesImportOnly = false;
    }
};

Eigen::VectorXd consumptionTangent(const Point& p, const Tangent& t)
{
    return t.dB.cwiseProduct(p.qb) + p.b.cwiseProduct(t.dQB);
}

// dG of the balance equations G_i = B_i PB_i EE_i - sum_j B_j QB_j DC_ij - Y_i - E_i - BA_i
// (Polovina 1984; DESIGN 3.2) along a tangent; entries of pools are meaningless.
Eigen::VectorXd residualTangent(const Point& p, const Tangent& t)
{
    const Eigen::VectorXd dQ = consumptionTangent(p, t);
    Eigen::VectorXd dG = (t.dB.cwiseProduct(p.pb) + p.b.cwiseProduct(t.dPB)).cwiseProduct(p.ee) +
                         p.production.cwiseProduct(t.dEE) - t.dY - t.dDemand;
    dG.noalias() -= p.in.diet * dQ;
    if (t.dietPredator) {
        const auto j = static_cast<Eigen::Index>(*t.dietPredator);
        for (const auto& [prey, d] : t.dDiet) dG[static_cast<Eigen::Index>(prey)] -= p.consumption[j] * d;
    }
    return dG;
}

// The tangent of one unit of compartment i's unknown.
void addUnknownTangent(const Point& p, std::size_t i, double dx, Tangent& t)
{
    const auto ii = static_cast<Eigen::Index>(i);
    switch (p.plan.unknownOf(i)) {
    case Unknown::Biomass: t.dB[ii] += dx; break;
    case Unknown::PB: t.dPB[ii] += dx; break;
    case Unknown::QB: t.dQB[ii] += dx; break;
    case Unknown::EE: t.dEE[ii] += dx; break;
    case Unknown::QBTiedPB:
        t.dQB[ii] += dx;
        t.dPB[ii] += p.pq[ii] * dx;  // P/B = P/Q x Q/B
        break;
    case Unknown::None: break;
    }
}

// The direct effect of moving one input by one unit of ln(input), before the unknowns
// respond; P/Q stand-ins follow their inputs (balance_plan.cpp step 1).
void seedTangent(const Point& p, const SensitivityInput& input, Tangent& t)
{
    const std::size_t i = input.compartment;
    const auto ii = static_cast<Eigen::Index>(i);
    const PqStandIn standIn = p.plan.pqStandInOf(i);
    switch (input.kind) {
    case SensitivityInputKind::Biomass: t.dB[ii] = p.b[ii]; break;
    case SensitivityInputKind::PB:
        t.dPB[ii] = p.pb[ii];
        if (standIn == PqStandIn::QBFromPQ) t.dQB[ii] = p.qb[ii];  // Q/B = P/B / P/Q
        break;
    case SensitivityInputKind::QB:
        t.dQB[ii] = p.qb[ii];
        if (standIn == PqStandIn::PBFromPQ) t.dPB[ii] = p.pb[ii];  // P/B = P/Q x Q/B
        break;
    case SensitivityInputKind::PQ:
        if (standIn == PqStandIn::QBFromPQ) t.dQB[ii] = -p.qb[ii];
        else t.dPB[ii] = p.pb[ii];  // P/B from P/Q, or tied to the unknown Q/B
        break;
    case SensitivityInputKind::EE: t.dEE[ii] = p.ee[ii]; break;
    case SensitivityInputKind::Catch:
        t.dY[ii] = p.in.catchTotal[ii];
        t.dDeadDiscards[ii] = p.in.deadDiscards[ii];
        break;
    case SensitivityInputKind::Unassim: t.dU[ii] = input.value; break;
    case SensitivityInputKind::NetEmigration:
    case SensitivityInputKind::BiomassAccum: t.dDemand[ii] = input.value; break;
    case SensitivityInputKind::DetritusImport: t.dImport[ii] = input.value; break;
    case SensitivityInputKind::Diet: {
        // The simplex path of elasticity.h: d DC_k = DC_k, d DC_l = -DC_l DC_k / (S - DC_k).
        const std::size_t j = i;
        const double sum = p.model.dietRowSum(j);
        const double moved = input.value;
        const double give = -moved / (sum - moved);
        t.dietPredator = j;
        for (const auto& [prey, dc] : p.model.dietRow(j))
            t.dDiet.emplace_back(prey, prey == input.prey ? dc : dc * give);
        t.movesImportOnly = input.prey == kImportPrey;
        break;
    }
    }
}

// d EE_d / d ln(input) / EE_d of a pool: EE_d = consumption / inflow (DESIGN 3.2),
// inflow = import + sum_i route_id [(1 - EE_i) P_i + U_i Q_i] + dead discards to d.
double poolEEElasticity(const Point& p, const Tangent& t, const Eigen::VectorXd& dQ, std::size_t d)
{
    const auto dd = static_cast<Eigen::Index>(d);
    double dConsumption = p.dietByPrey.row(dd).dot(dQ);
    if (t.dietPredator)
        for (const auto& [prey, delta] : t.dDiet)
            if (prey == d) dConsumption += p.consumption[static_cast<Eigen::Index>(*t.dietPredator)] * delta;
    double dInflow = t.dImport[dd];
    for (SparseColumns::InnerIterator it(p.in.routing, dd); it; ++it) {
        const Eigen::Index i = it.index();
        const double dP = t.dB[i] * p.pb[i] + p.b[i] * t.dPB[i];
        dInflow += it.value() * (-t.dEE[i] * p.production[i] + (1.0 - p.ee[i]) * dP + p.in.unassim[i] * dQ[i] +
                                 t.dU[i] * p.consumption[i]);
    }
    for (SparseColumns::InnerIterator it(p.in.discardsToPool, dd); it; ++it)
        if (p.in.deadDiscards[it.index()] != 0.0)
            dInflow += it.value() * t.dDeadDiscards[it.index()] / p.in.deadDiscards[it.index()];
    return relative(dConsumption, p.detritusConsumption[dd]) - relative(dInflow, p.detritusInflow[dd]);
}

// TL = 1 + D'^T TL over the consumers with a computed level (trophic_level.h), D' the
// diet renormalised without import: (I - D'^T) dTL = dD'^T TL for a diet path.
class TrophicLevelTangent {
public:
    explicit TrophicLevelTangent(const Model& model, const Eigen::VectorXd& tl)
        : model_(model), tl_(tl), notes_(computeTrophicLevels(model).note)
    {
        const auto n = static_cast<Eigen::Index>(model.size());
        std::vector<Eigen::Triplet<double>> entries;
        for (std::size_t j = 0; j < model.size(); ++j) {
            const auto jj = static_cast<Eigen::Index>(j);
            entries.emplace_back(jj, jj, 1.0);
            if (notes_[j] != TrophicLevelNote::Computed) continue;
            const double s = modelledSum(j);
            for (const auto& [prey, dc] : model.dietRow(j)) entries.emplace_back(jj, static_cast<Eigen::Index>(prey), -dc / s);
        }
        SparseMatrix m(n, n);
        m.setFromTriplets(entries.begin(), entries.end());
        m.makeCompressed();
        lu_.compute(m);
        ok_ = lu_.info() == Eigen::Success;
    }
    bool ok() const { return ok_; }

    // dTL per unit of ln(input); zero unless the tangent moves a diet.
    Eigen::VectorXd solve(const Tangent& t) const
    {
        Eigen::VectorXd rhs = Eigen::VectorXd::Zero(static_cast<Eigen::Index>(model_.size()));
        if (!t.dietPredator || notes_[*t.dietPredator] != TrophicLevelNote::Computed) return rhs;
        // Moving the import share rescales the modelled prey alike: D' does not change.
        if (t.movesImportOnly) return rhs;
        const std::size_t j = *t.dietPredator;
        const double s = modelledSum(j);
        double ds = 0.0;
        for (const auto& [prey, d] : t.dDiet) ds += d;
        // dD'_lj = dDC_lj / s - DC_lj ds / s^2
        double r = 0.0;
        std::size_t k = 0;
        for (const auto& [prey, dc] : model_.dietRow(j)) {
            const double dShare = t.dDiet[k++].second / s - dc * ds / (s * s);
            r += dShare * tl_[static_cast<Eigen::Index>(prey)];
        }
        rhs[static_cast<Eigen::Index>(j)] = r;
        return lu_.solve(rhs);
    }

private:
    double modelledSum(std::size_t j) const
    {
        double s = 0.0;
        for (const auto& [prey, dc] : model_.dietRow(j)) s += dc;
        return s;
    }
    const Model& model_;
    const Eigen::VectorXd& tl_;
    std::vector<TrophicLevelNote> notes_;
    Eigen::SparseLU<SparseMatrix> lu_;
    bool ok_ = false;
};

std::vector<SensitivityOutput> selectedOutputs(const Model& model, const BalanceSheet& sheet,
                                               const ElasticityOptions& options)
{
    if (options.only.empty()) return sensitivityOutputs(model, sheet);
    std::vector<SensitivityOutput> outputs;
    for (const auto& [compartment, kind] : options.only)
        if (auto o = findOutput(model, sheet, compartment, kind)) outputs.push_back(*o);
    return outputs;
}

void centralDifferences(const Model& model, ElasticityResult& result)
{
    const double h = result.logStep;
    BalanceScratch scratch;
    for (std::size_t k = 0; k < result.inputs.size(); ++k) {
        const BalanceSheet up = solveBalance(perturbedModel(model, result.inputs[k], h), scratch);
        const BalanceSheet down = solveBalance(perturbedModel(model, result.inputs[k], -h), scratch);
        const bool solved = up.status != BalanceStatus::Invalid && down.status != BalanceStatus::Invalid;
        for (std::size_t o = 0; o < result.outputs.size(); ++o) {
            const SensitivityOutput& out = result.outputs[o];
            const double dy = solved ? (outputValue(up, out) - outputValue(down, out)) / (2.0 * h) : kNaN;
            result.elasticity(static_cast<Eigen::Index>(o), static_cast<Eigen::Index>(k)) = relative(dy, out.value);
        }
    }
}

void analyticDerivatives(const Model& model, const BalanceSheet& sheet, const BalancePlan& plan, ElasticityResult& result)
{
    const BalanceInputs in = BalanceInputs::fromModel(model);
    const std::size_t n = model.size();
    const auto en = static_cast<Eigen::Index>(n);
    Point p{model, plan, in, {}, {}, {}, {}, {}, {}, {}, {}, {}, in.diet};
    for (Eigen::VectorXd* v : {&p.b, &p.pb, &p.qb, &p.ee, &p.pq, &p.production, &p.consumption,
                               &p.detritusConsumption, &p.detritusInflow})
        v->setZero(en);
    Eigen::VectorXd tl = Eigen::VectorXd::Constant(en, kNaN);
    for (std::size_t i = 0; i < n; ++i) {
        const CompartmentBalance& row = sheet.rows[i];
        const auto ii = static_cast<Eigen::Index>(i);
        tl[ii] = row.tl;
        if (!isLiving(row.kind)) {
            p.detritusConsumption[ii] = row.detritusConsumption;
            p.detritusInflow[ii] = row.detritusInflow;
            continue;
        }
        p.b[ii] = row.biomass;
        p.pb[ii] = row.pb;
        p.qb[ii] = row.kind == CompartmentKind::Consumer ? row.qb : 0.0;
        p.ee[ii] = row.ee;
        p.pq[ii] = std::isfinite(in.pq[ii]) ? in.pq[ii] : 0.0;
        p.production[ii] = p.b[ii] * p.pb[ii];
        p.consumption[ii] = p.b[ii] * p.qb[ii];
    }

    // J = dG/dx over the equations that determine the unknowns: the own equation of each
    // private unknown (EE, P/B) and the rows of the reduced system (balance_plan.h), square
    // here (the solver used LU). The other equations only check given values.
    const std::size_t unknowns = plan.unknownCount();
    std::vector<std::size_t> equations = plan.privateUnknowns();
    equations.insert(equations.end(), plan.reducedRows().begin(), plan.reducedRows().end());
    std::vector<Eigen::Triplet<double>> entries;
    Tangent t(en);
    for (std::size_t c = 0; c < unknowns; ++c) {
        t.clear();
        addUnknownTangent(p, plan.compartmentOfColumn(c), 1.0, t);
        const Eigen::VectorXd dG = residualTangent(p, t);
        for (std::size_t r = 0; r < equations.size(); ++r) {
            const double v = dG[static_cast<Eigen::Index>(equations[r])];
            if (v != 0.0) entries.emplace_back(static_cast<Eigen::Index>(r), static_cast<Eigen::Index>(c), v);
        }
    }
    const auto ek = static_cast<Eigen::Index>(unknowns);
    if (equations.size() != unknowns) {
        result.methodNote = "the balance equations that determine the unknowns are not square; central differences used";
        for (SensitivityOutput& o : result.outputs) o.method = DerivativeMethod::CentralDifference;
        centralDifferences(model, result);
        return;
    }
    SparseMatrix jacobian(ek, ek);
    jacobian.setFromTriplets(entries.begin(), entries.end());
    jacobian.makeCompressed();
    Eigen::SparseLU<SparseMatrix> lu;
    if (unknowns > 0) {
        lu.compute(jacobian);
        if (lu.info() != Eigen::Success) {
            result.methodNote = "the Jacobian of the balance equations could not be factorised; central differences used";
            for (SensitivityOutput& o : result.outputs) o.method = DerivativeMethod::CentralDifference;
            centralDifferences(model, result);
            return;
        }
    }
    const TrophicLevelTangent levels(model, tl);

    Eigen::VectorXd rhs(ek);
    for (std::size_t k = 0; k < result.inputs.size(); ++k) {
        t.clear();
        seedTangent(p, result.inputs[k], t);
        if (unknowns > 0) {
            const Eigen::VectorXd dG = residualTangent(p, t);
            for (std::size_t r = 0; r < unknowns; ++r)
                rhs[static_cast<Eigen::Index>(r)] = -dG[static_cast<Eigen::Index>(equations[r])];
            const Eigen::VectorXd dx = lu.solve(rhs);
            for (std::size_t c = 0; c < unknowns; ++c)
                addUnknownTangent(p, plan.compartmentOfColumn(c), dx[static_cast<Eigen::Index>(c)], t);
        }
        const Eigen::VectorXd dQ = consumptionTangent(p, t);
        const bool dietMoves = t.dietPredator.has_value();
        const Eigen::VectorXd dTL = dietMoves && levels.ok() ? levels.solve(t) : Eigen::VectorXd::Zero(en);
        for (std::size_t o = 0; o < result.outputs.size(); ++o) {
            const SensitivityOutput& out = result.outputs[o];
            const auto i = static_cast<Eigen::Index>(out.compartment);
            double e = kNaN;
            switch (out.kind) {
            case SensitivityOutputKind::Biomass: e = relative(t.dB[i], p.b[i]); break;
            case SensitivityOutputKind::PB: e = relative(t.dPB[i], p.pb[i]); break;
            case SensitivityOutputKind::QB: e = relative(t.dQB[i], p.qb[i]); break;
            case SensitivityOutputKind::EE:
                e = model.compartment(out.compartment).isLiving() ? relative(t.dEE[i], p.ee[i])
                                                                  : poolEEElasticity(p, t, dQ, out.compartment);
                break;
            case SensitivityOutputKind::PQ:  // P/Q = (P/B) / (Q/B)
                e = relative(t.dPB[i], p.pb[i]) - relative(t.dQB[i], p.qb[i]);
                break;
            case SensitivityOutputKind::TL:
                e = dietMoves && !levels.ok() ? kNaN : relative(dTL[i], tl[i]);
                break;
            }
            result.elasticity(static_cast<Eigen::Index>(o), static_cast<Eigen::Index>(k)) = e;
        }
    }
}

}  // namespace

std::string_view inputKindKey(SensitivityInputKind k)
{
    switch (k) {
    case SensitivityInputKind::Biomass: return "biomass";
    case SensitivityInputKind::PB: return "pb";
    case SensitivityInputKind::QB: return "qb";
    case SensitivityInputKind::EE: return "ee";
    case SensitivityInputKind::PQ: return "pq";
    case SensitivityInputKind::Catch: return "catch";
    case SensitivityInputKind::Diet: return "diet";
    case SensitivityInputKind::Unassim: return paramKey(Param::Unassim);
    case SensitivityInputKind::NetEmigration: return paramKey(Param::NetEmigration);
    case SensitivityInputKind::BiomassAccum: return paramKey(Param::BiomassAccum);
    case SensitivityInputKind::DetritusImport: return paramKey(Param::DetritusImport);
    }
    return "";
}

std::string_view outputKindKey(SensitivityOutputKind k)
{
    switch (k) {
    case SensitivityOutputKind::Biomass: return "biomass";
    case SensitivityOutputKind::PB: return "pb";
    case SensitivityOutputKind::QB: return "qb";
    case SensitivityOutputKind::EE: return "ee";
    case SensitivityOutputKind::PQ: return "pq";
    case SensitivityOutputKind::TL: return "tl";
    }
    return "";
}

std::optional<SensitivityOutputKind> parseOutputKind(std::string_view key)
{
    if (key == "b") return SensitivityOutputKind::Biomass;
    for (auto k : {SensitivityOutputKind::Biomass, SensitivityOutputKind::PB, SensitivityOutputKind::QB,
                   SensitivityOutputKind::EE, SensitivityOutputKind::PQ, SensitivityOutputKind::TL})
        if (key == outputKindKey(k)) return k;
    return std::nullopt;
}

std::string_view methodKey(DerivativeMethod m)
{
    return m == DerivativeMethod::Analytic ? "analytic" : "central_difference";
}

std::string outputName(const Model& model, const SensitivityOutput& output)
{
    return model.compartment(output.compartment).name + "." + std::string(outputKindKey(output.kind));
}

std::string inputName(const Model& model, const SensitivityInput& input)
{
    // The ensemble names its drawn inputs the same way (core/ensemble), so that PRCC and
    // elasticities of one input line up.
    std::string name = model.compartment(input.compartment).name + "." + std::string(inputKindKey(input.kind));
    if (input.kind == SensitivityInputKind::Diet)
        name += ":" + (input.prey == kImportPrey ? std::string("import") : model.compartment(input.prey).name);
    return name;
}

std::vector<SensitivityInput> sensitivityInputs(const Model& model)
{
    std::vector<SensitivityInput> inputs;
    for (std::size_t i = 0; i < model.size(); ++i) {
        const Compartment& c = model.compartment(i);
        auto add = [&](SensitivityInputKind kind, const std::optional<double>& v) {
            if (isGivenAndNonZero(v)) inputs.push_back({kind, i, 0, *v});
        };
        if (!c.isLiving()) {
            add(SensitivityInputKind::DetritusImport, c.value(Param::DetritusImport));
            continue;
        }
        const bool consumer = c.kind == CompartmentKind::Consumer;
        add(SensitivityInputKind::Biomass, c.value(Param::Biomass));
        add(SensitivityInputKind::PB, c.value(Param::PB));
        if (consumer) add(SensitivityInputKind::QB, c.value(Param::QB));
        add(SensitivityInputKind::EE, c.value(Param::EE));
        if (pqIsUsed(c)) add(SensitivityInputKind::PQ, c.value(Param::PQ));
        add(SensitivityInputKind::Catch, model.totalCatch(i));
        if (consumer) add(SensitivityInputKind::Unassim, c.value(Param::Unassim));
        add(SensitivityInputKind::NetEmigration, c.value(Param::NetEmigration));
        add(SensitivityInputKind::BiomassAccum, c.value(Param::BiomassAccum));
        if (!consumer) continue;
        std::size_t entries = model.dietImport(i) > 0.0 ? 1 : 0;
        for (const auto& e : model.dietRow(i)) entries += e.value > 0.0;
        if (entries < 2) continue;  // a single entry cannot move on the simplex
        for (const auto& [prey, dc] : model.dietRow(i))
            if (dc > 0.0) inputs.push_back({SensitivityInputKind::Diet, i, prey, dc});
        if (model.dietImport(i) > 0.0) inputs.push_back({SensitivityInputKind::Diet, i, kImportPrey, model.dietImport(i)});
    }
    return inputs;
}

std::vector<SensitivityOutput> sensitivityOutputs(const Model& model, const BalanceSheet& sheet)
{
    std::vector<SensitivityOutput> outputs;
    for (std::size_t i = 0; i < model.size() && i < sheet.rows.size(); ++i) {
        const CompartmentBalance& row = sheet.rows[i];
        auto add = [&](SensitivityOutputKind kind, double value, bool solved) {
            if (std::isfinite(value)) outputs.push_back({kind, i, value, solved, DerivativeMethod::Analytic});
        };
        if (!isLiving(row.kind)) {
            add(SensitivityOutputKind::EE, row.ee, true);
            continue;
        }
        if (row.solved.contains(Param::Biomass)) add(SensitivityOutputKind::Biomass, row.biomass, true);
        if (row.solved.contains(Param::PB)) add(SensitivityOutputKind::PB, row.pb, true);
        if (row.solved.contains(Param::QB)) add(SensitivityOutputKind::QB, row.qb, true);
        add(SensitivityOutputKind::EE, row.ee, row.solved.contains(Param::EE));
        if (row.kind != CompartmentKind::Consumer) continue;
        add(SensitivityOutputKind::PQ, row.pq, false);
        add(SensitivityOutputKind::TL, row.tl, false);
    }
    return outputs;
}

std::optional<SensitivityOutput> findOutput(const Model& model, const BalanceSheet& sheet, std::size_t compartment,
                                            SensitivityOutputKind kind)
{
    for (const SensitivityOutput& o : sensitivityOutputs(model, sheet))
        if (o.compartment == compartment && o.kind == kind) return o;
    return std::nullopt;
}

double outputValue(const BalanceSheet& sheet, const SensitivityOutput& output)
{
    if (output.compartment >= sheet.rows.size()) return kNaN;
    const CompartmentBalance& row = sheet.rows[output.compartment];
    switch (output.kind) {
    case SensitivityOutputKind::Biomass: return row.biomass;
    case SensitivityOutputKind::PB: return row.pb;
    case SensitivityOutputKind::QB: return row.qb;
    case SensitivityOutputKind::EE: return row.ee;
    case SensitivityOutputKind::PQ: return row.pq;
    case SensitivityOutputKind::TL: return row.tl;
    }
    return kNaN;
}

Model perturbedModel(const Model& model, const SensitivityInput& input, double logStep)
{
    Model m = model;
    const double factor = std::exp(logStep);
    const std::size_t i = input.compartment;
    Compartment& c = m.compartment(i);
    auto scale = [&](Param p) {
        if (c.value(p)) *c.value(p) *= factor;
    };
    switch (input.kind) {
    case SensitivityInputKind::Biomass: scale(Param::Biomass); break;
    case SensitivityInputKind::PB: scale(Param::PB); break;
    case SensitivityInputKind::QB: scale(Param::QB); break;
    case SensitivityInputKind::EE: scale(Param::EE); break;
    case SensitivityInputKind::PQ: scale(Param::PQ); break;
    case SensitivityInputKind::Unassim: scale(Param::Unassim); break;
    case SensitivityInputKind::NetEmigration: scale(Param::NetEmigration); break;
    case SensitivityInputKind::BiomassAccum: scale(Param::BiomassAccum); break;
    case SensitivityInputKind::DetritusImport: scale(Param::DetritusImport); break;
    case SensitivityInputKind::Catch:
        for (std::size_t f = 0; f < m.fleets().size(); ++f) {
            m.fleet(f).landings[i] *= factor;
            m.fleet(f).discards[i] *= factor;
        }
        break;
    case SensitivityInputKind::Diet: {
        const double sum = model.dietRowSum(i);
        const double before = input.prey == kImportPrey ? model.dietImport(i) : model.diet(i, input.prey);
        const double after = before * factor;
        const double rest = (sum - after) / (sum - before);
        for (const auto& [prey, dc] : model.dietRow(i)) m.setDiet(i, prey, prey == input.prey ? after : dc * rest);
        m.setDietImport(i, input.prey == kImportPrey ? after : model.dietImport(i) * rest);
        break;
    }
    }
    return m;
}

ElasticityResult computeElasticities(const Model& model, const ElasticityOptions& options)
{
    ElasticityResult result;
    result.logStep = options.logStep;
    const BalanceSheet sheet = solveBalance(model);
    result.status = sheet.status;
    if (sheet.status == BalanceStatus::Invalid) {
        result.error = "the scenario does not solve, so it has no point estimate to differentiate";
        for (const Problem& p : sheet.problems)
            if (p.severity == Severity::Error) {
                result.error += ": " + p.message;
                break;
            }
        return result;
    }
    result.inputs = sensitivityInputs(model);
    result.outputs = selectedOutputs(model, sheet, options);
    if (static_cast<double>(result.outputs.size()) * static_cast<double>(result.inputs.size()) >
        static_cast<double>(options.maxEntries)) {
        result.tooLarge = true;
        result.error = std::to_string(result.outputs.size()) + " outputs x " + std::to_string(result.inputs.size()) +
                       " inputs is more than " + std::to_string(options.maxEntries) +
                       " elasticities for one run; choose the outputs (tledger sensitivity --output C.QUANTITY)";
        result.outputs.clear();
        return result;
    }
    result.elasticity.setConstant(static_cast<Eigen::Index>(result.outputs.size()),
                                  static_cast<Eigen::Index>(result.inputs.size()), kNaN);

    const BalancePlan plan = BalancePlan::build(model);
    const bool overdetermined =
        plan.method() == BalancePlan::Method::DenseQR || plan.method() == BalancePlan::Method::SparseQR;
    if (options.forceCentralDifferences || overdetermined) {
        result.methodNote = options.forceCentralDifferences
                                ? "central differences, as asked"
                                : "the balance equations are over-determined (a fully given compartment checks a "
                                  "solved biomass or Q/B; the solver fits them by least squares), so every output "
                                  "uses central differences";
        for (SensitivityOutput& o : result.outputs) o.method = DerivativeMethod::CentralDifference;
        centralDifferences(model, result);
        return result;
    }
    analyticDerivatives(model, sheet, plan, result);
    return result;
}

}  // namespace tl
