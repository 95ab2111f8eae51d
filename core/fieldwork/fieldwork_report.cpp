#include "core/fieldwork/fieldwork_report.h"

#include "core/io/balance_report.h"
#include "core/io/text_table.h"

namespace tl::fieldwork {
namespace {

void optionalNumber(JsonWriter& w, std::string_view key, const std::optional<double>& v)
{
    w.key(key);
    if (v) w.value(*v);
    else w.null();
}

void stringArray(JsonWriter& w, std::string_view key, const std::vector<std::string>& items)
{
    w.key(key).beginArray();
    for (const std::string& s : items) w.value(s);
    w.endArray();
}

void warningsArray(JsonWriter& w, const Problems& warnings)
{
    w.key("warnings").beginArray();
    for (const Problem& p : warnings) {
        w.beginObject();
        w.field("code", p.code);
        w.field("message", p.message);
        w.endObject();
    }
    w.endArray();
}

}  // namespace

void writeEstimateJson(JsonWriter& w, const Estimate& e)
{
    w.field("quantity", e.quantity);
    optionalNumber(w, "value", e.valid ? std::optional<double>(e.value) : std::nullopt);
    w.field("unit", e.unit);
    optionalNumber(w, "cv", e.cv);
    optionalNumber(w, "ci_low", e.ciLow);
    optionalNumber(w, "ci_high", e.ciHigh);
    w.field("ci_level", e.ciLevel);
    w.field("method", e.method);
    stringArray(w, "inputs", e.inputs);
    stringArray(w, "assumptions", e.assumptions);
    warningsArray(w, e.warnings);
    w.field("notice", kDecisionSupportNotice);
}

void writeSweptAreaJson(JsonWriter& w, const SweptAreaResult& r)
{
    w.key("strata").beginArray();
    for (const StratumEstimate& s : r.strata) {
        w.beginObject();
        w.field("name", s.name);
        w.field("area_km2", s.areaKm2);
        w.field("weight", s.weight);
        w.field("hauls", s.hauls);
        w.field("mean_kg_per_km2", s.meanKgPerKm2);
        w.field("sd_kg_per_km2", s.sdKgPerKm2);
        w.endObject();
    }
    w.endArray();
    w.field("density_kg_per_km2", r.densityKgPerKm2);
    w.field("se_kg_per_km2", r.seKgPerKm2);
    w.field("degrees_of_freedom", r.degreesOfFreedom);
    stringArray(w, "taxa", r.taxa);
}

void writeCatchCurveJson(JsonWriter& w, const CatchCurveResult& r)
{
    w.key("points").beginArray();
    for (const CatchCurvePoint& p : r.points) {
        w.beginObject();
        w.field("from_cm", p.fromCm);
        w.field("to_cm", p.toCm);
        w.field("count", p.count);
        optionalNumber(w, "age", p.dt > 0.0 ? std::optional<double>(p.age) : std::nullopt);
        optionalNumber(w, "dt", p.dt > 0.0 ? std::optional<double>(p.dt) : std::nullopt);
        optionalNumber(w, "ln_c_dt", p.usable ? std::optional<double>(p.lnCdt) : std::nullopt);
        w.field("usable", p.usable);
        w.field("selected", p.selected);
        w.endObject();
    }
    w.endArray();
    w.field("slope", r.slope);
    w.field("intercept", r.intercept);
    w.field("slope_se", r.slopeSe);
    w.field("r2", r.r2);
}

void writeMeanLengthJson(JsonWriter& w, const MeanLengthResult& r)
{
    w.field("cut_off_cm", r.cutOffCm);
    w.field("mean_length_cm", r.meanLengthCm);
    w.field("sd_cm", r.sdCm);
    w.field("fish", r.fish);
}

void writeDietJson(JsonWriter& w, const StomachDiet& d)
{
    w.field("predator", d.predator);
    w.field("summary", d.summary == DietSummary::Pooled ? "pooled" : "mean");
    w.field("method", d.method);
    w.field("samples", d.samples);
    w.field("stomachs", d.stomachs);
    w.field("empty_stomachs", d.emptyStomachs);
    w.field("left_out_share", d.leftOutShare);
    w.field("grade", gradeKey(d.grade));
    w.field("ci_level", d.ciLevel);
    w.key("shares").beginArray();
    for (const PreyShare& s : d.shares) {
        w.beginObject();
        w.field("prey", s.prey);
        w.field("share", s.share);
        w.field("mean_of_proportions", s.meanOfProportions);
        w.field("pooled", s.pooled);
        w.field("cv", s.cv);
        w.field("ci_low", s.ciLow);
        w.field("ci_high", s.ciHigh);
        w.endObject();
    }
    w.endArray();
    warningsArray(w, d.warnings);
    w.field("notice", kDecisionSupportNotice);
}

std::string estimateText(const Estimate& e)
{
    std::string out = e.quantity + " = " + displayNumber(e.value) + " " + e.unit;
    std::string spread;
    if (e.cv) spread += "CV " + displayNumber(*e.cv);
    if (e.ciLow && e.ciHigh)
        spread += (spread.empty() ? "" : "; ") + displayNumber(e.ciLevel * 100) + " % CI " + displayNumber(*e.ciLow) +
                  " to " + displayNumber(*e.ciHigh);
    if (spread.empty()) spread = "no CV";
    out += " (" + spread + ")\n";
    out += "  method: " + e.method + "\n";
    for (const std::string& s : e.inputs) out += "  input: " + s + "\n";
    for (const std::string& s : e.assumptions) out += "  assumed: " + s + "\n";
    for (const Problem& p : e.warnings) out += "  warning: " + p.message + "\n";
    return out;
}

std::string sweptAreaTable(const SweptAreaResult& r)
{
    TextTable t;
    t.addColumn("stratum", TextTable::Align::Left);
    t.addColumn("area km²");
    t.addColumn("weight");
    t.addColumn("hauls");
    t.addColumn("mean kg/km²");
    t.addColumn("sd kg/km²");
    for (const StratumEstimate& s : r.strata)
        t.addRow({s.name.empty() ? "(all hauls)" : s.name, s.areaKm2 > 0.0 ? displayNumber(s.areaKm2) : "-",
                  displayNumber(s.weight), std::to_string(s.hauls), displayNumber(s.meanKgPerKm2),
                  displayNumber(s.sdKgPerKm2)});
    return t.render();
}

std::string catchCurveTable(const CatchCurveResult& r)
{
    TextTable t;
    t.addColumn("point");
    t.addColumn("length cm", TextTable::Align::Left);
    t.addColumn("count");
    t.addColumn("age (years)");
    t.addColumn("ln(C/dt)");
    t.addColumn("used", TextTable::Align::Left);
    for (std::size_t i = 0; i < r.points.size(); ++i) {
        const CatchCurvePoint& p = r.points[i];
        t.addRow({std::to_string(i + 1), displayNumber(p.fromCm) + "-" + displayNumber(p.toCm), displayNumber(p.count),
                  p.dt > 0.0 ? displayNumber(p.age) : "-", p.usable ? displayNumber(p.lnCdt) : "-",
                  p.selected ? "*" : (p.usable ? "" : "(cannot)")});
    }
    std::string out = t.render();
    if (r.used < 3 || r.slope == 0.0)  // no line was fitted (the estimate's problems say why)
        return out + "no regression line: " + std::to_string(r.used) + " usable point(s) marked *\n";
    out += "regression over the points marked *: ln(C/dt) = " + displayNumber(r.intercept) + " " +
           (r.slope < 0 ? "- " : "+ ") + displayNumber(std::abs(r.slope)) + " t, SE of the slope " +
           displayNumber(r.slopeSe) + ", r² " + displayNumber(r.r2) + "\n";
    return out;
}

std::string dietText(const StomachDiet& d)
{
    TextTable t;
    t.addColumn("prey", TextTable::Align::Left);
    t.addColumn(d.summary == DietSummary::Pooled ? "share (pooled)" : "share (mean of proportions)");
    t.addColumn("CV");
    t.addColumn(displayNumber(d.ciLevel * 100) + " % CI", TextTable::Align::Left);
    t.addColumn("mean of proportions");
    t.addColumn("pooled");
    for (const PreyShare& s : d.shares)
        t.addRow({s.prey, displayNumber(s.share), displayNumber(s.cv),
                  displayNumber(s.ciLow) + " to " + displayNumber(s.ciHigh), displayNumber(s.meanOfProportions),
                  displayNumber(s.pooled)});
    std::string out = "diet of " + d.predator + ": " + d.method + "; confidence grade " + std::string(gradeKey(d.grade)) +
                      " (" + std::to_string(d.stomachs - d.emptyStomachs) + " non-empty of " +
                      std::to_string(d.stomachs) + " stomachs)\n" + t.render();
    for (const Problem& p : d.warnings) out += "warning: " + p.message + "\n";
    return out;
}

}  // namespace tl::fieldwork
