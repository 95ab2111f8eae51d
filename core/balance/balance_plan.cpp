// Structural and numeric steps of the mass balance (Polovina 1984; Christensen &
// Pauly 1992). See balance_plan.h for the equation and the reduced system.
#include "core/balance/balance_plan.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <span>
#include <string>

#include <Eigen/SparseLU>
#include <Eigen/SparseQR>

#include "core/balance/balance_codes.h"
#include "core/model/param_set.h"

namespace tl {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

double given(const Compartment& c, Param p) { return c.value(p).value_or(kNaN); }

bool isPrivate(Unknown u) { return u == Unknown::EE || u == Unknown::PB; }
bool isCoupled(Unknown u) { return u == Unknown::Biomass || u == Unknown::QB || u == Unknown::QBTiedPB; }

std::string joinSymbols(const ParamSet& params)
{
    std::string out;
    for (Param p : params) {
        if (!out.empty()) out += ", ";
        out += paramSymbol(p);
    }
    return out;
}

// Max |entry| of a row or column; 1 for an all-zero one so that scaling leaves it be.
template <typename Vec>
double unitScale(const Vec& v)
{
    if (v.size() == 0) return 1.0;
    const double m = v.cwiseAbs().maxCoeff();
    return m > 0.0 ? 1.0 / m : 1.0;
}

// Hager-Higham estimate of 1 / (||A||_1 ||A^-1||_1) (the LAPACK xLACON iteration, at
// most five steps). solveA(src, dst) writes A^-1 src into dst; solveAT(src, dst) writes
// A^-T src into dst and may overwrite src. The four iterates live in the workspace.
template <typename SolveA, typename SolveAT>
double reciprocalConditionEstimate(double normA, BalanceWorkspace& ws, SolveA solveA, SolveAT solveAT)
{
    const Eigen::Index n = ws.estimateX.size();
    Eigen::VectorXd& x = ws.estimateX;
    Eigen::VectorXd& y = ws.estimateY;
    Eigen::VectorXd& xi = ws.estimateW;
    Eigen::VectorXd& z = ws.estimateZ;
    x.setConstant(1.0 / static_cast<double>(n));
    double estimate = 0.0;
    for (int step = 0; step < 5; ++step) {
        solveA(x, y);
        const double norm = y.cwiseAbs().sum();
        if (!std::isfinite(norm)) return 0.0;
        if (step > 0 && norm <= estimate) break;
        estimate = norm;
        for (Eigen::Index i = 0; i < n; ++i) xi[i] = y[i] >= 0.0 ? 1.0 : -1.0;
        solveAT(xi, z);
        Eigen::Index j = 0;
        const double zmax = z.cwiseAbs().maxCoeff(&j);
        if (step > 0 && zmax <= z.dot(x)) break;  // |z|_inf <= z^T x: a local maximum
        x.setZero();
        x[j] = 1.0;
    }
    return estimate > 0.0 ? 1.0 / (normA * estimate) : 0.0;
}

// The prey-side coefficient of a coupled predator j's unknown in its prey's rows:
// consumption B_j Q/B_j is linear in B_j (times Q/B_j) or in Q/B_j (times B_j).
double consumptionCoefficient(Unknown u, const BalanceValues& out, Eigen::Index j)
{
    return u == Unknown::Biomass ? out.qb[j] : out.biomass[j];
}

// Own-row coefficient of a coupled unknown (production B P/B EE); 0 for Q/B alone.
double productionCoefficient(Unknown u, const BalanceInputs& in, const BalanceValues& out, Eigen::Index i)
{
    switch (u) {
    case Unknown::Biomass: return out.pb[i] * out.ee[i];
    case Unknown::QBTiedPB: return out.biomass[i] * out.ee[i] * in.pq[i];
    default: return 0.0;
    }
}

}  // namespace

BalanceInputs BalanceInputs::fromModel(const Model& model)
{
    BalanceInputs in;
    in.assign(model);
    return in;
}

