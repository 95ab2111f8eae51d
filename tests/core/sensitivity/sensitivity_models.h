// Invented models for the sensitivity tests (test data only, not from any survey).
#pragma once

#include <algorithm>
#include <cstdint>
#include <random>
#include <string>
#include <vector>

#include "core/model/model.h"
#include "tests/support/small_models.h"

namespace tl::testing {

// A pond solvable by hand: Algae (B 20, P/B 100, EE solved), Grazer (B solved; P/B 5,
// Q/B 20, EE 0.8; eats Algae 0.7 and Detritus 0.3; 2 landed), Pike (B 1, P/B 1, Q/B 5,
// EE solved; eats Grazer 0.5, Algae 0.3 and import 0.2; 0.2 landed), Detritus.
inline Model handPond()
{
    Model m;
    m.addCompartment(makeCompartment("Algae", CompartmentKind::Producer, 20.0, 100.0));
    m.addCompartment(makeCompartment("Grazer", CompartmentKind::Consumer, std::nullopt, 5.0, 20.0, 0.8));
    m.addCompartment(makeCompartment("Pike", CompartmentKind::Consumer, 1.0, 1.0, 5.0));
    m.addCompartment(makeCompartment("Detritus", CompartmentKind::Detritus));
    m.setDiet(1, 0, 0.7);
    m.setDiet(1, 3, 0.3);
    m.setDiet(2, 1, 0.5);
    m.setDiet(2, 0, 0.3);
    m.setDietImport(2, 0.2);
    const std::size_t nets = m.addFleet("Nets");
    m.fleet(nets).landings[1] = 2.0;
    m.fleet(nets).landings[2] = 0.2;
    return m;
}

// A consistent random web: every value drawn, EE computed so each equation closes, then
// exactly one value per living compartment left unknown (EE, B, P/B, or P/B and Q/B tied
// by a given P/Q), some Q/B or P/B given through P/Q, cannibalism, import, catches with
// discards, net emigration and biomass accumulation, given U, two detritus pools with
// routing and an import. One unknown each keeps the system square.
inline Model randomSquareWeb(std::uint32_t seed, std::size_t consumers)
{
    std::mt19937 rng(seed);
    auto uniform = [&](double a, double b) { return std::uniform_real_distribution<double>(a, b)(rng); };
    auto chance = [&](double p) { return uniform(0.0, 1.0) < p; };
    Model m;
    m.addCompartment(makeCompartment("producer 1", CompartmentKind::Producer, uniform(20, 60), uniform(40, 120)));
    m.addCompartment(makeCompartment("producer 2", CompartmentKind::Producer, uniform(10, 50), uniform(10, 60)));
    for (std::size_t k = 0; k < consumers; ++k) {
        const double level = static_cast<double>(k) / static_cast<double>(std::max<std::size_t>(consumers, 1));
        const double pb = uniform(0.4, 4.0) * (1.0 - 0.6 * level);
        Compartment c = makeCompartment("consumer " + std::to_string(k + 1), CompartmentKind::Consumer,
                                        uniform(0.3, 6.0) * (1.0 - 0.7 * level), pb, pb / uniform(0.1, 0.3));
        if (chance(0.3)) c.value(Param::Unassim) = uniform(0.1, 0.4);
        m.addCompartment(std::move(c));
    }
    const std::size_t pool1 = m.addCompartment(makeCompartment("detritus 1", CompartmentKind::Detritus));
    const std::size_t pool2 = m.addCompartment(makeCompartment("detritus 2", CompartmentKind::Detritus));
    m.compartment(pool1).value(Param::DetritusImport) = uniform(0.0, 20.0);
    // Diets: 1-4 prey among producers, pools and earlier consumers; sometimes itself.
    for (std::size_t k = 0; k < consumers; ++k) {
        const std::size_t j = 2 + k;
        std::vector<std::size_t> candidates = {0, 1, pool1, pool2};
        for (std::size_t e = 2; e < j; ++e) candidates.push_back(e);
        std::shuffle(candidates.begin(), candidates.end(), rng);
        const std::size_t count = std::min<std::size_t>(candidates.size(), 1 + rng() % 4);
        std::vector<std::size_t> prey(candidates.begin(), candidates.begin() + static_cast<std::ptrdiff_t>(count));
        if (j > 2 && chance(0.15)) prey.push_back(j);  // cannibalism
        std::vector<double> shares(prey.size());
        double total = 0.0;
        for (double& s : shares) total += (s = uniform(0.2, 1.0));
        const double import = chance(0.25) ? uniform(0.05, 0.2) : 0.0;
        for (std::size_t e = 0; e < prey.size(); ++e) m.setDiet(j, prey[e], (1.0 - import) * shares[e] / total);
        if (import > 0.0) m.setDietImport(j, import);
    }
    // Catch: landings and discards (some surviving) on some consumers, two fleets.
    const std::size_t nets = m.addFleet("nets"), traps = m.addFleet("traps");
    m.fleet(traps).discardPool = pool2;
    for (std::size_t k = 0; k < consumers; ++k) {
        const std::size_t i = 2 + k;
        const double b = *m.compartment(i).value(Param::Biomass), pb = *m.compartment(i).value(Param::PB);
        if (chance(0.4)) m.fleet(nets).landings[i] = uniform(0.02, 0.2) * b * pb;
        if (chance(0.3)) {
            m.fleet(traps).discards[i] = uniform(0.01, 0.1) * b * pb;
            m.fleet(traps).discardSurvival[i] = uniform(0.0, 0.5);
        }
    }
    // Routing: some sources split between the pools.
    for (std::size_t i = 0; i < 2 + consumers; ++i)
        if (chance(0.3)) {
            const double share = uniform(0.2, 0.8);
            m.setRouting(i, pool1, share);
            m.setRouting(i, pool2, 1.0 - share);
        }
    // EE that closes each equation: (predation + Y) / P, after a minimum demand from
    // others than itself (an uneaten, unfished top consumer gets a catch).
    for (std::size_t i = 0; i < 2 + consumers; ++i) {
        Compartment& c = m.compartment(i);
        const double production = *c.value(Param::Biomass) * *c.value(Param::PB);
        // Net emigration (negative: immigration) and biomass accumulation on some.
        if (chance(0.25)) c.value(Param::NetEmigration) = uniform(-0.05, 0.1) * production;
        if (chance(0.25)) c.value(Param::BiomassAccum) = uniform(-0.05, 0.05) * production;
        double demand = m.totalCatch(i) + c.valueOr(Param::NetEmigration, 0.0) + c.valueOr(Param::BiomassAccum, 0.0);
        double self = 0.0;
        for (std::size_t j = 2; j < 2 + consumers; ++j) {
            const double eaten = *m.compartment(j).value(Param::Biomass) * *m.compartment(j).value(Param::QB) * m.diet(j, i);
            (j == i ? self : demand) += eaten;
        }
        // Demand other than its own cannibalism (else a solved B would be 0/0).
        if (demand < 0.05 * production) {
            m.fleet(nets).landings[i] += 0.1 * production;
            demand += 0.1 * production;
        }
        c.value(Param::EE) = (demand + self) / production;
    }
    // One unknown per living compartment.
    for (std::size_t i = 0; i < 2 + consumers; ++i) {
        Compartment& c = m.compartment(i);
        const bool consumer = c.kind == CompartmentKind::Consumer;
        const double pq = consumer ? *c.value(Param::PB) / *c.value(Param::QB) : 0.0;
        switch (rng() % (consumer ? 6 : 3)) {
        case 0: c.value(Param::EE).reset(); break;
        case 1: c.value(Param::Biomass).reset(); break;
        case 2: c.value(Param::PB).reset(); break;
        case 3:  // P/B and Q/B tied by P/Q
            c.value(Param::PB).reset();
            c.value(Param::QB).reset();
            c.value(Param::PQ) = pq;
            break;
        case 4:  // Q/B through P/Q, EE solved
            c.value(Param::QB).reset();
            c.value(Param::PQ) = pq;
            c.value(Param::EE).reset();
            break;
        default:  // P/B through P/Q, B solved
            c.value(Param::PB).reset();
            c.value(Param::PQ) = pq;
            c.value(Param::Biomass).reset();
            break;
        }
    }
    return m;
}

}  // namespace tl::testing
