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
// Food-web figures: total primary production (net production of producers; for plain
// flow networks the imports of producer nodes), TPP/R with R the respiration of the
// network (consumers only for scenarios, which enter producers with net production),
// TPP/B and total living biomass, system omnivory index (intake-weighted mean OI of
// consumers, this project's convention).
// Catch figures (solved scenarios only, Pauly & Christensen 1995, Nature 374:255):
//   primary production required per unit production of j:
//     ppr_j = 1 for producers and detritus pools (both level I; counting detritus with
//     primary production follows that paper as recalled from memory, not re-read);
//     ppr_j = (Q_j / P_j) sum_i DC_ij ppr_i for consumers (imported food needs none from
//     this system); NaN for a consumer without positive P and for whatever eats it;
//   PPR of the catch = sum_j Y_j ppr_j;  mean TL of the catch = sum_j Y_j TL_j / sum_j Y_j.
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
    bool fciSingular = false;  // I - G singular (a closed loop): fci NaN

    // Food web.
    double totalPrimaryProduction = 0.0, totalRespiration = 0.0, totalLivingBiomass = 0.0;
    double tppOverR = 0.0, tppOverB = 0.0;  // NaN when R or B is 0
    double systemOmnivory = 0.0;            // NaN without consumers

    // Catch (solved scenarios; NaN for plain flow networks or without catch).
    double totalCatch = 0.0;
    double catchPpr = 0.0;             // PPR of the catch, flow units
    double catchPprShareOfTpp = 0.0;   // catchPpr / TPP
    double catchMeanTl = 0.0;
    std::vector<double> pprPerUnitProduction;  // per node; empty for plain flow networks
};

// ENA and food-web figures on a flow network (omnivory from flowTrophicLevels); catch
// figures NaN.
SystemIndicators systemIndicators(const FlowNetwork& network);

// The same for a solved scenario plus the catch figures, using the sheet's TL and OI.
SystemIndicators systemIndicators(const Model& model, const BalanceSheet& sheet, const FlowNetwork& network);

}  // namespace tl
