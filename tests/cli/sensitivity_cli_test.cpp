// `tledger sensitivity` as a user runs it (DESIGN.md 5.2): elasticities ranked by
// magnitude in JSON and text, exit codes 0/1/2, bad arguments named. Models: the invented
// hand-worked pond of tests/core/sensitivity and the invented samples.
#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "core/io/csv_model.h"
#include "tests/core/sensitivity/sensitivity_models.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

const std::string kLagoon = shellQuoted(std::string(TL_SAMPLES_DIR) + "/lagoon.tledger");

fs::path writePond(const ScratchDir& dir, const Model& model = handPond())
{
    const fs::path folder = dir.path() / "pond";
    EXPECT_TRUE(writeCsvModel(model, folder).empty());
    return folder;
}

void expectRankedByMagnitude(const nlohmann::json& output)
{
    double previous = INFINITY;
    for (const auto& e : output.at("elasticities")) {
        const double magnitude = std::abs(e.at("elasticity").get<double>());
        EXPECT_LE(magnitude, previous) << output.at("output");
        previous = magnitude;
    }
}

TEST(SensitivityCli, OneOutputRankedWithTheHandWorkedValues)
{
    const ScratchDir dir("sensitivity_cli");
    const fs::path pond = writePond(dir);
    const CliRun run = runTledger("sensitivity " + shellQuoted(pond.string()) + " --output Grazer.b --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const nlohmann::json j = run.json();
    EXPECT_EQ(j.at("status"), "balanced");
    EXPECT_EQ(j.at("scenario"), "pond");
    EXPECT_TRUE(j.at("prcc").is_null());
    EXPECT_FALSE(j.at("notice").get<std::string>().empty());
    ASSERT_EQ(j.at("outputs").size(), 1u);
    const nlohmann::json& out = j.at("outputs")[0];
    EXPECT_EQ(out.at("output"), "Grazer.biomass");
    EXPECT_EQ(out.at("method"), "analytic");
    EXPECT_TRUE(out.at("solved").get<bool>());
    EXPECT_NEAR(out.at("value").get<double>(), 1.125, 1e-12);
    expectRankedByMagnitude(out);
    // B_G = (B_P QB_P DC_GP + Y_G) / (PB_G EE_G): the two -1s first, then 5/9, then 4/9
    // (elasticity_test.cpp works these out).
    const auto& e = out.at("elasticities");
    ASSERT_GE(e.size(), 5u);
    EXPECT_NEAR(std::abs(e[0].at("elasticity").get<double>()), 1.0, 1e-12);
    EXPECT_NEAR(std::abs(e[1].at("elasticity").get<double>()), 1.0, 1e-12);
    bool sawDiet = false;
    int sawHandWorked = 0;
    for (const auto& x : e) {
        if (x.at("input") == "Pike.biomass") {
            EXPECT_NEAR(x.at("elasticity").get<double>(), 5.0 / 9.0, 1e-12);
            ++sawHandWorked;
        }
        if (x.at("input") == "Grazer.catch") {
            EXPECT_NEAR(x.at("elasticity").get<double>(), 4.0 / 9.0, 1e-12);
            ++sawHandWorked;
        }
        if (x.at("parameter") == "diet") {
            sawDiet = true;
            EXPECT_EQ(x.at("compartment"), "Pike");
            EXPECT_TRUE(x.at("prey").is_string());
        } else {
            EXPECT_TRUE(x.at("prey").is_null());
        }
    }
    EXPECT_TRUE(sawDiet);
    EXPECT_EQ(sawHandWorked, 2);
}

TEST(SensitivityCli, EveryOutputInJsonAndTheTopInText)
{
    const CliRun run = runTledger("sensitivity " + kLagoon + " --scenario baseline --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const nlohmann::json j = run.json();
    EXPECT_EQ(j.at("output_count").get<std::size_t>(), j.at("outputs").size());
    EXPECT_EQ(j.at("input_count").get<std::size_t>(), j.at("inputs").size());
    EXPECT_GT(j.at("outputs").size(), 20u);
    std::size_t withElasticities = 0;
    for (const auto& out : j.at("outputs")) {
        for (const char* key : {"output", "compartment", "quantity", "value", "solved", "method", "note", "elasticities"})
            EXPECT_TRUE(out.contains(key)) << key;
        expectRankedByMagnitude(out);
        withElasticities += !out.at("elasticities").empty();
    }
    EXPECT_GT(withElasticities, 20u);

    const CliRun text = runTledger("sensitivity " + kLagoon + " --scenario baseline");
    ASSERT_EQ(text.exitCode, 0) << text.err;
    EXPECT_NE(text.out.find("Elasticity"), std::string::npos);
    EXPECT_NE(text.out.find("smaller not shown"), std::string::npos);  // 10 per output by default
    EXPECT_NE(text.out.find("does not replace"), std::string::npos);   // the decision-support notice
}

TEST(SensitivityCli, CentralDifferencesAgreeWithTheAnalyticDerivatives)
{
    const std::string args = "sensitivity " + kLagoon + " --scenario baseline --output 'grey mullet.ee' --json";
    const nlohmann::json analytic = runTledger(args).json(), central = runTledger(args + " --central-differences").json();
    EXPECT_EQ(central.at("outputs")[0].at("method"), "central_difference");
    std::map<std::string, double> byInput;
    for (const auto& e : analytic.at("outputs")[0].at("elasticities")) byInput[e.at("input")] = e.at("elasticity");
    ASSERT_FALSE(byInput.empty());
    for (const auto& e : central.at("outputs")[0].at("elasticities")) {
        const double c = e.at("elasticity");
        if (std::abs(c) < 1e-6) continue;  // below the differences' resolution
        ASSERT_TRUE(byInput.count(e.at("input"))) << e.at("input");
        EXPECT_NEAR(byInput[e.at("input")], c, 1e-6 + 1e-5 * std::abs(c)) << e.at("input");
    }
}

TEST(SensitivityCli, BadOutputNamesExitTwoNamingTheProblem)
{
    const ScratchDir dir("sensitivity_cli");
    const std::string pond = shellQuoted(writePond(dir).string());
    CliRun run = runTledger("sensitivity " + pond + " --output Perch.b");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("no compartment named 'Perch'"), std::string::npos) << run.err;
    EXPECT_TRUE(run.out.empty());

    run = runTledger("sensitivity " + pond + " --output Grazer.respiration");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("unknown quantity 'respiration'"), std::string::npos) << run.err;

    run = runTledger("sensitivity " + pond + " --output Pike.biomass");  // given, so an input
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("is not an output"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("Pike.ee, Pike.pq, Pike.tl"), std::string::npos) << run.err;

    run = runTledger("sensitivity " + pond + " --output Grazer");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("COMPARTMENT.QUANTITY"), std::string::npos) << run.err;

    run = runTledger("sensitivity " + pond + " --top many");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("--top 'many'"), std::string::npos) << run.err;
}

