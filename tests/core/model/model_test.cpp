#include "core/model/model.h"

#include <gtest/gtest.h>

#include "tests/support/small_models.h"

namespace tl {
namespace {

using testing::makeCompartment;

Model threeBoxModel() { return testing::threeBoxPond(2.0); }

TEST(Model, InsertKeepsDietAndHarvestAligned)
{
    Model m = threeBoxModel();
    m.addCompartment(makeCompartment("Snail", CompartmentKind::Consumer), 1);
    ASSERT_EQ(m.size(), 4u);
    EXPECT_EQ(m.compartment(2).name, "Grazer");
    EXPECT_DOUBLE_EQ(m.diet(2, 0), 0.7);
    EXPECT_DOUBLE_EQ(m.diet(2, 3), 0.3);
    EXPECT_DOUBLE_EQ(m.diet(1, 0), 0.0);
    EXPECT_DOUBLE_EQ(m.fleet(0).landings[2], 2.0);
    EXPECT_DOUBLE_EQ(m.fleet(0).landings[1], 0.0);
}

TEST(Model, RemoveThenReinsertRestoresModel)
{
    const Model original = threeBoxModel();
    Model m = original;
    const Compartment grazer = m.compartment(1);
    m.removeCompartment(1);
    EXPECT_EQ(m.size(), 2u);
    EXPECT_EQ(m.indexOf("Grazer"), std::nullopt);
    m.addCompartment(grazer, 1);
    m.setDiet(1, 0, 0.7);
    m.setDiet(1, 2, 0.3);
    m.fleet(0).landings[1] = 2.0;
    EXPECT_EQ(m, original);
}

TEST(Model, MoveCompartmentCarriesItsRowsAndColumns)
{
    Model m = threeBoxModel();
    m.moveCompartment(2, 0);  // Detritus first
    EXPECT_EQ(m.compartment(0).name, "Detritus");
    EXPECT_EQ(m.compartment(2).name, "Grazer");
    EXPECT_DOUBLE_EQ(m.diet(2, 1), 0.7);  // Grazer eats Algae (now index 1)
    EXPECT_DOUBLE_EQ(m.diet(2, 0), 0.3);  // and Detritus (now index 0)
    EXPECT_DOUBLE_EQ(m.fleet(0).landings[2], 2.0);
    m.moveCompartment(0, 2);
    EXPECT_EQ(m, threeBoxModel());
}

TEST(Model, DietRowListsNonZeroPreyInIndexOrder)
{
    Model m = threeBoxModel();
    ASSERT_EQ(m.dietRow(1).size(), 2u);
    EXPECT_EQ(m.dietRow(1)[0], (GridEntry{0, 0.7}));
    EXPECT_EQ(m.dietRow(1)[1], (GridEntry{2, 0.3}));
    EXPECT_TRUE(m.dietRow(0).empty());
    m.setDiet(1, 2, 0.0);  // clearing a cell removes its entry
    ASSERT_EQ(m.dietRow(1).size(), 1u);
    m.moveCompartment(0, 2);  // Algae last: Grazer is now 0, Detritus 1, Algae 2
    ASSERT_EQ(m.dietRow(0).size(), 1u);
    EXPECT_EQ(m.dietRow(0)[0], (GridEntry{2, 0.7}));
    m.setRouting(0, 1, 1.0);
    ASSERT_EQ(m.routingRow(0).size(), 1u);
    EXPECT_EQ(m.routingRow(0)[0].col, 1u);
}

TEST(Model, DefaultRoutingSendsEverythingToFirstPool)
{
    Model m = threeBoxModel();
    m.addCompartment(makeCompartment("Dissolved", CompartmentKind::Detritus));
    EXPECT_DOUBLE_EQ(m.effectiveRouting(1, 2), 1.0);
    EXPECT_DOUBLE_EQ(m.effectiveRouting(1, 3), 0.0);
    m.setRouting(1, 3, 0.25);
    m.setRouting(1, 2, 0.75);
    EXPECT_DOUBLE_EQ(m.effectiveRouting(1, 3), 0.25);
}

TEST(Model, CatchCountsDeadDiscardsOnly)
{
    Model m = threeBoxModel();
    m.fleet(0).discards[1] = 1.0;
    m.fleet(0).discardSurvival[1] = 0.4;
    EXPECT_DOUBLE_EQ(m.totalCatch(1), 2.6);
}

TEST(Compartment, UnassimilatedDefaultsByKind)
{
    EXPECT_DOUBLE_EQ(makeCompartment("a", CompartmentKind::Consumer).unassimilatedOrDefault(), 0.2);
    EXPECT_DOUBLE_EQ(makeCompartment("b", CompartmentKind::Producer).unassimilatedOrDefault(), 0.0);
    Compartment c = makeCompartment("c", CompartmentKind::Consumer);
    c.value(Param::Unassim) = 0.35;
    EXPECT_DOUBLE_EQ(c.unassimilatedOrDefault(), 0.35);
}

TEST(Compartment, KeysRoundTrip)
{
    for (Param p : kAllParams) EXPECT_EQ(parseParamKey(paramKey(p)), p);
    EXPECT_EQ(parseKind(" detritus "), CompartmentKind::Detritus);
    EXPECT_EQ(parseKind("Detritus"), std::nullopt);
}

}  // namespace
}  // namespace tl
