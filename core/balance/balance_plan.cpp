// Structural and numeric steps of the mass balance (Polovina 1984; Christensen &
// Pauly 1992). See balance_plan.h for the equation and the layout of A x = b.
#include "core/balance/balance_plan.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "core/balance/balance_codes.h"

namespace tl {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

double given(const Compartment& c, Param p) { return c.value(p).value_or(kNaN); }

std::string joinSymbols(const std::vector<Param>& params)
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
    const double m = v.cwiseAbs().maxCoeff();
    return m > 0.0 ? 1.0 / m : 1.0;
}

// Hager-Higham estimate of 1 / (||A||_1 ||A^-1||_1) from the LU factors of A (the
// LAPACK xLACON iteration, at most five steps), in the workspace's vectors.
double reciprocalConditionEstimate(BalanceWorkspace& ws)
{
    const Eigen::MatrixXd& lu = ws.lu.matrixLU();
    const Eigen::Index n = lu.rows();
    if (!(lu.diagonal().cwiseAbs().minCoeff() > 0.0)) return 0.0;  // a zero (or NaN) pivot
    double normA = 0.0;
    for (Eigen::Index c = 0; c < n; ++c) normA = std::max(normA, ws.a.col(c).cwiseAbs().sum());
    Eigen::VectorXd& x = ws.estimateX;
    Eigen::VectorXd& y = ws.estimateY;
    x.setConstant(1.0 / static_cast<double>(n));
    double estimate = 0.0;
    for (int step = 0; step < 5; ++step) {
        y = ws.lu.permutationP() * x;  // y = A^-1 x
        lu.triangularView<Eigen::UnitLower>().solveInPlace(y);
        lu.triangularView<Eigen::Upper>().solveInPlace(y);
        const double norm = y.cwiseAbs().sum();
        if (!std::isfinite(norm)) return 0.0;
        if (step > 0 && norm <= estimate) break;
        estimate = norm;
        for (Eigen::Index i = 0; i < n; ++i) y[i] = y[i] >= 0.0 ? 1.0 : -1.0;  // xi = sign(y)
        lu.transpose().triangularView<Eigen::Lower>().solveInPlace(y);      // z = A^-T xi
        lu.transpose().triangularView<Eigen::UnitUpper>().solveInPlace(y);
        Eigen::VectorXd& z = ws.estimateZ;
        z = ws.lu.permutationP().transpose() * y;
        Eigen::Index j = 0;
        const double zmax = z.cwiseAbs().maxCoeff(&j);
        if (step > 0 && zmax <= z.dot(x)) break;  // |z|_inf <= z^T x: a local maximum
        x.setZero();
        x[j] = 1.0;
    }
    return estimate > 0.0 ? 1.0 / (normA * estimate) : 0.0;
}

}  // namespace

BalanceInputs BalanceInputs::fromModel(const Model& model)
{
    const auto n = static_cast<Eigen::Index>(model.size());
    BalanceInputs in;
    for (Eigen::VectorXd* v : {&in.biomass, &in.pb, &in.qb, &in.ee, &in.pq})
        v->setConstant(n, kNaN);
    for (Eigen::VectorXd* v : {&in.unassim, &in.catchTotal, &in.deadDiscards, &in.netEmigration,
                               &in.biomassAccum, &in.detritusImport})
        v->setZero(n);
    in.diet.setZero(n, n);
    in.routing.setZero(n, n);
    in.discardsToPool.setZero(n, n);

    const std::vector<std::size_t> pools = model.detritusPools();
    for (std::size_t i = 0; i < model.size(); ++i) {
        const Compartment& c = model.compartment(i);
        const auto k = static_cast<Eigen::Index>(i);
        in.biomass[k] = given(c, Param::Biomass);
        in.pb[k] = given(c, Param::PB);
        in.qb[k] = given(c, Param::QB);
        in.ee[k] = given(c, Param::EE);
        in.pq[k] = given(c, Param::PQ);
        in.unassim[k] = c.isLiving() ? c.unassimilatedOrDefault() : 0.0;
        in.catchTotal[k] = model.totalCatch(i);
        in.deadDiscards[k] = model.deadDiscards(i);
        in.netEmigration[k] = c.valueOr(Param::NetEmigration, 0.0);
        in.biomassAccum[k] = c.valueOr(Param::BiomassAccum, 0.0);
        in.detritusImport[k] = c.kind == CompartmentKind::Detritus ? c.valueOr(Param::DetritusImport, 0.0) : 0.0;
        for (std::size_t j = 0; j < model.size(); ++j)  // j eats i
            in.diet(k, static_cast<Eigen::Index>(j)) = model.diet(j, i);
        if (c.isLiving())
            for (std::size_t d : pools) in.routing(k, static_cast<Eigen::Index>(d)) = model.effectiveRouting(i, d);
    }
    // Dead discards go to the fleet's discard pool, else to the first pool.
    for (const Fleet& fleet : model.fleets()) {
        std::optional<std::size_t> pool = fleet.discardPool;
        if (!pool || *pool >= model.size() || model.compartment(*pool).kind != CompartmentKind::Detritus)
            pool = pools.empty() ? std::nullopt : std::optional<std::size_t>(pools.front());
        if (!pool) continue;
        for (std::size_t i = 0; i < model.size(); ++i)
            in.discardsToPool(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(*pool)) +=
                fleet.discards[i] * (1.0 - fleet.discardSurvival[i]);
    }
    return in;
}

