#include "core/io/report_svg.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <map>

#include "core/compare/comparison_report.h"
#include "core/io/impact_colour_ramp.h"
#include "core/io/text_table.h"

namespace tl {
namespace {

// Okabe & Ito (2008), "Color Universal Design": the palette of ui/style/palette.h.
constexpr const char* kBluishGreen = "#009E73";
constexpr const char* kBlue = "#0072B2";
constexpr const char* kOrange = "#E69F00";
constexpr const char* kVermillion = "#D55E00";
constexpr const char* kSkyBlue = "#56B4E9";
constexpr const char* kReddishPurple = "#CC79A7";
constexpr std::array<const char*, 5> kScenarioColours = {kBlue, kVermillion, kBluishGreen, kReddishPurple, kSkyBlue};

std::string num(double v)
{
    char text[32];
    std::snprintf(text, sizeof text, "%.1f", v);
    return text;
}

const char* roleColour(NodeRole role)
{
    switch (role) {
    case NodeRole::Producer: return kBluishGreen;
    case NodeRole::Consumer: return kBlue;
    case NodeRole::Detritus: return kOrange;
    }
    return kBlue;
}

// Text that stays legible on the fill (white on the dark blue, black elsewhere).
const char* textOn(const char* fill) { return std::string_view(fill) == kBlue || std::string_view(fill) == kVermillion ? "#ffffff" : "#000000"; }

// About the width of `text` at `size` px in a sans-serif face (0.56 em a character; an
// estimate for deciding whether a label fits, common practice, no source).
double textWidth(std::string_view text, double size)
{
    std::size_t chars = 0;
    for (unsigned char c : text)
        if ((c & 0xC0) != 0x80) ++chars;  // count UTF-8 characters, not bytes
    return 0.56 * size * static_cast<double>(chars);
}

class Svg {
public:
    Svg(double width, double height, std::string_view label) : width_(width), height_(height)
    {
        out_ = "<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.2\" baseProfile=\"tiny\" width=\"" + num(width) +
               "\" height=\"" + num(height) + "\" viewBox=\"0 0 " + num(width) + " " + num(height) +
               "\" font-family=\"DejaVu Sans, Arial, sans-serif\" font-size=\"11\" role=\"img\" aria-label=\"" +
               xmlEscape(label) + "\">\n";
        out_ += "<rect x=\"0\" y=\"0\" width=\"" + num(width) + "\" height=\"" + num(height) + "\" fill=\"#ffffff\"/>\n";
    }
    void rect(double x, double y, double w, double h, std::string_view fill, std::string_view tooltip = {},
              std::string_view stroke = "none")
    {
        out_ += "<rect x=\"" + num(x) + "\" y=\"" + num(y) + "\" width=\"" + num(std::max(w, 0.0)) + "\" height=\"" +
                num(std::max(h, 0.0)) + "\" fill=\"" + std::string(fill) + "\" stroke=\"" + std::string(stroke) + "\"";
        closeWithTooltip("rect", tooltip);
    }
    void line(double x1, double y1, double x2, double y2, std::string_view stroke = "#444444", double width = 1.0)
    {
        out_ += "<line x1=\"" + num(x1) + "\" y1=\"" + num(y1) + "\" x2=\"" + num(x2) + "\" y2=\"" + num(y2) +
                "\" stroke=\"" + std::string(stroke) + "\" stroke-width=\"" + num(width) + "\"/>\n";
    }
    void text(double x, double y, std::string_view content, std::string_view anchor = "start", double size = 11,
              std::string_view fill = "#000000", bool bold = false)
    {
        out_ += "<text x=\"" + num(x) + "\" y=\"" + num(y) + "\" text-anchor=\"" + std::string(anchor) +
                "\" font-size=\"" + num(size) + "\" fill=\"" + std::string(fill) + "\"" +
                (bold ? " font-weight=\"bold\"" : "") + ">" + xmlEscape(content) + "</text>\n";
    }
    void ribbon(double x1, double y1, double x2, double y2, double width, std::string_view tooltip)
    {
        const double dx = std::max(30.0, std::abs(x2 - x1) / 2);
        out_ += "<path d=\"M" + num(x1) + "," + num(y1) + " C" + num(x1 + dx) + "," + num(y1) + " " + num(x2 - dx) + "," +
                num(y2) + " " + num(x2) + "," + num(y2) + "\" fill=\"none\" stroke=\"#5b7c99\" stroke-opacity=\"0.45\" stroke-width=\"" +
                num(width) + "\"";
        closeWithTooltip("path", tooltip);
    }
    std::string finish()
    {
        out_ += "</svg>\n";
        return std::move(out_);
    }
    double width() const { return width_; }
    double height() const { return height_; }

private:
    // A <title> child is the tooltip a browser shows on hover.
    void closeWithTooltip(std::string_view element, std::string_view tooltip)
    {
        if (tooltip.empty()) {
            out_ += "/>\n";
            return;
        }
        out_ += "><title>";
        out_ += xmlEscape(tooltip);
        out_ += "</title></";
        out_ += element;
        out_ += ">\n";
    }