void BalanceInputs::assign(const Model& model)
{
    const std::size_t n = model.size();
    const auto en = static_cast<Eigen::Index>(n);
    BalanceInputs& in = *this;
    for (Eigen::VectorXd* v : {&in.biomass, &in.pb, &in.qb, &in.ee, &in.pq})
        v->setConstant(en, kNaN);
    for (Eigen::VectorXd* v : {&in.unassim, &in.catchTotal, &in.deadDiscards, &in.netEmigration,
                               &in.biomassAccum, &in.detritusImport})
        v->setZero(en);

    std::size_t firstPool = n;  // n: no pool
    std::size_t dietEntries = 0;
    for (std::size_t i = 0; i < n; ++i) {
        const Compartment& c = model.compartment(i);
        const auto k = static_cast<Eigen::Index>(i);
        in.biomass[k] = given(c, Param::Biomass);
        in.pb[k] = given(c, Param::PB);
        in.qb[k] = given(c, Param::QB);
        in.ee[k] = given(c, Param::EE);
        in.pq[k] = given(c, Param::PQ);
        in.unassim[k] = c.isLiving() ? c.unassimilatedOrDefault() : 0.0;
        in.netEmigration[k] = c.valueOr(Param::NetEmigration, 0.0);
        in.biomassAccum[k] = c.valueOr(Param::BiomassAccum, 0.0);
        in.detritusImport[k] = c.kind == CompartmentKind::Detritus ? c.valueOr(Param::DetritusImport, 0.0) : 0.0;
        if (c.kind == CompartmentKind::Detritus && firstPool == n) firstPool = i;
        dietEntries += model.dietRow(i).size();
    }
    // Compressed columns written in order: column j = predator j, prey ascending (the
    // model's rows hold no zeros).
    in.diet.resize(en, en);
    in.diet.resizeNonZeros(static_cast<Eigen::Index>(dietEntries));
    int* dietOuter = in.diet.outerIndexPtr();
    int* dietInner = in.diet.innerIndexPtr();
    double* dietValue = in.diet.valuePtr();
    int entry = 0;
    for (std::size_t j = 0; j < n; ++j) {
        dietOuter[j] = entry;
        for (const auto& [prey, dc] : model.dietRow(j)) {
            dietInner[entry] = static_cast<int>(prey);
            dietValue[entry] = dc;
            ++entry;
        }
    }
    dietOuter[n] = entry;
    // Routing: column d = pool d, sources ascending; a source without explicit routing
    // sends everything to the first pool. Each source's cursor walks its routing row
    // (sorted by pool) as d ascends: O(n x pools + entries), no lookup per cell.
    constexpr int kNotLiving = -2, kToFirstPool = -1;
    routingCursor_.resize(n);
    for (std::size_t i = 0; i < n; ++i)
        routingCursor_[i] = !model.compartment(i).isLiving() ? kNotLiving : model.hasExplicitRouting(i) ? 0 : kToFirstPool;
    in.routing.resize(en, en);
    in.routing.reserve(static_cast<Eigen::Index>(n));
    for (std::size_t d = 0; d < n; ++d) {
        in.routing.startVec(static_cast<Eigen::Index>(d));
        if (model.compartment(d).kind != CompartmentKind::Detritus) continue;
        for (std::size_t i = 0; i < n; ++i) {
            int& cursor = routingCursor_[i];
            if (cursor == kNotLiving) continue;
            double share = 0.0;
            if (cursor == kToFirstPool) {
                share = d == firstPool ? 1.0 : 0.0;
            } else {
                const std::span<const GridEntry> row = model.routingRow(i);
                while (static_cast<std::size_t>(cursor) < row.size() && row[static_cast<std::size_t>(cursor)].col < d) ++cursor;
                if (static_cast<std::size_t>(cursor) < row.size() && row[static_cast<std::size_t>(cursor)].col == d)
                    share = row[static_cast<std::size_t>(cursor)].value;
            }
            if (share != 0.0) in.routing.insertBack(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(d)) = share;
        }
    }
    in.routing.finalize();
    // Catch and dead discards; dead discards go to the fleet's discard pool, else to
    // the first pool.
    std::vector<std::size_t>& discardPool = discardPool_;
    discardPool.assign(model.fleets().size(), n);  // n: nowhere
    for (std::size_t f = 0; f < model.fleets().size(); ++f) {
        const Fleet& fleet = model.fleet(f);
        const std::optional<std::size_t> own = fleet.discardPool;
        if (own && *own < n && model.compartment(*own).kind == CompartmentKind::Detritus) discardPool[f] = *own;
        else if (firstPool < n) discardPool[f] = firstPool;
        for (std::size_t i = 0; i < n; ++i) {
            const double dead = fleet.discards[i] * (1.0 - fleet.discardSurvival[i]);
            in.catchTotal[static_cast<Eigen::Index>(i)] += fleet.landings[i];  // landings, for now
            in.deadDiscards[static_cast<Eigen::Index>(i)] += dead;
        }
    }
    in.catchTotal += in.deadDiscards;  // Y = landings + dead discards, as Model::totalCatch sums them
    // Column d = pool d: sources ascending, each fleet's dead discards summed in fleet order.
    in.discardsToPool.resize(en, en);
    std::size_t discardEntries = 0;
    for (std::size_t f = 0; f < model.fleets().size(); ++f)
        for (std::size_t i = 0; i < n; ++i) discardEntries += model.fleet(f).discards[i] != 0.0;
    in.discardsToPool.reserve(static_cast<Eigen::Index>(discardEntries));
    std::vector<double>& deadToPool = deadToPool_;  // one pool's dead discards, by source
    for (std::size_t d = 0; d < n; ++d) {
        in.discardsToPool.startVec(static_cast<Eigen::Index>(d));
        if (model.compartment(d).kind != CompartmentKind::Detritus || discardEntries == 0) continue;
        deadToPool.assign(n, 0.0);
        for (std::size_t f = 0; f < model.fleets().size(); ++f) {
            if (discardPool[f] != d) continue;
            const Fleet& fleet = model.fleet(f);
            for (std::size_t i = 0; i < n; ++i)
                if (fleet.discards[i] != 0.0) deadToPool[i] += fleet.discards[i] * (1.0 - fleet.discardSurvival[i]);
        }
        for (std::size_t i = 0; i < n; ++i)
            if (deadToPool[i] != 0.0) in.discardsToPool.insertBack(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(d)) = deadToPool[i];
    }
    in.discardsToPool.finalize();
}

