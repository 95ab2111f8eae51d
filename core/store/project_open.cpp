#include <unistd.h>

#include <set>
#include <system_error>

#include "core/io/atomic_file.h"
#include "core/store/project_file_detail.h"
#include "core/store/schema.h"
#include "core/store/sqlite_statement.h"

namespace tl::store::detail {

// Opens an existing file whose header has been checked, applies the safe defaults,
// verifies the content and migrates it when allowed.
ProjectOpenResult openChecked(const fs::path& path, OpenMode mode, int busyTimeoutMs,
                              ProjectFile* (*make)(fs::path, sqlite3*, bool, std::string, int))
{
    ProjectOpenResult result;
    // SQLite makes -wal and -shm files beside a WAL database when it opens it. If the
    // file is then refused, remove the ones this attempt made, so that a refused file
    // is left exactly as it was found.
    std::error_code ec;
    fs::path wal = path, shm = path;
    wal += "-wal";
    shm += "-shm";
    const bool hadWal = fs::exists(wal, ec), hadShm = fs::exists(shm, ec);
    auto refuse = [&](sqlite3* db) {
        sqlite3_close(db);
        if (!hadWal && fs::exists(wal, ec) && fs::file_size(wal, ec) == 0) fs::remove(wal, ec);
        if (!hadShm && !fs::exists(wal, ec)) fs::remove(shm, ec);
        return std::move(result);
    };
    // A read-only project is still opened read-write when the file system allows, with
    // PRAGMA query_only so that no statement can change it: then closing the last
    // connection removes the -wal and -shm files as usual, instead of leaving them
    // beside the project. Read-only media fall back to a read-only connection.
    auto openDb = [&](bool readOnly) -> sqlite3* {
        sqlite3* db = nullptr;
        int rc = sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READWRITE, nullptr);
        if (rc != SQLITE_OK && readOnly) {
            sqlite3_close(db);
            db = nullptr;
            rc = sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READONLY, nullptr);
        }
        if (rc != SQLITE_OK) {
            result.problems.push_back(fileProblem(path, "store-open-failed", "cannot be opened: " + sqliteError(db)));
            sqlite3_close(db);
            return nullptr;
        }
        configureConnection(db, busyTimeoutMs);
        if (readOnly) execute(db, "PRAGMA query_only = ON");
        return db;
    };
    bool readOnly = mode == OpenMode::ReadOnly;
    sqlite3* db = openDb(readOnly);
    if (!db) return result;

    // The check's statement is finalized before refuse() closes the connection: with a
    // statement still open, sqlite3_close fails and the connection and its file handle
    // leak (found by tests/fuzz/fuzz_project).
    const std::optional<Problem> unusable = [&]() -> std::optional<Problem> {
        Statement check(db, "PRAGMA quick_check");
        const bool stepped = check.step();
        if (stepped && check.text(0) == "ok") return std::nullopt;
        const std::string why = stepped ? check.text(0) : sqliteError(db);
        if (!stepped && isBusy(db))
            return fileProblem(path, "store-busy", "is busy (another program holds it locked); try again in a moment");
        return fileProblem(path, "store-damaged", "damaged: " + why,
                           "The file was left unchanged; restore it from a backup.");
    }();
    if (unusable) {
        result.problems.push_back(*unusable);
        return refuse(db);
    }
    const auto appId = pragmaInt(db, "PRAGMA application_id");
    const auto version = pragmaInt(db, "PRAGMA user_version");
    if (!appId || !version || *appId != store::kApplicationId || *version < 1) {
        result.problems.push_back(fileProblem(path, "store-not-project",
                                              "not a Trophic Ledger project (no schema version); it was left unchanged"));
        return refuse(db);
    }
    int schema = static_cast<int>(*version);
    std::string reason;
    if (schema > store::kSchemaVersion) {
        reason = "made by a newer version of Trophic Ledger (schema " + std::to_string(schema) +
                 "; this program writes schema " + std::to_string(store::kSchemaVersion) +
                 "), so it is opened read-only to keep what it holds intact";
        if (!readOnly) {
            sqlite3_close(db);
            readOnly = true;
            db = openDb(true);
            if (!db) return result;
        }
        Problem note = fileProblem(path, "store-newer-version", reason, "Open it with a newer Trophic Ledger to edit it.");
        note.severity = Severity::Warning;
        result.problems.push_back(note);
    } else if (readOnly) {
        reason = "opened read-only on request";
    } else if (schema < store::kSchemaVersion) {
        // All steps in one transaction: the file ends at the current version or stays
        // at its own, never in between.
        const bool migrated = [&] {
            Transaction tx(db);
            if (!tx.begun()) {
                result.problems.push_back(writeFailure(path, db, "updating the file to the current schema"));
                return false;
            }
            const auto current = pragmaInt(db, "PRAGMA user_version");  // another process may have migrated it
            schema = static_cast<int>(current.value_or(schema));
            for (const store::Migration& step : store::migrations()) {
                if (step.from != schema) continue;
                if (const auto error = execute(db, step.sql)) {
                    result.problems.push_back(fileProblem(path, "store-migration-failed",
                                                          "could not be updated from schema " + std::to_string(schema) +
                                                              ": " + *error + "; nothing was changed",
                                                          "Open it read-only, or with the program version that made it."));
                    return false;
                }
                ++schema;
            }
            if (execute(db, "PRAGMA user_version = " + std::to_string(schema)) || !tx.commit()) {
                result.problems.push_back(writeFailure(path, db, "updating the file to the current schema"));
                return false;
            }
            return true;
        }();
        if (!migrated) return refuse(db);
    }
    if (!readOnly) {
        execute(db, "PRAGMA journal_mode = WAL");
        execute(db, "PRAGMA synchronous = FULL");
    }
    result.readOnly = readOnly;
    result.readOnlyReason = reason;
    result.file.reset(make(path, db, readOnly, reason, schema));
    return result;
}

}  // namespace tl::store::detail

