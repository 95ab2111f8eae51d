#include "core/compare/comparison_report.h"

#include <cmath>
#include <cstdio>

#include "core/io/balance_report.h"
#include "core/io/json_writer.h"
#include "core/io/text_table.h"

namespace tl {
namespace {

void writeStrings(JsonWriter& w, std::string_view key, const std::vector<std::string>& items)
{
    w.key(key).beginArray();
    for (const std::string& s : items) w.value(s);
    w.endArray();
}

std::string signedNumber(double v)
{
    if (std::isnan(v)) return "-";
    const std::string text = displayNumber(v);
    return v > 0 ? "+" + text : text;
}

std::string subjectText(const ComparedOutput& o)
{
    switch (o.group) {
    case OutputGroup::Level: return std::string("level ").append(o.subject);
    case OutputGroup::System: return "system";
    case OutputGroup::Compartment: break;
    }
    return o.subject;
}

}  // namespace

std::string_view outputGroupKey(OutputGroup group)
{
    switch (group) {
    case OutputGroup::Compartment: return "compartment";
    case OutputGroup::Level: return "level";
    case OutputGroup::System: return "system";
    }
    return "";
}

std::string percentText(const OutputDifference& d)
{
    if (std::isnan(d.absolute)) return d.differs ? "n/a" : "-";
    if (std::isnan(d.percent)) return "undefined";
    char text[32];
    std::snprintf(text, sizeof text, "%+.3g %%", d.percent);
    return d.percent == 0.0 ? std::string("0 %") : std::string(text);
}

std::string comparisonJson(const ScenarioComparison& c)
{
    JsonWriter w;
    w.beginObject();
    w.field("reference", c.scenarios.empty() ? std::string() : c.scenarios.front());
    w.key("scenarios").beginArray();
    for (std::size_t s = 0; s < c.scenarios.size(); ++s) {
        w.beginObject();
        w.field("name", c.scenarios[s]);
        w.field("status", statusKey(c.sheets[s].status));
        w.field("analysed", c.analyses[s].available());
        w.endObject();
    }
    w.endArray();
    w.field("differing_inputs", c.inputs.size());
    w.field("differing_outputs", c.differingOutputs());
    w.field("compared_outputs", c.outputs.size());

    w.key("inputs").beginArray();
    for (const InputDifference& d : c.inputs) {
        w.beginObject();
        w.field("compartment", d.compartment);
        w.field("item", d.item);
        w.field("label", d.label);
        w.key("values").beginArray();
        for (std::size_t s = 0; s < d.shown.size(); ++s) {
            if (s < d.values.size() && d.values[s]) w.value(*d.values[s]);
            else w.null();
        }
        w.endArray();
        writeStrings(w, "shown", d.shown);
        writeStrings(w, "sources", d.sources);
        writeStrings(w, "confidence", d.confidence);
        w.field("value_differs", d.valueDiffers);
        w.field("source_differs", d.sourceDiffers);
        w.field("confidence_differs", d.confidenceDiffers);
        w.endObject();
    }
    w.endArray();

    w.key("outputs").beginArray();
    for (const ComparedOutput& o : c.outputs) {
        w.beginObject();
        w.field("group", outputGroupKey(o.group));
        w.field("subject", o.subject);
        w.field("quantity", o.quantity);
        w.field("label", o.label);
        w.field("unit", o.unit);
        w.key("values").beginArray();
        for (double v : o.values) w.value(v);
        w.endArray();
        w.field("differs", o.differs());
        w.key("differences").beginArray();  // one per scenario after the reference
        for (std::size_t s = 1; s < o.differences.size(); ++s) {
            const OutputDifference& d = o.differences[s];
            w.beginObject();
            w.field("scenario", c.scenarios[s]);
            w.field("absolute", d.absolute);
            w.field("percent", d.percent);
            w.field("differs", d.differs);
            w.key("same_sign_share");
            if (d.sameSignShare) w.value(*d.sameSignShare);
            else w.null();
            w.endObject();
        }
        w.endArray();
        w.endObject();
    }
    w.endArray();
    w.field("notice", kDecisionSupportNotice);
    w.endObject();
    return w.str() + "\n";
}

std::string comparisonTables(const ScenarioComparison& c)
{
    std::string out;
    if (c.scenarios.empty()) return out;
    out += "Reference: " + c.scenarios.front() + "\n";
    for (std::size_t s = 0; s < c.scenarios.size(); ++s)
        out += "  " + c.scenarios[s] + ": " + std::string(statusKey(c.sheets[s].status)) +
               (c.analyses[s].available() ? "" : " (no flow network: outputs not available)") + "\n";
    out += "\n";

    out += "Inputs that differ: " + std::to_string(c.inputs.size()) + "\n";
    if (!c.inputs.empty()) {
        TextTable t;
        t.addColumn("Compartment", TextTable::Align::Left);
        t.addColumn("Input", TextTable::Align::Left);
        for (const std::string& name : c.scenarios) t.addColumn(name);
        t.addColumn("What differs", TextTable::Align::Left);
        for (const InputDifference& d : c.inputs) {
            std::vector<std::string> row{d.compartment.empty() ? "(fleet)" : d.compartment, d.label};
            row.insert(row.end(), d.shown.begin(), d.shown.end());
            std::string what;
            const auto add = [&](bool on, const char* word) {
                if (on) what += (what.empty() ? "" : ", ") + std::string(word);
            };
            add(d.valueDiffers, "value");
            add(d.confidenceDiffers, "confidence");
            add(d.sourceDiffers, "source note");
            row.push_back(what);
            t.addRow(std::move(row));
        }
        out += t.render();
        for (const InputDifference& d : c.inputs) {
            if (!d.sourceDiffers) continue;
            out += "  source notes of " + d.compartment + " " + d.label + ":";
            for (std::size_t s = 0; s < d.sources.size(); ++s)
                out += " [" + c.scenarios[s] + "] " + (d.sources[s].empty() ? "(none)" : d.sources[s]) + ";";
            out += "\n";
        }
    }
    out += "\n";

    const std::size_t differing = c.differingOutputs();
    out += "Outputs that differ: " + std::to_string(differing) + " of " + std::to_string(c.outputs.size()) +
           " (differences against " + c.scenarios.front() + ")\n";
    if (differing > 0) {
        TextTable t;
        t.addColumn("Subject", TextTable::Align::Left);
        t.addColumn("Output", TextTable::Align::Left);
        t.addColumn("Unit", TextTable::Align::Left);
        for (const std::string& name : c.scenarios) t.addColumn(name);
        for (std::size_t s = 1; s < c.scenarios.size(); ++s) {
            t.addColumn("Diff " + c.scenarios[s]);
            t.addColumn("%");
        }
        for (const ComparedOutput& o : c.outputs) {
            if (!o.differs()) continue;
            std::vector<std::string> row{subjectText(o), o.label, o.unit};
            for (double v : o.values) row.push_back(displayNumber(v));
            for (std::size_t s = 1; s < o.differences.size(); ++s) {
                row.push_back(signedNumber(o.differences[s].absolute));
                row.push_back(percentText(o.differences[s]));
            }
            t.addRow(std::move(row));
        }
        out += t.render();
    }
    // Appended piece by piece: GCC 12 warns falsely (-Wrestrict) on "\n" + std::string(...).
    out += '\n';
    out += kDecisionSupportNotice;
    out += '\n';
    return out;
}

}  // namespace tl
