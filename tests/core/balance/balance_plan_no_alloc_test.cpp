// The numeric step of the balance (BalancePlan::solve) must not touch the heap: the
// ensemble calls it ~1e5 times a second. This executable compiles balance_plan.cpp
// itself with EIGEN_RUNTIME_NO_MALLOC and assertions on (see CMakeLists.txt), so every
// Eigen allocation inside the step aborts while set_is_malloc_allowed(false) is in
// force; a replaced global operator new counts any other (std::vector, std::string).
#ifndef EIGEN_RUNTIME_NO_MALLOC
#error "build this test with EIGEN_RUNTIME_NO_MALLOC"
#endif

#include <atomic>
#include <cmath>
#include <cstdlib>
#include <new>

#include <gtest/gtest.h>

#include "core/balance/balance_plan.h"
#include "tests/core/balance/random_model.h"

namespace {
std::atomic<long> g_news{0};
}

void* operator new(std::size_t size)
{
    ++g_news;
    if (void* p = std::malloc(size ? size : 1)) return p;
    throw std::bad_alloc();
}
void operator delete(void* p) noexcept { std::free(p); }
void operator delete(void* p, std::size_t) noexcept { std::free(p); }

namespace tl {
namespace {

struct Case {
    Model model;
    std::vector<std::pair<std::size_t, Param>> hidden;
};

// Hides EE of every other living compartment (overdetermined: QR path) or of all of
// them (square: LU path), and B of one predator.
Case makeCase(std::size_t n, std::uint64_t seed, bool square)
{
    Case c{testing::randomConsistentModel(n, seed), {}};
    std::size_t k = 0;
    bool biomassHidden = false;
    for (std::size_t i : c.model.living()) {
        Compartment& comp = c.model.compartment(i);
        if (!square && k++ % 2) continue;
        Param p = Param::EE;
        if (!biomassHidden && comp.kind == CompartmentKind::Consumer && c.model.diet(i, i) == 0.0) {
            p = Param::Biomass;
            biomassHidden = true;
        }
        c.hidden.emplace_back(i, p);
        comp.value(p).reset();
    }
    return c;
}

void expectNumericStepAllocatesNothing(std::size_t n, std::uint64_t seed, bool square)
{
    const Case c = makeCase(n, seed, square);
    const BalancePlan plan = BalancePlan::build(c.model);
    ASSERT_FALSE(plan.hasStructuralErrors());
    ASSERT_EQ(plan.equationCount() == plan.unknownCount(), square);
    BalanceInputs in = BalanceInputs::fromModel(c.model);
    BalanceWorkspace ws = plan.makeWorkspace();
    BalanceValues out = plan.makeValues();
    plan.solve(in, ws, out);  // warm-up outside the guard (nothing should be lazily sized, but be fair)

    const long newsBefore = g_news.load();
    Eigen::internal::set_is_malloc_allowed(false);
    for (int repeat = 0; repeat < 20; ++repeat) {
        in.diet *= 1.0;  // same values; exercises the step again
        plan.solve(in, ws, out);
    }
    Eigen::internal::set_is_malloc_allowed(true);
    EXPECT_EQ(g_news.load() - newsBefore, 0) << "operator new called inside the numeric step";

    ASSERT_EQ(out.status, NumericStatus::Solved);
    const Model originalModel = testing::randomConsistentModel(n, seed);
    for (auto [i, p] : c.hidden) {
        const Compartment& original = originalModel.compartment(i);
        const double expected = *original.value(p);
        const double got = p == Param::Biomass ? out.biomass[static_cast<Eigen::Index>(i)] : out.ee[static_cast<Eigen::Index>(i)];
        EXPECT_NEAR(got, expected, 1e-9 * std::abs(expected));
    }
}

TEST(BalancePlanNoAlloc, GuardIsActive)
{
    // The mechanism itself: an Eigen allocation while forbidden must abort.
    EXPECT_DEATH(
        {
            Eigen::internal::set_is_malloc_allowed(false);
            Eigen::VectorXd v(1000);
            v.setZero();
        },
        "heap allocation is forbidden");
}

TEST(BalancePlanNoAlloc, SquareSystemLU20) { expectNumericStepAllocatesNothing(20, 11, true); }
TEST(BalancePlanNoAlloc, SquareSystemLU150) { expectNumericStepAllocatesNothing(150, 12, true); }
TEST(BalancePlanNoAlloc, OverdeterminedQR20) { expectNumericStepAllocatesNothing(20, 13, false); }
TEST(BalancePlanNoAlloc, OverdeterminedQR150) { expectNumericStepAllocatesNothing(150, 14, false); }

}  // namespace
}  // namespace tl
