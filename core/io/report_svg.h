// The charts of a report as plain SVG text (issue 16): self-contained (no fonts, scripts
// or links fetched), drawn with attributes only so that Qt's SVG renderer draws the same
// vector picture into the PDF (ui/report). No science here: every number comes from the
// network analysis (core/network/network_analysis.h) or the comparison
// (core/compare/scenario_comparison.h). Status and sign are written as text beside the
// colour, never by colour alone; colours are the Okabe-Ito palette (as ui/style/palette.h:
// producers bluish green, consumers blue, detritus orange) and, for impacts, a diverging
// purple-green scheme (core/io/impact_colour_ramp.h, shared with the workbench).
#pragma once

#include <cstddef>
#include <string>
#include <string_view>

#include "core/compare/scenario_comparison.h"
#include "core/network/network_analysis.h"

namespace tl {

struct SvgFigure {
    std::string title;    // also the SVG's aria-label
    std::string svg;      // a whole <svg> element; empty when there is nothing to draw
    std::string caption;  // what is drawn and how to read it (or why nothing is)
    double width = 0.0, height = 0.0;
};

// & < > " ' as entities: for HTML text and attributes and for SVG alike.
std::string xmlEscape(std::string_view text);

// Level bars: one horizontal bar per integer trophic level, stacked by the compartments
// contributing to it (share s_jk x throughput T_j, Ulanowicz 1995), centred as a pyramid;
// linear scale, the level's total and TE written beside each bar.
SvgFigure levelBarsSvg(const NetworkAnalysis& analysis);

// Flow map: trophic level left to right, boxes whose area follows biomass, feeding flows
// as curved ribbons whose width follows the log of the flow, detritus pools on a lane
// along the bottom. Up to kFlowMapSvgLimit compartments (more would not be legible on a
// page; the workbench's flow map zooms).
inline constexpr std::size_t kFlowMapSvgLimit = 60;
SvgFigure flowMapSvg(const NetworkAnalysis& analysis);

// Impact matrix (mixed trophic impact, Ulanowicz & Puccia 1990): row acts on column,
// green positive, purple negative, up to kImpactMatrixSvgLimit rows.
inline constexpr std::size_t kImpactMatrixSvgLimit = 45;
SvgFigure impactMatrixSvg(const NetworkAnalysis& analysis);

// The level throughputs of every scenario of a comparison side by side on one axis.
SvgFigure levelBarsComparisonSvg(const ScenarioComparison& comparison);

// The compartment outputs of scenario `s` with the largest relative change against the
// reference (largestRelativeChanges), as bars from zero with the percent written out.
SvgFigure relativeChangesSvg(const ScenarioComparison& comparison, std::size_t s, std::size_t count = 15);

}  // namespace tl
