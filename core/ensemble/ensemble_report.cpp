// Ensemble JSON, table, partial results and CSV (see the header).
#include "core/ensemble/ensemble_report.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <numeric>

#include <nlohmann/json.hpp>

#include "core/io/balance_report.h"
#include "core/io/csv_table.h"
#include "core/io/json_writer.h"
#include "core/io/text_table.h"
#include "core/model/problem_codes.h"

namespace tl::ensemble {
namespace {

constexpr const char* kPercentileMethod =
    "nearest rank (Hyndman & Fan 1996, definition 1) located in fixed bins of 2^-7 relative width on the "
    "binary exponent and mantissa, interpolated inside the bin";
constexpr double kRelativeErrorBound = 1.0 / OutputStatistics::kBinsPerExponent;

void optionalField(JsonWriter& w, std::string_view key, const std::optional<double>& v)
{
    w.key(key);
    if (v) w.value(*v);
    else w.null();
}

std::string shortest(double v)
{
    if (std::isnan(v)) return "";
    char buf[32];
    const auto end = std::to_chars(buf, buf + sizeof buf, v).ptr;
    return std::string(buf, end);
}

// Compartments that broke the balance in at least one draw, most often first.
std::vector<std::size_t> breakerOrder(const EnsembleStatistics& s)
{
    std::vector<std::size_t> order;
    for (std::size_t i = 0; i < s.breaks.size(); ++i)
        if (s.breaks[i].any > 0) order.push_back(i);
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return s.breaks[a].any > s.breaks[b].any; });
    return order;
}

std::string rangesText(const std::vector<DrawRange>& ranges)
{
    std::string t;
    for (const DrawRange& r : ranges) t += (t.empty() ? "" : ", ") + std::to_string(r.first) + ":" + std::to_string(r.last);
    return t;
}

}  // namespace

std::string ensembleJson(const EnsembleStatistics& s)
{
    JsonWriter w;
    w.beginObject();
    w.field("draws", s.drawsRun);
    w.field("balanced_share", s.balancedShare());
    // A number as DESIGN 5.3 has it; a seed beyond 2^53 (which JSON readers cannot hold
    // exactly as a number) as text.
    if (s.seed <= (1ULL << 53)) w.field("seed", static_cast<long long>(s.seed));
    else w.field("seed", std::to_string(s.seed));
    w.key("outputs").beginObject();
    for (std::size_t k = 0; k < s.outputs.size(); ++k) {
        const OutputStatistics& o = s.outputs[k];
        const PercentileSummary p = o.summary();
        w.key(s.outputNames[k]).beginObject();
        optionalField(w, "p2_5", p.p2_5);
        optionalField(w, "p25", p.p25);
        optionalField(w, "p50", p.p50);
        optionalField(w, "p75", p.p75);
        optionalField(w, "p97_5", p.p97_5);
        optionalField(w, "mean", p.mean);
        w.field("count", o.count());
        optionalField(w, "min", o.count() ? std::optional<double>(o.min()) : std::nullopt);
        optionalField(w, "max", o.count() ? std::optional<double>(o.max()) : std::nullopt);
        if (o.nanCount()) w.field("undefined", o.nanCount());
        if (p.outOfWindow) w.field("percentiles_out_of_window", true);
        w.endObject();
    }
    w.endObject();
    w.field("total_draws", static_cast<long long>(s.totalDraws));
    w.key("draw_ranges").beginArray();
    for (const DrawRange& r : s.ranges) {
        w.beginArray();
        w.value(static_cast<long long>(r.first)).value(static_cast<long long>(r.last));
        w.endArray();
    }
    w.endArray();
    w.field("complete", s.complete());
    w.field("cancelled", s.cancelled);
    w.field("solved_draws", s.solved);
    w.field("balanced_draws", s.balanced);
    w.field("singular_draws", s.singular);
    w.key("analyses").beginArray();
    for (const std::string& a : analysesKeys(s.analyses)) w.value(a);
    w.endArray();
    w.field("shape", s.shape);
    w.field("outputs_over", "balanced draws");
    w.field("held_at_point_value", kHeldFixed);
    w.key("inputs").beginArray();
    for (const std::string& n : s.inputNames) w.value(n);
    w.endArray();
    w.key("balance_breakers").beginArray();
    for (std::size_t i : breakerOrder(s)) {
        const BreakCounts& b = s.breaks[i];
        w.beginObject();
        w.field("compartment", s.compartments[i]);
        w.field("draws", b.any);
        w.field("share", s.drawsRun ? static_cast<double>(b.any) / static_cast<double>(s.drawsRun) : 0.0);
        w.field("ee_above_max", b.eeAboveMax);
        w.field("negative_respiration", b.negativeRespiration);
        w.field("negative_solved_value", b.negativeValue);
        w.field("equation_residual", b.residual);
        w.field("detritus_over_consumed", b.detritusOverConsumed);
        w.endObject();
    }
    w.endArray();
    w.key("percentiles").beginObject();
    w.field("method", kPercentileMethod);
    w.field("relative_error_bound", kRelativeErrorBound);
    w.endObject();
    w.field("fingerprint", s.fingerprint);
    w.field("notice", kDecisionSupportNotice);
    w.endObject();
    return w.str() + "\n";
}

