// Internals of ProjectFile (core/store/project_file.h) shared by its source files; not
// for use elsewhere. The files, one concern each:
//   project_file_support.cpp  Problems naming the file, connection defaults, small helpers
//   project_header.cpp        the 100-byte header check before SQLite touches a file
//   project_rows.cpp          checks before a write, and rows <-> Project / Scenario
//   project_open.cpp          open (quick check, migration), create
//   project_file.cpp          the operations: load, save, scenarios, runs
#pragma once

#include <sqlite3.h>

#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "core/model/problem.h"
#include "core/store/project.h"
#include "core/store/project_file.h"
#include "core/store/sqlite_statement.h"

namespace tl::store::detail {

namespace fs = std::filesystem;

inline constexpr int kDefaultBusyTimeoutMs = 5000;

// --- project_file_support.cpp
Problem fileProblem(const fs::path& file, std::string code, std::string message, std::string hint = {});
std::string sqliteError(sqlite3* db);
bool isBusy(sqlite3* db);
// Why a SQLite call failed, in words a user can act on: the disk is full, permission
// is denied (or the disk is read-only), another program holds the file, the disk
// reported an I/O error, or the file is damaged (SQLITE_CORRUPT / NOTADB only: nothing
// else is ever called damage).
struct FailureCause {
    const char* code;  // code::kStoreDiskFull, kStorePermissionDenied, kStoreBusy, kStoreIoError, kStoreDamaged or the fallback
    std::string cause;
    std::string hint;
};
FailureCause failureCause(const store::SqliteError& error, const char* fallback);
bool isDamage(const store::SqliteError& error);
// A failed write: names the cause and says the file keeps its previous content.
Problem writeFailure(const fs::path& file, const store::SqliteError& error, const std::string& what);
Problem writeFailure(const fs::path& file, sqlite3* db, const std::string& what);  // the error as it stands now
// A failed read ("cannot be read: the disk reported an input/output error...").
Problem readFailure(const fs::path& file, const store::SqliteError& error, const std::string& what);
// Why this process may not write `file` or create files (SQLite's -wal, -shm) beside
// it; nothing when it may.
std::optional<std::string> whyNotWritable(const fs::path& file);
void configureConnection(sqlite3* db, int busyTimeoutMs);
std::optional<std::int64_t> pragmaInt(sqlite3* db, const char* sql);
bool fraction(double v);
std::string trimmed(const std::string& s);

// --- project_header.cpp
std::optional<Problem> checkHeader(const fs::path& path);

// --- project_rows.cpp
void checkScenarioWritable(const fs::path& file, const Scenario& s, Problems& out);
bool writeInfo(sqlite3* db, const ProjectInfo& info);
std::optional<std::int64_t> scenarioId(sqlite3* db, const std::string& name);
bool writeScenario(sqlite3* db, int version, const Scenario& s, std::optional<std::int64_t> position);
bool insertRuns(sqlite3* db, int version, const std::vector<StoredRun>& runs, bool keepIds);
std::optional<ProjectInfo> readInfo(sqlite3* db, int version);  // version: of the file as opened
std::optional<Scenario> readScenario(sqlite3* db, const fs::path& file, int version, std::int64_t id,
                                     const ProjectInfo& info, Problems& problems);

// --- project_open.cpp
ProjectOpenResult openChecked(const fs::path& path, OpenMode mode, int busyTimeoutMs,
                              ProjectFile* (*make)(fs::path, sqlite3*, bool, std::string, int));

}  // namespace tl::store::detail
