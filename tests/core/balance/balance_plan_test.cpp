// The structural/numeric split: one plan and workspace reused over changing inputs
// (what the ensemble does) gives exactly what a fresh solve of each model gives.
#include "core/balance/balance_plan.h"

#include <gtest/gtest.h>

#include <cmath>

#include "core/balance/solver.h"
#include "tests/core/balance/random_model.h"

namespace tl {
namespace {

// Bitwise-same results, NaN (undefined) matching NaN.
#define EXPECT_SAME(a, b) \
    EXPECT_TRUE((std::isnan(a) && std::isnan(b)) || (a) == (b)) << #a " = " << (a) << ", " #b " = " << (b) << " "

TEST(BalancePlan, ReusedWorkspaceMatchesFreshSolvesOverChangingInputs)
{
    for (std::uint64_t seed = 500; seed < 520; ++seed) {
        Model base = testing::randomConsistentModel(10 + seed % 15, seed);
        std::size_t k = 0;
        for (std::size_t i : base.living())
            if (k++ % 3 != 2) base.compartment(i).value(k % 2 ? Param::EE : Param::Biomass).reset();
        const BalancePlan plan = BalancePlan::build(base);
        ASSERT_FALSE(plan.hasStructuralErrors());
        BalanceWorkspace ws = plan.makeWorkspace();
        BalanceValues out = plan.makeValues();
        testing::Draw draw(seed);
        for (int draws = 0; draws < 10; ++draws) {
            // A "draw": every given B, P/B, Q/B and the diet perturbed (diet rows renormalised).
            Model m = base;
            for (std::size_t i = 0; i < m.size(); ++i)
                for (Param p : {Param::Biomass, Param::PB, Param::QB, Param::EE})
                    if (auto& v = m.compartment(i).value(p); v && m.compartment(i).isLiving()) *v *= draw.uniform(0.7, 1.3);
            for (std::size_t j = 0; j < m.size(); ++j) {
                if (m.compartment(j).kind != CompartmentKind::Consumer) continue;
                double sum = 0;
                for (std::size_t i = 0; i < m.size(); ++i) {
                    m.setDiet(j, i, m.diet(j, i) * draw.uniform(0.5, 1.5));
                    sum += m.diet(j, i);
                }
                for (std::size_t i = 0; i < m.size(); ++i) m.setDiet(j, i, m.diet(j, i) / sum * (1 - m.dietImport(j)));
            }
            plan.solve(BalanceInputs::fromModel(m), ws, out);
            const BalanceSheet fresh = solveBalance(m);
            ASSERT_EQ(out.status, NumericStatus::Solved);
            for (std::size_t i = 0; i < m.size(); ++i) {
                const auto ii = static_cast<Eigen::Index>(i);
                const CompartmentBalance& r = fresh.rows[i];
                EXPECT_SAME(out.ee[ii], r.ee) << r.name;
                if (r.kind == CompartmentKind::Detritus) {
                    EXPECT_SAME(out.detritusInflow[ii], r.detritusInflow) << r.name;
                    continue;
                }
                EXPECT_SAME(out.biomass[ii], r.biomass) << r.name;
                EXPECT_SAME(out.production[ii], r.production) << r.name;
                EXPECT_SAME(out.flowToDetritus[ii], r.flowToDetritus) << r.name;
            }
        }
    }
}

TEST(BalancePlan, StructureNamesTheUnknownOfEachCompartment)
{
    Model m = testing::randomConsistentModel(12, 3);
    const std::vector<std::size_t> living = m.living();
    m.compartment(living[0]).value(Param::Biomass).reset();
    m.compartment(living[1]).value(Param::EE).reset();
    const BalancePlan plan = BalancePlan::build(m);
    EXPECT_EQ(plan.equationCount(), living.size());
    EXPECT_EQ(plan.unknownCount(), 2u);
    EXPECT_EQ(plan.unknownOf(living[0]), Unknown::Biomass);
    EXPECT_EQ(plan.unknownOf(living[1]), Unknown::EE);
    EXPECT_EQ(plan.unknownOf(living[2]), Unknown::None);
    EXPECT_EQ(plan.compartmentOfColumn(static_cast<std::size_t>(plan.columnOf(living[1]))), living[1]);
    EXPECT_EQ(plan.rowOf(m.detritusPools().front()), -1);
}

}  // namespace
}  // namespace tl
