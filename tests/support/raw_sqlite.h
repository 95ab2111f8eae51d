#pragma once
// Plain-SQLite access to a project file, as another program would touch it: for tests
// that plant rows or damage a file outside the store. Link SQLite::SQLite3.

#include <gtest/gtest.h>
#include <sqlite3.h>

#include <filesystem>
#include <string>

namespace tl::testing {

// Runs SQL on `file` with plain SQLite; fails the calling test when SQLite refuses it.
inline void rawExec(const std::filesystem::path& file, const std::string& sql)
{
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(file.c_str(), &db), SQLITE_OK);
    char* error = nullptr;
    const int rc = sqlite3_exec(db, sql.c_str(), nullptr, nullptr, &error);
    const std::string message = error ? error : "";
    sqlite3_free(error);
    sqlite3_close(db);
    ASSERT_EQ(rc, SQLITE_OK) << message;
}

}  // namespace tl::testing
