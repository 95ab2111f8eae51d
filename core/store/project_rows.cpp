#include "core/store/project_file_detail.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>
#include <unordered_map>

#include "core/model/problem_codes.h"
#include "core/model/limits.h"
#include "core/model/text.h"
#include "core/store/sqlite_statement.h"

#ifndef TL_PROGRAM_VERSION
#define TL_PROGRAM_VERSION "unknown"
#endif

namespace tl::store::detail {

// --- validation before a write: a save either fits the schema or is refused whole ---

void checkScenarioWritable(const fs::path& file, const Scenario& s, Problems& out)
{
    const std::string name = trimmed(s.name);
    if (name.empty()) {
        out.push_back(fileProblem(file, code::kStoreInvalidName, "a scenario needs a name (it is empty)"));
        return;
    }
    const Model& m = s.model;
    const std::string in = " in scenario '" + name + "'";
    for (const std::string& beyond : limits::exceededLimits(m))  // the loader would refuse the file
        out.push_back(fileProblem(file, code::kStoreLimit, "scenario '" + name + "': " + beyond));
    std::set<std::string> seen;
    for (std::size_t i = 0; i < m.size(); ++i) {
        const Compartment& c = m.compartment(i);
        if (c.name.empty())
            out.push_back(fileProblem(file, code::kStoreInvalidName,
                                      "compartment " + std::to_string(i + 1) + in + " has no name"));
        else if (!seen.insert(c.name).second)
            out.push_back(fileProblem(file, code::kStoreDuplicateName, "two compartments are named '" + c.name + "'" + in));
        for (Param p : kAllParams) {
            const auto& v = c.value(p);
            if (v && !std::isfinite(*v)) {
                Problem pr = fileProblem(file, code::kStoreInvalidValue,
                                         std::string(paramSymbol(p)) + " of '" + c.name + "'" + in + " is not a finite number");
                pr.compartment = c.name;
                pr.parameter = std::string(paramKey(p));
                out.push_back(pr);
            }
            const auto& cv = c.confidenceOf(p).cv;
            if (cv && !(std::isfinite(*cv) && *cv >= 0.0)) {
                Problem pr = fileProblem(file, code::kStoreInvalidValue,
                                         "the CV of " + std::string(paramSymbol(p)) + " of '" + c.name + "'" + in +
                                             " must be a number of at least 0");
                pr.compartment = c.name;
                pr.parameter = std::string(paramKey(p));
                out.push_back(pr);
            }
        }
        if (const auto& cv = c.dietConfidence.cv; cv && !(std::isfinite(*cv) && *cv >= 0.0)) {
            Problem pr = fileProblem(file, code::kStoreInvalidValue,
                                     "the CV of the diet of '" + c.name + "'" + in + " must be a number of at least 0");
            pr.compartment = c.name;
            pr.parameter = "diet";
            out.push_back(pr);
        }
        auto badFraction = [&](const std::string& what, const std::string& parameter, const std::string& other) {
            Problem pr = fileProblem(file, code::kStoreInvalidFraction, what + in + " must lie between 0 and 1");
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
        if (f.name.empty()) out.push_back(fileProblem(file, code::kStoreInvalidName, "a fleet" + in + " has no name"));
        else if (!fleetNames.insert(f.name).second)
            out.push_back(fileProblem(file, code::kStoreDuplicateName, "two fleets are named '" + f.name + "'" + in));
        for (std::size_t i = 0; i < m.size(); ++i) {
            const double landed = i < f.landings.size() ? f.landings[i] : 0.0;
            const double discarded = i < f.discards.size() ? f.discards[i] : 0.0;
            const double survival = i < f.discardSurvival.size() ? f.discardSurvival[i] : 0.0;
            if (!std::isfinite(landed) || !std::isfinite(discarded) || !fraction(survival)) {
                Problem pr = fileProblem(file, code::kStoreInvalidValue,
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
            out.push_back(fileProblem(file, code::kStoreInvalidValue,
                                      "the flow-map position of '" + compartment + "'" + in + " is not finite"));
}

bool writeInfo(sqlite3* db, const ProjectInfo& info)
{
    Statement st(db, R"sql(
INSERT INTO project_info (id, title, notes, created, modified, program_version, currency, area, time_unit,
                          ee_max, pq_min, pq_max, diet_sum_tolerance, cv_grade_a, cv_grade_b, cv_grade_c, cv_grade_d,
                          plausible_biomass_max, plausible_rate_max, plausible_flow_max)
VALUES (1, ?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12, ?13, ?14, ?15, ?16, ?17, ?18, ?19)
ON CONFLICT (id) DO UPDATE SET title = ?1, notes = ?2, created = ?3, modified = ?4, program_version = ?5,
  currency = ?6, area = ?7, time_unit = ?8, ee_max = ?9, pq_min = ?10, pq_max = ?11, diet_sum_tolerance = ?12,
  cv_grade_a = ?13, cv_grade_b = ?14, cv_grade_c = ?15, cv_grade_d = ?16,
  plausible_biomass_max = ?17, plausible_rate_max = ?18, plausible_flow_max = ?19)sql");
    const std::string now = utcNowIso8601();
    st.bind(1, info.title).bind(2, info.notes).bind(3, info.created.empty() ? now : info.created).bind(4, now);
    st.bind(5, std::string_view(TL_PROGRAM_VERSION));
    st.bind(6, info.units.currency).bind(7, info.units.area).bind(8, info.units.time);
    st.bind(9, info.rules.eeMax).bind(10, info.rules.pqMin).bind(11, info.rules.pqMax);
    st.bind(12, info.rules.dietSumTolerance);
    for (int g = 0; g < 4; ++g) st.bind(13 + g, info.rules.cvByGrade[static_cast<std::size_t>(g)]);
    st.bind(17, info.rules.plausible.biomassMax).bind(18, info.rules.plausible.rateMax).bind(19, info.rules.plausible.flowMax);
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
    Statement insC(db, version >= 3 ? "INSERT INTO compartment (scenario_id, position, name, kind, diet_import, diet_grade, "
                                      "diet_cv, diet_source) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8)"
                                    : "INSERT INTO compartment (scenario_id, position, name, kind, diet_import) "
                                      "VALUES (?1, ?2, ?3, ?4, ?5)");
    Statement insV(db, "INSERT INTO parameter_value (compartment_id, parameter, value, grade, cv, source) "
                       "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
    for (std::size_t i = 0; i < m.size(); ++i) {
        const Compartment& c = m.compartment(i);
        insC.reset();
        insC.bind(1, id).bind(2, static_cast<std::int64_t>(i)).bind(3, c.name).bind(4, kindKey(c.kind)).bind(5, m.dietImport(i));
        if (version >= 3)
            insC.bind(6, gradeKey(c.dietConfidence.grade)).bind(7, c.dietConfidence.cv).bind(8, c.dietConfidence.source);
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
// for a new file, all of them with the ids they carry. A run of id 0 the file already
// holds word for word (the workbench keeps a run it made with id 0 until the project is
// opened again, so every later save offers it anew) is not added twice.
bool insertRuns(sqlite3* db, int version, const std::vector<StoredRun>& runs, bool keepIds)
{
    if (version < 2) return true;
    Statement ins(db, "INSERT INTO stored_run (id, scenario_id, kind, settings_json, summary_json, created) "
                      "SELECT ?6, (SELECT id FROM scenario WHERE name = ?1), ?2, ?3, ?4, ?5 WHERE ?6 IS NOT NULL OR NOT EXISTS "
                      "(SELECT 1 FROM stored_run r WHERE r.kind = ?2 AND r.settings_json = ?3 AND r.summary_json = ?4 "
                      "AND r.created = ?5 AND r.scenario_id IS (SELECT id FROM scenario WHERE name = ?1))");
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

std::optional<ProjectInfo> readInfo(sqlite3* db, int version)
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
    if (version >= 3) {  // before schema 3 the plausible ranges were not stored: defaults
        Statement ranges(db, "SELECT plausible_biomass_max, plausible_rate_max, plausible_flow_max FROM project_info WHERE id = 1");
        if (!ranges.step()) return std::nullopt;
        info.rules.plausible = {ranges.real(0), ranges.real(1), ranges.real(2)};
    }
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
        problems.push_back(fileProblem(file, code::kStoreDamaged, "scenario '" + s.name + "': " + what,
                                       "The file was left unchanged; it may have been edited by another program."));
    };

    // Limits of this version (core/model/limits.h): refused, never cut.
    auto beyondLimit = [&](const std::string& what) {
        problems.push_back(fileProblem(file, code::kStoreLimit, "scenario '" + s.name + "': " + what,
                                       "The file was left unchanged; this version cannot open a scenario that large."));
    };
    std::unordered_map<std::int64_t, std::size_t> index;  // row id -> compartment index
    Statement comps(db, version >= 3 ? "SELECT id, name, kind, diet_import, diet_grade, diet_cv, diet_source FROM compartment "
                                       "WHERE scenario_id = ?1 ORDER BY position"
                                     : "SELECT id, name, kind, diet_import FROM compartment WHERE scenario_id = ?1 "
                                       "ORDER BY position");
    comps.bind(1, id);
    std::vector<std::pair<std::int64_t, double>> imports;
    while (comps.step()) {
        if (s.model.size() == limits::kMaxCompartments) {
            beyondLimit("more than " + limits::groupedNumber(limits::kMaxCompartments) +
                        " compartments; the limit of this version is " + limits::groupedNumber(limits::kMaxCompartments));
            return std::nullopt;
        }
        Compartment c;
        c.name = comps.text(1);
        if (const std::size_t length = limits::characterCount(c.name); length > limits::kMaxNameLength) {
            beyondLimit("compartment " + std::to_string(s.model.size() + 1) + " has a name of " + std::to_string(length) +
                        " characters; the limit of this version is " + std::to_string(limits::kMaxNameLength));
            return std::nullopt;
        }
        const auto kind = parseKind(comps.text(2));
        if (!kind) {
            damaged("compartment '" + c.name + "' has an unknown kind '" + comps.text(2) + "'");
            continue;
        }
        c.kind = *kind;
        if (version >= 3) {
            const auto dietGrade = parseGrade(comps.text(4));
            if (!dietGrade) {
                damaged("compartment '" + c.name + "' has an unknown diet grade '" + comps.text(4) + "'");
                continue;
            }
            c.dietConfidence = Confidence{*dietGrade, comps.optionalReal(5), comps.text(6)};
        }
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
    std::size_t dietEntries = static_cast<std::size_t>(
        std::count_if(imports.begin(), imports.end(), [](const auto& entry) { return entry.second != 0.0; }));
    readPairs("SELECT d.predator_id, d.prey_id, d.fraction FROM diet d JOIN compartment c ON c.id = d.predator_id "
              "WHERE c.scenario_id = ?1",
              "diet", [&](std::size_t pred, std::size_t prey, double v) {
                  if (v != 0.0 && ++dietEntries == limits::kMaxDietEntries + 1)
                      beyondLimit("more than " + limits::groupedNumber(limits::kMaxDietEntries) +
                                  " non-zero diet shares; the limit of this version is " +
                                  limits::groupedNumber(limits::kMaxDietEntries));
                  if (dietEntries <= limits::kMaxDietEntries) s.model.setDiet(pred, prey, v);
              });
    readPairs("SELECT r.source_id, r.pool_id, r.fraction FROM routing r JOIN compartment c ON c.id = r.source_id "
              "WHERE c.scenario_id = ?1",
              "routing", [&](std::size_t src, std::size_t pool, double v) { s.model.setRouting(src, pool, v); });

    std::map<std::int64_t, std::size_t> fleetIndex;
    Statement fleets(db, "SELECT id, name, discard_pool_id FROM fleet WHERE scenario_id = ?1 ORDER BY position");
    fleets.bind(1, id);
    while (fleets.step()) {
        if (s.model.fleets().size() == limits::kMaxFleets) {  // each fleet holds a catch per compartment
            beyondLimit("more than " + std::to_string(limits::kMaxFleets) + " fleets; the limit of this version is " +
                        std::to_string(limits::kMaxFleets));
            return std::nullopt;
        }
        if (const std::size_t length = limits::characterCount(fleets.text(1)); length > limits::kMaxNameLength) {
            beyondLimit("fleet " + std::to_string(s.model.fleets().size() + 1) + " has a name of " +
                        std::to_string(length) + " characters; the limit of this version is " +
                        std::to_string(limits::kMaxNameLength));
            return std::nullopt;
        }
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

}  // namespace tl::store::detail
