// Diet overlap between predators (Pianka 1973, Annu Rev Ecol Syst 4:53; volume and page
// from memory):
//   O_jk = sum_i p_ij p_ik / sqrt( sum_i p_ij^2  sum_i p_ik^2 )
// p_ij = fraction of modelled prey i in predator j's diet. Food imported from outside the
// modelled area is left out: it is not one resource that predators could share, so
// counting it as an item would make two import feeders overlap fully. The index is
// invariant to rescaling a predator's fractions, so no renormalisation is needed.
// Symmetric, 0 (no shared prey) .. 1 (identical diets over modelled prey). A consumer
// that eats only imported food has no modelled diet and is left out.
#pragma once

#include <cstddef>
#include <vector>

#include <Eigen/Core>

#include "core/model/model.h"

namespace tl {

struct DietOverlap {
    std::vector<std::size_t> predators;  // compartment indices of consumers with modelled prey
    Eigen::MatrixXd overlap;             // predators x predators
};

DietOverlap dietOverlap(const Model& model);

}  // namespace tl
