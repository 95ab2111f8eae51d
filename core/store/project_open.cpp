#include <unistd.h>

#include <cctype>
#include <set>
#include <system_error>

#include "core/io/atomic_file.h"
#include "core/model/problem_codes.h"
#include "core/store/project_file_detail.h"
#include "core/store/schema.h"
#include "core/store/sqlite_statement.h"

namespace tl::store::detail {
namespace {

// `path` for a SQLite URI (https://sqlite.org/uri.html): every byte outside the
// unreserved set and '/' percent-encoded, so '?', '#' and '%' in a name stay a name.
std::string uriPath(const fs::path& path)
{
    static constexpr char kHex[] = "0123456789ABCDEF";
    std::string out;
    for (unsigned char c : path.string()) {
        if (std::isalnum(c) || c == '/' || c == '-' || c == '.' || c == '_' || c == '~') {
            out += static_cast<char>(c);
        } else {
            out += '%';
            out += kHex[c >> 4];
            out += kHex[c & 15];
        }
    }
    return out;
}

}  // namespace

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
    // A read-only open of a file this process may write is still a read-write
    // connection, with PRAGMA query_only so that no statement can change it: then
    // closing the last connection removes the -wal and -shm files as usual, instead of
    // leaving them beside the project. A file this process may NOT write (mode 444, a
    // folder at 555, a read-only share or disk) is never given a -wal or -shm: it is
    // read through a read-only URI, `immutable` unless a -wal left by its owner holds
    // pages the file still needs (then plain mode=ro reads them).
    const std::optional<std::string> denied = whyNotWritable(path);
    const bool walHasContent = hadWal && fs::file_size(wal, ec) > 0;
    auto openDb = [&](bool readOnly, bool immutable) -> sqlite3* {
        sqlite3* db = nullptr;
        int rc = SQLITE_OK;
        if (immutable || denied) {
            const std::string uri = "file:" + uriPath(fs::absolute(path, ec)) +
                                    (immutable || !walHasContent ? "?mode=ro&immutable=1" : "?mode=ro");
            rc = sqlite3_open_v2(uri.c_str(), &db, SQLITE_OPEN_READONLY | SQLITE_OPEN_URI, nullptr);
        } else {
            rc = sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READWRITE, nullptr);
        }
        if (rc != SQLITE_OK) {
            result.problems.push_back(readFailure(path, store::SqliteError::of(db), "cannot be opened"));
            sqlite3_close(db);
            return nullptr;
        }
        configureConnection(db, busyTimeoutMs);
        if (readOnly) execute(db, "PRAGMA query_only = ON");
        return db;
    };
    bool readOnly = mode == OpenMode::ReadOnly || denied.has_value();
    std::string reason;
    if (denied) {
        reason = *denied;
        Problem note = fileProblem(path, code::kStoreOpenedReadOnly, "opened read-only: " + *denied +
                                                                       "; nothing is written to it or beside it",
                                   "Use Save As to keep changes in a copy.");
        note.severity = Severity::Warning;
        result.problems.push_back(note);
    }
    sqlite3* db = openDb(readOnly, false);
    if (!db) return result;

    // The content check. Only a verdict of the check, or SQLite's "corrupt" / "not a
    // database", is damage: a full disk, a denied permission or a lock is named as such.
    std::string verdict;
    store::SqliteError error;
    auto sound = [&] {
        Statement check(db, "PRAGMA quick_check");
        if (check.step()) {
            verdict = check.text(0);
            return verdict == "ok";
        }
        error = store::SqliteError::of(db);
        return false;
    };
    bool ok = sound();
    const int primary = error.code & 0xff;
    bool immutable = false;
    if (!ok && verdict.empty() && !walHasContent && !isDamage(error) && primary != SQLITE_BUSY &&
        primary != SQLITE_LOCKED) {
        // A connection that cannot make the -shm beside the file (a full disk, say) may
        // still read the file as it stands on disk: read-only, and saying why.
        sqlite3_close(db);
        immutable = true;
        db = openDb(true, true);
        if (!db) return result;
        ok = sound();
        if (ok && !readOnly) {
            readOnly = true;
            reason = failureCause(error, code::kStoreReadFailed).cause;
            Problem note = fileProblem(path, code::kStoreOpenedReadOnly,
                                       "opened read-only: it cannot be opened for writing (" + reason + ")",
                                       "Use Save As to keep changes in a copy.");
            note.severity = Severity::Warning;
            result.problems.push_back(note);
        }
        readOnly = true;
    }
    if (!ok) {
        if (!verdict.empty())
            result.problems.push_back(fileProblem(path, code::kStoreDamaged, "damaged: " + verdict,
                                                  "The file was left unchanged; restore it from a backup."));
        else
            result.problems.push_back(readFailure(path, error, "cannot be read"));
        return refuse(db);
    }
    const auto appId = pragmaInt(db, "PRAGMA application_id");
    const auto version = pragmaInt(db, "PRAGMA user_version");
    if (!appId || !version || *appId != store::kApplicationId || *version < 1) {
        result.problems.push_back(fileProblem(path, code::kStoreNotProject,
                                              "not a Trophic Ledger project (no schema version); it was left unchanged"));
        return refuse(db);
    }
    int schema = static_cast<int>(*version);
    if (schema > store::kSchemaVersion) {
        reason = "made by a newer version of Trophic Ledger (schema " + std::to_string(schema) +
                 "; this program writes schema " + std::to_string(store::kSchemaVersion) +
                 "), so it is opened read-only to keep what it holds intact";
        if (!readOnly) {
            sqlite3_close(db);
            readOnly = true;
            db = openDb(true, immutable);
            if (!db) return result;
        }
        Problem note = fileProblem(path, code::kStoreNewerVersion, reason, "Open it with a newer Trophic Ledger to edit it.");
        note.severity = Severity::Warning;
        result.problems.push_back(note);
    } else if (readOnly) {
        // Never migrated: an older file opened read-only (on request, or because it may
        // not be written) is read at its own schema version and left as it is.
        if (reason.empty()) reason = "opened read-only on request";
    } else if (schema < store::kSchemaVersion) {
        // All steps in one transaction: the file ends at the current version or stays
        // at its own, never in between.
        const bool migrated = [&] {
            Transaction tx(db);
            if (!tx.begun()) {
                result.problems.push_back(writeFailure(path, tx.failure(), "updating the file to the current schema"));
                return false;
            }
            const auto current = pragmaInt(db, "PRAGMA user_version");  // another process may have migrated it
            schema = static_cast<int>(current.value_or(schema));
            for (const store::Migration& step : store::migrations()) {
                if (step.from != schema) continue;
                if (const auto error = execute(db, step.sql)) {
                    result.problems.push_back(fileProblem(path, code::kStoreMigrationFailed,
                                                          "could not be updated from schema " + std::to_string(schema) +
                                                              ": " + *error + "; nothing was changed",
                                                          "Open it read-only, or with the program version that made it."));
                    return false;
                }
                ++schema;
            }
            if (execute(db, "PRAGMA user_version = " + std::to_string(schema))) {
                result.problems.push_back(writeFailure(path, db, "updating the file to the current schema"));
                return false;
            }
            if (!tx.commit()) {
                result.problems.push_back(writeFailure(path, tx.failure(), "updating the file to the current schema"));
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
        result.problems.push_back(fileProblem(path, code::kStoreExists, "already exists; a new project is never written over it",
                                              "Choose another file name, or open the existing project."));
        return result;
    }
    for (const Scenario& s : project.scenarios) checkScenarioWritable(path, s, result.problems);
    std::set<std::string> names;
    for (const Scenario& s : project.scenarios)
        if (!names.insert(trimmed(s.name)).second)
            result.problems.push_back(fileProblem(path, code::kStoreDuplicateName, "two scenarios are named '" + trimmed(s.name) + "'"));
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
        result.problems.push_back(fileProblem(path, code::kStoreCreateFailed, "cannot be created: " + sqliteError(db)));
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
        result.problems.push_back(fileProblem(path, code::kStoreCreateFailed, "cannot be created: " + sqliteError(db)));
        sqlite3_close(db);
        removeTemp();
        return result;
    }
    sqlite3_close(db);  // checkpoints the WAL into the file
    if (::link(temp.c_str(), path.c_str()) != 0) {
        result.problems.push_back(fileProblem(path, code::kStoreCreateFailed,
                                              "cannot be created (another file appeared under that name, or the folder "
                                              "does not allow it)"));
        removeTemp();
        return result;
    }
    removeTemp();
    return open(path, OpenMode::ReadWrite);
}

}  // namespace tl
