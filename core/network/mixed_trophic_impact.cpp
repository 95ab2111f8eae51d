#include "core/network/mixed_trophic_impact.h"

#include <limits>

#include <Eigen/LU>

namespace tl {

MixedTrophicImpact mixedTrophicImpact(const FlowNetwork& net)
{
    const std::size_t n = net.size();
    const std::size_t fleets = net.fleetNames.size();
    const auto N = static_cast<Eigen::Index>(n);
    const auto S = static_cast<Eigen::Index>(n + fleets);

    MixedTrophicImpact out;
    out.names = net.names;
    out.names.insert(out.names.end(), net.fleetNames.begin(), net.fleetNames.end());
    out.nodeCount = n;

    // Harvest by fleet f of node i: landings + dead discards.
    Eigen::MatrixXd harvest = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(fleets), N);
    if (fleets > 0) {
        harvest = net.fleetLandings;
        if (net.fleetDeadDiscards.size() == harvest.size()) harvest += net.fleetDeadDiscards;
    }

    Eigen::MatrixXd d = Eigen::MatrixXd::Zero(S, S);  // d(i, j): share of i in j's food
    Eigen::MatrixXd f = Eigen::MatrixXd::Zero(S, S);  // f(i, j): share of j's losses taken by i
    for (Eigen::Index j = 0; j < N; ++j) {
        const double intake = net.flows.col(j).sum() + net.foodImport[static_cast<std::size_t>(j)];
        if (intake > 0.0) d.block(0, j, N, 1) = net.flows.col(j) / intake;
    }
    for (std::size_t g = 0; g < fleets; ++g) {
        const auto G = static_cast<Eigen::Index>(n + g);
        const double total = harvest.row(static_cast<Eigen::Index>(g)).sum();
        if (total > 0.0) d.block(0, G, N, 1) = harvest.row(static_cast<Eigen::Index>(g)).transpose() / total;
    }
    for (Eigen::Index j = 0; j < N; ++j) {
        double losses = harvest.col(j).sum();
        for (Eigen::Index k = 0; k < N; ++k)
            if (net.isLiving(static_cast<std::size_t>(k))) losses += net.flows(j, k);
        if (losses <= 0.0) continue;
        for (Eigen::Index k = 0; k < N; ++k)
            if (net.isLiving(static_cast<std::size_t>(k))) f(k, j) = net.flows(j, k) / losses;
        for (std::size_t g = 0; g < fleets; ++g)
            f(static_cast<Eigen::Index>(n + g), j) = harvest(static_cast<Eigen::Index>(g), j) / losses;
    }

    out.direct = d - f;
    const Eigen::MatrixXd identity = Eigen::MatrixXd::Identity(S, S);
    const Eigen::FullPivLU<Eigen::MatrixXd> lu(identity - out.direct);
    if (!lu.isInvertible()) {
        out.singular = true;
        out.total = Eigen::MatrixXd::Constant(S, S, std::numeric_limits<double>::quiet_NaN());
    } else {
        out.total = lu.inverse() - identity;
    }
    return out;
}

}  // namespace tl
