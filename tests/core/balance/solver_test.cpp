// Tests of the mass-balance solver (Polovina 1984; Christensen & Pauly 1992).
#include "core/balance/solver.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "core/balance/balance_codes.h"
#include "tests/core/balance/random_model.h"

namespace tl {
namespace {

Compartment make(std::string name, CompartmentKind kind,
                 std::initializer_list<std::pair<Param, double>> values = {})
{
    Compartment c;
    c.name = std::move(name);
    c.kind = kind;
    for (auto [p, v] : values) c.value(p) = v;
    return c;
}

// Four-level chain with 10 % gross efficiency (P/Q = 0.1) at every consumer, every
// consumer eating half of its prey's production (common practice, no source: the
// textbook "ten per cent" chain). Expected values worked by hand:
//   Alga      P = 100 x 20 = 2000, eaten 1000           -> EE 0.5
//   Grazer    Q = 10 x 100 = 1000, P = 100, eaten 50    -> EE 0.5, R = 0.8 x 1000 - 100 = 700
//   Carnivore Q = 0.5 x 100 = 50,  P = 5,   eaten 2.5   -> EE 0.5
//   Top       Q = 0.025 x 100 = 2.5, P = 0.25, catch 0.2 -> EE 0.8
// Detritus inflow = sum (1-EE) P + 0.2 Q = 1000 + 250 + 12.5 + 0.55 = 1263.05, all exported.
Model tenPercentChain()
{
    Model m;
    m.addCompartment(make("Alga", CompartmentKind::Producer, {{Param::Biomass, 100}, {Param::PB, 20}}));
    m.addCompartment(make("Grazer", CompartmentKind::Consumer,
                          {{Param::Biomass, 10}, {Param::PB, 10}, {Param::QB, 100}}));
    m.addCompartment(make("Carnivore", CompartmentKind::Consumer,
                          {{Param::Biomass, 0.5}, {Param::PB, 10}, {Param::QB, 100}}));
    m.addCompartment(make("Top", CompartmentKind::Consumer,
                          {{Param::Biomass, 0.025}, {Param::PB, 10}, {Param::QB, 100}}));
    m.addCompartment(make("Detritus", CompartmentKind::Detritus));
    m.setDiet(1, 0, 1.0);
    m.setDiet(2, 1, 1.0);
    m.setDiet(3, 2, 1.0);
    m.addFleet("Nets");
    m.fleet(0).landings[3] = 0.2;
    return m;
}

TEST(SolverChain, TenPercentChainGivesHandWorkedEEProductionAndLevels)
{
    const BalanceSheet sheet = solveBalance(tenPercentChain());
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced) << (sheet.problems.empty() ? "" : sheet.problems[0].message);
    ASSERT_EQ(sheet.rows.size(), 5u);
    const double ee[] = {0.5, 0.5, 0.5, 0.8};
    const double production[] = {2000, 100, 5, 0.25};
    for (int i = 0; i < 4; ++i) {
        EXPECT_NEAR(sheet.rows[i].ee, ee[i], 1e-12) << sheet.rows[i].name;
        EXPECT_NEAR(sheet.rows[i].production, production[i], 1e-12 * production[i]) << sheet.rows[i].name;
        EXPECT_NEAR(sheet.rows[i].tl, i + 1.0, 1e-12) << sheet.rows[i].name;
        EXPECT_NEAR(sheet.rows[i].oi, 0.0, 1e-12) << sheet.rows[i].name;
        EXPECT_EQ(sheet.rows[i].solved, std::vector<Param>{Param::EE});
    }
    EXPECT_NEAR(sheet.rows[1].respiration, 700.0, 1e-9);
    EXPECT_NEAR(sheet.rows[1].pq, 0.1, 1e-15);
    EXPECT_NEAR(sheet.rows[1].netEfficiency, 0.125, 1e-15);  // 100 / (0.8 x 1000)
    EXPECT_NEAR(sheet.rows[1].m2, 5.0, 1e-12);                // 50 / 10
    EXPECT_NEAR(sheet.rows[1].m0, 5.0, 1e-12);                // 10 x (1 - 0.5)
    EXPECT_NEAR(sheet.rows[3].f, 8.0, 1e-12);                 // 0.2 / 0.025
    EXPECT_NEAR(sheet.rows[4].tl, 1.0, 0.0);
    EXPECT_NEAR(sheet.rows[4].detritusInflow, 1263.05, 1e-9);
    EXPECT_NEAR(sheet.rows[4].detritusExport, 1263.05, 1e-9);
    EXPECT_NEAR(sheet.rows[4].ee, 0.0, 0.0);
}

TEST(SolverChain, PredatorBiomassSolvedFromItsOwnEE)
{
    Model m = tenPercentChain();
    m.compartment(2).value(Param::Biomass).reset();
    m.compartment(2).value(Param::EE) = 0.5;
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced);
    EXPECT_NEAR(sheet.rows[2].biomass, 0.5, 1e-12);
    EXPECT_NEAR(sheet.rows[1].ee, 0.5, 1e-12);  // depends on the solved B through predation
    EXPECT_EQ(sheet.rows[2].solved, std::vector<Param>{Param::Biomass});
}


