// Synthetic food webs for the benchmarks (invented; their numbers describe no real
// water body). A seeded generator builds a consistent model of any size with the
// structure of a drafted lake or coastal model: a few producers, one to three detritus
// pools, consumers in layers (each eating 3-10 prey, mostly from the layer below),
// some cannibalism and some feeding loops, two or three fleets with landings and
// discards, detritus routing split between pools.
//
// Consistency: every value of the "truth" model is given and every living
// compartment's equation (DESIGN 3.2)
//   B_i (P/B)_i EE_i = sum_j B_j (Q/B)_j DC_ij + Y_i + E_i + BA_i
// closes to rounding, because biomasses are set top-down from the demand of the
// layers above and EE is then computed from that demand. The true EE lies in
// (0, 1) for every compartment (target 0.2-0.85, plus at most 0.1 from loops and
// cannibalism); detritus pools get an import where their consumers would otherwise
// eat more than 80 % of the inflow.
//
// Unknown mixes hide values of the truth for the solver to recover:
//   ee          every living EE hidden (square system, one unknown per row);
//   ee-biomass  10 % of living biomasses hidden (their EE given), every other EE hidden;
//   ee-qb-pq    5 % of consumers with Q/B hidden (EE given; one of their living prey is
//               then fully given so that Q/B is determined: more equations than
//               unknowns), 10 % of consumers give P/Q instead of P/B, 10 % give P/Q
//               instead of Q/B, every other EE hidden.
//
// Deterministic for a seed on every platform: numbers come from std::mt19937_64's
// bits through tl::testing::Draw, never through std:: distributions.
#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/model/model.h"

namespace tl::bench {

enum class UnknownMix { EE, EEBiomass, EEQbPq };
std::string_view mixKey(UnknownMix mix);  // "ee", "ee-biomass", "ee-qb-pq"
std::optional<UnknownMix> parseMix(std::string_view key);
// "50,200" -> {50, 200}: the --sizes argument of the benchmark drivers (throws
// std::invalid_argument on a list that is not whole numbers).
std::vector<std::size_t> parseSizes(const std::string& list);

struct SyntheticModel {
    Model model;  // the inputs, with the mix's unknowns hidden
    Model truth;  // every B, P/B, Q/B (consumers) and EE given
    // What the mix hid or replaced, and the shape of A x = b the solver should build.
    std::size_t hiddenEE = 0, hiddenBiomass = 0, hiddenQB = 0, pbFromPQ = 0, qbFromPQ = 0, fullyGiven = 0;
    std::size_t expectedEquations = 0, expectedUnknowns = 0;
};

// n >= 10 compartments.
Model syntheticTruth(std::size_t n, std::uint64_t seed);
SyntheticModel syntheticModel(std::size_t n, UnknownMix mix, std::uint64_t seed);

}  // namespace tl::bench
