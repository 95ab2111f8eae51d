// Small invented food webs for the reconcile tests (test data only, from no survey):
// a hand-written one where one predator over-eats one prey, and seeded random webs of
// 6-12 compartments with every kind of unknown reconcile handles (EE unknown, B unknown
// with EE given, Q/B through P/Q), catch, and EE violations.
#pragma once

#include <algorithm>
#include <cstdint>
#include <random>
#include <string>

#include "core/model/model.h"
#include "tests/support/small_models.h"

namespace tl::testing {

// Algae -> grazers -> small fish -> pike; pike eats small fish far beyond its
// production (EE of small fish = 0.8 x 1.5 x 5 / (1 x 2) = 3).
inline Model overEatingModel()
{
    Model m;
    m.addCompartment(makeCompartment("algae", CompartmentKind::Producer, 20.0, 60.0));
    m.addCompartment(makeCompartment("grazers", CompartmentKind::Consumer, 8.0, 12.0, 50.0));
    m.addCompartment(makeCompartment("small fish", CompartmentKind::Consumer, 1.0, 2.0, 9.0));
    m.addCompartment(makeCompartment("pike", CompartmentKind::Consumer, 1.5, 0.6, 5.0));
    m.addCompartment(makeCompartment("detritus", CompartmentKind::Detritus, 50.0));
    m.setDiet(1, 0, 0.7);  // grazers: algae, detritus
    m.setDiet(1, 4, 0.3);
    m.setDiet(2, 1, 1.0);  // small fish: grazers
    m.setDiet(3, 2, 0.8);  // pike: small fish, grazers
    m.setDiet(3, 1, 0.2);
    return m;
}

// A seeded random web: 2 producers, one or two detritus pools, consumers that eat
// producers, detritus and consumers listed before them. Values are drawn in plausible
// ranges and then consumption is inflated on a few prey, so that some EE exceed 1.
inline Model randomFoodWeb(std::uint32_t seed, std::size_t size)
{
    std::mt19937 rng(seed);
    auto uniform = [&](double a, double b) { return std::uniform_real_distribution<double>(a, b)(rng); };
    auto chance = [&](double p) { return uniform(0.0, 1.0) < p; };
    Model m;
    const std::size_t pools = size >= 9 ? 2 : 1;
    const std::size_t consumers = size - 2 - pools;
    m.addCompartment(makeCompartment("producer 1", CompartmentKind::Producer, uniform(10, 40), uniform(20, 120)));
    m.addCompartment(makeCompartment("producer 2", CompartmentKind::Producer, uniform(5, 60), uniform(2, 30)));
    for (std::size_t k = 0; k < consumers; ++k) {
        const double level = static_cast<double>(k) / static_cast<double>(std::max<std::size_t>(consumers - 1, 1));
        const double b = uniform(0.5, 10.0) * (1.0 - 0.8 * level);
        const double pb = uniform(0.5, 8.0) * (1.0 - 0.7 * level);
        const double pq = uniform(0.1, 0.3);
        Compartment c = makeCompartment("consumer " + std::to_string(k + 1), CompartmentKind::Consumer, b, pb, pb / pq);
        if (k % 5 == 3) {  // Q/B through P/Q
            c.value(Param::QB).reset();
            c.value(Param::PQ) = pq;
        }
        c.confidenceOf(Param::Biomass).grade = static_cast<Confidence::Grade>(1 + rng() % 4);
        c.confidenceOf(Param::PB).grade = static_cast<Confidence::Grade>(1 + rng() % 4);
        if (chance(0.3)) c.confidenceOf(Param::QB).cv = uniform(0.1, 0.6);
        if (chance(0.2)) c.value(Param::Unassim) = uniform(0.15, 0.4);
        m.addCompartment(std::move(c));
    }
    for (std::size_t p = 0; p < pools; ++p) {
        Compartment d = makeCompartment("detritus " + std::to_string(p + 1), CompartmentKind::Detritus, 100.0);
        if (p == 0) d.value(Param::DetritusImport) = uniform(0.0, 50.0);
        m.addCompartment(std::move(d));
    }
    const std::size_t firstPool = 2 + consumers;
    // Diets: 1-4 prey among producers, pools and earlier consumers; shares random.
    for (std::size_t k = 0; k < consumers; ++k) {
        const std::size_t j = 2 + k;
        std::vector<std::size_t> candidates = {0, 1, firstPool};
        if (pools > 1) candidates.push_back(firstPool + 1);
        for (std::size_t e = 2; e < j; ++e) candidates.push_back(e);
        // Higher consumers prefer consumers.
        std::shuffle(candidates.begin(), candidates.end(), rng);
        const std::size_t count = std::min<std::size_t>(candidates.size(), 1 + rng() % 4);
        std::vector<double> shares(count);
        double total = 0.0;
        for (double& s : shares) total += (s = uniform(0.2, 1.0));
        const double import = chance(0.2) ? 0.1 : 0.0;
        for (std::size_t e = 0; e < count; ++e) m.setDiet(j, candidates[e], (1.0 - import) * shares[e] / total);
        if (import > 0.0) m.setDietImport(j, import);
    }
    // B unknown, EE given, on some consumers that are eaten (else the balance gives B = 0).
    for (std::size_t k = 2; k < consumers; k += 4) {
        const std::size_t i = 2 + k;
        bool eaten = false;
        for (std::size_t j = i + 1; j < firstPool; ++j) eaten |= m.diet(j, i) > 0.0;
        if (!eaten || !m.compartment(i).value(Param::QB)) continue;
        m.compartment(i).value(Param::Biomass).reset();
        m.compartment(i).value(Param::EE) = uniform(0.5, 0.9);
    }
    // Routing to the second pool for a few sources.
    if (pools > 1)
        for (std::size_t i = 0; i < firstPool; ++i)
            if (chance(0.3)) {
                m.setRouting(i, firstPool, 0.6);
                m.setRouting(i, firstPool + 1, 0.4);
            }
    // Catch on two consumers.
    m.addFleet("gill nets");
    for (std::size_t k = 0; k < consumers; k += std::max<std::size_t>(2, consumers / 2)) {
        const auto& c = m.compartment(2 + k);
        if (!c.value(Param::Biomass)) continue;
        m.fleet(0).landings[2 + k] = 0.05 * *c.value(Param::Biomass) * *c.value(Param::PB);
    }
    return m;
}

}  // namespace tl::testing
