// Effective trophic level and omnivory index (Pauly et al. 1993); see trophic_level.h.
#include "core/balance/trophic_level.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <span>

#include <Eigen/SparseLU>

#include "core/model/strong_components.h"

namespace tl {
namespace {

// Feeding loops up to this size are solved dense, larger ones with a sparse LU.
constexpr Eigen::Index kDenseBlock = 48;

// One feeding loop (strongly connected component) of consumers, all of whose outside
// prey already have their level: TL_j - sum_{i in loop} DC'_ij TL_i = 1 + sum_{i outside} DC'_ij TL_i.
void solveLoop(const SparseColumns& share, std::span<const int> members, TrophicLevelScratch& scratch,
               Eigen::VectorXd& tl)
{
    std::vector<int>& local = scratch.local;
    const auto k = static_cast<Eigen::Index>(members.size());
    for (Eigen::Index r = 0; r < k; ++r) local[static_cast<std::size_t>(members[static_cast<std::size_t>(r)])] = static_cast<int>(r);
    // Row r: the loop's entries go to a(r, c) (through addInLoop), the outside prey to b.
    Eigen::VectorXd& b = scratch.loopRhs;
    b.setOnes(k);
    const auto assemble = [&](auto addInLoop) {
        for (Eigen::Index r = 0; r < k; ++r) {
            addInLoop(static_cast<int>(r), static_cast<int>(r), 1.0);
            for (SparseColumns::InnerIterator it(share, members[static_cast<std::size_t>(r)]); it; ++it) {
                const int c = local[static_cast<std::size_t>(it.index())];
                if (c >= 0) addInLoop(static_cast<int>(r), c, -it.value());
                else b[r] += it.value() * tl[it.index()];
            }
        }
    };
    // Nonsingular: every chain reaches a fixed node. Small loops dense, large sparse.
    Eigen::VectorXd& levels = scratch.loopLevels;
    if (k <= kDenseBlock) {
        Eigen::MatrixXd& a = scratch.loopMatrix;
        a.setZero(k, k);
        assemble([&a](int r, int c, double v) { a(r, c) += v; });
        levels = a.partialPivLu().solve(b);
    } else {
        std::vector<Eigen::Triplet<double, int>> entries;
        assemble([&entries](int r, int c, double v) { entries.emplace_back(r, c, v); });
        SparseColumns a(k, k);
        a.setFromTriplets(entries.begin(), entries.end());
        Eigen::SparseLU<SparseColumns, Eigen::COLAMDOrdering<int>> lu(a);
        levels = lu.solve(b);
    }
    for (Eigen::Index r = 0; r < k; ++r) {
        tl[members[static_cast<std::size_t>(r)]] = levels[r];
        local[static_cast<std::size_t>(members[static_cast<std::size_t>(r)])] = -1;
    }
}

// Whether the loops recorded in scratch were found on the current share and fixed nodes.
bool loopsStillApply(const TrophicLevelScratch& scratch)
{
    if (!scratch.loopsKnown || scratch.loopsFixed != scratch.fixed) return false;
    const SparseColumns& share = scratch.share;
    const auto outerCount = static_cast<std::size_t>(share.cols()) + 1;
    const auto innerCount = static_cast<std::size_t>(share.nonZeros());
    const std::vector<int>& pattern = scratch.loopsPattern;
    return pattern.size() == outerCount + innerCount &&
           std::equal(pattern.begin(), pattern.begin() + static_cast<std::ptrdiff_t>(outerCount), share.outerIndexPtr()) &&
           std::equal(pattern.begin() + static_cast<std::ptrdiff_t>(outerCount), pattern.end(), share.innerIndexPtr());
}

// Records the feeding loops (strongly connected components) of the consumers in
// scratch.share, in the order Tarjan's algorithm (without recursion) emits them: each
// after everything its members eat. Loop by loop, one pass decides:
//   grounded  = some member eats a fixed or grounded node outside the loop (a food
//               chain reaches a producer, pool or import-only consumer);
//   undefined = not grounded, or some member eats an undefined node outside the loop.
void findLoops(TrophicLevelScratch& scratch)
{
    const SparseColumns& share = scratch.share;
    const auto n = static_cast<int>(share.cols());
    const auto sn = static_cast<std::size_t>(n);
    const int* outer = share.outerIndexPtr();
    const int* inner = share.innerIndexPtr();
    std::vector<char>& consumers = scratch.consumers;
    std::vector<char>& grounded = scratch.grounded;
    std::vector<char>& undefined = scratch.undefined;
    consumers.resize(sn);
    grounded.resize(sn);
    undefined.assign(sn, 0);
    for (std::size_t j = 0; j < sn; ++j) {
        consumers[j] = !scratch.fixed[j];
        grounded[j] = scratch.fixed[j];
    }
    scratch.loopsKnown = false;  // until the loops below are complete
    scratch.loopStart.assign(1, 0);
    scratch.loopMembers.clear();
    scratch.loopUndefined.clear();
    scratch.loopStart.reserve(sn + 1);
    scratch.loopMembers.reserve(sn);
    scratch.loopUndefined.reserve(sn);
    forEachStrongComponent(
        n, consumers, [&](int v) { return outer[v + 1] - outer[v]; }, [&](int v, int k) { return inner[outer[v] + k]; },
        [&](std::span<const int> members) {
            bool isGrounded = false, eatsUndefined = false;
            for (int m : members)
                for (int e = outer[m]; e < outer[m + 1]; ++e) {
                    // Members are neither grounded nor undefined yet; outside prey are final.
                    const auto prey = static_cast<std::size_t>(inner[e]);
                    isGrounded = isGrounded || grounded[prey];
                    eatsUndefined = eatsUndefined || undefined[prey];
                }
            const bool isUndefined = !isGrounded || eatsUndefined;
            for (int m : members) {
                grounded[static_cast<std::size_t>(m)] = isGrounded;
                undefined[static_cast<std::size_t>(m)] = isUndefined;
            }
            scratch.loopMembers.insert(scratch.loopMembers.end(), members.begin(), members.end());
            scratch.loopStart.push_back(static_cast<int>(scratch.loopMembers.size()));
            scratch.loopUndefined.push_back(isUndefined);
        },
        scratch.components);
    scratch.loopsPattern.assign(outer, outer + n + 1);
    scratch.loopsPattern.insert(scratch.loopsPattern.end(), inner, inner + share.nonZeros());
    scratch.loopsFixed = scratch.fixed;
    scratch.loopsKnown = true;
}

// Levels and omnivory from the renormalised diet (fixed columns empty, their levels
// set), loop by loop in solving order: a loop of one (no loop, or cannibalism only) by
// substitution, a longer one by solveLoop, an undefined one left NaN.
void finishLevels(TrophicLevelScratch& scratch, TrophicLevels& out)
{
    if (!loopsStillApply(scratch)) findLoops(scratch);
    const SparseColumns& share = scratch.share;
    const auto sn = static_cast<std::size_t>(share.cols());
    for (std::size_t c = 0; c + 1 < scratch.loopStart.size(); ++c) {
        const std::span<const int> members(scratch.loopMembers.data() + scratch.loopStart[c],
                                           static_cast<std::size_t>(scratch.loopStart[c + 1] - scratch.loopStart[c]));
        if (scratch.loopUndefined[c]) {
            for (int m : members) out.note[static_cast<std::size_t>(m)] = TrophicLevelNote::Undefined;
            continue;
        }
        if (members.size() == 1) {
            const int j = members[0];
            double rhs = 1.0, self = 0.0;
            for (SparseColumns::InnerIterator it(share, j); it; ++it) {
                if (it.index() == j) self += it.value();
                else rhs += it.value() * out.tl[it.index()];
            }
            out.tl[j] = rhs / (1.0 - self);  // self < 1: j also eats something grounded
        } else {
            if (scratch.local.size() != sn) scratch.local.assign(sn, -1);
            solveLoop(share, members, scratch, out.tl);
        }
        for (int j : members) {  // every prey's level is final now
            double oi = 0.0;
            for (SparseColumns::InnerIterator it(share, j); it; ++it) {
                const double d = out.tl[it.index()] - (out.tl[j] - 1.0);
                oi += it.value() * d * d;
            }
            out.oi[j] = oi;
        }
    }
}

void startLevels(Eigen::Index n, TrophicLevels& out)
{
    out.tl.setConstant(n, std::numeric_limits<double>::quiet_NaN());
    out.oi.setConstant(n, std::numeric_limits<double>::quiet_NaN());
    out.note.assign(static_cast<std::size_t>(n), TrophicLevelNote::Computed);
}

// A node whose level is fixed: basal (1) or with no modelled prey (2).
void fix(TrophicLevels& out, std::vector<char>& fixed, Eigen::Index j, bool basal)
{
    const auto s = static_cast<std::size_t>(j);
    out.note[s] = basal ? TrophicLevelNote::Basal : TrophicLevelNote::NoModelledPrey;
    out.tl[j] = basal ? 1.0 : 2.0;
    out.oi[j] = 0.0;
    fixed[s] = 1;
}

}  // namespace

void computeTrophicLevels(const SparseColumns& diet, const std::vector<bool>& basal, TrophicLevelScratch& scratch,
                          TrophicLevels& out)
{
    const Eigen::Index n = diet.cols();
    startLevels(n, out);
    // The renormalised diet, written straight into compressed storage: fixed columns
    // empty, zero entries left out (at most diet.nonZeros() entries).
    SparseColumns& share = scratch.share;
    share.resize(n, n);
    share.resizeNonZeros(diet.nonZeros());
    int* shareOuter = share.outerIndexPtr();
    int* shareInner = share.innerIndexPtr();
    double* shareValue = share.valuePtr();
    scratch.fixed.assign(static_cast<std::size_t>(n), 0);
    const int* outer = diet.outerIndexPtr();
    const int* inner = diet.innerIndexPtr();
    const double* value = diet.valuePtr();
    int count = 0;
    for (Eigen::Index j = 0; j < n; ++j) {
        shareOuter[j] = count;
        const int begin = outer[j], end = diet.isCompressed() ? outer[j + 1] : outer[j] + diet.innerNonZeroPtr()[j];
        double sum = 0.0;
        for (int e = begin; e < end; ++e) sum += value[e];
        if (basal[static_cast<std::size_t>(j)] || !(sum > 0.0)) {
            fix(out, scratch.fixed, j, basal[static_cast<std::size_t>(j)]);
            continue;
        }
        for (int e = begin; e < end; ++e) {
            if (value[e] == 0.0) continue;
            shareInner[count] = inner[e];
            shareValue[count] = value[e] / sum;
            ++count;
        }
    }
    shareOuter[n] = count;
    share.resizeNonZeros(count);
    finishLevels(scratch, out);
}

TrophicLevels computeTrophicLevels(const SparseColumns& diet, const std::vector<bool>& basal)
{
    TrophicLevelScratch scratch;
    TrophicLevels out;
    computeTrophicLevels(diet, basal, scratch, out);
    return out;
}

TrophicLevels computeTrophicLevels(const Eigen::MatrixXd& diet, const std::vector<bool>& basal)
{
    return computeTrophicLevels(SparseColumns(diet.sparseView(1.0, 0.0)), basal);
}

TrophicLevels computeTrophicLevels(const Model& model)
{
    const std::size_t n = model.size();
    const auto en = static_cast<Eigen::Index>(n);
    std::size_t entries = 0;
    for (std::size_t j = 0; j < n; ++j) entries += model.dietRow(j).size();
    SparseColumns diet(en, en);  // column j = predator j, prey ascending, import excluded
    diet.reserve(static_cast<Eigen::Index>(entries));
    std::vector<bool> basal(n, false);
    for (std::size_t j = 0; j < n; ++j) {
        const auto jj = static_cast<Eigen::Index>(j);
        diet.startVec(jj);
        basal[j] = model.compartment(j).kind != CompartmentKind::Consumer;
        for (const auto& [prey, dc] : model.dietRow(j)) diet.insertBack(static_cast<Eigen::Index>(prey), jj) = dc;
    }
    diet.finalize();
    return computeTrophicLevels(diet, basal);
}

}  // namespace tl
