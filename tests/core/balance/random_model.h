// Random food webs that balance exactly by construction (invented, for tests and
// benchmarks only). B, Q/B, U, diets, catch, E and BA are drawn; then each living
// compartment's EE is drawn and its P/B set so that
//   B (P/B) EE = predation + Y + E + BA
// holds to rounding (predation does not depend on the compartment's own P/B, not
// even with cannibalism). Deterministic for a seed on every platform: uniform
// numbers come straight from the 64-bit Mersenne Twister's bits.
#pragma once

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <random>
#include <string>
#include <vector>

#include "core/model/model.h"

namespace tl::testing {

class Draw {
public:
    explicit Draw(std::uint64_t seed) : engine_(seed) {}
    double uniform() { return static_cast<double>(engine_() >> 11) * 0x1.0p-53; }  // [0, 1)
    double uniform(double lo, double hi) { return lo + (hi - lo) * uniform(); }
    double logUniform(double lo, double hi) { return std::exp(uniform(std::log(lo), std::log(hi))); }
    std::size_t index(std::size_t n) { return static_cast<std::size_t>(uniform() * static_cast<double>(n)); }
    bool chance(double p) { return uniform() < p; }

private:
    std::mt19937_64 engine_;
};

// Fills in P/B of every living compartment from its drawn EE (see file comment).
inline void closeEquations(Model& m, Draw& draw)
{
    const std::size_t n = m.size();
    for (std::size_t i = 0; i < n; ++i) {
        Compartment& c = m.compartment(i);
        if (!c.isLiving()) continue;
        double demand = m.totalCatch(i) + c.valueOr(Param::NetEmigration, 0.0) + c.valueOr(Param::BiomassAccum, 0.0);
        for (std::size_t j = 0; j < n; ++j)
            if (m.compartment(j).kind == CompartmentKind::Consumer)
                demand += m.diet(j, i) * *m.compartment(j).value(Param::Biomass) * *m.compartment(j).value(Param::QB);
        const double ee = draw.uniform(0.2, 0.95);
        c.value(Param::EE) = ee;
        c.value(Param::PB) = demand / (*c.value(Param::Biomass) * ee);
    }
}

// n compartments (n >= 6): 1-3 producers, 1-2 detritus pools, the rest consumers,
// in shuffled order. Consumers eat 1-4 prey among producers, pools and lower-ranked
// consumers, sometimes themselves (cannibalism), sometimes a higher-ranked consumer
// (a feeding loop), sometimes some import. Every living compartment has some
// predation or catch, so no EE is 0.
inline Model randomConsistentModel(std::size_t n, std::uint64_t seed)
{
    Draw draw(seed);
    const std::size_t producers = 1 + draw.index(3), pools = 1 + draw.index(2);
    std::vector<CompartmentKind> kinds;
    for (std::size_t i = 0; i < n; ++i)
        kinds.push_back(i < producers           ? CompartmentKind::Producer
                        : i < producers + pools ? CompartmentKind::Detritus
                                                : CompartmentKind::Consumer);
    for (std::size_t i = n - 1; i > 0; --i) std::swap(kinds[i], kinds[draw.index(i + 1)]);

    Model m;
    std::vector<std::size_t> basal, consumers;  // consumers in rank order
    for (std::size_t i = 0; i < n; ++i) {
        Compartment c;
        c.kind = kinds[i];
        c.name = std::string(c.kind == CompartmentKind::Producer   ? "Producer "
                             : c.kind == CompartmentKind::Detritus ? "Pool "
                                                                   : "Consumer ") +
                 std::to_string(i + 1);
        if (c.kind == CompartmentKind::Producer) c.value(Param::Biomass) = draw.logUniform(20, 500);
        if (c.kind == CompartmentKind::Consumer) {
            c.value(Param::Biomass) = draw.logUniform(0.05, 40);
            c.value(Param::QB) = draw.logUniform(2, 60);
            if (draw.chance(0.7)) c.value(Param::Unassim) = draw.uniform(0.1, 0.4);
        }
        if (c.kind == CompartmentKind::Detritus && draw.chance(0.3)) c.value(Param::DetritusImport) = draw.uniform(0, 50);
        if (c.isLiving() && draw.chance(0.1)) c.value(Param::NetEmigration) = draw.uniform(0, 0.2) * *c.value(Param::Biomass);
        if (c.isLiving() && draw.chance(0.1)) c.value(Param::BiomassAccum) = draw.uniform(0, 0.1) * *c.value(Param::Biomass);
        m.addCompartment(std::move(c));
        (kinds[i] == CompartmentKind::Consumer ? consumers : basal).push_back(i);
    }
    for (std::size_t r = 0; r < consumers.size(); ++r) {
        const std::size_t j = consumers[r];
        std::vector<std::size_t> candidates = basal;
        for (std::size_t q = 0; q < r; ++q) candidates.push_back(consumers[q]);
        std::vector<double> weight(n, 0.0);
        const std::size_t preyCount = 1 + draw.index(4);
        for (std::size_t k = 0; k < preyCount; ++k) weight[candidates[draw.index(candidates.size())]] += draw.uniform(0.2, 1);
        if (draw.chance(0.25)) weight[j] += draw.uniform(0.02, 0.2);                                  // cannibalism
        if (r + 1 < consumers.size() && draw.chance(0.15)) weight[consumers[r + 1 + draw.index(consumers.size() - r - 1)]] += draw.uniform(0.02, 0.2);  // loop
        const double import = draw.chance(0.2) ? draw.uniform(0.05, 0.3) : 0.0;
        double sum = 0;
        for (double w : weight) sum += w;
        for (std::size_t i = 0; i < n; ++i)
            if (weight[i] > 0) m.setDiet(j, i, (1.0 - import) * weight[i] / sum);
        m.setDietImport(j, import);
    }
    // Two fleets; anything nobody eats is harvested, plus some random catch.
    m.addFleet("Nets");
    m.addFleet("Lines");
    m.fleet(1).discardPool = m.detritusPools().back();
    for (std::size_t i : m.living()) {
        bool eaten = false;
        for (std::size_t j : consumers) eaten = eaten || (j != i && m.diet(j, i) > 0);  // cannibalism alone would leave B undetermined
        const double b = *m.compartment(i).value(Param::Biomass);
        if (!eaten || draw.chance(0.3)) m.fleet(0).landings[i] = draw.uniform(0.02, 0.3) * b;
        if (draw.chance(0.2)) {
            m.fleet(1).discards[i] = draw.uniform(0.01, 0.1) * b;
            m.fleet(1).discardSurvival[i] = draw.uniform(0, 0.5);
        }
    }
    // With two pools, some sources split their detritus explicitly.
    const std::vector<std::size_t> poolIndex = m.detritusPools();
    if (poolIndex.size() == 2)
        for (std::size_t i : m.living())
            if (draw.chance(0.4)) {
                const double share = draw.uniform(0.1, 0.9);
                m.setRouting(i, poolIndex[0], share);
                m.setRouting(i, poolIndex[1], 1.0 - share);
            }
    closeEquations(m, draw);
    return m;
}

}  // namespace tl::testing