std::string ensembleTable(const EnsembleStatistics& s)
{
    std::string out;
    out += "Ensemble: " + std::to_string(s.drawsRun) + " draws (" + rangesText(s.ranges) + " of " +
           std::to_string(s.totalDraws) + "), seed " + std::to_string(s.seed) + ", inputs " + s.shape + "\n";
    if (s.cancelled) out += "CANCELLED: the figures cover only the draws finished.\n";
    out += "Balanced: " + std::to_string(s.balanced) + " draws (" + displayNumber(100.0 * s.balancedShare()) +
           " %); singular: " + std::to_string(s.singular) + "\n";
    out += "Held at their point values: " + std::string(kHeldFixed) + ".\n\n";
    TextTable t;
    t.addColumn("output", TextTable::Align::Left);
    for (const char* h : {"2.5 %", "25 %", "median", "75 %", "97.5 %", "mean"}) t.addColumn(h);
    auto cell = [](const std::optional<double>& v) { return v ? displayNumber(*v) : std::string("-"); };
    for (std::size_t k = 0; k < s.outputs.size(); ++k) {
        const PercentileSummary p = s.outputs[k].summary();
        t.addRow({s.outputNames[k], cell(p.p2_5), cell(p.p25), cell(p.p50), cell(p.p75), cell(p.p97_5), cell(p.mean)});
    }
    if (s.balanced > 0)
        out += "Over the balanced draws:\n" + t.render();
    else
        out += "No draw balanced, so the outputs have no distribution to show. The compartments below break\n"
               "the balance most often: reconcile the scenario first, or check their confidence grades.\n";
    const std::vector<std::size_t> breakers = breakerOrder(s);
    if (!breakers.empty()) {
        TextTable b;
        b.addColumn("compartment", TextTable::Align::Left);
        for (const char* h : {"draws broken", "share", "EE > max", "R < 0", "negative", "residual", "detritus"}) b.addColumn(h);
        for (std::size_t n = 0; n < breakers.size() && n < 10; ++n) {
            const BreakCounts& c = s.breaks[breakers[n]];
            b.addRow({s.compartments[breakers[n]], std::to_string(c.any),
                      displayNumber(100.0 * static_cast<double>(c.any) / static_cast<double>(std::max<std::uint64_t>(1, s.drawsRun))) + " %",
                      std::to_string(c.eeAboveMax), std::to_string(c.negativeRespiration), std::to_string(c.negativeValue),
                      std::to_string(c.residual), std::to_string(c.detritusOverConsumed)});
        }
        out += "\nCompartments that most often break the balance:\n" + b.render();
    }
    out += "\nPercentiles: " + std::string(kPercentileMethod) + "; relative error at most " +
           displayNumber(100.0 * kRelativeErrorBound) + " %.\n";
    out += std::string(kDecisionSupportNotice) + "\n";
    return out;
}

