// Diet overlap between predators (Pianka 1973, Annu Rev Ecol Syst 4:53; volume and page
// from memory):
//   O_jk = sum_i p_ij p_ik / sqrt( sum_i p_ij^2  sum_i p_ik^2 )
// p_ij = fraction of food item i in predator j's diet (the import column counts as one
// item). Symmetric, 0 (no shared prey) .. 1 (identical diets).
#pragma once

#include <cstddef>
#include <vector>

#include <Eigen/Core>

#include "core/model/model.h"

namespace tl {

struct DietOverlap {
    std::vector<std::size_t> predators;  // compartment indices of consumers with a diet
    Eigen::MatrixXd overlap;             // predators x predators
};

DietOverlap dietOverlap(const Model& model);

}  // namespace tl
