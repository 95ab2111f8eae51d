// BalancePlan: the structural and numeric steps of the mass-balance solve
// (Polovina 1984; Christensen & Pauly 1992), DESIGN.md 3.2. For each living i:
//
//   B_i (P/B)_i EE_i - sum_j B_j (Q/B)_j DC_ij = Y_i + E_i + BA_i
//
// With at most one unknown per compartment, the unknowns enter linearly. Their
// structure is what makes the solve fast:
//   - an unknown EE_i or P/B_i ("private") appears in row i only, with coefficient
//     B_i P/B_i or B_i EE_i; it is filled by back-substitution once the predators'
//     consumption is known;
//   - an unknown B_j, Q/B_j, or Q/B_j tied to P/B_j by P/Q ("coupled") appears in row j
//     (own production) and in the rows of j's prey (its consumption), so only these
//     couple equations, through the diet links.
// Permuting private rows and columns first makes A block upper triangular,
//   [ D  C1 ] [x_private]   [b1]
//   [ 0  C2 ] [x_coupled] = [b2],   D diagonal,
// so the plan builds the reduced system C2 y = b2 over the coupled unknowns alone (rows:
// the equations of compartments without a private unknown that involve a coupled one),
// solves it, then x_private = (b1 - C1 y) / D. A model whose unknowns are all EE or P/B
// needs no factorisation. C2 is equilibrated (rows and columns scaled to unit max norm)
// and, by size and shape:
//   square, small:        dense partial-pivot LU; conditioning by the Hager-Higham
//                         estimate of 1 / cond_1 (Hager 1984 SIAM J Sci Stat Comput 5:311;
//                         Higham 1988 ACM TOMS 14:381), computed without allocation;
//   more rows, small:     dense column-pivoted Householder QR least squares (conditioning
//                         |r_kk| min / max); every equation's residual is then reported;
//   large (> kDenseLimit coupled unknowns): Eigen's SparseLU or SparseQR with COLAMD
//                         ordering; the pattern is analysed once in makeWorkspace.
// The numeric step allocates nothing on the dense paths once ws and out come from the
// plan (balance_plan_no_alloc_test); the sparse factorisations allocate internally.
#pragma once

#include <cstddef>
#include <cstdint>
#include <memory>
#include <vector>

#include <Eigen/Dense>
#include <Eigen/SparseLU>
#include <Eigen/SparseQR>

#include "core/balance/sparse_columns.h"
#include "core/balance/trophic_level.h"
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
// Compartment::unassimilatedOrDefault, missing catch/E/BA/import as 0). The sparse
// matrices keep the model's pattern: a caller that perturbs them (the ensemble) changes
// values in place and never adds an entry the model does not have.
struct BalanceInputs {
    Eigen::VectorXd biomass, pb, qb, ee, pq;
    Eigen::VectorXd unassim;         // U
    Eigen::VectorXd catchTotal;      // Y = landings + dead discards (Model::totalCatch)
    Eigen::VectorXd deadDiscards;    // part of Y that goes to detritus
    Eigen::VectorXd netEmigration;   // E
    Eigen::VectorXd biomassAccum;    // BA (absolute, per year)
    Eigen::VectorXd detritusImport;  // import into a pool
    SparseColumns diet;              // diet(prey, predator) = DC; import excluded
    SparseColumns routing;           // routing(source, pool) = share of source's detritus flow
    SparseColumns discardsToPool;    // discardsToPool(source, pool) = dead discards of source into pool

    static BalanceInputs fromModel(const Model& model);
    // The same into this object, reusing its storage when the sizes are unchanged.
    void assign(const Model& model);
    std::size_t size() const { return static_cast<std::size_t>(biomass.size()); }

private:
    // Work buffers of assign, kept so that assigning again allocates nothing.
    std::vector<int> routingCursor_;
    std::vector<std::size_t> discardPool_;
    std::vector<double> deadToPool_;
};

enum class NumericStatus : std::uint8_t { Solved, Singular };

// Everything the numeric step writes. Sized by BalancePlan::makeValues.
struct BalanceValues {
    NumericStatus status = NumericStatus::Solved;
    // Conditioning of the equilibrated reduced system: LU, estimate of 1 / cond_1;
    // QR, min |r_kk| / max |r_kk|. 1 when no unknown couples equations, 0 when exactly
    // singular (including a private unknown whose coefficient is 0).
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
    // Reduced system C2 y = b2 over the coupled unknowns (rows: BalancePlan::reducedRows).
    Eigen::MatrixXd a;               // dense paths; equilibrated after a step
    SparseColumns sparseA;           // sparse path; pattern fixed by the plan
    Eigen::VectorXd b, x, y;
    Eigen::VectorXd rowScale, colScale;
    Eigen::VectorXd colGross;        // largest term added into each column
    Eigen::VectorXd rhsWork;         // permuted / rotated right-hand side
    Eigen::VectorXd estimateX, estimateY, estimateZ, estimateW;  // condition estimate iterates
    Eigen::PartialPivLU<Eigen::MatrixXd> lu;              // square, dense
    Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr;       // overdetermined, dense
    // Sparse factorisations (pattern analysed once); shared_ptr keeps the workspace movable.
    std::shared_ptr<Eigen::SparseLU<SparseColumns, Eigen::COLAMDOrdering<int>>> sparseLu;
    std::shared_ptr<Eigen::SparseQR<SparseColumns, Eigen::COLAMDOrdering<int>>> sparseQr;
};

class BalancePlan {
public:
    enum class Method : std::uint8_t { None, DenseLU, DenseQR, SparseLU, SparseQR };

