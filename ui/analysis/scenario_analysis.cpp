#include "ui/analysis/scenario_analysis.h"

#include <QtConcurrent/QtConcurrentRun>

#include "core/balance/balance_sheet.h"

namespace tl::ui {

ScenarioAnalysis analyseScenario(const Model& model, const BalanceSheet& sheet)
{
    ScenarioAnalysis a;
    a.units = model.units;
    for (const auto& c : model.compartments()) a.kinds.push_back(c.kind);
    if (sheet.status == BalanceStatus::Invalid || sheet.rows.size() != model.size()) {
        a.unavailable = QObject::tr("The scenario could not be solved, so it has no flow network to analyse. "
                                    "See the balance sheet for the problems.");
        return a;
    }
    if (model.size() == 0) {
        a.unavailable = QObject::tr("The scenario has no compartments.");
        return a;
    }
    a.balanced = sheet.status == BalanceStatus::Balanced;
    a.network = buildFlowNetwork(model, sheet);
    a.mti = mixedTrophicImpact(a.network);
    a.keystone = keystoneIndices(a.network, a.mti);
    a.indicators = systemIndicators(model, sheet, a.network);
    a.levels = decomposeLevels(a.network);
    for (std::size_t i = 0; i < a.network.size(); ++i)
        if (a.network.catchTotal(i) > 0) a.hasCatch = true;
    return a;
}

AnalysisRunner::AnalysisRunner(QObject* parent) : QObject(parent) {}

AnalysisRunner::~AnalysisRunner()
{
    // Background jobs hold copies of their inputs, not `this`; their watchers are our
    // children and are destroyed with us, so a late result reaches nobody.
}

void AnalysisRunner::start(const Model& model, const BalanceSheet& sheet)
{
    const quint64 generation = ++generation_;
    if (model.size() < inlineLimit_) {
        emit finished(std::make_shared<const ScenarioAnalysis>(analyseScenario(model, sheet)));
        return;
    }
    auto* watcher = new QFutureWatcher<std::shared_ptr<const ScenarioAnalysis>>(this);
    ++running_;
    connect(watcher, &QFutureWatcherBase::finished, this, [this, watcher, generation] {
        --running_;
        const auto result = watcher->result();
        watcher->deleteLater();
        if (generation == generation_) emit finished(result);
    });
    watcher->setFuture(QtConcurrent::run([model, sheet] {
        return std::make_shared<const ScenarioAnalysis>(analyseScenario(model, sheet));
    }));
}

}  // namespace tl::ui
