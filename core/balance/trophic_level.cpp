// Effective trophic level and omnivory index (Pauly et al. 1993); see trophic_level.h.
#include "core/balance/trophic_level.h"

#include <cmath>
#include <limits>

namespace tl {

TrophicLevels computeTrophicLevels(const Eigen::MatrixXd& diet, const std::vector<bool>& basal)
{
    const Eigen::Index n = diet.rows();
    TrophicLevels out;
    out.tl.setConstant(n, std::numeric_limits<double>::quiet_NaN());
    out.oi.setConstant(n, std::numeric_limits<double>::quiet_NaN());
    out.note.assign(static_cast<std::size_t>(n), TrophicLevelNote::Computed);

    // Renormalised diet; "fixed" nodes have a known level (basal 1, no prey 2).
    Eigen::MatrixXd share = Eigen::MatrixXd::Zero(n, n);
    std::vector<bool> fixed(static_cast<std::size_t>(n), false);
    for (Eigen::Index j = 0; j < n; ++j) {
        const auto s = static_cast<std::size_t>(j);
        if (basal[s]) {
            out.note[s] = TrophicLevelNote::Basal;
            out.tl[j] = 1.0;
            out.oi[j] = 0.0;
            fixed[s] = true;
            continue;
        }
        const double sum = diet.col(j).sum();
        if (!(sum > 0.0)) {
            out.note[s] = TrophicLevelNote::NoModelledPrey;
            out.tl[j] = 2.0;
            out.oi[j] = 0.0;
            fixed[s] = true;
            continue;
        }
        share.col(j) = diet.col(j) / sum;
    }

    // grounded: some food chain from the node reaches a fixed node.
    std::vector<bool> grounded = fixed;
    for (bool changed = true; changed;) {
        changed = false;
        for (Eigen::Index j = 0; j < n; ++j) {
            if (grounded[static_cast<std::size_t>(j)]) continue;
            for (Eigen::Index i = 0; i < n; ++i)
                if (share(i, j) != 0.0 && grounded[static_cast<std::size_t>(i)]) {
                    grounded[static_cast<std::size_t>(j)] = changed = true;
                    break;
                }
        }
    }
    // undefined: some food chain from the node reaches an ungrounded node.
    std::vector<bool> undefined(static_cast<std::size_t>(n));
    for (Eigen::Index j = 0; j < n; ++j) undefined[static_cast<std::size_t>(j)] = !grounded[static_cast<std::size_t>(j)];
    for (bool changed = true; changed;) {
        changed = false;
        for (Eigen::Index j = 0; j < n; ++j) {
            if (undefined[static_cast<std::size_t>(j)] || fixed[static_cast<std::size_t>(j)]) continue;
            for (Eigen::Index i = 0; i < n; ++i)
                if (share(i, j) != 0.0 && undefined[static_cast<std::size_t>(i)]) {
                    undefined[static_cast<std::size_t>(j)] = changed = true;
                    break;
                }
        }
    }

    // Solve (I - S^T) TL = 1 + sum_fixed DC'_ij TL_i over the remaining consumers.
    std::vector<Eigen::Index> unknownIndex(static_cast<std::size_t>(n), -1);
    std::vector<Eigen::Index> members;
    for (Eigen::Index j = 0; j < n; ++j) {
        const auto s = static_cast<std::size_t>(j);
        if (undefined[s]) out.note[s] = TrophicLevelNote::Undefined;
        else if (!fixed[s]) {
            unknownIndex[s] = static_cast<Eigen::Index>(members.size());
            members.push_back(j);
        }
    }
    const auto k = static_cast<Eigen::Index>(members.size());
    if (k > 0) {
        Eigen::MatrixXd a = Eigen::MatrixXd::Identity(k, k);
        Eigen::VectorXd b = Eigen::VectorXd::Ones(k);
        for (Eigen::Index r = 0; r < k; ++r) {
            const Eigen::Index j = members[static_cast<std::size_t>(r)];
            for (Eigen::Index i = 0; i < n; ++i) {
                const double w = share(i, j);
                if (w == 0.0) continue;
                const Eigen::Index c = unknownIndex[static_cast<std::size_t>(i)];
                if (c >= 0) a(r, c) -= w;
                else b[r] += w * out.tl[i];  // a fixed prey (undefined prey excluded above)
            }
        }
        const Eigen::VectorXd levels = a.partialPivLu().solve(b);  // nonsingular: every chain reaches a fixed node
        for (Eigen::Index r = 0; r < k; ++r) out.tl[members[static_cast<std::size_t>(r)]] = levels[r];
        for (Eigen::Index j : members) {
            double oi = 0.0;
            for (Eigen::Index i = 0; i < n; ++i) {
                const double w = share(i, j);
                if (w != 0.0) oi += w * std::pow(out.tl[i] - (out.tl[j] - 1.0), 2);
            }
            out.oi[j] = oi;
        }
    }
    return out;
}

TrophicLevels computeTrophicLevels(const Model& model)
{
    const auto n = static_cast<Eigen::Index>(model.size());
    Eigen::MatrixXd diet(n, n);
    std::vector<bool> basal(model.size());
    for (std::size_t j = 0; j < model.size(); ++j) {
        basal[j] = model.compartment(j).kind != CompartmentKind::Consumer;
        for (std::size_t i = 0; i < model.size(); ++i)
            diet(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j)) = model.diet(j, i);
    }
    return computeTrophicLevels(diet, basal);
}

}  // namespace tl
