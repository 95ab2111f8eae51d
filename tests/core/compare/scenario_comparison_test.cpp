// Scenario comparison (core/compare/scenario_comparison.h). Reference values are worked
// by hand on the invented three-box pond (tests/support/small_models.h); the sample
// reservoir (invented, sample_projects/README.md) supplies real-sized scenarios.
#include "core/compare/scenario_comparison.h"

#include <cmath>
#include <gtest/gtest.h>

#include "core/store/model_source.h"
#include "tests/support/small_models.h"
#include "tests/support/test_support.h"

namespace tl {
namespace {

namespace fs = std::filesystem;
using testing::makeCompartment;

// Algae B 10, P/B 100; Grazer B 5, P/B 2, Q/B 10, EE unknown; 1 landed by Nets.
Scenario pond(const std::string& name)
{
    Scenario s;
    s.name = name;
    s.model = testing::threeBoxPond(1.0);
    Compartment& algae = s.model.compartment(0);
    algae.value(Param::Biomass) = 10.0;
    algae.value(Param::PB) = 100.0;
    Compartment& grazer = s.model.compartment(1);
    grazer.value(Param::Biomass) = 5.0;
    grazer.value(Param::PB) = 2.0;
    grazer.value(Param::QB) = 10.0;
    grazer.confidenceOf(Param::Biomass).source = "seine survey 2025 (invented)";
    return s;
}

const ComparedOutput& output(const ScenarioComparison& c, const std::string& subject, const std::string& quantity)
{
    for (const ComparedOutput& o : c.outputs)
        if (o.subject == subject && o.quantity == quantity) return o;
    ADD_FAILURE() << "no output " << subject << "." << quantity;
    static const ComparedOutput none;
    return none;
}

Project reservoir()
{
    ModelSource source = readModelSource(fs::path(TL_SAMPLES_DIR) / "reservoir.tledger");
    if (!source.project) {
        ADD_FAILURE() << "reservoir.tledger does not open";
        return {};
    }
    return std::move(*source.project);
}

TEST(ScenarioComparison, DuplicateShowsNoDifference)
{
    const Scenario a = pond("baseline");
    Scenario b = a;
    b.name = "baseline copy";
    const ScenarioComparison c = compareScenarios({&a, &b});
    EXPECT_TRUE(c.inputs.empty());
    EXPECT_EQ(c.differingOutputs(), 0u);
    ASSERT_FALSE(c.outputs.empty());
    for (const ComparedOutput& o : c.outputs) {
        ASSERT_EQ(o.differences.size(), 2u);
        EXPECT_FALSE(o.differences[1].differs) << o.key();
    }
}

TEST(ScenarioComparison, DuplicateOfEverySampleScenarioShowsNoDifference)
{
    const Project project = reservoir();
    for (const Scenario& s : project.scenarios) {
        SCOPED_TRACE(s.name);
        Scenario copy = s;
        copy.name += " copy";
        const ScenarioComparison c = compareScenarios({&s, &copy});
        EXPECT_TRUE(c.inputs.empty());
        EXPECT_EQ(c.differingOutputs(), 0u);
        EXPECT_GT(c.outputs.size(), 100u);
    }
}

// Grazer B 5 -> 6 (hand-worked): P 10 -> 12, EE (0 + 1)/P 0.1 -> 1/12, Algae's EE
// Q 0.7 / P_algae = 50*0.7/1000 = 0.035 -> 60*0.7/1000 = 0.042.
TEST(ScenarioComparison, OneChangedInputAppearsOnceAndMovesWhatDependsOnIt)
{
    const Scenario a = pond("baseline");
    Scenario b = pond("bigger grazer");
    b.model.compartment(1).value(Param::Biomass) = 6.0;
    const ScenarioComparison c = compareScenarios({&a, &b});
    ASSERT_EQ(c.inputs.size(), 1u);
    const InputDifference& d = c.inputs.front();
    EXPECT_EQ(d.compartment, "Grazer");
    EXPECT_EQ(d.item, "biomass");
    EXPECT_TRUE(d.valueDiffers);
    EXPECT_FALSE(d.sourceDiffers);
    EXPECT_EQ(d.values, (std::vector<std::optional<double>>{5.0, 6.0}));
    EXPECT_EQ(d.sources[0], "seine survey 2025 (invented)");

    const ComparedOutput& bio = output(c, "Grazer", "biomass");
    EXPECT_DOUBLE_EQ(bio.differences[1].absolute, 1.0);
    EXPECT_DOUBLE_EQ(bio.differences[1].percent, 20.0);
    const ComparedOutput& p = output(c, "Grazer", "production");
    EXPECT_DOUBLE_EQ(p.values[0], 10.0);
    EXPECT_DOUBLE_EQ(p.values[1], 12.0);
    const ComparedOutput& ee = output(c, "Grazer", "ee");
    EXPECT_NEAR(ee.values[0], 0.1, 1e-12);
    EXPECT_NEAR(ee.values[1], 1.0 / 12.0, 1e-12);
    EXPECT_NEAR(ee.differences[1].percent, 100.0 * (1.0 / 12.0 - 0.1) / 0.1, 1e-9);
    const ComparedOutput& algaeEe = output(c, "Algae", "ee");
    EXPECT_NEAR(algaeEe.values[0], 0.035, 1e-12);
    EXPECT_NEAR(algaeEe.values[1], 0.042, 1e-12);
    EXPECT_TRUE(algaeEe.differs());
    // What does not depend on the grazer's biomass stays put.
    EXPECT_FALSE(output(c, "Algae", "production").differs());
    EXPECT_FALSE(output(c, "Grazer", "tl").differs());
    EXPECT_FALSE(output(c, "Grazer", "catch").differs());
    EXPECT_TRUE(output(c, "", "tst").differs());
}

TEST(ScenarioComparison, SourceNoteOrConfidenceAloneIsAnInputDifference)
{
    const Scenario a = pond("baseline");
    Scenario b = pond("re-sourced");
    b.model.compartment(1).confidenceOf(Param::Biomass).source = "trawl survey 2026 (invented)";
    b.model.compartment(1).confidenceOf(Param::PB).grade = Confidence::Grade::B;
    const ScenarioComparison c = compareScenarios({&a, &b});
    ASSERT_EQ(c.inputs.size(), 2u);
    EXPECT_EQ(c.inputs[0].item, "biomass");
    EXPECT_TRUE(c.inputs[0].sourceDiffers);
    EXPECT_FALSE(c.inputs[0].valueDiffers);
    EXPECT_EQ(c.inputs[1].item, "pb");
    EXPECT_TRUE(c.inputs[1].confidenceDiffers);
    EXPECT_EQ(c.inputs[1].confidence[1], "B");
    EXPECT_EQ(c.differingOutputs(), 0u);
}

TEST(ScenarioComparison, DietHarvestAndAbsentCompartments)
{
    const Scenario a = pond("baseline");
    Scenario b = pond("changed");
    b.model.setDiet(1, 0, 0.6);
    b.model.setDietImport(1, 0.1);
    b.model.fleet(0).landings[1] = 2.0;
    Compartment snail = makeCompartment("Snail", CompartmentKind::Consumer, 1.0, 3.0, 12.0);
    const std::size_t at = b.model.addCompartment(snail);
    b.model.setDiet(at, 2, 1.0);
    const ScenarioComparison c = compareScenarios({&a, &b});
    std::vector<std::string> items;
    for (const InputDifference& d : c.inputs) items.push_back(d.compartment + "|" + d.item);
    EXPECT_EQ(items, (std::vector<std::string>{"Grazer|diet:Algae", "Grazer|diet:import", "Grazer|landings:Nets",
                                               "Snail|compartment"}));
    EXPECT_EQ(c.inputs.back().shown, (std::vector<std::string>{"absent", "consumer"}));
    const ComparedOutput& snailB = output(c, "Snail", "biomass");
    EXPECT_TRUE(std::isnan(snailB.values[0]));
    EXPECT_DOUBLE_EQ(snailB.values[1], 1.0);
    EXPECT_TRUE(snailB.differs());
    EXPECT_DOUBLE_EQ(output(c, "Grazer", "catch").differences[1].absolute, 1.0);
    EXPECT_DOUBLE_EQ(output(c, "", "total_catch").differences[1].percent, 100.0);
}

// The sample reservoir's scenarios (invented; sample_projects/README.md): doubled
// gill-net catch and an invading mussel.
TEST(ScenarioComparison, SampleScenariosAgainstTheBaseline)
{
    const Project project = reservoir();
    std::string error;
    const auto picked = pickScenarios(project, {"baseline", "doubled net effort", "invasive mussel"}, error);
    ASSERT_EQ(picked.size(), 3u) << error;
    const ScenarioComparison c = compareScenarios(picked);
    // Every gill-net landing differs in the second scenario only, by a factor 2.
    std::size_t gillnetRows = 0;
    for (const InputDifference& d : c.inputs) {
        if (d.item.rfind("landings:Commercial gillnets", 0) != 0) continue;
        ++gillnetRows;
        ASSERT_TRUE(d.values[0] && d.values[1] && d.values[2]);
        EXPECT_DOUBLE_EQ(*d.values[1], 2.0 * *d.values[0]) << d.compartment;
        EXPECT_DOUBLE_EQ(*d.values[2], *d.values[0]) << d.compartment;
    }
    EXPECT_EQ(gillnetRows, 5u);
    // Total catch: the doubled scenario adds exactly the baseline's gill-net catch
    // (landings + discards, none surviving), summed here from the inputs.
    const Model& base = project.findScenario("baseline")->model;
    const auto gill = base.fleetIndexOf("Commercial gillnets");
    ASSERT_TRUE(gill);
    double gillCatch = 0.0;
    for (std::size_t i = 0; i < base.size(); ++i)
        gillCatch += base.fleet(*gill).landings[i] + base.fleet(*gill).discards[i] *
                                                         (1.0 - (i < base.fleet(*gill).discardSurvival.size() ? base.fleet(*gill).discardSurvival[i] : 0.0));
    EXPECT_NEAR(output(c, "", "total_catch").differences[1].absolute, gillCatch, 1e-9);
    std::size_t mussel = 0;
    for (const InputDifference& d : c.inputs)
        if (d.item == "compartment") {
            ++mussel;
            EXPECT_EQ(d.shown[0], "absent");
            EXPECT_EQ(d.shown[1], "absent");
            EXPECT_EQ(d.shown[2], "consumer");
        }
    EXPECT_EQ(mussel, 1u);
    // The largest relative changes of the doubled scenario are all differences, sorted.
    const auto top = largestRelativeChanges(c, 1, 10);
    ASSERT_FALSE(top.empty());
    for (std::size_t k = 1; k < top.size(); ++k)
        EXPECT_GE(std::abs(top[k - 1]->differences[1].percent), std::abs(top[k]->differences[1].percent));
}

TEST(ScenarioComparison, PickScenariosNamesWhatIsWrong)
{
    const Project project = reservoir();
    std::string error;
    EXPECT_TRUE(pickScenarios(project, {"baseline", "no such"}, error).empty());
    EXPECT_NE(error.find("no scenario named 'no such'"), std::string::npos) << error;
    EXPECT_NE(error.find("'doubled net effort'"), std::string::npos) << error;
    EXPECT_TRUE(pickScenarios(project, {"baseline", "Baseline"}, error).empty());
    EXPECT_NE(error.find("named twice"), std::string::npos) << error;
    EXPECT_TRUE(pickScenarios(project, {"baseline"}, error).empty());
    EXPECT_NE(error.find("at least two"), std::string::npos) << error;
    EXPECT_EQ(pickScenarios(project, {" Invasive Mussel", "baseline"}, error).size(), 2u) << error;
    EXPECT_EQ(splitScenarioList(" a, b ,,c "), (std::vector<std::string>{"a", "b", "c"}));
}

// Paired draws, worked by hand: differences +1, +2, -1, +0.5 and a failed draw (NaN).
TEST(ScenarioComparison, SameSignShareOfPairedDraws)
{
    const std::vector<double> ref{1.0, 2.0, 3.0, 4.0, 5.0};
    const std::vector<double> other{2.0, 4.0, 2.0, 4.5, std::nan("")};
    EXPECT_DOUBLE_EQ(sameSignShare(ref, other, 1.5), 0.75);
    EXPECT_DOUBLE_EQ(sameSignShare(ref, other, -0.2), 0.25);
    EXPECT_TRUE(std::isnan(sameSignShare(ref, other, 0.0)));
    EXPECT_TRUE(std::isnan(sameSignShare({}, {}, 1.0)));
}

TEST(ScenarioComparison, EnsembleAgreementThroughTheLookup)
{
    const Scenario a = pond("baseline");
    Scenario b = pond("bigger grazer");
    b.model.compartment(1).value(Param::Biomass) = 6.0;
    ScenarioComparison c = compareScenarios({&a, &b});
    const auto lookup = [](std::string_view scenario, std::string_view key) -> std::optional<std::vector<double>> {
        if (key != "Grazer.biomass") return std::nullopt;
        if (scenario == "baseline") return std::vector<double>{5.0, 4.0, 6.0, 5.5};
        return std::vector<double>{6.0, 3.5, 7.0, 6.0};  // differences +1, -0.5, +1, +0.5
    };
    EXPECT_EQ(attachEnsembleAgreement(c, lookup), 1u);
    const ComparedOutput& bio = output(c, "Grazer", "biomass");
    ASSERT_TRUE(bio.differences[1].sameSignShare);
    EXPECT_DOUBLE_EQ(*bio.differences[1].sameSignShare, 0.75);
    EXPECT_FALSE(output(c, "Grazer", "ee").differences[1].sameSignShare);
}

}  // namespace
}  // namespace tl
