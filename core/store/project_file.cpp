#include "core/store/project_file.h"

#include <sqlite3.h>
#include <unistd.h>

#include <cmath>
#include <cstdio>
#include <fstream>
#include <map>
#include <random>
#include <set>
#include <system_error>
#include <unordered_map>

#include "core/model/text.h"
#include "core/store/schema.h"
#include "core/store/sqlite_statement.h"

#ifndef TL_PROGRAM_VERSION
#define TL_PROGRAM_VERSION "unknown"
#endif

namespace tl {
namespace fs = std::filesystem;
using store::execute;
using store::Statement;
using store::Transaction;

namespace {

constexpr int kDefaultBusyTimeoutMs = 5000;

Problem fileProblem(const fs::path& file, std::string code, std::string message, std::string hint = {})
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

std::string hex32(std::uint32_t v)
{
    char text[16];
    std::snprintf(text, sizeof text, "0x%08X", v);
    return text;
}

std::uint32_t bigEndian32(const unsigned char* p)
{
    return (std::uint32_t(p[0]) << 24) | (std::uint32_t(p[1]) << 16) | (std::uint32_t(p[2]) << 8) | std::uint32_t(p[3]);
}

// Checks the 100-byte SQLite header without letting SQLite near the file, so that a
// file of another kind is refused before anything could write to it.
std::optional<Problem> checkHeader(const fs::path& path)
{
    std::error_code ec;
    const auto status = fs::status(path, ec);
    if (ec || !fs::exists(status))
        return fileProblem(path, "store-not-found", "no such project file");
    if (!fs::is_regular_file(status))
        return fileProblem(path, "store-not-project", "not a Trophic Ledger project: it is not a regular file");
    std::ifstream in(path, std::ios::binary);
    if (!in) return fileProblem(path, "store-unreadable", "cannot be read (permission denied?)");
    unsigned char header[100] = {};
    in.read(reinterpret_cast<char*>(header), sizeof header);
    const std::streamsize got = in.gcount();
    if (got == 0) return fileProblem(path, "store-not-project", "not a Trophic Ledger project: the file is empty");
    static constexpr char kMagic[] = "SQLite format 3";  // 16 bytes with the terminating NUL
    if (got < 100 || std::char_traits<char>::compare(reinterpret_cast<const char*>(header), kMagic, 16) != 0) {
        if (got >= 16 && std::char_traits<char>::compare(reinterpret_cast<const char*>(header), kMagic, 16) == 0)
            return fileProblem(path, "store-damaged", "damaged: the file is cut short (shorter than its own header)",
                               "The file was left unchanged; restore it from a backup.");
        return fileProblem(path, "store-not-project", "not a Trophic Ledger project: it is not a SQLite database");
    }
    const std::uint32_t appId = bigEndian32(header + 68);
    if (appId != static_cast<std::uint32_t>(store::kApplicationId)) {
        return fileProblem(path, "store-foreign-database",
                           appId == 0 ? "not a Trophic Ledger project: a SQLite database of another program "
                                        "(it carries no Trophic Ledger application id); it was left unchanged"
                                      : "not a Trophic Ledger project: a SQLite database of another program "
                                        "(application id " + hex32(appId) + "); it was left unchanged");
    }
    // Truncation: the page count in the header (valid when the "version valid for"
    // number equals the change counter) must fit in the file. Skipped while a WAL
    // holds pages that a checkpoint has not yet copied back.
    const std::uint32_t pageSizeField = (std::uint32_t(header[16]) << 8) | header[17];
    const std::uint64_t pageSize = pageSizeField == 1 ? 65536u : pageSizeField;
    const std::uint32_t pages = bigEndian32(header + 28);
    const bool pagesValid = bigEndian32(header + 92) == bigEndian32(header + 24) && pages > 0;
    fs::path wal = path;
    wal += "-wal";
    const bool walHasContent = fs::exists(wal, ec) && fs::file_size(wal, ec) > 0;
    const auto size = fs::file_size(path, ec);
    if (!ec && pagesValid && !walHasContent && pageSize > 0 && size < pageSize * pages)
        return fileProblem(path, "store-damaged",
                           "damaged: the file is cut short (" + std::to_string(size) + " bytes of " +
                               std::to_string(pageSize * pages) + ")",
                           "The file was left unchanged; restore it from a backup.");
    return std::nullopt;
}

std::optional<std::int64_t> pragmaInt(sqlite3* db, const char* sql)
{
    Statement st(db, sql);
    if (!st.step()) return std::nullopt;
    return st.integer(0);
}

// --- validation before a write: a save either fits the schema or is refused whole ---

bool fraction(double v) { return std::isfinite(v) && v >= 0.0 && v <= 1.0; }

std::string trimmed(const std::string& s) { return std::string(trim(s)); }

void checkScenarioWritable(const fs::path& file, const Scenario& s, Problems& out)
{
    const std::string name = trimmed(s.name);
    if (name.empty()) {
        out.push_back(fileProblem(file, "store-invalid-name", "a scenario needs a name (it is empty)"));
        return;
    }
    const Model& m = s.model;
    const std::string in = " in scenario '" + name + "'";
    std::set<std::string> seen;
    for (std::size_t i = 0; i < m.size(); ++i) {
        const Compartment& c = m.compartment(i);
        if (c.name.empty())
            out.push_back(fileProblem(file, "store-invalid-name",
                                      "compartment " + std::to_string(i + 1) + in + " has no name"));
        else if (!seen.insert(c.name).second)
            out.push_back(fileProblem(file, "store-duplicate-name", "two compartments are named '" + c.name + "'" + in));
        for (Param p : kAllParams) {
            const auto& v = c.value(p);
            if (v && !std::isfinite(*v)) {
                Problem pr = fileProblem(file, "store-invalid-value",
                                         std::string(paramSymbol(p)) + " of '" + c.name + "'" + in + " is not a finite number");
                pr.compartment = c.name;
                pr.parameter = std::string(paramKey(p));
                out.push_back(pr);
            }
            const auto& cv = c.confidenceOf(p).cv;
            if (cv && !(std::isfinite(*cv) && *cv >= 0.0)) {
                Problem pr = fileProblem(file, "store-invalid-value",
                                         "the CV of " + std::string(paramSymbol(p)) + " of '" + c.name + "'" + in +
                                             " must be a number of at least 0");
                pr.compartment = c.name;
                pr.parameter = std::string(paramKey(p));
                out.push_back(pr);
            }
        }
        auto badFraction = [&](const std::string& what, const std::string& parameter, const std::string& other) {
            Problem pr = fileProblem(file, "store-invalid-fraction", what + in + " must lie between 0 and 1");
            pr.compartment = c.name;
            pr.parameter = parameter;
            pr.prey = other;
            out.push_back(pr);
        };
        if (!fraction(m.dietImport(i))) badFraction("the import share of the diet of '" + c.name + "'", "diet", "import");
        // Both rows in step by column, so the findings come in the order of a cell-by-cell scan.
        const auto diet = m.dietRow(i), routing = m.routingRow(i);
        for (std::size_t d = 0, r = 0; d < diet.size() || r < routing.size();) {
            const std::size_t j = std::min(d < diet.size() ? diet[d].col : m.size(), r < routing.size() ? routing[r].col : m.size());
            if (d < diet.size() && diet[d].col == j && !fraction(diet[d++].value))
                badFraction("the share of '" + m.compartment(j).name + "' in the diet of '" + c.name + "'", "diet",
                            m.compartment(j).name);
            if (r < routing.size() && routing[r].col == j && !fraction(routing[r++].value))
                badFraction("the share of '" + c.name + "' routed to '" + m.compartment(j).name + "'", "routing",
                            m.compartment(j).name);
        }
    }
    std::set<std::string> fleetNames;
    for (const Fleet& f : m.fleets()) {
        if (f.name.empty()) out.push_back(fileProblem(file, "store-invalid-name", "a fleet" + in + " has no name"));
        else if (!fleetNames.insert(f.name).second)
            out.push_back(fileProblem(file, "store-duplicate-name", "two fleets are named '" + f.name + "'" + in));
        for (std::size_t i = 0; i < m.size(); ++i) {
            const double landed = i < f.landings.size() ? f.landings[i] : 0.0;
            const double discarded = i < f.discards.size() ? f.discards[i] : 0.0;
            const double survival = i < f.discardSurvival.size() ? f.discardSurvival[i] : 0.0;
            if (!std::isfinite(landed) || !std::isfinite(discarded) || !fraction(survival)) {
                Problem pr = fileProblem(file, "store-invalid-value",
                                         "the catch of '" + m.compartment(i).name + "' by fleet '" + f.name + "'" + in +
                                             " needs finite landings and discards and a discard survival between 0 and 1");
                pr.compartment = m.compartment(i).name;
                pr.fleet = f.name;
                out.push_back(pr);
            }
        }
    }
    for (const auto& [compartment, pos] : s.layout)
        if (!std::isfinite(pos.x) || !std::isfinite(pos.y))
            out.push_back(fileProblem(file, "store-invalid-value",
                                      "the flow-map position of '" + compartment + "'" + in + " is not finite"));
}

bool writeInfo(sqlite3* db, const ProjectInfo& info)
{
    Statement st(db, R"sql(
INSERT INTO project_info (id, title, notes, created, modified, program_version, currency, area, time_unit,
                          ee_max, pq_min, pq_max, diet_sum_tolerance, cv_grade_a, cv_grade_b, cv_grade_c, cv_grade_d)
VALUES (1, ?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12, ?13, ?14, ?15, ?16)
ON CONFLICT (id) DO UPDATE SET title = ?1, notes = ?2, created = ?3, modified = ?4, program_version = ?5,
  currency = ?6, area = ?7, time_unit = ?8, ee_max = ?9, pq_min = ?10, pq_max = ?11, diet_sum_tolerance = ?12,
  cv_grade_a = ?13, cv_grade_b = ?14, cv_grade_c = ?15, cv_grade_d = ?16)sql");
    const std::string now = utcNowIso8601();
    st.bind(1, info.title).bind(2, info.notes).bind(3, info.created.empty() ? now : info.created).bind(4, now);
    st.bind(5, std::string_view(TL_PROGRAM_VERSION));
    st.bind(6, info.units.currency).bind(7, info.units.area).bind(8, info.units.time);
    st.bind(9, info.rules.eeMax).bind(10, info.rules.pqMin).bind(11, info.rules.pqMax);
    st.bind(12, info.rules.dietSumTolerance);
    for (int g = 0; g < 4; ++g) st.bind(13 + g, info.rules.cvByGrade[static_cast<std::size_t>(g)]);
    return st.run();
}

std::optional<std::int64_t> scenarioId(sqlite3* db, const std::string& name)
{
    Statement st(db, "SELECT id FROM scenario WHERE name = ?1");
    st.bind(1, name);
    if (!st.step()) return std::nullopt;
    return st.integer(0);
}

// Writes one scenario inside the caller's transaction, replacing any of the same name.
bool writeScenario(sqlite3* db, int version, const Scenario& s, std::optional<std::int64_t> position)
{
    const std::string name = trimmed(s.name);
    std::int64_t id = 0;
    if (const auto existing = scenarioId(db, name)) {
        id = *existing;
        // Children first: fleets (and their harvest), compartments (and their parameter
        // values, diet and routing rows), layout.
        Statement delFleets(db, "DELETE FROM fleet WHERE scenario_id = ?1");
        Statement delCompartments(db, "DELETE FROM compartment WHERE scenario_id = ?1");
        if (!delFleets.bind(1, id).run() || !delCompartments.bind(1, id).run()) return false;
        if (version >= 2) {
            Statement delLayout(db, "DELETE FROM layout_position WHERE scenario_id = ?1");
            if (!delLayout.bind(1, id).run()) return false;
        }
        Statement up(db, "UPDATE scenario SET description = ?2, parent = ?3, created = coalesce(nullif(?4, ''), created),"
                         " position = coalesce(?5, position) WHERE id = ?1");
        up.bind(1, id).bind(2, s.description).bind(3, s.parent).bind(4, s.created);
        if (position) up.bind(5, *position);
        else up.bindNull(5);
        if (!up.run()) return false;
    } else {
        Statement ins(db, "INSERT INTO scenario (name, position, description, parent, created) VALUES "
                          "(?1, coalesce(?2, (SELECT coalesce(max(position), -1) + 1 FROM scenario)), ?3, ?4, ?5)");
        ins.bind(1, name).bind(3, s.description).bind(4, s.parent).bind(5, s.created.empty() ? utcNowIso8601() : s.created);
        if (position) ins.bind(2, *position);
        else ins.bindNull(2);
        if (!ins.run()) return false;
        id = sqlite3_last_insert_rowid(db);
    }

    const Model& m = s.model;
    std::vector<std::int64_t> ids(m.size());
    Statement insC(db, "INSERT INTO compartment (scenario_id, position, name, kind, diet_import) VALUES (?1, ?2, ?3, ?4, ?5)");
    Statement insV(db, "INSERT INTO parameter_value (compartment_id, parameter, value, grade, cv, source) "
                       "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
    for (std::size_t i = 0; i < m.size(); ++i) {
        const Compartment& c = m.compartment(i);
        insC.reset();
        insC.bind(1, id).bind(2, static_cast<std::int64_t>(i)).bind(3, c.name).bind(4, kindKey(c.kind)).bind(5, m.dietImport(i));
        if (!insC.run()) return false;
        ids[i] = sqlite3_last_insert_rowid(db);
        for (Param p : kAllParams) {
            const Confidence& conf = c.confidenceOf(p);
            if (!c.value(p) && conf == Confidence{}) continue;  // nothing to keep
            insV.reset();
            insV.bind(1, ids[i]).bind(2, paramKey(p)).bind(3, c.value(p)).bind(4, gradeKey(conf.grade)).bind(5, conf.cv);
            insV.bind(6, conf.source);
            if (!insV.run()) return false;
        }
    }
    Statement insD(db, "INSERT INTO diet (predator_id, prey_id, fraction) VALUES (?1, ?2, ?3)");
    Statement insR(db, "INSERT INTO routing (source_id, pool_id, fraction) VALUES (?1, ?2, ?3)");
    for (std::size_t i = 0; i < m.size(); ++i) {
        for (const auto& [j, fraction] : m.dietRow(i)) {
            insD.reset();
            if (!insD.bind(1, ids[i]).bind(2, ids[j]).bind(3, fraction).run()) return false;
        }
        for (const auto& [j, fraction] : m.routingRow(i)) {
            insR.reset();
            if (!insR.bind(1, ids[i]).bind(2, ids[j]).bind(3, fraction).run()) return false;
        }
    }
    Statement insF(db, "INSERT INTO fleet (scenario_id, position, name, discard_pool_id) VALUES (?1, ?2, ?3, ?4)");
    Statement insH(db, "INSERT INTO harvest (fleet_id, compartment_id, landings, discards, discard_survival) "
                       "VALUES (?1, ?2, ?3, ?4, ?5)");
    for (std::size_t f = 0; f < m.fleets().size(); ++f) {
        const Fleet& fleet = m.fleet(f);
        insF.reset();
        insF.bind(1, id).bind(2, static_cast<std::int64_t>(f)).bind(3, fleet.name);
        if (fleet.discardPool && *fleet.discardPool < ids.size()) insF.bind(4, ids[*fleet.discardPool]);
        else insF.bindNull(4);
        if (!insF.run()) return false;
        const std::int64_t fleetId = sqlite3_last_insert_rowid(db);
        for (std::size_t i = 0; i < m.size(); ++i) {
            const double landed = i < fleet.landings.size() ? fleet.landings[i] : 0.0;
            const double discarded = i < fleet.discards.size() ? fleet.discards[i] : 0.0;
            const double survival = i < fleet.discardSurvival.size() ? fleet.discardSurvival[i] : 0.0;
            if (landed == 0.0 && discarded == 0.0 && survival == 0.0) continue;
            insH.reset();
            if (!insH.bind(1, fleetId).bind(2, ids[i]).bind(3, landed).bind(4, discarded).bind(5, survival).run())
                return false;
        }
    }
    if (version >= 2) {
        Statement insL(db, "INSERT INTO layout_position (scenario_id, compartment_name, x, y) VALUES (?1, ?2, ?3, ?4)");
        for (const auto& [compartment, pos] : s.layout) {
            insL.reset();
            if (!insL.bind(1, id).bind(2, compartment).bind(3, pos.x).bind(4, pos.y).run()) return false;
        }
    }
    return true;
}

// Inserts runs inside the caller's transaction: those not yet in the file (id 0), or,
// for a new file, all of them with the ids they carry.
bool insertRuns(sqlite3* db, int version, const std::vector<StoredRun>& runs, bool keepIds)
{
    if (version < 2) return true;
    Statement ins(db, "INSERT INTO stored_run (id, scenario_id, kind, settings_json, summary_json, created) VALUES "
                      "(?6, (SELECT id FROM scenario WHERE name = ?1), ?2, ?3, ?4, ?5)");
    for (const StoredRun& run : runs) {
        if (run.id != 0 && !keepIds) continue;
        ins.reset();
        ins.bind(1, run.scenario).bind(2, run.kind).bind(3, run.settingsJson).bind(4, run.summaryJson);
        ins.bind(5, run.created.empty() ? utcNowIso8601() : run.created);
        if (run.id != 0) ins.bind(6, run.id);
        else ins.bindNull(6);
        if (!ins.run()) return false;
    }
    return true;
}

std::optional<ProjectInfo> readInfo(sqlite3* db)
{
    Statement st(db, "SELECT title, notes, created, modified, program_version, currency, area, time_unit, ee_max, pq_min,"
                     " pq_max, diet_sum_tolerance, cv_grade_a, cv_grade_b, cv_grade_c, cv_grade_d FROM project_info WHERE id = 1");
    if (!st.step()) return std::nullopt;
    ProjectInfo info;
    info.title = st.text(0);
    info.notes = st.text(1);
    info.created = st.text(2);
    info.modified = st.text(3);
    info.programVersion = st.text(4);
    info.units.currency = st.text(5);
    info.units.area = st.text(6);
    info.units.time = st.text(7);
    info.rules.eeMax = st.real(8);
    info.rules.pqMin = st.real(9);
    info.rules.pqMax = st.real(10);
    info.rules.dietSumTolerance = st.real(11);
    for (int g = 0; g < 4; ++g) info.rules.cvByGrade[static_cast<std::size_t>(g)] = st.real(12 + g);
    return info;
}

// Reads one scenario by id. Content the program cannot interpret (an unknown kind,
// a reference to another scenario's compartment) is reported, never guessed.
std::optional<Scenario> readScenario(sqlite3* db, const fs::path& file, int version, std::int64_t id,
                                     const ProjectInfo& info, Problems& problems)
{
    Statement head(db, "SELECT name, description, parent, created FROM scenario WHERE id = ?1");
    if (!head.bind(1, id).step()) return std::nullopt;
    Scenario s;
    s.name = head.text(0);
    s.description = head.text(1);
    s.parent = head.text(2);
    s.created = head.text(3);
    s.model.units = info.units;
    s.model.rules = info.rules;
    const std::size_t before = problems.size();
    auto damaged = [&](const std::string& what) {
        problems.push_back(fileProblem(file, "store-damaged", "scenario '" + s.name + "': " + what,
                                       "The file was left unchanged; it may have been edited by another program."));
    };

    std::unordered_map<std::int64_t, std::size_t> index;  // row id -> compartment index
    Statement comps(db, "SELECT id, name, kind, diet_import FROM compartment WHERE scenario_id = ?1 ORDER BY position");
    comps.bind(1, id);
    std::vector<std::pair<std::int64_t, double>> imports;
    while (comps.step()) {
        Compartment c;
        c.name = comps.text(1);
        const auto kind = parseKind(comps.text(2));
        if (!kind) {
            damaged("compartment '" + c.name + "' has an unknown kind '" + comps.text(2) + "'");
            continue;
        }
        c.kind = *kind;
        index[comps.integer(0)] = s.model.addCompartment(std::move(c));
        imports.emplace_back(comps.integer(0), comps.real(3));
    }
    if (comps.failed()) damaged(sqliteError(db));
    for (const auto& [cid, share] : imports) s.model.setDietImport(index[cid], share);

    Statement vals(db, "SELECT v.compartment_id, v.parameter, v.value, v.grade, v.cv, v.source FROM parameter_value v "
                       "JOIN compartment c ON c.id = v.compartment_id WHERE c.scenario_id = ?1");
    vals.bind(1, id);
    while (vals.step()) {
        const auto it = index.find(vals.integer(0));
        const auto param = parseParamKey(vals.text(1));
        const auto grade = parseGrade(vals.text(3));
        if (it == index.end() || !param || !grade) {
            damaged("a parameter row ('" + vals.text(1) + "') cannot be read");
            continue;
        }
        Compartment& c = s.model.compartment(it->second);
        c.value(*param) = vals.optionalReal(2);
        c.confidenceOf(*param) = Confidence{*grade, vals.optionalReal(4), vals.text(5)};
    }
    if (vals.failed()) damaged(sqliteError(db));

    auto readPairs = [&](const char* sql, const char* what, auto&& apply) {
        Statement st(db, sql);
        st.bind(1, id);
        while (st.step()) {
            const auto a = index.find(st.integer(0));
            const auto b = index.find(st.integer(1));
            if (a == index.end() || b == index.end()) {
                damaged(std::string("a ") + what + " row refers to a compartment of another scenario");
                continue;
            }
            apply(a->second, b->second, st.real(2));
        }
        if (st.failed()) damaged(sqliteError(db));
    };
    readPairs("SELECT d.predator_id, d.prey_id, d.fraction FROM diet d JOIN compartment c ON c.id = d.predator_id "
              "WHERE c.scenario_id = ?1",
              "diet", [&](std::size_t pred, std::size_t prey, double v) { s.model.setDiet(pred, prey, v); });
    readPairs("SELECT r.source_id, r.pool_id, r.fraction FROM routing r JOIN compartment c ON c.id = r.source_id "
              "WHERE c.scenario_id = ?1",
              "routing", [&](std::size_t src, std::size_t pool, double v) { s.model.setRouting(src, pool, v); });

    std::map<std::int64_t, std::size_t> fleetIndex;
    Statement fleets(db, "SELECT id, name, discard_pool_id FROM fleet WHERE scenario_id = ?1 ORDER BY position");
    fleets.bind(1, id);
    while (fleets.step()) {
        const std::size_t f = s.model.addFleet(fleets.text(1));
        fleetIndex[fleets.integer(0)] = f;
        if (!fleets.isNull(2)) {
            const auto pool = index.find(fleets.integer(2));
            if (pool == index.end()) damaged("fleet '" + fleets.text(1) + "' sends discards to an unknown pool");
            else s.model.fleet(f).discardPool = pool->second;
        }
    }
    if (fleets.failed()) damaged(sqliteError(db));
    Statement harvest(db, "SELECT h.fleet_id, h.compartment_id, h.landings, h.discards, h.discard_survival FROM harvest h "
                          "JOIN fleet f ON f.id = h.fleet_id WHERE f.scenario_id = ?1");
    harvest.bind(1, id);
    while (harvest.step()) {
        const auto f = fleetIndex.find(harvest.integer(0));
        const auto c = index.find(harvest.integer(1));
        if (f == fleetIndex.end() || c == index.end()) {
            damaged("a harvest row refers to a compartment of another scenario");
            continue;
        }
        Fleet& fleet = s.model.fleet(f->second);
        fleet.landings[c->second] = harvest.real(2);
        fleet.discards[c->second] = harvest.real(3);
        fleet.discardSurvival[c->second] = harvest.real(4);
    }
    if (harvest.failed()) damaged(sqliteError(db));

    if (version >= 2) {
        Statement layout(db, "SELECT compartment_name, x, y FROM layout_position WHERE scenario_id = ?1");
        layout.bind(1, id);
        while (layout.step()) s.layout[layout.text(0)] = LayoutPosition{layout.real(1), layout.real(2)};
        if (layout.failed()) damaged(sqliteError(db));
    }
    if (problems.size() != before) return std::nullopt;
    return s;
}

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

    {
        Statement check(db, "PRAGMA quick_check");
        const bool stepped = check.step();
        if (!stepped || check.text(0) != "ok") {
            const std::string why = stepped ? check.text(0) : sqliteError(db);
            if (!stepped && isBusy(db)) {
                result.problems.push_back(fileProblem(path, "store-busy",
                                                      "is busy (another program holds it locked); try again in a moment"));
            } else {
                result.problems.push_back(fileProblem(path, "store-damaged", "damaged: " + why,
                                                      "The file was left unchanged; restore it from a backup."));
            }
            return refuse(db);
        }
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

}  // namespace

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
    std::random_device rd;
    fs::path temp = path;
    temp += ".creating-" + std::to_string(rd());
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

StoreResult<Project> ProjectFile::load()
{
    StoreResult<Project> result;
    execute(db_, "BEGIN");  // one read snapshot for the whole project
    const auto info = readInfo(db_);
    if (!info) {
        result.problems.push_back(fileProblem(path_, "store-damaged", "the project information is missing"));
        execute(db_, "ROLLBACK");
        return result;
    }
    Project project;
    project.info = *info;
    std::vector<std::int64_t> ids;
    {
        Statement st(db_, "SELECT id FROM scenario ORDER BY position, id");
        while (st.step()) ids.push_back(st.integer(0));
        if (st.failed()) result.problems.push_back(fileProblem(path_, "store-read-failed", sqliteError(db_)));
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
        result.problems.push_back(fileProblem(path_, "store-read-failed", "the scenarios cannot be listed: " + sqliteError(db_)));
        return result;
    }
    result.value = std::move(list);
    return result;
}

StoreResult<Scenario> ProjectFile::loadScenario(const std::string& name)
{
    StoreResult<Scenario> result;
    execute(db_, "BEGIN");
    const auto info = readInfo(db_);
    const auto id = scenarioId(db_, trimmed(name));
    if (!info) result.problems.push_back(fileProblem(path_, "store-damaged", "the project information is missing"));
    else if (!id)
        result.problems.push_back(fileProblem(path_, "store-unknown-scenario", "has no scenario named '" + name + "'"));
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
        return {fileProblem(path, "store-read-only", what + " refused: the project is " + reason)};
    Transaction tx(db);
    if (!tx.begun()) return {writeFailure(path, db, what)};
    Problems problems;
    if (!body(problems)) {
        if (problems.empty()) problems.push_back(writeFailure(path, db, what));
        return problems;  // the guard rolls back
    }
    if (!tx.commit()) return {writeFailure(path, db, what)};
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
            problems.push_back(fileProblem(path_, "store-duplicate-name", "two scenarios are named '" + trimmed(s.name) + "'"));
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
        Statement del(db_, "DELETE FROM scenario WHERE name = ?1");
        for (const std::string& name : stale) {
            del.reset();
            if (!del.bind(1, name).run()) return false;
        }
        for (std::size_t i = 0; i < project.scenarios.size(); ++i)
            if (!writeScenario(db_, schemaVersion_, project.scenarios[i], static_cast<std::int64_t>(i))) return false;
        if (!insertRuns(db_, schemaVersion_, project.runs, false)) return false;
        return true;
    });
}

Problems ProjectFile::saveInfo(const ProjectInfo& info)
{
    return writeTransaction(db_, path_, readOnly_, readOnlyReason_, "saving the project information",
                            [&](Problems&) { return writeInfo(db_, info); });
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
            out.push_back(fileProblem(path_, "store-duplicate-name", "already has a scenario named '" + name + "'",
                                      "Choose another name."));
            return false;
        }
        return writeScenario(db_, schemaVersion_, scenario, std::nullopt);
    });
}

