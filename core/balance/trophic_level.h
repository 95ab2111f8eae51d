// Effective trophic level and omnivory index of every compartment (DESIGN.md 3.3).
//
//   TL_j = 1                               for producers and detritus pools;
//   TL_j = 1 + sum_i DC'_ij TL_i            for consumers,
//   OI_j = sum_i (TL_i - (TL_j - 1))^2 DC'_ij   (omnivory index, Pauly et al. 1993),
//
// with DC'_ij = DC_ij / sum_k DC_kj the diet renormalised without `import`. The
// consumers' levels solve one linear system (I - DC'^T) TL = 1 + basal terms, not a
// fixed-point iteration: its blocks are the strongly connected components of the
// feeding graph (Tarjan 1972 SIAM J Comput 1:146), solved prey before predator, so a
// web without loops is plain substitution and each feeding loop a small dense LU.
// The cost is linear in the diet entries plus the cube of the largest loop. This is the same quantity as networkx's
// trophic_levels on the weighted diet graph (prey -> predator), producers and pools
// being the nodes without food.
//
// Two cases the equation leaves open, handled explicitly (this project's choices):
//  - a consumer with no modelled prey (all-import or empty diet): its food comes from
//    outside, treated as basal food of TL 1, so TL = 2 and OI = 0 (NoModelledPrey);
//  - a consumer whose food chains never reach a producer, pool or such a consumer (a
//    closed feeding loop, e.g. two groups eating only each other) has no finite level,
//    nor has anything that eats it: TL and OI are NaN (Undefined).
#pragma once

#include <cstdint>
#include <vector>

#include <Eigen/Dense>

#include "core/balance/sparse_columns.h"
#include "core/model/model.h"
#include "core/model/strong_components.h"

namespace tl {

enum class TrophicLevelNote : std::uint8_t { Basal, Computed, NoModelledPrey, Undefined };

struct TrophicLevels {
    Eigen::VectorXd tl;  // per compartment
    Eigen::VectorXd oi;
    std::vector<TrophicLevelNote> note;
};

// The work buffers of one computation, kept by a caller that computes again and again
// (BalanceScratch, the ensemble): a later call of the same size allocates nothing
// unless it meets a feeding loop larger than any before. The feeding loops found by the
// last call (prey first, each with its verdict) are reused while the diet's pattern and
// the fixed nodes stay the same, as between an ensemble's draws or after a value edit.
struct TrophicLevelScratch {
    SparseColumns share;  // renormalised diet; fixed columns empty
    std::vector<char> fixed, consumers, grounded, undefined;
    std::vector<int> local;  // position in the current loop, or -1
    StrongComponentBuffers components;
    Eigen::MatrixXd loopMatrix;
    Eigen::VectorXd loopRhs, loopLevels;
    // The structure the loops were found on: share's outer and inner indices, fixed nodes.
    std::vector<int> loopsPattern;
    std::vector<char> loopsFixed;
    bool loopsKnown = false;
    // The loops in solving order: members of loop c are loopMembers[loopStart[c] ..
    // loopStart[c + 1]); loopUndefined[c] when its levels are undefined.
    std::vector<int> loopStart, loopMembers;
    std::vector<char> loopUndefined;
};

// diet(prey, predator) = fraction of prey in predator's diet, import excluded (columns
// are renormalised here, so flows work as well as fractions). basal[i] marks
// producers and detritus pools.
TrophicLevels computeTrophicLevels(const SparseColumns& diet, const std::vector<bool>& basal);
TrophicLevels computeTrophicLevels(const Eigen::MatrixXd& diet, const std::vector<bool>& basal);
// The same into `out`, reusing the storage of `out` and `scratch`.
void computeTrophicLevels(const SparseColumns& diet, const std::vector<bool>& basal, TrophicLevelScratch& scratch,
                          TrophicLevels& out);

// From a model's diet matrix; producers and detritus pools are basal.
TrophicLevels computeTrophicLevels(const Model& model);

}  // namespace tl
