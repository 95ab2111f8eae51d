// Tests of core/store/project_file: create, load, save, scenario operations, stored
// runs, hostile names, and the refusal of files that are not (or no longer) projects.
#include "core/store/project_file.h"

#include <gtest/gtest.h>
#include <sqlite3.h>

#include <algorithm>

#include "core/store/schema.h"
#include "tests/core/store/store_test_support.h"
#include "tests/support/raw_sqlite.h"

namespace tl {
namespace {

using testing::fileBytes;
using testing::inventedModel;
using testing::inventedProject;
using testing::sameContent;
using testing::TempDir;
using testing::writeBytes;

bool hasCode(const Problems& problems, const std::string& code)
{
    return std::any_of(problems.begin(), problems.end(), [&](const Problem& p) { return p.code == code; });
}

bool namesFile(const Problems& problems, const std::filesystem::path& file)
{
    return !problems.empty() && std::all_of(problems.begin(), problems.end(), [&](const Problem& p) {
        return p.location && p.location->file == file.string() && p.describe().find(file.string()) == 0;
    });
}

std::string allMessages(const Problems& problems)
{
    std::string text;
    for (const Problem& p : problems) text += p.describe() + "\n";
    return text;
}

std::int64_t rawInt(const std::filesystem::path& file, const std::string& sql)
{
    sqlite3* db = nullptr;
    sqlite3_open_v2(file.c_str(), &db, SQLITE_OPEN_READONLY, nullptr);
    sqlite3_stmt* st = nullptr;
    sqlite3_prepare_v2(db, sql.c_str(), -1, &st, nullptr);
    std::int64_t v = -1;
    if (sqlite3_step(st) == SQLITE_ROW) v = sqlite3_column_int64(st, 0);
    sqlite3_finalize(st);
    sqlite3_close(db);
    return v;
}

TEST(ProjectFile, CreateThenLoadGivesBackEveryTable)
{
    TempDir dir;
    const auto path = dir / "lake.tledger";
    const Project original = inventedProject();
    {
        auto created = ProjectFile::create(path, original);
        ASSERT_TRUE(created.file) << allMessages(created.problems);
        EXPECT_FALSE(created.readOnly);
        EXPECT_EQ(created.file->schemaVersion(), store::kSchemaVersion);
    }
    auto opened = ProjectFile::open(path);
    ASSERT_TRUE(opened.file) << allMessages(opened.problems);
    auto loaded = opened.file->load();
    ASSERT_TRUE(loaded.value) << allMessages(loaded.problems);
    EXPECT_TRUE(sameContent(original, *loaded.value));
    // Spot checks that would catch a table silently left out of sameContent's model ==.
    const Scenario* base = loaded.value->findScenario("baseline");
    ASSERT_NE(base, nullptr);
    const Model& m = base->model;
    EXPECT_EQ(m.compartment(1).confidenceOf(Param::PB).cv, 0.35);
    EXPECT_EQ(m.compartment(1).confidenceOf(Param::PB).source, "catch curve, \"rough\"");
    EXPECT_EQ(m.dietImport(0), 0.2);
    EXPECT_EQ(m.routing(1, 5), 0.4);
    EXPECT_EQ(m.fleet(0).discardPool, std::optional<std::size_t>(5));
    EXPECT_EQ(m.fleet(0).discardSurvival[1], 0.5);
    EXPECT_FALSE(m.compartment(2).value(Param::Biomass).has_value());
    EXPECT_EQ(base->layout.at("pike"), (LayoutPosition{120.5, -3.25}));
    EXPECT_EQ(loaded.value->info.rules.eeMax, 0.99);
    EXPECT_EQ(loaded.value->info.units.area, "km²");
    EXPECT_FALSE(loaded.value->info.created.empty());
    EXPECT_EQ(loaded.value->scenarioNames(), (std::vector<std::string>{"baseline", "more nets"}));
}

TEST(ProjectFile, FileCarriesApplicationIdVersionAndWal)
{
    TempDir dir;
    const auto path = dir / "ids.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    EXPECT_EQ(rawInt(path, "PRAGMA application_id"), store::kApplicationId);
    EXPECT_EQ(rawInt(path, "PRAGMA user_version"), store::kSchemaVersion);
    const std::string bytes = fileBytes(path);
    ASSERT_GE(bytes.size(), 100u);
    EXPECT_EQ(bytes[18], 2) << "WAL journal mode is recorded in the header (SQLite file format, bytes 18-19)";
    EXPECT_EQ(rawInt(path, "PRAGMA foreign_key_check"), -1) << "no foreign-key violations";
}

TEST(ProjectFile, CreateRefusesAnExistingPathAndLeavesItUnchanged)
{
    TempDir dir;
    const auto path = dir / "taken.tledger";
    writeBytes(path, "someone's notes");
    auto created = ProjectFile::create(path, inventedProject());
    EXPECT_FALSE(created.file);
    EXPECT_TRUE(hasCode(created.problems, "store-exists"));
    EXPECT_TRUE(namesFile(created.problems, path));
    EXPECT_EQ(fileBytes(path), "someone's notes");
}

TEST(ProjectFile, SaveScenarioReplacesOnlyThatScenario)
{
    TempDir dir;
    const auto path = dir / "p.tledger";
    auto file = ProjectFile::create(path, inventedProject()).file;
    ASSERT_TRUE(file);
    auto scenario = file->loadScenario("more nets");
    ASSERT_TRUE(scenario.value);
    scenario.value->model.compartment(0).value(Param::Biomass) = 1.75;
    scenario.value->model.removeCompartment(2);
    scenario.value->description = "edited";
    ASSERT_TRUE(file->saveScenario(*scenario.value).empty());
    auto reloaded = file->load();
    ASSERT_TRUE(reloaded.value);
    EXPECT_EQ(reloaded.value->findScenario("more nets")->model, scenario.value->model);
    EXPECT_EQ(reloaded.value->findScenario("more nets")->description, "edited");
    EXPECT_EQ(reloaded.value->findScenario("baseline")->model, inventedProject().scenarios[0].model);
    EXPECT_EQ(reloaded.value->scenarioNames(), (std::vector<std::string>{"baseline", "more nets"}));
}

TEST(ProjectFile, SaveOfTheWholeProjectDropsScenariosNoLongerThere)
{
    TempDir dir;
    const auto path = dir / "p.tledger";
    auto file = ProjectFile::create(path, inventedProject()).file;
    ASSERT_TRUE(file);
    Project p = *file->load().value;
    std::swap(p.scenarios[0], p.scenarios[1]);
    p.scenarios.pop_back();  // drops "baseline"
    p.info.title = "renamed project";
    ASSERT_TRUE(file->save(p).empty());
    const Project back = *file->load().value;
    EXPECT_EQ(back.scenarioNames(), (std::vector<std::string>{"more nets"}));
    EXPECT_EQ(back.info.title, "renamed project");
    EXPECT_EQ(rawInt(path, "SELECT count(*) FROM compartment"), 6) << "no orphan rows of the dropped scenario";
}

TEST(ProjectFile, RefusedSaveChangesNothing)
{
    TempDir dir;
    const auto path = dir / "p.tledger";
    auto file = ProjectFile::create(path, inventedProject()).file;
    ASSERT_TRUE(file);
    const Project before = *file->load().value;
    Project bad = before;
    bad.scenarios[0].model.setDiet(0, 1, 1.5);  // a fraction above 1
    bad.info.title = "must not be written";
    const Problems problems = file->save(bad);
    ASSERT_TRUE(hasCode(problems, "store-invalid-fraction")) << allMessages(problems);
    EXPECT_EQ(problems[0].compartment, "pike");
    EXPECT_EQ(problems[0].prey, "roach");
    EXPECT_TRUE(namesFile(problems, path));
    EXPECT_TRUE(sameContent(before, *file->load().value));

    Project twice = before;
    twice.scenarios[1].name = "baseline";
    EXPECT_TRUE(hasCode(file->save(twice), "store-duplicate-name"));
    EXPECT_TRUE(sameContent(before, *file->load().value));
}

TEST(ProjectFile, SchemaConstraintsHoldEvenAgainstDirectSql)
{
    // The CHECK constraints guard the file against other writers too (fractions in [0,1]).
    TempDir dir;
    const auto path = dir / "p.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
    EXPECT_NE(sqlite3_exec(db, "UPDATE diet SET fraction = 1.5", nullptr, nullptr, nullptr), SQLITE_OK);
    EXPECT_NE(sqlite3_exec(db, "UPDATE routing SET fraction = -0.1", nullptr, nullptr, nullptr), SQLITE_OK);
    EXPECT_NE(sqlite3_exec(db, "INSERT INTO scenario (name, position, created) VALUES ('baseline', 9, 'x')", nullptr,
                           nullptr, nullptr),
              SQLITE_OK);
    sqlite3_close(db);
}

TEST(ProjectFile, TriggersPlantedInAFileDoNotRun)
{
    // A project file from elsewhere may carry SQL of its own; the store runs none of it
    // (triggers disabled, trusted_schema off, defensive mode).
    TempDir dir;
    const auto path = dir / "planted.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    tl::testing::rawExec(path, "CREATE TRIGGER wipe AFTER INSERT ON compartment BEGIN DELETE FROM diet; "
                  "UPDATE project_info SET title = 'owned'; END;");
    auto file = ProjectFile::open(path).file;
    ASSERT_TRUE(file);
    Scenario s = *file->loadScenario("baseline").value;
    s.name = "new one";
    ASSERT_TRUE(file->createScenario(s).empty());
    auto back = file->load();
    ASSERT_TRUE(back.value);
    EXPECT_EQ(back.value->info.title, "invented test project");
    EXPECT_EQ(back.value->findScenario("new one")->model, s.model) << "its diet rows were kept";
}

TEST(ProjectFile, CreateScenarioRefusesTakenAndEmptyNames)
{
    TempDir dir;
    const auto path = dir / "ops.tledger";
    auto file = ProjectFile::create(path, inventedProject()).file;
    ASSERT_TRUE(file);
    Scenario s = inventedProject().scenarios[0];
    s.name = "  stocking  ";
    ASSERT_TRUE(file->createScenario(s).empty());
    auto added = file->loadScenario("stocking");
    ASSERT_TRUE(added.value);
    EXPECT_EQ(added.value->model, inventedProject().scenarios[0].model);
    EXPECT_TRUE(hasCode(file->createScenario(s), "store-duplicate-name"));
    s.name = "  ";
    EXPECT_TRUE(hasCode(file->createScenario(s), "store-invalid-name"));
    EXPECT_EQ(file->load().value->scenarioNames(), (std::vector<std::string>{"baseline", "more nets", "stocking"}));
}

TEST(ProjectFile, StoredRunsAreKeptAndGoWithTheirScenario)
{
    TempDir dir;
    const auto path = dir / "runs.tledger";
    auto file = ProjectFile::create(path, inventedProject()).file;
    ASSERT_TRUE(file);
    StoredRun run{0, "more nets", "ensemble", R"({"draws": 1000, "seed": 7})", R"({"balanced_share": 0.61})", ""};
    auto id = file->addRun(run);
    ASSERT_TRUE(id.value) << allMessages(id.problems);
    auto other = file->addRun(StoredRun{0, "", "reconcile", "{}", "{}", "2026-01-01T00:00:00Z"});
    ASSERT_TRUE(other.value);
    EXPECT_TRUE(hasCode(file->addRun(StoredRun{0, "ghost", "ensemble", "{}", "{}", ""}).problems, "store-unknown-scenario"));
    auto runs = file->listRuns();
    ASSERT_TRUE(runs.value);
    ASSERT_EQ(runs.value->size(), 2u);
    EXPECT_EQ((*runs.value)[0].id, *id.value);
    EXPECT_EQ((*runs.value)[0].settingsJson, run.settingsJson);
    EXPECT_EQ((*runs.value)[0].summaryJson, run.summaryJson);
    EXPECT_EQ((*runs.value)[0].scenario, "more nets");
    EXPECT_EQ((*runs.value)[1].created, "2026-01-01T00:00:00Z");

    // A project written anew (create) keeps the runs it was loaded with.
    {
        const auto copyPath = dir / "copy.tledger";
        auto copy = ProjectFile::create(copyPath, *file->load().value);
        ASSERT_TRUE(copy.file);
        EXPECT_EQ(*copy.file->listRuns().value, *file->listRuns().value);
    }

    Project fewer = *file->load().value;
    fewer.scenarios.pop_back();  // "more nets": its stored runs go with it
    ASSERT_TRUE(file->save(fewer).empty());
    runs = file->listRuns();
    ASSERT_EQ(runs.value->size(), 1u);
    EXPECT_EQ((*runs.value)[0].kind, "reconcile");
    ASSERT_TRUE(file->deleteRun((*runs.value)[0].id).empty());
    EXPECT_TRUE(file->listRuns().value->empty());
    EXPECT_TRUE(hasCode(file->deleteRun(12345), "store-unknown-run"));
}

// A scenario renamed in memory (its runs renamed with it, as the workbench's shelf does)
// keeps its stored runs through a save; a run not yet in the file (id 0) offered by two
// saves is stored once (the workbench keeps it with id 0 until the project is reopened).
TEST(ProjectFile, RunsFollowARenamedScenarioAndAreNotStoredTwice)
{
    TempDir dir;
    const auto path = dir / "rename.tledger";
    auto file = ProjectFile::create(path, inventedProject()).file;
    ASSERT_TRUE(file);
    ASSERT_TRUE(file->addRun(StoredRun{0, "more nets", "ensemble", "{}", R"({"draws": 5})", "2026-02-01T00:00:00Z"}).value);
    Project renamed = *file->load().value;
    ASSERT_EQ(renamed.runs.size(), 1u);
    renamed.findScenario("more nets")->name = "twice the nets";
    renamed.runs[0].scenario = "twice the nets";
    renamed.runs.push_back(StoredRun{0, "twice the nets", "reconcile", "{}", R"({"changes": []})", "2026-02-02T00:00:00Z"});
    ASSERT_TRUE(file->save(renamed).empty());
    ASSERT_TRUE(file->save(renamed).empty());  // the id-0 run again
    const auto runs = file->listRuns();
    ASSERT_TRUE(runs.value);
    ASSERT_EQ(runs.value->size(), 2u);
    EXPECT_EQ((*runs.value)[0].scenario, "twice the nets");
    EXPECT_EQ((*runs.value)[0].summaryJson, R"({"draws": 5})");
    EXPECT_EQ((*runs.value)[1].kind, "reconcile");
    EXPECT_EQ((*runs.value)[1].scenario, "twice the nets");
    EXPECT_EQ(file->load().value->scenarioNames(), (std::vector<std::string>{"baseline", "twice the nets"}));
}

// Names chosen to break naive SQL, CSV and JSON handling.
TEST(ProjectFile, HostileNamesAreStoredAsJustNames)
{
    const std::vector<std::string> names = {
        "'); DROP TABLE compartment; --",
        "\"quoted\", with, commas",
        "perch 🐟 juvenile",
        std::string(200, 'x') + "",
        "Robert'); DELETE FROM scenario WHERE ('1'='1",
    };
    TempDir dir;
    const auto path = dir / "names.tledger";
    Project p = inventedProject();
    for (std::size_t i = 0; i < names.size(); ++i) p.scenarios[0].model.compartment(i).name = names[i];
    p.scenarios[0].layout.clear();
    p.scenarios[0].layout[names[0]] = LayoutPosition{1, 2};
    p.scenarios[1].name = "🐟 '); DROP TABLE scenario; -- " + std::string(150, 'y');
    p.scenarios[1].model.fleet(0).name = names[1];
    auto file = ProjectFile::create(path, p).file;
    ASSERT_TRUE(file);
    Scenario copy = p.scenarios[1];
    copy.name = names[3];
    copy.parent = p.scenarios[1].name;
    ASSERT_TRUE(file->createScenario(copy).empty());
    auto back = file->load();
    ASSERT_TRUE(back.value) << allMessages(back.problems);
    EXPECT_TRUE(sameContent(p, Project{back.value->info, {back.value->scenarios[0], back.value->scenarios[1]}, {}}));
    for (std::size_t i = 0; i < names.size(); ++i) EXPECT_EQ(back.value->scenarios[0].model.compartment(i).name, names[i]);
    EXPECT_EQ(back.value->scenarios[1].model.fleet(0).name, names[1]);
    EXPECT_EQ(back.value->scenarios[2].name, names[3]);
    EXPECT_EQ(back.value->scenarios[2].parent, p.scenarios[1].name);
    EXPECT_EQ(rawInt(path, "SELECT count(*) FROM sqlite_schema WHERE name IN ('compartment', 'scenario')"), 2);
}

// --- files that are not projects, or are damaged: refused, named, left unchanged ---

struct RefusalCase {
    const char* label;
    std::string code;
};

void expectRefusedUnchanged(const std::filesystem::path& path, const std::string& code, const char* label)
{
    const std::string before = fileBytes(path);
    for (OpenMode mode : {OpenMode::ReadWrite, OpenMode::ReadOnly}) {
        auto opened = ProjectFile::open(path, mode);
        EXPECT_FALSE(opened.file) << label;
        EXPECT_TRUE(hasCode(opened.problems, code)) << label << ": " << allMessages(opened.problems);
        EXPECT_TRUE(namesFile(opened.problems, path)) << label << ": " << allMessages(opened.problems);
    }
    EXPECT_EQ(fileBytes(path), before) << label << ": the file must be left byte for byte unchanged";
    std::filesystem::path wal = path;
    wal += "-wal";
    EXPECT_FALSE(std::filesystem::exists(wal)) << label;
}

TEST(ProjectFileRefusal, MissingFile)
{
    TempDir dir;
    auto opened = ProjectFile::open(dir / "absent.tledger");
    EXPECT_FALSE(opened.file);
    EXPECT_TRUE(hasCode(opened.problems, "store-not-found"));
    EXPECT_FALSE(std::filesystem::exists(dir / "absent.tledger")) << "opening must not create a file";
}

TEST(ProjectFileRefusal, EmptyFileAndPlainText)
{
    TempDir dir;
    writeBytes(dir / "empty.tledger", "");
    expectRefusedUnchanged(dir / "empty.tledger", "store-not-project", "empty");
    writeBytes(dir / "notes.tledger", "name,kind\npike,consumer\n");
    expectRefusedUnchanged(dir / "notes.tledger", "store-not-project", "csv text");
}

TEST(ProjectFileRefusal, RandomBytes)
{
    TempDir dir;
    std::mt19937 rng(20261202);
    std::string bytes(8192, '\0');
    for (char& c : bytes) c = static_cast<char>(rng() & 0xff);
    writeBytes(dir / "noise.tledger", bytes);
    expectRefusedUnchanged(dir / "noise.tledger", "store-not-project", "random bytes");
}

TEST(ProjectFileRefusal, AnotherProgramsSqliteDatabase)
{
    TempDir dir;
    const auto path = dir / "contacts.tledger";
    tl::testing::rawExec(path, "CREATE TABLE person(name TEXT, phone TEXT); INSERT INTO person VALUES ('Ann', '123');");
    expectRefusedUnchanged(path, "store-foreign-database", "foreign database without application id");
    EXPECT_NE(allMessages(ProjectFile::open(path).problems).find("another program"), std::string::npos);

    const auto other = dir / "other.tledger";
    tl::testing::rawExec(other, "PRAGMA application_id = 1234567; CREATE TABLE t(x);");
    expectRefusedUnchanged(other, "store-foreign-database", "foreign database with its own application id");
    EXPECT_NE(allMessages(ProjectFile::open(other).problems).find("0x0012D687"), std::string::npos);
}

TEST(ProjectFileRefusal, TruncatedProject)
{
    TempDir dir;
    const auto good = dir / "good.tledger";
    ASSERT_TRUE(ProjectFile::create(good, inventedProject()).file);
    const std::string bytes = fileBytes(good);
    ASSERT_GT(bytes.size(), 4096u);
    for (std::size_t keep : {std::size_t{50}, std::size_t{100}, bytes.size() / 2, bytes.size() - 1}) {
        const auto cut = dir / ("cut" + std::to_string(keep) + ".tledger");
        writeBytes(cut, bytes.substr(0, keep));
        const std::string code = keep < 100 ? "store-damaged" : "store-damaged";
        expectRefusedUnchanged(cut, code, ("truncated to " + std::to_string(keep)).c_str());
    }
}

TEST(ProjectFileRefusal, OverwrittenPagesAreFoundDamaged)
{
    TempDir dir;
    const auto path = dir / "scribbled.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    std::string bytes = fileBytes(path);
    ASSERT_GT(bytes.size(), 3 * 4096u);
    std::mt19937 rng(7);
    for (std::size_t i = 4096; i < bytes.size(); ++i) bytes[i] = static_cast<char>(rng() & 0xff);  // all but page 1
    writeBytes(path, bytes);
    expectRefusedUnchanged(path, "store-damaged", "scribbled pages");
}

TEST(ProjectFileRefusal, NewerSchemaOpensReadOnlyAndStaysUnchanged)
{
    TempDir dir;
    const auto path = dir / "future.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    tl::testing::rawExec(path, "PRAGMA user_version = " + std::to_string(store::kSchemaVersion + 1) +
                      "; CREATE TABLE future_feature(x); PRAGMA wal_checkpoint(TRUNCATE);");
    const std::string before = fileBytes(path);
    {
        auto opened = ProjectFile::open(path, OpenMode::ReadWrite);
        ASSERT_TRUE(opened.file) << allMessages(opened.problems);
        EXPECT_TRUE(opened.readOnly);
        EXPECT_TRUE(opened.file->readOnly());
        EXPECT_NE(opened.readOnlyReason.find("newer version"), std::string::npos) << opened.readOnlyReason;
        EXPECT_TRUE(hasCode(opened.problems, "store-newer-version"));
        EXPECT_FALSE(hasErrors(opened.problems)) << "a warning, not an error: the content is still shown";
        auto loaded = opened.file->load();
        ASSERT_TRUE(loaded.value) << allMessages(loaded.problems);
        EXPECT_TRUE(sameContent(inventedProject(), *loaded.value));
        const Problems refused = opened.file->save(*loaded.value);
        EXPECT_TRUE(hasCode(refused, "store-read-only"));
        EXPECT_NE(allMessages(refused).find("newer version"), std::string::npos);
        EXPECT_TRUE(hasCode(opened.file->saveScenario(loaded.value->scenarios[0]), "store-read-only"));
        EXPECT_TRUE(hasCode(opened.file->addRun(StoredRun{0, "", "ensemble", "{}", "{}", ""}).problems, "store-read-only"));
    }
    EXPECT_EQ(fileBytes(path), before);
}

TEST(ProjectFile, ReadOnlyOnRequestRefusesWrites)
{
    TempDir dir;
    const auto path = dir / "ro.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    const std::string before = fileBytes(path);
    {
        auto opened = ProjectFile::open(path, OpenMode::ReadOnly);
        ASSERT_TRUE(opened.file);
        EXPECT_TRUE(opened.readOnly);
        EXPECT_TRUE(opened.problems.empty());
        EXPECT_TRUE(opened.file->load().value.has_value());
        EXPECT_TRUE(hasCode(opened.file->save(inventedProject()), "store-read-only"));
    }
    EXPECT_EQ(fileBytes(path), before);
    // Reading leaves nothing beside the project (no -wal / -shm files in the user's folder).
    EXPECT_EQ(std::distance(std::filesystem::directory_iterator(dir.path()), std::filesystem::directory_iterator{}), 1);
}

}  // namespace
}  // namespace tl
