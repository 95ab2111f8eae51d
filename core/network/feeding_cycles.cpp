// Feeding-cycle removal (Ulanowicz 1983); see feeding_cycles.h for the procedure.
#include "core/network/feeding_cycles.h"

#include <algorithm>
#include <vector>

namespace tl {
namespace {

using Index = Eigen::Index;

// Compartments reachable from `from` along positive arcs (complete).
std::vector<char> reachableFrom(const Eigen::MatrixXd& web, Index from)
{
    const Index n = web.rows();
    std::vector<char> seen(static_cast<std::size_t>(n), 0);
    std::vector<Index> queue{from};
    seen[static_cast<std::size_t>(from)] = 1;
    while (!queue.empty()) {
        const Index j = queue.back();
        queue.pop_back();
        for (Index i = 0; i < n; ++i)
            if (!seen[static_cast<std::size_t>(i)] && web(j, i) > 0.0) {
                seen[static_cast<std::size_t>(i)] = 1;
                queue.push_back(i);
            }
    }
    return seen;
}

// The published procedure's bounded search for the nexus: floor(n/2)+1 passes over the
// compartments in order, each marking a compartment joined by a positive arc to one
// already marked (forward: from a marked one; backward: to a marked one).
std::vector<char> boundedSearch(const Eigen::MatrixXd& web, Index start, bool forward)
{
    const Index n = web.rows();
    std::vector<char> marked(static_cast<std::size_t>(n), 0);
    marked[static_cast<std::size_t>(start)] = 1;
    const Index passes = n / 2 + 1;
    for (Index pass = 0; pass < passes; ++pass)
        for (Index i = 0; i < n; ++i) {
            if (marked[static_cast<std::size_t>(i)]) continue;
            for (Index j = 0; j < n; ++j)
                if (marked[static_cast<std::size_t>(j)] && (forward ? web(j, i) : web(i, j)) > 0.0) {
                    marked[static_cast<std::size_t>(i)] = 1;
                    break;
                }
        }
    return marked;
}

// Compartments on some cycle, most cycle arcs ending in them first (ties: lower index):
// the order in which the weak arc and the nexus members are searched.
std::vector<Index> compartmentsOnCycles(const Eigen::MatrixXd& web)
{
    const Index n = web.rows();
    std::vector<int> arcsBack(static_cast<std::size_t>(n), 0);
    for (Index v = 0; v < n; ++v) {
        const std::vector<char> reach = reachableFrom(web, v);
        for (Index i = 0; i < n; ++i)
            if (reach[static_cast<std::size_t>(i)] && web(i, v) > 0.0) ++arcsBack[static_cast<std::size_t>(v)];
    }
    std::vector<Index> order;
    for (Index v = 0; v < n; ++v)
        if (arcsBack[static_cast<std::size_t>(v)] > 0) order.push_back(v);
    std::stable_sort(order.begin(), order.end(), [&](Index a, Index b) {
        return arcsBack[static_cast<std::size_t>(a)] > arcsBack[static_cast<std::size_t>(b)];
    });
    return order;
}

// Every simple cycle a -> b -> ... -> a through `members` (members[0] = a, members[1] = b),
// by depth-first backtracking; adds each cycle's weight prod g_ij to `weights` on its
// arcs. Returns the number of cycles, or stops early (false) once `budget` is used up.
bool enumerateNexus(const Eigen::MatrixXd& web, const Eigen::MatrixXd& g, const std::vector<Index>& members,
                    Eigen::MatrixXd& weights, std::size_t& cycles, std::size_t budget)
{
    const std::size_t m = members.size();
    std::vector<std::size_t> path{0, 1};
    std::vector<std::size_t> nextCandidate{0, 0};  // per depth: next member to try after path[d]
    std::vector<char> onPath(m, 0);
    onPath[0] = onPath[1] = 1;
    while (path.size() >= 2) {
        const std::size_t depth = path.size() - 1;
        const Index from = members[path[depth]];
        std::size_t& c = nextCandidate[depth];
        bool advanced = false;
        while (c < m) {
            const std::size_t candidate = c++;
            if (!(web(from, members[candidate]) > 0.0)) continue;
            if (candidate == 0) {  // closes a cycle back to a
                if (++cycles > budget) return false;
                double w = g(from, members[0]);
                for (std::size_t k = 0; k + 1 < path.size(); ++k) w *= g(members[path[k]], members[path[k + 1]]);
                weights(from, members[0]) += w;
                for (std::size_t k = 0; k + 1 < path.size(); ++k) weights(members[path[k]], members[path[k + 1]]) += w;
                continue;
            }
            if (onPath[candidate]) continue;
            path.push_back(candidate);
            nextCandidate.push_back(0);
            onPath[candidate] = 1;
            advanced = true;
            break;
        }
        if (advanced) continue;
        if (depth == 1) break;  // every continuation of a -> b tried: the nexus is complete
        onPath[path.back()] = 0;
        path.pop_back();
        nextCandidate.pop_back();
    }
    return true;
}

}  // namespace

FeedingCycleRemoval removeFeedingCycles(const Eigen::MatrixXd& flows, const Eigen::VectorXd& inputs,
                                        std::size_t cycleBudget)
{
    const Index n = flows.rows();
    FeedingCycleRemoval out;
    Eigen::MatrixXd web = flows;  // arcs on no cycle are set aside as negative values until the end
    const Eigen::VectorXd through = flows.colwise().sum().transpose() + inputs;
    Eigen::MatrixXd g = Eigen::MatrixXd::Zero(n, n);  // output fractions g_ij = F_ij / T_i
    for (Index i = 0; i < n; ++i)
        if (through[i] > 0.0) g.row(i) = flows.row(i) / through[i];

    for (;;) {
        const std::vector<Index> onCycles = compartmentsOnCycles(web);
        if (onCycles.empty()) break;
        // The weak arc: the smallest positive arc among them that lies on a cycle.
        Index a = -1, b = -1;
        std::vector<Index> members;
        for (;;) {
            double smallest = 0.0;
            a = b = -1;
            for (Index r : onCycles)
                for (Index c : onCycles)
                    if (web(r, c) > 0.0 && (a < 0 || web(r, c) < smallest)) {
                        smallest = web(r, c);
                        a = r;
                        b = c;
                    }
            if (a < 0 || a == b) break;
            const std::vector<char> ahead = boundedSearch(web, b, true), behind = boundedSearch(web, a, false);
            members = {a, b};
            for (Index v : onCycles)
                if (v != a && v != b && ahead[static_cast<std::size_t>(v)] && behind[static_cast<std::size_t>(v)])
                    members.push_back(v);
            const bool anyMember = std::any_of(onCycles.begin(), onCycles.end(), [&](Index v) {
                return ahead[static_cast<std::size_t>(v)] && behind[static_cast<std::size_t>(v)];
            });
            if (anyMember) break;
            web(a, b) = -web(a, b);  // on no cycle: set aside, try the next smallest
        }
        if (a < 0) break;
        if (a == b) {  // cannibalism: a cycle of its own
            web(a, a) = 0.0;
            ++out.cycles;
            ++out.nexuses;
            continue;
        }
        const double weakFlow = web(a, b);
        Eigen::MatrixXd weights = Eigen::MatrixXd::Zero(n, n);
        if (!enumerateNexus(web, g, members, weights, out.cycles, cycleBudget)) {
            out.complete = false;
            break;
        }
        const double pivot = weights(a, b);  // sum of the nexus's cycle weights
        if (!(pivot > 0.0)) {
            web(a, b) = -web(a, b);
            continue;
        }
        for (Index i = 0; i < n; ++i)
            for (Index j = 0; j < n; ++j)
                if (web(i, j) > 0.0 && weights(i, j) != 0.0) web(i, j) -= weights(i, j) / pivot * weakFlow;
        web(a, b) = 0.0;
        ++out.nexuses;
    }
    out.residual = web.cwiseAbs();
    out.removed = flows - out.residual;
    return out;
}

}  // namespace tl