BalancePlan BalancePlan::build(const Model& model)
{
    BalancePlan plan;
    plan.rebuild(model);
    return plan;
}

void BalancePlan::rebuild(const Model& model)
{
    BalancePlan& plan = *this;
    const std::size_t n = model.size();
    // Start empty, keeping the storage of an earlier build.
    for (std::vector<std::size_t>* v : {&rowCompartment_, &colCompartment_, &pools_, &coupled_, &reducedRows_, &private_})
        v->clear();
    uncoupledChecks_ = 0;
    method_ = Method::None;
    pattern_.resize(0, 0);
    problems_.clear();
    plan.slots_.assign(n, Slot{});
    for (std::vector<std::size_t>* v : {&plan.rowCompartment_, &plan.colCompartment_})
        v->reserve(n);  // one allocation each

    for (std::size_t i = 0; i < n; ++i) {
        const Compartment& c = model.compartment(i);
        plan.slots_[i].kind = c.kind;
        if (c.kind == CompartmentKind::Detritus) {
            plan.pools_.push_back(i);
            if (model.hasExplicitRouting(i))
                plan.problems_.push_back(code::makeProblem(code::kRoutingFromPoolIgnored, Severity::Warning, c.name,
                                          "routing",
                                          "Detritus routing from the pool '" + c.name +
                                              "' is ignored: a pool's surplus is exported.",
                                          "Remove the routing rows whose source is a detritus pool."));
            continue;
        }
        plan.slots_[i].row = static_cast<int>(plan.rowCompartment_.size());
        plan.rowCompartment_.push_back(i);
        const bool consumer = c.kind == CompartmentKind::Consumer;

        bool missB = !c.value(Param::Biomass), missPB = !c.value(Param::PB);
        bool missQB = consumer && !c.value(Param::QB), missEE = !c.value(Param::EE);
        bool tied = false;
        if (consumer && c.value(Param::PQ)) {
            if (missPB && !missQB) {
                plan.slots_[i].standIn = PqStandIn::PBFromPQ;
                missPB = false;
            } else if (missQB && !missPB) {
                plan.slots_[i].standIn = PqStandIn::QBFromPQ;
                missQB = false;
            } else if (missPB && missQB) {
                tied = true;
                missPB = false;
            }
            if ((plan.slots_[i].standIn != PqStandIn::None || tied) && !(*c.value(Param::PQ) > 0.0))
                plan.problems_.push_back(code::makeProblem(code::kInvalidValue, Severity::Error, c.name, "pq",
                                          "P/Q of '" + c.name + "' must be above 0 to stand in for P/B or Q/B.",
                                          "Enter a positive P/Q, or give P/B and Q/B."));
        }
        ParamSet missing;
        if (missB) missing.insert(Param::Biomass);
        if (missPB) missing.insert(Param::PB);
        if (missQB) missing.insert(Param::QB);
        if (missEE) missing.insert(Param::EE);
        if (missing.size() >= 2) {
            plan.problems_.push_back(code::makeProblem(code::kUnderdetermined, Severity::Error, c.name, std::string(paramKey(*missing.begin())),
                 "'" + c.name + "' has " + std::to_string(missing.size()) + " unknowns (" + joinSymbols(missing) +
                     "); at most one of B, P/B, Q/B, EE can be solved.",
                 "Enter all but one of them (P/Q can stand in for P/B or Q/B)."));
            continue;
        }
        Unknown u = Unknown::None;
        if (missing.size() == 1) {
            switch (*missing.begin()) {
            case Param::Biomass: u = Unknown::Biomass; break;
            case Param::PB: u = Unknown::PB; break;
            case Param::QB: u = tied ? Unknown::QBTiedPB : Unknown::QB; break;
            default: u = Unknown::EE; break;
            }
        }
        if (tied && u != Unknown::QBTiedPB) {
            // P/B and Q/B tied by P/Q plus another unknown: two unknowns after all.
            plan.problems_.push_back(code::makeProblem(code::kUnderdetermined, Severity::Error, c.name, "pb",
                                      "'" + c.name + "' has 2 unknowns (P/B and Q/B tied by P/Q, and " +
                                          std::string(paramSymbol(*missing.begin())) +
                                          "); at most one of B, P/B, Q/B, EE can be solved.",
                                      "Enter P/B or Q/B, or the other missing value."));
            continue;
        }
        if (tied && missing.empty()) u = Unknown::QBTiedPB;
        plan.slots_[i].unknown = u;
        if (u != Unknown::None) {
            plan.slots_[i].column = static_cast<int>(plan.colCompartment_.size());
            plan.colCompartment_.push_back(i);
        }
    }
    if (plan.pools_.empty() && !plan.rowCompartment_.empty())
        plan.problems_.push_back(code::makeProblem(code::kNoDetritusPool, Severity::Warning, "", "",
                                                   code::kNoDetritusPoolMessage, code::kNoDetritusPoolHint));

    // The reduced system: coupled unknowns as columns; as rows, the equations without
    // a private unknown that some coupled unknown enters (its own production, or the
    // consumption of a coupled predator).
    plan.private_.reserve(plan.colCompartment_.size());
    std::vector<char>& entered = entered_;  // the equation involves a coupled unknown
    entered.assign(n, 0);
    for (std::size_t i : plan.rowCompartment_) {
        const Unknown u = plan.slots_[i].unknown;
        if (isPrivate(u)) plan.private_.push_back(i);
        if (!isCoupled(u)) continue;
        plan.slots_[i].reducedColumn = static_cast<int>(plan.coupled_.size());
        plan.coupled_.push_back(i);
        if (u != Unknown::QB) entered[i] = 1;
        for (const auto& [prey, dc] : model.dietRow(i))
            if (dc != 0.0 && isLiving(plan.slots_[prey].kind) && !isPrivate(plan.slots_[prey].unknown)) entered[prey] = 1;
    }
    for (std::size_t i : plan.rowCompartment_) {
        if (isPrivate(plan.slots_[i].unknown)) continue;
        if (!entered[i]) {
            ++plan.uncoupledChecks_;
            continue;
        }
        plan.slots_[i].reducedRow = static_cast<int>(plan.reducedRows_.size());
        plan.reducedRows_.push_back(i);
    }
    const std::size_t m = plan.reducedRows_.size(), k = plan.coupled_.size();
    if (k == 0) plan.method_ = Method::None;
    else if (k <= kDenseLimit) plan.method_ = m == k ? Method::DenseLU : Method::DenseQR;
    else plan.method_ = m == k ? Method::SparseLU : Method::SparseQR;
    if (plan.method_ == Method::SparseLU || plan.method_ == Method::SparseQR) {
        std::vector<Eigen::Triplet<double, int>> entries;
        for (std::size_t j : plan.coupled_) {
            const int col = plan.slots_[j].reducedColumn;
            if (plan.slots_[j].unknown != Unknown::QB) entries.emplace_back(plan.slots_[j].reducedRow, col, 1.0);
            for (const auto& [prey, dc] : model.dietRow(j))
                if (dc != 0.0 && plan.slots_[prey].reducedRow >= 0) entries.emplace_back(plan.slots_[prey].reducedRow, col, 1.0);
        }
        plan.pattern_.resize(static_cast<Eigen::Index>(m), static_cast<Eigen::Index>(k));
        plan.pattern_.setFromTriplets(entries.begin(), entries.end());
        plan.pattern_.makeCompressed();
    }
}

