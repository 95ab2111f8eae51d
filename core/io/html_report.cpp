#include "core/io/html_report.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <string_view>

#include "core/balance/solver.h"
#include "core/io/balance_report.h"

namespace tl {
namespace {

std::string html(std::string_view text)
{
    std::string out;
    for (char c : text) {
        switch (c) {
        case '&': out += "&amp;"; break;
        case '<': out += "&lt;"; break;
        case '>': out += "&gt;"; break;
        case '"': out += "&quot;"; break;
        case '\'': out += "&#39;"; break;
        default: out += c;
        }
    }
    return out;
}

// Four significant digits for reading; the exact values are in the JSON export.
std::string cell(double v, bool solved = false)
{
    if (std::isnan(v)) return "<td>-</td>";
    char text[32];
    std::snprintf(text, sizeof text, "%.4g", v);
    return std::string("<td>") + text + (solved ? "*" : "") + "</td>";
}

}  // namespace

std::string htmlReport(const Project& project)
{
    const Units& u = project.info.units;
    std::string out = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>" +
                      html(project.info.title) + "</title>\n<style>\n"
                      "body { font-family: sans-serif; margin: 2em; }\n"
                      "table { border-collapse: collapse; margin: 1em 0; }\n"
                      "th, td { border: 1px solid #999; padding: 0.2em 0.5em; text-align: right; }\n"
                      "th:first-child, td:first-child, td:nth-child(2) { text-align: left; }\n"
                      ".notice { border-left: 4px solid #555; padding-left: 0.8em; }\n"
                      "</style>\n</head>\n<body>\n";
    out += "<h1>" + html(project.info.title) + "</h1>\n";
    out += "<p class=\"notice\">" + html(kDecisionSupportNotice) + "</p>\n";
    if (!project.info.notes.empty()) out += "<p>" + html(project.info.notes) + "</p>\n";
    out += "<p>Biomass in " + html(u.biomass()) + "; flows (P, Q, R, catch) in " + html(u.flow()) + "; rates in " +
           html(u.rate()) + ". Values marked * were solved by the mass balance; the others are as given.</p>\n";
    for (const Scenario& s : project.scenarios) {
        const BalanceSheet sheet = solveBalance(s.model);
        out += "<h2>Scenario: " + html(s.name) + "</h2>\n";
        if (!s.description.empty()) out += "<p>" + html(s.description) + "</p>\n";
        // A duplicate is a frozen copy: say so, with the day it was made (ISO date).
        if (!s.parent.empty())
            out += "<p>Copied from scenario " + html(s.parent) + (s.created.size() >= 10 ? " on " + html(s.created.substr(0, 10)) : "") +
                   "; later edits of either do not reach the other.</p>\n";
        out += "<p>Balance status: <strong>" + html(statusKey(sheet.status)) + "</strong></p>\n";
        out += "<table>\n<tr><th>Compartment</th><th>Kind</th><th>TL</th><th>B</th><th>P/B</th><th>Q/B</th><th>EE</th>"
               "<th>P/Q</th><th>P</th><th>Q</th><th>R</th><th>Catch</th></tr>\n";
        for (const CompartmentBalance& row : sheet.rows) {
            auto solved = [&](Param p) { return std::find(row.solved.begin(), row.solved.end(), p) != row.solved.end(); };
            out += "<tr><td>" + html(row.name) + "</td><td>" + html(kindKey(row.kind)) + "</td>" + cell(row.tl) +
                   cell(row.biomass, solved(Param::Biomass)) + cell(row.pb, solved(Param::PB)) +
                   cell(row.qb, solved(Param::QB)) + cell(row.ee, solved(Param::EE)) + cell(row.pq, solved(Param::PQ)) +
                   cell(row.production) + cell(row.consumption) + cell(row.respiration) + cell(row.catchTotal) + "</tr>\n";
        }
        out += "</table>\n";
        if (!sheet.problems.empty()) {
            out += "<h3>Problems</h3>\n<ul>\n";
            for (const Problem& p : sheet.problems)
                out += "<li>" + html(severityKey(p.severity)) + ": " + html(p.message) +
                       (p.hint.empty() ? "" : " <em>" + html(p.hint) + "</em>") + "</li>\n";
            out += "</ul>\n";
        }
    }
    out += "</body>\n</html>\n";
    return out;
}

}  // namespace tl
