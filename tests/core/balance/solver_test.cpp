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
        EXPECT_EQ(sheet.rows[i].solved, ParamSet{Param::EE});
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
    EXPECT_EQ(sheet.rows[2].solved, ParamSet{Param::Biomass});
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

// ---------------------------------------------------------------------------------
// Every reported problem, by code and compartment name.

const Problem* findProblem(const BalanceSheet& sheet, std::string_view code, std::string_view compartment)
{
    for (const Problem& p : sheet.problems)
        if (p.code == code && p.compartment == compartment) return &p;
    return nullptr;
}

std::string listProblems(const BalanceSheet& sheet)
{
    std::string out;
    for (const Problem& p : sheet.problems) out += p.code + " [" + p.compartment + "] " + p.message + "\n";
    return out;
}

TEST(SolverProblems, TwoUnknownsNameTheCompartmentAndTheMissingValues)
{
    Model m = tenPercentChain();
    m.compartment(2).value(Param::Biomass).reset();  // Carnivore: B and EE both missing
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Invalid);
    const Problem* p = findProblem(sheet, code::kUnderdetermined, "Carnivore");
    ASSERT_NE(p, nullptr) << listProblems(sheet);
    EXPECT_EQ(p->severity, Severity::Error);
    EXPECT_NE(p->message.find("B, EE"), std::string::npos) << p->message;
    EXPECT_EQ(findProblem(sheet, code::kUnderdetermined, "Grazer"), nullptr);
}

TEST(SolverProblems, PBAndQBBothMissingWithoutPQIsTwoUnknowns)
{
    Model m = tenPercentChain();
    m.compartment(1).value(Param::PB).reset();
    m.compartment(1).value(Param::QB).reset();
    m.compartment(1).value(Param::EE) = 0.5;
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Invalid);
    const Problem* p = findProblem(sheet, code::kUnderdetermined, "Grazer");
    ASSERT_NE(p, nullptr) << listProblems(sheet);
    EXPECT_NE(p->message.find("P/B, Q/B"), std::string::npos) << p->message;
}

TEST(SolverProblems, SingularSystemNamesTheCompartmentsInvolved)
{
    // Grazer's Q/B appears only in Alga's row, which also holds Alga's unknown EE:
    // one equation, two unknowns, the rest of the rows do not involve them.
    Model m = tenPercentChain();
    m.compartment(1).value(Param::QB).reset();
    m.compartment(1).value(Param::EE) = 0.5;
    for (std::size_t i : {2u, 3u}) m.compartment(i).value(Param::EE) = i == 2 ? 0.5 : 0.8;
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Invalid) << listProblems(sheet);
    const Problem* alga = findProblem(sheet, code::kSingularSystem, "Alga");
    const Problem* grazer = findProblem(sheet, code::kSingularSystem, "Grazer");
    ASSERT_NE(alga, nullptr) << listProblems(sheet);
    ASSERT_NE(grazer, nullptr) << listProblems(sheet);
    EXPECT_EQ(grazer->parameter, "qb");
    EXPECT_EQ(alga->parameter, "ee");
    EXPECT_EQ(findProblem(sheet, code::kSingularSystem, "Carnivore"), nullptr);
}

TEST(SolverProblems, SquareSingularSystemWithAnEquationWithoutUnknowns)
{
    // Four rows, four unknowns, but Grazer's row holds none (its Q/B sits in Alga's
    // row): the LU path must see it singular and name both.
    Model m = tenPercentChain();
    m.compartment(1).value(Param::QB).reset();
    m.compartment(1).value(Param::EE) = 0.5;
    m.compartment(3).value(Param::EE).reset();
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Invalid) << listProblems(sheet);
    EXPECT_NE(findProblem(sheet, code::kSingularSystem, "Alga"), nullptr) << listProblems(sheet);
    EXPECT_NE(findProblem(sheet, code::kSingularSystem, "Grazer"), nullptr) << listProblems(sheet);
    EXPECT_EQ(findProblem(sheet, code::kSingularSystem, "Top"), nullptr) << listProblems(sheet);
}

TEST(SolverProblems, CannibalEatenOnlyByItselfHasUndeterminedBiomass)
{
    // B (P/B EE - Q/B DC_ii) = 0 with P/B EE = Q/B DC_ii: any B satisfies it.
    Model m;
    Compartment alga = make("Alga", CompartmentKind::Producer, {{Param::Biomass, 100}, {Param::PB, 10}});
    m.addCompartment(alga);
    m.addCompartment(make("Pike", CompartmentKind::Consumer, {{Param::PB, 0.6}, {Param::QB, 3}, {Param::EE, 0.1}}));
    m.addCompartment(make("Detritus", CompartmentKind::Detritus));
    m.setDiet(1, 0, 0.98);
    m.setDiet(1, 1, 0.02);  // 3 x 0.02 = 0.06 = 0.6 x 0.1
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Invalid);
    ASSERT_NE(findProblem(sheet, code::kSingularSystem, "Pike"), nullptr) << listProblems(sheet);
}

