// The one rule for a MODEL path (core/store/model_source.h), shared by every tledger
// command and the workbench's Open: a CSV folder is one scenario named after the
// folder or after --scenario; a .tledger keeps the named scenario only, and a name it
// lacks is an error listing the names it has.
#include <gtest/gtest.h>

#include "core/store/model_source.h"
#include "core/store/project_file.h"
#include "tests/core/store/store_test_support.h"

namespace tl::testing {
namespace {

const fs::path kPond = fs::path(TL_FIXTURES_DIR) / "csv_models" / "pond";

TEST(ModelSource, CsvFolderIsOneScenarioNamedAfterTheFolder)
{
    const ModelSource source = readModelSource(kPond);
    ASSERT_TRUE(source.project) << (source.problems.empty() ? "" : source.problems[0].describe());
    EXPECT_TRUE(source.csvFolder);
    ASSERT_EQ(source.project->scenarios.size(), 1u);
    EXPECT_EQ(source.project->scenarios[0].name, "pond");
    EXPECT_EQ(source.project->info.title, "pond");
    EXPECT_GT(source.project->scenarios[0].model.size(), 0u);
    // A trailing separator names the same folder.
    EXPECT_EQ(readModelSource(kPond.string() + "/").project->scenarios[0].name, "pond");
}

TEST(ModelSource, ScenarioOptionNamesTheScenarioOfACsvFolder)
{
    const ModelSource source = readModelSource(kPond, {std::string("  wet year "), OpenMode::ReadOnly});
    ASSERT_TRUE(source.project);
    EXPECT_EQ(source.project->scenarios[0].name, "wet year");
    // and readScenarioSource, which the CLI's solve, check and network use, agrees.
    const StoreResult<Scenario> one = readScenarioSource(kPond, std::string("wet year"));
    ASSERT_TRUE(one.value);
    EXPECT_EQ(one.value->name, "wet year");
    EXPECT_EQ(one.value->model, source.project->scenarios[0].model);
}

TEST(ModelSource, ProjectFileKeepsOnlyTheNamedScenario)
{
    TempDir dir;
    const auto path = dir / "two.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);

    const ModelSource all = readModelSource(path);
    ASSERT_TRUE(all.project);
    EXPECT_FALSE(all.csvFolder);
    EXPECT_EQ(all.project->scenarioNames(), (std::vector<std::string>{"baseline", "more nets"}));

    const ModelSource one = readModelSource(path, {std::string("more nets"), OpenMode::ReadOnly});
    ASSERT_TRUE(one.project);
    EXPECT_EQ(one.project->scenarioNames(), (std::vector<std::string>{"more nets"}));
    EXPECT_EQ(one.project->scenarios[0].model, inventedProject().scenarios[1].model);
}

TEST(ModelSource, UnknownScenarioListsTheNamesTheProjectHas)
{
    TempDir dir;
    const auto path = dir / "two.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    const ModelSource source = readModelSource(path, {std::string("dry year"), OpenMode::ReadOnly});
    EXPECT_FALSE(source.project);
    ASSERT_FALSE(source.problems.empty());
    const Problem& p = source.problems.back();
    EXPECT_EQ(p.code, "store-unknown-scenario");
    EXPECT_NE(p.describe().find(path.string()), std::string::npos);
    EXPECT_NE(p.message.find("'dry year'"), std::string::npos);
    EXPECT_NE(p.message.find("'baseline', 'more nets'"), std::string::npos);
}

TEST(ModelSource, SeveralScenariosAndNoNameIsAnErrorForOneScenario)
{
    TempDir dir;
    const auto path = dir / "two.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    const StoreResult<Scenario> one = readScenarioSource(path, std::nullopt);
    EXPECT_FALSE(one.value);
    ASSERT_EQ(one.problems.size(), 1u);
    EXPECT_EQ(one.problems[0].code, "store-scenario-needed");
    EXPECT_EQ(readScenarioSource(path, std::string("baseline")).value->name, "baseline");
}

TEST(ModelSource, MissingPathAndForeignFileAreNamedErrors)
{
    TempDir dir;
    const ModelSource missing = readModelSource(dir / "nothing here");
    EXPECT_FALSE(missing.project);
    ASSERT_EQ(missing.problems.size(), 1u);
    EXPECT_EQ(missing.problems[0].code, "store-not-found");
    EXPECT_NE(missing.problems[0].describe().find("nothing here"), std::string::npos);

    writeText(dir / "notes.txt", "not a project\n");
    const ModelSource foreign = readModelSource(dir / "notes.txt");
    EXPECT_FALSE(foreign.project);
    ASSERT_FALSE(foreign.problems.empty());
    EXPECT_EQ(foreign.problems[0].code, "store-not-project");
    EXPECT_EQ(slurp(dir / "notes.txt"), "not a project\n");  // left untouched
}

}  // namespace
}  // namespace tl::testing