BalancePlan BalancePlan::build(const Model& model)
{
    BalancePlan plan;
    const std::size_t n = model.size();
    plan.kinds_.resize(n);
    plan.unknown_.assign(n, Unknown::None);
    plan.standIn_.assign(n, PqStandIn::None);
    plan.rowOf_.assign(n, -1);
    plan.colOf_.assign(n, -1);

    for (std::size_t i = 0; i < n; ++i) {
        const Compartment& c = model.compartment(i);
        plan.kinds_[i] = c.kind;
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
        plan.rowOf_[i] = static_cast<int>(plan.rowCompartment_.size());
        plan.rowCompartment_.push_back(i);
        const bool consumer = c.kind == CompartmentKind::Consumer;
        if (consumer) plan.consumers_.push_back(i);

        bool missB = !c.value(Param::Biomass), missPB = !c.value(Param::PB);
        bool missQB = consumer && !c.value(Param::QB), missEE = !c.value(Param::EE);
        bool tied = false;
        if (consumer && c.value(Param::PQ)) {
            if (missPB && !missQB) {
                plan.standIn_[i] = PqStandIn::PBFromPQ;
                missPB = false;
            } else if (missQB && !missPB) {
                plan.standIn_[i] = PqStandIn::QBFromPQ;
                missQB = false;
            } else if (missPB && missQB) {
                tied = true;
                missPB = false;
            }
            if ((plan.standIn_[i] != PqStandIn::None || tied) && !(*c.value(Param::PQ) > 0.0))
                plan.problems_.push_back(code::makeProblem(code::kInvalidValue, Severity::Error, c.name, "pq",
                                          "P/Q of '" + c.name + "' must be above 0 to stand in for P/B or Q/B.",
                                          "Enter a positive P/Q, or give P/B and Q/B."));
        }
        std::vector<Param> missing;
        if (missB) missing.push_back(Param::Biomass);
        if (missPB) missing.push_back(Param::PB);
        if (missQB) missing.push_back(Param::QB);
        if (missEE) missing.push_back(Param::EE);
        if (missing.size() >= 2) {
            plan.problems_.push_back(code::makeProblem(code::kUnderdetermined, Severity::Error, c.name, std::string(paramKey(missing.front())),
                 "'" + c.name + "' has " + std::to_string(missing.size()) + " unknowns (" + joinSymbols(missing) +
                     "); at most one of B, P/B, Q/B, EE can be solved.",
                 "Enter all but one of them (P/Q can stand in for P/B or Q/B)."));
            continue;
        }
        Unknown u = Unknown::None;
        if (missing.size() == 1) {
            switch (missing.front()) {
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
                                          std::string(paramSymbol(missing.front())) +
                                          "); at most one of B, P/B, Q/B, EE can be solved.",
                                      "Enter P/B or Q/B, or the other missing value."));
            continue;
        }
        if (tied && missing.empty()) u = Unknown::QBTiedPB;
        plan.unknown_[i] = u;
        if (u != Unknown::None) {
            plan.colOf_[i] = static_cast<int>(plan.colCompartment_.size());
            plan.colCompartment_.push_back(i);
        }
    }
    if (plan.pools_.empty() && !plan.rowCompartment_.empty())
        plan.problems_.push_back(code::makeProblem(code::kNoDetritusPool, Severity::Warning, "", "",
                                  "The model has no detritus pool: egestion and other mortality leave the system.",
                                  "Add a detritus compartment."));
    return plan;
}

