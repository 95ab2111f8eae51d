#include "core/network/indicators.h"

#include <cmath>
#include <limits>
#include <string>

#include <Eigen/LU>

#include "core/network/flow_trophic_level.h"

namespace tl {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

double ratioOrNaN(double a, double b) { return b != 0.0 ? a / b : kNaN; }

// Network analysis figures shared by both overloads.
void networkAnalysis(const FlowNetwork& net, SystemIndicators& s)
{
    const std::size_t n = net.size();
    const auto N = static_cast<Eigen::Index>(n);
    Eigen::VectorXd T(N);
    for (std::size_t j = 0; j < n; ++j) T(static_cast<Eigen::Index>(j)) = net.throughflow(j);

    double sumImports = 0, sumExports = 0, sumResp = 0;
    for (std::size_t j = 0; j < n; ++j) {
        sumImports += net.imports[j];
        sumExports += net.exports[j];
        sumResp += net.respiration[j];
    }
    s.tst = T.sum();
    s.boundaryInput = sumImports;
    s.tstp = net.flows.sum() + sumImports + sumExports + sumResp;
    s.apl = ratioOrNaN(s.tst, s.boundaryInput);
    s.totalRespiration = sumResp;

    s.links = 0;
    for (Eigen::Index i = 0; i < N; ++i)
        for (Eigen::Index j = 0; j < N; ++j)
            if (net.flows(i, j) != 0.0) ++s.links;
    s.connectance = n > 0 ? static_cast<double>(s.links) / static_cast<double>(n * n) : kNaN;
    s.linkDensity = n > 0 ? static_cast<double>(s.links) / static_cast<double>(n) : kNaN;
    std::size_t living = 0;
    s.feedingLinks = 0;
    for (std::size_t i = 0; i < n; ++i) {
        if (!net.isLiving(i)) continue;
        ++living;
        for (std::size_t j = 0; j < n; ++j)
            if (net.isLiving(j) && net.flows(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j)) != 0.0)
                ++s.feedingLinks;
    }
    s.foodWebConnectance = living > 0 ? static_cast<double>(s.feedingLinks) / static_cast<double>(living * living) : kNaN;
    for (std::size_t j = 0; j < n; ++j)
        if (net.roles[j] == NodeRole::Detritus) s.totalDetritusInflow += net.throughflow(j);

    // Finn cycling index: G_ij = F_ij / T_i, N = (I - G)^-1.
    Eigen::MatrixXd G = Eigen::MatrixXd::Zero(N, N);
    for (Eigen::Index i = 0; i < N; ++i)
        if (T(i) > 0.0) G.row(i) = net.flows.row(i) / T(i);
    const Eigen::FullPivLU<Eigen::MatrixXd> lu(Eigen::MatrixXd::Identity(N, N) - G);
    if (!lu.isInvertible()) {
        s.fciSingular = true;
        s.fci = kNaN;
    } else {
        const Eigen::MatrixXd integral = lu.inverse();
        double cycled = 0.0;
        for (Eigen::Index j = 0; j < N; ++j) {
            const double njj = integral(j, j);
            if (njj != 0.0) cycled += (njj - 1.0) / njj * T(j);
        }
        s.fci = ratioOrNaN(cycled, s.tst);
    }

    // Information figures on the extended matrix: row 0 = imports, rows/cols 1..n nodes,
    // column n+1 = exports, column n+2 = respiration.
    const Eigen::Index E = N + 3;
    Eigen::MatrixXd X = Eigen::MatrixXd::Zero(E, E);
    X.block(1, 1, N, N) = net.flows;
    for (Eigen::Index j = 0; j < N; ++j) {
        X(0, j + 1) = net.imports[static_cast<std::size_t>(j)];
        X(j + 1, N + 1) = net.exports[static_cast<std::size_t>(j)];
        X(j + 1, N + 2) = net.respiration[static_cast<std::size_t>(j)];
    }
    const double total = X.sum();
    const Eigen::VectorXd rowSum = X.rowwise().sum();
    const Eigen::VectorXd colSum = X.colwise().sum().transpose();
    double ami = 0.0, h = 0.0;
    for (Eigen::Index i = 0; i < E; ++i)
        for (Eigen::Index j = 0; j < E; ++j) {
            const double t = X(i, j);
            if (t <= 0.0) continue;
            ami += t / total * std::log2(t * total / (rowSum(i) * colSum(j)));
            h -= t / total * std::log2(t / total);
        }
    s.ami = total > 0 ? ami : kNaN;
    s.flowDiversity = total > 0 ? h : kNaN;
    s.ascendency = total * s.ami;
    s.capacity = total * s.flowDiversity;
    s.overhead = s.capacity - s.ascendency;
}

