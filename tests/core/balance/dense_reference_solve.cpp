// The full dense solve (see dense_reference_solve.h): the numeric step and the singular
// report of the solver as it stood before the structured rewrite.
#include "tests/core/balance/dense_reference_solve.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <Eigen/SVD>

namespace tl::testing {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

double unitScale(const auto& v)
{
    const double m = v.cwiseAbs().maxCoeff();
    return m > 0.0 ? 1.0 / m : 1.0;
}

}  // namespace

DenseReference denseReferenceSolve(const Model& model, const BalancePlan& plan)
{
    const BalanceInputs in = BalanceInputs::fromModel(model);
    const Eigen::MatrixXd diet = in.diet, routing = in.routing, discardsToPool = in.discardsToPool;
    const auto n = static_cast<Eigen::Index>(plan.compartmentCount());
    const auto m = static_cast<Eigen::Index>(plan.equationCount());
    const auto k = static_cast<Eigen::Index>(plan.unknownCount());
    DenseReference ref;
    BalanceValues& out = ref.values;
    out = plan.makeValues();
    std::vector<std::size_t> consumers;
    for (std::size_t i = 0; i < model.size(); ++i)
        if (model.compartment(i).kind == CompartmentKind::Consumer) consumers.push_back(i);

    out.biomass = in.biomass;
    out.pb = in.pb;
    out.qb = in.qb;
    out.ee = in.ee;
    for (Eigen::Index i = 0; i < n; ++i) {
        const auto s = static_cast<std::size_t>(i);
        if (model.compartment(s).kind != CompartmentKind::Consumer) out.qb[i] = 0.0;
        if (plan.pqStandInOf(s) == PqStandIn::PBFromPQ) out.pb[i] = in.pq[i] * in.qb[i];
        if (plan.pqStandInOf(s) == PqStandIn::QBFromPQ) out.qb[i] = in.pb[i] / in.pq[i];
    }

    Eigen::MatrixXd a = Eigen::MatrixXd::Zero(m, k);
    Eigen::VectorXd b = Eigen::VectorXd::Zero(m), colGross = Eigen::VectorXd::Zero(k);
    const auto add = [&](Eigen::Index r, int col, double term) {
        a(r, col) += term;
        colGross[col] = std::max(colGross[col], std::abs(term));
    };
    for (Eigen::Index r = 0; r < m; ++r) {
        const std::size_t i = plan.compartmentOfRow(static_cast<std::size_t>(r));
        const auto ii = static_cast<Eigen::Index>(i);
        double rhs = in.catchTotal[ii] + in.netEmigration[ii] + in.biomassAccum[ii];
        const int col = plan.columnOf(i);
        switch (plan.unknownOf(i)) {
        case Unknown::None:
        case Unknown::QB: rhs -= out.biomass[ii] * out.pb[ii] * out.ee[ii]; break;
        case Unknown::Biomass: add(r, col, out.pb[ii] * out.ee[ii]); break;
        case Unknown::PB: add(r, col, out.biomass[ii] * out.ee[ii]); break;
        case Unknown::EE: add(r, col, out.biomass[ii] * out.pb[ii]); break;
        case Unknown::QBTiedPB: add(r, col, out.biomass[ii] * out.ee[ii] * in.pq[ii]); break;
        }
        for (std::size_t j : consumers) {
            const auto jj = static_cast<Eigen::Index>(j);
            const double dc = diet(ii, jj);
            if (dc == 0.0) continue;
            switch (plan.unknownOf(j)) {
            case Unknown::Biomass: add(r, plan.columnOf(j), -dc * out.qb[jj]); break;
            case Unknown::QB:
            case Unknown::QBTiedPB: add(r, plan.columnOf(j), -dc * out.biomass[jj]); break;
            default: rhs += dc * out.biomass[jj] * out.qb[jj]; break;
            }
        }
        b[r] = rhs;
    }

    out.status = NumericStatus::Solved;
    out.conditioning = 1.0;
    Eigen::VectorXd x = Eigen::VectorXd::Zero(k);
    if (k > 0) {
        Eigen::VectorXd colScale(k), rowScale(m);
        for (Eigen::Index c = 0; c < k; ++c) {
            const double residue = BalancePlan::kCancellationResidue * colGross[c];
            for (Eigen::Index r = 0; r < m; ++r)
                if (std::abs(a(r, c)) <= residue) a(r, c) = 0.0;
            colScale[c] = unitScale(a.col(c));
            a.col(c) *= colScale[c];
        }
        for (Eigen::Index r = 0; r < m; ++r) {
            rowScale[r] = unitScale(a.row(r));
            a.row(r) *= rowScale[r];
        }
        const Eigen::VectorXd rhs = b.cwiseProduct(rowScale);
        Eigen::VectorXd y;
        if (m == k) {
            const Eigen::PartialPivLU<Eigen::MatrixXd> lu(a);
            const bool zeroPivot = !(lu.matrixLU().diagonal().cwiseAbs().minCoeff() > 0.0);
            out.conditioning = zeroPivot ? 0.0 : lu.rcond();  // LAPACK-style estimate, as before
            y = lu.solve(rhs);
        } else {
            const Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(a);
            const auto pivots = qr.matrixR().diagonal().cwiseAbs();
            out.conditioning = pivots.maxCoeff() > 0.0 ? pivots.minCoeff() / pivots.maxCoeff() : 0.0;
            y = qr.solve(rhs);
        }
        if (!(out.conditioning > BalancePlan::kSingularConditioning)) {
            out.status = NumericStatus::Singular;
            Eigen::JacobiSVD<Eigen::MatrixXd> svd(a, Eigen::ComputeFullV);
            const Eigen::VectorXd& sigma = svd.singularValues();
            const double tol = BalancePlan::kSingularConditioning * 1e3 * (sigma.size() ? sigma[0] : 0.0);
            for (Eigen::Index s = 0; s < k; ++s) {
                if (s < sigma.size() && sigma[s] > tol) continue;
                for (Eigen::Index c = 0; c < k; ++c)
                    if (std::abs(svd.matrixV()(c, s)) > 1e-6)
                        ref.singularInvolved.insert(plan.compartmentOfColumn(static_cast<std::size_t>(c)));
            }
            if (m == k)
                for (Eigen::Index r = 0; r < m; ++r)
                    if (a.row(r).cwiseAbs().maxCoeff() == 0.0)
                        ref.singularInvolved.insert(plan.compartmentOfRow(static_cast<std::size_t>(r)));
            return ref;
        }
        x = y.cwiseProduct(colScale);
    }

    for (Eigen::Index c = 0; c < k; ++c) {
        const std::size_t i = plan.compartmentOfColumn(static_cast<std::size_t>(c));
        const auto ii = static_cast<Eigen::Index>(i);
        switch (plan.unknownOf(i)) {
        case Unknown::Biomass: out.biomass[ii] = x[c]; break;
        case Unknown::PB: out.pb[ii] = x[c]; break;
        case Unknown::QB: out.qb[ii] = x[c]; break;
        case Unknown::EE: out.ee[ii] = x[c]; break;
        case Unknown::QBTiedPB:
            out.qb[ii] = x[c];
            out.pb[ii] = in.pq[ii] * x[c];
            break;
        case Unknown::None: break;
        }
    }
    for (Eigen::Index i = 0; i < n; ++i) {
        const bool living = model.compartment(static_cast<std::size_t>(i)).isLiving();
        out.production[i] = living ? out.biomass[i] * out.pb[i] : 0.0;
        out.consumption[i] = living ? out.biomass[i] * out.qb[i] : 0.0;
    }
    out.predation = diet * out.consumption;
    for (Eigen::Index i = 0; i < n; ++i) {
        if (!model.compartment(static_cast<std::size_t>(i)).isLiving()) continue;
        const double used = out.production[i] * out.ee[i];
        const double demand = out.predation[i] + in.catchTotal[i] + in.netEmigration[i] + in.biomassAccum[i];
        out.residual[i] = used - demand;
        out.residualScale[i] = std::max(std::abs(used), std::abs(demand));
        out.flowToDetritus[i] =
            (1.0 - out.ee[i]) * out.production[i] + in.unassim[i] * out.consumption[i] + in.deadDiscards[i];
    }
    for (std::size_t d : plan.pools()) {
        const auto dd = static_cast<Eigen::Index>(d);
        double inflow = in.detritusImport[dd];
        for (Eigen::Index s = 0; s < n; ++s)
            if (model.compartment(static_cast<std::size_t>(s)).isLiving())
                inflow += routing(s, dd) * (out.flowToDetritus[s] - in.deadDiscards[s]) + discardsToPool(s, dd);
        out.detritusInflow[dd] = inflow;
        out.detritusEE[dd] = inflow > 0.0 ? out.predation[dd] / inflow : (out.predation[dd] != 0.0 ? kNaN : 0.0);
        out.detritusExport[dd] = inflow - out.predation[dd] - in.biomassAccum[dd];
        out.ee[dd] = out.detritusEE[dd];
    }
    return ref;
}

}  // namespace tl::testing
