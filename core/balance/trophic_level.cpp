// Effective trophic level and omnivory index (Pauly et al. 1993); see trophic_level.h.
#include "core/balance/trophic_level.h"

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
void solveLoop(const SparseColumns& share, std::span<const int> members, std::vector<int>& local, Eigen::VectorXd& tl)
{
    const auto k = static_cast<Eigen::Index>(members.size());
    for (Eigen::Index r = 0; r < k; ++r) local[static_cast<std::size_t>(members[static_cast<std::size_t>(r)])] = static_cast<int>(r);
    // Row r: the loop's entries go to a(r, c) (through addInLoop), the outside prey to b.
    Eigen::VectorXd b = Eigen::VectorXd::Ones(k);
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
    Eigen::VectorXd levels;
    if (k <= kDenseBlock) {
        Eigen::MatrixXd a = Eigen::MatrixXd::Zero(k, k);
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

// share: renormalised diet, fixed columns (basal, no modelled prey) empty; out holds
// TL 1 or 2 for fixed nodes. Tarjan's algorithm (without recursion) over the consumers
// emits each feeding loop after everything its members eat, so one pass decides,
// loop by loop:
//   grounded  = some member eats a fixed or grounded node outside the loop (a food
//               chain reaches a producer, pool or import-only consumer);
//   undefined = not grounded, or some member eats an undefined node outside the loop;
// and solves the levels of grounded, defined loops.
void levelsByLoops(const SparseColumns& share, const std::vector<bool>& fixed, TrophicLevels& out)
{
    const auto n = static_cast<int>(share.cols());
    const auto sn = static_cast<std::size_t>(n);
    const int* outer = share.outerIndexPtr();
    const int* inner = share.innerIndexPtr();
    std::vector<char> consumers(sn), grounded(sn, 0), undefined(sn, 0);
    for (std::size_t j = 0; j < sn; ++j) {
        consumers[j] = !fixed[j];
        grounded[j] = fixed[j];
    }
    std::vector<int> local;  // sized on the first loop of two or more
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
                const auto s = static_cast<std::size_t>(m);
                grounded[s] = isGrounded;
                undefined[s] = isUndefined;
                if (isUndefined) out.note[s] = TrophicLevelNote::Undefined;
            }
            if (isUndefined) return;
            if (members.size() == 1) {  // no loop, or cannibalism only
                const int j = members[0];
                double rhs = 1.0, self = 0.0;
                for (SparseColumns::InnerIterator it(share, j); it; ++it) {
                    if (it.index() == j) self += it.value();
                    else rhs += it.value() * out.tl[it.index()];
                }
                out.tl[j] = rhs / (1.0 - self);  // self < 1: j also eats something grounded
                return;
            }
            if (local.empty()) local.assign(sn, -1);
            solveLoop(share, members, local, out.tl);
        });
}

}  // namespace

namespace {

// Levels and omnivory from the renormalised diet (fixed columns empty, their levels set).
void finishLevels(const SparseColumns& share, const std::vector<bool>& fixed, TrophicLevels& out)
{
    levelsByLoops(share, fixed, out);
    for (Eigen::Index j = 0; j < share.cols(); ++j) {
        const auto s = static_cast<std::size_t>(j);
        if (fixed[s] || out.note[s] == TrophicLevelNote::Undefined) continue;
        double oi = 0.0;
        for (SparseColumns::InnerIterator it(share, j); it; ++it) {
            const double d = out.tl[it.index()] - (out.tl[j] - 1.0);
            oi += it.value() * d * d;
        }
        out.oi[j] = oi;
    }
}

TrophicLevels startLevels(Eigen::Index n)
{
    TrophicLevels out;
    out.tl.setConstant(n, std::numeric_limits<double>::quiet_NaN());
    out.oi.setConstant(n, std::numeric_limits<double>::quiet_NaN());
    out.note.assign(static_cast<std::size_t>(n), TrophicLevelNote::Computed);
    return out;
}

// A node whose level is fixed: basal (1) or with no modelled prey (2).
void fix(TrophicLevels& out, std::vector<bool>& fixed, Eigen::Index j, bool basal)
{
    const auto s = static_cast<std::size_t>(j);
    out.note[s] = basal ? TrophicLevelNote::Basal : TrophicLevelNote::NoModelledPrey;
    out.tl[j] = basal ? 1.0 : 2.0;
    out.oi[j] = 0.0;
    fixed[s] = true;
}

}  // namespace

TrophicLevels computeTrophicLevels(const SparseColumns& diet, const std::vector<bool>& basal)
{
    const Eigen::Index n = diet.cols();
    TrophicLevels out = startLevels(n);
    SparseColumns share(n, n);  // renormalised diet; fixed columns empty
    share.reserve(diet.nonZeros());
    std::vector<bool> fixed(static_cast<std::size_t>(n), false);
    for (Eigen::Index j = 0; j < n; ++j) {
        share.startVec(j);
        double sum = 0.0;
        for (SparseColumns::InnerIterator it(diet, j); it; ++it) sum += it.value();
        if (basal[static_cast<std::size_t>(j)] || !(sum > 0.0)) {
            fix(out, fixed, j, basal[static_cast<std::size_t>(j)]);
            continue;
        }
        for (SparseColumns::InnerIterator it(diet, j); it; ++it)
            if (it.value() != 0.0) share.insertBack(it.index(), j) = it.value() / sum;
    }
    share.finalize();
    finishLevels(share, fixed, out);
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
    TrophicLevels out = startLevels(en);
    std::size_t entries = 0;
    for (std::size_t j = 0; j < n; ++j) entries += model.dietRow(j).size();
    SparseColumns share(en, en);  // column j = predator j, prey ascending, renormalised without import
    share.reserve(static_cast<Eigen::Index>(entries));
    std::vector<bool> fixed(n, false);
    for (std::size_t j = 0; j < n; ++j) {
        const auto jj = static_cast<Eigen::Index>(j);
        share.startVec(jj);
        const bool basal = model.compartment(j).kind != CompartmentKind::Consumer;
        double sum = 0.0;
        for (const auto& [prey, dc] : model.dietRow(j)) sum += dc;
        if (basal || !(sum > 0.0)) {
            fix(out, fixed, jj, basal);
            continue;
        }
        for (const auto& [prey, dc] : model.dietRow(j)) share.insertBack(static_cast<Eigen::Index>(prey), jj) = dc / sum;
    }
    share.finalize();
    finishLevels(share, fixed, out);
    return out;
}

}  // namespace tl