Problems ProjectFile::duplicateScenario(const std::string& from, const std::string& to, const std::string& description)
{
    const std::string source = trimmed(from), target = trimmed(to);
    if (target.empty()) return {fileProblem(path_, "store-invalid-name", "a scenario needs a name (it is empty)")};
    return writeTransaction(db_, path_, readOnly_, readOnlyReason_, "duplicating scenario '" + source + "'",
                            [&](Problems& out) {
                                const auto id = scenarioId(db_, source);
                                const auto info = readInfo(db_);
                                if (!id || !info) {
                                    out.push_back(fileProblem(path_, "store-unknown-scenario",
                                                              "has no scenario named '" + source + "'"));
                                    return false;
                                }
                                if (scenarioId(db_, target)) {
                                    out.push_back(fileProblem(path_, "store-duplicate-name",
                                                              "already has a scenario named '" + target + "'",
                                                              "Choose another name."));
                                    return false;
                                }
                                auto copy = readScenario(db_, path_, schemaVersion_, *id, *info, out);
                                if (!copy) return false;
                                copy->name = target;
                                copy->parent = source;
                                copy->created = utcNowIso8601();
                                if (!description.empty()) copy->description = description;
                                return writeScenario(db_, schemaVersion_, *copy, std::nullopt);
                            });
}

