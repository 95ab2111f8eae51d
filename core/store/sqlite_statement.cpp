#include "core/store/sqlite_statement.h"

#include <sqlite3.h>

namespace tl::store {

Statement::Statement(sqlite3* db, std::string_view sql) : db_(db)
{
    rc_ = sqlite3_prepare_v2(db, sql.data(), static_cast<int>(sql.size()), &stmt_, nullptr);
    if (rc_ != SQLITE_OK) {
        failed_ = true;
        stmt_ = nullptr;
    }
}

Statement::~Statement() { sqlite3_finalize(stmt_); }

Statement& Statement::bind(int i, std::string_view text)
{
    if (stmt_) sqlite3_bind_text(stmt_, i, text.data(), static_cast<int>(text.size()), SQLITE_TRANSIENT);
    return *this;
}

Statement& Statement::bind(int i, double v)
{
    if (stmt_) sqlite3_bind_double(stmt_, i, v);
    return *this;
}

Statement& Statement::bind(int i, std::int64_t v)
{
    if (stmt_) sqlite3_bind_int64(stmt_, i, v);
    return *this;
}

Statement& Statement::bind(int i, const std::optional<double>& v)
{
    return v ? bind(i, *v) : bindNull(i);
}

Statement& Statement::bindNull(int i)
{
    if (stmt_) sqlite3_bind_null(stmt_, i);
    return *this;
}

bool Statement::step()
{
    if (!stmt_) return false;
    rc_ = sqlite3_step(stmt_);
    if (rc_ == SQLITE_ROW) return true;
    if (rc_ != SQLITE_DONE) failed_ = true;
    return false;
}

bool Statement::run()
{
    while (step()) {
    }
    return !failed_;
}

void Statement::reset()
{
    if (!stmt_) return;
    sqlite3_reset(stmt_);
    sqlite3_clear_bindings(stmt_);
}

bool Statement::isNull(int col) const { return sqlite3_column_type(stmt_, col) == SQLITE_NULL; }
double Statement::real(int col) const { return sqlite3_column_double(stmt_, col); }
std::int64_t Statement::integer(int col) const { return sqlite3_column_int64(stmt_, col); }

std::string Statement::text(int col) const
{
    const auto* p = reinterpret_cast<const char*>(sqlite3_column_text(stmt_, col));
    const int n = sqlite3_column_bytes(stmt_, col);
    return p ? std::string(p, static_cast<std::size_t>(n)) : std::string();
}

std::optional<double> Statement::optionalReal(int col) const
{
    if (isNull(col)) return std::nullopt;
    return real(col);
}

std::optional<std::string> execute(sqlite3* db, std::string_view sql)
{
    const std::string copy(sql);  // sqlite3_exec needs a terminated string
    char* message = nullptr;
    if (sqlite3_exec(db, copy.c_str(), nullptr, nullptr, &message) == SQLITE_OK) return std::nullopt;
    std::string text = message ? message : sqlite3_errmsg(db);
    sqlite3_free(message);
    return text;
}

SqliteError SqliteError::of(sqlite3* db)
{
    if (!db) return {SQLITE_NOMEM, 0, "out of memory"};
    return {sqlite3_extended_errcode(db), sqlite3_system_errno(db), sqlite3_errmsg(db)};
}

Transaction::Transaction(sqlite3* db) : db_(db)
{
    begun_ = !execute(db, "BEGIN IMMEDIATE");
    if (!begun_) failure_ = SqliteError::of(db);
}

Transaction::~Transaction()
{
    if (begun_ && !done_) execute(db_, "ROLLBACK");
}

bool Transaction::commit()
{
    if (!begun_ || done_) return false;
    if (execute(db_, "COMMIT")) {
        failure_ = SqliteError::of(db_);
        // A full disk or an I/O error may already have rolled the transaction back;
        // a second ROLLBACK would only add "no transaction is active".
        if (!sqlite3_get_autocommit(db_)) execute(db_, "ROLLBACK");
        done_ = true;
        return false;
    }
    done_ = true;
    return true;
}

}  // namespace tl::store
