// Mixed trophic impact (Ulanowicz & Puccia 1990, Coenoses 5:7), DESIGN.md 3.4:
//   Q_ij = d_ij - f_ij,   M = (I - Q)^-1 - I,   row i acts on column j,
// d_ij: fraction of i in the food of j (j gains from its prey). For a consumer this is
//       its diet fraction DC_ij = F_ij / (sum_k F_kj + food import_j), so imported food
//       dilutes what a consumer gains from its modelled prey (import is no row: nothing in
//       the system can raise or lower it); for a detritus pool
//       the composition of its inflow; for a fleet its catch composition.
// f_ij: share of j's losses to predators and fleets that i takes,
//       F_ji / (sum_{living k} F_jk + catch_j) (j loses to its predator i); flows into
//       detritus are not predation.
// Fleets are appended as rows/columns after the nodes (impacting and impacted).
#pragma once

#include <string>
#include <vector>

#include <Eigen/Core>

#include "core/network/flow_network.h"

namespace tl {

struct MixedTrophicImpact {
    std::vector<std::string> names;  // nodes then fleets; rows and columns alike
    std::size_t nodeCount = 0;       // the first nodeCount entries are nodes
    Eigen::MatrixXd direct;          // Q
    Eigen::MatrixXd total;           // M; NaN-filled when I - Q is singular
    bool singular = false;
};

MixedTrophicImpact mixedTrophicImpact(const FlowNetwork& network);

}  // namespace tl
