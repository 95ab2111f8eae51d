#include "core/network/flow_trophic_level.h"

#include <cmath>
#include <limits>

#include <Eigen/LU>

namespace tl {

FlowTrophicLevels flowTrophicLevels(const FlowNetwork& net)
{
    const std::size_t n = net.size();
    FlowTrophicLevels out;
    out.tl.assign(n, 1.0);
    out.omnivory.assign(n, 0.0);
    out.fixedAtOne.assign(n, true);

    // Free nodes: living, with intake from some other node.
    std::vector<Eigen::Index> freeIndex(n, -1);
    Eigen::Index freeCount = 0;
    for (std::size_t j = 0; j < n; ++j) {
        if (!net.isLiving(j)) continue;
        const auto J = static_cast<Eigen::Index>(j);
        const double fromOthers = net.flows.col(J).sum() - net.flows(J, J);
        if (fromOthers > 0.0) {
            out.fixedAtOne[j] = false;
            freeIndex[j] = freeCount++;
        }
    }
    if (freeCount == 0) return out;

    // (I - A_ff^T) tl_f = 1 + A_fixed^T * 1, with A_ij = F_ij / sum_k F_kj.
    Eigen::MatrixXd system = Eigen::MatrixXd::Identity(freeCount, freeCount);
    Eigen::VectorXd rhs = Eigen::VectorXd::Ones(freeCount);
    for (std::size_t j = 0; j < n; ++j) {
        if (freeIndex[j] < 0) continue;
        const auto J = static_cast<Eigen::Index>(j);
        const double intake = net.flows.col(J).sum();
        for (std::size_t i = 0; i < n; ++i) {
            const double a = net.flows(static_cast<Eigen::Index>(i), J) / intake;
            if (a == 0.0) continue;
            if (freeIndex[i] >= 0) system(freeIndex[j], freeIndex[i]) -= a;
            else rhs(freeIndex[j]) += a;  // TL_i = 1
        }
    }
    const Eigen::FullPivLU<Eigen::MatrixXd> lu(system);
    if (!lu.isInvertible()) {
        out.singular = true;
        for (std::size_t j = 0; j < n; ++j)
            if (freeIndex[j] >= 0) out.tl[j] = out.omnivory[j] = std::numeric_limits<double>::quiet_NaN();
        return out;
    }
    const Eigen::VectorXd tlFree = lu.solve(rhs);
    for (std::size_t j = 0; j < n; ++j)
        if (freeIndex[j] >= 0) out.tl[j] = tlFree(freeIndex[j]);

    for (std::size_t j = 0; j < n; ++j) {
        if (freeIndex[j] < 0) continue;
        const auto J = static_cast<Eigen::Index>(j);
        const double intake = net.flows.col(J).sum();
        double oi = 0.0;
        for (std::size_t i = 0; i < n; ++i) {
            const double a = net.flows(static_cast<Eigen::Index>(i), J) / intake;
            const double d = out.tl[i] - (out.tl[j] - 1.0);
            oi += a * d * d;
        }
        out.omnivory[j] = oi;
    }
    return out;
}

}  // namespace tl