TEST(SolverProblems, EEAboveOneUnbalancesAndNamesTheCompartment)
{
    Model m = tenPercentChain();
    m.compartment(0).value(Param::PB) = 5;  // Alga produces 500, Grazer eats 1000
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Unbalanced);
    EXPECT_NEAR(sheet.rows[0].ee, 2.0, 1e-12);
    const Problem* p = findProblem(sheet, code::kEEAboveMax, "Alga");
    ASSERT_NE(p, nullptr) << listProblems(sheet);
    EXPECT_EQ(p->parameter, "ee");
    EXPECT_EQ(sheet.problems.size(), 1u) << listProblems(sheet);
}

TEST(SolverProblems, EEMaxRuleIsHonoured)
{
    Model m = tenPercentChain();
    m.rules.eeMax = 0.7;  // Top's EE is 0.8
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Unbalanced);
    EXPECT_NE(findProblem(sheet, code::kEEAboveMax, "Top"), nullptr) << listProblems(sheet);
    EXPECT_EQ(findProblem(sheet, code::kEEAboveMax, "Carnivore"), nullptr);
}

TEST(SolverProblems, NegativeRespiration)
{
    Model m = tenPercentChain();
    m.compartment(1).value(Param::Unassim) = 0.95;  // assimilates 50, produces 100
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Unbalanced);
    EXPECT_NEAR(sheet.rows[1].respiration, -50.0, 1e-9);
    EXPECT_NE(findProblem(sheet, code::kNegativeRespiration, "Grazer"), nullptr) << listProblems(sheet);
}

TEST(SolverProblems, PQOutsideRuleOfThumbIsAWarningOnly)
{
    Model m = tenPercentChain();
    m.compartment(1).value(Param::PB) = 60;  // P/Q = 0.6 > 0.5
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Balanced) << listProblems(sheet);
    const Problem* p = findProblem(sheet, code::kPQOutOfRange, "Grazer");
    ASSERT_NE(p, nullptr) << listProblems(sheet);
    EXPECT_EQ(p->severity, Severity::Warning);
    m.compartment(3).value(Param::QB) = 300;  // Top P/Q = 0.033 < 0.05
    EXPECT_NE(findProblem(solveBalance(m), code::kPQOutOfRange, "Top"), nullptr);
}

TEST(SolverProblems, FullyGivenEquationThatDoesNotCloseReportsItsResidual)
{
    Model m = tenPercentChain();
    m.compartment(1).value(Param::EE) = 0.4;  // Grazer fully given; 40 produced-and-used vs 50 eaten
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Unbalanced);
    const Problem* p = findProblem(sheet, code::kEquationResidual, "Grazer");
    ASSERT_NE(p, nullptr) << listProblems(sheet);
    EXPECT_NEAR(sheet.rows[1].residual, -10.0, 1e-9);
    EXPECT_NE(p->message.find("-10"), std::string::npos) << p->message;
    EXPECT_NE(p->message.find("would close it is 0.5"), std::string::npos) << p->message;
    for (const char* other : {"Alga", "Carnivore", "Top"})
        EXPECT_EQ(findProblem(sheet, code::kEquationResidual, other), nullptr) << other;
}

TEST(SolverProblems, NegativeSolvedValue)
{
    Model m = tenPercentChain();
    m.compartment(0).value(Param::NetEmigration) = -1500;  // immigration beyond use: EE = (1000 - 1500) / 2000
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Unbalanced);
    EXPECT_NEAR(sheet.rows[0].ee, -0.25, 1e-12);
    const Problem* p = findProblem(sheet, code::kNegativeSolvedValue, "Alga");
    ASSERT_NE(p, nullptr) << listProblems(sheet);
    EXPECT_EQ(p->parameter, "ee");
}

TEST(SolverProblems, DetritusConsumedBeyondInflow)
{
    Model m = tenPercentChain();
    const std::size_t worm = m.addCompartment(
        make("Worm", CompartmentKind::Consumer, {{Param::Biomass, 100}, {Param::PB, 2}, {Param::QB, 20}, {Param::EE, 0}}));
    m.setDiet(worm, 4, 1.0);  // eats 2000 of a pool that receives ~1263 + 400 egested by the worm
    m.compartment(worm).value(Param::EE).reset();
    m.fleet(0).landings[worm] = 10;
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Unbalanced);
    const Problem* p = findProblem(sheet, code::kDetritusEEAboveOne, "Detritus");
    ASSERT_NE(p, nullptr) << listProblems(sheet);
    EXPECT_GT(sheet.rows[4].ee, 1.0);
    EXPECT_LT(sheet.rows[4].detritusExport, 0.0);
}

// ---------------------------------------------------------------------------------
// P/Q standing in for P/B or Q/B (DESIGN 3.2).

TEST(SolverPQ, StandsInForPB)
{
    Model m = tenPercentChain();
    m.compartment(1).value(Param::PB).reset();
    m.compartment(1).value(Param::PQ) = 0.1;
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced) << listProblems(sheet);
    EXPECT_NEAR(sheet.rows[1].pb, 10.0, 1e-12);
    EXPECT_NEAR(sheet.rows[1].ee, 0.5, 1e-12);
    EXPECT_EQ(sheet.rows[1].solved, (ParamSet{Param::PB, Param::EE}));
}

