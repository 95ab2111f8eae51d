// Network analysis of one solved scenario, as the analysis pages show it: the core's
// tl::analyseNetwork (core/network/network_analysis.h, the same call `tledger network`
// makes) plus a sentence for the pages when there is nothing to show. This file only
// moves the work off the GUI thread.
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

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"
#include "core/network/network_analysis.h"

namespace tl::ui {

inline constexpr std::size_t kInlineAnalysisLimit = 80;

struct ScenarioAnalysis : tl::NetworkAnalysis {
    QString unavailable;  // why there is nothing to show (set exactly when !available())
};

// Runs tl::analyseNetwork (any thread) and says why an unsolvable or empty scenario
// has nothing to show.
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
