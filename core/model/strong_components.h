// Strongly connected components of a directed graph by Tarjan's algorithm (Tarjan 1972,
// SIAM J Comput 1:146), without recursion so that a food chain of thousands of
// compartments cannot overflow the stack. Components are reported in the order the
// algorithm completes them: each one after every component reachable from it. With
// arcs predator -> prey that is prey first (trophic levels solve in that order); the
// feeding-cycle removal uses the component numbers.
//
//   successorCount(v)   number of arc slots of node v
//   successorAt(v, k)   the node arc slot k of v leads to, or -1 to skip the slot
//   onComponent(span)   the members of one component, while they are still in order
// Nodes with include[v] == 0 are neither visited nor reported. A caller that runs it
// again and again passes StrongComponentBuffers to keep its work arrays between calls.
#pragma once

#include <algorithm>
#include <cstddef>
#include <span>
#include <utility>
#include <vector>

namespace tl {

// The work arrays of one search; their storage is reused by the next.
struct StrongComponentBuffers {
    std::vector<int> index, low, stack;
    std::vector<char> onStack;
    std::vector<std::pair<int, int>> calls;  // node, next arc slot
};

template <typename SuccessorCount, typename SuccessorAt, typename OnComponent>
void forEachStrongComponent(int n, const std::vector<char>& include, SuccessorCount successorCount,
                            SuccessorAt successorAt, OnComponent onComponent, StrongComponentBuffers& buffers)
{
    const auto size = static_cast<std::size_t>(n);
    std::vector<int>& index = buffers.index;
    std::vector<int>& low = buffers.low;
    std::vector<int>& stack = buffers.stack;
    std::vector<char>& onStack = buffers.onStack;
    std::vector<std::pair<int, int>>& calls = buffers.calls;
    index.assign(size, -1);
    low.assign(size, 0);
    onStack.assign(size, 0);
    stack.clear();
    calls.clear();
    stack.reserve(size);
    calls.reserve(size);
    int counter = 0;
    for (int root = 0; root < n; ++root) {
        if (!include[static_cast<std::size_t>(root)] || index[static_cast<std::size_t>(root)] >= 0) continue;
        calls.emplace_back(root, 0);
        while (!calls.empty()) {
            const int v = calls.back().first;
            const auto sv = static_cast<std::size_t>(v);
            if (index[sv] < 0) {  // first visit
                index[sv] = low[sv] = counter++;
                stack.push_back(v);
                onStack[sv] = 1;
            }
            bool descended = false;
            const int arcSlots = static_cast<int>(successorCount(v));  // not "slots": a Qt macro
            while (calls.back().second < arcSlots) {
                const int w = successorAt(v, calls.back().second++);
                if (w < 0 || !include[static_cast<std::size_t>(w)]) continue;
                const auto sw = static_cast<std::size_t>(w);
                if (index[sw] < 0) {
                    calls.emplace_back(w, 0);
                    descended = true;
                    break;
                }
                if (onStack[sw]) low[sv] = std::min(low[sv], index[sw]);
            }
            if (descended) continue;
            calls.pop_back();
            if (!calls.empty()) {
                const auto parent = static_cast<std::size_t>(calls.back().first);
                low[parent] = std::min(low[parent], low[sv]);
            }
            if (low[sv] != index[sv]) continue;
            std::size_t first = stack.size();
            do --first;
            while (stack[first] != v);
            for (std::size_t k = first; k < stack.size(); ++k) onStack[static_cast<std::size_t>(stack[k])] = 0;
            onComponent(std::span<const int>(stack.data() + first, stack.size() - first));
            stack.resize(first);
        }
    }
}

template <typename SuccessorCount, typename SuccessorAt, typename OnComponent>
void forEachStrongComponent(int n, const std::vector<char>& include, SuccessorCount successorCount,
                            SuccessorAt successorAt, OnComponent onComponent)
{
    StrongComponentBuffers buffers;
    forEachStrongComponent(n, include, successorCount, successorAt, onComponent, buffers);
}

}  // namespace tl
