// Compressed-column sparse matrix of the balance area: diets and routing, one column
// per predator or detritus pool (real diets have 3-15 prey per predator).
#pragma once

#include <Eigen/SparseCore>

namespace tl {

using SparseColumns = Eigen::SparseMatrix<double, Eigen::ColMajor, int>;

}  // namespace tl