    double width_, height_;
    std::string out_;
};

SvgFigure figure(std::string title, Svg& svg, std::string caption)
{
    SvgFigure f;
    f.title = std::move(title);
    f.width = svg.width();
    f.height = svg.height();
    f.svg = svg.finish();
    f.caption = std::move(caption);
    return f;
}

SvgFigure nothingToDraw(std::string title, std::string why)
{
    SvgFigure f;
    f.title = std::move(title);
    f.caption = std::move(why);
    return f;
}

void kindLegend(Svg& svg, double y)
{
    double x = 20;
    for (const auto& [colour, label] : {std::pair{kBluishGreen, "producer"}, std::pair{kBlue, "consumer"},
                                         std::pair{kOrange, "detritus pool"}}) {
        svg.rect(x, y - 10, 12, 12, colour);
        svg.text(x + 17, y, label);
        x += 30 + textWidth(label, 11);
    }
}

}  // namespace

std::string xmlEscape(std::string_view text)
{
    std::string out;
    out.reserve(text.size());
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

SvgFigure levelBarsSvg(const NetworkAnalysis& a)
{
    const std::string title = "Level bars: throughput by integer trophic level";
    if (!a.available()) return nothingToDraw(title, "No level bars: the scenario has no flow network.");
    const ChainDecomposition& c = a.levels.combined;
    std::vector<std::size_t> shown;  // levels with something in them
    double largest = 0.0;
    for (std::size_t k = 0; k < c.levels.size(); ++k) largest = std::max(largest, c.levels[k].throughput);
    for (std::size_t k = 0; k < c.levels.size(); ++k)
        if (c.levels[k].throughput > 1e-4 * largest) shown.push_back(k);
    if (shown.empty() || !(largest > 0)) return nothingToDraw(title, "No level bars: no throughput.");
    const double width = 700, left = 40, barArea = 470, barHeight = 26, gap = 10, top = 16;
    const double height = top + static_cast<double>(shown.size()) * (barHeight + gap) + 40;
    Svg svg(width, height, title);
    const double centre = left + barArea / 2;
    const std::string unit = a.flowUnit();
    for (std::size_t row = 0; row < shown.size(); ++row) {
        const std::size_t k = shown[row];
        const TrophicLevelBin& bin = c.levels[k];
        const double y = top + static_cast<double>(row) * (barHeight + gap);
        const double total = bin.throughput / largest * barArea;
        double x = centre - total / 2;
        svg.text(8, y + barHeight / 2 + 4, levelName(bin.level), "start", 12, "#000000", true);
        for (std::size_t j = 0; j < a.network.size() && static_cast<Eigen::Index>(k) < c.share.cols(); ++j) {
            const double v = c.share(static_cast<Eigen::Index>(j), static_cast<Eigen::Index>(k)) * a.network.throughflow(j);
            if (!(v > 0)) continue;
            const double w = v / largest * barArea;
            const char* fill = roleColour(a.network.roles[j]);
            svg.rect(x, y, w, barHeight, fill, a.network.names[j] + ": " + displayNumber(v) + " " + unit, "#ffffff");
            if (w > textWidth(a.network.names[j], 10) + 6) svg.text(x + w / 2, y + barHeight / 2 + 4, a.network.names[j], "middle", 10, textOn(fill));
            x += w;
        }
        std::string note = displayNumber(bin.throughput);  // the unit is in the caption
        if (!std::isnan(bin.te)) note += ", TE " + displayNumber(100 * bin.te) + " %";
        svg.text(left + barArea + 12, y + barHeight / 2 + 4, note);
    }
    kindLegend(svg, height - 14);
    std::string caption = "Throughput at each integer trophic level (Ulanowicz 1995), stacked by the compartments "
                          "contributing to it, in " + unit + "; linear scale. TE: transfer efficiency to the next level "
                          "(not defined at level I). Mean TE of levels II-IV: " +
                          (std::isnan(c.meanTe) ? std::string("undefined") : displayNumber(100 * c.meanTe) + " %") + ".";
    if (shown.size() < c.levels.size()) caption += " Levels holding less than 0.01 % of the largest are left out.";
    return figure(title, svg, caption);
}

SvgFigure flowMapSvg(const NetworkAnalysis& a)
{
    const std::string title = "Flow map: feeding flows by trophic level";
    if (!a.available()) return nothingToDraw(title, "No flow map: the scenario has no flow network.");
    const FlowNetwork& net = a.network;
    const std::size_t n = net.size();
    if (n > kFlowMapSvgLimit)
        return nothingToDraw(title, "The flow map of " + std::to_string(n) + " compartments is not legible on a page (up to " +
                                        std::to_string(kFlowMapSvgLimit) +
                                        " are drawn here); the workbench's Flow map zooms and hides small flows.");
    double maxTl = 1.0, maxB = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        if (std::isfinite(a.tl[i])) maxTl = std::max(maxTl, a.tl[i]);
        // Scaled to the living compartments: a detritus stock would shrink them all.
        if (std::isfinite(net.stocks[i]) && net.isLiving(i)) maxB = std::max(maxB, net.stocks[i]);
    }
    // Living compartments in columns of half a trophic level; pools on the bottom lane.
    const double width = 800, left = 70, right = 90, top = 40, rowHeight = 64;
    const double perLevel = (width - left - right) / std::max(1.0, maxTl - 1.0);
    std::map<int, std::vector<std::size_t>> columns;
    std::vector<std::size_t> pools;
    for (std::size_t i = 0; i < n; ++i) {
        if (!net.isLiving(i)) pools.push_back(i);
        else columns[static_cast<int>(std::lround(((std::isfinite(a.tl[i]) ? a.tl[i] : 1.0) - 1.0) * 2.0))].push_back(i);
    }
    std::size_t tallest = pools.empty() ? 0 : 1;
    for (auto& [_, members] : columns) {
        std::sort(members.begin(), members.end(), [&](std::size_t x, std::size_t y) { return a.tl[x] > a.tl[y]; });
        tallest = std::max(tallest, members.size());
    }
    const double lane = top + static_cast<double>(tallest) * rowHeight + 30;
    const double height = lane + 90;
    std::vector<double> cx(n), cy(n), side(n);
    for (std::size_t i = 0; i < n; ++i) {
        const double b = net.stocks[i];
        side[i] = std::clamp(maxB > 0 && b > 0 ? 40.0 * std::sqrt(b / maxB) : 0.0, 7.0, 40.0);  // area ~ biomass
    }
    std::vector<bool> labelAbove(n, false);  // alternate columns label above the box, so neighbours' labels do not meet
    for (auto& [column, members] : columns)
        for (std::size_t r = 0; r < members.size(); ++r) {
            const std::size_t i = members[r];
            cx[i] = left + (std::isfinite(a.tl[i]) ? a.tl[i] - 1.0 : 0.0) * perLevel;
            cy[i] = top + rowHeight / 2 + static_cast<double>(r) * rowHeight;
            labelAbove[i] = column % 2 != 0;
        }
    for (std::size_t r = 0; r < pools.size(); ++r) {
        cx[pools[r]] = left + (static_cast<double>(r) + 0.5) * (width - left - right) / static_cast<double>(pools.size());
        cy[pools[r]] = lane + 25;
    }
    Svg svg(width, height, title);
    // Trophic level axis.
    for (int level = 1; level <= static_cast<int>(std::ceil(maxTl)); ++level) {
        const double x = left + (level - 1) * perLevel;
        svg.line(x, top - 12, x, lane - 10, "#dddddd");
        svg.text(x, top - 16, "TL " + std::to_string(level), "middle", 10, "#555555");
    }
    svg.line(left - 60, lane, width - 20, lane, "#bbbbbb");
    svg.text(left - 60, lane + 14, "detritus", "start", 10, "#555555");
    // Ribbons: width follows log10 of the flow over the range of the feeding flows.
    double fmin = 0, fmax = 0;
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j < n; ++j) {
            const double f = net.flows(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j));
            if (f > 0 && net.isLiving(j) && i != j) {
                fmin = fmin == 0 ? f : std::min(fmin, f);
                fmax = std::max(fmax, f);
            }
        }
    const double span = fmax > fmin ? std::log10(fmax / fmin) : 1.0;
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j < n; ++j) {
            const double f = net.flows(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j));
            if (!(f > 0) || !net.isLiving(j) || i == j) continue;
            const double w = 1.0 + 9.0 * std::log10(f / fmin) / span;
            svg.ribbon(cx[i] + side[i] / 2, cy[i], cx[j] - side[j] / 2, cy[j], w,
                       net.names[i] + " eaten by " + net.names[j] + ": " + displayNumber(f) + " " + a.flowUnit());
        }
    for (std::size_t i = 0; i < n; ++i) {
        const char* fill = roleColour(net.roles[i]);
        svg.rect(cx[i] - side[i] / 2, cy[i] - side[i] / 2, side[i], side[i], fill,
                 net.names[i] + ": B " + displayNumber(net.stocks[i]) + " " + a.stockUnit() + ", TL " + displayNumber(a.tl[i]),
                 "#333333");
        svg.text(cx[i], labelAbove[i] ? cy[i] - side[i] / 2 - 4 : cy[i] + side[i] / 2 + 11, net.names[i], "middle", 9.5);
    }
    kindLegend(svg, height - 12);
    return figure(title, svg,
                  "Compartments placed by trophic level (left to right), box area following biomass; ribbons are feeding "
                  "flows (prey to predator, detritus eaten included), their width following the log of the flow "
                  "(" + displayNumber(fmin) + " to " + displayNumber(fmax) + " " + a.flowUnit() +
                  "). Flows to detritus, harvest and respiration are not drawn.");
}

