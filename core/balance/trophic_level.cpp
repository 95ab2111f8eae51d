// Effective trophic level and omnivory index (Pauly et al. 1993); see trophic_level.h.
#include "core/balance/trophic_level.h"

#include <cmath>
#include <limits>

namespace tl {
namespace {

// Strongly connected components of the feeding graph restricted to `member` nodes,
// edges predator -> prey (share(prey, predator) != 0), by Tarjan's algorithm without
// recursion. Components come out prey first: each one only depends on those before it.
std::vector<std::vector<Eigen::Index>> componentsPreyFirst(const SparseColumns& share, const std::vector<bool>& member)
{
    const Eigen::Index n = share.cols();
    const int* outer = share.outerIndexPtr();
    const int* inner = share.innerIndexPtr();
    std::vector<int> index(static_cast<std::size_t>(n), -1), low(static_cast<std::size_t>(n), 0);
    std::vector<bool> onStack(static_cast<std::size_t>(n), false);
    std::vector<Eigen::Index> stack;
    std::vector<std::pair<Eigen::Index, int>> calls;  // node, next entry of its column
    std::vector<std::vector<Eigen::Index>> components;
    int counter = 0;
    for (Eigen::Index root = 0; root < n; ++root) {
        if (!member[static_cast<std::size_t>(root)] || index[static_cast<std::size_t>(root)] >= 0) continue;
        calls.emplace_back(root, outer[root]);
        while (!calls.empty()) {
            auto& [v, next] = calls.back();
            const auto sv = static_cast<std::size_t>(v);
            if (next == outer[v]) {  // first visit
                index[sv] = low[sv] = counter++;
                stack.push_back(v);
                onStack[sv] = true;
            }
            bool descended = false;
            while (next < outer[v + 1]) {
                const Eigen::Index w = inner[next++];
                const auto sw = static_cast<std::size_t>(w);
                if (!member[sw]) continue;
                if (index[sw] < 0) {
                    calls.emplace_back(w, outer[w]);
                    descended = true;
                    break;
                }
                if (onStack[sw]) low[sv] = std::min(low[sv], index[sw]);
            }
            if (descended) continue;
            if (low[sv] == index[sv]) {
                std::vector<Eigen::Index> component;
                Eigen::Index w = -1;
                do {
                    w = stack.back();
                    stack.pop_back();
                    onStack[static_cast<std::size_t>(w)] = false;
                    component.push_back(w);
                } while (w != v);
                components.push_back(std::move(component));
            }
            const Eigen::Index finished = v;
            calls.pop_back();
            if (!calls.empty()) {
                const auto parent = static_cast<std::size_t>(calls.back().first);
                low[parent] = std::min(low[parent], low[static_cast<std::size_t>(finished)]);
            }
        }
    }
    return components;
}

// Marks every node reachable from a marked one along prey -> predator edges, skipping
// nodes for which `skip` holds. byPrey(i, j) != 0 when j eats i (row i lists i's predators).
void spreadToPredators(const Eigen::SparseMatrix<double, Eigen::RowMajor, int>& byPrey, std::vector<bool>& marked,
                       const std::vector<bool>& skip)
{
    std::vector<Eigen::Index> queue;
    for (std::size_t i = 0; i < marked.size(); ++i)
        if (marked[i]) queue.push_back(static_cast<Eigen::Index>(i));
    while (!queue.empty()) {
        const Eigen::Index i = queue.back();
        queue.pop_back();
        for (Eigen::SparseMatrix<double, Eigen::RowMajor, int>::InnerIterator it(byPrey, i); it; ++it) {
            const auto j = static_cast<std::size_t>(it.index());
            if (marked[j] || skip[j]) continue;
            marked[j] = true;
            queue.push_back(it.index());
        }
    }
}

}  // namespace

TrophicLevels computeTrophicLevels(const SparseColumns& diet, const std::vector<bool>& basal)
{
    const Eigen::Index n = diet.cols();
    const auto sn = static_cast<std::size_t>(n);
    TrophicLevels out;
    out.tl.setConstant(n, std::numeric_limits<double>::quiet_NaN());
    out.oi.setConstant(n, std::numeric_limits<double>::quiet_NaN());
    out.note.assign(sn, TrophicLevelNote::Computed);

    // Renormalised diet; "fixed" nodes have a known level (basal 1, no prey 2).
    SparseColumns share = diet;
    share.makeCompressed();
    std::vector<bool> fixed(sn, false);
    for (Eigen::Index j = 0; j < n; ++j) {
        const auto s = static_cast<std::size_t>(j);
        double sum = 0.0;
        for (SparseColumns::InnerIterator it(share, j); it; ++it) sum += it.value();
        if (basal[s] || !(sum > 0.0)) {
            out.note[s] = basal[s] ? TrophicLevelNote::Basal : TrophicLevelNote::NoModelledPrey;
            out.tl[j] = basal[s] ? 1.0 : 2.0;
            out.oi[j] = 0.0;
            fixed[s] = true;
            for (SparseColumns::InnerIterator it(share, j); it; ++it) it.valueRef() = 0.0;
            continue;
        }
        for (SparseColumns::InnerIterator it(share, j); it; ++it) it.valueRef() /= sum;
    }
    share.prune(0.0);
    const Eigen::SparseMatrix<double, Eigen::RowMajor, int> byPrey = share;

    // grounded: some food chain from the node reaches a fixed node; undefined: some
    // food chain from it reaches an ungrounded node.
    std::vector<bool> grounded = fixed;
    spreadToPredators(byPrey, grounded, std::vector<bool>(sn, false));
    std::vector<bool> undefined(sn);
    for (std::size_t j = 0; j < sn; ++j) undefined[j] = !grounded[j];
    spreadToPredators(byPrey, undefined, fixed);

    std::vector<bool> member(sn, false);
    for (std::size_t j = 0; j < sn; ++j) {
        if (undefined[j]) out.note[j] = TrophicLevelNote::Undefined;
        else member[j] = !fixed[j];
    }

    // TL_j - sum_{i in block} DC'_ij TL_i = 1 + sum_{i before} DC'_ij TL_i, block by block.
    std::vector<int> local(sn, -1);
    for (const std::vector<Eigen::Index>& block : componentsPreyFirst(share, member)) {
        if (block.size() == 1) {
            const Eigen::Index j = block.front();
            double rhs = 1.0, self = 0.0;
            for (SparseColumns::InnerIterator it(share, j); it; ++it) {
                if (it.index() == j) self += it.value();  // cannibalism
                else rhs += it.value() * out.tl[it.index()];
            }
            out.tl[j] = rhs / (1.0 - self);  // self < 1: j also eats something grounded
            continue;
        }
        const auto k = static_cast<Eigen::Index>(block.size());
        for (Eigen::Index r = 0; r < k; ++r) local[static_cast<std::size_t>(block[static_cast<std::size_t>(r)])] = static_cast<int>(r);
        Eigen::MatrixXd a = Eigen::MatrixXd::Identity(k, k);
        Eigen::VectorXd b = Eigen::VectorXd::Ones(k);
        for (Eigen::Index r = 0; r < k; ++r)
            for (SparseColumns::InnerIterator it(share, block[static_cast<std::size_t>(r)]); it; ++it) {
                const int c = local[static_cast<std::size_t>(it.index())];
                if (c >= 0) a(r, c) -= it.value();
                else b[r] += it.value() * out.tl[it.index()];  // fixed or an earlier block
            }
        const Eigen::VectorXd levels = a.partialPivLu().solve(b);  // nonsingular: every chain reaches a fixed node
        for (Eigen::Index r = 0; r < k; ++r) {
            out.tl[block[static_cast<std::size_t>(r)]] = levels[r];
            local[static_cast<std::size_t>(block[static_cast<std::size_t>(r)])] = -1;
        }
    }
    for (Eigen::Index j = 0; j < n; ++j) {
        if (!member[static_cast<std::size_t>(j)]) continue;
        double oi = 0.0;
        for (SparseColumns::InnerIterator it(share, j); it; ++it)
            oi += it.value() * std::pow(out.tl[it.index()] - (out.tl[j] - 1.0), 2);
        out.oi[j] = oi;
    }
    return out;
}

TrophicLevels computeTrophicLevels(const Eigen::MatrixXd& diet, const std::vector<bool>& basal)
{
    return computeTrophicLevels(SparseColumns(diet.sparseView(1.0, 0.0)), basal);
}

TrophicLevels computeTrophicLevels(const Model& model)
{
    const auto n = static_cast<Eigen::Index>(model.size());
    std::vector<Eigen::Triplet<double, int>> entries;
    std::vector<bool> basal(model.size());
    for (std::size_t j = 0; j < model.size(); ++j) {
        basal[j] = model.compartment(j).kind != CompartmentKind::Consumer;
        for (const auto& [prey, dc] : model.dietRow(j))
            entries.emplace_back(static_cast<int>(prey), static_cast<int>(j), dc);
    }
    SparseColumns diet(n, n);
    diet.setFromTriplets(entries.begin(), entries.end());
    return computeTrophicLevels(diet, basal);
}

}  // namespace tl
