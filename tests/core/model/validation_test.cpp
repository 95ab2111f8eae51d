// Checks of core/model/validation: each rule fires on a model that breaks it, names the
// compartment, parameter, prey/pool and fleet concerned, and stays silent on a sound
// model. The rules are definitions (a diet row is a set of shares summing to 1,
// Christensen & Pauly 1992) or common practice (no source), not fitted numbers.
#include "core/model/validation.h"

#include <gtest/gtest.h>

#include "tests/support/small_models.h"

#include <algorithm>

namespace tl {
namespace {

using testing::makeCompartment;

// Invented three-box pond for tests: algae, a grazer eating algae and detritus, detritus.
Model soundModel()
{
    Model m = testing::threeBoxPond(0.5);
    m.compartment(0).value(Param::Biomass) = 10;
    m.compartment(0).value(Param::PB) = 100;
    m.compartment(1).value(Param::Biomass) = 2;
    m.compartment(1).value(Param::PB) = 5;
    m.compartment(1).value(Param::QB) = 20;
    m.compartment(1).value(Param::Unassim) = 0.3;
    m.compartment(2).value(Param::DetritusImport) = 1;
    return m;
}

std::vector<Problem> withCode(const Problems& all, std::string_view code)
{
    std::vector<Problem> out;
    std::copy_if(all.begin(), all.end(), std::back_inserter(out), [&](const Problem& p) { return p.code == code; });
    return out;
}

bool mentions(const Problem& p, std::string_view word) { return p.message.find(word) != std::string::npos; }

TEST(Validation, SoundModelHasNoProblems)
{
    const Problems problems = validateModel(soundModel());
    for (const Problem& p : problems) ADD_FAILURE() << p.code << ": " << p.message;
}

TEST(Validation, EmptyAndDuplicateNames)
{
    Model m = soundModel();
    m.addCompartment(makeCompartment("  ", CompartmentKind::Consumer));
    m.addCompartment(makeCompartment("Grazer ", CompartmentKind::Consumer));  // equal after trimming
    m.addCompartment(makeCompartment(" Grazer", CompartmentKind::Consumer));  // a third: paired with the first
    const Problems all = validateModel(m);
    const auto empty = withCode(all, check::kEmptyName);
    ASSERT_EQ(empty.size(), 1u);
    EXPECT_TRUE(mentions(empty[0], "compartment 4"));
    const auto dup = withCode(all, check::kDuplicateName);
    ASSERT_EQ(dup.size(), 2u);
    EXPECT_TRUE(mentions(dup[0], "'Grazer'"));
    EXPECT_TRUE(mentions(dup[0], "2 and 5"));
    EXPECT_TRUE(mentions(dup[1], "2 and 6"));
    EXPECT_FALSE(dup[0].hint.empty());
}

TEST(Validation, NegativeValuesNamedByParameter)
{
    Model m = soundModel();
    m.compartment(1).value(Param::PB) = -0.5;
    m.compartment(0).value(Param::Biomass) = -1;
    m.compartment(1).value(Param::BiomassAccum) = -0.2;   // loss of biomass: allowed
    m.compartment(1).value(Param::NetEmigration) = -0.1;  // net immigration: allowed
    const auto neg = withCode(validateModel(m), check::kNegativeValue);
    ASSERT_EQ(neg.size(), 2u);
    EXPECT_EQ(neg[0].compartment, "Algae");
    EXPECT_EQ(neg[0].parameter, "biomass");
    EXPECT_EQ(neg[1].compartment, "Grazer");
    EXPECT_EQ(neg[1].parameter, "pb");
    EXPECT_TRUE(mentions(neg[1], "-0.5"));
    EXPECT_TRUE(mentions(neg[1], "P/B"));
}

TEST(Validation, UnassimilatedFractionMustBeBelowOne)
{
    for (double u : {-0.1, 1.0, 1.5}) {
        Model m = soundModel();
        m.compartment(1).value(Param::Unassim) = u;
        const auto p = withCode(validateModel(m), check::kUnassimOutOfRange);
        ASSERT_EQ(p.size(), 1u) << u;
        EXPECT_EQ(p[0].parameter, "unassim");
    }
    Model m = soundModel();
    m.compartment(1).value(Param::Unassim) = 0.0;
    EXPECT_TRUE(withCode(validateModel(m), check::kUnassimOutOfRange).empty());
}

TEST(Validation, ProducerWithConsumptionOrDiet)
{
    Model m = soundModel();
    m.compartment(0).value(Param::QB) = 3;
    m.setDiet(0, 2, 1.0);
    const Problems all = validateModel(m);
    const auto qb = withCode(all, check::kProducerConsumes);
    ASSERT_EQ(qb.size(), 1u);
    EXPECT_EQ(qb[0].compartment, "Algae");
    EXPECT_EQ(qb[0].parameter, "qb");
    const auto diet = withCode(all, check::kDietOfNonConsumer);
    ASSERT_EQ(diet.size(), 1u);
    EXPECT_EQ(diet[0].parameter, "diet");
    EXPECT_EQ(diet[0].prey, "Detritus");
    EXPECT_TRUE(mentions(diet[0], "producer"));
}

TEST(Validation, DetritusWithRates)
{
    Model m = soundModel();
    m.compartment(2).value(Param::PB) = 1;
    m.compartment(2).value(Param::EE) = 0.5;
    m.compartment(2).value(Param::Biomass) = 40;  // a detritus stock is fine
    const auto p = withCode(validateModel(m), check::kDetritusRate);
    ASSERT_EQ(p.size(), 2u);
    EXPECT_EQ(p[0].parameter, "pb");
    EXPECT_EQ(p[1].parameter, "ee");
    EXPECT_TRUE(mentions(p[0], "detritus pool"));
}

TEST(Validation, DetritusImportOnlyIntoPools)
{
    Model m = soundModel();
    m.compartment(1).value(Param::DetritusImport) = 2;
    const auto p = withCode(validateModel(m), check::kImportOnLiving);
    ASSERT_EQ(p.size(), 1u);
    EXPECT_EQ(p[0].compartment, "Grazer");
}

TEST(Validation, DietRowSumGivesTheSum)
{
    Model m = soundModel();
    m.setDiet(1, 2, 0.25);  // 0.7 + 0.25 = 0.95
    const auto p = withCode(validateModel(m), check::kDietSum);
    ASSERT_EQ(p.size(), 1u);
    EXPECT_EQ(p[0].compartment, "Grazer");
    EXPECT_EQ(p[0].parameter, "diet");
    EXPECT_TRUE(mentions(p[0], "0.95")) << p[0].message;
}

TEST(Validation, DietSumCountsImportAndHonoursTolerance)
{
    Model m = soundModel();
    m.setDiet(1, 2, 0.2);
    m.setDietImport(1, 0.1);  // 0.7 + 0.2 + 0.1 = 1
    EXPECT_TRUE(withCode(validateModel(m), check::kDietSum).empty());
    m.setDietImport(1, 0.1009);  // off by 0.0009 < 0.001
    EXPECT_TRUE(withCode(validateModel(m), check::kDietSum).empty());
    m.setDietImport(1, 0.102);  // off by 0.002
    EXPECT_EQ(withCode(validateModel(m), check::kDietSum).size(), 1u);
    m.rules.dietSumTolerance = 0.01;
    EXPECT_TRUE(withCode(validateModel(m), check::kDietSum).empty());
}

TEST(Validation, ConsumerWithoutDiet)
{
    Model m = soundModel();
    m.addCompartment(makeCompartment("Perch", CompartmentKind::Consumer));
    const auto p = withCode(validateModel(m), check::kDietSum);
    ASSERT_EQ(p.size(), 1u);
    EXPECT_EQ(p[0].compartment, "Perch");
    EXPECT_TRUE(mentions(p[0], "empty"));
}

TEST(Validation, DietFractionOutsideZeroOne)
{
    Model m = soundModel();
    m.setDiet(1, 0, 1.3);
    m.setDiet(1, 2, -0.3);
    const auto p = withCode(validateModel(m), check::kDietFraction);
    ASSERT_EQ(p.size(), 2u);
    EXPECT_EQ(p[0].prey, "Algae");
    EXPECT_EQ(p[1].prey, "Detritus");
    EXPECT_TRUE(mentions(p[1], "-0.3"));
}

TEST(Validation, DetritusWithDietIsNotAConsumer)
{
    Model m = soundModel();
    m.setDietImport(2, 1.0);
    const auto p = withCode(validateModel(m), check::kDietOfNonConsumer);
    ASSERT_EQ(p.size(), 1u);
    EXPECT_EQ(p[0].compartment, "Detritus");
    EXPECT_EQ(p[0].prey, "import");
}

TEST(Validation, RoutingSumAndTarget)
{
    Model m = soundModel();
    m.addCompartment(makeCompartment("Dissolved", CompartmentKind::Detritus));
    m.setRouting(1, 2, 0.6);
    m.setRouting(1, 3, 0.3);  // sums to 0.9
    m.setRouting(0, 1, 1.0);  // Algae -> Grazer: not a pool
    const Problems all = validateModel(m);
    const auto sum = withCode(all, check::kRoutingSum);
    ASSERT_EQ(sum.size(), 1u);
    EXPECT_EQ(sum[0].compartment, "Grazer");
    EXPECT_EQ(sum[0].parameter, "routing");
    EXPECT_TRUE(mentions(sum[0], "0.9"));
    const auto target = withCode(all, check::kRoutingToLiving);
    ASSERT_EQ(target.size(), 1u);
    EXPECT_EQ(target[0].compartment, "Algae");
    EXPECT_EQ(target[0].prey, "Grazer");
    m.setRouting(1, 3, 0.4);
    EXPECT_TRUE(withCode(validateModel(m), check::kRoutingSum).empty());
}

TEST(Validation, NegativeRoutingFraction)
{
    Model m = soundModel();
    m.addCompartment(makeCompartment("Dissolved", CompartmentKind::Detritus));
    m.setRouting(1, 2, 1.2);
    m.setRouting(1, 3, -0.2);  // sums to 1 but is nonsense
    const auto p = withCode(validateModel(m), check::kRoutingFraction);
    ASSERT_EQ(p.size(), 2u);
    EXPECT_EQ(p[1].prey, "Dissolved");
}

TEST(Validation, HarvestSignsSurvivalAndDetritus)
{
    Model m = soundModel();
    m.fleet(0).landings[0] = -1;
    m.fleet(0).discards[1] = -2;
    m.fleet(0).discardSurvival[1] = 1.5;
    m.fleet(0).landings[2] = 3;
    const Problems all = validateModel(m);
    const auto landings = withCode(all, check::kNegativeLandings);
    ASSERT_EQ(landings.size(), 1u);
    EXPECT_EQ(landings[0].compartment, "Algae");
    EXPECT_EQ(landings[0].fleet, "Nets");
    EXPECT_EQ(landings[0].parameter, "harvest");
    ASSERT_EQ(withCode(all, check::kNegativeDiscards).size(), 1u);
    const auto survival = withCode(all, check::kDiscardSurvival);
    ASSERT_EQ(survival.size(), 1u);
    EXPECT_TRUE(mentions(survival[0], "1.5"));
    const auto detritus = withCode(all, check::kCatchFromDetritus);
    ASSERT_EQ(detritus.size(), 1u);
    EXPECT_EQ(detritus[0].compartment, "Detritus");
}

TEST(Validation, FleetNamesAndDiscardPool)
{
    Model m = soundModel();
    m.addFleet("Nets");
    m.addFleet("");
    m.fleet(0).discardPool = 1;  // Grazer is not a pool
    const Problems all = validateModel(m);
    EXPECT_EQ(withCode(all, check::kDuplicateFleet).size(), 1u);
    EXPECT_EQ(withCode(all, check::kEmptyFleetName).size(), 1u);
    const auto pool = withCode(all, check::kDiscardPool);
    ASSERT_EQ(pool.size(), 1u);
    EXPECT_EQ(pool[0].compartment, "Grazer");
}

TEST(Validation, MissingDetritusPoolIsAWarning)
{
    Model m = soundModel();
    m.setDiet(1, 0, 1.0);
    m.removeCompartment(2);
    const Problems all = validateModel(m);
    const auto p = withCode(all, check::kNoDetritusPool);
    ASSERT_EQ(p.size(), 1u);
    EXPECT_EQ(p[0].severity, Severity::Warning);
    EXPECT_FALSE(hasErrors(all));
    EXPECT_TRUE(validateModel(Model{}).empty());
}

TEST(Validation, EveryProblemHasMessageAndHint)
{
    Model m = soundModel();
    m.compartment(1).value(Param::QB) = -1;
    m.compartment(0).value(Param::QB) = 1;
    m.setDiet(1, 0, 2);
    m.fleet(0).discards[2] = 1;
    const Problems all = validateModel(m);
    ASSERT_GE(all.size(), 4u);
    for (const Problem& p : all) {
        EXPECT_FALSE(p.code.empty());
        EXPECT_FALSE(p.message.empty()) << p.code;
        EXPECT_FALSE(p.hint.empty()) << p.code;
        EXPECT_FALSE(p.location.has_value()) << "validation knows no files";
    }
}

}  // namespace
}  // namespace tl