SvgFigure impactMatrixSvg(const NetworkAnalysis& a)
{
    const std::string title = "Impact matrix: mixed trophic impact";
    if (!a.available()) return nothingToDraw(title, "No impact matrix: the scenario has no flow network.");
    const MixedTrophicImpact& m = a.mti;
    const std::size_t n = m.names.size();
    if (n == 0) return nothingToDraw(title, "No impact matrix: nothing to relate.");
    if (n > kImpactMatrixSvgLimit)
        return nothingToDraw(title, "The impact matrix has " + std::to_string(n) + " rows, too many for a legible page (up to " +
                                        std::to_string(kImpactMatrixSvgLimit) +
                                        "); `tledger network --json` writes it whole.");
    double range = 0.0;
    for (Eigen::Index i = 0; i < m.total.rows(); ++i)
        for (Eigen::Index j = 0; j < m.total.cols(); ++j)
            if (i != j && std::isfinite(m.total(i, j))) range = std::max(range, std::abs(m.total(i, j)));
    double labelWidth = 0;
    for (const std::string& name : m.names) labelWidth = std::max(labelWidth, textWidth(name, 9.5));
    const double cell = n > 30 ? 12 : 16, left = labelWidth + 12, top = labelWidth + 12;
    const double width = left + cell * static_cast<double>(n) + 20, height = top + cell * static_cast<double>(n) + 50;
    Svg svg(std::max(width, 420.0), height, title);
    const auto colour = [range](double v) { return hexColour(impactRampColour(v, range)); };
    for (std::size_t i = 0; i < n; ++i)
        svg.text(left - 4, top + cell * static_cast<double>(i) + cell * 0.72, m.names[i], "end", 9.5);
    // Column names written upwards (a rotated text; kept apart and added at the end).
    std::string columnLabels;
    for (std::size_t j = 0; j < n; ++j) {
        const double x = left + cell * static_cast<double>(j) + cell * 0.7;
        columnLabels += "<text x=\"0\" y=\"0\" font-size=\"9.5\" transform=\"translate(" + num(x) + "," + num(top - 4) +
                        ") rotate(-90)\">" + xmlEscape(m.names[j]) + "</text>\n";
    }
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j < n; ++j) {
            const double v = m.total(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j));
            svg.rect(left + cell * static_cast<double>(j), top + cell * static_cast<double>(i), cell, cell, colour(v),
                     m.names[i] + " on " + m.names[j] + ": " + displayNumber(v), "#eeeeee");
        }
    const double ly = top + cell * static_cast<double>(n) + 22;
    svg.rect(left, ly - 10, 14, 12, colour(-range));
    svg.text(left + 18, ly, "negative (" + displayNumber(-range) + ")");
    svg.rect(left + 150, ly - 10, 14, 12, colour(range));
    svg.text(left + 168, ly, "positive (+" + displayNumber(range) + ")");
    SvgFigure f = figure(title, svg,
                         "Total impact of a small increase of the row's compartment (or fleet) on the column's "
                         "(Ulanowicz & Puccia 1990): green cells positive, purple negative, white none; the strongest "
                         "off-diagonal impact sets the end of the scale (" + displayNumber(range) + ").");
    // The column labels go in before the closing tag (Svg builds elements in order).
    f.svg.insert(f.svg.rfind("</svg>"), columnLabels);
    return f;
}

