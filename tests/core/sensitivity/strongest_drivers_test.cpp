// strongestDrivers (core/sensitivity/strongest_drivers.h): the tornado's figures, by hand
// on the pond and against the full elasticity matrix.
#include <cmath>

#include <gtest/gtest.h>

#include "core/sensitivity/strongest_drivers.h"
#include "tests/core/sensitivity/sensitivity_models.h"

namespace tl {
namespace {

// By hand (sensitivity_models.h): Grazer B = (0.5 x 5 + 2) / (0.8 x 5) = 1.125, so the
// Algae eaten are 0.7 x 1.125 x 20 + 0.3 x 5 = 15.75 + 1.5 = 17.25 of a production of 2000.
// EE(Algae) = 17.25 / (B P/B): elasticity -1 for Algae's B and P/B; Grazer's Q/B moves
// the 15.75 part in proportion: 15.75 / 17.25.
TEST(StrongestDrivers, PondWorkedByHand)
{
    const StrongestDrivers d = strongestDrivers(testing::handPond(), "Algae.ee", 50);
    ASSERT_TRUE(d.error.empty()) << d.error;
    ASSERT_GE(d.drivers.size(), 3u);
    EXPECT_NEAR(d.drivers[0].elasticity, -1.0, 1e-9);
    EXPECT_NEAR(d.drivers[1].elasticity, -1.0, 1e-9);
    bool grazerQb = false;
    for (const Driver& x : d.drivers) {
        if (x.input == "Grazer.qb") {
            grazerQb = true;
            EXPECT_NEAR(x.elasticity, 15.75 / 17.25, 1e-9);
        }
    }
    EXPECT_TRUE(grazerQb);
    for (std::size_t k = 1; k < d.drivers.size(); ++k)
        EXPECT_GE(std::abs(d.drivers[k - 1].elasticity), std::abs(d.drivers[k].elasticity));
    EXPECT_EQ(strongestDrivers(testing::handPond(), "Algae.ee", 2).drivers.size(), 2u);
}

TEST(StrongestDrivers, SameAsTheRowOfTheFullMatrix)
{
    const Model m = testing::handPond();
    const ElasticityResult all = computeElasticities(m);
    for (std::size_t o = 0; o < all.outputs.size(); ++o) {
        const std::string name = outputName(m, all.outputs[o]);
        const StrongestDrivers d = strongestDrivers(m, name, 1000);
        ASSERT_TRUE(d.error.empty()) << name << ": " << d.error;
        for (const Driver& x : d.drivers) {
            bool found = false;
            for (std::size_t k = 0; k < all.inputs.size(); ++k)
                if (inputName(m, all.inputs[k]) == x.input) {
                    found = true;
                    EXPECT_NEAR(x.elasticity, all.elasticity(Eigen::Index(o), Eigen::Index(k)), 1e-12) << name << " " << x.input;
                }
            EXPECT_TRUE(found) << x.input;
        }
    }
}

TEST(StrongestDrivers, GivenValuesAndUnknownNamesAreExplained)
{
    const Model m = testing::handPond();
    EXPECT_NE(strongestDrivers(m, "Algae.biomass", 5).error.find("given"), std::string::npos);
    EXPECT_NE(strongestDrivers(m, "Heron.ee", 5).error.find("not COMPARTMENT.QUANTITY"), std::string::npos);
    EXPECT_NE(strongestDrivers(m, "Algae.colour", 5).error.find("not COMPARTMENT.QUANTITY"), std::string::npos);
}

}  // namespace
}  // namespace tl
