// The report of a project (`tledger export --format html|pdf`, File > Report...): plain,
// self-contained HTML (charts inline as SVG, no style sheet, script, font or image
// fetched), for one scenario, every scenario, or a comparison of scenarios (issue 16).
//
// Contents: the caution that model output supports and does not replace stock
// assessment, local regulation and licensed professional judgement (under the title and
// at the end); the job and the system described (project notes, scenario descriptions);
// units and the meaning of the data-confidence grades; provenance (program version,
// project file and its SHA-256, scenarios, date). Per scenario: balance status, the
// checks still open, the inputs with their data confidence and source notes, the
// balance sheet, level bars with TE by level, the flow map, the impact matrix, the
// system indicators, and reconcile changes and stored ensemble/reconcile runs when the
// project holds them. A comparison adds, before the scenarios, the inputs that differ,
// the outputs that differ (absolute and percent, direction written as text), the level
// bars side by side and the largest relative changes (core/compare).
// All user text is escaped; solved values are marked *, status is in words.
#pragma once

#include <string>
#include <vector>

#include "core/io/report_svg.h"
#include "core/store/project.h"

namespace tl {

struct ReportProvenance {
    std::string programVersion;  // of the program writing the report
    std::string projectFile;     // the file's name, or empty
    std::string projectSha256;   // of the file's bytes (core/io/sha256.h), or empty
    std::string date;            // the day the report was made, YYYY-MM-DD (UTC)
};

struct ReportOptions {
    // Scenarios to report, by name (as pickScenarios matches them), in this order; empty:
    // every scenario of the project. With `compare`, the first is the reference.
    std::vector<std::string> scenarios;
    bool compare = false;
    ReportProvenance provenance;
    // For the PDF writer (ui/report): each figure's <svg> is replaced by a paragraph
    // holding only figureMarker(k), and the figures are returned apart.
    bool figureMarkers = false;
};

struct HtmlReport {
    std::string html;
    std::string title;
    std::vector<SvgFigure> figures;  // in document order (also when inline)
    std::string error;               // non-empty: nothing was made (an unknown scenario, ...)
};

HtmlReport makeHtmlReport(const Project& project, const ReportOptions& options);
// The marker text standing for figure k when ReportOptions::figureMarkers is set.
std::string figureMarker(std::size_t k);
// A report built with figure markers as the self-contained HTML built without them: each
// marker's paragraph replaced by its figure's SVG (byte for byte what makeHtmlReport
// writes without markers), so that a preview can be saved without building it again.
std::string withInlineFigures(const HtmlReport& report);

// Every scenario, no provenance: makeHtmlReport(project, {}).html.
std::string htmlReport(const Project& project);

}  // namespace tl
