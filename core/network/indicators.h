// System indicators of a flow network (DESIGN.md 3.5; conventions of
// shared/reference/reference.json meta.conventions, JSON keys of DESIGN 5.3).
//   T_j  = sum_i F_ij + z_j (input-side throughflow; z import, e export, r respiration)
//   tst  = sum_j T_j;  tstp = sum F + sum z + sum e + sum r   (Finn 1976; Ulanowicz 1986)
//   boundary input = sum z;  apl = tst / boundary input        (Finn 1976)
//   fci  = sum_j ((n_jj - 1)/n_jj) T_j / tst,  N = (I - G)^-1,  G_ij = F_ij / T_i (Finn 1976)
//   On the (n+3)x(n+3) matrix T extended by an import row and export and respiration
//   columns (Ulanowicz 1986, Growth and Development; Ulanowicz 2004, Comput Biol Chem
//   28:321), logs base 2:
//   ami  = sum_ij T_ij/tstp log2(T_ij tstp / (T_i. T_.j)),  h = -sum_ij T_ij/tstp log2(T_ij/tstp)
//   ascendency = tstp ami, capacity = tstp h, overhead = capacity - ascendency
//   links = nonzero internal flows (self-loops counted), connectance = links / n^2
//   foodWebConnectance = feeding links among living compartments (cannibalism counted)
//                        / (living compartments)^2: the directed connectance of food-web
//                        studies (Martinez 1992, Am Nat 139:1208, from memory), beside the
//                        ENA connectance above, which counts every internal flow.
// Food-web figures: total primary production (net production of producers; for plain
// flow networks the imports of producer nodes; NaN with producersIdentified false when
// no producer can be told apart), TPP/R with R the respiration of the network
// (consumers only for scenarios, which enter producers with net production), TPP/B and
// total living biomass.
//   systemOmnivory      = sum_j OI_j log(Q_j) / sum_j log(Q_j) over consumers, the
//                         published system omnivory index (Christensen & Pauly 1993,
//                         ICLARM Conf Proc 26; the weighting as recalled from memory).
//                         It depends on the units: log(Q) < 0 when Q < 1.
//   omnivoryIntakeWeighted = sum_j OI_j Q_j / sum_j Q_j (this project's own variant,
//                         independent of units; shown under this name only).
// Catch figures (solved scenarios only):
//   primary production required per unit production of j (Pauly & Christensen 1995,
//   Nature 374:255): ppr_j = (Q_j / P_j) sum_i DC_ij ppr_i for consumers (imported food
//   needs none from this system); ppr_j = 1 for producers; for detritus pools either
//     1, detritus counted as level-I supply (catchPpr, divided by TPP + detritus inflow),
//     0, producers only: detritus eaten needs no further primary production
//        (catchPprProducersOnly, divided by TPP); this project's two labelled readings,
//   NaN for a consumer without positive P and for whatever eats it;
//   PPR of the catch = sum_j Y_j ppr_j, Y = landings + dead discards.
//   Mean trophic level of the catch on landings, sum_j L_j TL_j / sum_j L_j, as in the
//   analyses of fishing down marine food webs (Pauly et al. 1998, Science 279:860);
//   beside it the same on landings plus dead discards (catchMeanTlWithDiscards).
#pragma once

#include <cstddef>
#include <optional>
#include <vector>

#include "core/balance/balance_sheet.h"
#include "core/network/flow_network.h"

namespace tl {

struct SystemIndicators {
    // Network analysis (any flow network).
    double tst = 0.0, tstp = 0.0, boundaryInput = 0.0, fci = 0.0, apl = 0.0;
    double ami = 0.0, flowDiversity = 0.0, ascendency = 0.0, capacity = 0.0, overhead = 0.0;
    std::size_t links = 0;
    double connectance = 0.0, linkDensity = 0.0;
    std::size_t feedingLinks = 0;     // nonzero flows among living compartments
    double foodWebConnectance = 0.0;  // feedingLinks / living^2
    bool fciSingular = false;  // I - G singular (a closed loop): fci NaN

    // Food web.
    bool producersIdentified = true;  // false: no producer told apart; TPP figures NaN
    double totalPrimaryProduction = 0.0, totalRespiration = 0.0, totalLivingBiomass = 0.0;
    double tppOverR = 0.0, tppOverB = 0.0;  // NaN when R or B is 0
    double systemOmnivory = 0.0;            // published, log(Q)-weighted; NaN without consumers
    double omnivoryIntakeWeighted = 0.0;    // Q-weighted (project's own); NaN without consumers

    // Catch (solved scenarios; NaN for plain flow networks or without catch).
    double totalCatch = 0.0, totalLandings = 0.0;
    double totalDetritusInflow = 0.0;  // sum of the pools' inflows (internal + import)
    double catchPpr = 0.0;             // PPR of the catch, detritus as level-I supply, flow units
    double catchPprShareOfTpp = 0.0;   // catchPpr / (TPP + detritus inflow): the matching total
    double catchPprProducersOnly = 0.0;       // PPR with detritus needing none
    double catchPprProducersOnlyShare = 0.0;  // catchPprProducersOnly / TPP
    double catchMeanTl = 0.0;                 // on landings (Pauly et al. 1998)
    double catchMeanTlWithDiscards = 0.0;     // on landings + dead discards
    std::vector<double> pprPerUnitProduction;  // per node, detritus as level-I supply; empty for plain networks
};

// ENA and food-web figures on a flow network (omnivory from flowTrophicLevels); catch
// figures NaN.
SystemIndicators systemIndicators(const FlowNetwork& network);

// Marks the named nodes as producers (their imports as primary production) and every
// other living node without intake from other nodes as a consumer fed from outside:
// for SCOR networks whose producers cannot be told apart from their flows. Returns the
// names not found.
std::vector<std::string> assignProducers(FlowNetwork& network, const std::vector<std::string>& names);

// The same for a solved scenario plus the catch figures, using the sheet's TL and OI.
SystemIndicators systemIndicators(const Model& model, const BalanceSheet& sheet, const FlowNetwork& network);

}  // namespace tl
