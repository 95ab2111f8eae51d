#include "core/io/balance_report.h"

#include <algorithm>

#include "core/io/json_writer.h"
#include "core/io/text_table.h"

namespace tl {
namespace {

void writeProblems(JsonWriter& w, const Problems& problems)
{
    w.key("problems").beginArray();
    for (const Problem& p : problems) {
        w.beginObject()
            .field("code", p.code)
            .field("severity", severityKey(p.severity))
            .field("compartment", p.compartment)
            .field("parameter", p.parameter)
            .field("message", p.message);
        if (!p.hint.empty()) w.field("hint", p.hint);
        if (!p.prey.empty()) w.field("prey", p.prey);
        if (p.location) {
            w.key("location").beginObject().field("file", p.location->file);
            w.field("line", p.location->line).field("column", p.location->column).endObject();
        }
        w.endObject();
    }
    w.endArray();
}

bool isSolved(const CompartmentBalance& row, Param p)
{
    return std::find(row.solved.begin(), row.solved.end(), p) != row.solved.end();
}

// A value for the table, with a trailing '*' when the solver supplied it.
std::string cell(const CompartmentBalance& row, Param p, double v)
{
    return displayNumber(v) + (isSolved(row, p) ? "*" : " ");
}

}  // namespace

std::string balanceSheetJson(const BalanceSheet& sheet)
{
    JsonWriter w;
    w.beginObject().field("status", statusKey(sheet.status));
    w.key("compartments").beginArray();
    for (const CompartmentBalance& r : sheet.rows) {
        w.beginObject()
            .field("name", r.name)
            .field("kind", kindKey(r.kind))
            .field("biomass", r.biomass)
            .field("pb", r.pb)
            .field("qb", r.qb)
            .field("ee", r.ee)
            .field("pq", r.pq)
            .field("tl", r.tl)
            .field("oi", r.oi)
            .field("production", r.production)
            .field("consumption", r.consumption)
            .field("respiration", r.respiration)
            .field("flow_to_detritus", r.flowToDetritus);
        w.key("solved").beginArray();
        for (Param p : r.solved) w.value(paramKey(p));
        w.endArray();
        // Additional keys (the contract allows adding, never renaming).
        w.field("unassim", r.unassim)
            .field("predation", r.predation)
            .field("catch", r.catchTotal)
            .field("m0", r.m0)
            .field("m2", r.m2)
            .field("f", r.f)
            .field("z", r.z)
            .field("net_efficiency", r.netEfficiency)
            .field("rb", r.rb)
            .field("pr", r.pr)
            .field("residual", r.residual);
        if (r.kind == CompartmentKind::Detritus) {
            w.field("detritus_inflow", r.detritusInflow)
                .field("detritus_consumption", r.detritusConsumption)
                .field("detritus_export", r.detritusExport);
        }
        w.endObject();
    }
    w.endArray();
    writeProblems(w, sheet.problems);
    w.field("conditioning", sheet.conditioning);
    w.field("notice", kDecisionSupportNotice);
    w.endObject();
    return w.str();
}

std::string problemsJson(const Problems& problems)
{
    JsonWriter w;
    const auto count = [&](Severity s) {
        return static_cast<long long>(std::count_if(problems.begin(), problems.end(),
                                                    [s](const Problem& p) { return p.severity == s; }));
    };
    w.beginObject();
    w.key("counts").beginObject();
    w.field("error", count(Severity::Error)).field("warning", count(Severity::Warning)).field("info", count(Severity::Info));
    w.endObject();
    writeProblems(w, problems);
    w.endObject();
    return w.str();
}

std::string statusJson(std::string_view status, const Problems& problems, std::string_view message)
{
    JsonWriter w;
    w.beginObject();
    w.field("status", std::string(status));
    writeProblems(w, problems);
    w.field("message", std::string(message));
    w.endObject();
    return w.str() + "\n";
}

std::string balanceSheetTable(const BalanceSheet& sheet, const Units& units)
{
    TextTable t;
    t.addColumn("Compartment", TextTable::Align::Left);
    t.addColumn("Kind", TextTable::Align::Left);
    t.addColumn("TL");
    t.addColumn("B [" + units.biomass() + "]");
    t.addColumn("P/B [" + units.rate() + "]");
    t.addColumn("Q/B [" + units.rate() + "]");
    t.addColumn("EE");
    t.addColumn("P/Q");
    t.addColumn("P [" + units.flow() + "]");
    t.addColumn("Q");
    t.addColumn("R");
    t.addColumn("To detritus");
    t.addColumn("Catch");
    for (const CompartmentBalance& r : sheet.rows) {
        t.addRow({r.name, std::string(kindKey(r.kind)), displayNumber(r.tl), cell(r, Param::Biomass, r.biomass),
                  cell(r, Param::PB, r.pb), cell(r, Param::QB, r.qb), cell(r, Param::EE, r.ee),
                  cell(r, Param::PQ, r.pq), displayNumber(r.production), displayNumber(r.consumption),
                  displayNumber(r.respiration), displayNumber(r.flowToDetritus),
                  r.catchTotal > 0 ? displayNumber(r.catchTotal) : "-"});
    }
    std::string out = "Balance sheet: " + std::string(statusKey(sheet.status)) + "\n\n" + t.render();
    out += "\n* solved by the mass balance; other values as given. Flows in " + units.flow() + ".\n";
    if (!sheet.problems.empty()) out += "\n" + problemsTable(sheet.problems);
    out += "\n" + std::string(kDecisionSupportNotice) + "\n";
    return out;
}

std::string problemsTable(const Problems& problems)
{
    if (problems.empty()) return "No problems found.\n";
    TextTable t;
    t.addColumn("Severity", TextTable::Align::Left);
    t.addColumn("Where", TextTable::Align::Left);
    t.addColumn("Problem", TextTable::Align::Left);
    for (const Problem& p : problems) {
        std::string where = p.compartment;
        if (!p.parameter.empty()) where += (where.empty() ? "" : " / ") + p.parameter;
        if (!p.prey.empty()) where += " <- " + p.prey;
        if (p.location) where = p.describe().substr(0, p.describe().size() - p.message.size() - 2);
        std::string text = p.message;
        if (!p.hint.empty()) text += " (" + p.hint + ")";
        t.addRow({std::string(severityKey(p.severity)), where, text});
    }
    return t.render();
}

}  // namespace tl
