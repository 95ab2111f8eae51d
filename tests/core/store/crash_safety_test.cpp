// Crash safety and concurrent writers of core/store/project_file.
//
// Kill test: a forked child saves two different projects in turn, as fast as it can;
// the parent SIGKILLs it at a random moment, 200 times. After every kill the file must
// pass PRAGMA integrity_check and hold exactly one of the two states: a save is one
// transaction, so a crash leaves the previous state or the new one, never a mix.
//
// Busy test: one process holds the write lock while another saves: the second waits
// (busy timeout) and both changes are kept, or, when the wait is too short, the second
// gets a clear "busy" problem and the file keeps the first change.
#include <gtest/gtest.h>
#include <signal.h>
#include <sqlite3.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <random>
#include <thread>

#include "core/store/project_file.h"
#include "tests/core/store/store_test_support.h"

namespace tl {
namespace {

using testing::inventedModel;
using testing::inventedProject;
using testing::sameContent;
using testing::TempDir;

// Two states that differ in every table, the scenario count and the compartment count.
Project stateA() { return inventedProject("state A"); }

Project stateB()
{
    Project p = inventedProject("state B");
    p.info.notes = "B notes";
    for (Scenario& s : p.scenarios) {
        s.description += " (B)";
        for (std::size_t i = 0; i < s.model.size(); ++i)
            if (auto& b = s.model.compartment(i).value(Param::Biomass)) *b *= 3.0;
        Compartment extra;
        extra.name = "benthos added in B";
        s.model.addCompartment(extra, 1);
        s.model.setDiet(0, 1, 0.05);
        s.model.setDiet(0, 2, 0.65);
        s.layout["benthos added in B"] = LayoutPosition{5, 5};
    }
    Scenario third;
    third.name = "only in B";
    third.model = inventedModel(0.5);
    third.model.units = p.info.units;
    third.model.rules = p.info.rules;
    p.scenarios.push_back(third);
    return p;
}

std::string integrityCheck(const std::filesystem::path& path)
{
    sqlite3* db = nullptr;
    sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READWRITE, nullptr);
    sqlite3_stmt* st = nullptr;
    sqlite3_prepare_v2(db, "PRAGMA integrity_check", -1, &st, nullptr);
    std::string result = sqlite3_step(st) == SQLITE_ROW ? reinterpret_cast<const char*>(sqlite3_column_text(st, 0)) : "no row";
    sqlite3_finalize(st);
    sqlite3_close(db);
    return result;
}

// A SIGKILL leaves the page cache intact, so what is tested here (transactions under
// process death) does not depend on the disk; a RAM-backed folder, when there is one,
// keeps the 200 kills well inside the time budget on slow disks.
std::filesystem::path fastTempBase()
{
    std::error_code ec;
    if (std::filesystem::is_directory("/dev/shm", ec) && access("/dev/shm", W_OK) == 0) return "/dev/shm";
    return std::filesystem::temp_directory_path();
}

TEST(CrashSafety, KilledSavesLeaveTheOldOrTheNewStateNeverAMix)
{
    TempDir dir(fastTempBase());
    const auto path = dir / "killed.tledger";
    const Project a = stateA(), b = stateB();
    ASSERT_TRUE(ProjectFile::create(path, a).file);

    // The length of one save on this machine, to spread the kill moments over it.
    double saveUs = 0;
    {
        auto file = ProjectFile::open(path).file;
        ASSERT_TRUE(file);
        const auto t0 = std::chrono::steady_clock::now();
        ASSERT_TRUE(file->save(b).empty());
        ASSERT_TRUE(file->save(a).empty());
        saveUs = std::chrono::duration<double, std::micro>(std::chrono::steady_clock::now() - t0).count() / 2;
    }
    constexpr int kKills = 200;
    std::mt19937 rng(424242);
    std::uniform_int_distribution<int> delayUs(0, static_cast<int>(1.5 * saveUs) + 200);
    std::uniform_int_distribution<int> savesBeforeKill(0, 3);
    int seenA = 0, seenB = 0;
    const auto started = std::chrono::steady_clock::now();
    for (int kill = 0; kill < kKills; ++kill) {
        int ready[2];
        ASSERT_EQ(pipe(ready), 0);
        const pid_t child = fork();
        ASSERT_GE(child, 0);
        if (child == 0) {
            close(ready[0]);
            auto opened = ProjectFile::open(path);
            if (!opened.file) _exit(3);
            const char byte = 1;
            if (write(ready[1], &byte, 1) != 1) _exit(4);
            for (bool toB = true;; toB = !toB) {
                if (!opened.file->save(toB ? b : a).empty()) _exit(5);
                if (write(ready[1], &byte, 1) != 1) _exit(6);  // one byte per finished save
            }
        }
        close(ready[1]);
        // Wait until the child is ready and has finished 0 to 3 saves, then kill it at a
        // random moment of the save that follows (or just after it): whatever the load of
        // the machine, kills land in both kinds of save and at every stage of one.
        char byte = 0;
        bool childReady = read(ready[0], &byte, 1) == 1;
        for (int done = savesBeforeKill(rng); childReady && done > 0; --done) childReady = read(ready[0], &byte, 1) == 1;
        std::this_thread::sleep_for(std::chrono::microseconds(delayUs(rng)));
        ::kill(child, SIGKILL);
        close(ready[0]);
        int status = 0;
        waitpid(child, &status, 0);
        ASSERT_TRUE(childReady) << "child could not open the project (exit " << WEXITSTATUS(status) << ")";
        ASSERT_TRUE(WIFSIGNALED(status)) << "the child stopped on its own (exit " << WEXITSTATUS(status) << ") at kill " << kill;

        ASSERT_EQ(integrityCheck(path), "ok") << "after kill " << kill;
        auto opened = ProjectFile::open(path);
        ASSERT_TRUE(opened.file) << "after kill " << kill << ": " << opened.problems.at(0).describe();
        auto loaded = opened.file->load();
        ASSERT_TRUE(loaded.value) << "after kill " << kill;
        const bool isA = sameContent(*loaded.value, a), isB = sameContent(*loaded.value, b);
        ASSERT_TRUE(isA || isB) << "after kill " << kill << " the file holds a mix of two saves";
        seenA += isA;
        seenB += isB;
    }
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
    // Both states must have been hit, or the kills did not land during saves.
    EXPECT_GT(seenA, 0);
    EXPECT_GT(seenB, 0);
    RecordProperty("kills", kKills);
    RecordProperty("seconds", std::to_string(seconds));
    std::cout << "one save " << saveUs / 1000 << " ms; kills " << kKills << ": state A " << seenA << ", state B " << seenB << ", " << seconds << " s\n";
}

// Child: takes the write lock, changes the notes, holds the lock for `holdMs`, commits.
pid_t holdWriteLock(const std::filesystem::path& path, int holdMs, int& readyFd)
{
    int ready[2];
    if (pipe(ready) != 0) return -1;
    const pid_t child = fork();
    if (child == 0) {
        close(ready[0]);
        sqlite3* db = nullptr;
        if (sqlite3_open(path.c_str(), &db) != SQLITE_OK) _exit(3);
        if (sqlite3_exec(db, "BEGIN IMMEDIATE; UPDATE project_info SET notes = 'written by the other process';", nullptr,
                         nullptr, nullptr) != SQLITE_OK)
            _exit(4);
        const char byte = 1;
        if (write(ready[1], &byte, 1) != 1) _exit(5);
        std::this_thread::sleep_for(std::chrono::milliseconds(holdMs));
        if (sqlite3_exec(db, "COMMIT", nullptr, nullptr, nullptr) != SQLITE_OK) _exit(6);
        sqlite3_close(db);
        _exit(0);
    }
    close(ready[1]);
    readyFd = ready[0];
    return child;
}

TEST(Concurrency, SecondWriterWaitsAndBothChangesAreKept)
{
    TempDir dir;
    const auto path = dir / "shared.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    auto mine = ProjectFile::open(path);
    ASSERT_TRUE(mine.file);

    int readyFd = -1;
    const pid_t other = holdWriteLock(path, 400, readyFd);
    ASSERT_GT(other, 0);
    char byte = 0;
    ASSERT_EQ(read(readyFd, &byte, 1), 1);
    close(readyFd);

    Scenario added;
    added.name = "saved while the other held the lock";
    added.model = inventedModel(1.5);
    const auto t0 = std::chrono::steady_clock::now();
    const Problems problems = mine.file->createScenario(added);
    const auto waited = std::chrono::steady_clock::now() - t0;
    int status = 0;
    waitpid(other, &status, 0);
    ASSERT_TRUE(WIFEXITED(status) && WEXITSTATUS(status) == 0);
    EXPECT_TRUE(problems.empty()) << problems.at(0).describe();
    EXPECT_GE(std::chrono::duration_cast<std::chrono::milliseconds>(waited).count(), 200) << "it should have waited";

    auto loaded = mine.file->load();
    ASSERT_TRUE(loaded.value);
    EXPECT_EQ(loaded.value->info.notes, "written by the other process");
    EXPECT_NE(loaded.value->findScenario(added.name), nullptr);
}

TEST(Concurrency, TooLongAWaitGivesAClearBusyProblemAndLosesNothing)
{
    TempDir dir;
    const auto path = dir / "busy.tledger";
    ASSERT_TRUE(ProjectFile::create(path, inventedProject()).file);
    auto mine = ProjectFile::open(path);
    ASSERT_TRUE(mine.file);
    mine.file->setBusyTimeout(50);

    int readyFd = -1;
    const pid_t other = holdWriteLock(path, 800, readyFd);
    ASSERT_GT(other, 0);
    char byte = 0;
    ASSERT_EQ(read(readyFd, &byte, 1), 1);
    close(readyFd);

    Scenario added;
    added.name = "tried while busy";
    added.model = inventedModel();
    const Problems problems = mine.file->createScenario(added);
    ASSERT_EQ(problems.size(), 1u);
    EXPECT_EQ(problems[0].code, "store-busy");
    EXPECT_NE(problems[0].describe().find(path.string()), std::string::npos);
    EXPECT_NE(problems[0].message.find("busy"), std::string::npos);

    int status = 0;
    waitpid(other, &status, 0);
    ASSERT_TRUE(WIFEXITED(status) && WEXITSTATUS(status) == 0);
    // The other process's change is there; trying again now succeeds.
    EXPECT_EQ(mine.file->load().value->info.notes, "written by the other process");
    EXPECT_TRUE(mine.file->createScenario(added).empty());
    EXPECT_NE(mine.file->load().value->findScenario(added.name), nullptr);
}

}  // namespace
}  // namespace tl