// Published (log Q weights) and intake-weighted system omnivory over consumers with
// intake Q_j and omnivory OI_j.
void systemOmnivory(const std::vector<double>& intake, const std::vector<double>& omnivory, SystemIndicators& s)
{
    double logWeighted = 0, logWeight = 0, weighted = 0, weight = 0;
    for (std::size_t j = 0; j < intake.size(); ++j) {
        if (!std::isfinite(omnivory[j]) || !(intake[j] > 0.0)) continue;
        logWeighted += omnivory[j] * std::log(intake[j]);
        logWeight += std::log(intake[j]);
        weighted += omnivory[j] * intake[j];
        weight += intake[j];
    }
    s.systemOmnivory = ratioOrNaN(logWeighted, logWeight);
    s.omnivoryIntakeWeighted = ratioOrNaN(weighted, weight);
}

}  // namespace

std::vector<std::string> assignProducers(FlowNetwork& net, const std::vector<std::string>& names)
{
    std::vector<std::string> missing;
    std::vector<bool> named(net.size(), false);
    for (const std::string& name : names) {
        bool found = false;
        for (std::size_t j = 0; j < net.size(); ++j)
            if (net.names[j] == name && net.isLiving(j)) named[j] = found = true;
        if (!found) missing.push_back(name);
    }
    for (std::size_t j = 0; j < net.size(); ++j)
        if (net.isLiving(j)) net.roles[j] = named[j] ? NodeRole::Producer : NodeRole::Consumer;
    return missing;
}

SystemIndicators systemIndicators(const FlowNetwork& net)
{
    SystemIndicators s;
    networkAnalysis(net, s);
    const std::size_t n = net.size();
    double tpp = 0, biomass = 0;
    s.producersIdentified = false;
    for (std::size_t j = 0; j < n; ++j) {
        if (net.roles[j] == NodeRole::Producer) {
            tpp += net.imports[j];
            s.producersIdentified = true;
        }
        if (net.isLiving(j)) biomass += net.stocks[j];
    }
    s.totalPrimaryProduction = s.producersIdentified ? tpp : kNaN;
    s.totalLivingBiomass = biomass;
    s.tppOverR = s.producersIdentified ? ratioOrNaN(tpp, s.totalRespiration) : kNaN;
    s.tppOverB = s.producersIdentified ? ratioOrNaN(tpp, biomass) : kNaN;

    const FlowTrophicLevels levels = flowTrophicLevels(net);
    std::vector<double> intake(n, 0.0), omnivory(n, kNaN);
    for (std::size_t j = 0; j < n; ++j) {
        if (levels.fixedAtOne[j]) continue;
        intake[j] = net.inflow(j);
        omnivory[j] = levels.omnivory[j];
    }
    systemOmnivory(intake, omnivory, s);

    s.totalCatch = s.totalLandings = 0;
    for (std::size_t j = 0; j < n; ++j) {
        s.totalCatch += net.catchTotal(j);
        s.totalLandings += net.landings(j);
    }
    s.catchPpr = s.catchPprShareOfTpp = s.catchMeanTl = s.catchMeanTlWithDiscards = kNaN;
    s.catchPprProducersOnly = s.catchPprProducersOnlyShare = kNaN;
    return s;
}

