// SCOR flow network -> Model: lets `tledger import FILE.scor` turn a published flow
// network (the open exchange format of ecological network analysis) into a scenario
// whose mass balance reproduces the network's flows.
//
// Per node (B = stock, F_ij = flow from i to j, imp/exp/R = boundary flows):
//   kind       non-living -> detritus pool; living with food from other nodes -> consumer;
//              other living -> producer.
//   consumer j Q_j = sum_i F_ij + imp_j;  Q/B = Q_j / B_j;  DC_ij = F_ij / Q_j;
//              diet import = imp_j / Q_j;  U = 0 (a SCOR network lumps egestion with the
//              other flows to detritus, so all of it counts as non-predation mortality);
//              P_j = Q_j - R_j (from Q = P + R + U Q, DESIGN 3.2).
//   producer i P_i = imp_i - R_i (gross input minus respiration), or the outflows plus
//              export when the network gives no import.
//   living     P/B = P / B;  net emigration E = exp;  EE left unknown, so the solver
//              returns EE = (sum_j F_ij + exp_i) / P_i, the network's own share.
//   routing    a living node's flows to detritus pools split as F_id / sum_d F_id.
//   detritus   B = stock when positive; detritus import = imp_d.
// Not expressible in a Model, and reported as warnings: respiration of a detritus pool
// and flows between detritus pools (both then leave as the pool's surplus export).
// Errors: a living node with no positive stock, a consumer with P <= 0.
#pragma once

#include <optional>
#include <string>

#include "core/io/scor.h"
#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl {

struct ScorImport {
    std::optional<Model> model;  // empty when any error was found
    Problems problems;
};

ScorImport modelFromScor(const ScorNetwork& network, const std::string& fileName);

}  // namespace tl
