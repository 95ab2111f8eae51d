#include "ui/analysis/scenario_analysis.h"

#include <QtConcurrent/QtConcurrentRun>


namespace tl::ui {

ScenarioAnalysis analyseScenario(const Model& model, const BalanceSheet& sheet)
{
    ScenarioAnalysis a;
    static_cast<tl::NetworkAnalysis&>(a) = tl::analyseNetwork(model, sheet);
    switch (a.gap) {
    case tl::AnalysisGap::None: break;
    case tl::AnalysisGap::Unsolvable:
        a.unavailable = QObject::tr("The scenario could not be solved, so it has no flow network to analyse. "
                                    "See the balance sheet for the problems.");
        break;
    case tl::AnalysisGap::Empty: a.unavailable = QObject::tr("The scenario has no compartments."); break;
    }
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
