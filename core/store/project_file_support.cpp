#include "core/store/project_file_detail.h"

#include <unistd.h>

#include <cerrno>
#include <cmath>

#include "core/model/problem_codes.h"
#include "core/model/text.h"
#include "core/store/sqlite_statement.h"

namespace tl::store::detail {

Problem fileProblem(const fs::path& file, std::string code, std::string message, std::string hint)
{
    Problem p;
    p.code = std::move(code);
    p.severity = Severity::Error;
    p.message = std::move(message);
    p.hint = std::move(hint);
    p.location = FileLocation{file.string(), 0, 0};
    return p;
}

std::string sqliteError(sqlite3* db) { return db ? sqlite3_errmsg(db) : "out of memory"; }

bool isBusy(sqlite3* db)
{
    const int code = sqlite3_errcode(db) & 0xff;
    return code == SQLITE_BUSY || code == SQLITE_LOCKED;
}

FailureCause failureCause(const store::SqliteError& error, const char* fallback)
{
    const int primary = error.code & 0xff;
    const int sys = error.systemErrno;
    if (primary == SQLITE_FULL || sys == ENOSPC || sys == EDQUOT)
        return {code::kStoreDiskFull, "the disk is full",
                "Free some space, or use Save As to put the project on another disk."};
    if (sys == EROFS)
        return {code::kStorePermissionDenied, "the disk or share is read-only",
                "Use Save As to write a copy where you may write."};
    if (primary == SQLITE_READONLY || primary == SQLITE_PERM || primary == SQLITE_AUTH || sys == EACCES || sys == EPERM)
        return {code::kStorePermissionDenied, "permission denied (the file or its folder cannot be written)",
                "Use Save As to write a copy where you may write."};
    if (primary == SQLITE_BUSY || primary == SQLITE_LOCKED)
        return {code::kStoreBusy, "the file is locked by another program (or another window is saving it)",
                "Try again in a moment; close the other program if it keeps the file open."};
    if (primary == SQLITE_CORRUPT || primary == SQLITE_NOTADB)
        return {code::kStoreDamaged, "damaged: " + error.message, "The file was left unchanged; restore it from a backup."};
    if (primary == SQLITE_IOERR || primary == SQLITE_CANTOPEN)
        return {code::kStoreIoError,
                "the disk reported an input/output error (it may be full, removed or failing): " + error.message,
                "Check the disk, then try again, or use Save As to another disk."};
    return {fallback, error.message, {}};
}

bool isDamage(const store::SqliteError& error)
{
    const int primary = error.code & 0xff;
    return primary == SQLITE_CORRUPT || primary == SQLITE_NOTADB;
}

Problem writeFailure(const fs::path& file, const store::SqliteError& error, const std::string& what)
{
    const FailureCause c = failureCause(error, code::kStoreWriteFailed);
    return fileProblem(file, c.code,
                       what + " failed: " + c.cause + "; nothing was changed, the file keeps its previous content", c.hint);
}

Problem writeFailure(const fs::path& file, sqlite3* db, const std::string& what)
{
    return writeFailure(file, store::SqliteError::of(db), what);
}

Problem readFailure(const fs::path& file, const store::SqliteError& error, const std::string& what)
{
    const FailureCause c = failureCause(error, code::kStoreReadFailed);
    if (c.code == code::kStoreDamaged) return fileProblem(file, c.code, c.cause, c.hint);
    return fileProblem(file, c.code, what + ": " + c.cause + "; the file was left unchanged", c.hint);
}

std::optional<std::string> whyNotWritable(const fs::path& file)
{
    const fs::path folder = file.has_parent_path() ? file.parent_path() : fs::path(".");
    if (::access(file.c_str(), W_OK) != 0)
        return errno == EROFS ? "it is on a read-only disk or share" : "you have no permission to write it";
    if (::access(folder.c_str(), W_OK) != 0)
        return errno == EROFS ? "it is on a read-only disk or share"
                              : "its folder does not let you create files beside it (the journal SQLite keeps while writing)";
    return std::nullopt;
}

// The safe defaults every connection gets before it touches the schema.
void configureConnection(sqlite3* db, int busyTimeoutMs)
{
    sqlite3_db_config(db, SQLITE_DBCONFIG_DEFENSIVE, 1, nullptr);
    sqlite3_db_config(db, SQLITE_DBCONFIG_TRUSTED_SCHEMA, 0, nullptr);
    sqlite3_db_config(db, SQLITE_DBCONFIG_ENABLE_LOAD_EXTENSION, 0, nullptr);
    sqlite3_db_config(db, SQLITE_DBCONFIG_ENABLE_TRIGGER, 0, nullptr);  // the schema has none
    sqlite3_db_config(db, SQLITE_DBCONFIG_ENABLE_VIEW, 0, nullptr);     // the schema has none
    sqlite3_busy_timeout(db, busyTimeoutMs);
    execute(db, "PRAGMA foreign_keys = ON");
    execute(db, "PRAGMA trusted_schema = OFF");
}

std::optional<std::int64_t> pragmaInt(sqlite3* db, const char* sql)
{
    Statement st(db, sql);
    if (!st.step()) return std::nullopt;
    return st.integer(0);
}

bool fraction(double v) { return std::isfinite(v) && v >= 0.0 && v <= 1.0; }

std::string trimmed(const std::string& s) { return std::string(trim(s)); }

}  // namespace tl::store::detail