std::string partialJson(const EnsembleStatistics& s)
{
    JsonWriter w;
    w.beginObject();
    w.field("format", kPartialFormat);
    w.field("version", kPartialVersion);
    w.field("fingerprint", s.fingerprint);
    w.field("seed", std::to_string(s.seed));  // as text: a seed may exceed JSON's safe integers
    w.field("total_draws", static_cast<long long>(s.totalDraws));
    w.key("analyses").beginArray();
    for (const std::string& a : analysesKeys(s.analyses)) w.value(a);
    w.endArray();
    w.field("shape", s.shape);
    w.key("ranges").beginArray();
    for (const DrawRange& r : s.ranges) {
        w.beginArray();
        w.value(static_cast<long long>(r.first)).value(static_cast<long long>(r.last));
        w.endArray();
    }
    w.endArray();
    w.field("draws_run", s.drawsRun);
    w.field("solved", s.solved);
    w.field("balanced", s.balanced);
    w.field("singular", s.singular);
    w.field("cancelled", s.cancelled);
    w.key("compartments").beginArray();
    for (std::size_t i = 0; i < s.compartments.size(); ++i) {
        const BreakCounts& b = s.breaks[i];
        w.beginObject();
        w.field("name", s.compartments[i]);
        w.key("breaks").beginArray();
        for (std::uint64_t v : {b.any, b.eeAboveMax, b.negativeRespiration, b.negativeValue, b.residual, b.detritusOverConsumed})
            w.value(static_cast<long long>(v));
        w.endArray();
        w.endObject();
    }
    w.endArray();
    w.key("inputs").beginArray();
    for (const std::string& n : s.inputNames) w.value(n);
    w.endArray();
    w.key("outputs").beginArray();
    for (std::size_t k = 0; k < s.outputs.size(); ++k) {
        const OutputStatistics& o = s.outputs[k];
        w.beginObject();
        w.field("name", s.outputNames[k]);
        w.field("scale_exponent", o.scaleExponent());
        w.field("count", o.count());
        w.field("undefined", o.nanCount());
        w.field("saturated", o.saturated());
        w.field("min", o.min());
        w.field("max", o.max());
        w.field("sum", int128ToString(o.fixedSum()));
        w.key("bins").beginArray();
        for (const auto& [bin, c] : o.nonZeroBins()) {
            w.beginArray();
            w.value(bin).value(static_cast<long long>(c));
            w.endArray();
        }
        w.endArray();
        w.endObject();
    }
    w.endArray();
    w.endObject();
    return w.str() + "\n";
}