BalanceWorkspace BalancePlan::makeWorkspace() const
{
    BalanceWorkspace ws;
    sizeWorkspace(ws);
    return ws;
}

void BalancePlan::sizeWorkspace(BalanceWorkspace& ws) const
{
    const auto m = static_cast<Eigen::Index>(reducedRows_.size());
    const auto k = static_cast<Eigen::Index>(coupled_.size());
    ws.b.setZero(m);
    ws.x.setZero(k);
    ws.y.setZero(k);
    ws.rowScale.setOnes(m);
    ws.colScale.setOnes(k);
    ws.colGross.setZero(k);
    ws.rhsWork.setZero(m);
    ws.estimateX.setZero(k);
    ws.estimateY.setZero(k);
    ws.estimateZ.setZero(k);
    ws.estimateW.setZero(k);
    switch (method_) {
    case Method::None: break;
    case Method::DenseLU:
        ws.a.setZero(m, k);
        if (ws.lu.rows() != k) ws.lu = Eigen::PartialPivLU<Eigen::MatrixXd>(k);
        break;
    case Method::DenseQR:
        ws.a.setZero(m, k);
        if (ws.qr.rows() != m || ws.qr.cols() != k) ws.qr = Eigen::ColPivHouseholderQR<Eigen::MatrixXd>(m, k);
        break;
    case Method::SparseLU:
        ws.sparseA = pattern_;
        ws.sparseLu = std::make_shared<Eigen::SparseLU<SparseColumns, Eigen::COLAMDOrdering<int>>>();
        ws.sparseLu->analyzePattern(ws.sparseA);
        break;
    case Method::SparseQR:
        ws.sparseA = pattern_;
        ws.sparseQr = std::make_shared<Eigen::SparseQR<SparseColumns, Eigen::COLAMDOrdering<int>>>();
        if (m >= k) ws.sparseQr->analyzePattern(ws.sparseA);
        break;
    }
}