Problems ProjectFile::renameScenario(const std::string& from, const std::string& to)
{
    const std::string source = trimmed(from), target = trimmed(to);
    if (target.empty()) return {fileProblem(path_, "store-invalid-name", "a scenario needs a name (it is empty)")};
    return writeTransaction(db_, path_, readOnly_, readOnlyReason_, "renaming scenario '" + source + "'",
                            [&](Problems& out) {
                                if (!scenarioId(db_, source)) {
                                    out.push_back(fileProblem(path_, "store-unknown-scenario",
                                                              "has no scenario named '" + source + "'"));
                                    return false;
                                }
                                if (source == target) return true;
                                if (scenarioId(db_, target)) {
                                    out.push_back(fileProblem(path_, "store-duplicate-name",
                                                              "already has a scenario named '" + target + "'",
                                                              "Choose another name."));
                                    return false;
                                }
                                Statement rename(db_, "UPDATE scenario SET name = ?2 WHERE name = ?1");
                                Statement children(db_, "UPDATE scenario SET parent = ?2 WHERE parent = ?1");
                                return rename.bind(1, source).bind(2, target).run() &&
                                       children.bind(1, source).bind(2, target).run();
                            });
}

Problems ProjectFile::deleteScenario(const std::string& name)
{
    const std::string target = trimmed(name);
    return writeTransaction(db_, path_, readOnly_, readOnlyReason_, "deleting scenario '" + target + "'",
                            [&](Problems& out) {
                                Statement del(db_, "DELETE FROM scenario WHERE name = ?1");
                                if (!del.bind(1, target).run()) return false;
                                if (sqlite3_changes(db_) == 0) {
                                    out.push_back(fileProblem(path_, "store-unknown-scenario",
                                                              "has no scenario named '" + target + "'"));
                                    return false;
                                }
                                return true;
                            });
}

