// BalancePlan: the structural and numeric steps of the mass-balance solve
// (Polovina 1984; Christensen & Pauly 1992), DESIGN.md 3.2. For each living i:
//
//   B_i (P/B)_i EE_i - sum_j B_j (Q/B)_j DC_ij = Y_i + E_i + BA_i
//
// With at most one unknown x_i among B, P/B, Q/B, EE per compartment, both sides are
// linear in the unknowns: x_i enters row i through the production term (coefficient
// P/B EE, B EE or B P/B) and the rows of i's prey through its consumption (coefficient
// -DC_ki Q/B or -DC_ki B). The plan fixes which value is unknown where and the sizes;
// the numeric step fills A x = b from a flat BalanceInputs, equilibrates it (rows and
// columns scaled to unit max norm), factorises it and writes every completed value
// and derived flow into a BalanceValues, without heap allocation.
//   square system:       partial-pivot LU, its conditioning checked by the Hager-Higham
//                         estimate of 1 / cond_1 (Hager 1984 SIAM J Sci Stat Comput 5:311;
//                         Higham 1988 ACM TOMS 14:381), computed without allocation;
//   more rows than unknowns (some compartments fully given): column-pivoted Householder
//                         QR least squares (rank-revealing: |r_kk| min / max), then every
//                         equation's residual is reported.
#pragma once

#include <cstddef>
#include <cstdint>
#include <vector>

#include <Eigen/Dense>

#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl {

// Which of a living compartment's values the solve determines.
enum class Unknown : std::uint8_t {
    None,      // fully given: its equation is a check
    Biomass,
    PB,
    QB,
    EE,
    QBTiedPB   // both P/B and Q/B missing, P/Q given: unknown Q/B, P/B = P/Q Q/B
};

// How P/Q completes P/B or Q/B before the solve (DESIGN 3.2: P/Q may stand in).
enum class PqStandIn : std::uint8_t { None, PBFromPQ, QBFromPQ };

// Flat numeric inputs, indexed by compartment. NaN where a value is not given; the
// plan decides which entries are read. Defaults are applied by fromModel (U per
// Compartment::unassimilatedOrDefault, missing catch/E/BA/import as 0).
struct BalanceInputs {
    Eigen::VectorXd biomass, pb, qb, ee, pq;
    Eigen::VectorXd unassim;         // U
    Eigen::VectorXd catchTotal;      // Y = landings + dead discards (Model::totalCatch)
    Eigen::VectorXd deadDiscards;    // part of Y that goes to detritus
    Eigen::VectorXd netEmigration;   // E
    Eigen::VectorXd biomassAccum;    // BA (absolute, per year)
    Eigen::VectorXd detritusImport;  // import into a pool
    Eigen::MatrixXd diet;            // diet(prey, predator) = DC; import excluded
    Eigen::MatrixXd routing;         // routing(source, pool) = share of source's detritus flow
    Eigen::MatrixXd discardsToPool;  // discardsToPool(source, pool) = dead discards of source into pool

    static BalanceInputs fromModel(const Model& model);
    std::size_t size() const { return static_cast<std::size_t>(biomass.size()); }
};

enum class NumericStatus : std::uint8_t { Solved, Singular };

// Everything the numeric step writes. Sized by BalancePlan::makeValues.
struct BalanceValues {
    NumericStatus status = NumericStatus::Solved;
    // Conditioning of the equilibrated A: LU, estimate of 1 / cond_1(A); QR, min |r_kk| /
    // max |r_kk|. 1 when nothing is unknown, 0 when exactly singular.
    double conditioning = 1.0;

    // Completed inputs (given, from P/Q, or solved). Q/B is 0 for producers and pools.
    Eigen::VectorXd biomass, pb, qb, ee;
    // Flows, per year in the model's currency.
    Eigen::VectorXd production;      // P = B P/B (0 for pools)
    Eigen::VectorXd consumption;     // Q = B Q/B (0 for producers and pools)
    Eigen::VectorXd predation;       // sum_j DC_ij Q_j (for pools: their consumption)
    Eigen::VectorXd flowToDetritus;  // (1-EE)P + U Q + dead discards (0 for pools)
    Eigen::VectorXd residual;        // B P/B EE - (predation + Y + E + BA); 0 for pools
    Eigen::VectorXd residualScale;   // max(|B P/B EE|, |predation + Y + E + BA|)
    // Detritus pools (0 elsewhere): inflow, EE_d = consumption / inflow, export.
    Eigen::VectorXd detritusInflow, detritusEE, detritusExport;
};

// Preallocated matrices and decompositions for the numeric step.
struct BalanceWorkspace {
    Eigen::MatrixXd a;               // rows = living equations, cols = unknowns
    Eigen::VectorXd b, x, y;
    Eigen::VectorXd rowScale, colScale;
    Eigen::VectorXd colGross;        // largest term added into each column
    Eigen::VectorXd rhsWork;         // permuted / rotated right-hand side
    Eigen::VectorXd estimateX, estimateY, estimateZ;  // condition estimate iterates
    Eigen::PartialPivLU<Eigen::MatrixXd> lu;              // square systems
    Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr;       // overdetermined systems
};

class BalancePlan {
public:
    // Decides the unknown of every living compartment; structural problems (two or
    // more unknowns, no detritus pool, ignored routing) go to problems().
    static BalancePlan build(const Model& model);

    BalanceWorkspace makeWorkspace() const;
    BalanceValues makeValues() const;

    // Numeric step: no heap allocation once ws and out come from this plan.
    // Requires !hasStructuralErrors() and inputs of size compartmentCount().
    void solve(const BalanceInputs& in, BalanceWorkspace& ws, BalanceValues& out) const;

    std::size_t compartmentCount() const { return kinds_.size(); }
    std::size_t equationCount() const { return rowCompartment_.size(); }
    std::size_t unknownCount() const { return colCompartment_.size(); }
    Unknown unknownOf(std::size_t compartment) const { return unknown_[compartment]; }
    PqStandIn pqStandInOf(std::size_t compartment) const { return standIn_[compartment]; }
    // Equation row / unknown column of a compartment, or -1.
    int rowOf(std::size_t compartment) const { return rowOf_[compartment]; }
    int columnOf(std::size_t compartment) const { return colOf_[compartment]; }
    std::size_t compartmentOfColumn(std::size_t col) const { return colCompartment_[col]; }
    std::size_t compartmentOfRow(std::size_t row) const { return rowCompartment_[row]; }
    const std::vector<std::size_t>& pools() const { return pools_; }

    const Problems& problems() const { return problems_; }
    bool hasStructuralErrors() const { return hasErrors(problems_); }

    // Conditioning at or below this means the equilibrated system is (numerically)
    // singular: solved values would carry relative errors of 1e-4 or worse (this
    // project's choice). After a Singular step, ws.a holds the equilibrated A.
    static constexpr double kSingularConditioning = 1e-12;
    // An entry of A at or below this share of the largest term summed into its column
    // is cancellation residue and counts as 0 (about 450 machine epsilons).
    static constexpr double kCancellationResidue = 1e-13;

private:
    std::vector<CompartmentKind> kinds_;
    std::vector<Unknown> unknown_;
    std::vector<PqStandIn> standIn_;
    std::vector<int> rowOf_, colOf_;
    std::vector<std::size_t> rowCompartment_, colCompartment_;
    std::vector<std::size_t> consumers_, pools_;
    Problems problems_;
};

}  // namespace tl
