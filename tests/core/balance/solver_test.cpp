// Tests of the mass-balance solver (Polovina 1984; Christensen & Pauly 1992).
#include "core/balance/solver.h"

#include <gtest/gtest.h>

#include "core/balance/balance_codes.h"

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

}  // namespace
}  // namespace tl
