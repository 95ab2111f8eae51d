#include "core/network/flow_network.h"

#include <cmath>
#include <limits>

#include "core/model/problem_codes.h"
#include "core/model/text.h"

namespace tl {
namespace {

double finiteOr(double v, double fallback) { return std::isfinite(v) ? v : fallback; }

void noteShortfall(FlowNetwork& net, std::size_t i, const char* what, double amount)
{
    Problem p;
    p.code = code::kNetworkShortfallImport;
    p.severity = Severity::Warning;
    p.compartment = net.names[i];
    p.message = std::string("the balance implies a negative ") + what + " of " + formatNumber(-amount) +
                " for '" + net.names[i] + "'; the flow network books it as an import of " + formatNumber(amount);
    p.hint = "balance the scenario first (EE <= 1, R >= 0) for figures that describe real flows";
    net.adjustments.push_back(std::move(p));
}

}  // namespace

double FlowNetwork::landings(std::size_t i) const
{
    if (fleetLandings.rows() == 0) return 0.0;
    return fleetLandings.col(static_cast<Eigen::Index>(i)).sum();
}

double FlowNetwork::catchTotal(std::size_t i) const
{
    double total = landings(i);
    if (fleetDeadDiscards.rows() > 0) total += fleetDeadDiscards.col(static_cast<Eigen::Index>(i)).sum();
    return total;
}

FlowNetwork buildFlowNetwork(const Model& model, const BalanceSheet& sheet)
{
    const std::size_t n = model.size();
    const auto N = static_cast<Eigen::Index>(n);
    FlowNetwork net;
    net.names.resize(n);
    net.roles.resize(n);
    net.stocks.assign(n, 0.0);
    net.imports.assign(n, 0.0);
    net.foodImport.assign(n, 0.0);
    net.exports.assign(n, 0.0);
    net.respiration.assign(n, 0.0);
    net.production.assign(n, std::numeric_limits<double>::quiet_NaN());
    net.flows = Eigen::MatrixXd::Zero(N, N);

    const std::vector<std::size_t> pools = model.detritusPools();
    const auto row = [&](std::size_t i) -> const CompartmentBalance* {
        return i < sheet.rows.size() ? &sheet.rows[i] : nullptr;
    };
    // A boundary term: positive leaves as export, negative enters as import.
    const auto boundary = [&](std::size_t i, double v) {
        if (!std::isfinite(v) || v == 0.0) return;
        if (v > 0) net.exports[i] += v;
        else net.imports[i] -= v;
    };
    const auto addFlow = [&](std::size_t from, std::size_t to, double v) {
        net.flows(static_cast<Eigen::Index>(from), static_cast<Eigen::Index>(to)) += v;
    };

    // 1. Nodes, consumption flows, primary production, food imports, respiration.
    for (std::size_t i = 0; i < n; ++i) {
        const Compartment& c = model.compartment(i);
        net.names[i] = c.name;
        net.roles[i] = c.kind == CompartmentKind::Producer   ? NodeRole::Producer
                       : c.kind == CompartmentKind::Consumer ? NodeRole::Consumer
                                                             : NodeRole::Detritus;
        const CompartmentBalance* r = row(i);
        if (!r) continue;
        net.stocks[i] = finiteOr(r->biomass, 0.0);
        if (c.kind == CompartmentKind::Detritus) {
            const double imp = c.valueOr(Param::DetritusImport, 0.0);
            net.imports[i] += imp;
            net.foodImport[i] += imp;
            continue;
        }
        net.production[i] = finiteOr(r->production, 0.0);
        if (c.kind == CompartmentKind::Producer) {
            net.imports[i] += net.production[i];  // net primary production enters from outside
            continue;
        }
        const double Q = finiteOr(r->consumption, 0.0);
        for (std::size_t prey = 0; prey < n; ++prey)
            if (model.diet(i, prey) != 0.0) addFlow(prey, i, Q * model.diet(i, prey));
        const double imported = Q * model.dietImport(i);
        net.imports[i] += imported;
        net.foodImport[i] += imported;
        const double R = finiteOr(r->respiration, 0.0);
        if (R < 0) {
            noteShortfall(net, i, "respiration", -R);
            net.imports[i] -= R;
        } else {
            net.respiration[i] = R;
        }
    }

    // 2. Harvest: landings leave, dead discards fall to a detritus pool.
    const std::size_t fleets = model.fleets().size();
    net.fleetLandings = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(fleets), N);
    net.fleetDeadDiscards = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(fleets), N);
    std::vector<double> caught(n, 0.0);
    for (std::size_t f = 0; f < fleets; ++f) {
        const Fleet& fleet = model.fleet(f);
        net.fleetNames.push_back(fleet.name);
        const bool hasPool = fleet.discardPool.has_value() || !pools.empty();
        const std::size_t pool = fleet.discardPool.value_or(pools.empty() ? 0 : pools[0]);
        for (std::size_t i = 0; i < n; ++i) {
            const double landed = i < fleet.landings.size() ? fleet.landings[i] : 0.0;
            const double discarded = i < fleet.discards.size() ? fleet.discards[i] : 0.0;
            const double survival = i < fleet.discardSurvival.size() ? fleet.discardSurvival[i] : 0.0;
            const double dead = discarded * (1.0 - survival);
            net.fleetLandings(static_cast<Eigen::Index>(f), static_cast<Eigen::Index>(i)) = landed;
            net.fleetDeadDiscards(static_cast<Eigen::Index>(f), static_cast<Eigen::Index>(i)) = dead;
            caught[i] += landed + dead;
            net.exports[i] += landed;
            if (dead == 0.0) continue;
            if (hasPool) addFlow(i, pool, dead);
            else net.exports[i] += dead;  // no detritus pool: dead discards leave the system
        }
    }

    // 3. Living nodes: other mortality M0 = P - predation - catch - E - BA (= (1 - EE) P
    //    when the equation closes) and egestion U Q go to the pools by routing.
    for (std::size_t i = 0; i < n; ++i) {
        const CompartmentBalance* r = row(i);
        if (!r || model.compartment(i).kind == CompartmentKind::Detritus) continue;
        double predation = 0.0;
        for (std::size_t j = 0; j < n; ++j)
            if (model.compartment(j).kind == CompartmentKind::Consumer)
                predation += net.flows(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j));
        const double emigration = finiteOr(r->netEmigration, 0.0), accumulation = finiteOr(r->biomassAccum, 0.0);
        boundary(i, emigration);
        boundary(i, accumulation);
        double toDetritus = net.production[i] - predation - caught[i] - emigration - accumulation +
                            finiteOr(r->egestion, 0.0);
        if (toDetritus < 0) {
            noteShortfall(net, i, "flow to detritus", -toDetritus);
            net.imports[i] -= toDetritus;
            continue;
        }
        for (std::size_t d : pools) {
            const double share = model.effectiveRouting(i, d);
            if (share != 0.0) addFlow(i, d, share * toDetritus);
        }
        if (pools.empty() && toDetritus > 0) net.exports[i] += toDetritus;  // nowhere to settle: it leaves
    }

    // 4. Detritus pools: whatever is neither eaten nor accumulated leaves; a deficit enters.
    for (std::size_t d : pools) {
        const CompartmentBalance* r = row(d);
        const double in = net.inflow(d) + net.imports[d];
        const double eaten = net.outflow(d);
        const double accumulated = r ? finiteOr(r->biomassAccum, 0.0) : 0.0;
        boundary(d, accumulated);
        const double surplus = in - eaten - accumulated;
        if (surplus < 0) noteShortfall(net, d, "detritus surplus", -surplus);
        boundary(d, surplus);
    }
    return net;
}

