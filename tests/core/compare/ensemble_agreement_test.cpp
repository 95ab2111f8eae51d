// Ensemble agreement of a comparison (core/compare/ensemble_agreement.h): paired draws
// (same seed, same draw index) judge a planted difference, an identical pair has no sign
// to keep, the keys of the ensemble map onto the comparison's, the JSON says so.
#include "core/compare/ensemble_agreement.h"

#include <cmath>
#include <gtest/gtest.h>

#include "core/compare/comparison_report.h"
#include "core/ensemble/ensemble_report.h"
#include "tests/support/small_models.h"
#include "tests/support/test_support.h"

namespace tl {
namespace {

// The invented three-box pond: Algae B 10, P/B 100; Grazer B `grazerB`, P/B 2, Q/B 10,
// EE unknown; 1 landed by Nets; every value known to 10 %.
Scenario pond(const std::string& name, double grazerB)
{
    Scenario s;
    s.name = name;
    s.model = testing::threeBoxPond(1.0);
    s.model.rules.cvByGrade = {0.1, 0.1, 0.1, 0.1};
    s.model.compartment(0).value(Param::Biomass) = 10.0;
    s.model.compartment(0).value(Param::PB) = 100.0;
    Compartment& grazer = s.model.compartment(1);
    grazer.value(Param::Biomass) = grazerB;
    grazer.value(Param::PB) = 2.0;
    grazer.value(Param::QB) = 10.0;
    return s;
}

ensemble::EnsembleSettings settings()
{
    ensemble::EnsembleSettings s;
    s.draws = 2000;
    s.seed = 99;
    s.threads = 2;
    return s;
}

const ComparedOutput& output(const ScenarioComparison& c, const std::string& key)
{
    for (const ComparedOutput& o : c.outputs)
        if (o.key() == key) return o;
    ADD_FAILURE() << "no output " << key;
    static const ComparedOutput none;
    return none;
}

TEST(EnsembleAgreement, EnsembleOutputNamesMapOntoComparisonKeys)
{
    EXPECT_EQ(comparisonKeyOf("Perch.ee"), "Perch.ee");
    EXPECT_EQ(comparisonKeyOf("system.te_III"), "III.te");
    EXPECT_EQ(comparisonKeyOf("system.tst"), "tst");
    EXPECT_EQ(comparisonKeyOf("system.mean_te"), "mean_te");  // no comparison output: never looked up
}

// A 1 % larger grazer biomass: at the point estimate the algae's EE rises by 1 % and the
// grazer's falls. In paired draws the grazer's drawn B is the same quantile in both
// scenarios (B x 1.01), so every pair keeps the sign: share 1. Unpaired draws with a 10 %
// CV would keep it in about half of them; that the share is 1 shows the pairing.
TEST(EnsembleAgreement, APlantedDifferenceKeepsItsSignInEveryPairedDraw)
{
    const Scenario a = pond("baseline", 5.0), b = pond("grazer up 1 %", 5.05);
    ScenarioComparison c = compareScenarios({&a, &b});
    const EnsembleAgreementRun run = attachEnsembleRuns(c, {&a, &b}, settings());
    ASSERT_TRUE(run.problems.empty());
    ASSERT_TRUE(c.ensemble);
    EXPECT_EQ(c.ensemble->draws, 2000u);
    ASSERT_EQ(c.ensemble->balanced.size(), 2u);
    EXPECT_GT(c.ensemble->paired, 1500u);
    EXPECT_LE(c.ensemble->paired, std::min(c.ensemble->balanced[0], c.ensemble->balanced[1]));
    EXPECT_GT(run.filled, 10u);
    for (const char* key : {"Algae.ee", "Grazer.ee", "Grazer.biomass"}) {
        const auto& share = output(c, key).differences[1].sameSignShare;
        ASSERT_TRUE(share) << key;
        EXPECT_DOUBLE_EQ(*share, 1.0) << key;
    }
    // Outputs the ensemble does not compute keep no share (flows); levels and indicators do.
    EXPECT_FALSE(output(c, "Grazer.consumption").differences[1].sameSignShare);
    EXPECT_TRUE(output(c, "tst").differences[1].sameSignShare);
    EXPECT_TRUE(output(c, "II.te").differences[1].sameSignShare);

    const nlohmann::json j = nlohmann::json::parse(comparisonJson(c));
    ASSERT_TRUE(j.at("ensemble").is_object());
    EXPECT_EQ(j.at("ensemble").at("paired_draws").get<std::uint64_t>(), c.ensemble->paired);
    bool found = false;
    for (const auto& o : j.at("outputs"))
        if (o.at("subject") == "Algae" && o.at("quantity") == "ee") {
            EXPECT_DOUBLE_EQ(o.at("differences")[0].at("same_sign_share").get<double>(), 1.0);
            found = true;
        }
    EXPECT_TRUE(found);
}

// The share follows the sign of each pair: a change the uncertainty swamps keeps its sign
// in fewer pairs. The other scenario lands 2 % more (catch drawn with 10 % CV in both)
// and knows its grazer B less well (CV 30 % against 10 %): the same quantile z of B then
// moves it further, and the grazer's EE = Y / (B P/B) keeps its higher point value only
// while 1.02 B_a > B_b. For lognormals (s^2 = ln(1 + CV^2)) that is
// (s_b - s_a) z < ln 1.02 + (s_b^2 - s_a^2) / 2, z < 0.2988: Phi(0.2988) = 0.6175 (worked by
// hand); the bound is 4 binomial standard errors at ~1900 pairs plus the few draws that
// do not balance.
TEST(EnsembleAgreement, ASwampedDifferenceKeepsItsSignInFewerPairs)
{
    const Scenario a = pond("baseline", 5.0);
    Scenario b = pond("noisy", 5.0);
    b.model.fleet(0).landings[1] = 1.02;
    b.model.compartment(1).confidenceOf(Param::Biomass).cv = 0.3;
    ScenarioComparison c = compareScenarios({&a, &b});
    ASSERT_TRUE(attachEnsembleRuns(c, {&a, &b}, settings()).problems.empty());
    const auto& share = output(c, "Grazer.ee").differences[1].sameSignShare;  // EE = Y / (B P/B)
    ASSERT_TRUE(share);
    EXPECT_NEAR(*share, 0.6175, 0.05);
}

TEST(EnsembleAgreement, AnIdenticalPairHasNoSignToKeep)
{
    const Scenario a = pond("baseline", 5.0), b = pond("copy", 5.0);
    ScenarioComparison c = compareScenarios({&a, &b});
    const EnsembleAgreementRun run = attachEnsembleRuns(c, {&a, &b}, settings());
    ASSERT_TRUE(c.ensemble);
    EXPECT_EQ(c.ensemble->balanced[0], c.ensemble->balanced[1]);
    EXPECT_EQ(c.ensemble->paired, c.ensemble->balanced[0]);  // the same draws balance
    EXPECT_GT(run.filled, 10u);
    for (const ComparedOutput& o : c.outputs) {
        const auto& share = o.differences[1].sameSignShare;
        if (share) {
            EXPECT_TRUE(std::isnan(*share)) << o.key();
        }
    }
    const nlohmann::json j = nlohmann::json::parse(comparisonJson(c));
    for (const auto& o : j.at("outputs")) EXPECT_TRUE(o.at("differences")[0].at("same_sign_share").is_null());
}

// A stored run as `tledger ensemble` stores it (settings and summary JSON).
StoredRun storedRun(const Scenario& s, const ensemble::EnsembleSettings& settings, std::int64_t id)
{
    StoredRun run;
    run.id = id;
    run.scenario = s.name;
    run.kind = "ensemble";
    run.settingsJson = ensemble::ensembleSettingsJson(settings, s.name);
    run.summaryJson = ensemble::ensembleJson(ensemble::runEnsemble(s.model, settings).statistics);
    run.created = "2026-12-02T10:00:00Z";
    return run;
}

TEST(EnsembleAgreement, StoredRunsGiveTheirSettingsBackAndNameAChangedScenario)
{
    Project project;
    project.scenarios = {pond("baseline", 5.0), pond("grazer up 1 %", 5.05)};
    const Scenario& a = project.scenarios[0];
    const Scenario& b = project.scenarios[1];
    ensemble::EnsembleSettings s = settings();
    s.draws = 300;
    s.catchCv = 0.2;
    s.shape = ensemble::Shape::Triangular;
    project.runs = {storedRun(a, s, 1), storedRun(b, s, 2)};
    std::string error;
    std::vector<std::string> warnings;
    const auto got = storedEnsembleSettings(project, {&a, &b}, error, warnings);
    ASSERT_TRUE(got) << error;
    EXPECT_TRUE(warnings.empty());
    EXPECT_EQ(got->draws, 300u);
    EXPECT_EQ(got->seed, 99u);
    EXPECT_EQ(got->shape, ensemble::Shape::Triangular);
    EXPECT_EQ(got->catchCv, 0.2);
    EXPECT_FALSE(got->dietCv);
    EXPECT_FALSE(got->holdFlowTerms);
    EXPECT_EQ(ensemble::ensembleFingerprint(a.model, *got), ensemble::runEnsemble(a.model, s).statistics.fingerprint);

    // The latest run of a scenario counts; a later run with another seed breaks the pairing.
    ensemble::EnsembleSettings other = s;
    other.seed = 100;
    project.runs.push_back(storedRun(b, other, 3));
    EXPECT_FALSE(storedEnsembleSettings(project, {&a, &b}, error, warnings));
    EXPECT_NE(error.find("differ in draws, seed"), std::string::npos) << error;
    project.runs.pop_back();

    // A scenario edited after its run is named (its draws come from its current values).
    project.scenarios[1].model.compartment(0).value(Param::PB) = 90.0;
    warnings.clear();
    ASSERT_TRUE(storedEnsembleSettings(project, {&project.scenarios[0], &project.scenarios[1]}, error, warnings));
    ASSERT_EQ(warnings.size(), 1u);
    EXPECT_NE(warnings[0].find("'grazer up 1 %' changed since its stored ensemble run 2"), std::string::npos) << warnings[0];

    project.runs.pop_back();
    EXPECT_FALSE(storedEnsembleSettings(project, {&a, &b}, error, warnings));
    EXPECT_NE(error.find("has no stored ensemble run"), std::string::npos) << error;
}

}  // namespace
}  // namespace tl
