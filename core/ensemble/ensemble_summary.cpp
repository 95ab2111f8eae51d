#include "core/ensemble/ensemble_summary.h"

#include <algorithm>
#include <cmath>

#include <nlohmann/json.hpp>

namespace tl::ensemble {
namespace {

using json = nlohmann::ordered_json;  // keeps the run's order of outputs

std::optional<double> number(const json& o, const char* key)
{
    const auto it = o.find(key);
    if (it == o.end() || !it->is_number()) return std::nullopt;
    return it->get<double>();
}

std::uint64_t count(const json& o, const char* key)
{
    const auto it = o.find(key);
    return it != o.end() && it->is_number_unsigned() ? it->get<std::uint64_t>() : 0;
}

}  // namespace

const OutputSummary* EnsembleSummary::find(std::string_view name) const
{
    for (const OutputSummary& o : outputs)
        if (o.name == name) return &o;
    return nullptr;
}

std::optional<EnsembleSummary> readEnsembleSummary(std::string_view text, std::string* why)
{
    const json j = json::parse(text.begin(), text.end(), nullptr, false);
    auto fail = [&](const std::string& w) -> std::optional<EnsembleSummary> {
        if (why) *why = w;
        return std::nullopt;
    };
    if (j.is_discarded() || !j.is_object()) return fail("not a JSON object");
    if (!j.contains("outputs") || !j["outputs"].is_object() || !j.contains("balanced_share"))
        return fail("not an ensemble summary (no 'outputs' or 'balanced_share')");
    EnsembleSummary s;
    s.draws = count(j, "draws");
    s.totalDraws = count(j, "total_draws");
    s.balanced = count(j, "balanced_draws");
    s.balancedShare = number(j, "balanced_share").value_or(0.0);
    if (const auto it = j.find("seed"); it != j.end()) s.seed = it->is_string() ? it->get<std::string>() : it->dump();
    s.shape = j.value("shape", std::string());
    s.cancelled = j.value("cancelled", false);
    s.complete = j.value("complete", false);
    if (const auto it = j.find("analyses"); it != j.end() && it->is_array())
        for (const json& a : *it)
            if (a.is_string()) s.analyses.push_back(a.get<std::string>());
    for (const auto& [name, o] : j["outputs"].items()) {
        if (!o.is_object()) return fail("output '" + name + "' is not an object");
        OutputSummary out;
        out.name = name;
        out.p2_5 = number(o, "p2_5");
        out.p25 = number(o, "p25");
        out.p50 = number(o, "p50");
        out.p75 = number(o, "p75");
        out.p97_5 = number(o, "p97_5");
        out.mean = number(o, "mean");
        out.min = number(o, "min");
        out.max = number(o, "max");
        out.count = count(o, "count");
        out.undefined = count(o, "undefined");
        out.outOfWindow = o.value("percentiles_out_of_window", false);
        s.outputs.push_back(std::move(out));
    }
    if (const auto it = j.find("balance_breakers"); it != j.end() && it->is_array()) {
        for (const json& b : *it) {
            if (!b.is_object()) continue;
            BreakerSummary br;
            br.compartment = b.value("compartment", std::string());
            br.draws = count(b, "draws");
            br.share = number(b, "share").value_or(0.0);
            br.eeAboveMax = count(b, "ee_above_max");
            br.negativeRespiration = count(b, "negative_respiration");
            br.negativeValue = count(b, "negative_solved_value");
            br.residual = count(b, "equation_residual");
            br.detritusOverConsumed = count(b, "detritus_over_consumed");
            s.breakers.push_back(std::move(br));
        }
    }
    return s;
}

std::optional<Interval> interval95(const EnsembleSummary& summary, std::string_view compartment, std::string_view quantity)
{
    std::string name(compartment);
    name += '.';
    name += quantity;
    const OutputSummary* o = summary.find(name);
    if (!o || !o->p2_5 || !o->p97_5) return std::nullopt;
    return Interval{*o->p2_5, *o->p97_5};
}

HistogramBars histogramBars(const OutputStatistics& st, int bars)
{
    HistogramBars h;
    if (st.count() == 0 || bars < 1) return h;
    h.low = st.min();
    const double span = st.max() - st.min();
    if (!(span > 0.0)) {
        h.counts.assign(1, st.count());
        return h;
    }
    h.width = span / bars;
    h.counts.assign(static_cast<std::size_t>(bars), 0);
    for (const auto& [bin, n] : st.nonZeroBins()) {
        const auto [lo, hi] = st.binRange(bin);
        // An edge bin beyond the exponent window may be unbounded: clamp before the midpoint.
        const double a = std::clamp(lo, st.min(), st.max()), b = std::clamp(hi, st.min(), st.max());
        const double mid = 0.5 * (a + b);
        const auto k = static_cast<std::ptrdiff_t>(std::floor((mid - h.low) / h.width));
        h.counts[static_cast<std::size_t>(std::clamp<std::ptrdiff_t>(k, 0, bars - 1))] += n;
    }
    return h;
}

}  // namespace tl::ensemble
