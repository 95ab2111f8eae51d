// Partial rank correlation coefficients (PRCC; Marino et al. 2008 J Theor Biol 254:178,
// section 4.2): how strongly each input drives an output over a sample of draws once the
// other inputs' (monotone) effects are taken out.
//
// For input j, with every column and the output replaced by its ranks (ties get the mean
// of the ranks they span, as scipy.stats.rankdata's "average"):
//   1. regress rank(x_j) on the other inputs' ranks (with an intercept) -> residual r_x;
//   2. regress rank(y)   on the same                                    -> residual r_y;
//   3. PRCC_j = Pearson correlation of r_x and r_y.
// The same number is -P_jy / sqrt(P_jj P_yy), P the inverse of the covariance matrix of
// the ranked [X y] (the partial correlation identity); that is how it is computed when the
// covariance is well conditioned (one factorisation for all inputs), and step by step
// (column-pivoted QR per input) when it is not.
//
// Undefined (NaN, with the reason) for a constant input column (no ranks to move; left
// out of the other inputs' regressions too), for every input when the output is constant,
// for an input the others determine exactly (residual r_x is 0), and for all when there
// are too few draws (fewer than the inputs kept + 3: no residual degrees of freedom left).
// Draws holding a value that is not finite (a draw that did not solve) are left out.
//
// Significance: a PRCC r of k kept inputs over N draws is tested as a partial correlation
// controlled for k - 1 variables, T = r sqrt(df / (1 - r^2)) with df = N - 2 - (k - 1)
// degrees of freedom, Student's t (the test Marino et al. 2008 give, recalled from memory;
// the standard test of a partial correlation), two-sided p-value.
#pragma once

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

#include <Eigen/Dense>

namespace tl {

enum class PrccNote : std::uint8_t { Defined, ConstantInput, ConstantOutput, Collinear, TooFewDraws };
const char* prccNoteKey(PrccNote note);  // "", "constant_input", "constant_output", "collinear", "too_few_draws"

struct PrccOptions {
    // Force the step-by-step regressions (the cross-check of the two computations).
    bool viaResiduals = false;
};

struct PrccResult {
    Eigen::VectorXd coefficient;  // one per input column; NaN where not defined
    Eigen::VectorXd pValue;       // two-sided, of the t test above; NaN where not defined
    std::vector<PrccNote> note;   // why, per input
    bool viaResiduals = false;    // which computation was used
    std::size_t draws = 0;        // draws used (finite rows)
    double degreesOfFreedom = 0.0;
};

// P(|T| >= |t|) for Student's t with df degrees of freedom (df > 0), through the
// regularized incomplete beta function I_x(df/2, 1/2) at x = df / (df + t^2), evaluated
// by its continued fraction (modified Lentz method).
double studentTwoSidedP(double t, double df);

// Mid-ranks 1..n, ties averaged.
Eigen::VectorXd averageRanks(const Eigen::Ref<const Eigen::VectorXd>& values);

// draws: one row per draw, one column per input; output: one value per draw.
PrccResult partialRankCorrelation(const Eigen::MatrixXd& draws, const Eigen::VectorXd& output,
                                  const PrccOptions& options = {});

// PRCC of every output column against the input columns of one set of draws, with their
// names: the form of the ensemble's kept draws (rows = draws, names "C.pb", "C.diet:PREY",
// "C.ee", ...), which `tledger sensitivity --prcc` will pass here once the ensemble exists.
struct PrccTable {
    std::vector<std::string> inputNames, outputNames;
    std::vector<PrccResult> outputs;  // one per output column
};
PrccTable prccTable(const std::vector<std::string>& inputNames, const Eigen::MatrixXd& inputs,
                    const std::vector<std::string>& outputNames, const Eigen::MatrixXd& outputs);

}  // namespace tl