SystemIndicators systemIndicators(const Model& model, const BalanceSheet& sheet, const FlowNetwork& net)
{
    SystemIndicators s;
    networkAnalysis(net, s);
    const std::size_t n = model.size();
    const auto finite = [](double v) { return std::isfinite(v) ? v : 0.0; };
    const auto rowOf = [&](std::size_t i) -> const CompartmentBalance* {
        return i < sheet.rows.size() ? &sheet.rows[i] : nullptr;
    };

    double tpp = 0, biomass = 0;
    std::vector<double> intake(n, 0.0), omnivory(n, kNaN);
    s.producersIdentified = false;
    for (std::size_t i = 0; i < n; ++i) {
        const CompartmentBalance* r = rowOf(i);
        if (!r) continue;
        const CompartmentKind kind = model.compartment(i).kind;
        if (kind == CompartmentKind::Producer) {
            tpp += finite(r->production);
            s.producersIdentified = true;
        }
        if (kind != CompartmentKind::Detritus) biomass += finite(r->biomass);
        if (kind == CompartmentKind::Consumer && std::isfinite(r->oi) && std::isfinite(r->consumption)) {
            intake[i] = r->consumption;
            omnivory[i] = r->oi;
        }
    }
    s.totalPrimaryProduction = s.producersIdentified ? tpp : kNaN;
    s.totalLivingBiomass = biomass;
    s.tppOverR = s.producersIdentified ? ratioOrNaN(tpp, s.totalRespiration) : kNaN;
    s.tppOverB = s.producersIdentified ? ratioOrNaN(tpp, biomass) : kNaN;
    systemOmnivory(intake, omnivory, s);

    // Primary production required per unit production: (I - A) ppr = b, with
    // A_ji = (Q_j / P_j) DC_ij for consumers j and b = 1 at producers and detritus.
    // A consumer without positive production has no defined ppr, nor has anything that
    // eats it: they are left out of the system (NaN).
    const auto N = static_cast<Eigen::Index>(n);
    std::vector<bool> defined(n, sheet.rows.size() == n);
    for (std::size_t j = 0; j < n && sheet.rows.size() == n; ++j) {
        if (model.compartment(j).kind != CompartmentKind::Consumer) continue;
        const double P = sheet.rows[j].production, Q = sheet.rows[j].consumption;
        defined[j] = std::isfinite(P) && std::isfinite(Q) && P > 0.0;
    }
    for (bool changed = true; changed;) {
        changed = false;
        for (std::size_t j = 0; j < n; ++j) {
            if (!defined[j] || model.compartment(j).kind != CompartmentKind::Consumer) continue;
            for (std::size_t i = 0; i < n; ++i)
                if (model.diet(j, i) != 0.0 && !defined[i]) {
                    defined[j] = false;
                    changed = true;
                    break;
                }
        }
    }
    Eigen::MatrixXd A = Eigen::MatrixXd::Identity(N, N);
    Eigen::VectorXd b = Eigen::VectorXd::Zero(N);
    for (std::size_t j = 0; j < n; ++j) {
        const auto J = static_cast<Eigen::Index>(j);
        if (!defined[j]) continue;  // identity row, b = 0; replaced by NaN below
        if (model.compartment(j).kind != CompartmentKind::Consumer) {
            b(J) = 1.0;
            continue;
        }
        const double P = sheet.rows[j].production, Q = sheet.rows[j].consumption;
        for (std::size_t i = 0; i < n; ++i) {
            const double dc = model.diet(j, i);
            if (dc != 0.0) A(J, static_cast<Eigen::Index>(i)) -= Q / P * dc;
        }
    }
    const bool usable = sheet.rows.size() == n;
    s.catchPpr = s.catchPprShareOfTpp = s.catchMeanTl = s.catchMeanTlWithDiscards = kNaN;
    s.catchPprProducersOnly = s.catchPprProducersOnlyShare = kNaN;
    s.totalCatch = s.totalLandings = 0;
    double catchTl = 0, landingsTl = 0;
    bool tlKnown = true;
    for (std::size_t i = 0; i < n; ++i) {
        const double y = net.catchTotal(i), landed = net.landings(i);
        if (y == 0.0 && landed == 0.0) continue;
        s.totalCatch += y;
        s.totalLandings += landed;
        const CompartmentBalance* r = rowOf(i);
        if (r && std::isfinite(r->tl)) {
            catchTl += y * r->tl;
            landingsTl += landed * r->tl;
        } else {
            tlKnown = false;
        }
    }
    if (s.totalLandings > 0 && tlKnown) s.catchMeanTl = landingsTl / s.totalLandings;
    if (s.totalCatch > 0 && tlKnown) s.catchMeanTlWithDiscards = catchTl / s.totalCatch;
    if (usable) {
        const Eigen::FullPivLU<Eigen::MatrixXd> lu(A);
        if (lu.isInvertible()) {
            // b = 1 at producers and pools (detritus as level-I supply), or at producers only.
            Eigen::VectorXd producersOnly = b;
            for (std::size_t j = 0; j < n; ++j)
                if (model.compartment(j).kind == CompartmentKind::Detritus) producersOnly(static_cast<Eigen::Index>(j)) = 0.0;
            const Eigen::VectorXd ppr = lu.solve(b), pprProducers = lu.solve(producersOnly);
            s.pprPerUnitProduction.assign(ppr.data(), ppr.data() + ppr.size());
            for (std::size_t j = 0; j < n; ++j)
                if (!defined[j]) s.pprPerUnitProduction[j] = kNaN;
            double required = 0, requiredProducers = 0;
            for (std::size_t i = 0; i < n; ++i)
                if (net.catchTotal(i) != 0.0) {
                    required += net.catchTotal(i) * s.pprPerUnitProduction[i];
                    requiredProducers += net.catchTotal(i) * (defined[i] ? pprProducers(static_cast<Eigen::Index>(i)) : kNaN);
                }
            s.catchPpr = required;
            s.catchPprProducersOnly = requiredProducers;
            s.catchPprShareOfTpp = ratioOrNaN(required, tpp + s.totalDetritusInflow);
            s.catchPprProducersOnlyShare = ratioOrNaN(requiredProducers, tpp);
        }
    }
    return s;
}

}  // namespace tl