BalanceValues BalancePlan::makeValues() const
{
    BalanceValues v;
    sizeValues(v);
    return v;
}

void BalancePlan::sizeValues(BalanceValues& v) const
{
    const auto n = static_cast<Eigen::Index>(compartmentCount());
    v.status = NumericStatus::Solved;
    v.conditioning = 1.0;
    for (Eigen::VectorXd* x : {&v.biomass, &v.pb, &v.qb, &v.ee, &v.production, &v.consumption, &v.predation,
                               &v.flowToDetritus, &v.residual, &v.residualScale, &v.detritusInflow, &v.detritusEE,
                               &v.detritusExport})
        x->setZero(n);
}

// Fills C2 and b2 from the given values; out.consumption holds the consumption of
// every consumer whose B and Q/B are given (0 for coupled ones), out.predation the
// predation those exert.
void BalancePlan::assembleReduced(const BalanceInputs& in, const BalanceValues& out, BalanceWorkspace& ws) const
{
    const bool dense = method_ == Method::DenseLU || method_ == Method::DenseQR;
    if (dense) ws.a.setZero();
    else std::fill_n(ws.sparseA.valuePtr(), ws.sparseA.nonZeros(), 0.0);
    ws.colGross.setZero();
    const auto add = [&ws, dense](int r, int col, double term) {
        if (dense) ws.a(r, col) += term;
        else ws.sparseA.coeffRef(r, col) += term;
        ws.colGross[col] = std::max(ws.colGross[col], std::abs(term));
    };
    for (std::size_t r = 0; r < reducedRows_.size(); ++r) {
        const auto i = static_cast<Eigen::Index>(reducedRows_[r]);
        double rhs = in.catchTotal[i] + in.netEmigration[i] + in.biomassAccum[i] + out.predation[i];
        if (slots_[reducedRows_[r]].unknown == Unknown::None || slots_[reducedRows_[r]].unknown == Unknown::QB)
            rhs -= out.biomass[i] * out.pb[i] * out.ee[i];
        ws.b[static_cast<Eigen::Index>(r)] = rhs;
    }
    for (std::size_t col = 0; col < coupled_.size(); ++col) {
        const std::size_t j = coupled_[col];
        const auto jj = static_cast<Eigen::Index>(j);
        const Unknown u = slots_[j].unknown;
        if (u != Unknown::QB) add(slots_[j].reducedRow, static_cast<int>(col), productionCoefficient(u, in, out, jj));
        const double perDiet = consumptionCoefficient(u, out, jj);
        for (SparseColumns::InnerIterator it(in.diet, jj); it; ++it)
            if (const int r = slots_[static_cast<std::size_t>(it.index())].reducedRow; r >= 0)
                add(r, static_cast<int>(col), -it.value() * perDiet);
    }
}

