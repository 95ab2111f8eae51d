// ProjectFile: a .tledger project file, a SQLite database with this project's own
// schema (see schema.h for the tables, the application id and the schema versions).
//
// Safety (SQLite "defensive" use): foreign keys ON, SQLITE_DBCONFIG_DEFENSIVE,
// trusted_schema OFF, no extension loading, triggers and views disabled (the schema
// has none, so SQL planted in a file never runs), bound parameters only, WAL journal
// with synchronous FULL, busy timeout; read-only opens also set query_only. A file is
// identified by its header bytes before SQLite touches it, and checked with
// PRAGMA quick_check before use. Every save is ONE transaction, so a crash leaves the previous state or
// the new one, never a mix. A file of an older schema is migrated on a read-write
// open (in one transaction); a newer schema opens read-only with the reason; anything
// that is not a Trophic Ledger project is refused and left untouched.
//
// Nothing here throws: every failure is a Problem whose location names the file
// (Problem::describe() puts it first), with code "store-..." (e.g. store-not-project,
// store-foreign-database, store-damaged, store-newer-version, store-busy,
// store-read-only, store-duplicate-name, store-invalid-fraction).
#pragma once

#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/model/problem.h"
#include "core/store/project.h"

struct sqlite3;

namespace tl {

class ProjectFile;

enum class OpenMode { ReadWrite, ReadOnly };

struct ProjectOpenResult {
    std::unique_ptr<ProjectFile> file;  // null when the file could not be opened
    Problems problems;                  // why not, or warnings (e.g. opened read-only)
    bool readOnly = false;
    std::string readOnlyReason;         // e.g. "made by a newer version of Trophic Ledger (schema 3; ...)"
};

template <typename T>
struct StoreResult {
    std::optional<T> value;  // empty on error
    Problems problems;
};

struct ScenarioSummary {
    std::string name, description, parent, created;
    std::size_t compartments = 0;
};

class ProjectFile {
public:
    // Creates a new project file (refuses to overwrite an existing path) holding
    // `project` (may have no scenarios; its stored runs keep their ids), and returns it
    // open read-write. To save into an existing project, open it and call save():
    // one transaction in place, safe while other windows or programs read the file.
    static ProjectOpenResult create(const std::filesystem::path& path, const Project& project);
    static ProjectOpenResult open(const std::filesystem::path& path, OpenMode mode = OpenMode::ReadWrite);

    ~ProjectFile();
    ProjectFile(const ProjectFile&) = delete;
    ProjectFile& operator=(const ProjectFile&) = delete;

    const std::filesystem::path& path() const { return path_; }
    bool readOnly() const { return readOnly_; }
    const std::string& readOnlyReason() const { return readOnlyReason_; }
    int schemaVersion() const { return schemaVersion_; }  // of the file as opened (after migration)

    // --- reading ----------------------------------------------------------------
    StoreResult<Project> load();                                  // everything
    StoreResult<std::vector<ScenarioSummary>> listScenarios();
    StoreResult<Scenario> loadScenario(const std::string& name);  // units/rules from the project

    // --- writing (each call one transaction: all of it or nothing) ---------------
    // Replaces the whole content: info and scenarios (those not in `project` are
    // deleted, in the order of `project`). Runs with id 0 in `project.runs` are
    // inserted; runs already in the file are kept (remove them with deleteRun).
    Problems save(const Project& project);
    // Inserts the scenario or replaces the one of the same name, as a whole.
    Problems saveScenario(const Scenario& scenario);

    // Adds a scenario (tledger import). The name is trimmed first; an empty name or one
    // the project has is refused. Duplicating, renaming and deleting scenarios are
    // edits of the whole project: save() writes them in one transaction.
    Problems createScenario(const Scenario& scenario);

    // Stored runs.
    StoreResult<std::int64_t> addRun(const StoredRun& run);  // returns the new id
    StoreResult<std::vector<StoredRun>> listRuns();
    Problems deleteRun(std::int64_t id);

    // How long a write waits for another process holding the file before it fails
    // with a "busy" Problem (default 5000 ms).
    void setBusyTimeout(int milliseconds);

private:
    ProjectFile(std::filesystem::path path, sqlite3* db, bool readOnly, std::string reason, int version);
    friend struct ProjectFileAccess;

    std::filesystem::path path_;
    sqlite3* db_ = nullptr;
    bool readOnly_ = false;
    std::string readOnlyReason_;
    int schemaVersion_ = 0;
};

// Reading a model from a path (a CSV folder or a project, with a scenario name) is
// core/store/model_source.h; saving a project to a path is core/store/project_save.h.

}  // namespace tl
