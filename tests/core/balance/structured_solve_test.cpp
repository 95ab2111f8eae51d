// The structured solve (reduced system over the coupled unknowns, back-substitution of
// EE and P/B, sparse factorisation when large) against the plain dense solve of the full
// system (dense_reference_solve.h): same values within 1e-10 relative and the same
// problems, on random models of every size and unknown mix, square and overdetermined,
// dense and sparse paths, solvable and singular.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <iostream>
#include <map>
#include <set>
#include <string>
#include <vector>

#include "core/balance/balance_codes.h"
#include "core/balance/balance_plan.h"
#include "core/balance/solver.h"
#include "tests/core/balance/dense_reference_solve.h"
#include "tests/core/balance/random_model.h"

namespace tl {
namespace {

enum class Mix { EEOnly, EEAndBiomass, EEAndQBAndPQ, Everything, MostlyGiven, ManyBiomasses, ManyBiomassesSomeGiven, Count };

const char* mixName(Mix mix)
{
    switch (mix) {
    case Mix::EEOnly: return "EE only";
    case Mix::EEAndBiomass: return "EE + 10% B";
    case Mix::EEAndQBAndPQ: return "EE + Q/B + P/Q stand-ins";
    case Mix::Everything: return "every kind of unknown, some fully given";
    case Mix::MostlyGiven: return "mostly given (overdetermined)";
    case Mix::ManyBiomasses: return "60% B unknown (sparse path when large)";
    case Mix::ManyBiomassesSomeGiven: return "60% B unknown, 10% fully given (sparse least squares when large)";
    case Mix::Count: break;
    }
    return "";
}

// Hides values of a consistent model in the given mix. Never hides two values of one
// compartment, so the plan has no structural error.
void hide(Model& m, Mix mix, testing::Draw& draw)
{
    for (std::size_t i : m.living()) {
        Compartment& c = m.compartment(i);
        const bool consumer = c.kind == CompartmentKind::Consumer;
        const double u = draw.uniform();
        switch (mix) {
        case Mix::EEOnly: c.value(Param::EE).reset(); break;
        case Mix::EEAndBiomass:
            c.value(u < 0.1 ? Param::Biomass : Param::EE).reset();
            break;
        case Mix::EEAndQBAndPQ:
            if (consumer && u < 0.15) {
                c.value(Param::QB).reset();  // solved: Q/B, EE given
            } else if (consumer && u < 0.3) {
                c.value(Param::PQ) = *c.value(Param::PB) / *c.value(Param::QB);
                c.value(Param::PB).reset();  // P/Q stands in for P/B
                c.value(Param::EE).reset();
            } else if (consumer && u < 0.4) {
                c.value(Param::PQ) = *c.value(Param::PB) / *c.value(Param::QB);
                c.value(Param::QB).reset();  // P/Q stands in for Q/B
                c.value(Param::EE).reset();
            } else if (consumer && u < 0.5) {
                c.value(Param::PQ) = *c.value(Param::PB) / *c.value(Param::QB);
                c.value(Param::PB).reset();  // Q/B solved, P/B tied to it by P/Q
                c.value(Param::QB).reset();
            } else {
                c.value(Param::EE).reset();
            }
            break;
        case Mix::Everything: {
            static constexpr Param kParams[] = {Param::Biomass, Param::PB, Param::QB, Param::EE};
            const std::size_t pick = draw.index(5);
            if (pick < 4 && (kParams[pick] != Param::QB || consumer)) c.value(kParams[pick]).reset();
            break;
        }
        case Mix::MostlyGiven:
            if (u < 0.1) c.value(Param::Biomass).reset();
            else if (u < 0.2) c.value(Param::EE).reset();
            break;
        case Mix::ManyBiomasses: c.value(u < 0.6 ? Param::Biomass : Param::EE).reset(); break;
        case Mix::ManyBiomassesSomeGiven:
            if (u < 0.6) c.value(Param::Biomass).reset();
            else if (u < 0.9) c.value(Param::EE).reset();
            break;
        case Mix::Count: break;
        }
    }
}

// Relative agreement, NaN matching NaN; values near 0 compared against `scale`.
::testing::AssertionResult agree(double got, double want, double scale, double rel = 1e-10)
{
    if (std::isnan(got) && std::isnan(want)) return ::testing::AssertionSuccess();
    const double tol = rel * std::max({std::abs(got), std::abs(want), scale});
    if (std::abs(got - want) <= tol) return ::testing::AssertionSuccess();
    return ::testing::AssertionFailure() << got << " vs reference " << want << " (tolerance " << tol << ")";
}

std::multiset<std::string> problemKeys(const Problems& problems, bool withMessages)
{
    std::multiset<std::string> keys;
    for (const Problem& p : problems)
        keys.insert(p.code + "|" + p.compartment + "|" + p.parameter + (withMessages ? "|" + p.message : ""));
    return keys;
}

std::set<std::string> singularNames(const Problems& problems)
{
    std::set<std::string> names;
    for (const Problem& p : problems)
        if (p.code == code::kSingularSystem) names.insert(p.compartment);
    return names;
}

struct Tally {
    std::map<BalancePlan::Method, int> methods, solvedBy;
    int solved = 0, singular = 0, extraSingularNames = 0;
};

void expectSameAsDenseReference(const Model& m, const std::string& what, Tally& tally)
{
    SCOPED_TRACE(what);
    const BalancePlan plan = BalancePlan::build(m);
    ASSERT_FALSE(plan.hasStructuralErrors());
    ++tally.methods[plan.method()];
    const BalanceSheet sheet = solveBalance(m);
    const testing::DenseReference ref = testing::denseReferenceSolve(m, plan);

    if (ref.values.status == NumericStatus::Singular) {
        ++tally.singular;
        EXPECT_EQ(sheet.status, BalanceStatus::Invalid);
        std::set<std::string> want;
        for (std::size_t i : ref.singularInvolved) want.insert(m.compartment(i).name);
        // The structured report names every compartment the dense one names. It may name
        // more: the EE or P/B of a prey of an undetermined coupled unknown, which is
        // undetermined too (its predation is); the dense report misses such a prey when
        // its share of the full null vector falls under its 1e-6 threshold.
        const std::set<std::string> got = singularNames(sheet.problems);
        for (const std::string& name : want)
            EXPECT_TRUE(got.count(name)) << "named only by the dense reference: " << name;
        for (std::size_t i = 0; i < m.size(); ++i) {
            const std::string& name = m.compartment(i).name;
            if (!got.count(name) || want.count(name)) continue;
            bool preyOfUndetermined = plan.unknownOf(i) == Unknown::EE || plan.unknownOf(i) == Unknown::PB;
            bool eaten = false;
            for (std::size_t j : plan.coupledUnknowns())
                eaten = eaten || (m.diet(j, i) != 0.0 && got.count(m.compartment(j).name));
            EXPECT_TRUE(preyOfUndetermined && eaten) << "named only by the structured solve: " << name;
            ++tally.extraSingularNames;
        }
        return;
    }
    ++tally.solved;
    ++tally.solvedBy[plan.method()];
    ASSERT_NE(sheet.status, BalanceStatus::Invalid) << (sheet.problems.empty() ? "" : sheet.problems.front().message);
    const BalanceSheet want = balanceSheetFromValues(m, plan, ref.values);
    double flowScale = 0.0;  // residuals are compared on the scale of the flows they balance
    for (const CompartmentBalance& r : want.rows)
        if (!std::isnan(r.production)) flowScale = std::max(flowScale, std::abs(r.production));
    for (std::size_t i = 0; i < m.size(); ++i) {
        const CompartmentBalance& got = sheet.rows[i];
        const CompartmentBalance& ref_ = want.rows[i];
        SCOPED_TRACE(got.name);
        EXPECT_TRUE(agree(got.biomass, ref_.biomass, 0.0)) << "B";
        EXPECT_TRUE(agree(got.pb, ref_.pb, 0.0)) << "P/B";
        EXPECT_TRUE(agree(got.qb, ref_.qb, 0.0)) << "Q/B";
        EXPECT_TRUE(agree(got.ee, ref_.ee, 0.0)) << "EE";
        EXPECT_TRUE(agree(got.production, ref_.production, 0.0)) << "P";
        EXPECT_TRUE(agree(got.consumption, ref_.consumption, 0.0)) << "Q";
        EXPECT_TRUE(agree(got.predation, ref_.predation, 0.0)) << "predation";
        EXPECT_TRUE(agree(got.respiration, ref_.respiration, flowScale)) << "R";
        EXPECT_TRUE(agree(got.flowToDetritus, ref_.flowToDetritus, 0.0)) << "flow to detritus";
        EXPECT_TRUE(agree(got.residual, ref_.residual, flowScale)) << "residual";
        EXPECT_TRUE(agree(got.detritusInflow, ref_.detritusInflow, 0.0)) << "detritus inflow";
        EXPECT_TRUE(agree(got.detritusExport, ref_.detritusExport, flowScale)) << "detritus export";
        EXPECT_TRUE(agree(got.tl, ref_.tl, 0.0)) << "TL";
    }
    EXPECT_EQ(sheet.status, want.status);
    // Same problems: code, compartment, parameter and message (numbers in messages are
    // printed to 4 significant digits, so values equal to 1e-10 print alike). The
    // conditioning is of a different matrix (reduced vs full), so the ill-conditioning
    // warning is compared only by its presence in random models that are well posed.
    EXPECT_EQ(problemKeys(sheet.problems, true), problemKeys(want.problems, true));
}

TEST(StructuredSolve, EqualsDenseSolveOn500RandomModels)
{
    Tally tally;
    for (std::uint64_t seed = 1; seed <= 500; ++seed) {
        testing::Draw draw(seed * 7919);
        const std::size_t n = 6 + draw.index(295);  // 6..300 compartments
        const auto mix = static_cast<Mix>(seed % static_cast<std::uint64_t>(Mix::Count));
        Model m = testing::randomConsistentModel(n, seed);
        hide(m, mix, draw);
        expectSameAsDenseReference(m, "seed " + std::to_string(seed) + ", " + std::to_string(n) +
                                          " compartments, " + mixName(mix), tally);
        if (::testing::Test::HasFatalFailure()) return;
    }
    // The sample covers every path of the structured solve (a check on the test itself).
    for (auto method : {BalancePlan::Method::None, BalancePlan::Method::DenseLU, BalancePlan::Method::DenseQR,
                        BalancePlan::Method::SparseLU, BalancePlan::Method::SparseQR})
        EXPECT_GT(tally.solvedBy[method], 0) << "method " << static_cast<int>(method) << " never solved a model";
    EXPECT_GT(tally.solved, 300);
    EXPECT_GT(tally.singular, 0) << "no singular case exercised";
    std::cout << "[ tally    ] " << tally.solved << " solved, " << tally.singular << " singular ("
              << tally.extraSingularNames << " weakly linked prey named only by the structured report); methods:";
    for (auto [method, count] : tally.methods)
        std::cout << " " << static_cast<int>(method) << ":" << count << " (" << tally.solvedBy[method] << " solved)";
    std::cout << "\n";
}

bool sameNumber(double a, double b) { return (std::isnan(a) && std::isnan(b)) || a == b; }

// Two sheets equal to the last bit: status, conditioning, every value of every row and
// every problem with its message.
void expectIdenticalSheets(const BalanceSheet& got, const BalanceSheet& want)
{
    EXPECT_EQ(got.status, want.status);
    EXPECT_TRUE(sameNumber(got.conditioning, want.conditioning));
    ASSERT_EQ(got.rows.size(), want.rows.size());
    for (std::size_t i = 0; i < got.rows.size(); ++i) {
        const CompartmentBalance& a = got.rows[i];
        const CompartmentBalance& b = want.rows[i];
        SCOPED_TRACE(b.name);
        EXPECT_EQ(a.name, b.name);
        EXPECT_EQ(a.solved, b.solved);
        const double CompartmentBalance::*fields[] = {
            &CompartmentBalance::biomass, &CompartmentBalance::pb, &CompartmentBalance::qb, &CompartmentBalance::ee,
            &CompartmentBalance::pq, &CompartmentBalance::production, &CompartmentBalance::consumption,
            &CompartmentBalance::respiration, &CompartmentBalance::flowToDetritus, &CompartmentBalance::predation,
            &CompartmentBalance::m2, &CompartmentBalance::tl, &CompartmentBalance::oi, &CompartmentBalance::residual,
            &CompartmentBalance::detritusInflow, &CompartmentBalance::detritusExport};
        for (std::size_t f = 0; f < std::size(fields); ++f)
            EXPECT_TRUE(sameNumber(a.*fields[f], b.*fields[f])) << "field " << f << ": " << a.*fields[f] << " vs " << b.*fields[f];
    }
    EXPECT_EQ(problemKeys(got.problems, true), problemKeys(want.problems, true));
}

// One BalanceScratch kept across models of changing size, unknown mix and solve path
// (each solved twice, the second time into storage of the right size) gives the sheet
// of a fresh solveBalance, bit for bit: reused buffers carry nothing over.
TEST(StructuredSolve, KeptScratchGivesTheSheetOfAFreshSolve)
{
    BalanceScratch scratch;
    std::set<BalancePlan::Method> methods;
    for (std::uint64_t seed = 1; seed <= 120; ++seed) {
        testing::Draw draw(seed * 104729);
        const std::size_t n = 6 + draw.index(seed % 10 == 0 ? 295 : 60);  // mostly small, some sparse paths
        const auto mix = static_cast<Mix>(seed % static_cast<std::uint64_t>(Mix::Count));
        Model m = testing::randomConsistentModel(n, seed);
        hide(m, mix, draw);
        SCOPED_TRACE("seed " + std::to_string(seed) + ", " + std::to_string(n) + " compartments, " + mixName(mix));
        methods.insert(BalancePlan::build(m).method());
        const BalanceSheet fresh = solveBalance(m);
        expectIdenticalSheets(solveBalance(m, scratch), fresh);
        expectIdenticalSheets(solveBalance(m, scratch), fresh);
        if (::testing::Test::HasFatalFailure()) return;
    }
    EXPECT_GE(methods.size(), 4u) << "the sample should take most solve paths";
}

// The buffers that solveBalance(model) keeps per thread, and a BalanceScratch kept by a
// caller, carry nothing over, including the feeding loops the trophic levels reuse while
// the diet's pattern is unchanged: on models of one size whose diets change only in
// value, gain a feeding loop, or leave a consumer without prey, both give the sheet of a
// solve with a scratch of its own, bit for bit.
TEST(StructuredSolve, KeptBuffersGiveTheSheetOfAFreshScratch)
{
    BalanceScratch kept;
    std::size_t loopsAdded = 0, preyRemoved = 0;
    for (std::uint64_t seed = 1; seed <= 60; ++seed) {
        testing::Draw draw(seed * 7919);
        const std::size_t n = 12 + draw.index(40);
        const auto mix = static_cast<Mix>(seed % static_cast<std::uint64_t>(Mix::Count));
        Model m = testing::randomConsistentModel(n, seed);
        hide(m, mix, draw);
        std::vector<std::size_t> consumers;
        for (std::size_t i = 0; i < m.size(); ++i)
            if (m.compartment(i).kind == CompartmentKind::Consumer) consumers.push_back(i);
        ASSERT_FALSE(consumers.empty());
        for (int variant = 0; variant < 4; ++variant) {
            SCOPED_TRACE("seed " + std::to_string(seed) + ", variant " + std::to_string(variant));
            BalanceScratch fresh;
            const BalanceSheet want = solveBalance(m, fresh);
            expectIdenticalSheets(solveBalance(m, kept), want);
            expectIdenticalSheets(solveBalance(m), want);
            if (::testing::Test::HasFatalFailure()) return;
            const std::size_t j = consumers[draw.index(consumers.size())];
            if (variant == 0) {  // values only: the same pattern
                for (const GridEntry& e : std::vector<GridEntry>(m.dietRow(j).begin(), m.dietRow(j).end()))
                    m.setDiet(j, e.col, e.value * 0.9);
            } else if (variant == 1) {  // a new loop: j eats one of its predators
                for (std::size_t p : consumers)
                    if (p != j && m.diet(p, j) > 0.0 && m.diet(j, p) == 0.0) {
                        m.setDiet(j, p, 0.05);
                        ++loopsAdded;
                        break;
                    }
            } else if (variant == 2) {  // j loses every prey: its level becomes fixed
                for (const GridEntry& e : std::vector<GridEntry>(m.dietRow(j).begin(), m.dietRow(j).end()))
                    m.setDiet(j, e.col, 0.0);
                ++preyRemoved;
            }
        }
    }
    EXPECT_GT(loopsAdded, 10u) << "the sample should add feeding loops";
    EXPECT_EQ(preyRemoved, 60u);
}

TEST(StructuredSolve, ModelWhoseUnknownsAreAllEENeedsNoFactorisation)
{
    Model m = testing::randomConsistentModel(40, 77);
    for (std::size_t i : m.living()) m.compartment(i).value(Param::EE).reset();
    const BalancePlan plan = BalancePlan::build(m);
    EXPECT_EQ(plan.method(), BalancePlan::Method::None);
    EXPECT_TRUE(plan.coupledUnknowns().empty());
    EXPECT_EQ(plan.privateUnknowns().size(), m.living().size());
    const Model original = testing::randomConsistentModel(40, 77);
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);  // random rates may leave R < 0: Unbalanced
    for (std::size_t i : m.living())
        EXPECT_NEAR(sheet.rows[i].ee, *original.compartment(i).value(Param::EE), 1e-12);
}

TEST(StructuredSolve, ReducedSystemHoldsOnlyTheCoupledUnknowns)
{
    // Hidden: B of two consumers (coupled), EE of everything else (private, back-substituted).
    Model m = testing::randomConsistentModel(30, 5);
    std::vector<std::size_t> hiddenB;
    for (std::size_t i : m.living()) {
        Compartment& c = m.compartment(i);
        if (hiddenB.size() < 2 && c.kind == CompartmentKind::Consumer && m.diet(i, i) == 0.0) {
            c.value(Param::Biomass).reset();
            hiddenB.push_back(i);
        } else {
            c.value(Param::EE).reset();
        }
    }
    const BalancePlan plan = BalancePlan::build(m);
    EXPECT_EQ(plan.coupledUnknowns(), hiddenB);
    EXPECT_EQ(plan.reducedRows(), hiddenB);  // their prey's rows belong to the prey's EE
    EXPECT_EQ(plan.unknownCount(), m.living().size());
    EXPECT_EQ(plan.method(), BalancePlan::Method::DenseLU);
    const BalanceSheet sheet = solveBalance(m);
    const Model original = testing::randomConsistentModel(30, 5);
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);
    for (std::size_t i : hiddenB)
        EXPECT_NEAR(sheet.rows[i].biomass, *original.compartment(i).value(Param::Biomass),
                    1e-10 * *original.compartment(i).value(Param::Biomass));
}