FlowNetwork flowNetworkFromScor(const ScorNetwork& scor)
{
    const std::size_t n = scor.names.size();
    const auto N = static_cast<Eigen::Index>(n);
    FlowNetwork net;
    net.names = scor.names;
    net.stocks = scor.stocks;
    net.imports = scor.imports;
    net.foodImport = scor.imports;
    net.exports = scor.exports;
    net.respiration = scor.respiration;
    net.production.assign(n, std::numeric_limits<double>::quiet_NaN());
    net.flows = Eigen::MatrixXd::Zero(N, N);
    for (const ScorFlow& f : scor.flows)
        net.flows(static_cast<Eigen::Index>(f.from), static_cast<Eigen::Index>(f.to)) += f.value;
    net.roles.resize(n);
    for (std::size_t j = 0; j < n; ++j) {
        if (j >= scor.livingCount) {
            net.roles[j] = NodeRole::Detritus;
            continue;
        }
        const double fromOthers = net.inflow(j) - net.flows(static_cast<Eigen::Index>(j), static_cast<Eigen::Index>(j));
        net.roles[j] = fromOthers > 0.0 ? NodeRole::Consumer : NodeRole::Producer;
    }
    net.fleetLandings = Eigen::MatrixXd::Zero(0, N);
    net.fleetDeadDiscards = Eigen::MatrixXd::Zero(0, N);
    return net;
}

ScorNetwork scorFromFlowNetwork(const FlowNetwork& net, std::string title)
{
    // SCOR stores living compartments first; keep the network's order within each group.
    const std::size_t n = net.size();
    std::vector<std::size_t> order;
    for (std::size_t i = 0; i < n; ++i)
        if (net.isLiving(i)) order.push_back(i);
    const std::size_t living = order.size();
    for (std::size_t i = 0; i < n; ++i)
        if (!net.isLiving(i)) order.push_back(i);

    ScorNetwork scor;
    scor.title = std::move(title);
    scor.livingCount = living;
    for (std::size_t k = 0; k < n; ++k) {
        const std::size_t i = order[k];
        scor.names.push_back(net.names[i]);
        scor.stocks.push_back(net.stocks[i]);
        scor.imports.push_back(net.imports[i]);
        scor.exports.push_back(net.exports[i]);
        scor.respiration.push_back(net.respiration[i]);
    }
    for (std::size_t a = 0; a < n; ++a)
        for (std::size_t b = 0; b < n; ++b) {
            const double v = net.flows(static_cast<Eigen::Index>(order[a]), static_cast<Eigen::Index>(order[b]));
            if (v != 0.0) scor.flows.push_back({a, b, v});
        }
    return scor;
}

}  // namespace tl
