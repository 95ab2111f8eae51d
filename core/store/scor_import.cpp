#include "core/store/scor_import.h"

#include <algorithm>
#include <vector>

#include "core/model/problem_codes.h"
#include "core/model/text.h"

namespace tl {
namespace {

Problem scorProblem(const std::string& file, Severity severity, std::string code, const std::string& compartment,
                    std::string message)
{
    Problem p;
    p.code = std::move(code);
    p.severity = severity;
    p.compartment = compartment;
    p.message = std::move(message);
    p.location = FileLocation{file, 0, 0};
    return p;
}

// The flows leaving (out) and entering (in) each compartment, each list sorted by the
// other end, repeated pairs summed: O(n + flows) where an n x n table cost n^2.
struct FlowLists {
    std::vector<std::vector<GridEntry>> out, in;
};

FlowLists flowLists(const ScorNetwork& net, std::size_t n)
{
    std::vector<ScorFlow> flows;
    flows.reserve(net.flows.size());
    for (const ScorFlow& f : net.flows)
        if (f.from < n && f.to < n) flows.push_back(f);
    std::stable_sort(flows.begin(), flows.end(),
                     [](const ScorFlow& a, const ScorFlow& b) { return std::pair(a.from, a.to) < std::pair(b.from, b.to); });
    FlowLists lists{std::vector<std::vector<GridEntry>>(n), std::vector<std::vector<GridEntry>>(n)};
    for (const ScorFlow& f : flows) {
        auto& out = lists.out[f.from];
        if (!out.empty() && out.back().col == f.to) out.back().value += f.value;
        else out.push_back({f.to, f.value});
    }
    for (std::size_t from = 0; from < n; ++from)  // ascending sources: each in-list comes out sorted
        for (const GridEntry& e : lists.out[from]) lists.in[e.col].push_back({from, e.value});
    return lists;
}

double sum(const std::vector<GridEntry>& entries)
{
    double total = 0.0;
    for (const GridEntry& e : entries) total += e.value;
    return total;
}

}  // namespace

ScorImport modelFromScor(const ScorNetwork& net, const std::string& fileName)
{
    ScorImport out;
    const std::size_t n = net.names.size();
    auto at = [](const std::vector<double>& v, std::size_t i) { return i < v.size() ? v[i] : 0.0; };
    const FlowLists flows = flowLists(net, n);
    auto living = [&](std::size_t i) { return i < net.livingCount; };

    Model m;
    for (std::size_t i = 0; i < n; ++i) {
        Compartment c;
        c.name = net.names[i];
        const double intake = sum(flows.in[i]);
        c.kind = !living(i) ? CompartmentKind::Detritus : intake > 0.0 ? CompartmentKind::Consumer : CompartmentKind::Producer;
        m.addCompartment(std::move(c));
    }
    std::vector<std::size_t> pools = m.detritusPools();
    for (std::size_t i = 0; i < n; ++i) {
        Compartment& c = m.compartment(i);
        const double B = at(net.stocks, i), imp = at(net.imports, i), exp = at(net.exports, i),
                     R = at(net.respiration, i);
        const double outflow = sum(flows.out[i]), intake = sum(flows.in[i]);
        const auto isPool = [&](std::size_t k) { return m.compartment(k).kind == CompartmentKind::Detritus; };
        if (c.kind == CompartmentKind::Detritus) {
            if (B > 0.0) c.value(Param::Biomass) = B;
            if (imp != 0.0) c.value(Param::DetritusImport) = imp;
            if (R > 0.0)
                out.problems.push_back(scorProblem(fileName, Severity::Warning, code::kScorDetritusRespiration, c.name,
                                                   "detritus pool '" + c.name + "' respires " + formatNumber(R) +
                                                       "; a model has no respiration of detritus, so it leaves as the "
                                                       "pool's surplus export"));
            for (const auto& [d, flow] : flows.out[i])
                if (isPool(d) && flow > 0.0)
                    out.problems.push_back(scorProblem(fileName, Severity::Warning, code::kScorDetritusToDetritus, c.name,
                                                       "the flow from detritus pool '" + c.name + "' to '" +
                                                           m.compartment(d).name + "' (" + formatNumber(flow) +
                                                           ") cannot be expressed; it leaves as the pool's surplus export"));
            continue;
        }
        if (!(B > 0.0)) {
            out.problems.push_back(scorProblem(fileName, Severity::Error, code::kScorNoBiomass, c.name,
                                               "living compartment '" + c.name + "' has no positive stock (" +
                                                   formatNumber(B) + "); a model needs its biomass"));
            continue;
        }
        double P = 0.0;
        c.value(Param::Biomass) = B;
        c.value(Param::Unassim) = 0.0;
        if (c.kind == CompartmentKind::Consumer) {
            const double Q = intake + imp;
            P = Q - R;
            c.value(Param::QB) = Q / B;
            for (const auto& [k, flow] : flows.in[i])
                if (flow > 0.0) m.setDiet(i, k, flow / Q);
            if (imp > 0.0) m.setDietImport(i, imp / Q);
            if (!(P > 0.0)) {
                out.problems.push_back(scorProblem(fileName, Severity::Error, code::kScorNoProduction, c.name,
                                                   "consumer '" + c.name + "' respires " + formatNumber(R) +
                                                       " of a consumption of " + formatNumber(Q) +
                                                       ", which leaves no production"));
                continue;
            }
        } else {
            P = imp > 0.0 ? imp - R : outflow + exp;
            if (!(P > 0.0)) {
                out.problems.push_back(scorProblem(fileName, Severity::Error, code::kScorNoProduction, c.name,
                                                   "producer '" + c.name + "' has no net production (import " +
                                                       formatNumber(imp) + ", respiration " + formatNumber(R) + ")"));
                continue;
            }
        }
        c.value(Param::PB) = P / B;
        if (exp != 0.0) c.value(Param::NetEmigration) = exp;
        double toDetritus = 0.0;
        for (const auto& [d, flow] : flows.out[i])
            if (isPool(d)) toDetritus += flow;
        if (toDetritus > 0.0 && pools.size() > 1)
            for (const auto& [d, flow] : flows.out[i])
                if (isPool(d) && flow > 0.0) m.setRouting(i, d, flow / toDetritus);
    }
    if (pools.empty())
        out.problems.push_back(scorProblem(fileName, Severity::Warning, code::kScorNoDetritus, "",
                                           "the network has no non-living compartment; a model normally has a "
                                           "detritus pool"));
    if (!hasErrors(out.problems)) out.model = std::move(m);
    return out;
}

}  // namespace tl
