// Migration of project files from earlier schema versions (core/store/schema.h).
// tests/fixtures/store/v1_project.tledger is written by make_v1_fixture.py beside it
// (schema version 1 frozen in that script).
#include <gtest/gtest.h>
#include <sqlite3.h>

#include "core/store/project_file.h"
#include "core/store/schema.h"
#include "tests/core/store/store_test_support.h"

namespace tl {
namespace {

using testing::fileBytes;
using testing::TempDir;

const std::filesystem::path kV1Fixture = std::filesystem::path(TL_FIXTURES_DIR) / "store" / "v1_project.tledger";

std::filesystem::path copyOfFixture(const TempDir& dir)
{
    const auto copy = dir / "v1.tledger";
    std::filesystem::copy_file(kV1Fixture, copy);
    return copy;
}

// What make_v1_fixture.py wrote, checked field by field.
void expectFixtureContent(const Project& p)
{
    EXPECT_EQ(p.info.title, "pond written by schema 1");
    EXPECT_EQ(p.info.units.currency, "g C");
    EXPECT_EQ(p.info.units.area, "m²");
    EXPECT_EQ(p.info.created, "2026-11-01T08:00:00Z");
    // Schema 3's plausible ranges were not stored before: the defaults of that time.
    EXPECT_EQ(p.info.rules.plausible, PlausibleRanges{});
    EXPECT_EQ(p.scenarios[0].model.rules.plausible, PlausibleRanges{});
    // Nor was a diet row's confidence: none.
    for (const Scenario& s : p.scenarios)
        for (const Compartment& c : s.model.compartments()) EXPECT_EQ(c.dietConfidence, Confidence{}) << c.name;
    ASSERT_EQ(p.scenarios.size(), 2u);
    const Scenario& spring = p.scenarios[0];
    EXPECT_EQ(spring.name, "spring");
    EXPECT_EQ(p.scenarios[1].name, "spring, no fishing");
    EXPECT_EQ(p.scenarios[1].parent, "spring");
    const Model& m = spring.model;
    ASSERT_EQ(m.size(), 4u);
    EXPECT_EQ(m.compartment(0).name, "perch");
    EXPECT_EQ(m.compartment(2).kind, CompartmentKind::Producer);
    EXPECT_EQ(m.compartment(0).value(Param::Biomass), 2.5);
    EXPECT_EQ(m.compartment(0).confidenceOf(Param::Biomass).grade, Confidence::Grade::B);
    EXPECT_EQ(m.compartment(0).confidenceOf(Param::Biomass).source, "fyke nets");
    EXPECT_EQ(m.compartment(0).confidenceOf(Param::PB).cv, 0.3);
    EXPECT_FALSE(m.compartment(3).value(Param::Biomass).has_value());
    EXPECT_EQ(m.compartment(3).confidenceOf(Param::Biomass).grade, Confidence::Grade::D);
    EXPECT_EQ(m.dietImport(0), 0.1);
    EXPECT_EQ(m.diet(0, 1), 0.9);
    EXPECT_EQ(m.diet(1, 3), 0.3);
    EXPECT_EQ(m.routing(0, 3), 1.0);
    ASSERT_EQ(m.fleets().size(), 1u);
    EXPECT_EQ(m.fleet(0).name, "anglers");
    EXPECT_EQ(m.fleet(0).landings[0], 0.2);
    EXPECT_EQ(m.fleet(0).discards[0], 0.01);
    EXPECT_EQ(m.fleet(0).discardSurvival[0], 0.25);
    EXPECT_EQ(m.fleet(0).discardPool, std::optional<std::size_t>(3));
    EXPECT_TRUE(p.scenarios[1].model.fleets().empty());
    EXPECT_TRUE(spring.layout.empty());
    EXPECT_TRUE(p.runs.empty());
}

TEST(Migration, FixtureReallyIsVersionOne)
{
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open_v2(kV1Fixture.c_str(), &db, SQLITE_OPEN_READONLY, nullptr), SQLITE_OK);
    sqlite3_stmt* st = nullptr;
    sqlite3_prepare_v2(db, "SELECT (SELECT user_version FROM pragma_user_version),"
                           " (SELECT count(*) FROM sqlite_schema WHERE name IN ('layout_position', 'stored_run'))",
                       -1, &st, nullptr);
    ASSERT_EQ(sqlite3_step(st), SQLITE_ROW);
    EXPECT_EQ(sqlite3_column_int(st, 0), 1);
    EXPECT_EQ(sqlite3_column_int(st, 1), 0);
    sqlite3_finalize(st);
    sqlite3_close(db);
}

TEST(Migration, ReadWriteOpenMigratesToCurrentAndKeepsEverything)
{
    TempDir dir;
    const auto path = copyOfFixture(dir);
    {
        auto opened = ProjectFile::open(path);
        ASSERT_TRUE(opened.file) << (opened.problems.empty() ? "" : opened.problems[0].describe());
        EXPECT_FALSE(opened.readOnly);
        EXPECT_EQ(opened.file->schemaVersion(), store::kSchemaVersion);
        auto loaded = opened.file->load();
        ASSERT_TRUE(loaded.value) << (loaded.problems.empty() ? "" : loaded.problems[0].describe());
        expectFixtureContent(*loaded.value);

        // What version 2 added now works on the migrated file.
        Scenario spring = loaded.value->scenarios[0];
        spring.layout["perch"] = LayoutPosition{10, 20};
        ASSERT_TRUE(opened.file->saveScenario(spring).empty());
        ASSERT_TRUE(opened.file->addRun(StoredRun{0, "spring", "ensemble", "{}", "{}", ""}).value);
    }
    auto again = ProjectFile::open(path, OpenMode::ReadOnly);
    ASSERT_TRUE(again.file);
    EXPECT_EQ(again.file->schemaVersion(), store::kSchemaVersion);
    auto loaded = again.file->load();
    ASSERT_TRUE(loaded.value);
    EXPECT_EQ(loaded.value->scenarios[0].layout.at("perch"), (LayoutPosition{10, 20}));
    EXPECT_EQ(loaded.value->runs.size(), 1u);
}

TEST(Migration, PlausibleRangesAndDietConfidenceAreKeptFromSchemaThreeOn)
{
    TempDir dir;
    const auto path = copyOfFixture(dir);
    Project project;
    {
        auto opened = ProjectFile::open(path);
        ASSERT_TRUE(opened.file);
        auto loaded = opened.file->load();
        ASSERT_TRUE(loaded.value);
        project = *loaded.value;
        project.info.rules.plausible = PlausibleRanges{50.0, 300.0, 1e4};
        for (Scenario& s : project.scenarios) s.model.rules = project.info.rules;
        Model& spring = project.scenarios[0].model;
        spring.compartment(*spring.indexOf("perch")).dietConfidence = Confidence{Confidence::Grade::B, 0.35, "42 stomachs"};
        ASSERT_TRUE(opened.file->save(project).empty());
    }
    auto again = ProjectFile::open(path, OpenMode::ReadOnly);
    ASSERT_TRUE(again.file);
    auto loaded = again.file->load();
    ASSERT_TRUE(loaded.value);
    EXPECT_EQ(loaded.value->info.rules.plausible, (PlausibleRanges{50.0, 300.0, 1e4}));
    // Each scenario's checks use the project's ranges: perch's B of 2.5 is within 50.
    EXPECT_EQ(loaded.value->scenarios[0].model.rules.plausible, (PlausibleRanges{50.0, 300.0, 1e4}));
    const Model& spring = loaded.value->scenarios[0].model;
    EXPECT_EQ(spring.compartment(*spring.indexOf("perch")).dietConfidence,
              (Confidence{Confidence::Grade::B, 0.35, "42 stomachs"}));
    EXPECT_EQ(loaded.value->scenarios, project.scenarios);
}

TEST(Migration, ReadOnlyOpenReadsVersionOneWithoutChangingIt)
{
    TempDir dir;
    const auto path = copyOfFixture(dir);
    const std::string before = fileBytes(path);
    {
        auto opened = ProjectFile::open(path, OpenMode::ReadOnly);
        ASSERT_TRUE(opened.file);
        EXPECT_TRUE(opened.readOnly);
        EXPECT_EQ(opened.file->schemaVersion(), 1);
        auto loaded = opened.file->load();
        ASSERT_TRUE(loaded.value) << (loaded.problems.empty() ? "" : loaded.problems[0].describe());
        expectFixtureContent(*loaded.value);
    }
    EXPECT_EQ(fileBytes(path), before);
}

TEST(Migration, FailedMigrationLeavesTheFileAtItsVersion)
{
    // A v1 file that (against the rules) already holds a table named like a v2 one:
    // the migration step fails, and the file must stay version 1 with its content.
    TempDir dir;
    const auto path = copyOfFixture(dir);
    {
        sqlite3* db = nullptr;
        ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
        ASSERT_EQ(sqlite3_exec(db, "CREATE TABLE stored_run(x)", nullptr, nullptr, nullptr), SQLITE_OK);
        sqlite3_close(db);
    }
    const std::string before = fileBytes(path);
    auto opened = ProjectFile::open(path);
    EXPECT_FALSE(opened.file);
    ASSERT_FALSE(opened.problems.empty());
    EXPECT_EQ(opened.problems[0].code, "store-migration-failed");
    EXPECT_NE(opened.problems[0].describe().find(path.string()), std::string::npos);
    EXPECT_EQ(fileBytes(path), before);
    auto readOnly = ProjectFile::open(path, OpenMode::ReadOnly);
    ASSERT_TRUE(readOnly.file);
    EXPECT_EQ(readOnly.file->schemaVersion(), 1);
    ASSERT_TRUE(readOnly.file->load().value);
}

}  // namespace
}  // namespace tl
