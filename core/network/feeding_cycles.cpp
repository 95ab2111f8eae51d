// Feeding-cycle removal (Ulanowicz 1983); see feeding_cycles.h for the procedure.
//
// Work on adjacency lists of the positive arcs. A cycle through the arc a -> b never
// leaves the strongly connected component (SCC) of a and b, and every compartment of
// that component is reachable from b and reaches a, so the nexus of a weak arc is its
// component; an arc between two components lies on no cycle. Each round therefore costs
// one SCC pass (Tarjan 1972, SIAM J Comput 1:146) over the arcs plus the enumeration of
// the nexus's cycles, instead of a reachability search from every compartment.
// The published procedure bounds its nexus search at n/2 + 1 passes over the
// compartments; the search here is complete, which differs only for a loop longer than
// half the web (none of the 44 reference networks of the tests has one).
#include "core/network/feeding_cycles.h"

#include <algorithm>
#include <span>
#include <vector>

#include "core/model/strong_components.h"

namespace tl {
namespace {

struct Arc {
    int to;
    double flow;  // current residual flow; <= 0 once removed
    double g;     // output fraction F_ij / T_i of the original flows
};

using Graph = std::vector<std::vector<Arc>>;  // out-arcs per compartment, by target

// Strongly connected components over arcs with positive flow (component[v] numbers
// them), and the cycle arcs ending in each compartment (arcsBack).
void components(const Graph& graph, std::vector<int>& component, std::vector<int>& arcsBack)
{
    const int n = static_cast<int>(graph.size());
    component.assign(static_cast<std::size_t>(n), -1);
    int count = 0;
    forEachStrongComponent(
        n, std::vector<char>(static_cast<std::size_t>(n), 1),
        [&](int v) { return graph[static_cast<std::size_t>(v)].size(); },
        [&](int v, int k) {
            const Arc& arc = graph[static_cast<std::size_t>(v)][static_cast<std::size_t>(k)];
            return arc.flow > 0.0 ? arc.to : -1;
        },
        [&](std::span<const int> members) {
            for (int m : members) component[static_cast<std::size_t>(m)] = count;
            ++count;
        });
    // Cycle arcs ending in each compartment: positive in-arcs from its own component
    // (a self-loop included); the published procedure searches compartments in
    // decreasing order of this count.
    arcsBack.assign(static_cast<std::size_t>(n), 0);
    for (int u = 0; u < n; ++u)
        for (const Arc& arc : graph[static_cast<std::size_t>(u)])
            if (arc.flow > 0.0 && component[static_cast<std::size_t>(u)] == component[static_cast<std::size_t>(arc.to)])
                ++arcsBack[static_cast<std::size_t>(arc.to)];
}

// Depth-first enumeration of every simple cycle a -> b -> ... -> a inside the component
// (members[0] = a, members[1] = b, then the others in search order; local[v] = position
// in members or -1). Adds each cycle's weight (product of g along it) to weight[u][k],
// the k-th out-arc of u. False once more than `budget` cycles were counted.
bool enumerateNexus(const Graph& graph, const std::vector<int>& members, const std::vector<int>& local,
                    std::vector<std::vector<double>>& weight, std::size_t& cycles, std::size_t budget)
{
    // Out-arcs of each member inside the component, in search order of their targets.
    std::vector<std::vector<std::pair<int, std::size_t>>> next(members.size());  // (local target, arc k)
    for (std::size_t m = 0; m < members.size(); ++m) {
        const auto& arcs = graph[static_cast<std::size_t>(members[m])];
        for (std::size_t k = 0; k < arcs.size(); ++k) {
            const int t = local[static_cast<std::size_t>(arcs[k].to)];
            if (t >= 0 && arcs[k].flow > 0.0) next[m].emplace_back(t, k);
        }
        std::sort(next[m].begin(), next[m].end());
    }
    std::size_t weakArc = 0;  // the arc a -> b among a's out-arcs
    for (const auto& [t, k] : next[0])
        if (t == 1) weakArc = k;
    std::vector<int> path{0, 1};
    std::vector<std::size_t> via{weakArc};    // arc index taken out of path[d] to path[d+1]
    std::vector<std::size_t> cursor{0, 0};    // next candidate per depth
    std::vector<char> onPath(members.size(), 0);
    onPath[0] = onPath[1] = 1;
    const auto gOf = [&](int m, std::size_t k) { return graph[static_cast<std::size_t>(members[static_cast<std::size_t>(m)])][k].g; };
    while (path.size() >= 2) {
        const std::size_t depth = path.size() - 1;
        const int from = path[depth];
        const auto& candidates = next[static_cast<std::size_t>(from)];
        bool advanced = false;
        while (cursor[depth] < candidates.size()) {
            const auto [to, k] = candidates[cursor[depth]++];
            if (to == 0) {  // back to a: a cycle
                if (++cycles > budget) return false;
                double w = gOf(from, k);
                for (std::size_t d = 0; d < via.size(); ++d) w *= gOf(path[d], via[d]);
                weight[static_cast<std::size_t>(from)][k] += w;
                for (std::size_t d = 0; d < via.size(); ++d) weight[static_cast<std::size_t>(path[d])][via[d]] += w;
                continue;
            }
            if (onPath[static_cast<std::size_t>(to)]) continue;
            path.push_back(to);
            via.push_back(k);
            cursor.push_back(0);
            onPath[static_cast<std::size_t>(to)] = 1;
            advanced = true;
            break;
        }
        if (advanced) continue;
        if (depth == 1) break;  // every continuation of a -> b tried
        onPath[static_cast<std::size_t>(path.back())] = 0;
        path.pop_back();
        via.pop_back();
        cursor.pop_back();
    }
    return true;
}

}  // namespace

FeedingCycleRemoval removeFeedingCycles(const Eigen::MatrixXd& flows, const Eigen::VectorXd& inputs,
                                        std::size_t cycleBudget)
{
    const Eigen::Index n = flows.rows();
    FeedingCycleRemoval out;
    const Eigen::VectorXd through = flows.colwise().sum().transpose() + inputs;
    Graph graph(static_cast<std::size_t>(n));
    for (Eigen::Index i = 0; i < n; ++i)
        for (Eigen::Index j = 0; j < n; ++j)
            if (flows(i, j) > 0.0)
                graph[static_cast<std::size_t>(i)].push_back(
                    {static_cast<int>(j), flows(i, j), through[i] > 0.0 ? flows(i, j) / through[i] : 0.0});

    std::vector<int> component, arcsBack, rank(static_cast<std::size_t>(n)), local(static_cast<std::size_t>(n), -1);
    for (;;) {
        components(graph, component, arcsBack);
        // Search order: most cycle arcs ending in a compartment first, then lower index.
        std::vector<int> order;
        for (int v = 0; v < n; ++v)
            if (arcsBack[static_cast<std::size_t>(v)] > 0) order.push_back(v);
        if (order.empty()) break;
        std::stable_sort(order.begin(), order.end(), [&](int x, int y) {
            return arcsBack[static_cast<std::size_t>(x)] > arcsBack[static_cast<std::size_t>(y)];
        });
        for (std::size_t r = 0; r < order.size(); ++r) rank[static_cast<std::size_t>(order[r])] = static_cast<int>(r);
        // The weak arc: the smallest arc inside a component (ties: first in search order).
        int a = -1, b = -1;
        std::size_t weakK = 0;
        for (int u : order)
            for (std::size_t k = 0; k < graph[static_cast<std::size_t>(u)].size(); ++k) {
                const Arc& arc = graph[static_cast<std::size_t>(u)][k];
                if (!(arc.flow > 0.0) || component[static_cast<std::size_t>(u)] != component[static_cast<std::size_t>(arc.to)]) continue;
                const Arc* best = a < 0 ? nullptr : &graph[static_cast<std::size_t>(a)][weakK];
                if (!best || arc.flow < best->flow ||
                    (arc.flow == best->flow && (rank[static_cast<std::size_t>(u)] < rank[static_cast<std::size_t>(a)] ||
                                                (u == a && rank[static_cast<std::size_t>(arc.to)] < rank[static_cast<std::size_t>(b)])))) {
                    a = u;
                    b = arc.to;
                    weakK = k;
                }
            }
        Arc& weak = graph[static_cast<std::size_t>(a)][weakK];
        if (a == b) {  // cannibalism: a cycle of its own
            weak.flow = 0.0;
            ++out.cycles;
            ++out.nexuses;
            continue;
        }
        // The nexus: a, b, then the rest of their component in search order.
        std::vector<int> members{a, b};
        for (int v : order)
            if (v != a && v != b && component[static_cast<std::size_t>(v)] == component[static_cast<std::size_t>(a)])
                members.push_back(v);
        for (std::size_t m = 0; m < members.size(); ++m) local[static_cast<std::size_t>(members[m])] = static_cast<int>(m);
        std::vector<std::vector<double>> weight(members.size());
        for (std::size_t m = 0; m < members.size(); ++m)
            weight[m].assign(graph[static_cast<std::size_t>(members[m])].size(), 0.0);
        const bool finished = enumerateNexus(graph, members, local, weight, out.cycles, cycleBudget);
        for (int v : members) local[static_cast<std::size_t>(v)] = -1;
        if (!finished) {
            out.complete = false;
            break;
        }
        // Each arc gives up the weak flow times its share of the nexus's cycle weight.
        const double weakFlow = weak.flow, pivot = weight[0][weakK];
        for (std::size_t m = 0; m < members.size(); ++m)
            for (std::size_t k = 0; k < weight[m].size(); ++k)
                if (weight[m][k] != 0.0) graph[static_cast<std::size_t>(members[m])][k].flow -= weight[m][k] / pivot * weakFlow;
        weak.flow = 0.0;
        ++out.nexuses;
    }
    // Residual flows; rounding can leave a removed arc a hair below 0: its size counts.
    out.residual = Eigen::MatrixXd::Zero(n, n);
    for (Eigen::Index i = 0; i < n; ++i)
        for (const Arc& arc : graph[static_cast<std::size_t>(i)]) out.residual(i, arc.to) = std::abs(arc.flow);
    out.removed = flows - out.residual;
    return out;
}

}  // namespace tl
