// `tledger compare` as a user runs it (DESIGN.md 5.2, issue 16): a scenario against its
// duplicate, one changed input, the JSON keys of DEVELOPERS.md, bad scenario names.
// Projects are copies of the invented sample reservoir (sample_projects/) with a scenario
// added through the store.
#include <gtest/gtest.h>

#include <filesystem>
#include <string>

#include "core/store/project_file.h"
#include "core/store/project_save.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

const fs::path kReservoir = fs::path(TL_SAMPLES_DIR) / "reservoir.tledger";  // its scenarios do not balance
const fs::path kLagoon = fs::path(TL_SAMPLES_DIR) / "lagoon.tledger";        // both scenarios balance

// The sample project `sample` plus `extra`, a copy of its baseline changed by `change`.
fs::path projectWithCopy(const ScratchDir& dir, const fs::path& sample, const std::string& extra,
                         const std::function<void(Model&)>& change)
{
    auto opened = ProjectFile::open(sample, OpenMode::ReadOnly);
    Project project = *opened.file->load().value;
    Scenario copy = *project.findScenario("baseline");
    copy.name = extra;
    change(copy.model);
    project.scenarios.push_back(copy);
    const fs::path path = dir / sample.filename();
    const Problems problems = saveProjectToPath(project, path);
    if (hasErrors(problems)) ADD_FAILURE() << problems.front().describe();
    return path;
}

TEST(CompareCli, DuplicateShowsNoDifference)
{
    const ScratchDir dir("compare_cli");
    const fs::path project = projectWithCopy(dir, kLagoon, "baseline copy", [](Model&) {});
    const CliRun run = runTledger("compare " + shellQuoted(project.string()) + " --scenarios 'baseline,baseline copy' --json");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const nlohmann::json j = run.json();
    EXPECT_EQ(j.at("differing_inputs"), 0);
    EXPECT_EQ(j.at("differing_outputs"), 0);
    EXPECT_GT(j.at("compared_outputs").get<int>(), 100);
    for (const auto& o : j.at("outputs")) EXPECT_FALSE(o.at("differs").get<bool>()) << o.dump();

    const CliRun text = runTledger("compare " + shellQuoted(project.string()) + " --scenarios 'baseline,baseline copy'");
    EXPECT_EQ(text.exitCode, 0) << text.err;
    EXPECT_NE(text.out.find("Inputs that differ: 0"), std::string::npos) << text.out;
    EXPECT_NE(text.out.find("Outputs that differ: 0 of"), std::string::npos) << text.out;
}

// Zander adults' P/B raised by 10 %: one input row. Its production and its own EE move
// (EE = (predation + catch) / P); its biomass and consumption do not.
TEST(CompareCli, OneChangedInputAppearsOnceAndItsDependentOutputsChange)
{
    const ScratchDir dir("compare_cli");
    double before = 0.0;
    const fs::path project = projectWithCopy(dir, kReservoir, "faster zander", [&](Model& m) {
        Compartment& z = m.compartment(*m.indexOf("Zander adults"));
        before = *z.value(Param::PB);
        z.value(Param::PB) = before * 1.1;
    });
    const CliRun run = runTledger("compare " + shellQuoted(project.string()) + " --scenarios 'baseline,faster zander' --json");
    EXPECT_EQ(run.exitCode, 1) << "the reservoir's baseline does not balance: " << run.err;
    EXPECT_NE(run.err.find("'baseline' does not balance"), std::string::npos) << run.err;
    const nlohmann::json j = run.json();
    ASSERT_EQ(j.at("inputs").size(), 1u) << j.at("inputs").dump(1);
    const auto& input = j.at("inputs")[0];
    EXPECT_EQ(input.at("compartment"), "Zander adults");
    EXPECT_EQ(input.at("item"), "pb");
    EXPECT_DOUBLE_EQ(input.at("values")[0].get<double>(), before);
    EXPECT_DOUBLE_EQ(input.at("values")[1].get<double>(), before * 1.1);
    std::map<std::string, nlohmann::json> outputs;
    for (const auto& o : j.at("outputs")) outputs[o.at("subject").get<std::string>() + "." + o.at("quantity").get<std::string>()] = o;
    // P = B P/B: +10 % exactly; EE = (predation + catch) / P falls by 1 - 1/1.1.
    EXPECT_NEAR(outputs.at("Zander adults.production").at("differences")[0].at("percent").get<double>(), 10.0, 1e-9);
    EXPECT_NEAR(outputs.at("Zander adults.ee").at("differences")[0].at("percent").get<double>(), 100.0 * (1.0 / 1.1 - 1.0),
                1e-9);
    EXPECT_TRUE(outputs.at("Zander adults.flow_to_detritus").at("differs").get<bool>());
    EXPECT_FALSE(outputs.at("Zander adults.biomass").at("differs").get<bool>());
    EXPECT_FALSE(outputs.at("Zander adults.consumption").at("differs").get<bool>());
}

TEST(CompareCli, BadScenarioNamesExitTwoNamingThem)
{
    const std::string project = shellQuoted(kReservoir.string());
    CliRun run = runTledger("compare " + project + " --scenarios 'baseline,doubled net efort'");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("no scenario named 'doubled net efort'"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("'doubled net effort'"), std::string::npos) << run.err << " lists the names it has";
    EXPECT_TRUE(run.out.empty());
    run = runTledger("compare " + project + " --scenarios baseline");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("at least two"), std::string::npos) << run.err;
    run = runTledger("compare " + project);
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("usage"), std::string::npos) << run.err;
    run = runTledger("compare /no/such/file.tledger --scenarios a,b");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("/no/such/file.tledger"), std::string::npos) << run.err;
}

TEST(CompareCli, ThreeSampleScenarios)
{
    const CliRun run = runTledger("compare " + shellQuoted(kReservoir.string()) +
                                  " --scenarios 'baseline,doubled net effort,invasive mussel' --json");
    EXPECT_EQ(run.exitCode, 1) << run.err;
    const nlohmann::json j = run.json();
    ASSERT_EQ(j.at("scenarios").size(), 3u);
    for (const auto& o : j.at("outputs")) ASSERT_EQ(o.at("differences").size(), 2u);
    EXPECT_GT(j.at("differing_outputs").get<int>(), 0);
    EXPECT_NE(j.at("notice").get<std::string>().find("does not replace"), std::string::npos);
}

}  // namespace
}  // namespace tl::testing