StoreResult<std::int64_t> ProjectFile::addRun(const StoredRun& run)
{
    StoreResult<std::int64_t> result;
    if (run.kind.empty()) {
        result.problems.push_back(fileProblem(path_, "store-invalid-name", "a stored run needs a kind (it is empty)"));
        return result;
    }
    std::int64_t id = 0;
    result.problems = writeTransaction(db_, path_, readOnly_, readOnlyReason_, "storing a " + run.kind + " run",
                                       [&](Problems& out) {
                                           std::optional<std::int64_t> sid;
                                           if (!run.scenario.empty()) {
                                               sid = scenarioId(db_, run.scenario);
                                               if (!sid) {
                                                   out.push_back(fileProblem(path_, "store-unknown-scenario",
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
        result.problems.push_back(fileProblem(path_, "store-read-failed", "the stored runs cannot be read: " + sqliteError(db_)));
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
            out.push_back(fileProblem(path_, "store-unknown-run", "has no stored run number " + std::to_string(id)));
            return false;
        }
        return true;
    });
}

StoreResult<Project> loadProjectFromFile(const fs::path& path)
{
    auto opened = ProjectFile::open(path, OpenMode::ReadOnly);
    StoreResult<Project> result;
    if (!opened.file) {
        result.problems = std::move(opened.problems);
        return result;
    }
    result = opened.file->load();
    for (Problem& p : opened.problems)
        if (p.code != "store-newer-version") result.problems.push_back(std::move(p));  // read-only is what was asked
    return result;
}

StoreResult<Scenario> loadScenarioFromFile(const fs::path& path, const std::optional<std::string>& name)
{
    StoreResult<Scenario> result;
    auto opened = ProjectFile::open(path, OpenMode::ReadOnly);
    if (!opened.file) {
        result.problems = std::move(opened.problems);
        return result;
    }
    if (name && !trimmed(*name).empty()) return opened.file->loadScenario(*name);
    auto list = opened.file->listScenarios();
    if (!list.value) {
        result.problems = std::move(list.problems);
        return result;
    }
    if (list.value->size() == 1) return opened.file->loadScenario(list.value->front().name);
    std::string names;
    for (const ScenarioSummary& s : *list.value) names += (names.empty() ? "'" : ", '") + s.name + "'";
    result.problems.push_back(
        list.value->empty()
            ? fileProblem(path, "store-no-scenario", "holds no scenario yet", "Import one with: tledger import CSV_FOLDER --into PROJECT --scenario NAME")
            : fileProblem(path, "store-scenario-needed",
                          "holds " + std::to_string(list.value->size()) + " scenarios (" + names + "); say which one",
                          "Add --scenario NAME."));
    return result;
}

}  // namespace tl
