#include "core/store/project_file.h"

#include <set>

#include "core/model/problem_codes.h"
#include "core/store/project_file_detail.h"
#include "core/store/schema.h"
#include "core/store/sqlite_statement.h"

namespace tl {
namespace fs = std::filesystem;
using store::execute;
using store::Statement;
using store::Transaction;
using namespace store::detail;

StoreResult<Project> ProjectFile::load()
{
    StoreResult<Project> result;
    if (const auto error = execute(db_, "BEGIN")) {  // one read snapshot for the whole project
        result.problems.push_back(readFailure(path_, store::SqliteError::of(db_), "cannot be read"));
        return result;
    }
    const auto info = readInfo(db_, schemaVersion_);
    if (!info) {
        result.problems.push_back(fileProblem(path_, code::kStoreDamaged, "the project information is missing"));
        execute(db_, "ROLLBACK");
        return result;
    }
    Project project;
    project.info = *info;
    std::vector<std::int64_t> ids;
    {
        Statement st(db_, "SELECT id FROM scenario ORDER BY position, id");
        while (st.step()) ids.push_back(st.integer(0));
        if (st.failed()) result.problems.push_back(fileProblem(path_, code::kStoreReadFailed, sqliteError(db_)));
    }
    for (std::int64_t id : ids)
        if (auto s = readScenario(db_, path_, schemaVersion_, id, project.info, result.problems))
            project.scenarios.push_back(std::move(*s));
    execute(db_, "ROLLBACK");
    if (hasErrors(result.problems)) return result;
    auto runs = listRuns();
    result.problems.insert(result.problems.end(), runs.problems.begin(), runs.problems.end());
    if (hasErrors(result.problems)) return result;
    project.runs = std::move(*runs.value);
    result.value = std::move(project);
    return result;
}

StoreResult<std::vector<ScenarioSummary>> ProjectFile::listScenarios()
{
    StoreResult<std::vector<ScenarioSummary>> result;
    Statement st(db_, "SELECT s.name, s.description, s.parent, s.created, "
                      "(SELECT count(*) FROM compartment c WHERE c.scenario_id = s.id) FROM scenario s ORDER BY s.position, s.id");
    std::vector<ScenarioSummary> list;
    while (st.step())
        list.push_back({st.text(0), st.text(1), st.text(2), st.text(3), static_cast<std::size_t>(st.integer(4))});
    if (st.failed()) {
        result.problems.push_back(fileProblem(path_, code::kStoreReadFailed, "the scenarios cannot be listed: " + sqliteError(db_)));
        return result;
    }
    result.value = std::move(list);
    return result;
}

StoreResult<Scenario> ProjectFile::loadScenario(const std::string& name)
{
    StoreResult<Scenario> result;
    if (const auto error = execute(db_, "BEGIN")) {
        result.problems.push_back(readFailure(path_, store::SqliteError::of(db_), "cannot be read"));
        return result;
    }
    const auto info = readInfo(db_, schemaVersion_);
    const auto id = scenarioId(db_, trimmed(name));
    if (!info) result.problems.push_back(fileProblem(path_, code::kStoreDamaged, "the project information is missing"));
    else if (!id)
        result.problems.push_back(fileProblem(path_, code::kStoreUnknownScenario, "has no scenario named '" + name + "'"));
    else
        result.value = readScenario(db_, path_, schemaVersion_, *id, *info, result.problems);
    execute(db_, "ROLLBACK");
    return result;
}

namespace {

// Runs `body` inside one write transaction; any failure rolls everything back.
template <typename Body>
Problems writeTransaction(sqlite3* db, const fs::path& path, bool readOnly, const std::string& reason,
                          const std::string& what, Body&& body)
{
    if (readOnly)
        return {fileProblem(path, code::kStoreReadOnly,
                            what + " refused: the project was opened read-only (" + reason + "); nothing was changed",
                            "Use Save As to keep the changes in a copy.")};
    Transaction tx(db);
    if (!tx.begun()) return {writeFailure(path, tx.failure(), what)};
    Problems problems;
    if (!body(problems)) {
        if (problems.empty()) problems.push_back(writeFailure(path, db, what));
        return problems;  // the guard rolls back
    }
    if (!tx.commit()) return {writeFailure(path, tx.failure(), what)};
    return problems;
}

}  // namespace

Problems ProjectFile::save(const Project& project)
{
    Problems problems;
    std::set<std::string> names;
    for (const Scenario& s : project.scenarios) {
        checkScenarioWritable(path_, s, problems);
        if (!names.insert(trimmed(s.name)).second)
            problems.push_back(fileProblem(path_, code::kStoreDuplicateName, "two scenarios are named '" + trimmed(s.name) + "'"));
    }
    if (hasErrors(problems)) return problems;
    return writeTransaction(db_, path_, readOnly_, readOnlyReason_, "saving the project", [&](Problems&) {
        if (!writeInfo(db_, project.info)) return false;
        std::vector<std::string> stale;
        {
            Statement st(db_, "SELECT name FROM scenario");
            while (st.step())
                if (!names.count(st.text(0))) stale.push_back(st.text(0));
            if (st.failed()) return false;
        }
        for (std::size_t i = 0; i < project.scenarios.size(); ++i)
            if (!writeScenario(db_, schemaVersion_, project.scenarios[i], static_cast<std::int64_t>(i))) return false;
        // A run already in the file follows its scenario to the name the project gives it
        // (a renamed scenario is a new row here), before the stale rows and, by cascade,
        // their runs go.
        if (schemaVersion_ >= 2) {
            Statement follow(db_, "UPDATE stored_run SET scenario_id = (SELECT id FROM scenario WHERE name = ?2) "
                                  "WHERE id = ?1 AND EXISTS (SELECT 1 FROM scenario WHERE name = ?2)");
            for (const StoredRun& run : project.runs) {
                if (run.id == 0 || run.scenario.empty()) continue;
                follow.reset();
                if (!follow.bind(1, run.id).bind(2, run.scenario).run()) return false;
            }
        }
        Statement del(db_, "DELETE FROM scenario WHERE name = ?1");
        for (const std::string& name : stale) {
            del.reset();
            if (!del.bind(1, name).run()) return false;
        }
        if (!insertRuns(db_, schemaVersion_, project.runs, false)) return false;
        return true;
    });
}

Problems ProjectFile::saveScenario(const Scenario& scenario)
{
    Problems problems;
    checkScenarioWritable(path_, scenario, problems);
    if (hasErrors(problems)) return problems;
    return writeTransaction(db_, path_, readOnly_, readOnlyReason_, "saving scenario '" + trimmed(scenario.name) + "'",
                            [&](Problems&) { return writeScenario(db_, schemaVersion_, scenario, std::nullopt); });
}

Problems ProjectFile::createScenario(const Scenario& scenario)
{
    Problems problems;
    checkScenarioWritable(path_, scenario, problems);
    if (hasErrors(problems)) return problems;
    const std::string name = trimmed(scenario.name);
    return writeTransaction(db_, path_, readOnly_, readOnlyReason_, "creating scenario '" + name + "'", [&](Problems& out) {
        if (scenarioId(db_, name)) {
            out.push_back(fileProblem(path_, code::kStoreDuplicateName, "already has a scenario named '" + name + "'",
                                      "Choose another name."));
            return false;
        }
        return writeScenario(db_, schemaVersion_, scenario, std::nullopt);
    });
}

StoreResult<std::int64_t> ProjectFile::addRun(const StoredRun& run)
{
    StoreResult<std::int64_t> result;
    if (run.kind.empty()) {
        result.problems.push_back(fileProblem(path_, code::kStoreInvalidName, "a stored run needs a kind (it is empty)"));
        return result;
    }
    std::int64_t id = 0;
    result.problems = writeTransaction(db_, path_, readOnly_, readOnlyReason_, "storing a " + run.kind + " run",
                                       [&](Problems& out) {
                                           std::optional<std::int64_t> sid;
                                           if (!run.scenario.empty()) {
                                               sid = scenarioId(db_, run.scenario);
                                               if (!sid) {
                                                   out.push_back(fileProblem(path_, code::kStoreUnknownScenario,
                                                                             "has no scenario named '" + run.scenario + "'"));
                                                   return false;
                                               }
                                           }
                                           Statement ins(db_, "INSERT INTO stored_run (scenario_id, kind, settings_json, "
                                                              "summary_json, created) VALUES (?1, ?2, ?3, ?4, ?5)");
                                           if (sid) ins.bind(1, *sid);
                                           else ins.bindNull(1);
                                           ins.bind(2, run.kind).bind(3, run.settingsJson).bind(4, run.summaryJson);
                                           ins.bind(5, run.created.empty() ? utcNowIso8601() : run.created);
                                           if (!ins.run()) return false;
                                           id = sqlite3_last_insert_rowid(db_);
                                           return true;
                                       });
    if (!hasErrors(result.problems)) result.value = id;
    return result;
}

StoreResult<std::vector<StoredRun>> ProjectFile::listRuns()
{
    StoreResult<std::vector<StoredRun>> result;
    std::vector<StoredRun> runs;
    if (schemaVersion_ < 2) {  // version 1 files have no stored runs
        result.value = std::move(runs);
        return result;
    }
    Statement st(db_, "SELECT r.id, coalesce(s.name, ''), r.kind, r.settings_json, r.summary_json, r.created "
                      "FROM stored_run r LEFT JOIN scenario s ON s.id = r.scenario_id ORDER BY r.id");
    while (st.step()) runs.push_back({st.integer(0), st.text(1), st.text(2), st.text(3), st.text(4), st.text(5)});
    if (st.failed()) {
        result.problems.push_back(fileProblem(path_, code::kStoreReadFailed, "the stored runs cannot be read: " + sqliteError(db_)));
        return result;
    }
    result.value = std::move(runs);
    return result;
}

Problems ProjectFile::deleteRun(std::int64_t id)
{
    return writeTransaction(db_, path_, readOnly_, readOnlyReason_, "deleting a stored run", [&](Problems& out) {
        Statement del(db_, "DELETE FROM stored_run WHERE id = ?1");
        if (!del.bind(1, id).run()) return false;
        if (sqlite3_changes(db_) == 0) {
            out.push_back(fileProblem(path_, code::kStoreUnknownRun, "has no stored run number " + std::to_string(id)));
            return false;
        }
        return true;
    });
}

}  // namespace tl
