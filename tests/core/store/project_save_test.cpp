// The one safe save (core/store/project_save.h): a new file appears whole under its
// name, an existing project is replaced in one transaction while a second reader keeps
// seeing the old state, and anything that is not a project is never written over.
// (The kill test of the same save path is tests/core/store/crash_safety_test.cpp.)
#include <gtest/gtest.h>

#include <sqlite3.h>

#include "core/store/project_file.h"
#include "core/store/project_save.h"
#include "tests/core/store/store_test_support.h"

namespace tl::testing {
namespace {

Project loadAll(const fs::path& path)
{
    auto opened = ProjectFile::open(path, OpenMode::ReadOnly);
    EXPECT_TRUE(opened.file);
    if (!opened.file) return {};
    auto loaded = opened.file->load();
    EXPECT_TRUE(loaded.value);
    return loaded.value.value_or(Project{});
}

TEST(ProjectSave, NewPathIsCreatedWhole)
{
    TempDir dir;
    const auto path = dir / "new.tledger";
    const Problems problems = saveProjectToPath(inventedProject(), path);
    ASSERT_TRUE(problems.empty()) << problems[0].describe();
    EXPECT_TRUE(sameContent(loadAll(path), inventedProject()));
    // Nothing temporary is left beside it.
    std::size_t entries = 0;
    for ([[maybe_unused]] const auto& e : fs::directory_iterator(dir.path())) ++entries;
    EXPECT_EQ(entries, 1u);
}

TEST(ProjectSave, ExistingProjectIsReplacedWhileAReaderKeepsItsSnapshot)
{
    TempDir dir;
    const auto path = dir / "shared.tledger";
    ASSERT_TRUE(saveProjectToPath(inventedProject("first"), path).empty());

    // A second program reading the file: its read transaction started before the save.
    sqlite3* reader = nullptr;
    ASSERT_EQ(sqlite3_open_v2(path.c_str(), &reader, SQLITE_OPEN_READONLY, nullptr), SQLITE_OK);
    ASSERT_EQ(sqlite3_exec(reader, "BEGIN; SELECT count(*) FROM scenario;", nullptr, nullptr, nullptr), SQLITE_OK);

    Project second = inventedProject("second");
    second.scenarios.pop_back();  // one scenario fewer
    const Problems problems = saveProjectToPath(second, path);
    ASSERT_TRUE(problems.empty()) << problems[0].describe();

    auto scenarioCount = [&] {
        sqlite3_stmt* st = nullptr;
        sqlite3_prepare_v2(reader, "SELECT count(*) FROM scenario", -1, &st, nullptr);
        sqlite3_step(st);
        const int n = sqlite3_column_int(st, 0);
        sqlite3_finalize(st);
        return n;
    };
    EXPECT_EQ(scenarioCount(), 2) << "the reader's snapshot changed under it";
    ASSERT_EQ(sqlite3_exec(reader, "COMMIT;", nullptr, nullptr, nullptr), SQLITE_OK);
    EXPECT_EQ(scenarioCount(), 1) << "a new read sees the saved state";
    sqlite3_close(reader);

    EXPECT_TRUE(sameContent(loadAll(path), second));
}

TEST(ProjectSave, SavingTwiceToTheSameFileKeepsTheLatest)
{
    TempDir dir;
    const auto path = dir / "twice.tledger";
    Project p = inventedProject();
    ASSERT_TRUE(saveProjectToPath(p, path).empty());
    p.scenarios[0].model.compartment(0).value(Param::Biomass) = 0.95;
    p.info.notes = "changed";
    ASSERT_TRUE(saveProjectToPath(p, path).empty());
    EXPECT_TRUE(sameContent(loadAll(path), p));
}

TEST(ProjectSave, AFileThatIsNotAProjectIsNeverWrittenOver)
{
    TempDir dir;
    const auto path = dir / "thesis.tledger";
    writeText(path, "three years of field notes\n");
    const Problems problems = saveProjectToPath(inventedProject(), path);
    ASSERT_FALSE(problems.empty());
    EXPECT_EQ(problems[0].code, "store-not-project");
    EXPECT_NE(problems[0].describe().find(path.string()), std::string::npos);
    EXPECT_EQ(slurp(path), "three years of field notes\n");
}

}  // namespace
}  // namespace tl::testing
