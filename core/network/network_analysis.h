// NetworkAnalysis: every network analysis of one solved scenario or of a plain SCOR
// flow network, gathered once so that the CLI (`tledger network`), the report writers
// (core/io/network_report.h) and the workbench's analysis pages show the same numbers
// from the same call. Nothing is computed here that the concept files do not compute:
//   flow network            core/network/flow_network.h
//   trophic level, omnivory the balance sheet (scenario) or flow_trophic_level.h (SCOR)
//   system indicators       core/network/indicators.h (Finn 1976; Ulanowicz 1986, 2004)
//   level decomposition     core/network/level_decomposition.h (Ulanowicz 1995)
//   mixed trophic impact    core/network/mixed_trophic_impact.h (Ulanowicz & Puccia 1990)
//   keystone index          core/network/keystone.h (Libralato et al. 2006)
//   diet overlap            core/network/diet_overlap.h (Pianka 1973; scenarios only)
//
// Cost: indicators + impact matrix grow roughly with n^3 (about 11 ms at 125
// compartments; tests/bench/network_bench).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/balance/balance_sheet.h"
#include "core/io/scor.h"
#include "core/model/compartment.h"
#include "core/model/model.h"
#include "core/network/diet_overlap.h"
#include "core/network/flow_network.h"
#include "core/network/indicators.h"
#include "core/network/keystone.h"
#include "core/network/level_decomposition.h"
#include "core/network/mixed_trophic_impact.h"

namespace tl {

// Choices a user can make about the analyses.
struct AnalysisOptions {
    FeedingCycles feedingCycles = FeedingCycles::Removed;  // level decomposition (Ulanowicz 1995: removed)
    // SCOR networks: the living nodes that are primary producers. Empty: told apart by
    // their flows (living nodes with no intake from other nodes).
    std::vector<std::string> producers;
};

// Why a scenario has no network analysis.
enum class AnalysisGap {
    None,        // analysed
    Unsolvable,  // the balance could not be solved (status Invalid): there is no flow network
    Empty        // the scenario has no compartments
};

struct NetworkAnalysis {
    AnalysisGap gap = AnalysisGap::None;
    bool fromScor = false;                // a plain SCOR network rather than a scenario
    std::optional<BalanceStatus> status;  // scenarios only
    bool balanced = false;                // status is Balanced (figures of an unbalanced one are as they stand)
    Units units;                          // the scenario's; SCOR networks have no declared units
    std::vector<CompartmentKind> kinds;   // scenarios only: per node (the compartments, in order)
    FlowNetwork network;
    std::vector<double> tl, oi;           // trophic level and omnivory index per node
    SystemIndicators indicators;
    LevelDecomposition levels;
    MixedTrophicImpact mti;
    std::vector<KeystoneEntry> keystone;
    std::optional<DietOverlap> overlap;   // scenarios only (needs the diet matrix)
    bool hasCatch = false;                // some node is harvested: outputs carry the decision-support notice
    std::vector<std::string> unknownProducers;  // names given in AnalysisOptions::producers that are no living node

    bool available() const { return gap == AnalysisGap::None; }
    std::string flowUnit() const { return fromScor ? "flow units" : units.flow(); }
    std::string stockUnit() const { return fromScor ? "stock units" : units.biomass(); }
};

// The analyses of a solved scenario (any thread). An Invalid sheet or an empty model
// gives `gap` set and nothing else computed.
NetworkAnalysis analyseNetwork(const Model& model, const BalanceSheet& sheet, const AnalysisOptions& options = {});
// The analyses of a plain flow network read from a SCOR file.
NetworkAnalysis analyseNetwork(const ScorNetwork& scor, const AnalysisOptions& options = {});

}  // namespace tl
