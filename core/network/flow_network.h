// FlowNetwork: the steady-state flow network of a food web (DESIGN.md 3.5), the common
// input of every network analysis here (trophic levels on flows, level decomposition,
// mixed trophic impact, system indicators). It comes either from a solved scenario
// (buildFlowNetwork) or from a plain SCOR network (flowNetworkFromScor).
//
// From a scenario, per compartment i (B, P, Q, EE, U from the BalanceSheet):
//   consumption      F(i -> j) = B_j (Q/B)_j DC_ij          prey i to predator j
//   to detritus      F(i -> d) = route_id [M0_i + U_i Q_i] + dead discards of i to d, with
//                    M0_i = P_i - predation_i - Y_i - E_i - BA_i (= (1 - EE_i) P_i when the
//                    balance equation closes; this form keeps every node balanced)
//   imports          P_i for producers (primary production), Q_j DC_import,j for consumers,
//                    detritus import, and -E_i, -BA_i where these are negative
//   exports          landings + positive E_i + positive BA_i; for detritus the surplus
//                    inflow - consumption - BA_d (a deficit becomes an import)
//   respiration      R_j = Q_j (1 - U_j) - P_j for consumers (producers enter with net P)
// Fleets are boundary, not nodes: landings leave as exports and dead discards are flows
// to detritus; both are also kept per fleet for the impact and catch analyses.
// An unbalanced scenario can imply negative flows (M0 < 0 when EE > 1; R < 0 when
// production exceeds assimilation; a detritus pool eaten beyond its inflow). Flows stay >= 0: such a shortfall enters as an
// import of that compartment, and `adjustments` says so, naming it.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "core/balance/balance_sheet.h"
#include "core/io/scor.h"
#include "core/model/model.h"

namespace tl {

// What a node does in the food web. Producers and detritus pools start food chains
// (level I); consumers take food from other nodes.
enum class NodeRole { Producer, Consumer, Detritus };

struct FlowNetwork {
    std::vector<std::string> names;
    std::vector<NodeRole> roles;
    std::vector<double> stocks;       // biomass (storage), currency/area
    std::vector<double> imports;      // all boundary inputs per node, currency/area/time
    std::vector<double> foodImport;   // the part of imports that is food (diet import, detritus import)
    std::vector<double> exports;      // all usable boundary outputs, landings included
    std::vector<double> respiration;  // dissipative losses
    std::vector<double> production;   // P per node; NaN where not known (SCOR networks)
    Eigen::MatrixXd flows;            // flows(i, j): from node i to node j (row = source)

    // Harvest, one row per fleet (empty for SCOR networks).
    std::vector<std::string> fleetNames;
    Eigen::MatrixXd fleetLandings;      // fleets x nodes
    Eigen::MatrixXd fleetDeadDiscards;  // fleets x nodes

    // Warnings from buildFlowNetwork about shortfalls booked as imports (see above).
    Problems adjustments;

    std::size_t size() const { return names.size(); }
    bool isLiving(std::size_t i) const { return roles[i] != NodeRole::Detritus; }
    double inflow(std::size_t j) const { return flows.col(static_cast<Eigen::Index>(j)).sum(); }  // internal only
    double outflow(std::size_t i) const { return flows.row(static_cast<Eigen::Index>(i)).sum(); }
    // Throughflow on the input side: T_j = sum_i F_ij + import_j (Finn 1976).
    double throughflow(std::size_t j) const { return inflow(j) + imports[j]; }
    double landings(std::size_t i) const;     // summed over fleets
    double catchTotal(std::size_t i) const;   // landings + dead discards, summed over fleets
};

FlowNetwork buildFlowNetwork(const Model& model, const BalanceSheet& sheet);

// A SCOR network has only living flags: non-living nodes become detritus, living nodes
// with no intake from other nodes become producers, the other living nodes consumers.
// All imports count as food imports.
FlowNetwork flowNetworkFromScor(const ScorNetwork& scor);
// SCOR lists living compartments first: the network's order is kept within living and
// within non-living nodes. SCOR has no fleets: landings stay in the exports and dead
// discards in the flows to detritus, but which share was catch is lost.
ScorNetwork scorFromFlowNetwork(const FlowNetwork& network, std::string title);

}  // namespace tl