std::optional<EnsembleStatistics> readPartialJson(std::string_view text, const std::string& file, Problems& problems)
{
    auto fail = [&](const std::string& what) {
        Problem p;
        p.code = code::kEnsemblePartial;
        p.severity = Severity::Error;
        p.message = file + ": " + what;
        p.hint = "Give the files written by tledger ensemble --draw-range (unchanged).";
        problems.push_back(std::move(p));
        return std::nullopt;
    };
    nlohmann::json j;
    try {
        j = nlohmann::json::parse(text);
    } catch (const nlohmann::json::parse_error& e) {
        return fail(std::string("not JSON (") + e.what() + ")");
    }
    try {
        if (!j.is_object() || j.value("format", "") != kPartialFormat)
            return fail("not a partial ensemble result (no \"format\": \"" + std::string(kPartialFormat) + "\")");
        if (j.at("version").get<int>() != kPartialVersion)
            return fail("partial result version " + std::to_string(j.at("version").get<int>()) + "; this program reads version " +
                        std::to_string(kPartialVersion));
        EnsembleStatistics s;
        s.fingerprint = j.at("fingerprint").get<std::string>();
        const std::string seed = j.at("seed").get<std::string>();
        std::uint64_t seedValue = 0;
        if (std::from_chars(seed.data(), seed.data() + seed.size(), seedValue).ec != std::errc{}) return fail("bad seed '" + seed + "'");
        s.seed = seedValue;
        s.totalDraws = j.at("total_draws").get<std::uint64_t>();
        std::string words;
        for (const auto& a : j.at("analyses")) words += (words.empty() ? "" : ",") + a.get<std::string>();
        const auto analyses = parseAnalyses(words);
        if (!analyses) return fail("unknown analyses '" + words + "'");
        s.analyses = *analyses;
        s.shape = j.at("shape").get<std::string>();
        for (const auto& r : j.at("ranges")) {
            const DrawRange range{r.at(0).get<std::uint64_t>(), r.at(1).get<std::uint64_t>()};
            if (range.first > range.last || range.last >= s.totalDraws) return fail("a draw range lies outside the draws");
            s.ranges.push_back(range);
        }
        s.drawsRun = j.at("draws_run").get<std::uint64_t>();
        s.solved = j.at("solved").get<std::uint64_t>();
        s.balanced = j.at("balanced").get<std::uint64_t>();
        s.singular = j.at("singular").get<std::uint64_t>();
        s.cancelled = j.at("cancelled").get<bool>();
        for (const auto& c : j.at("compartments")) {
            s.compartments.push_back(c.at("name").get<std::string>());
            const auto& b = c.at("breaks");
            if (b.size() != 6) return fail("compartment '" + s.compartments.back() + "' needs 6 break counts");
            s.breaks.push_back({b[0].get<std::uint64_t>(), b[1].get<std::uint64_t>(), b[2].get<std::uint64_t>(),
                                b[3].get<std::uint64_t>(), b[4].get<std::uint64_t>(), b[5].get<std::uint64_t>()});
        }
        for (const auto& n : j.at("inputs")) s.inputNames.push_back(n.get<std::string>());
        for (const auto& o : j.at("outputs")) {
            const std::string name = o.at("name").get<std::string>();
            std::vector<std::pair<int, std::uint64_t>> bins;
            for (const auto& b : o.at("bins")) bins.emplace_back(b.at(0).get<int>(), b.at(1).get<std::uint64_t>());
            const auto sum = int128FromString(o.at("sum").get<std::string>());
            if (!sum) return fail("output '" + name + "': bad sum");
            auto stats = OutputStatistics::fromParts(o.at("scale_exponent").get<int>(), o.at("count").get<std::uint64_t>(),
                                                     o.at("undefined").get<std::uint64_t>(), o.at("saturated").get<std::uint64_t>(),
                                                     o.at("min").get<double>(), o.at("max").get<double>(), *sum, bins);
            if (!stats) return fail("output '" + name + "': its bins do not add up to its count");
            s.outputNames.push_back(name);
            s.outputs.push_back(std::move(*stats));
        }
        if (s.balanced > s.solved || s.solved + s.singular != s.drawsRun) return fail("its draw counts do not add up");
        return s;
    } catch (const nlohmann::json::exception& e) {
        return fail(std::string("a field is missing or of the wrong type (") + e.what() + ")");
    }
}

std::string keptDrawsCsv(const KeptDraws& kept)
{
    std::vector<std::string> header = {"draw"};
    for (const std::string& n : kept.inputNames) header.push_back(n);
    for (const std::string& n : kept.outputNames) header.push_back(n);
    std::string out = csvRecord(header);
    std::vector<std::string> row;
    for (Eigen::Index r = 0; r < kept.inputs.rows(); ++r) {
        row.assign(1, std::to_string(kept.draw[static_cast<std::size_t>(r)]));
        for (Eigen::Index c = 0; c < kept.inputs.cols(); ++c) row.push_back(shortest(kept.inputs(r, c)));
        for (Eigen::Index c = 0; c < kept.outputs.cols(); ++c) row.push_back(shortest(kept.outputs(r, c)));
        out += csvRecord(row);
    }
    return out;
}

std::string ensembleSettingsJson(const EnsembleSettings& settings, const std::string& scenario)
{
    JsonWriter w;
    w.beginObject();
    w.field("scenario", scenario);
    w.field("draws", static_cast<long long>(settings.draws));
    w.field("seed", std::to_string(settings.seed));
    w.field("threads", static_cast<long long>(settings.threads));
    w.key("analyses").beginArray();
    for (const std::string& a : analysesKeys(settings.analyses)) w.value(a);
    w.endArray();
    w.field("shape", shapeKey(settings.shape));
    w.key("diet_cv");
    if (settings.dietCv) w.value(*settings.dietCv);
    else w.value("grade C of the project");
    w.endObject();
    return w.str();
}

}  // namespace tl::ensemble
