#include "core/store/project_json.h"

#include "core/io/json_writer.h"
#include "core/store/schema.h"

namespace tl {
namespace {

// Re-indents a JSON value by two spaces per nesting step. Safe on any JSON text: a raw
// line break can only sit between tokens (strings hold it escaped as \n).
std::string indented(std::string value)
{
    while (!value.empty() && (value.back() == '\n' || value.back() == ' ')) value.pop_back();
    std::string out;
    out.reserve(value.size() + 64);
    for (char c : value) {
        out += c;
        if (c == '\n') out += "  ";
    }
    return out;
}

// {"k1": v1, "k2": v2} from already valid JSON values, one member per line.
std::string objectOf(const JsonMembers& members)
{
    if (members.empty()) return "{}";
    std::string out = "{";
    for (std::size_t i = 0; i < members.size(); ++i) {
        out += i == 0 ? "\n  " : ",\n  ";
        out += jsonEscape(members[i].first) + ": " + indented(members[i].second);
    }
    return out + "\n}";
}

std::string arrayOf(const std::vector<std::string>& values)
{
    if (values.empty()) return "[]";
    std::string out = "[";
    for (std::size_t i = 0; i < values.size(); ++i) out += (i == 0 ? "\n  " : ",\n  ") + indented(values[i]);
    return out + "\n]";
}

void optionalNumber(JsonWriter& w, std::string_view key, const std::optional<double>& v)
{
    w.key(key);
    if (v) w.value(*v);
    else w.null();
}

}  // namespace

std::string modelInputsJson(const Model& m)
{
    JsonWriter w;
    w.beginObject();
    w.key("compartments").beginArray();
    for (const Compartment& c : m.compartments()) {
        w.beginObject();
        w.field("name", c.name).field("kind", kindKey(c.kind));
        for (Param p : kAllParams) optionalNumber(w, paramKey(p), c.value(p));
        w.key("confidence").beginObject();
        for (Param p : kAllParams) {
            const Confidence& conf = c.confidenceOf(p);
            if (conf == Confidence{}) continue;
            w.key(paramKey(p)).beginObject();
            w.field("grade", gradeKey(conf.grade));
            optionalNumber(w, "cv", conf.cv);
            w.field("source", conf.source);
            w.endObject();
        }
        if (c.dietConfidence != Confidence{}) {  // the diet row as a whole
            w.key("diet").beginObject();
            w.field("grade", gradeKey(c.dietConfidence.grade));
            optionalNumber(w, "cv", c.dietConfidence.cv);
            w.field("source", c.dietConfidence.source);
            w.endObject();
        }
        w.endObject();
        w.endObject();
    }
    w.endArray();
    w.key("diet").beginArray();
    for (std::size_t pred = 0; pred < m.size(); ++pred)
        for (const auto& [prey, fraction] : m.dietRow(pred))
            w.beginObject()
                .field("predator", m.compartment(pred).name)
                .field("prey", m.compartment(prey).name)
                .field("fraction", fraction)
                .endObject();
    w.endArray();
    w.key("diet_import").beginArray();
    for (std::size_t pred = 0; pred < m.size(); ++pred)
        if (m.dietImport(pred) != 0.0)
            w.beginObject().field("predator", m.compartment(pred).name).field("fraction", m.dietImport(pred)).endObject();
    w.endArray();
    w.key("detritus_routing").beginArray();
    for (std::size_t src = 0; src < m.size(); ++src)
        for (const auto& [pool, fraction] : m.routingRow(src))
            w.beginObject()
                .field("source", m.compartment(src).name)
                .field("detritus", m.compartment(pool).name)
                .field("fraction", fraction)
                .endObject();
    w.endArray();
    w.key("fleets").beginArray();
    for (const Fleet& f : m.fleets()) {
        w.beginObject().field("name", f.name).key("discard_pool");
        if (f.discardPool && *f.discardPool < m.size()) w.value(m.compartment(*f.discardPool).name);
        else w.null();
        w.key("catch").beginArray();
        for (std::size_t i = 0; i < m.size(); ++i) {
            const double landed = i < f.landings.size() ? f.landings[i] : 0.0;
            const double discarded = i < f.discards.size() ? f.discards[i] : 0.0;
            const double survival = i < f.discardSurvival.size() ? f.discardSurvival[i] : 0.0;
            if (landed == 0.0 && discarded == 0.0 && survival == 0.0) continue;
            w.beginObject()
                .field("compartment", m.compartment(i).name)
                .field("landings", landed)
                .field("discards", discarded)
                .field("discard_survival", survival)
                .endObject();
        }
        w.endArray().endObject();
    }
    w.endArray();
    w.endObject();
    return w.str();
}

std::string projectJson(const Project& project, const ProjectJsonOptions& options, const ScenarioJsonExtras& extras)
{
    const ProjectInfo& info = project.info;
    JsonMembers top;
    top.emplace_back("format", jsonEscape("trophic-ledger-project"));
    top.emplace_back("schema_version", std::to_string(store::kSchemaVersion));
    if (!options.notice.empty()) top.emplace_back("notice", jsonEscape(options.notice));
    top.emplace_back("title", jsonEscape(info.title));
    top.emplace_back("notes", jsonEscape(info.notes));
    if (options.timestamps) {
        top.emplace_back("created", jsonEscape(info.created));
        top.emplace_back("modified", jsonEscape(info.modified));
        top.emplace_back("program_version", jsonEscape(info.programVersion));
    }
    {
        JsonWriter w;
        w.beginObject()
            .field("currency", info.units.currency)
            .field("area", info.units.area)
            .field("time", info.units.time)
            .field("biomass", info.units.biomass())
            .field("flow", info.units.flow())
            .endObject();
        top.emplace_back("units", w.str());
    }
    {
        JsonWriter w;
        w.beginObject()
            .field("ee_max", info.rules.eeMax)
            .field("pq_min", info.rules.pqMin)
            .field("pq_max", info.rules.pqMax)
            .field("diet_sum_tolerance", info.rules.dietSumTolerance);
        w.key("cv_by_grade").beginObject();
        const char* grades[] = {"A", "B", "C", "D"};
        for (std::size_t g = 0; g < 4; ++g) w.field(grades[g], info.rules.cvByGrade[g]);
        w.endObject();
        w.key("plausible_max").beginObject()
            .field("biomass", info.rules.plausible.biomassMax)
            .field("rate", info.rules.plausible.rateMax)
            .field("flow", info.rules.plausible.flowMax)
            .endObject();
        w.endObject();
        top.emplace_back("rules", w.str());
    }
    std::vector<std::string> scenarios;
    for (const Scenario& s : project.scenarios) {
        JsonMembers members;
        members.emplace_back("name", jsonEscape(s.name));
        members.emplace_back("description", jsonEscape(s.description));
        members.emplace_back("parent", jsonEscape(s.parent));
        if (options.timestamps) members.emplace_back("created", jsonEscape(s.created));
        members.emplace_back("inputs", modelInputsJson(s.model));
        JsonWriter layout;
        layout.beginObject();
        for (const auto& [name, pos] : s.layout)
            layout.key(name).beginObject().field("x", pos.x).field("y", pos.y).endObject();
        layout.endObject();
        members.emplace_back("layout", layout.str());
        if (extras)
            for (auto& member : extras(s)) members.push_back(std::move(member));
        scenarios.push_back(objectOf(members));
    }
    top.emplace_back("scenarios", arrayOf(scenarios));
    std::vector<std::string> runs;
    for (const StoredRun& r : project.runs) {
        JsonWriter w;
        w.beginObject().field("id", static_cast<long long>(r.id)).field("scenario", r.scenario).field("kind", r.kind);
        if (options.timestamps) w.field("created", r.created);
        w.field("settings", r.settingsJson).field("summary", r.summaryJson).endObject();
        runs.push_back(w.str());
    }
    top.emplace_back("runs", arrayOf(runs));
    return objectOf(top) + "\n";
}

}  // namespace tl
