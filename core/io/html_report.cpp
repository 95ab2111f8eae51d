#include "core/io/html_report.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <string_view>

#include "core/balance/scenario_checks.h"
#include "core/compare/comparison_report.h"
#include "core/compare/scenario_comparison.h"
#include "core/io/balance_report.h"
#include "core/io/stored_run_summary.h"
#include "core/io/text_table.h"
#include "core/model/names.h"

namespace tl {
namespace {

std::string html(std::string_view text) { return xmlEscape(text); }

// Four significant digits for reading; the exact values are in the JSON export.
std::string cell(double v, bool solved = false)
{
    return "<td>" + html(displayNumber(v)) + (solved && !std::isnan(v) ? "*" : "") + "</td>";
}

std::string textCell(std::string_view text) { return "<td class=\"text\">" + html(text) + "</td>"; }

// Tables carry their borders as attributes too: Qt's rich text (the PDF) reads those,
// not the style sheet.
constexpr const char* kTable = "<table border=\"1\" cellspacing=\"0\" cellpadding=\"3\">\n";

// Figures taller than this (SVG pixels; a third of a printed page) begin a printed page.
constexpr double kTallFigure = 200.0;

class Writer {
public:
    explicit Writer(const ReportOptions& options) : options_(options) {}

    void add(std::string_view text) { out_ += text; }
    // `heading` (an h3) goes with the figure: a tall figure starts a new printed page with
    // its heading, so that no heading is left alone at the foot of a page (browsers and
    // Qt's rich text, which draws the PDF, both honour page-break-before).
    void figure(SvgFigure f, std::string_view heading)
    {
        const bool tall = !f.svg.empty() && f.height > kTallFigure;
        out_ += std::string(tall ? "<h3 style=\"page-break-before: always\">" : "<h3>") + html(heading) + "</h3>\n";
        const std::size_t k = figures_.size();
        out_ += "<div class=\"figure\">\n<p class=\"figure-title\"><strong>" + html(f.title) + "</strong></p>\n";
        if (f.svg.empty()) {
            out_ += "<p><em>" + html(f.caption) + "</em></p>\n</div>\n";
            figures_.push_back(std::move(f));
            return;
        }
        out_ += options_.figureMarkers ? "<p>" + figureMarker(k) + "</p>\n" : f.svg;
        out_ += "<p class=\"caption\">" + html(f.caption) + "</p>\n</div>\n";
        figures_.push_back(std::move(f));
    }
    std::string& text() { return out_; }
    std::vector<SvgFigure>& figures() { return figures_; }

private:
    const ReportOptions& options_;
    std::string out_;
    std::vector<SvgFigure> figures_;
};

std::string confidenceText(const Confidence& c, const BalanceRules& rules)
{
    if (c.cv) return "CV " + displayNumber(*c.cv);
    switch (c.grade) {
    case Confidence::Grade::A: return "A (CV " + displayNumber(rules.cvByGrade[0]) + ")";
    case Confidence::Grade::B: return "B (CV " + displayNumber(rules.cvByGrade[1]) + ")";
    case Confidence::Grade::C: return "C (CV " + displayNumber(rules.cvByGrade[2]) + ")";
    case Confidence::Grade::D: return "D (CV " + displayNumber(rules.cvByGrade[3]) + ")";
    case Confidence::Grade::None: break;
    }
    return "not graded";
}

std::string paramUnit(Param p, const Units& u)
{
    switch (p) {
    case Param::Biomass: return u.biomass();
    case Param::PB:
    case Param::QB: return u.rate();
    case Param::BiomassAccum:
    case Param::NetEmigration:
    case Param::DetritusImport: return u.flow();
    case Param::EE:
    case Param::PQ:
    case Param::Unassim: break;
    }
    return "";
}

void inputsTable(Writer& w, const Model& model)
{
    w.add("<h3>Inputs, data confidence and sources</h3>\n");
    w.add(kTable);
    w.add("<thead><tr><th>Compartment</th><th>Input</th><th>Value</th><th>Unit</th><th>Data confidence</th><th>Source</th></tr></thead>\n");
    std::size_t ungraded = 0, unsourced = 0, given = 0;
    for (const Compartment& c : model.compartments())
        for (Param p : kAllParams) {
            if (!c.value(p)) continue;
            const Confidence& conf = c.confidenceOf(p);
            ++given;
            if (conf.grade == Confidence::Grade::None && !conf.cv) ++ungraded;
            if (conf.source.empty()) ++unsourced;
            w.add("<tr>" + textCell(c.name) + textCell(paramSymbol(p)) + cell(*c.value(p)) + textCell(paramUnit(p, model.units)) +
                  textCell(confidenceText(conf, model.rules)) + textCell(conf.source.empty() ? "-" : conf.source) + "</tr>\n");
        }
    w.add("</table>\n<p>" + std::to_string(given) + " values given; " + std::to_string(ungraded) + " without a data-confidence grade, " +
          std::to_string(unsourced) + " without a source note. Empty values are solved by the balance or not applicable.</p>\n");
}

void balanceSheetTable(Writer& w, const BalanceSheet& sheet)
{
    w.add("<h3>Balance sheet</h3>\n");
    w.add(kTable);
    w.add("<thead><tr><th>Compartment</th><th>Kind</th><th>TL</th><th>B</th><th>P/B</th><th>Q/B</th><th>EE</th>"
          "<th>P/Q</th><th>P</th><th>Q</th><th>R</th><th>Catch</th></tr></thead>\n");
    for (const CompartmentBalance& row : sheet.rows) {
        const auto solved = [&](Param p) { return row.solved.contains(p); };
        w.add("<tr>" + textCell(row.name) + textCell(kindKey(row.kind)) + cell(row.tl) + cell(row.biomass, solved(Param::Biomass)) +
              cell(row.pb, solved(Param::PB)) + cell(row.qb, solved(Param::QB)) + cell(row.ee, solved(Param::EE)) +
              cell(row.pq, solved(Param::PQ)) + cell(row.production) + cell(row.consumption) + cell(row.respiration) +
              cell(row.catchTotal) + "</tr>\n");
    }
    w.add("</table>\n");
}

void checksList(Writer& w, const Model& model, const BalanceSheet& sheet)
{
    const Problems checks = scenarioChecks(model, sheet);
    w.add("<h3>Checks still open</h3>\n");
    if (checks.empty()) {
        w.add("<p>None: every input check and balance condition holds.</p>\n");
        return;
    }
    w.add("<ul>\n");
    for (const Problem& p : checks)
        w.add("<li><strong>" + html(severityKey(p.severity)) + "</strong> (" + html(p.code) + "): " + html(p.message) +
              (p.hint.empty() ? "" : " <em>" + html(p.hint) + "</em>") + "</li>\n");
    w.add("</ul>\n");
}

void levelTable(Writer& w, const NetworkAnalysis& a)
{
    w.add(kTable);
    w.add("<thead><tr><th>Level</th><th>Throughput (" + html(a.flowUnit()) + ")</th><th>Biomass (" + html(a.stockUnit()) +
          ")</th><th>Production (" + html(a.flowUnit()) + ")</th><th>Catch (" + html(a.flowUnit()) +
          ")</th><th>TE (%)</th></tr></thead>\n");
    for (const TrophicLevelBin& bin : a.levels.combined.levels) {
        if (bin.level > 12) break;  // deeper levels of long chains hold next to nothing
        w.add("<tr>" + textCell(levelName(bin.level)) + cell(bin.throughput) + cell(bin.biomass) + cell(bin.production) +
              cell(bin.catchTotal) + (bin.level == 1 ? textCell("not defined") : cell(100 * bin.te)) + "</tr>\n");
    }
    w.add("</table>\n<p>At level I, in place of a transfer efficiency: share of primary production consumed " +
          html(displayNumber(a.levels.primaryProductionConsumed)) + ", share of detritus inflow consumed " +
          html(displayNumber(a.levels.detritusInflowConsumed)) + ".</p>\n");
}

void indicatorTable(Writer& w, const ScenarioComparison& one)
{
    w.add("<h3>System indicators</h3>\n");
    w.add(kTable);
    w.add("<thead><tr><th>Indicator</th><th>Value</th><th>Unit</th></tr></thead>\n");
    for (const ComparedOutput& o : one.outputs)
        if (o.group == OutputGroup::System)
            w.add("<tr>" + textCell(o.label) + cell(o.values.front()) + textCell(o.unit) + "</tr>\n");
    w.add("</table>\n<p>Definitions and sources: Finn 1976 (TST, cycling, path length); Ulanowicz 1986, 2004 "
          "(ascendency, capacity, overhead, bits); Christensen &amp; Pauly 1993 (system omnivory); Pauly &amp; "
          "Christensen 1995 (primary production required); Pauly et al. 1998 (mean TL of the catch).</p>\n");
}

std::string optionalCell(const std::optional<double>& v) { return v ? cell(*v) : textCell("-"); }

std::string keyOutputUnit(KeyOutputUnit unit, const Units& u)
{
    switch (unit) {
    case KeyOutputUnit::Percent: return "%";
    case KeyOutputUnit::Flow: return u.flow();
    case KeyOutputUnit::Biomass: return u.biomass();
    case KeyOutputUnit::None: break;
    }
    return "-";
}

constexpr long long kFewBalancedDraws = 100;

std::string runDate(const StoredRun& run) { return run.created.size() >= 10 ? run.created.substr(0, 10) : run.created; }

// The reconcile JSON's parameter keys (core/reconcile adjustKey) as the report's symbols.
std::string changedInput(const ReconcileRunSummary::Change& c)
{
    if (c.parameter == "diet") return "diet share of " + c.prey;
    if (c.parameter == "b") return "B";
    if (c.parameter == "pb") return "P/B";
    if (c.parameter == "qb") return "Q/B";
    return c.parameter;
}

// Reconcile changes: from the reconcile run stored with the scenario it made; a project
// reconciled before runs were stored has only the source notes the reconcile wrote.
void reconcileChanges(Writer& w, const Project& project, const Scenario& s)
{
    bool stored = false;
    for (const StoredRun& run : project.runs) {
        if (run.kind != "reconcile" || !sameName(run.scenario, s.name)) continue;
        stored = true;
        const ReconcileRunSummary r = readReconcileRun(run);
        w.add("<h3>Reconcile changes (" + html(runDate(run)) + ")</h3>\n");
        if (!r.error.empty()) {
            w.add("<p><em>" + html(r.error) + "; the changes cannot be shown.</em></p>\n");
            continue;
        }
        w.add("<p>Made by reconciling scenario <strong>" + html(r.from) + "</strong>: " +
              html(r.status == "least_violating" ? "no balanced answer; the least-violating one"
                   : r.status.empty()            ? "status not stored"
                                                 : r.status) +
              ", balance after the changes: <strong>" + html(r.balanceAfter.empty() ? "not stored" : r.balanceAfter) + "</strong>; " +
              std::to_string(r.changes.size()) + " inputs changed.</p>\n");
        if (r.changes.empty()) continue;
        w.add(kTable);
        w.add("<thead><tr><th>Compartment</th><th>Input</th><th>Before</th><th>After</th><th>Change (%)</th><th>Confidence used</th></tr></thead>\n");
        for (const ReconcileRunSummary::Change& c : r.changes)
            w.add("<tr>" + textCell(c.compartment) + textCell(changedInput(c)) +
                  cell(c.before) + cell(c.after) + cell(c.percent) + textCell(c.confidence.empty() ? "-" : c.confidence) + "</tr>\n");
        w.add("</table>\n");
    }
    if (stored) return;
    std::vector<std::string> notes;
    for (const Compartment& c : s.model.compartments())
        for (Param p : kAllParams) {
            const std::string& source = c.confidenceOf(p).source;
            if (source.find("reconciled") != std::string::npos)
                notes.push_back(c.name + " " + std::string(paramSymbol(p)) + ": " + source);
        }
    if (notes.empty()) return;
    w.add("<h3>Reconcile changes</h3>\n<p>No reconcile run is stored with this scenario; its source notes say which inputs "
          "a reconcile changed:</p>\n<ul>\n");
    for (const std::string& n : notes) w.add("<li>" + html(n) + "</li>\n");
    w.add("</ul>\n");
}

// A stored ensemble as a summary: draws, seed, balanced share, a percentile table of the
// key system outputs and the compartments that broke the balance most often.
void ensembleSummaries(Writer& w, const Project& project, const Scenario& s)
{
    for (const StoredRun& run : project.runs) {
        if (!sameName(run.scenario, s.name) || run.kind == "reconcile") continue;
        if (run.kind != "ensemble") {
            w.add("<p>A stored " + html(run.kind) + " run of " + html(runDate(run)) + " is kept in the project (not summarised "
                  "in this report).</p>\n");
            continue;
        }
        const EnsembleRunSummary e = readEnsembleRun(run);
        w.add("<h3>Ensemble of " + html(runDate(run)) + "</h3>\n");
        if (!e.error.empty()) {
            w.add("<p><em>" + html(e.error) + "; the ensemble cannot be summarised.</em></p>\n");
            continue;
        }
        w.add("<p>" + std::to_string(e.draws) + " draws" +
              (e.totalDraws > e.draws ? " of " + std::to_string(e.totalDraws) + " planned" : std::string()) + ", seed " +
              html(e.seed.empty() ? "not stored" : e.seed) + (e.shape.empty() ? "" : ", inputs drawn " + html(e.shape)) +
              "; balanced in " + std::to_string(e.balancedDraws) + " draws (<strong>" + html(displayNumber(100.0 * e.balancedShare)) +
              " %</strong>).</p>\n");
        // Few balanced draws make the outer percentiles little more than the extremes (common
        // practice, no source: a few hundred draws for a 95 % interval).
        if (e.balancedDraws > 0 && e.balancedDraws < kFewBalancedDraws)
            w.add("<p><strong>Only " + std::to_string(e.balancedDraws) + " draws balanced:</strong> the percentiles below rest "
                  "on few draws; reconcile the scenario or check its data-confidence grades before reading them.</p>\n");
        if (e.cancelled || !e.complete)
            w.add("<p><strong>Incomplete run:</strong> the figures cover only the draws finished.</p>\n");
        if (e.keyOutputs.empty()) {
            w.add("<p>The run holds neither system outputs nor EE to summarise here.</p>\n");
        } else {
            w.add(kTable);
            w.add("<thead><tr><th>Output</th><th>Unit</th><th>2.5 %</th><th>Median</th><th>97.5 %</th><th>Mean</th><th>Draws</th></tr></thead>\n");
            for (const EnsembleRunSummary::Row& r : e.keyOutputs)
                w.add("<tr>" + textCell(r.label) + textCell(keyOutputUnit(r.unit, s.model.units)) + optionalCell(r.p2_5) +
                      optionalCell(r.p50) + optionalCell(r.p97_5) + optionalCell(r.mean) + "<td>" + std::to_string(r.count) +
                      "</td></tr>\n");
            w.add("</table>\n<p class=\"caption\">Percentiles over the balanced draws, as stored with the run" +
                  (e.outputsLeftOut ? "; " + std::to_string(e.outputsLeftOut) + " more compartments' EE" : std::string()) +
                  ". Every output of every compartment is in the project's stored run (<code>tledger ensemble --json</code> "
                  "prints the same for a new run).</p>\n");
        }
        if (!e.breakers.empty()) {
            std::string list;
            for (std::size_t k = 0; k < std::min<std::size_t>(5, e.breakers.size()); ++k)
                list += (k ? "; " : "") + e.breakers[k].compartment + " " + std::to_string(e.breakers[k].draws) + " draws (" +
                        displayNumber(100.0 * e.breakers[k].share) + " %)";
            w.add("<p>Compartments that most often broke the balance: " + html(list) + ".</p>\n");
        }
    }
}

// `newPage`: printed from the top of a page (every scenario after a first one, or after a comparison).
void scenarioSection(Writer& w, const Project& project, const Scenario& s, const BalanceSheet& sheet,
                     const NetworkAnalysis& a, const ScenarioComparison& one, bool newPage)
{
    w.add(std::string(newPage ? "<h2 style=\"page-break-before: always\">" : "<h2>") + "Scenario: " + html(s.name) + "</h2>\n");
    if (!s.description.empty()) w.add("<p>" + html(s.description) + "</p>\n");
    // A duplicate is a frozen copy: say so, with the day it was made (ISO date).
    if (!s.parent.empty())
        w.add("<p>Copied from scenario " + html(s.parent) + (s.created.size() >= 10 ? " on " + html(s.created.substr(0, 10)) : "") +
              "; later edits of either do not reach the other.</p>\n");
    w.add("<p>Balance status: <strong>" + html(statusKey(sheet.status)) + "</strong></p>\n");
    checksList(w, s.model, sheet);
    inputsTable(w, s.model);
    balanceSheetTable(w, sheet);
    w.figure(levelBarsSvg(a), "Trophic levels");
    if (a.available()) levelTable(w, a);
    w.figure(flowMapSvg(a), "Flow map");
    w.figure(impactMatrixSvg(a), "Impact matrix");
    if (a.available()) indicatorTable(w, one);
    reconcileChanges(w, project, s);
    ensembleSummaries(w, project, s);
}

void comparisonSection(Writer& w, const ScenarioComparison& c)
{
    const std::size_t n = c.scenarios.size();
    w.add("<h2>Comparison</h2>\n<p>Reference: <strong>" + html(c.scenarios.front()) + "</strong>. Differences are each "
          "scenario minus the reference; percent of the reference value (undefined where the reference is 0).</p>\n");
    w.add("<h3>Inputs that differ (" + std::to_string(c.inputs.size()) + ")</h3>\n");
    if (c.inputs.empty()) w.add("<p>None: the scenarios have the same inputs.</p>\n");
    else {
        w.add(kTable);
        w.add("<thead><tr><th>Compartment</th><th>Input</th>");
        for (const std::string& s : c.scenarios) w.add("<th>" + html(s) + "</th>");
        w.add("<th>What differs</th><th>Source notes</th></tr></thead>\n");
        for (const InputDifference& d : c.inputs) {
            w.add("<tr>" + textCell(d.compartment.empty() ? "(fleet)" : d.compartment) + textCell(d.label));
            for (const std::string& v : d.shown) w.add(textCell(v));
            std::string what = d.valueDiffers ? "value" : "";
            if (d.confidenceDiffers) what += std::string(what.empty() ? "" : ", ") + "confidence";
            if (d.sourceDiffers) what += std::string(what.empty() ? "" : ", ") + "source note";
            std::string sources;
            for (std::size_t s = 0; s < d.sources.size(); ++s)
                if (!d.sources[s].empty()) sources += (sources.empty() ? "" : "; ") + c.scenarios[s] + ": " + d.sources[s];
            w.add(textCell(what) + textCell(sources.empty() ? "-" : sources) + "</tr>\n");
        }
        w.add("</table>\n");
    }
    const std::size_t differing = c.differingOutputs();
    w.add("<h3>Outputs that differ (" + std::to_string(differing) + " of " + std::to_string(c.outputs.size()) + ")</h3>\n");
    if (differing == 0) w.add("<p>None.</p>\n");
    else {
        w.add(kTable);
        w.add("<thead><tr><th>Subject</th><th>Output</th><th>Unit</th>");
        for (const std::string& s : c.scenarios) w.add("<th>" + html(s) + "</th>");
        for (std::size_t s = 1; s < n; ++s) w.add("<th>Change, " + html(c.scenarios[s]) + "</th>");
        w.add("</tr></thead>\n");
        for (const ComparedOutput& o : c.outputs) {
            if (!o.differs()) continue;
            const std::string subject = o.group == OutputGroup::System ? "system"
                                        : o.group == OutputGroup::Level ? std::string("level ").append(o.subject)
                                                                        : o.subject;
            w.add("<tr>" + textCell(subject) + textCell(o.label) + textCell(o.unit));
            for (double v : o.values) w.add(cell(v));
            for (std::size_t s = 1; s < n; ++s) {
                const OutputDifference& d = o.differences[s];
                const std::string arrow = !d.differs ? "= " : d.absolute > 0 ? "▲ up " : d.absolute < 0 ? "▼ down " : "≠ ";
                std::string text = arrow;
                if (!std::isnan(d.absolute)) text += (d.absolute > 0 ? "+" : "") + displayNumber(d.absolute) + " (" + percentText(d) + ")";
                else if (d.differs) text += "(available in one only)";
                w.add(textCell(text));
            }
            w.add("</tr>\n");
        }
        w.add("</table>\n");
    }
    w.figure(levelBarsComparisonSvg(c), "Level bars side by side");
    for (std::size_t s = 1; s < n; ++s) {
        w.figure(relativeChangesSvg(c, s), "Largest relative changes: " + c.scenarios[s]);
    }
    const bool anyEnsemble = std::any_of(c.outputs.begin(), c.outputs.end(), [](const ComparedOutput& o) {
        return std::any_of(o.differences.begin(), o.differences.end(), [](const OutputDifference& d) { return d.sameSignShare.has_value(); });
    });
    if (!anyEnsemble)
        w.add("<p>No ensembles of these scenarios are attached, so whether a difference exceeds the uncertainty of the "
              "inputs is not assessed here.</p>\n");
}

}  // namespace

std::string figureMarker(std::size_t k) { return "@@tl-figure-" + std::to_string(k) + "@@"; }

HtmlReport makeHtmlReport(const Project& project, const ReportOptions& options)
{
    HtmlReport report;
    // The scenarios, in the order asked.
    std::vector<const Scenario*> picked;
    if (options.compare) {
        picked = pickScenarios(project, options.scenarios, report.error);
        if (picked.empty()) return report;
    } else if (options.scenarios.empty()) {
        for (const Scenario& s : project.scenarios) picked.push_back(&s);
    } else {
        for (const std::string& name : options.scenarios) {
            const Scenario* found = nullptr;
            for (const Scenario& s : project.scenarios)
                if (sameName(s.name, name)) found = &s;
            if (!found) {
                std::string names;
                for (const std::string& n : project.scenarioNames()) names += (names.empty() ? "'" : ", '") + n + "'";
                report.error = "no scenario named '" + name + "'; the project has " + names;
                return report;
            }
            picked.push_back(found);
        }
    }

    const Units& u = project.info.units;
    const std::string title = project.info.title.empty() ? "Untitled project" : project.info.title;
    report.title = (options.compare ? "Comparison report: " : "Report: ") + title;
    Writer w(options);
    w.add("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>" + html(report.title) +
          "</title>\n<style>\n"
          "body { font-family: sans-serif; margin: 2em; max-width: 64em; }\n"
          "table { border-collapse: collapse; margin: 1em 0; }\n"
          "th, td { border: 1px solid #999; padding: 0.2em 0.5em; text-align: right; }\n"
          "th:first-child, td.text { text-align: left; }\n"
          ".notice { border-left: 4px solid #555; padding-left: 0.8em; font-weight: bold; }\n"
          ".caption { font-size: 90%; color: #333; max-width: 60em; }\n"
          "svg { max-width: 100%; height: auto; }\n"
          "</style>\n</head>\n<body>\n");
    w.add("<h1>" + html(report.title) + "</h1>\n");
    w.add("<p class=\"notice\">" + html(kDecisionSupportNotice) + "</p>\n");

    w.add("<h2>The job and the system</h2>\n");
    w.add(project.info.notes.empty() ? "<p><em>The project holds no description of the system or the job.</em></p>\n"
                                     : "<p>" + html(project.info.notes) + "</p>\n");
    w.add("<ul>\n");
    for (const Scenario* s : picked)
        w.add("<li><strong>" + html(s->name) + "</strong>: " + (s->description.empty() ? "no description" : html(s->description)) +
              " (" + std::to_string(s->model.size()) + " compartments, " + std::to_string(s->model.fleets().size()) +
              " fleets)</li>\n");
    w.add("</ul>\n");
    w.add("<h3>Units</h3>\n<p>Biomass in " + html(u.biomass()) + "; flows (P, Q, R, catch, throughput) in " + html(u.flow()) +
          "; rates (P/B, Q/B, mortalities) per " + html(u.time) + ". EE, P/Q, TL and TE have no unit. Values marked * were "
          "solved by the mass balance (Polovina 1984; Christensen &amp; Pauly 1992); the others are as given. Data-confidence "
          "grades stand for a coefficient of variation (CV) of A " + html(displayNumber(project.info.rules.cvByGrade[0])) +
          ", B " + html(displayNumber(project.info.rules.cvByGrade[1])) + ", C " + html(displayNumber(project.info.rules.cvByGrade[2])) +
          ", D " + html(displayNumber(project.info.rules.cvByGrade[3])) + " (this project's convention).</p>\n");

    const ReportProvenance& p = options.provenance;
    w.add("<h3>Provenance</h3>\n");
    w.add(kTable);
    w.add("<tr><th>Program</th>" + textCell("Trophic Ledger " + (p.programVersion.empty() ? std::string("(version not given)") : p.programVersion)) + "</tr>\n");
    w.add("<tr><th>Project file</th>" + textCell(p.projectFile.empty() ? "(not from a file)" : p.projectFile) + "</tr>\n");
    w.add("<tr><th>Project SHA-256</th>" + textCell(p.projectSha256.empty() ? "(not from a file)" : p.projectSha256) + "</tr>\n");
    std::string names;
    for (const Scenario* s : picked) names += (names.empty() ? "" : ", ") + s->name;
    w.add("<tr><th>Scenarios</th>" + textCell(names) + "</tr>\n");
    w.add("<tr><th>Report date</th>" + textCell(p.date.empty() ? "(not given)" : p.date + " (UTC)") + "</tr>\n");
    w.add("<tr><th>Project last saved</th>" + textCell(project.info.modified.empty() ? "-" : project.info.modified) + "</tr>\n");
    w.add("</table>\n");

    ScenarioComparison all;
    if (options.compare) {
        all = compareScenarios(picked);
        comparisonSection(w, all);
    }
    for (std::size_t k = 0; k < picked.size(); ++k) {
        const Scenario& s = *picked[k];
        // One scenario's own figures: a comparison of one (its outputs are the indicators).
        const ScenarioComparison one = compareScenarios({&s});
        scenarioSection(w, project, s, one.sheets.front(), one.analyses.front(), one, k > 0 || options.compare);
    }
    w.add("<hr>\n<p class=\"notice\">" + html(kDecisionSupportNotice) + "</p>\n");
    w.add("<p>Made by Trophic Ledger " + html(p.programVersion) + (p.date.empty() ? "" : " on " + html(p.date)) +
          (p.projectSha256.empty() ? "" : " from " + html(p.projectFile) + " (SHA-256 " + html(p.projectSha256) + ")") + ".</p>\n");
    w.add("</body>\n</html>\n");
    report.html = std::move(w.text());
    report.figures = std::move(w.figures());
    return report;
}

std::string withInlineFigures(const HtmlReport& report)
{
    std::string out;
    out.reserve(report.html.size());
    std::size_t from = 0;
    for (std::size_t k = 0; k < report.figures.size(); ++k) {
        if (report.figures[k].svg.empty()) continue;  // written as its caption, with no marker
        const std::string marker = "<p>" + figureMarker(k) + "</p>\n";
        const std::size_t at = report.html.find(marker, from);
        if (at == std::string::npos) continue;  // a report built without markers
        out.append(report.html, from, at - from);
        out += report.figures[k].svg;
        from = at + marker.size();
    }
    out.append(report.html, from, std::string::npos);
    return out;
}

std::string htmlReport(const Project& project) { return makeHtmlReport(project, {}).html; }

}  // namespace tl