TEST(SensitivityCli, UnknownScenarioAndMissingModelExitTwo)
{
    CliRun run = runTledger("sensitivity " + kLagoon + " --scenario 'no such scenario'");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("no such scenario"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("baseline"), std::string::npos) << run.err;  // lists what it has
    run = runTledger("sensitivity " + kLagoon);  // two scenarios, none named
    EXPECT_EQ(run.exitCode, 2);
    run = runTledger("sensitivity /nonexistent/model");
    EXPECT_EQ(run.exitCode, 2);
    run = runTledger("sensitivity");
    EXPECT_EQ(run.exitCode, 2);
}

// --prcc runs an ensemble of the scenario and ranks the inputs by PRCC over its balanced
// draws. The invented pond with every value known to 5 % but the grazer's EE (CV 50 %): the
// grazer's solved B = (Q_pike 0.5 + Y) / (P/B EE) is driven by that EE first.
TEST(SensitivityCli, PrccRunsTheEnsembleAndRanksAPlantedDriverFirst)
{
    const ScratchDir dir("sensitivity_cli");
    Model m = handPond();
    m.rules.cvByGrade = {0.05, 0.05, 0.05, 0.05};
    m.compartment(1).confidenceOf(Param::EE).cv = 0.5;
    const std::string pond = shellQuoted(writePond(dir, m).string());
    CliRun run = runTledger("sensitivity " + pond + " --output Grazer.b --prcc --draws 2000 --seed 3 --threads 2 --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const nlohmann::json j = run.json();
    ASSERT_TRUE(j.at("prcc").is_object());
    const auto& source = j.at("prcc").at("ensemble");
    EXPECT_EQ(source.at("draws").get<int>(), 2000);
    EXPECT_GT(source.at("balanced_draws").get<int>(), 1000);
    EXPECT_EQ(source.at("left_out"), nlohmann::json::parse(R"(["Grazer.diet:Detritus", "Pike.diet:import"])"));
    ASSERT_EQ(j.at("prcc").at("outputs").size(), 1u);
    const auto& out = j.at("prcc").at("outputs")[0];
    EXPECT_EQ(out.at("output"), "Grazer.biomass");
    EXPECT_EQ(out.at("draws").get<int>(), source.at("balanced_draws").get<int>());
    EXPECT_EQ(out.at("drivers")[0].at("input"), "Grazer.ee");
    EXPECT_LT(out.at("drivers")[0].at("prcc").get<double>(), -0.9);
    // The text shows the same table.
    run = runTledger("sensitivity " + pond + " --output Grazer.b --prcc --draws 500 --seed 3");
    EXPECT_EQ(run.exitCode, 0) << run.err;
    EXPECT_NE(run.out.find("Partial rank correlation"), std::string::npos) << run.out;
    EXPECT_NE(run.out.find("Left out"), std::string::npos) << run.out;
}

TEST(SensitivityCli, PrccOptionsAreCheckedAndNamed)
{
    const std::string scenario = kLagoon + " --scenario baseline";
    CliRun run = runTledger("sensitivity " + scenario + " --prcc --draws 100");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("--seed"), std::string::npos) << run.err;
    run = runTledger("sensitivity " + scenario + " --draws 100 --seed 1");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("--prcc"), std::string::npos) << run.err;
    run = runTledger("sensitivity " + scenario + " --prcc --draws many --seed 1");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("--draws 'many'"), std::string::npos) << run.err;
    run = runTledger("sensitivity " + scenario + " --prcc --draws 10 --seed -1");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("--seed '-1'"), std::string::npos) << run.err;
    run = runTledger("sensitivity " + scenario + " --prcc --draws 10 --seed 1 --threads 0");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("--threads '0'"), std::string::npos) << run.err;
}

TEST(SensitivityCli, UnsolvableScenarioExitsOneAndSaysWhy)
{
    const ScratchDir dir("sensitivity_cli");
    Model m = handPond();
    m.compartment(2).value(Param::Biomass).reset();  // Pike: B and EE unknown
    const std::string pond = shellQuoted(writePond(dir, m).string());
    CliRun run = runTledger("sensitivity " + pond + " --json");
    EXPECT_EQ(run.exitCode, 1);
    const nlohmann::json j = run.json();
    EXPECT_EQ(j.at("status"), "invalid");
    EXPECT_NE(j.at("error").get<std::string>().find("Pike"), std::string::npos);
    EXPECT_TRUE(j.at("outputs").empty());
    run = runTledger("sensitivity " + pond);
    EXPECT_EQ(run.exitCode, 1);
    EXPECT_NE(run.out.find("Not computed"), std::string::npos) << run.out;
}

}  // namespace
}  // namespace tl::testing