// Equilibrates and solves C2 y = b2 into ws.x; false when (numerically) singular.
bool BalancePlan::solveReduced(BalanceWorkspace& ws, BalanceValues& out) const
{
    const auto m = static_cast<Eigen::Index>(reducedRows_.size());
    const auto k = static_cast<Eigen::Index>(coupled_.size());
    const bool dense = method_ == Method::DenseLU || method_ == Method::DenseQR;

    // Cancellation residue to 0, then columns and rows to unit max norm.
    if (dense) {
        for (Eigen::Index c = 0; c < k; ++c) {
            const double residue = kCancellationResidue * ws.colGross[c];
            for (Eigen::Index r = 0; r < m; ++r)
                if (std::abs(ws.a(r, c)) <= residue) ws.a(r, c) = 0.0;
            ws.colScale[c] = unitScale(ws.a.col(c));
            ws.a.col(c) *= ws.colScale[c];
        }
        for (Eigen::Index r = 0; r < m; ++r) {
            ws.rowScale[r] = unitScale(ws.a.row(r));
            ws.a.row(r) *= ws.rowScale[r];
        }
    } else {
        ws.rowScale.setZero();
        for (Eigen::Index c = 0; c < k; ++c) {
            const double residue = kCancellationResidue * ws.colGross[c];
            double largest = 0.0;
            for (SparseColumns::InnerIterator it(ws.sparseA, c); it; ++it) {
                if (std::abs(it.value()) <= residue) it.valueRef() = 0.0;
                largest = std::max(largest, std::abs(it.value()));
            }
            ws.colScale[c] = largest > 0.0 ? 1.0 / largest : 1.0;
            for (SparseColumns::InnerIterator it(ws.sparseA, c); it; ++it) {
                it.valueRef() *= ws.colScale[c];
                ws.rowScale[it.index()] = std::max(ws.rowScale[it.index()], std::abs(it.value()));
            }
        }
        for (Eigen::Index r = 0; r < m; ++r) ws.rowScale[r] = ws.rowScale[r] > 0.0 ? 1.0 / ws.rowScale[r] : 1.0;
        for (Eigen::Index c = 0; c < k; ++c)
            for (SparseColumns::InnerIterator it(ws.sparseA, c); it; ++it) it.valueRef() *= ws.rowScale[it.index()];
    }
    ws.rhsWork = ws.b.cwiseProduct(ws.rowScale);
    if (m < k) {  // fewer equations than coupled unknowns: rank deficient by structure
        out.conditioning = 0.0;
        return false;
    }

    switch (method_) {
    case Method::None: return true;
    case Method::DenseLU: {
        ws.lu.compute(ws.a);
        const Eigen::MatrixXd& lu = ws.lu.matrixLU();
        if (!(lu.diagonal().cwiseAbs().minCoeff() > 0.0)) {  // a zero (or NaN) pivot
            out.conditioning = 0.0;
            return false;
        }
        double normA = 0.0;
        for (Eigen::Index c = 0; c < k; ++c) normA = std::max(normA, ws.a.col(c).cwiseAbs().sum());
        // PA = LU: A^-1 v = U^-1 L^-1 P v and A^-T v = P^T L^-T U^-T v.
        out.conditioning = reciprocalConditionEstimate(
            normA, ws,
            [&](const Eigen::VectorXd& src, Eigen::VectorXd& dst) {
                dst = ws.lu.permutationP() * src;
                lu.triangularView<Eigen::UnitLower>().solveInPlace(dst);
                lu.triangularView<Eigen::Upper>().solveInPlace(dst);
            },
            [&](Eigen::VectorXd& src, Eigen::VectorXd& dst) {
                lu.transpose().triangularView<Eigen::Lower>().solveInPlace(src);
                lu.transpose().triangularView<Eigen::UnitUpper>().solveInPlace(src);
                dst = ws.lu.permutationP().transpose() * src;
            });
        if (!(out.conditioning > kSingularConditioning)) return false;
        ws.y = ws.lu.permutationP() * ws.rhsWork;
        lu.triangularView<Eigen::UnitLower>().solveInPlace(ws.y);
        lu.triangularView<Eigen::Upper>().solveInPlace(ws.y);
        break;
    }
    case Method::DenseQR: {
        ws.qr.compute(ws.a);
        const auto pivots = ws.qr.matrixR().diagonal().cwiseAbs();
        const double maxPivot = pivots.maxCoeff();
        out.conditioning = maxPivot > 0.0 ? pivots.minCoeff() / maxPivot : 0.0;
        if (!(out.conditioning > kSingularConditioning)) return false;
        // Least squares: R y' = (Q^T b)_top, y = Pi y'. Q = H_0 ... H_{k-1} with
        // H_h = I - tau_h v v^T, v = (1, essential part below the diagonal); applied
        // by hand because Eigen's sequence product allocates on a vector block.
        const Eigen::MatrixXd& qr = ws.qr.matrixQR();
        for (Eigen::Index h = 0; h < k; ++h) {
            const Eigen::Index below = m - h - 1;
            const auto essential = qr.col(h).tail(below);
            const double w = ws.qr.hCoeffs()[h] * (ws.rhsWork[h] + essential.dot(ws.rhsWork.tail(below)));
            ws.rhsWork[h] -= w;
            ws.rhsWork.tail(below) -= w * essential;
        }
        ws.x = ws.rhsWork.head(k);
        ws.qr.matrixR().topLeftCorner(k, k).triangularView<Eigen::Upper>().solveInPlace(ws.x);
        ws.y = ws.qr.colsPermutation() * ws.x;
        break;
    }
    case Method::SparseLU: {
        ws.sparseLu->factorize(ws.sparseA);
        if (ws.sparseLu->info() != Eigen::Success) {
            out.conditioning = 0.0;
            return false;
        }
        double normA = 0.0;
        for (Eigen::Index c = 0; c < k; ++c) {
            double sum = 0.0;
            for (SparseColumns::InnerIterator it(ws.sparseA, c); it; ++it) sum += std::abs(it.value());
            normA = std::max(normA, sum);
        }
        auto& lu = *ws.sparseLu;
        out.conditioning = reciprocalConditionEstimate(
            normA, ws, [&](const Eigen::VectorXd& src, Eigen::VectorXd& dst) { dst = lu.solve(src); },
            [&](Eigen::VectorXd& src, Eigen::VectorXd& dst) { dst = lu.transpose().solve(src); });
        if (!(out.conditioning > kSingularConditioning)) return false;
        ws.y = lu.solve(ws.rhsWork);
        break;
    }
    case Method::SparseQR: {
        auto& qr = *ws.sparseQr;
        qr.factorize(ws.sparseA);
        if (qr.info() != Eigen::Success || qr.rank() < k) {
            out.conditioning = 0.0;
            return false;
        }
        const auto pivots = qr.matrixR().diagonal().cwiseAbs();
        const double maxPivot = pivots.maxCoeff();
        out.conditioning = maxPivot > 0.0 ? pivots.minCoeff() / maxPivot : 0.0;
        if (!(out.conditioning > kSingularConditioning)) return false;
        ws.y = qr.solve(ws.rhsWork);
        break;
    }
    }
    ws.x = ws.y.cwiseProduct(ws.colScale);
    return true;
}

