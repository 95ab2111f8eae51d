#include "core/reconcile/reconcile_report.h"

#include <cmath>
#include <cstdio>

#include "core/io/balance_report.h"
#include "core/io/json_writer.h"
#include "core/io/text_table.h"

namespace tl {
namespace {

// The readable table leaves out changes smaller than this (they are applied, noted and
// in the JSON; SLSQP spreads tiny adjustments over many inputs).
constexpr double kSmallestListedPercent = 0.05;

std::string parameterLabel(const Model& model, const ReconcileChange& ch)
{
    if (ch.param == AdjustParam::Diet) return "diet: " + model.compartment(ch.prey).name;
    return std::string(adjustSymbol(ch.param));
}

std::string percentText(double v)
{
    char buf[32];
    std::snprintf(buf, sizeof buf, "%+.1f %%", v);
    return buf;
}

}  // namespace

std::string reconcileJson(const Model& original, const ReconcileResult& r, const std::string& scenario,
                          const std::optional<std::string>& savedAs)
{
    JsonWriter w;
    w.beginObject();
    w.field("status", reconcileStatusKey(r.status));
    w.field("balance_after", statusKey(r.balanceAfter));
    w.field("scenario", scenario);
    w.key("saved_as");
    if (savedAs) w.value(*savedAs); else w.null();
    w.field("objective", r.objective);
    w.field("evaluations", r.evaluations);
    w.field("elastic", r.elastic);
    w.field("solver_result", r.solverResult);
    w.field("largest_violation", r.largestViolation);
    w.field("seconds", r.seconds);
    w.field("variables", r.variableCount);
    w.field("constraints", r.constraintCount);
    w.key("changes").beginArray();
    for (const ReconcileChange& ch : r.changes) {
        w.beginObject();
        w.field("compartment", original.compartment(ch.compartment).name);
        w.field("parameter", adjustKey(ch.param));
        w.key("prey");
        if (ch.param == AdjustParam::Diet) w.value(original.compartment(ch.prey).name); else w.null();
        w.field("before", ch.before).field("after", ch.after).field("percent_change", ch.percent);
        w.field("confidence", ch.confidence).field("cv", ch.cv).field("objective_share", ch.objectiveShare);
        w.endObject();
    }
    w.endArray();
    w.key("binding").beginArray();
    for (const std::string& b : r.binding) w.value(b);
    w.endArray();
    w.key("conflicts").beginArray();
    for (const ReconcileConflict& c : r.conflicts) {
        w.beginObject();
        w.field("constraint", c.constraint).field("compartment", c.compartment);
        w.field("kind", constraintKey(c.kind)).field("violation", c.violation);
        w.key("relax").beginArray();
        for (const std::string& s : c.relax) w.value(s);
        w.endArray();
        w.endObject();
    }
    w.endArray();
    w.key("ee").beginArray();
    for (std::size_t i = 0; i < original.size() && i < r.eeAfter.size(); ++i) {
        w.beginObject();
        w.field("compartment", original.compartment(i).name);
        w.field("before", r.eeBefore[i]).field("after", r.eeAfter[i]);
        w.endObject();
    }
    w.endArray();
    w.key("problems").beginArray();
    for (const Problem& p : r.problems) {
        w.beginObject();
        w.field("code", p.code).field("severity", severityKey(p.severity));
        w.field("compartment", p.compartment).field("message", p.message).field("hint", p.hint);
        w.endObject();
    }
    w.endArray();
    w.field("notice", kDecisionSupportNotice);
    w.endObject();
    return w.str() + "\n";
}

std::string reconcileSettingsJson(const Model& original, const ReconcileOptions& o, const std::string& scenario)
{
    const auto input = [&original](const std::pair<std::size_t, AdjustParam>& in) {
        return original.compartment(in.first).name + "." + std::string(adjustKey(in.second));
    };
    const auto optionalNumber = [](JsonWriter& w, const char* key, const std::optional<double>& v) {
        w.key(key);
        if (v) w.value(*v); else w.null();
    };
    JsonWriter w;
    w.beginObject();
    w.field("scenario", scenario);
    w.key("move").beginArray();
    for (const auto& [moves, param] : {std::pair{o.moveBiomass, AdjustParam::Biomass}, std::pair{o.movePB, AdjustParam::PB},
                                       std::pair{o.moveQB, AdjustParam::QB}, std::pair{o.moveDiet, AdjustParam::Diet},
                                       std::pair{o.moveCatch, AdjustParam::Catch}})
        if (moves) w.value(std::string(adjustKey(param)));
    w.endArray();
    w.key("pins").beginArray();
    for (const auto& pin : o.pins) w.value(input(pin));
    w.endArray();
    w.key("bounds").beginArray();
    for (const auto& [in, b] : o.bounds) {
        w.beginObject();
        w.field("input", input(in));
        optionalNumber(w, "low", b.lower);
        optionalNumber(w, "high", b.upper);
        w.endObject();
    }
    w.endArray();
    for (const auto& [key, map] : {std::pair{"ee_max", &o.eeMax}, std::pair{"ee_min", &o.eeMin}}) {
        w.key(key).beginArray();
        for (const auto& [i, v] : *map) {
            w.beginObject();
            w.field("compartment", original.compartment(i).name).field("value", v);
            w.endObject();
        }
        w.endArray();
    }
    w.key("pq_range").beginArray();
    for (const auto& [i, range] : o.pqRange) {
        w.beginObject();
        w.field("compartment", original.compartment(i).name).field("low", range.first).field("high", range.second);
        w.endObject();
    }
    w.endArray();
    w.field("diet_cv", o.dietCv).field("catch_cv", o.catchCv).field("max_factor", o.maxFactor);
    w.endObject();
    return w.str();
}

std::string reconcileText(const Model& original, const ReconcileResult& r, const std::string& scenario,
                          const std::optional<std::string>& savedAs)
{
    std::string out;
    switch (r.status) {
    case ReconcileStatus::Unchanged: out += "'" + scenario + "' already balances: nothing to change.\n"; break;
    case ReconcileStatus::Balanced: out += "'" + scenario + "' balances after the changes below.\n"; break;
    case ReconcileStatus::LeastViolating:
        out += "'" + scenario + "' cannot balance within its pins and bounds: the least-violating change is below.\n";
        break;
    case ReconcileStatus::Invalid: out += "'" + scenario + "' could not be reconciled.\n"; break;
    case ReconcileStatus::Cancelled: return out + "Reconciling '" + scenario + "' was cancelled: nothing changed.\n";
    }
    if (r.status == ReconcileStatus::Invalid) return out + problemsTable(r.problems);
    out += "Objective (sum of (change / CV)^2): " + displayNumber(r.objective) + "; evaluations: " +
           std::to_string(r.evaluations) + (r.elastic ? " (elastic phase ran)" : "") +
           "; largest remaining violation: " + displayNumber(r.largestViolation) + "; balance after: " +
           std::string(statusKey(r.balanceAfter)) + "\n";
    if (!r.changes.empty()) {
        TextTable t;
        t.addColumn("Compartment", TextTable::Align::Left);
        t.addColumn("Parameter", TextTable::Align::Left);
        t.addColumn("Before");
        t.addColumn("After");
        t.addColumn("Change");
        t.addColumn("Confidence", TextTable::Align::Left);
        t.addColumn("Share of objective");
        std::size_t small = 0;
        for (const ReconcileChange& ch : r.changes)
            if (std::abs(ch.percent) < kSmallestListedPercent) ++small; else t.addRow({original.compartment(ch.compartment).name, parameterLabel(original, ch), displayNumber(ch.before),
                      displayNumber(ch.after), percentText(ch.percent), ch.confidence,
                      percentText(100.0 * ch.objectiveShare).substr(1)});
        out += "\nChanges, largest share of the objective first:\n" + t.render();
        if (small > 0)
            out += "and " + std::to_string(small) + " changes under 0.05 % (all are listed by --json)\n";
    }
    if (!r.binding.empty()) {
        out += "\nBinding at the answer:\n";
        for (const std::string& b : r.binding) out += "  " + b + "\n";
    }
    if (!r.conflicts.empty()) {
        out += "\nIn conflict (cannot all hold):\n";
        for (const ReconcileConflict& c : r.conflicts) {
            out += "  " + c.constraint + " (short by " + displayNumber(c.violation) + " of its scale)\n";
            for (const std::string& s : c.relax) out += "    to relax: " + s + "\n";
        }
    }
    if (savedAs) out += "\nSaved as the new scenario '" + *savedAs + "'.\n";
    out += "\n" + std::string(kDecisionSupportNotice) + "\n";
    return out;
}

}  // namespace tl