// ---------------------------------------------------------------------------------
// Round trip: hide one value per compartment of a consistent model, solve, compare.

struct Hidden {
    std::size_t compartment;
    Param param;
    double value;
};

struct HideStats {
    int predatorBiomass = 0, cannibalBiomass = 0, qbThroughPrey = 0, total = 0;
};

// Hides at most one of B, P/B, Q/B, EE per living compartment such that every
// unknown can be matched to its own equation row (B, P/B, EE; Q/B of a cannibal) or
// to a prey's row nobody else needs (Q/B): a structurally full-rank system.
std::vector<Hidden> hideValues(Model& m, testing::Draw& draw, HideStats& stats)
{
    const std::size_t n = m.size();
    std::vector<std::size_t> order = m.living();
    for (std::size_t i = order.size() - 1; i > 0; --i) std::swap(order[i], order[draw.index(i + 1)]);
    std::vector<bool> claimed(n, false);
    std::vector<std::optional<Param>> choice(n);
    for (std::size_t i : order) {
        const double r = draw.uniform();
        const bool consumer = m.compartment(i).kind == CompartmentKind::Consumer;
        if (r < 0.15) continue;
        choice[i] = r < 0.4 ? Param::EE : r < 0.65 ? Param::Biomass : r < 0.8 ? Param::PB : consumer ? Param::QB : Param::EE;
        if (choice[i] != Param::QB) claimed[i] = true;
    }
    for (std::size_t j : order) {
        if (choice[j] != Param::QB) continue;
        std::optional<std::size_t> row;
        if (m.diet(j, j) > 0 && !claimed[j]) row = j;
        for (std::size_t i = 0; i < n && !row; ++i)
            if (m.compartment(i).isLiving() && m.diet(j, i) > 0 && !claimed[i]) row = i;
        if (row) {
            claimed[*row] = true;
            if (*row != j) ++stats.qbThroughPrey;
        } else {
            choice[j].reset();
        }
    }
    std::vector<Hidden> hidden;
    for (std::size_t i : order) {
        if (!choice[i]) continue;
        Compartment& c = m.compartment(i);
        hidden.push_back({i, *choice[i], *c.value(*choice[i])});
        c.value(*choice[i]).reset();
        if (*choice[i] == Param::Biomass && c.kind == CompartmentKind::Consumer) {
            ++stats.predatorBiomass;
            stats.cannibalBiomass += m.diet(i, i) > 0;
        }
    }
    stats.total += static_cast<int>(hidden.size());
    return hidden;
}

double solvedValue(const CompartmentBalance& row, Param p)
{
    switch (p) {
    case Param::Biomass: return row.biomass;
    case Param::PB: return row.pb;
    case Param::QB: return row.qb;
    default: return row.ee;
    }
}

