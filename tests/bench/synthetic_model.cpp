// Synthetic benchmark food webs (see synthetic_model.h). Invented numbers; the ranges
// below are plausible orders of magnitude for lake and coastal models (common
// practice, no source), chosen so that every check of the solver passes.
#include "tests/bench/synthetic_model.h"

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "tests/core/balance/random_model.h"

namespace tl::bench {

using tl::testing::Draw;

std::string_view mixKey(UnknownMix mix)
{
    switch (mix) {
    case UnknownMix::EE: return "ee";
    case UnknownMix::EEBiomass: return "ee-biomass";
    case UnknownMix::EEQbPq: return "ee-qb-pq";
    }
    return "ee";
}

std::optional<UnknownMix> parseMix(std::string_view key)
{
    for (UnknownMix m : {UnknownMix::EE, UnknownMix::EEBiomass, UnknownMix::EEQbPq})
        if (mixKey(m) == key) return m;
    return std::nullopt;
}

std::vector<std::size_t> parseSizes(const std::string& list)
{
    std::vector<std::size_t> sizes;
    for (std::string rest = list; !rest.empty();) {
        const auto comma = rest.find(',');
        sizes.push_back(std::stoul(rest.substr(0, comma)));
        rest = comma == std::string::npos ? "" : rest.substr(comma + 1);
    }
    return sizes;
}

namespace {

// A consumer's place in the web: its layer (1 eats producers and detritus; L is the
// top) and its share of production that leaves as catch, E and BA.
struct Plan {
    std::vector<int> layer;          // 0 for producers and pools
    std::vector<double> eeTarget;    // before loops and cannibalism
    std::vector<double> removal;     // (Y + E + BA) / P
    std::vector<double> catchShare;  // Y / P
};

int consumerLayers(std::size_t n) { return n < 30 ? 2 : n < 500 ? 3 : 4; }

// Diet weights of consumer j over its prey, before normalisation.
void drawDiet(Draw& draw, int layer, const std::vector<std::vector<std::size_t>>& byLayer,
              const std::vector<std::size_t>& producers, const std::vector<std::size_t>& pools,
              std::vector<double>& weight)
{
    const auto pickFrom = [&](const std::vector<std::size_t>& v) { return v[draw.index(v.size())]; };
    std::vector<std::size_t> basal = producers;
    basal.insert(basal.end(), pools.begin(), pools.end());
    std::size_t candidates = basal.size();
    for (int l = 1; l < layer; ++l) candidates += byLayer[static_cast<std::size_t>(l)].size();
    const std::size_t preyCount = std::min<std::size_t>(3 + draw.index(8), candidates);
    std::size_t distinct = 0;
    for (std::size_t guard = 0; distinct < preyCount && guard < 20 * preyCount; ++guard) {
        std::size_t prey;
        const double u = draw.uniform();
        if (layer == 1) prey = u < 0.45 ? pickFrom(pools) : pickFrom(producers);
        else if (u < 0.7) prey = pickFrom(byLayer[static_cast<std::size_t>(layer - 1)]);
        else if (u < 0.85) prey = pickFrom(byLayer[1 + draw.index(static_cast<std::size_t>(layer - 1))]);
        else prey = pickFrom(basal);
        if (weight[prey] == 0.0) ++distinct;
        // A dominant prey or two and a tail of minor ones, as stomach contents often show.
        weight[prey] += distinct <= 2 ? draw.uniform(1, 3) : draw.uniform(0.1, 1);
    }
}

}  // namespace

Model syntheticTruth(std::size_t n, std::uint64_t seed)
{
    Draw draw(seed ^ 0x7f4a7c159e3779b9ULL);
    n = std::max<std::size_t>(n, 10);
    const std::size_t producerCount = std::min<std::size_t>(2 + n / 100, 50);
    const std::size_t poolCount = n < 50 ? 1 + draw.index(2) : 1 + draw.index(3);
    const std::size_t consumerCount = n - producerCount - poolCount;
    const int layers = consumerLayers(n);

    // Consumers in a pyramid of layers (sizes in proportion L : L-1 : ... : 1), listed
    // from the top layer down, then producers, then pools.
    std::vector<std::size_t> layerSize(static_cast<std::size_t>(layers) + 1, 0);
    {
        const std::size_t weightSum = static_cast<std::size_t>(layers * (layers + 1) / 2);
        std::size_t assigned = 0;
        for (int l = 1; l <= layers; ++l) {
            const std::size_t size = consumerCount * static_cast<std::size_t>(layers + 1 - l) / weightSum;
            layerSize[static_cast<std::size_t>(l)] = std::max<std::size_t>(size, 1);
            assigned += layerSize[static_cast<std::size_t>(l)];
        }
        layerSize[1] += consumerCount - assigned;  // rounding goes to the bottom layer
    }
    Model m;
    Plan plan;
    std::vector<std::vector<std::size_t>> byLayer(static_cast<std::size_t>(layers) + 1);
    std::vector<std::size_t> producers, pools;
    for (int l = layers; l >= 1; --l)
        for (std::size_t k = 0; k < layerSize[static_cast<std::size_t>(l)]; ++k) {
            Compartment c;
            c.kind = CompartmentKind::Consumer;
            c.name = "consumer L" + std::to_string(l) + "-" + std::to_string(k + 1);
            byLayer[static_cast<std::size_t>(l)].push_back(m.addCompartment(std::move(c)));
            plan.layer.push_back(l);
        }
    for (std::size_t k = 0; k < producerCount; ++k) {
        Compartment c;
        c.kind = CompartmentKind::Producer;
        c.name = "producer " + std::to_string(k + 1);
        producers.push_back(m.addCompartment(std::move(c)));
        plan.layer.push_back(0);
    }
    for (std::size_t k = 0; k < poolCount; ++k) {
        Compartment c;
        c.kind = CompartmentKind::Detritus;
        c.name = "detritus pool " + std::to_string(k + 1);
        c.value(Param::Biomass) = draw.logUniform(5, 200);
        pools.push_back(m.addCompartment(std::move(c)));
        plan.layer.push_back(0);
    }

    // Diets (strictly downward for now; loops and cannibalism come after the biomasses).
    for (int l = 1; l <= layers; ++l)
        for (std::size_t j : byLayer[static_cast<std::size_t>(l)]) {
            std::vector<double> weight(n, 0.0);
            drawDiet(draw, l, byLayer, producers, pools, weight);
            for (std::size_t i = 0; i < n; ++i) m.setDiet(j, i, weight[i]);
        }
    // Everything below the top layer is eaten by someone other than itself.
    {
        std::vector<bool> eaten(n, false);
        for (std::size_t j = 0; j < n; ++j)
            for (const GridEntry& e : m.dietRow(j)) eaten[e.col] = eaten[e.col] || e.col != j;
        for (int l = 0; l < layers; ++l) {
            const std::vector<std::size_t>& prey = l == 0 ? producers : byLayer[static_cast<std::size_t>(l)];
            const std::vector<std::size_t>& above = byLayer[static_cast<std::size_t>(l + 1)];
            for (std::size_t i : prey)
                if (!eaten[i]) m.setDiet(above[draw.index(above.size())], i, draw.uniform(0.2, 1));
        }
    }
    for (std::size_t j = 0; j < n; ++j) {
        if (m.compartment(j).kind != CompartmentKind::Consumer) continue;
        const double import = draw.chance(0.1) ? draw.uniform(0.02, 0.15) : 0.0;
        const double sum = m.dietRowSum(j);
        const std::vector<GridEntry> row(m.dietRow(j).begin(), m.dietRow(j).end());
        for (const GridEntry& e : row) m.setDiet(j, e.col, (1.0 - import) * e.value / sum);
        m.setDietImport(j, import);
    }

    // Rates. Q/B falls with the layer; P/Q 0.08-0.3 keeps R = Q(1-U) - P positive.
    plan.eeTarget.assign(n, 0.0);
    plan.removal.assign(n, 0.0);
    plan.catchShare.assign(n, 0.0);
    static constexpr double kQbLow[] = {0, 20, 6, 3, 1.5}, kQbHigh[] = {0, 120, 30, 12, 6};
    for (std::size_t i = 0; i < n; ++i) {
        Compartment& c = m.compartment(i);
        if (!c.isLiving()) continue;
        const int l = plan.layer[i];
        if (c.kind == CompartmentKind::Producer) {
            c.value(Param::PB) = draw.logUniform(40, 250);
        } else {
            const double qb = draw.logUniform(kQbLow[l], kQbHigh[l]);
            c.value(Param::QB) = qb;
            c.value(Param::PB) = qb * draw.uniform(0.08, 0.3);
            if (draw.chance(0.3)) c.value(Param::Unassim) = draw.uniform(0.1, 0.4);
        }
        const bool top = l == layers;
        plan.eeTarget[i] = top ? 0.0 : draw.uniform(0.2, 0.85);
        if (c.kind == CompartmentKind::Consumer && (top || draw.chance(0.3)))
            plan.catchShare[i] = top ? draw.uniform(0.2, 0.6) : draw.uniform(0.02, 0.1);
        double removal = plan.catchShare[i];
        if (draw.chance(0.1)) removal += draw.uniform(0.0, 0.03);  // E
        if (draw.chance(0.1)) removal += draw.uniform(0.0, 0.03);  // BA
        plan.removal[i] = removal;
    }

    // Biomasses, top-down: the top layer is drawn; below, B_i follows from the demand of
    // the layers above, B_i (P/B)_i (EE_i - removal_i) = sum_j B_j (Q/B)_j DC_ij.
    for (std::size_t j : byLayer[static_cast<std::size_t>(layers)]) m.compartment(j).value(Param::Biomass) = draw.logUniform(0.05, 2);
    // Predation on every compartment, sum_j DC_ij B_j (Q/B)_j, over the consumers whose
    // biomass is set so far.
    const auto predationOnAll = [&] {
        std::vector<double> pred(n, 0.0);
        for (std::size_t j = 0; j < n; ++j) {
            const Compartment& c = m.compartment(j);
            if (c.kind != CompartmentKind::Consumer || !c.value(Param::Biomass)) continue;
            const double q = *c.value(Param::Biomass) * *c.value(Param::QB);
            for (const GridEntry& e : m.dietRow(j)) pred[e.col] += e.value * q;
        }
        return pred;
    };
    for (int l = layers - 1; l >= 0; --l) {
        const std::vector<double> pred = predationOnAll();  // predators all sit in the layers above
        for (std::size_t i : l == 0 ? producers : byLayer[static_cast<std::size_t>(l)]) {
            Compartment& c = m.compartment(i);
            plan.eeTarget[i] = std::max(plan.eeTarget[i], plan.removal[i] + 0.1);
            c.value(Param::Biomass) = pred[i] / (*c.value(Param::PB) * (plan.eeTarget[i] - plan.removal[i]));
        }
    }

    // Harvest and migration as shares of production.
    const std::size_t fleetCount = n < 200 ? 2 : 3;
    static const char* kFleetNames[] = {"trawl", "gillnet", "longline"};
    for (std::size_t f = 0; f < fleetCount; ++f) m.addFleet(kFleetNames[f]);
    if (pools.size() > 1) m.fleet(fleetCount - 1).discardPool = pools.back();
    for (std::size_t i = 0; i < n; ++i) {
        Compartment& c = m.compartment(i);
        if (!c.isLiving()) continue;
        const double p = *c.value(Param::Biomass) * *c.value(Param::PB);
        const double y = plan.catchShare[i] * p;
        if (y > 0) {
            if (draw.chance(0.25)) {  // part of the catch is discarded, some of it survives
                const std::size_t f = fleetCount - 1;
                const double dead = y * draw.uniform(0.1, 0.4), survival = draw.uniform(0.0, 0.5);
                m.fleet(f).discards[i] = dead / (1.0 - survival);
                m.fleet(f).discardSurvival[i] = survival;
                m.fleet(draw.index(fleetCount - 1)).landings[i] = y - dead;
            } else {
                m.fleet(draw.index(fleetCount)).landings[i] = y;
            }
        }
        const double other = plan.removal[i] - plan.catchShare[i];
        if (other > 0) {
            if (draw.chance(0.5)) c.value(Param::NetEmigration) = other * p;
            else c.value(Param::BiomassAccum) = other * p;
        }
    }

    // Cannibalism and feeding loops, each adding 0.01-0.05 of the prey's production to
    // its demand, taken from the predator's largest diet share (the biomasses stay).
    const auto takeFromLargest = [&](std::size_t j, std::size_t i, double share) {
        std::size_t largest = 0;
        double most = 0;
        for (const GridEntry& e : m.dietRow(j))
            if (e.value > most) largest = e.col, most = e.value;
        if (largest == i || share > 0.3 * most) return;
        m.setDiet(j, largest, most - share);
        m.setDiet(j, i, m.diet(j, i) + share);
    };
    const auto consumption = [&](std::size_t j) {
        return *m.compartment(j).value(Param::Biomass) * *m.compartment(j).value(Param::QB);
    };
    const auto production = [&](std::size_t i) {
        return *m.compartment(i).value(Param::Biomass) * *m.compartment(i).value(Param::PB);
    };
    for (int l = 2; l <= layers; ++l)
        for (std::size_t j : byLayer[static_cast<std::size_t>(l)]) {
            if (draw.chance(0.08)) takeFromLargest(j, j, draw.uniform(0.01, 0.05) * production(j) / consumption(j));
            if (l < layers && draw.chance(0.05)) {  // j eats a consumer of the layer above, which eats j's layer
                const auto& above = byLayer[static_cast<std::size_t>(l + 1)];
                const std::size_t i = above[draw.index(above.size())];
                takeFromLargest(j, i, draw.uniform(0.01, 0.05) * production(i) / consumption(j));
            }
        }

    // Detritus routing: with several pools, some sources split their flow.
    if (pools.size() > 1)
        for (std::size_t i = 0; i < n; ++i)
            if (m.compartment(i).isLiving() && draw.chance(0.4)) {
                const std::size_t a = draw.index(pools.size());
                const std::size_t b = (a + 1 + draw.index(pools.size() - 1)) % pools.size();
                const double share = draw.uniform(0.1, 0.9);
                m.setRouting(i, pools[a], share);
                m.setRouting(i, pools[b], 1.0 - share);
            }

    // True EE from the demand (exact closure of every equation).
    const std::vector<double> pred = predationOnAll();
    for (std::size_t i = 0; i < n; ++i) {
        Compartment& c = m.compartment(i);
        if (!c.isLiving()) continue;
        const double demand = pred[i] + m.totalCatch(i) + c.valueOr(Param::NetEmigration, 0.0) +
                              c.valueOr(Param::BiomassAccum, 0.0);
        c.value(Param::EE) = demand / production(i);
    }

    // Detritus import where consumers would eat more than 80 % of a pool's inflow.
    for (std::size_t d : pools) {
        double inflow = 0;
        for (std::size_t i = 0; i < n; ++i) {
            const Compartment& c = m.compartment(i);
            if (!c.isLiving()) continue;
            double flow = (1.0 - *c.value(Param::EE)) * production(i);
            if (c.kind == CompartmentKind::Consumer) flow += c.unassimilatedOrDefault() * consumption(i);
            inflow += m.effectiveRouting(i, d) * flow;
        }
        for (const Fleet& f : m.fleets()) {
            const std::size_t target = f.discardPool.value_or(pools.front());
            if (target != d) continue;
            for (std::size_t i = 0; i < n; ++i) inflow += f.discards[i] * (1.0 - f.discardSurvival[i]);
        }
        const double eaten = pred[d];
        if (eaten > 0.8 * inflow) m.compartment(d).value(Param::DetritusImport) = eaten / 0.8 - inflow;
    }
    return m;
}

namespace {

// Indices of `candidates` in a seeded random order.
std::vector<std::size_t> shuffled(std::vector<std::size_t> v, Draw& draw)
{
    for (std::size_t i = v.size(); i > 1; --i) std::swap(v[i - 1], v[draw.index(i)]);
    return v;
}

}  // namespace

SyntheticModel syntheticModel(std::size_t n, UnknownMix mix, std::uint64_t seed)
{
    SyntheticModel out;
    out.truth = syntheticTruth(n, seed);
    out.model = out.truth;
    Model& m = out.model;
    Draw draw(seed ^ 0x2545f4914f6cdd1dULL ^ (static_cast<std::uint64_t>(mix) << 56));
    const std::vector<std::size_t> living = m.living();
    std::vector<std::size_t> consumers;
    for (std::size_t i : living)
        if (m.compartment(i).kind == CompartmentKind::Consumer) consumers.push_back(i);

    enum class Role { HideEE, HideB, HideQB, FullyGiven, PBFromPQ, QBFromPQ };
    std::vector<Role> role(m.size(), Role::HideEE);
    const auto share = [](std::size_t count, double fraction) {
        return std::max<std::size_t>(1, static_cast<std::size_t>(std::lround(fraction * static_cast<double>(count))));
    };
    if (mix == UnknownMix::EEBiomass) {
        const std::vector<std::size_t> order = shuffled(living, draw);
        for (std::size_t k = 0; k < share(living.size(), 0.1); ++k) role[order[k]] = Role::HideB;
    }
    if (mix == UnknownMix::EEQbPq) {
        const std::vector<std::size_t> order = shuffled(consumers, draw);
        std::size_t next = 0, hidden = 0;
        const std::size_t wanted = share(consumers.size(), 0.05);
        // Q/B hidden: the largest living prey not yet assigned becomes fully given,
        // whose equation then determines the predator's Q/B.
        for (; next < order.size() && hidden < wanted; ++next) {
            const std::size_t j = order[next];
            if (role[j] != Role::HideEE) continue;
            std::optional<std::size_t> anchor;
            double most = 0;
            for (const GridEntry& e : m.dietRow(j))
                if (e.col != j && m.compartment(e.col).isLiving() && role[e.col] == Role::HideEE && e.value > most)
                    anchor = e.col, most = e.value;
            if (!anchor) continue;
            role[j] = Role::HideQB;
            role[*anchor] = Role::FullyGiven;
            ++hidden;
        }
        const std::size_t standIns = share(consumers.size(), 0.1);
        for (std::size_t k = 0; k < standIns && next < order.size(); ++next)
            if (role[order[next]] == Role::HideEE) role[order[next]] = Role::PBFromPQ, ++k;
        for (std::size_t k = 0; k < standIns && next < order.size(); ++next)
            if (role[order[next]] == Role::HideEE) role[order[next]] = Role::QBFromPQ, ++k;
    }

    for (std::size_t i : living) {
        Compartment& c = m.compartment(i);
        const Compartment& t = out.truth.compartment(i);
        switch (role[i]) {
        case Role::HideEE: c.value(Param::EE).reset(), ++out.hiddenEE; break;
        case Role::HideB: c.value(Param::Biomass).reset(), ++out.hiddenBiomass; break;
        case Role::HideQB: c.value(Param::QB).reset(), ++out.hiddenQB; break;
        case Role::FullyGiven: ++out.fullyGiven; break;
        case Role::PBFromPQ:
            c.value(Param::PQ) = *t.value(Param::PB) / *t.value(Param::QB);
            c.value(Param::PB).reset();
            c.value(Param::EE).reset();
            ++out.pbFromPQ, ++out.hiddenEE;
            break;
        case Role::QBFromPQ:
            c.value(Param::PQ) = *t.value(Param::PB) / *t.value(Param::QB);
            c.value(Param::QB).reset();
            c.value(Param::EE).reset();
            ++out.qbFromPQ, ++out.hiddenEE;
            break;
        }
    }
    out.expectedEquations = living.size();
    out.expectedUnknowns = living.size() - out.fullyGiven;
    return out;
}

}  // namespace tl::bench