// EE_i = demand_i / (B_i P/B_i), P/B_i = demand_i / (B_i EE_i), with
// demand = predation + Y + E + BA (row i of the full system, solved for its own unknown).
void BalancePlan::backSubstitute(const BalanceInputs& in, BalanceValues& out) const
{
    for (std::size_t i : private_) {
        const auto ii = static_cast<Eigen::Index>(i);
        const double demand = out.predation[ii] + in.catchTotal[ii] + in.netEmigration[ii] + in.biomassAccum[ii];
        if (slots_[i].unknown == Unknown::EE) out.ee[ii] = demand / (out.biomass[ii] * out.pb[ii]);
        else out.pb[ii] = demand / (out.biomass[ii] * out.ee[ii]);
    }
}

void BalancePlan::completeFlows(const BalanceInputs& in, BalanceValues& out) const
{
    for (std::size_t i : rowCompartment_) {
        const auto ii = static_cast<Eigen::Index>(i);
        out.production[ii] = out.biomass[ii] * out.pb[ii];
        const double used = out.production[ii] * out.ee[ii];
        const double demand = out.predation[ii] + in.catchTotal[ii] + in.netEmigration[ii] + in.biomassAccum[ii];
        out.residual[ii] = used - demand;
        out.residualScale[ii] = std::max(std::abs(used), std::abs(demand));
        out.flowToDetritus[ii] =
            (1.0 - out.ee[ii]) * out.production[ii] + in.unassim[ii] * out.consumption[ii] + in.deadDiscards[ii];
    }
    for (std::size_t d : pools_) {
        const auto dd = static_cast<Eigen::Index>(d);
        double inflow = in.detritusImport[dd];
        for (SparseColumns::InnerIterator it(in.routing, dd); it; ++it)
            inflow += it.value() * (out.flowToDetritus[it.index()] - in.deadDiscards[it.index()]);
        for (SparseColumns::InnerIterator it(in.discardsToPool, dd); it; ++it) inflow += it.value();
        out.detritusInflow[dd] = inflow;
        // EE_d is undefined without inflow unless nothing is eaten either.
        out.detritusEE[dd] = inflow > 0.0 ? out.predation[dd] / inflow : (out.predation[dd] != 0.0 ? kNaN : 0.0);
        out.detritusExport[dd] = inflow - out.predation[dd] - in.biomassAccum[dd];
        out.ee[dd] = out.detritusEE[dd];
    }
}

