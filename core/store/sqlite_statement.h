// Thin RAII helpers over the SQLite C API used by the project file: a prepared
// statement with bound parameters (never string-built SQL for values) and a
// transaction guard that rolls back unless committed. Internal to tl_store.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

struct sqlite3;
struct sqlite3_stmt;

namespace tl::store {

class Statement {
public:
    Statement(sqlite3* db, std::string_view sql);
    ~Statement();
    Statement(const Statement&) = delete;
    Statement& operator=(const Statement&) = delete;

    bool ok() const { return stmt_ != nullptr; }
    // Parameters are 1-based, as in SQLite.
    Statement& bind(int i, std::string_view text);
    Statement& bind(int i, double v);
    Statement& bind(int i, std::int64_t v);
    Statement& bind(int i, const std::optional<double>& v);  // NULL when empty
    Statement& bindNull(int i);

    // Steps once: true when a row is available; false when done or failed (see failed()).
    bool step();
    // Runs to completion; false on failure.
    bool run();
    void reset();

    bool isNull(int col) const;
    double real(int col) const;
    std::int64_t integer(int col) const;
    std::string text(int col) const;
    std::optional<double> optionalReal(int col) const;

    bool failed() const { return failed_; }
    int errorCode() const { return rc_; }

private:
    sqlite3* db_;
    sqlite3_stmt* stmt_ = nullptr;
    bool failed_ = false;
    int rc_ = 0;
};

// What a failed SQLite call left behind, taken at once: a later call (a ROLLBACK after a
// failed COMMIT) would overwrite it with its own message.
struct SqliteError {
    int code = 0;         // extended result code
    int systemErrno = 0;  // errno of the failing system call (ENOSPC, EACCES, EROFS...), 0 if none
    std::string message;
    static SqliteError of(sqlite3* db);
};

// Runs `sql` (possibly several statements, no parameters). Returns the SQLite error
// text, or nothing on success.
std::optional<std::string> execute(sqlite3* db, std::string_view sql);

// BEGIN IMMEDIATE on construction (takes the write lock up front, so a busy file is
// found before any work); ROLLBACK on destruction unless commit() succeeded.
class Transaction {
public:
    explicit Transaction(sqlite3* db);
    ~Transaction();
    Transaction(const Transaction&) = delete;
    Transaction& operator=(const Transaction&) = delete;

    bool begun() const { return begun_; }
    bool commit();  // false on failure (the transaction is then rolled back)
    // Why BEGIN or COMMIT failed, as SQLite said at the time.
    const SqliteError& failure() const { return failure_; }

private:
    sqlite3* db_;
    SqliteError failure_;
    bool begun_ = false;
    bool done_ = false;
};

}  // namespace tl::store
