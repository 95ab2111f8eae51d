// Issue 12, defects 1, 2 and 8 and fault item 12: a project that cannot be written is
// read (read-only, saying so, with nothing written beside it) and never called damaged;
// a project of a newer schema says it opened read-only even when read-only was asked;
// a write that fails (an injected SQLITE_FULL, a full tmpfs) names the cause and keeps
// the previous file byte for byte.
//
// A test of permissions needs a user the permissions bind: as root (who may write
// anything) each such check runs in a child process that first becomes 'nobody'.
#include <fcntl.h>
#include <sched.h>
#include <sqlite3.h>
#include <sys/mount.h>
#include <unistd.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <functional>

#include "core/model/problem_codes.h"
#include "core/store/model_source.h"
#include "core/store/project_file.h"
#include "core/store/project_save.h"
#include "tests/core/store/store_test_support.h"

namespace tl::testing {
namespace {

namespace fs = std::filesystem;

const Problem* findCode(const Problems& problems, std::string_view code)
{
    const auto it = std::find_if(problems.begin(), problems.end(), [&](const Problem& p) { return p.code == code; });
    return it == problems.end() ? nullptr : &*it;
}

std::string describeAll(const Problems& problems)
{
    std::string text;
    for (const Problem& p : problems) text += p.describe() + (p.hint.empty() ? "" : " (" + p.hint + ")") + "\n";
    return text;
}

// A project made as the test's own user, then closed.
fs::path makeProject(const fs::path& folder)
{
    const fs::path file = folder / "shared.tledger";
    ProjectOpenResult created = ProjectFile::create(file, inventedProject());
    EXPECT_TRUE(created.file) << describeAll(created.problems);
    return file;
}

bool sidecars(const fs::path& file)
{
    return fs::exists(fs::path(file.string() + "-wal")) || fs::exists(fs::path(file.string() + "-shm"));
}

// What the unprivileged reader checks: a read-write open gives the project read-only,
// says why, loads everything, refuses a save naming the reason, and calls nothing damaged.
std::string readsReadOnly(const fs::path& file, const std::string& why)
{
    std::string fails;
    ProjectOpenResult opened = ProjectFile::open(file, OpenMode::ReadWrite);
    if (!opened.file) return "not opened:\n" + describeAll(opened.problems);
    if (!opened.readOnly) fails += "not read-only\n";
    if (opened.readOnlyReason.find(why) == std::string::npos) fails += "reason: " + opened.readOnlyReason + "\n";
    const Problem* note = findCode(opened.problems, code::kStoreOpenedReadOnly);
    if (!note || note->severity != Severity::Warning || note->message.find("opened read-only") == std::string::npos)
        fails += "no 'opened read-only' warning:\n" + describeAll(opened.problems);
    if (hasErrors(opened.problems)) fails += "errors on open:\n" + describeAll(opened.problems);
    StoreResult<Project> loaded = opened.file->load();
    if (!loaded.value || !sameContent(*loaded.value, inventedProject()))
        fails += "content differs:\n" + describeAll(loaded.problems);
    const Problems refused = opened.file->save(inventedProject("changed"));
    if (!findCode(refused, code::kStoreReadOnly)) fails += "save not refused as read-only:\n" + describeAll(refused);
    opened.file.reset();

    ModelSource source = readModelSource(file);  // what every tledger command does
    if (!source.project) fails += "readModelSource failed:\n" + describeAll(source.problems);
    if (findCode(source.problems, code::kStoreDamaged)) fails += "called damaged\n";
    if (!findCode(source.problems, code::kStoreOpenedReadOnly)) fails += "readModelSource does not say read-only\n";
    return fails;
}

TEST(ReadOnlyProject, AFileAtMode444IsReadAndNeverCalledDamaged)
{
    TempDir dir;
    const fs::path file = makeProject(dir.path());
    fs::permissions(file, fs::perms::owner_read | fs::perms::group_read | fs::perms::others_read);
    const std::string before = fileBytes(file);
    EXPECT_EQ(runInChild([&] { return readsReadOnly(file, "no permission to write it"); }), "");
    EXPECT_EQ(fileBytes(file), before);
    EXPECT_FALSE(sidecars(file)) << "a -wal or -shm was written beside a file the user cannot write";
}

TEST(ReadOnlyProject, AFileInAFolderAtMode555IsReadWithNothingWrittenBeside)
{
    TempDir dir;
    const fs::path folder = dir / "share";
    fs::create_directory(folder);
    const fs::path file = makeProject(folder);
    // The file itself may be written (also by 'nobody'); only its folder may not.
    fs::permissions(file, fs::perms::owner_read | fs::perms::owner_write | fs::perms::group_read |
                              fs::perms::group_write | fs::perms::others_read | fs::perms::others_write);
    const std::string before = fileBytes(file);
    fs::permissions(folder, fs::perms::owner_read | fs::perms::owner_exec | fs::perms::group_read |
                                fs::perms::group_exec | fs::perms::others_read | fs::perms::others_exec);
    EXPECT_EQ(runInChild([&] { return readsReadOnly(file, "folder"); }), "");
    fs::permissions(folder, fs::perms::owner_all);
    EXPECT_EQ(fileBytes(file), before);
    EXPECT_FALSE(sidecars(file));
}

// Defect 8: a newer schema opens read-only and says so, also to a command that asked
// for read-only (tledger solve, check, network, export).
TEST(ReadOnlyProject, ANewerSchemaSaysItOpenedReadOnlyWhenReadOnlyWasAsked)
{
    TempDir dir;
    const fs::path file = makeProject(dir.path());
    {
        sqlite3* db = nullptr;
        ASSERT_EQ(sqlite3_open(file.c_str(), &db), SQLITE_OK);
        ASSERT_EQ(sqlite3_exec(db, "PRAGMA user_version = 9999", nullptr, nullptr, nullptr), SQLITE_OK);
        sqlite3_close(db);
    }
    const ModelSource source = readModelSource(file, {std::nullopt, OpenMode::ReadOnly});
    ASSERT_TRUE(source.project) << describeAll(source.problems);
    const Problem* note = findCode(source.problems, code::kStoreNewerVersion);
    ASSERT_NE(note, nullptr) << describeAll(source.problems);
    EXPECT_EQ(note->severity, Severity::Warning);
    EXPECT_NE(note->message.find("opened read-only"), std::string::npos) << note->message;
    EXPECT_NE(note->message.find("9999"), std::string::npos) << note->message;
    EXPECT_TRUE(source.readOnly);
}

// --- injected write failures (fault item 12) ------------------------------------------
//
// A VFS over the default one whose writes fail with SQLITE_FULL once `allowedWrites`
// writes have gone through: the disk fills up in the middle of a save.

struct FaultState {
    bool armed = false;
    int allowedWrites = 0;
    int writes = 0;
} gFault;

sqlite3_vfs* gRealVfs = nullptr;

struct ShimFile {
    sqlite3_file base;
    sqlite3_file* real;  // lives right after this struct
};

sqlite3_file* realOf(sqlite3_file* f) { return reinterpret_cast<ShimFile*>(f)->real; }

int shimClose(sqlite3_file* f)
{
    const int rc = realOf(f)->pMethods ? realOf(f)->pMethods->xClose(realOf(f)) : SQLITE_OK;
    return rc;
}
int shimRead(sqlite3_file* f, void* p, int n, sqlite3_int64 o) { return realOf(f)->pMethods->xRead(realOf(f), p, n, o); }
int shimWrite(sqlite3_file* f, const void* p, int n, sqlite3_int64 o)
{
    if (gFault.armed && gFault.writes++ >= gFault.allowedWrites) return SQLITE_FULL;
    return realOf(f)->pMethods->xWrite(realOf(f), p, n, o);
}
int shimTruncate(sqlite3_file* f, sqlite3_int64 s) { return realOf(f)->pMethods->xTruncate(realOf(f), s); }
int shimSync(sqlite3_file* f, int flags) { return realOf(f)->pMethods->xSync(realOf(f), flags); }
int shimFileSize(sqlite3_file* f, sqlite3_int64* s) { return realOf(f)->pMethods->xFileSize(realOf(f), s); }
int shimLock(sqlite3_file* f, int l) { return realOf(f)->pMethods->xLock(realOf(f), l); }
int shimUnlock(sqlite3_file* f, int l) { return realOf(f)->pMethods->xUnlock(realOf(f), l); }
int shimCheckReserved(sqlite3_file* f, int* r) { return realOf(f)->pMethods->xCheckReservedLock(realOf(f), r); }
int shimFileControl(sqlite3_file* f, int op, void* a) { return realOf(f)->pMethods->xFileControl(realOf(f), op, a); }
int shimSectorSize(sqlite3_file* f) { return realOf(f)->pMethods->xSectorSize(realOf(f)); }
int shimDeviceChar(sqlite3_file* f) { return realOf(f)->pMethods->xDeviceCharacteristics(realOf(f)); }
int shimShmMap(sqlite3_file* f, int i, int sz, int e, void volatile** p)
{
    return realOf(f)->pMethods->xShmMap(realOf(f), i, sz, e, p);
}
int shimShmLock(sqlite3_file* f, int o, int n, int fl) { return realOf(f)->pMethods->xShmLock(realOf(f), o, n, fl); }
void shimShmBarrier(sqlite3_file* f) { realOf(f)->pMethods->xShmBarrier(realOf(f)); }
int shimShmUnmap(sqlite3_file* f, int d) { return realOf(f)->pMethods->xShmUnmap(realOf(f), d); }
int shimFetch(sqlite3_file* f, sqlite3_int64 o, int n, void** p) { return realOf(f)->pMethods->xFetch(realOf(f), o, n, p); }
int shimUnfetch(sqlite3_file* f, sqlite3_int64 o, void* p) { return realOf(f)->pMethods->xUnfetch(realOf(f), o, p); }

const sqlite3_io_methods kShimMethods = {3,           shimClose,        shimRead,       shimWrite,      shimTruncate,
                                         shimSync,    shimFileSize,     shimLock,       shimUnlock,     shimCheckReserved,
                                         shimFileControl, shimSectorSize, shimDeviceChar, shimShmMap,     shimShmLock,
                                         shimShmBarrier, shimShmUnmap,   shimFetch,      shimUnfetch};

int shimOpen(sqlite3_vfs*, sqlite3_filename name, sqlite3_file* f, int flags, int* outFlags)
{
    auto* shim = reinterpret_cast<ShimFile*>(f);
    shim->real = reinterpret_cast<sqlite3_file*>(shim + 1);
    const int rc = gRealVfs->xOpen(gRealVfs, name, shim->real, flags, outFlags);
    shim->base.pMethods = rc == SQLITE_OK ? &kShimMethods : nullptr;
    return rc;
}

// The default VFS with writes that can be made to fail; installed as the default for
// this test program, so the store is exercised exactly as it runs.
void installFaultyVfs()
{
    static sqlite3_vfs shim;
    if (gRealVfs) return;
    gRealVfs = sqlite3_vfs_find(nullptr);
    shim = *gRealVfs;
    shim.zName = "tl-faulty";
    shim.szOsFile = static_cast<int>(sizeof(ShimFile)) + gRealVfs->szOsFile;
    shim.pAppData = nullptr;
    shim.xOpen = shimOpen;
    sqlite3_vfs_register(&shim, 1);
}

class InjectedWriteFailure : public ::testing::TestWithParam<int> {
protected:
    void SetUp() override { installFaultyVfs(); }
    void TearDown() override { gFault = {}; }
};

TEST_P(InjectedWriteFailure, SaveKeepsThePreviousFileByteForByteAndSaysTheDiskIsFull)
{
    TempDir dir;
    const fs::path file = makeProject(dir.path());
    const std::string before = fileBytes(file);
    ASSERT_FALSE(sidecars(file));

    Project bigger = inventedProject("bigger");
    for (int i = 0; i < 40; ++i) {
        Scenario s = bigger.scenarios[0];
        s.name = "variant " + std::to_string(i);
        bigger.scenarios.push_back(s);
    }
    gFault = {true, GetParam(), 0};
    const Problems problems = saveProjectToPath(bigger, file);  // the GUI's Save
    gFault.armed = false;
    ASSERT_GT(gFault.writes, GetParam()) << "the fault was never reached";
    const Problem* full = findCode(problems, code::kStoreDiskFull);
    ASSERT_NE(full, nullptr) << describeAll(problems);
    EXPECT_NE(full->message.find("disk is full"), std::string::npos) << full->message;
    EXPECT_NE(full->message.find("keeps its previous content"), std::string::npos) << full->message;
    EXPECT_EQ(full->message.find("no transaction is active"), std::string::npos) << full->message;
    EXPECT_FALSE(full->hint.empty());
    EXPECT_EQ(fileBytes(file), before) << "the project file changed although the save failed";
    EXPECT_FALSE(sidecars(file));

    ProjectOpenResult reopened = ProjectFile::open(file, OpenMode::ReadOnly);
    ASSERT_TRUE(reopened.file) << describeAll(reopened.problems);
    StoreResult<Project> loaded = reopened.file->load();
    ASSERT_TRUE(loaded.value);
    EXPECT_TRUE(sameContent(*loaded.value, inventedProject()));
}

// 0: the first write fails; later: part of the transaction reached the journal.
INSTANTIATE_TEST_SUITE_P(AfterWrites, InjectedWriteFailure, ::testing::Values(0, 1, 3, 12));

TEST(InjectedWriteFailure, ImportIntoAProjectNamesTheFullDiskNotTheRollback)
{
    installFaultyVfs();
    TempDir dir;
    const fs::path file = makeProject(dir.path());
    const std::string before = fileBytes(file);
    ProjectOpenResult opened = ProjectFile::open(file, OpenMode::ReadWrite);
    ASSERT_TRUE(opened.file);
    Scenario extra = inventedProject().scenarios[0];
    extra.name = "imported";
    gFault = {true, 2, 0};
    const Problems problems = opened.file->createScenario(extra);  // tledger import
    gFault = {};
    ASSERT_NE(findCode(problems, code::kStoreDiskFull), nullptr) << describeAll(problems);
    EXPECT_EQ(describeAll(problems).find("cannot rollback"), std::string::npos) << describeAll(problems);
    opened.file.reset();
    EXPECT_EQ(fileBytes(file), before);
}

// --- a real full disk: a private tmpfs, where this machine allows mounting ---------

TEST(FullDisk, ReadingWorksAndASaveNamesTheFullDisk)
{
    TempDir dir;
    const fs::path mountPoint = dir / "small disk";
    fs::create_directory(mountPoint);
    const fs::path file = mountPoint / "project.tledger";
    bool skipped = false;
    const std::string report = runInChild(
        [&] {
            std::string fails;
            ProjectOpenResult created = ProjectFile::create(file, inventedProject());
            if (!created.file) return "cannot create the project on the tmpfs:\n" + describeAll(created.problems);
            created.file.reset();
            const std::string before = fileBytes(file);
            {  // fill the disk
                const int fd = ::open((mountPoint / "filler").c_str(), O_WRONLY | O_CREAT, 0644);
                const std::string block(4096, 'x');
                while (::write(fd, block.data(), block.size()) > 0) {
                }
                ::close(fd);
            }
            ModelSource source = readModelSource(file);  // tledger solve
            if (!source.project) fails += "reading on a full disk failed:\n" + describeAll(source.problems);
            if (findCode(source.problems, code::kStoreDamaged)) fails += "a full disk was called damage\n";

            Project bigger = inventedProject("bigger");
            for (int i = 0; i < 60; ++i) {
                Scenario s = bigger.scenarios[0];
                s.name = "variant " + std::to_string(i);
                bigger.scenarios.push_back(s);
            }
            const Problems problems = saveProjectToPath(bigger, file);
            if (!hasErrors(problems)) fails += "a save on a full disk reported success\n";
            if (findCode(problems, code::kStoreDamaged)) fails += "a full disk was called damage:\n" + describeAll(problems);
            if (!findCode(problems, code::kStoreDiskFull) && describeAll(problems).find("full") == std::string::npos)
                fails += "the save does not say the disk is full:\n" + describeAll(problems);
            if (fileBytes(file) != before) fails += "the project changed although the save failed\n";
            return fails;
        },
        [&]() -> std::string {
            // A mount namespace of this child alone: the tmpfs vanishes with it.
            if (::unshare(CLONE_NEWNS) != 0 || ::mount(nullptr, "/", nullptr, MS_REC | MS_PRIVATE, nullptr) != 0 ||
                ::mount("tmpfs", mountPoint.c_str(), "tmpfs", 0, "size=256k") != 0)
                return "SKIP";
            return {};
        },
        false);
    if (report == "SKIP") skipped = true;
    if (skipped) GTEST_SKIP() << "this machine does not allow mounting a tmpfs (needs root with CAP_SYS_ADMIN)";
    EXPECT_EQ(report, "");
}

}  // namespace
}  // namespace tl::testing
