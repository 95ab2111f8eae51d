// Network analysis of one solved scenario, as the analysis pages show it: the flow
// network (core/network/flow_network.h), mixed trophic impact (Ulanowicz & Puccia 1990),
// keystone indices (Libralato et al. 2006), system indicators and the level
// decomposition (for the mean transfer efficiency). Nothing is computed here that the
// core does not compute; this file only gathers it and moves it off the GUI thread.
//
// Cost: indicators + impact matrix take about 11 ms at 125 compartments (figures from
// tests/bench/network_bench) and grow roughly with n^3, so scenarios below
// kInlineAnalysisLimit compartments (< ~4 ms) are analysed inline, larger ones with
// QtConcurrent so that editing never stalls.
#pragma once

#include <QFutureWatcher>
#include <QObject>
#include <QString>
#include <memory>
#include <vector>

#include "core/model/compartment.h"
#include "core/model/model.h"
#include "core/network/flow_network.h"
#include "core/network/indicators.h"
#include "core/network/keystone.h"
#include "core/network/level_decomposition.h"
#include "core/network/mixed_trophic_impact.h"

namespace tl::ui {

inline constexpr std::size_t kInlineAnalysisLimit = 80;

struct ScenarioAnalysis {
    QString unavailable;  // why there is nothing to show; empty when analysed
    Units units;
    std::vector<CompartmentKind> kinds;  // per node (nodes are the compartments, in order)
    FlowNetwork network;
    MixedTrophicImpact mti;
    std::vector<KeystoneEntry> keystone;
    SystemIndicators indicators;
    LevelDecomposition levels;
    bool hasCatch = false;
    bool balanced = false;  // the sheet's status is Balanced (figures of an unbalanced one are as they stand)

    bool available() const { return unavailable.isEmpty(); }
};

// Runs the core analyses (any thread). An unsolvable scenario gives `unavailable`.
ScenarioAnalysis analyseScenario(const Model& model, const BalanceSheet& sheet);

// Analyses scenarios inline or in the background and hands back only the newest result
// (a result of an older scenario that finishes late is dropped).
class AnalysisRunner : public QObject {
    Q_OBJECT
public:
    explicit AnalysisRunner(QObject* parent = nullptr);
    ~AnalysisRunner() override;

    void start(const Model& model, const BalanceSheet& sheet);
    bool busy() const { return running_ > 0; }
    // Lower the inline limit (tests use 0 to force the background path).
    void setInlineLimit(std::size_t compartments) { inlineLimit_ = compartments; }

signals:
    void finished(std::shared_ptr<const tl::ui::ScenarioAnalysis> analysis);

private:
    std::size_t inlineLimit_ = kInlineAnalysisLimit;
    quint64 generation_ = 0;
    int running_ = 0;
};

}  // namespace tl::ui