    // Decides the unknown of every living compartment and the layout of the reduced
    // system; structural problems (two or more unknowns, no detritus pool, ignored
    // routing) go to problems().
    static BalancePlan build(const Model& model);
    // The same into this plan, reusing its storage (BalanceScratch).
    void rebuild(const Model& model);

    BalanceWorkspace makeWorkspace() const;
    BalanceValues makeValues() const;
    // Size an existing workspace or values for this plan; storage of the right size is
    // kept (a sparse workspace is always analysed anew: its pattern may differ).
    void sizeWorkspace(BalanceWorkspace& ws) const;
    void sizeValues(BalanceValues& values) const;

    // Numeric step. Requires !hasStructuralErrors() and inputs of size
    // compartmentCount() with the model's diet pattern. No heap allocation on the dense
    // paths once ws and out come from this plan.
    void solve(const BalanceInputs& in, BalanceWorkspace& ws, BalanceValues& out) const;

    std::size_t compartmentCount() const { return slots_.size(); }
    // The full system (one row per living compartment, one column per unknown), as
    // the equations are written; the solve works on its reduced form.
    std::size_t equationCount() const { return rowCompartment_.size(); }
    std::size_t unknownCount() const { return colCompartment_.size(); }
    Unknown unknownOf(std::size_t compartment) const { return slots_[compartment].unknown; }
    PqStandIn pqStandInOf(std::size_t compartment) const { return slots_[compartment].standIn; }
    // Equation row / unknown column of a compartment in the full system, or -1.
    int rowOf(std::size_t compartment) const { return slots_[compartment].row; }
    int columnOf(std::size_t compartment) const { return slots_[compartment].column; }
    std::size_t compartmentOfColumn(std::size_t col) const { return colCompartment_[col]; }
    std::size_t compartmentOfRow(std::size_t row) const { return rowCompartment_[row]; }
    const std::vector<std::size_t>& pools() const { return pools_; }

    // The reduced system: its unknowns (compartments with a coupled unknown), its rows
    // (compartments without a private unknown whose equation involves a coupled one),
    // and the equations of compartments without a private unknown that involve none
    // (pure checks; they make the full system non-square).
    const std::vector<std::size_t>& coupledUnknowns() const { return coupled_; }
    const std::vector<std::size_t>& reducedRows() const { return reducedRows_; }
    const std::vector<std::size_t>& privateUnknowns() const { return private_; }
    std::size_t uncoupledCheckCount() const { return uncoupledChecks_; }
    int reducedRowOf(std::size_t compartment) const { return slots_[compartment].reducedRow; }
    int reducedColumnOf(std::size_t compartment) const { return slots_[compartment].reducedColumn; }
    bool fullSystemIsSquare() const { return equationCount() == unknownCount(); }
    Method method() const { return method_; }

    const Problems& problems() const { return problems_; }
    bool hasStructuralErrors() const { return hasErrors(problems_); }

    // Conditioning at or below this means the equilibrated system is (numerically)
    // singular: solved values would carry relative errors of 1e-4 or worse (this
    // project's choice). After a Singular step, ws.a / ws.sparseA hold the equilibrated C2.
    static constexpr double kSingularConditioning = 1e-12;
    // An entry of A at or below this share of the largest term summed into its column
    // is cancellation residue and counts as 0 (about 450 machine epsilons).
    static constexpr double kCancellationResidue = 1e-13;
    // Above this many coupled unknowns the reduced system is factorised sparse (the
    // crossover measured by tests/bench; this project's choice).
    static constexpr std::size_t kDenseLimit = 120;

private:
    void assembleReduced(const BalanceInputs& in, const BalanceValues& out, BalanceWorkspace& ws) const;
    bool solveReduced(BalanceWorkspace& ws, BalanceValues& out) const;
    void backSubstitute(const BalanceInputs& in, BalanceValues& out) const;
    void completeFlows(const BalanceInputs& in, BalanceValues& out) const;

    // What the plan decided for one compartment (one record each: a small model's
    // plan is mostly bookkeeping, and one vector is one allocation).
    struct Slot {
        CompartmentKind kind = CompartmentKind::Consumer;
        Unknown unknown = Unknown::None;
        PqStandIn standIn = PqStandIn::None;
        int row = -1, column = -1;                // in the full system, or -1
        int reducedRow = -1, reducedColumn = -1;  // in the reduced system, or -1
    };
    std::vector<Slot> slots_;
    std::vector<std::size_t> rowCompartment_, colCompartment_;  // rows: the living compartments, in order
    std::vector<std::size_t> pools_;
    // Reduced system.
    std::vector<std::size_t> coupled_, reducedRows_, private_;
    std::size_t uncoupledChecks_ = 0;
    Method method_ = Method::None;
    SparseColumns pattern_;  // structure of C2 (values unused), for the sparse path
    Problems problems_;
    std::vector<char> entered_;  // work buffer of rebuild
};

// The buffers of one solveBalance (plan, numeric inputs, workspace, values, trophic
// levels), kept by a caller that solves again and again (reconcile's fits, re-solving
// after each edit): a later solveBalance(model, scratch) on a model of the same size
// reuses their storage instead of allocating it. Holds nothing a result refers to; one
// per thread.
struct BalanceScratch {
    BalancePlan plan;
    BalanceInputs inputs;
    BalanceWorkspace workspace;
    BalanceValues values;
    std::vector<bool> basal;  // producers and pools: the fixed nodes of the trophic levels
    TrophicLevelScratch levelWork;
    TrophicLevels levels;
};

}  // namespace tl