TEST(SolverRoundTrip, HiddenValuesComeBackWithin1e9Relative)
{
    HideStats stats;
    int systems = 0, overdetermined = 0;
    for (std::uint64_t seed = 1; seed <= 300; ++seed) {
        const std::size_t n = 8 + seed % 18;  // 8..25 compartments
        const Model original = testing::randomConsistentModel(n, seed);
        ASSERT_EQ(solveBalance(original).status == BalanceStatus::Invalid, false) << "seed " << seed;
        testing::Draw draw(seed * 7919);
        for (int pattern = 0; pattern < 4; ++pattern) {
            Model m = original;
            const std::vector<Hidden> hidden = hideValues(m, draw, stats);
            const BalanceSheet sheet = solveBalance(m);
            ASSERT_NE(sheet.status, BalanceStatus::Invalid)
                << "seed " << seed << " pattern " << pattern << ": "
                << (sheet.problems.empty() ? "" : sheet.problems.front().message);
            ++systems;
            overdetermined += hidden.size() < m.living().size();
            for (const Hidden& h : hidden) {
                const CompartmentBalance& row = sheet.rows[h.compartment];
                EXPECT_NEAR(solvedValue(row, h.param), h.value, 1e-9 * std::abs(h.value))
                    << "seed " << seed << " pattern " << pattern << " " << row.name << " " << paramSymbol(h.param);
                EXPECT_NE(std::find(row.solved.begin(), row.solved.end(), h.param), row.solved.end());
            }
            for (const Problem& p : sheet.problems) EXPECT_NE(p.code, code::kEquationResidual) << p.message;
        }
    }
    // The random choices did exercise the hard cases.
    EXPECT_GT(stats.predatorBiomass, 100);
    EXPECT_GT(stats.cannibalBiomass, 20);
    EXPECT_GT(stats.qbThroughPrey, 50);
    EXPECT_GT(overdetermined, 100);
    EXPECT_EQ(systems, 1200);
}

// ---------------------------------------------------------------------------------
// Conservation: every flow is accounted for.

TEST(SolverConservation, ConsumersAndPoolsCloseTheirBudgets)
{
    for (std::uint64_t seed = 1000; seed < 1100; ++seed) {
        Model m = testing::randomConsistentModel(8 + seed % 18, seed);
        testing::Draw draw(seed);
        HideStats stats;
        hideValues(m, draw, stats);
        const BalanceSheet sheet = solveBalance(m);
        ASSERT_NE(sheet.status, BalanceStatus::Invalid);
        std::vector<double> inflow(m.size(), 0.0);
        double living = 0.0;
        for (std::size_t i = 0; i < m.size(); ++i) {
            const CompartmentBalance& r = sheet.rows[i];
            if (r.kind == CompartmentKind::Detritus) {
                inflow[i] += m.compartment(i).valueOr(Param::DetritusImport, 0.0);
                continue;
            }
            const double scale = std::max({std::abs(r.production), std::abs(r.consumption), 1e-300});
            if (r.kind == CompartmentKind::Consumer) {  // Q = P + R + U Q
                EXPECT_NEAR(r.consumption, r.production + r.respiration + r.unassim * r.consumption, 1e-9 * scale);
            }
            // P = predation + Y + E + BA + M0 B (production fully partitioned)
            EXPECT_NEAR(r.production, r.predation + r.catchTotal + r.netEmigration + r.biomassAccum + r.m0 * r.biomass,
                        1e-9 * scale)
                << r.name;
            // Routed to pools: (1-EE) P + U Q by routing, dead discards by fleet.
            const double own = r.flowToDetritus - m.deadDiscards(i);
            for (std::size_t d : m.detritusPools()) inflow[d] += m.effectiveRouting(i, d) * own;
            for (const Fleet& f : m.fleets())
                inflow[f.discardPool.value_or(m.detritusPools().front())] += f.discards[i] * (1 - f.discardSurvival[i]);
            living += r.flowToDetritus;
        }
        double pooled = 0.0, imports = 0.0;
        for (std::size_t d : m.detritusPools()) {
            const CompartmentBalance& r = sheet.rows[d];
            EXPECT_NEAR(r.detritusInflow, inflow[d], 1e-9 * std::abs(inflow[d])) << r.name;
            EXPECT_NEAR(r.detritusInflow, r.detritusConsumption + r.detritusExport + r.biomassAccum,
                        1e-9 * std::abs(r.detritusInflow));
            double eaten = 0.0;
            for (std::size_t j = 0; j < m.size(); ++j)
                if (m.compartment(j).kind == CompartmentKind::Consumer) eaten += m.diet(j, d) * sheet.rows[j].consumption;
            EXPECT_NEAR(r.detritusConsumption, eaten, 1e-9 * std::max(eaten, 1.0));
            pooled += r.detritusInflow;
            imports += m.compartment(d).valueOr(Param::DetritusImport, 0.0);
        }
        EXPECT_NEAR(pooled, living + imports, 1e-9 * pooled);  // nothing lost between living and pools
    }
}

}  // namespace
}  // namespace tl