TEST(SolverPQ, StandsInForQBAndFeedsThePreyEquation)
{
    Model m = tenPercentChain();
    m.compartment(1).value(Param::QB).reset();
    m.compartment(1).value(Param::PQ) = 0.1;
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced) << listProblems(sheet);
    EXPECT_NEAR(sheet.rows[1].qb, 100.0, 1e-12);
    EXPECT_NEAR(sheet.rows[0].ee, 0.5, 1e-12);  // Alga's EE needs Grazer's Q
    EXPECT_EQ(sheet.rows[1].solved, (ParamSet{Param::QB, Param::EE}));
}

TEST(SolverPQ, TiesPBAndQBWhenBothAreMissing)
{
    Model m = tenPercentChain();
    m.compartment(1).value(Param::PB).reset();
    m.compartment(1).value(Param::QB).reset();
    m.compartment(1).value(Param::PQ) = 0.1;
    m.compartment(1).value(Param::EE) = 0.5;
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced) << listProblems(sheet);
    EXPECT_NEAR(sheet.rows[1].qb, 100.0, 1e-10);
    EXPECT_NEAR(sheet.rows[1].pb, 10.0, 1e-11);
    EXPECT_NEAR(sheet.rows[0].ee, 0.5, 1e-12);
}

TEST(SolverPQ, StandsInForPBOfAPredatorWhoseBiomassIsSolved)
{
    Model m = tenPercentChain();
    m.compartment(2).value(Param::PB).reset();
    m.compartment(2).value(Param::PQ) = 0.1;
    m.compartment(2).value(Param::Biomass).reset();
    m.compartment(2).value(Param::EE) = 0.5;
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_EQ(sheet.status, BalanceStatus::Balanced) << listProblems(sheet);
    EXPECT_NEAR(sheet.rows[2].biomass, 0.5, 1e-12);
    EXPECT_NEAR(sheet.rows[2].pb, 10.0, 1e-12);
}

TEST(SolverPQ, InconsistentPQIsWarnedAndIgnored)
{
    Model m = tenPercentChain();
    m.compartment(1).value(Param::PQ) = 0.3;  // P/B / Q/B = 0.1
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Balanced);
    EXPECT_NE(findProblem(sheet, code::kPQInconsistent, "Grazer"), nullptr) << listProblems(sheet);
    EXPECT_NEAR(sheet.rows[1].pq, 0.1, 1e-15);
}

TEST(SolverPQ, NonPositivePQCannotStandIn)
{
    Model m = tenPercentChain();
    m.compartment(1).value(Param::QB).reset();
    m.compartment(1).value(Param::PQ) = 0.0;
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Invalid);
    EXPECT_NE(findProblem(sheet, code::kInvalidValue, "Grazer"), nullptr) << listProblems(sheet);
}

// ---------------------------------------------------------------------------------
// Harvest and routing reach the right pools.

TEST(SolverDetritus, DeadDiscardsGoToTheFleetPoolAndRoutingSplitsTheRest)
{
    Model m = tenPercentChain();
    const std::size_t sediment = m.addCompartment(make("Sediment", CompartmentKind::Detritus));
    m.fleet(0).discards[2] = 0.5;            // Carnivore: 0.5 discarded, 40 % survive -> 0.3 dead
    m.fleet(0).discardSurvival[2] = 0.4;
    m.fleet(0).discardPool = sediment;
    m.setRouting(1, 4, 0.25);                // Grazer's 250 split 1:3
    m.setRouting(1, sediment, 0.75);
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_NE(sheet.status, BalanceStatus::Invalid) << listProblems(sheet);
    // Carnivore EE now (2.5 + 0.3) / 5 = 0.56
    EXPECT_NEAR(sheet.rows[2].ee, 0.56, 1e-12);
    EXPECT_NEAR(sheet.rows[2].catchTotal, 0.3, 1e-15);
    // Pool "Detritus": Alga 1000 + Grazer 62.5 + Carnivore (0.44 x 5 + 10) + Top 0.55
    EXPECT_NEAR(sheet.rows[4].detritusInflow, 1000 + 62.5 + 12.2 + 0.55, 1e-9);
    // Sediment: Grazer 187.5 + dead discards 0.3
    EXPECT_NEAR(sheet.rows[sediment].detritusInflow, 187.8, 1e-9);
    EXPECT_NEAR(sheet.rows[2].flowToDetritus, 12.5, 1e-12);  // 2.2 + 10 + 0.3
}

TEST(SolverDetritus, NoPoolIsWarned)
{
    Model m = tenPercentChain();
    m.removeCompartment(4);
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Balanced);
    EXPECT_NE(findProblem(sheet, code::kNoDetritusPool, ""), nullptr) << listProblems(sheet);
}

}  // namespace
}  // namespace tl