namespace tl {
namespace fs = std::filesystem;
using store::execute;
using store::Statement;
using store::Transaction;
using namespace store::detail;

struct ProjectFileAccess {
    static ProjectFile* make(fs::path path, sqlite3* db, bool readOnly, std::string reason, int version)
    {
        return new ProjectFile(std::move(path), db, readOnly, std::move(reason), version);
    }
};

ProjectFile::ProjectFile(fs::path path, sqlite3* db, bool readOnly, std::string reason, int version)
    : path_(std::move(path)), db_(db), readOnly_(readOnly), readOnlyReason_(std::move(reason)), schemaVersion_(version)
{
}

ProjectFile::~ProjectFile() { sqlite3_close(db_); }

void ProjectFile::setBusyTimeout(int milliseconds) { sqlite3_busy_timeout(db_, milliseconds); }

ProjectOpenResult ProjectFile::open(const fs::path& path, OpenMode mode)
{
    if (auto refused = checkHeader(path)) {
        ProjectOpenResult result;
        result.problems.push_back(*refused);
        return result;
    }
    return openChecked(path, mode, kDefaultBusyTimeoutMs, &ProjectFileAccess::make);
}

ProjectOpenResult ProjectFile::create(const fs::path& path, const Project& project)
{
    ProjectOpenResult result;
    std::error_code ec;
    if (fs::exists(fs::symlink_status(path, ec))) {
        result.problems.push_back(fileProblem(path, "store-exists", "already exists; a new project is never written over it",
                                              "Choose another file name, or open the existing project."));
        return result;
    }
    for (const Scenario& s : project.scenarios) checkScenarioWritable(path, s, result.problems);
    std::set<std::string> names;
    for (const Scenario& s : project.scenarios)
        if (!names.insert(trimmed(s.name)).second)
            result.problems.push_back(fileProblem(path, "store-duplicate-name", "two scenarios are named '" + trimmed(s.name) + "'"));
    if (hasErrors(result.problems)) return result;

    // Built beside the target under a temporary name, then linked into place, so that
    // a half-made project never appears under the real name.
    const fs::path temp = temporaryBeside(path);
    auto removeTemp = [&] {
        for (const char* suffix : {"", "-wal", "-shm", "-journal"}) {
            fs::path p = temp;
            p += suffix;
            fs::remove(p, ec);
        }
    };
    sqlite3* db = nullptr;
    if (sqlite3_open_v2(temp.c_str(), &db, SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE | SQLITE_OPEN_EXCLUSIVE, nullptr) !=
        SQLITE_OK) {
        result.problems.push_back(fileProblem(path, "store-create-failed", "cannot be created: " + sqliteError(db)));
        sqlite3_close(db);
        removeTemp();
        return result;
    }
    configureConnection(db, kDefaultBusyTimeoutMs);
    bool ok = !execute(db, "PRAGMA application_id = " + std::to_string(store::kApplicationId));
    ok = ok && !execute(db, "PRAGMA journal_mode = WAL");
    if (ok) {
        Transaction tx(db);
        ok = tx.begun() && !execute(db, store::currentSchemaSql()) &&
             !execute(db, "PRAGMA user_version = " + std::to_string(store::kSchemaVersion)) && writeInfo(db, project.info);
        for (std::size_t i = 0; ok && i < project.scenarios.size(); ++i)
            ok = writeScenario(db, store::kSchemaVersion, project.scenarios[i], static_cast<std::int64_t>(i));
        ok = ok && insertRuns(db, store::kSchemaVersion, project.runs, true) && tx.commit();
    }
    if (!ok) {
        result.problems.push_back(fileProblem(path, "store-create-failed", "cannot be created: " + sqliteError(db)));
        sqlite3_close(db);
        removeTemp();
        return result;
    }
    sqlite3_close(db);  // checkpoints the WAL into the file
    if (::link(temp.c_str(), path.c_str()) != 0) {
        result.problems.push_back(fileProblem(path, "store-create-failed",
                                              "cannot be created (another file appeared under that name, or the folder "
                                              "does not allow it)"));
        removeTemp();
        return result;
    }
    removeTemp();
    return open(path, OpenMode::ReadWrite);
}

}  // namespace tl
