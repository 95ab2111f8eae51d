// Diet overlap (Pianka 1973, Annu Rev Ecol Syst 4:53), worked by hand.
#include <cmath>

#include <gtest/gtest.h>

#include "core/network/diet_overlap.h"
#include "tests/support/network_models.h"

namespace tl {
namespace {

TEST(DietOverlap, PiankaByHand)
{
    Model m;
    m.addCompartment(testing::makeCompartment("A", CompartmentKind::Producer, 1.0, 1.0, std::nullopt));
    m.addCompartment(testing::makeCompartment("B", CompartmentKind::Producer, 1.0, 1.0, std::nullopt));
    m.addCompartment(testing::makeCompartment("C", CompartmentKind::Producer, 1.0, 1.0, std::nullopt));
    for (const char* name : {"X", "Y", "Z", "W"})
        m.addCompartment(testing::makeCompartment(name, CompartmentKind::Consumer, 1.0, 1.0, 5.0));
    m.setDiet(3, 0, 0.5);  // X: A, B half each
    m.setDiet(3, 1, 0.5);
    m.setDiet(4, 0, 0.5);  // Y: A, C half each
    m.setDiet(4, 2, 0.5);
    m.setDiet(5, 2, 1.0);  // Z: C only
    m.setDiet(6, 0, 0.5);  // W: A half, imported food half
    m.setDietImport(6, 0.5);
    const DietOverlap o = dietOverlap(m);
    ASSERT_EQ(o.predators, (std::vector<std::size_t>{3, 4, 5, 6}));
    // X,Y: 0.25 / sqrt(0.5 * 0.5) = 0.5;  X,Z: 0;  Y,Z: 0.5 / sqrt(0.5 * 1) = 1/sqrt(2);
    // X,W: import left out, W's modelled diet is A alone: 0.5 x 0.5 / sqrt(0.5 x 0.25) = 1/sqrt(2).
    EXPECT_NEAR(o.overlap(0, 1), 0.5, 1e-15);
    EXPECT_EQ(o.overlap(0, 2), 0.0);
    EXPECT_NEAR(o.overlap(1, 2), 1.0 / std::sqrt(2.0), 1e-15);
    EXPECT_NEAR(o.overlap(0, 3), 1.0 / std::sqrt(2.0), 1e-15);
    for (Eigen::Index k = 0; k < 4; ++k) EXPECT_NEAR(o.overlap(k, k), 1.0, 1e-15);
    EXPECT_LT((o.overlap - o.overlap.transpose()).cwiseAbs().maxCoeff(), 1e-15);
}

TEST(DietOverlap, ImportIsNoSharedResource)
{
    // Two consumers that live mostly on imported food and share no modelled prey do not
    // overlap; one that eats only imported food has no modelled diet and is left out.
    Model m;
    m.addCompartment(testing::makeCompartment("A", CompartmentKind::Producer, 1.0, 1.0, std::nullopt));
    m.addCompartment(testing::makeCompartment("B", CompartmentKind::Producer, 1.0, 1.0, std::nullopt));
    for (const char* name : {"X", "Y", "Z"})
        m.addCompartment(testing::makeCompartment(name, CompartmentKind::Consumer, 1.0, 1.0, 5.0));
    m.setDiet(2, 0, 0.1);
    m.setDietImport(2, 0.9);
    m.setDiet(3, 1, 0.1);
    m.setDietImport(3, 0.9);
    m.setDietImport(4, 1.0);
    const DietOverlap o = dietOverlap(m);
    ASSERT_EQ(o.predators, (std::vector<std::size_t>{2, 3}));
    EXPECT_EQ(o.overlap(0, 1), 0.0);
}

}  // namespace
}  // namespace tl
