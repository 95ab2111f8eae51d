// Removal of feeding cycles before trophic aggregation: the cycle analysis of
// Ulanowicz (1983, Math Biosci 65:219), applied to the flows among living compartments
// as the published trophic aggregation requires (Ulanowicz & Kemp 1979, Am Nat 114:871;
// Ulanowicz 1995). DESIGN.md 3.3.
//
// Repeat until no cycle is left:
//  1. the weak arc is the smallest positive flow F_ab between two compartments that lie
//     on some cycle (an arc that lies on no cycle is set aside and the next one tried);
//  2. its nexus is every simple cycle a -> b -> ... -> a through compartments reachable
//     from b and reaching a; each cycle c gets the weight
//       w_c = prod_{(i,j) in c} g_ij,   g_ij = F_ij / T_i,
//     with T_i the compartment's intake from living compartments plus its boundary input
//     (both fixed at the start);
//  3. every arc (i,j) of the nexus gives up  F_ab * (sum_{c through (i,j)} w_c) / (sum_c w_c),
//     so the weak arc is emptied (it lies on every cycle of its nexus) and the other arcs
//     lose the cycled flow in proportion to the probability of each cycle.
// A self-loop (cannibalism) is a cycle of its own and is removed whole.
// The number of simple cycles can grow exponentially with dense feeding loops, so the
// enumeration has a budget; when it runs out, `complete` is false and the residual
// flows are those of the nexuses finished so far (the caller says so to the user).
// The search order follows the published procedure, so the residual flows, and the
// effective trophic levels built on them, can be checked against published figures
// (tests/core/network/feeding_cycles_test.cpp). Cost: one pass over the arcs per weak arc
// removed, plus the cycles enumerated (feeding_cycles.cpp says how).
#pragma once

#include <cstddef>

#include <Eigen/Core>

namespace tl {

struct FeedingCycleRemoval {
    Eigen::MatrixXd residual;  // living x living flows with the feeding cycles removed
    Eigen::MatrixXd removed;   // the cycled flow taken from each arc (input - residual)
    std::size_t cycles = 0;    // simple cycles found (self-loops included)
    std::size_t nexuses = 0;   // weak arcs removed
    bool complete = true;      // false when the enumeration budget ran out
};

// flows(i, j): flow from living compartment i to living compartment j; inputs: boundary
// inputs of the same compartments. cycleBudget bounds the cycles enumerated in all.
FeedingCycleRemoval removeFeedingCycles(const Eigen::MatrixXd& flows, const Eigen::VectorXd& inputs,
                                        std::size_t cycleBudget = 5'000'000);

}  // namespace tl
