// The Checks of a scenario (core/balance/scenario_checks.h): validation first, then the
// solver's findings, the same problem once.
#include <gtest/gtest.h>

#include <algorithm>

#include "core/balance/scenario_checks.h"
#include "core/balance/solver.h"
#include "core/model/problem_codes.h"
#include "tests/support/small_models.h"

namespace tl {
namespace {

using testing::makeCompartment;

std::size_t countCode(const Problems& problems, std::string_view code)
{
    return static_cast<std::size_t>(
        std::count_if(problems.begin(), problems.end(), [&](const Problem& p) { return p.code == code; }));
}

// Invented two-compartment web without a detritus pool: validation and the solver both
// find the missing pool; the Checks list it once.
TEST(ScenarioChecks, NoDetritusPoolIsReportedOnce)
{
    Model m;
    m.addCompartment(makeCompartment("Algae", CompartmentKind::Producer, 10.0, 50.0, std::nullopt));
    m.addCompartment(makeCompartment("Grazer", CompartmentKind::Consumer, 2.0, 5.0, 20.0));
    m.setDiet(1, 0, 1.0);
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_EQ(countCode(sheet.problems, code::kNoDetritusPool), 1u) << "the solver reports it too";
    const Problems checks = scenarioChecks(m, sheet);
    EXPECT_EQ(countCode(checks, code::kNoDetritusPool), 1u);
}

// A solved value below zero is the solver's own problem (not an input problem): it is
// kept, under its own code, beside validation's findings.
TEST(ScenarioChecks, SolverProblemsThatValidationDidNotFindAreKept)
{
    Model m;
    m.addCompartment(makeCompartment("Algae", CompartmentKind::Producer, 100.0, 10.0, std::nullopt));
    m.addCompartment(makeCompartment("Detritus", CompartmentKind::Detritus, std::nullopt, std::nullopt, std::nullopt));
    m.compartment(0).value(Param::NetEmigration) = -1500;  // immigration beyond use: EE < 0
    const BalanceSheet sheet = solveBalance(m);
    const Problems checks = scenarioChecks(m, sheet);
    EXPECT_EQ(countCode(checks, code::kNegativeSolvedValue), 1u);
    EXPECT_EQ(countCode(checks, code::kNegativeValue), 0u);
    EXPECT_EQ(checks.size(), sheet.problems.size());  // the inputs themselves are fine
}

// The status word (issue 13): "Balanced" only for valid inputs that solve without an
// error; an empty model, inputs with errors and breaches of balance are named apart.
TEST(ScenarioState, BalancedOnlyWhenValidSolvedAndErrorFree)
{
    Model empty;
    EXPECT_EQ(scenarioState(empty, solveBalance(empty), scenarioChecks(empty, solveBalance(empty))),
              ScenarioState::NoCompartments);

    // Invented web that balances: Algae eaten by Grazer, one detritus pool.
    Model m;
    m.addCompartment(makeCompartment("Algae", CompartmentKind::Producer, 10.0, 50.0, std::nullopt));
    m.addCompartment(makeCompartment("Grazer", CompartmentKind::Consumer, 2.0, 5.0, 20.0));
    m.addCompartment(makeCompartment("Detritus", CompartmentKind::Detritus, 5.0, std::nullopt, std::nullopt));
    m.setDiet(1, 0, 1.0);
    auto state = [](const Model& model) {
        const BalanceSheet sheet = solveBalance(model);
        return scenarioState(model, sheet, scenarioChecks(model, sheet));
    };
    EXPECT_EQ(state(m), ScenarioState::Balanced);

    // A diet summing to 0.3 solves (the solver reads the shares as given) but is an
    // input error: incomplete, not balanced.
    Model partDiet = m;
    partDiet.setDiet(1, 0, 0.3);
    ASSERT_NE(solveBalance(partDiet).status, BalanceStatus::Invalid);
    EXPECT_EQ(state(partDiet), ScenarioState::Incomplete);

    // Two unknowns: cannot be solved, incomplete.
    Model missing = m;
    missing.compartment(1).value(Param::Biomass).reset();
    missing.compartment(1).value(Param::PB).reset();
    EXPECT_EQ(state(missing), ScenarioState::Incomplete);

    // Grazers eating more than the algae produce: solved, not balanced (EE > 1).
    Model overGrazed = m;
    overGrazed.compartment(1).value(Param::Biomass) = 40.0;  // Q = 800 > P = 500
    EXPECT_EQ(state(overGrazed), ScenarioState::NotBalanced);
}

}  // namespace
}  // namespace tl
