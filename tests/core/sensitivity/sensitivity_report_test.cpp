// The sensitivity reports (core/sensitivity/sensitivity_report.h): the JSON contract parsed
// as JSON (keys, ranking, nulls), the PRCC part that the ensemble will fill, and the text.
#include <cmath>
#include <random>

#include <gtest/gtest.h>

#include "core/sensitivity/sensitivity_report.h"
#include "tests/core/sensitivity/sensitivity_models.h"
#include "tests/support/test_support.h"

namespace tl {
namespace {

TEST(SensitivityReport, JsonKeysRankingAndNoPrccWithoutDraws)
{
    const Model m = testing::handPond();
    const ElasticityResult r = computeElasticities(m);
    const nlohmann::json j = nlohmann::json::parse(sensitivityJson(m, r, {"pond", std::nullopt, nullptr}));
    for (const char* key : {"scenario", "status", "error", "method_note", "log_step", "diet_path", "input_count",
                            "output_count", "outputs", "inputs", "prcc", "notice"})
        EXPECT_TRUE(j.contains(key)) << key;
    EXPECT_TRUE(j.at("prcc").is_null());
    EXPECT_TRUE(j.at("error").is_null());
    EXPECT_EQ(j.at("inputs").size(), r.inputs.size());
    for (const auto& out : j.at("outputs")) {
        double previous = INFINITY;
        for (const auto& e : out.at("elasticities")) {
            const double magnitude = std::abs(e.at("elasticity").get<double>());
            EXPECT_LE(magnitude, previous);
            EXPECT_GT(magnitude, 1e-12);  // rounding residue is left out
            previous = magnitude;
        }
    }
    // --top keeps the largest.
    const nlohmann::json top = nlohmann::json::parse(sensitivityJson(m, r, {"pond", 2, nullptr}));
    for (const auto& out : top.at("outputs")) EXPECT_LE(out.at("elasticities").size(), 2u);
}

TEST(SensitivityReport, PrccDriversRankedAndUndefinedInputsNamed)
{
    std::mt19937 rng(3);
    std::uniform_real_distribution<double> u(0.0, 1.0);
    const Eigen::Index draws = 300;
    Eigen::MatrixXd inputs(draws, 4), outputs(draws, 2);
    for (Eigen::Index d = 0; d < draws; ++d) {
        inputs.row(d) << u(rng), u(rng), 5.0, u(rng);
        outputs(d, 0) = 3.0 * inputs(d, 0) - inputs(d, 3) + 0.3 * u(rng);
        outputs(d, 1) = 1.0;  // constant
    }
    const PrccTable table = prccTable({"Grazer.pb", "Pike.biomass", "Algae.biomass", "Pike.diet:Grazer"}, inputs,
                                      {"Grazer.biomass", "Algae.ee"}, outputs);
    const Model m = testing::handPond();
    const ElasticityResult r = computeElasticities(m);
    const nlohmann::json j = nlohmann::json::parse(sensitivityJson(m, r, {"pond", std::nullopt, &table}));
    const nlohmann::json& prcc = j.at("prcc");
    ASSERT_EQ(prcc.at("outputs").size(), 2u);
    const nlohmann::json& first = prcc.at("outputs")[0];
    EXPECT_EQ(first.at("output"), "Grazer.biomass");
    EXPECT_EQ(first.at("draws").get<int>(), draws);
    ASSERT_EQ(first.at("drivers").size(), 3u);
    EXPECT_EQ(first.at("drivers")[0].at("input"), "Grazer.pb");
    EXPECT_EQ(first.at("drivers")[1].at("input"), "Pike.diet:Grazer");
    EXPECT_LT(first.at("drivers")[1].at("prcc").get<double>(), 0.0);
    EXPECT_LT(first.at("drivers")[0].at("p_value").get<double>(), 1e-10);
    ASSERT_EQ(first.at("undefined").size(), 1u);
    EXPECT_EQ(first.at("undefined")[0].at("input"), "Algae.biomass");
    EXPECT_EQ(first.at("undefined")[0].at("reason"), "constant_input");
    const nlohmann::json& second = prcc.at("outputs")[1];
    EXPECT_TRUE(second.at("drivers").empty());
    EXPECT_EQ(second.at("undefined").size(), 4u);

    const std::string text = sensitivityText(m, r, {"pond", 5, &table});
    EXPECT_NE(text.find("Partial rank correlation"), std::string::npos);
    EXPECT_NE(text.find("Pike.diet:Grazer"), std::string::npos);
    EXPECT_NE(text.find("no input has a defined coefficient"), std::string::npos);
}

}  // namespace
}  // namespace tl