BalanceWorkspace BalancePlan::makeWorkspace() const
{
    const auto m = static_cast<Eigen::Index>(equationCount());
    const auto k = static_cast<Eigen::Index>(unknownCount());
    BalanceWorkspace ws;
    ws.a.setZero(m, k);
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
    if (m == k) ws.lu = Eigen::PartialPivLU<Eigen::MatrixXd>(m);
    else ws.qr = Eigen::ColPivHouseholderQR<Eigen::MatrixXd>(m, k);
    return ws;
}

BalanceValues BalancePlan::makeValues() const
{
    const auto n = static_cast<Eigen::Index>(compartmentCount());
    BalanceValues v;
    for (Eigen::VectorXd* x : {&v.biomass, &v.pb, &v.qb, &v.ee, &v.production, &v.consumption, &v.predation,
                               &v.flowToDetritus, &v.residual, &v.residualScale, &v.detritusInflow, &v.detritusEE,
                               &v.detritusExport})
        x->setZero(n);
    return v;
}

void BalancePlan::solve(const BalanceInputs& in, BalanceWorkspace& ws, BalanceValues& out) const
{
    const auto n = static_cast<Eigen::Index>(compartmentCount());
    const auto m = static_cast<Eigen::Index>(equationCount());
    const auto k = static_cast<Eigen::Index>(unknownCount());

    // 1. Given values, with P/Q standing in for P/B or Q/B.
    out.biomass = in.biomass;
    out.pb = in.pb;
    out.qb = in.qb;
    out.ee = in.ee;
    for (Eigen::Index i = 0; i < n; ++i) {
        const auto s = static_cast<std::size_t>(i);
        if (kinds_[s] != CompartmentKind::Consumer) out.qb[i] = 0.0;
        if (standIn_[s] == PqStandIn::PBFromPQ) out.pb[i] = in.pq[i] * in.qb[i];
        if (standIn_[s] == PqStandIn::QBFromPQ) out.qb[i] = in.pb[i] / in.pq[i];
    }

    // 2. Assemble A x = b, row r = living compartment i.
    // colGross tracks the largest term added into each column, so that entries which
    // cancel to rounding (e.g. P/B EE - Q/B DC_ii of a group eaten only by itself) are
    // recognised as zero before equilibration would blow them up.
    ws.a.setZero();
    ws.colGross.setZero();
    const auto add = [&ws](Eigen::Index r, int col, double term) {
        ws.a(r, col) += term;
        ws.colGross[col] = std::max(ws.colGross[col], std::abs(term));
    };
    for (Eigen::Index r = 0; r < m; ++r) {
        const std::size_t i = rowCompartment_[static_cast<std::size_t>(r)];
        const auto ii = static_cast<Eigen::Index>(i);
        double rhs = in.catchTotal[ii] + in.netEmigration[ii] + in.biomassAccum[ii];
        const int col = colOf_[i];
        switch (unknown_[i]) {
        case Unknown::None:
        case Unknown::QB: rhs -= out.biomass[ii] * out.pb[ii] * out.ee[ii]; break;
        case Unknown::Biomass: add(r, col, out.pb[ii] * out.ee[ii]); break;
        case Unknown::PB: add(r, col, out.biomass[ii] * out.ee[ii]); break;
        case Unknown::EE: add(r, col, out.biomass[ii] * out.pb[ii]); break;
        case Unknown::QBTiedPB: add(r, col, out.biomass[ii] * out.ee[ii] * in.pq[ii]); break;
        }
        for (std::size_t j : consumers_) {
            const auto jj = static_cast<Eigen::Index>(j);
            const double dc = in.diet(ii, jj);
            if (dc == 0.0) continue;
            switch (unknown_[j]) {
            case Unknown::Biomass: add(r, colOf_[j], -dc * out.qb[jj]); break;
            case Unknown::QB:
            case Unknown::QBTiedPB: add(r, colOf_[j], -dc * out.biomass[jj]); break;
            default: rhs += dc * out.biomass[jj] * out.qb[jj]; break;
            }
        }
        ws.b[r] = rhs;
    }

    // 3. Equilibrate, factorise, solve.
    out.status = NumericStatus::Solved;
    out.conditioning = 1.0;
    if (k > 0) {
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
        ws.rhsWork = ws.b.cwiseProduct(ws.rowScale);
        if (m == k) {
            ws.lu.compute(ws.a);
            out.conditioning = reciprocalConditionEstimate(ws);
            if (out.conditioning > kSingularConditioning) {
                ws.y = ws.lu.permutationP() * ws.rhsWork;
                ws.lu.matrixLU().triangularView<Eigen::UnitLower>().solveInPlace(ws.y);
                ws.lu.matrixLU().triangularView<Eigen::Upper>().solveInPlace(ws.y);
            }
        } else {
            ws.qr.compute(ws.a);
            const auto pivots = ws.qr.matrixR().diagonal().cwiseAbs();
            const double maxPivot = pivots.maxCoeff();
            out.conditioning = maxPivot > 0.0 ? pivots.minCoeff() / maxPivot : 0.0;
            if (out.conditioning > kSingularConditioning) {
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
            }
        }
        if (!(out.conditioning > kSingularConditioning)) {
            out.status = NumericStatus::Singular;
            return;
        }
        ws.x = ws.y.cwiseProduct(ws.colScale);
    }

    // 4. Write the unknowns back.
    for (Eigen::Index c = 0; c < k; ++c) {
        const std::size_t i = colCompartment_[static_cast<std::size_t>(c)];
        const auto ii = static_cast<Eigen::Index>(i);
        const double x = ws.x[c];
        switch (unknown_[i]) {
        case Unknown::Biomass: out.biomass[ii] = x; break;
        case Unknown::PB: out.pb[ii] = x; break;
        case Unknown::QB: out.qb[ii] = x; break;
        case Unknown::EE: out.ee[ii] = x; break;
        case Unknown::QBTiedPB:
            out.qb[ii] = x;
            out.pb[ii] = in.pq[ii] * x;
            break;
        case Unknown::None: break;
        }
    }

    // 5. Flows, residuals and detritus pools.
    for (Eigen::Index i = 0; i < n; ++i) {
        const bool living = isLiving(kinds_[static_cast<std::size_t>(i)]);
        out.production[i] = living ? out.biomass[i] * out.pb[i] : 0.0;
        out.consumption[i] = living ? out.biomass[i] * out.qb[i] : 0.0;
    }
    out.predation.noalias() = in.diet * out.consumption;
    for (Eigen::Index i = 0; i < n; ++i) {
        if (!isLiving(kinds_[static_cast<std::size_t>(i)])) {
            out.flowToDetritus[i] = out.residual[i] = out.residualScale[i] = 0.0;
            continue;
        }
        const double used = out.production[i] * out.ee[i];
        const double demand = out.predation[i] + in.catchTotal[i] + in.netEmigration[i] + in.biomassAccum[i];
        out.residual[i] = used - demand;
        out.residualScale[i] = std::max(std::abs(used), std::abs(demand));
        out.flowToDetritus[i] =
            (1.0 - out.ee[i]) * out.production[i] + in.unassim[i] * out.consumption[i] + in.deadDiscards[i];
    }
    out.detritusInflow.setZero();
    out.detritusEE.setZero();
    out.detritusExport.setZero();
    for (std::size_t d : pools_) {
        const auto dd = static_cast<Eigen::Index>(d);
        double inflow = in.detritusImport[dd];
        for (std::size_t s : rowCompartment_) {
            const auto ss = static_cast<Eigen::Index>(s);
            inflow += in.routing(ss, dd) * (out.flowToDetritus[ss] - in.deadDiscards[ss]) + in.discardsToPool(ss, dd);
        }
        out.detritusInflow[dd] = inflow;
        // EE_d is undefined without inflow unless nothing is eaten either.
        out.detritusEE[dd] = inflow > 0.0 ? out.predation[dd] / inflow : (out.predation[dd] != 0.0 ? kNaN : 0.0);
        out.detritusExport[dd] = inflow - out.predation[dd] - in.biomassAccum[dd];
        out.ee[dd] = out.detritusEE[dd];
    }
}

}  // namespace tl
