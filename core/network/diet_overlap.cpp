#include "core/network/diet_overlap.h"

#include <cmath>

namespace tl {

DietOverlap dietOverlap(const Model& model)
{
    const std::size_t n = model.size();
    DietOverlap out;
    for (std::size_t j = 0; j < n; ++j)
        if (model.compartment(j).kind == CompartmentKind::Consumer && !model.dietRow(j).empty())
            out.predators.push_back(j);

    // One column per predator: its fractions of modelled prey (import left out).
    const auto P = static_cast<Eigen::Index>(out.predators.size());
    Eigen::MatrixXd diets = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(n), P);
    for (Eigen::Index c = 0; c < P; ++c)
        for (const auto& [prey, dc] : model.dietRow(out.predators[static_cast<std::size_t>(c)]))
            diets(static_cast<Eigen::Index>(prey), c) = dc;
    const Eigen::MatrixXd cross = diets.transpose() * diets;  // sum_i p_ij p_ik
    out.overlap = Eigen::MatrixXd::Zero(P, P);
    for (Eigen::Index a = 0; a < P; ++a)
        for (Eigen::Index b = 0; b < P; ++b) {
            const double norm = std::sqrt(cross(a, a) * cross(b, b));
            out.overlap(a, b) = norm > 0.0 ? cross(a, b) / norm : 0.0;
        }
    return out;
}

}  // namespace tl