TEST(StructuredSolve, ZeroCoefficientOfAPrivateUnknownIsSingularAndNamed)
{
    // EE unknown with P/B = 0: B P/B EE = 0 whatever EE is, so EE cannot be solved.
    Model m = testing::randomConsistentModel(12, 9);
    for (std::size_t i : m.living()) m.compartment(i).value(Param::EE).reset();
    const std::size_t victim = m.living().front();
    m.compartment(victim).value(Param::PB) = 0.0;
    const BalanceSheet sheet = solveBalance(m);
    EXPECT_EQ(sheet.status, BalanceStatus::Invalid);
    EXPECT_EQ(singularNames(sheet.problems), std::set<std::string>{m.compartment(victim).name});
    const testing::DenseReference ref = testing::denseReferenceSolve(m, BalancePlan::build(m));
    ASSERT_EQ(ref.values.status, NumericStatus::Singular);
    std::set<std::string> want;
    for (std::size_t i : ref.singularInvolved) want.insert(m.compartment(i).name);
    EXPECT_EQ(singularNames(sheet.problems), want);
}

// DESIGN issue: a model of 5000 compartments solves. The assertion is on the result
// (every hidden value recovered), not on the time; the figures are in tests/bench.
TEST(StructuredSolve, FiveThousandCompartmentsSolve)
{
    const Model original = testing::randomConsistentModel(5000, 2026);
    Model m = original;
    testing::Draw draw(99);
    std::size_t hiddenBiomasses = 0;
    for (std::size_t i : m.living()) {
        const bool hideB = m.compartment(i).kind == CompartmentKind::Consumer && draw.chance(0.1);
        m.compartment(i).value(hideB ? Param::Biomass : Param::EE).reset();
        hiddenBiomasses += hideB;
    }
    const BalancePlan plan = BalancePlan::build(m);
    EXPECT_EQ(plan.method(), BalancePlan::Method::SparseLU);
    EXPECT_EQ(plan.coupledUnknowns().size(), hiddenBiomasses);
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_NE(sheet.status, BalanceStatus::Invalid) << (sheet.problems.empty() ? "" : sheet.problems.front().message);
    for (std::size_t i : m.living())
        for (Param p : {Param::Biomass, Param::EE}) {
            const double want = *original.compartment(i).value(p);
            const double got = p == Param::Biomass ? sheet.rows[i].biomass : sheet.rows[i].ee;
            EXPECT_NEAR(got, want, 1e-8 * want) << m.compartment(i).name << " " << paramSymbol(p);
        }
    EXPECT_GT(sheet.conditioning, 1e-8);
}

}  // namespace
}  // namespace tl