SvgFigure levelBarsComparisonSvg(const ScenarioComparison& c)
{
    const std::string title = "Level bars of the scenarios side by side";
    const std::size_t n = c.scenarios.size();
    int levels = 0;
    double largest = 0.0;
    for (const NetworkAnalysis& a : c.analyses) {
        if (!a.available()) continue;
        levels = std::max(levels, a.levels.levelCount());
        for (const TrophicLevelBin& bin : a.levels.combined.levels) largest = std::max(largest, bin.throughput);
    }
    while (levels > 1) {  // trailing levels below 0.01 % of the largest in every scenario
        bool tiny = true;
        for (const NetworkAnalysis& a : c.analyses)
            if (a.available() && levels <= a.levels.levelCount() &&
                a.levels.combined.levels[static_cast<std::size_t>(levels - 1)].throughput > 1e-4 * largest)
                tiny = false;
        if (!tiny) break;
        --levels;
    }
    if (levels == 0 || !(largest > 0)) return nothingToDraw(title, "No level bars: no scenario has a flow network.");
    double nameWidth = 0;
    for (const std::string& s : c.scenarios) nameWidth = std::max(nameWidth, textWidth(s, 10));
    const double left = 44, barArea = 440, barHeight = 14, groupGap = 12, top = 10;
    const double width = left + barArea + 24 + nameWidth + 90;
    const double height = top + levels * (static_cast<double>(n) * (barHeight + 2) + groupGap) + 20;
    Svg svg(width, height, title);
    const std::string unit = c.analyses.front().flowUnit();
    for (int k = 1; k <= levels; ++k) {
        const double groupTop = top + (k - 1) * (static_cast<double>(n) * (barHeight + 2) + groupGap);
        svg.text(8, groupTop + static_cast<double>(n) * (barHeight + 2) / 2 + 4, levelName(k), "start", 12, "#000000", true);
        for (std::size_t s = 0; s < n; ++s) {
            const NetworkAnalysis& a = c.analyses[s];
            const double y = groupTop + static_cast<double>(s) * (barHeight + 2);
            const bool has = a.available() && k <= a.levels.levelCount();
            const double v = has ? a.levels.combined.levels[static_cast<std::size_t>(k - 1)].throughput : kNotApplicable;
            const double w = has ? v / largest * barArea : 0.0;
            svg.rect(left, y, w, barHeight, kScenarioColours[s % kScenarioColours.size()],
                     c.scenarios[s] + ", level " + levelName(k) + ": " + displayNumber(v) + " " + unit);
            svg.text(left + w + 6, y + barHeight - 3, c.scenarios[s] + ": " + (has ? displayNumber(v) : std::string("n/a")), "start", 10);
        }
    }
    svg.line(left, top - 4, left, height - 18, "#444444");
    return figure(title, svg,
                  "Throughput per integer trophic level (Ulanowicz 1995) of each scenario on one linear axis, in " + unit +
                      "; each bar is named with its scenario and value.");
}

