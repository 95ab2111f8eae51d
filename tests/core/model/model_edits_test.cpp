// What the workbench asks and offers around an edit (issue 13), in the core:
// names equal up to capitals and spaces (core/model/names.h), what removing a
// compartment takes with it (removal_impact.h), one-click fixes (problem_fixes.h) and
// values beyond their plausible range (plausible_ranges.h). Models are invented.
#include <gtest/gtest.h>

#include <algorithm>

#include "core/model/names.h"
#include "core/model/plausible_ranges.h"
#include "core/model/problem_codes.h"
#include "core/model/problem_fixes.h"
#include "core/model/removal_impact.h"
#include "core/model/validation.h"
#include "tests/support/small_models.h"

namespace tl {
namespace {

using testing::makeCompartment;

// Invented pond: Algae, Daphnia, Perch, Pike, two detritus pools; a gill-net fleet.
Model pond()
{
    Model m;
    m.addCompartment(makeCompartment("Algae", CompartmentKind::Producer, 20.0, 150.0));
    m.addCompartment(makeCompartment("Daphnia", CompartmentKind::Consumer, 12.0, 30.0, 120.0));
    m.addCompartment(makeCompartment("Perch", CompartmentKind::Consumer, 2.0, 1.2, 8.0));
    m.addCompartment(makeCompartment("Pike", CompartmentKind::Consumer, 0.8, 0.6, 3.5));
    m.addCompartment(makeCompartment("Sediment", CompartmentKind::Detritus, 50.0));
    m.addCompartment(makeCompartment("Floc", CompartmentKind::Detritus, 5.0));
    m.setDiet(1, 0, 0.7);
    m.setDiet(1, 4, 0.3);
    m.setDiet(2, 1, 0.6);
    m.setDiet(2, 4, 0.4);
    m.setDiet(3, 2, 0.75);
    m.setDiet(3, 1, 0.25);
    const std::size_t f = m.addFleet("Gill nets");
    m.fleet(f).landings[2] = 0.5;
    m.fleet(f).discardPool = 5;
    m.setRouting(2, 5, 1.0);
    return m;
}

std::size_t countCode(const Problems& problems, std::string_view code)
{
    return std::size_t(std::count_if(problems.begin(), problems.end(), [&](const Problem& p) { return p.code == code; }));
}

TEST(Names, EqualUpToCapitalsAndSpaces)
{
    EXPECT_TRUE(sameName("Zooplankton", "zooplankton "));
    EXPECT_TRUE(sameName("Large  zooplankton", " large zooplankton"));
    EXPECT_TRUE(sameName("PIKE", "pike"));
    EXPECT_FALSE(sameName("Pike", "Pike 2"));
    EXPECT_FALSE(sameName("Perch", "Pearch"));
    EXPECT_EQ(nameKey("  Blue\tBream  "), "blue bream");
}

TEST(RemovalImpact, NamesThePredatorsWithTheirLossAndTheFleetsAndRoutes)
{
    const Model m = pond();
    const RemovalImpact perch = removalImpact(m, {2});
    ASSERT_EQ(perch.diets.size(), 1u);
    EXPECT_EQ(perch.diets[0].predator, "Pike");
    EXPECT_DOUBLE_EQ(perch.diets[0].share, 0.75);
    EXPECT_EQ(perch.diets[0].prey, std::vector<std::string>{"Perch"});
    EXPECT_EQ(perch.fleetsCatching, std::vector<std::string>{"Gill nets"});
    EXPECT_TRUE(perch.routedTo.empty()) << "Perch's own routing goes with it";

    // Daphnia and Perch together: Pike loses all of its diet; Perch (removed) is not listed.
    const RemovalImpact both = removalImpact(m, {1, 2, 2});
    ASSERT_EQ(both.diets.size(), 1u);
    EXPECT_DOUBLE_EQ(both.diets[0].share, 1.0);

    const RemovalImpact floc = removalImpact(m, {5});
    EXPECT_TRUE(floc.diets.empty());
    EXPECT_EQ(floc.fleetsDiscardingTo, std::vector<std::string>{"Gill nets"});
    EXPECT_EQ(floc.routedTo, std::vector<std::string>{"Perch"});

    EXPECT_TRUE(removalImpact(m, {3}).empty()) << "nothing eats, catches or routes to Pike";
}

TEST(ProblemFixes, ADietSummingToLessThanOneIsScaled)
{
    Model m = pond();
    m.setDiet(3, 2, 0.5);  // Pike: 0.5 + 0.25 = 0.75
    const Problems problems = validateModel(m);
    const auto it = std::find_if(problems.begin(), problems.end(), [](const Problem& p) { return p.code == code::kDietSum; });
    ASSERT_NE(it, problems.end());
    const auto fix = unambiguousFix(m, *it);
    ASSERT_TRUE(fix);
    EXPECT_EQ(fix->label, "Scale the diet of Pike so that it sums to 1");
    EXPECT_EQ(fixLabel(m, *it), fix->label);
    EXPECT_DOUBLE_EQ(fix->fixed.diet(3, 2), 0.5 / 0.75);
    EXPECT_DOUBLE_EQ(fix->fixed.diet(3, 1), 0.25 / 0.75);
    EXPECT_NEAR(fix->fixed.dietRowSum(3), 1.0, 1e-15);
    EXPECT_EQ(countCode(validateModel(fix->fixed), code::kDietSum), 0u);

    // An empty diet has no proportions to keep: no fix.
    Model empty = pond();
    empty.setDiet(3, 2, 0.0);
    empty.setDiet(3, 1, 0.0);
    Problem p;
    p.code = code::kDietSum;
    p.compartment = "Pike";
    EXPECT_FALSE(unambiguousFix(empty, p));
}

TEST(ProblemFixes, RoutingGoesToTheOnlyPoolOrIsScaledOverSeveral)
{
    Model two = pond();
    two.setRouting(2, 5, 0.25);
    two.setRouting(2, 4, 0.25);  // Perch: 0.5 over two pools
    Problem p;
    p.code = code::kRoutingSum;
    p.compartment = "Perch";
    auto fix = unambiguousFix(two, p);
    ASSERT_TRUE(fix);
    EXPECT_DOUBLE_EQ(fix->fixed.routing(2, 4), 0.5);
    EXPECT_DOUBLE_EQ(fix->fixed.routing(2, 5), 0.5);

    Model one = pond();
    one.removeCompartment(5);  // only Sediment left
    one.setRouting(2, 4, 0.4);
    one.setRouting(2, 1, 0.2);  // to a living compartment: routing-to-non-detritus
    p.code = code::kRoutingToLiving;
    fix = unambiguousFix(one, p);
    ASSERT_TRUE(fix);
    EXPECT_EQ(fix->label, "Send all the detritus of Perch to Sediment");
    EXPECT_DOUBLE_EQ(fix->fixed.routing(2, 4), 1.0);
    EXPECT_DOUBLE_EQ(fix->fixed.routing(2, 1), 0.0);
    EXPECT_EQ(countCode(validateModel(fix->fixed), code::kRoutingSum) + countCode(validateModel(fix->fixed), code::kRoutingToLiving), 0u);

    // Several pools and a share to a living compartment: which pool is a person's choice.
    Model unclear = pond();
    unclear.setRouting(2, 1, 0.5);
    EXPECT_FALSE(unambiguousFix(unclear, p));
}

TEST(ProblemFixes, DiscardsGoToTheOnlyPool)
{
    Model m = pond();
    m.removeCompartment(5);
    m.fleet(0).discardPool = 1;  // Daphnia: not a pool
    const Problems problems = validateModel(m);
    const auto it = std::find_if(problems.begin(), problems.end(), [](const Problem& q) { return q.code == code::kDiscardPool; });
    ASSERT_NE(it, problems.end());
    const auto fix = unambiguousFix(m, *it);
    ASSERT_TRUE(fix);
    EXPECT_EQ(fix->fixed.fleet(0).discardPool, std::optional<std::size_t>(4));
    EXPECT_EQ(countCode(validateModel(fix->fixed), code::kDiscardPool), 0u);
}

TEST(PlausibleRanges, AbsurdValuesAreWarnedNotRefused)
{
    Model m = pond();
    EXPECT_TRUE(implausibleValues(m).empty());
    m.compartment(3).value(Param::Biomass) = 1e300;
    m.compartment(1).value(Param::QB) = 2e4;
    m.fleet(0).landings[2] = -3e7;
    const Problems found = implausibleValues(m);
    ASSERT_EQ(found.size(), 3u);
    for (const Problem& p : found) {
        EXPECT_EQ(p.code, code::kImplausibleValue);
        EXPECT_EQ(p.severity, Severity::Warning);
        EXPECT_NE(findProblemCode(p.code), nullptr);
    }
    EXPECT_EQ(found[0].compartment, "Daphnia");
    EXPECT_EQ(found[0].parameter, "qb");
    EXPECT_EQ(found[1].compartment, "Pike");
    EXPECT_EQ(found[1].parameter, "biomass");
    EXPECT_NE(found[1].message.find("1e+300"), std::string::npos) << found[1].message;
    EXPECT_EQ(found[2].fleet, "Gill nets");
    // The limits are the caller's: B = 1e300 passes a range that allows it.
    PlausibleRanges wide;
    wide.biomassMax = 1e301;
    wide.rateMax = 1e5;
    wide.flowMax = 1e8;
    EXPECT_TRUE(implausibleValues(m, wide).empty());
    // Exactly at the limit is plausible (common practice, no source: the limit is inclusive).
    Model edge = pond();
    edge.compartment(0).value(Param::Biomass) = PlausibleRanges{}.biomassMax;
    EXPECT_TRUE(implausibleValues(edge).empty());
    // Without explicit ranges the model's own rules decide (editable per project).
    edge.rules.plausible.biomassMax = 1e5;
    const Problems own = implausibleValues(edge);
    ASSERT_EQ(own.size(), 1u);
    EXPECT_EQ(own[0].parameter, "biomass");
    EXPECT_NE(own[0].message.find("100000"), std::string::npos) << own[0].message;
}

}  // namespace
}  // namespace tl
