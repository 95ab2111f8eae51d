// The benchmark generator (synthetic_model.h) makes what the benchmarks claim to
// measure: consistent models whose hidden values the solver recovers, with the
// expected numbers of equations and unknowns, identical for the same seed.
// Reference values are the generator's own truth model (every value given), whose
// equations close by construction; the test checks that closure independently too.
#include <gtest/gtest.h>

#include <cmath>

#include "core/balance/balance_plan.h"
#include "core/balance/solver.h"
#include "tests/bench/synthetic_model.h"

namespace {

using tl::bench::UnknownMix;

double relativeError(double a, double b) { return std::abs(a - b) / std::max(std::abs(b), 1e-300); }

class SyntheticModelTest : public ::testing::TestWithParam<std::tuple<std::size_t, UnknownMix>> {};

TEST_P(SyntheticModelTest, SolvesToItsTruthWithTheExpectedUnknowns)
{
    const auto [n, mix] = GetParam();
    const tl::bench::SyntheticModel s = tl::bench::syntheticModel(n, mix, 20261202);
    ASSERT_EQ(s.model.size(), n);

    const tl::BalancePlan plan = tl::BalancePlan::build(s.model);
    ASSERT_FALSE(plan.hasStructuralErrors());
    EXPECT_EQ(plan.equationCount(), s.expectedEquations);
    EXPECT_EQ(plan.unknownCount(), s.expectedUnknowns);
    switch (mix) {
    case UnknownMix::EE: EXPECT_EQ(s.hiddenEE, s.expectedUnknowns); break;
    case UnknownMix::EEBiomass: EXPECT_GE(s.hiddenBiomass, n / 20); break;
    case UnknownMix::EEQbPq:
        EXPECT_GE(s.hiddenQB, 1u);
        EXPECT_EQ(s.fullyGiven, s.hiddenQB);
        EXPECT_GE(s.pbFromPQ, 1u);
        EXPECT_GE(s.qbFromPQ, 1u);
        break;
    }

    const tl::BalanceSheet sheet = tl::solveBalance(s.model);
    for (const tl::Problem& p : sheet.problems) ADD_FAILURE() << p.compartment << ": " << p.message;
    EXPECT_EQ(sheet.status, tl::BalanceStatus::Balanced);
    for (std::size_t i = 0; i < n; ++i) {
        const tl::Compartment& t = s.truth.compartment(i);
        if (!t.isLiving()) continue;
        const tl::CompartmentBalance& r = sheet.rows[i];
        EXPECT_LT(relativeError(r.biomass, *t.value(tl::Param::Biomass)), 1e-8) << t.name;
        EXPECT_LT(relativeError(r.pb, *t.value(tl::Param::PB)), 1e-8) << t.name;
        EXPECT_LT(relativeError(r.ee, *t.value(tl::Param::EE)), 1e-8) << t.name;
        if (t.kind == tl::CompartmentKind::Consumer) {
            EXPECT_LT(relativeError(r.qb, *t.value(tl::Param::QB)), 1e-8) << t.name;
        }
    }
}

INSTANTIATE_TEST_SUITE_P(SizesAndMixes, SyntheticModelTest,
                         ::testing::Combine(::testing::Values(std::size_t{10}, std::size_t{50}, std::size_t{200}),
                                            ::testing::Values(UnknownMix::EE, UnknownMix::EEBiomass, UnknownMix::EEQbPq)),
                         [](const auto& info) {
                             std::string name = "n";
                             name += std::to_string(std::get<0>(info.param));
                             name += '_';
                             for (char c : tl::bench::mixKey(std::get<1>(info.param))) name += c == '-' ? '_' : c;
                             return name;
                         });

// Checked without the solver: every living equation of the truth closes, every true
// EE lies in (0, 1), the structure has what the header promises.
TEST(SyntheticTruth, ClosesEveryEquationWithRealisticStructure)
{
    const std::size_t n = 400;
    const tl::Model m = tl::bench::syntheticTruth(n, 7);
    std::size_t producers = 0, pools = 0, cannibals = 0;
    for (std::size_t i = 0; i < n; ++i) {
        const tl::Compartment& c = m.compartment(i);
        producers += c.kind == tl::CompartmentKind::Producer;
        pools += c.kind == tl::CompartmentKind::Detritus;
        if (c.kind == tl::CompartmentKind::Consumer) {
            std::size_t prey = 0;
            for (std::size_t k = 0; k < n; ++k) prey += m.diet(i, k) > 0;
            cannibals += m.diet(i, i) > 0;
            EXPECT_GE(prey, 3u) << c.name;
            EXPECT_LE(prey, 12u) << c.name;  // 3-10 drawn, plus a loop and cannibalism
            EXPECT_NEAR(m.dietRowSum(i), 1.0, 1e-12) << c.name;
        }
        if (!c.isLiving()) continue;
        double predation = 0;
        for (std::size_t j = 0; j < n; ++j)
            if (m.compartment(j).kind == tl::CompartmentKind::Consumer)
                predation += m.diet(j, i) * *m.compartment(j).value(tl::Param::Biomass) * *m.compartment(j).value(tl::Param::QB);
        const double demand = predation + m.totalCatch(i) + c.valueOr(tl::Param::NetEmigration, 0) + c.valueOr(tl::Param::BiomassAccum, 0);
        const double supply = *c.value(tl::Param::Biomass) * *c.value(tl::Param::PB) * *c.value(tl::Param::EE);
        EXPECT_LT(relativeError(supply, demand), 1e-12) << c.name;
        EXPECT_GT(*c.value(tl::Param::EE), 0.0) << c.name;
        EXPECT_LT(*c.value(tl::Param::EE), 1.0) << c.name;
    }
    EXPECT_GE(producers, 2u);
    EXPECT_GE(pools, 1u);
    EXPECT_LE(pools, 3u);
    EXPECT_GE(cannibals, 1u);
}

TEST(SyntheticModel, SameSeedSameModelOtherSeedOtherModel)
{
    for (UnknownMix mix : {UnknownMix::EE, UnknownMix::EEBiomass, UnknownMix::EEQbPq}) {
        EXPECT_EQ(tl::bench::syntheticModel(120, mix, 5).model, tl::bench::syntheticModel(120, mix, 5).model);
        EXPECT_FALSE(tl::bench::syntheticModel(120, mix, 5).model == tl::bench::syntheticModel(120, mix, 6).model);
    }
}

}  // namespace
