// JSON and tables of a scenario comparison (core/compare/comparison_report.h): the keys
// of the contract (DEVELOPERS.md) are checked by parsing the JSON.
#include "core/compare/comparison_report.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "tests/support/small_models.h"

namespace tl {
namespace {

Scenario pond(const std::string& name, double grazerBiomass)
{
    Scenario s;
    s.name = name;
    s.model = testing::threeBoxPond(1.0);
    s.model.compartment(0).value(Param::Biomass) = 10.0;
    s.model.compartment(0).value(Param::PB) = 100.0;
    s.model.compartment(1).value(Param::Biomass) = grazerBiomass;
    s.model.compartment(1).value(Param::PB) = 2.0;
    s.model.compartment(1).value(Param::QB) = 10.0;
    return s;
}

TEST(ComparisonReport, JsonKeysHold)
{
    const Scenario a = pond("baseline", 5.0), b = pond("bigger <grazer>", 6.0);
    const nlohmann::json j = nlohmann::json::parse(comparisonJson(compareScenarios({&a, &b})));
    for (const char* key : {"reference", "scenarios", "differing_inputs", "differing_outputs", "compared_outputs", "inputs",
                            "outputs", "notice"})
        EXPECT_TRUE(j.contains(key)) << key;
    EXPECT_EQ(j["reference"], "baseline");
    ASSERT_EQ(j["scenarios"].size(), 2u);
    EXPECT_EQ(j["scenarios"][1]["name"], "bigger <grazer>");
    EXPECT_EQ(j["scenarios"][0]["status"], "balanced");
    EXPECT_EQ(j["differing_inputs"], 1);
    const auto& input = j["inputs"][0];
    for (const char* key : {"compartment", "item", "label", "values", "shown", "sources", "confidence", "value_differs",
                            "source_differs", "confidence_differs"})
        EXPECT_TRUE(input.contains(key)) << key;
    EXPECT_EQ(input["values"], nlohmann::json::parse("[5, 6]"));
    bool sawBiomass = false;
    for (const auto& o : j["outputs"]) {
        for (const char* key : {"group", "subject", "quantity", "label", "unit", "values", "differs", "differences"})
            ASSERT_TRUE(o.contains(key)) << key;
        ASSERT_EQ(o["differences"].size(), 1u);
        for (const char* key : {"scenario", "absolute", "percent", "differs", "same_sign_share"})
            ASSERT_TRUE(o["differences"][0].contains(key)) << key;
        if (o["subject"] == "Grazer" && o["quantity"] == "biomass") {
            sawBiomass = true;
            EXPECT_EQ(o["group"], "compartment");
            EXPECT_EQ(o["unit"], "t wet weight/km²");
            EXPECT_DOUBLE_EQ(o["differences"][0]["percent"].get<double>(), 20.0);
            EXPECT_TRUE(o["differences"][0]["same_sign_share"].is_null());
        }
    }
    EXPECT_TRUE(sawBiomass);
}

TEST(ComparisonReport, TablesListTheChangeWithUnitsAndNotice)
{
    const Scenario a = pond("baseline", 5.0), b = pond("bigger grazer", 6.0);
    const std::string text = comparisonTables(compareScenarios({&a, &b}));
    EXPECT_NE(text.find("Inputs that differ: 1"), std::string::npos) << text;
    EXPECT_NE(text.find("+20 %"), std::string::npos) << text;
    EXPECT_NE(text.find("t wet weight/km²"), std::string::npos) << text;
    EXPECT_NE(text.find("does not replace"), std::string::npos);
}

TEST(ComparisonReport, PercentText)
{
    EXPECT_EQ(percentText({2.0, 20.0, true, std::nullopt}), "+20 %");
    EXPECT_EQ(percentText({-1.0, -12.5, true, std::nullopt}), "-12.5 %");
    EXPECT_EQ(percentText({0.0, 0.0, false, std::nullopt}), "0 %");
    EXPECT_EQ(percentText({1.0, std::nan(""), true, std::nullopt}), "undefined");
}

}  // namespace
}  // namespace tl
