#include "core/store/project_file_detail.h"

#include <cmath>

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

// Turns a failed write step into the Problem a user can act on.
Problem writeFailure(const fs::path& file, sqlite3* db, const std::string& what)
{
    if (isBusy(db))
        return fileProblem(file, "store-busy",
                           what + " failed: the project is busy (another window or program is saving it); nothing was changed",
                           "Try again in a moment.");
    return fileProblem(file, "store-write-failed", what + " failed: " + sqliteError(db) + "; nothing was changed");
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
