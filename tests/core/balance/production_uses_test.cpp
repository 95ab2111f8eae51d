// Who takes a compartment's production, and the EE-above-1 check that names the
// largest takers (hand-worked small web; no published source needed: it is bookkeeping).
#include "core/balance/production_uses.h"

#include <gtest/gtest.h>

#include "core/balance/balance_codes.h"
#include "core/balance/solver.h"

namespace tl {
namespace {

// Midge: B 10, P/B 1 -> P 10, EE solved. Perch (B 2, Q/B 5 -> Q 10) eats 60 % midges: 6.
// Ruffe (B 1, Q/B 4 -> Q 4) eats 50 % midges: 2. Gillnets land 4 midges (invented).
// Uses: Perch 6 (60 %), Gillnets 4 (40 %), Ruffe 2 (20 %); EE = 12 / 10 = 1.2.
Model overEatenMidges()
{
    Model m;
    const auto add = [&m](std::string name, CompartmentKind kind, std::initializer_list<std::pair<Param, double>> v) {
        Compartment c;
        c.name = std::move(name);
        c.kind = kind;
        for (auto [p, x] : v) c.value(p) = x;
        return m.addCompartment(std::move(c));
    };
    const std::size_t alga = add("Alga", CompartmentKind::Producer, {{Param::Biomass, 50}, {Param::PB, 10}});
    const std::size_t midge = add("Midge", CompartmentKind::Consumer, {{Param::Biomass, 10}, {Param::PB, 1}, {Param::QB, 5}});
    const std::size_t perch = add("Perch", CompartmentKind::Consumer,
                                  {{Param::Biomass, 2}, {Param::PB, 0.5}, {Param::QB, 5}, {Param::EE, 0.1}});
    const std::size_t ruffe = add("Ruffe", CompartmentKind::Consumer,
                                  {{Param::Biomass, 1}, {Param::PB, 0.6}, {Param::QB, 4}, {Param::EE, 0.1}});
    add("Detritus", CompartmentKind::Detritus, {});
    m.setDiet(midge, alga, 1.0);
    m.setDiet(perch, midge, 0.6);
    m.setDiet(perch, alga, 0.4);
    m.setDiet(ruffe, midge, 0.5);
    m.setDiet(ruffe, alga, 0.5);
    m.addFleet("Gillnets");
    m.fleet(0).landings[midge] = 4;
    return m;
}

TEST(ProductionUses, ListsPredatorsAndFleetsLargestFirstWithShares)
{
    const Model m = overEatenMidges();
    const BalanceSheet sheet = solveBalance(m);
    const std::vector<ProductionUse> uses = productionUses(m, sheet, 1);
    ASSERT_EQ(uses.size(), 3u);
    EXPECT_EQ(uses[0].name, "Perch");
    EXPECT_EQ(uses[0].kind, ProductionUse::Kind::Predator);
    EXPECT_NEAR(uses[0].amount, 6.0, 1e-12);
    EXPECT_NEAR(uses[0].shareOfProduction, 0.6, 1e-12);
    EXPECT_EQ(uses[1].name, "Gillnets");
    EXPECT_EQ(uses[1].kind, ProductionUse::Kind::Fleet);
    EXPECT_NEAR(uses[1].shareOfProduction, 0.4, 1e-12);
    EXPECT_EQ(uses[2].name, "Ruffe");
    EXPECT_NEAR(uses[2].shareOfProduction, 0.2, 1e-12);
    EXPECT_EQ(describeLargestUses(uses), "Perch 60 %, Gillnets 40 %, Ruffe 20 %");
    EXPECT_EQ(describeLargestUses(uses, 1), "Perch 60 %");
    EXPECT_TRUE(productionUses(m, sheet, 4).empty()) << "a detritus pool has no production";
}

TEST(ProductionUses, EEAboveOneNamesTheLargestTakers)
{
    const BalanceSheet sheet = solveBalance(overEatenMidges());
    ASSERT_EQ(sheet.status, BalanceStatus::Unbalanced);
    EXPECT_NEAR(sheet.rows[1].ee, 1.2, 1e-12);
    const auto it = std::find_if(sheet.problems.begin(), sheet.problems.end(),
                                 [](const Problem& p) { return p.code == code::kEEAboveMax; });
    ASSERT_NE(it, sheet.problems.end());
    EXPECT_EQ(it->compartment, "Midge");
    EXPECT_NE(it->message.find("(share of its production: Perch 60 %, Gillnets 40 %, Ruffe 20 %)"), std::string::npos)
        << it->message;
}

}  // namespace
}  // namespace tl