SvgFigure relativeChangesSvg(const ScenarioComparison& c, std::size_t s, std::size_t count)
{
    const std::string title = s < c.scenarios.size() ? "Largest relative changes: " + c.scenarios[s] + " against " + c.scenarios.front()
                                                     : std::string("Largest relative changes");
    const auto rows = largestRelativeChanges(c, s, count);
    if (rows.empty()) return nothingToDraw(title, "No compartment output changes by a defined percentage.");
    double labelWidth = 0, largest = 0;
    std::vector<std::string> labels;
    for (const ComparedOutput* o : rows) {
        labels.push_back(o->subject + " · " + o->label);
        labelWidth = std::max(labelWidth, textWidth(labels.back(), 10));
        largest = std::max(largest, std::abs(o->differences[s].percent));
    }
    const double rowHeight = 18, top = 10, barHalf = 200, axis = labelWidth + 16 + barHalf;
    const double width = axis + barHalf + 80, height = top + rowHeight * static_cast<double>(rows.size()) + 30;
    Svg svg(width, height, title);
    for (std::size_t r = 0; r < rows.size(); ++r) {
        const double pct = rows[r]->differences[s].percent;
        const double y = top + rowHeight * static_cast<double>(r);
        const double w = std::abs(pct) / largest * barHalf;
        const bool up = pct > 0;
        svg.text(labelWidth + 8, y + 12, labels[r], "end", 10);
        svg.rect(up ? axis : axis - w, y + 2, w, rowHeight - 5, up ? kBluishGreen : kVermillion,
                 labels[r] + ": " + percentText(rows[r]->differences[s]));
        const std::string value = std::string(up ? "▲ " : "▼ ") + percentText(rows[r]->differences[s]);
        if (up) svg.text(axis + w + 4, y + 12, value, "start", 10);
        else svg.text(axis + 4, y + 12, value, "start", 10);
    }
    svg.line(axis, top - 4, axis, height - 22, "#444444");
    svg.text(axis, height - 8, "0 %", "middle", 10);
    return figure(title, svg,
                  "Compartment outputs of '" + c.scenarios[s] + "' with the largest change against '" + c.scenarios.front() +
                      "', in percent of the reference value: ▲ increase (bar to the right), ▼ decrease (bar to the left).");
}

}  // namespace tl