void BalancePlan::solve(const BalanceInputs& in, BalanceWorkspace& ws, BalanceValues& out) const
{
    const auto n = static_cast<Eigen::Index>(compartmentCount());

    // 1. Given values, with P/Q standing in for P/B or Q/B; zero flows.
    out.biomass = in.biomass;
    out.pb = in.pb;
    out.qb = in.qb;
    out.ee = in.ee;
    for (Eigen::VectorXd* v : {&out.production, &out.consumption, &out.flowToDetritus, &out.residual,
                               &out.residualScale, &out.detritusInflow, &out.detritusEE, &out.detritusExport})
        v->setZero();
    for (Eigen::Index i = 0; i < n; ++i) {
        const auto s = static_cast<std::size_t>(i);
        if (slots_[s].kind != CompartmentKind::Consumer) out.qb[i] = 0.0;
        if (slots_[s].standIn == PqStandIn::PBFromPQ) out.pb[i] = in.pq[i] * in.qb[i];
        if (slots_[s].standIn == PqStandIn::QBFromPQ) out.qb[i] = in.pb[i] / in.pq[i];
    }
    out.status = NumericStatus::Solved;
    out.conditioning = 1.0;

    // 2. A private unknown with a zero coefficient leaves its column of A empty.
    for (std::size_t i : private_) {
        const auto ii = static_cast<Eigen::Index>(i);
        const double coefficient = out.biomass[ii] * (slots_[i].unknown == Unknown::EE ? out.pb[ii] : out.ee[ii]);
        if (!(coefficient != 0.0) || !std::isfinite(coefficient)) {
            out.status = NumericStatus::Singular;
            out.conditioning = 0.0;
        }
    }

    // 3. Consumption of consumers with B and Q/B known, and the predation it exerts.
    for (std::size_t i : rowCompartment_) {
        const auto ii = static_cast<Eigen::Index>(i);
        out.consumption[ii] = isCoupled(slots_[i].unknown) ? 0.0 : out.biomass[ii] * out.qb[ii];
    }

    // 4. The coupled unknowns from the reduced system.
    if (!coupled_.empty()) {
        out.predation.noalias() = in.diet * out.consumption;
        assembleReduced(in, out, ws);
        if (!solveReduced(ws, out)) out.status = NumericStatus::Singular;
        if (out.status == NumericStatus::Singular) return;
        for (std::size_t c = 0; c < coupled_.size(); ++c) {
            const std::size_t i = coupled_[c];
            const auto ii = static_cast<Eigen::Index>(i);
            const double x = ws.x[static_cast<Eigen::Index>(c)];
            switch (slots_[i].unknown) {
            case Unknown::Biomass: out.biomass[ii] = x; break;
            case Unknown::QB: out.qb[ii] = x; break;
            case Unknown::QBTiedPB:
                out.qb[ii] = x;
                out.pb[ii] = in.pq[ii] * x;
                break;
            default: break;
            }
            out.consumption[ii] = out.biomass[ii] * out.qb[ii];
        }
    }
    if (out.status == NumericStatus::Singular) return;

    // 5. Predation from every consumer, the private unknowns, flows and pools.
    out.predation.noalias() = in.diet * out.consumption;
    backSubstitute(in, out);
    completeFlows(in, out);
}

}  // namespace tl
