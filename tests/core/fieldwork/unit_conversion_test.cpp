// Biomass unit conversion, worked by hand: 0.45 t wet weight/km² is 450 kg/km², i.e.
// 0.45 g wet weight/m²; with 0.1 g C per g wet weight 0.045 g C/m²; with 5 kJ per g
// 2.25 kJ/m².
#include <gtest/gtest.h>

#include "core/fieldwork/unit_conversion.h"

namespace tl::fieldwork {
namespace {

BiomassUnit unit(const char* currency, const char* area)
{
    Units u;
    u.currency = currency;
    u.area = area;
    Problems problems;
    const auto parsed = parseBiomassUnit(u, problems);
    EXPECT_TRUE(parsed) << currency << "/" << area;
    return parsed.value_or(BiomassUnit{});
}

TEST(UnitConversion, HandWorkedConversions)
{
    const ConversionFactors f;
    const BiomassUnit survey = tonnesWetWeightPerKm2();
    EXPECT_NEAR(convertBiomass(0.45, survey, unit("t wet weight", "km²"), f), 0.45, 1e-15);
    EXPECT_NEAR(convertBiomass(0.45, survey, unit("g wet weight", "m²"), f), 0.45, 1e-15);
    EXPECT_NEAR(convertBiomass(0.45, survey, unit("g C", "m²"), f), 0.045, 1e-15);
    EXPECT_NEAR(convertBiomass(0.45, survey, unit("kJ", "m²"), f), 2.25, 1e-12);
    EXPECT_NEAR(convertBiomass(0.45, survey, unit("kg ww", "ha"), f), 4.5, 1e-12);
    // Editable factors: 1:9 carbon.
    ConversionFactors nine = f;
    nine.carbonPerWetWeight = 1.0 / 9.0;
    EXPECT_NEAR(convertBiomass(0.45, survey, unit("g C", "m²"), nine), 0.05, 1e-15);
    // Round trip.
    const BiomassUnit kj = unit("kJ", "m²");
    EXPECT_NEAR(convertBiomass(convertBiomass(3.0, survey, kj, f), kj, survey, f), 3.0, 1e-12);
    EXPECT_NE(conversionNote(Currency::WetWeight, Currency::Carbon, f).find("0.1 g C"), std::string::npos);
    EXPECT_TRUE(conversionNote(Currency::WetWeight, Currency::WetWeight, f).empty());
}

TEST(UnitConversion, UnknownUnitsAreSaid)
{
    Units u;
    u.currency = "bushels";
    Problems problems;
    EXPECT_FALSE(parseBiomassUnit(u, problems));
    ASSERT_EQ(problems.size(), 1u);
    EXPECT_NE(problems[0].message.find("bushels"), std::string::npos);
    u.currency = "t wet weight";
    u.area = "acre";
    EXPECT_FALSE(parseBiomassUnit(u, problems));
}

}  // namespace
}  // namespace tl::fieldwork
