#include "core/network/network_analysis.h"

#include "core/network/flow_trophic_level.h"

namespace tl {
namespace {

// The analyses both sources share, once the network, TL and OI are known.
void analyseFlows(NetworkAnalysis& a, const AnalysisOptions& options)
{
    a.levels = decomposeLevels(a.network, 30, options.feedingCycles);
    a.mti = mixedTrophicImpact(a.network);
    a.keystone = keystoneIndices(a.network, a.mti);
    for (std::size_t i = 0; i < a.network.size(); ++i)
        if (a.network.catchTotal(i) > 0) a.hasCatch = true;
}

}  // namespace

NetworkAnalysis analyseNetwork(const Model& model, const BalanceSheet& sheet, const AnalysisOptions& options)
{
    NetworkAnalysis a;
    a.units = model.units;
    a.status = sheet.status;
    for (const Compartment& c : model.compartments()) a.kinds.push_back(c.kind);
    if (sheet.status == BalanceStatus::Invalid || sheet.rows.size() != model.size()) {
        a.gap = AnalysisGap::Unsolvable;
        return a;
    }
    if (model.size() == 0) {
        a.gap = AnalysisGap::Empty;
        return a;
    }
    a.balanced = sheet.status == BalanceStatus::Balanced;
    a.network = buildFlowNetwork(model, sheet);
    a.indicators = systemIndicators(model, sheet, a.network);
    a.overlap = dietOverlap(model);
    for (const CompartmentBalance& row : sheet.rows) {
        a.tl.push_back(row.tl);
        a.oi.push_back(row.oi);
    }
    analyseFlows(a, options);
    return a;
}

NetworkAnalysis analyseNetwork(const ScorNetwork& scor, const AnalysisOptions& options)
{
    NetworkAnalysis a;
    a.fromScor = true;
    a.network = flowNetworkFromScor(scor);
    if (!options.producers.empty()) a.unknownProducers = assignProducers(a.network, options.producers);
    a.indicators = systemIndicators(a.network);
    FlowTrophicLevels levels = flowTrophicLevels(a.network);
    a.tl = std::move(levels.tl);
    a.oi = std::move(levels.omnivory);
    analyseFlows(a, options);
    return a;
}

}  // namespace tl
