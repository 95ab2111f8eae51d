#include "ui/ensemble/ensemble_runner.h"

#include <QElapsedTimer>
#include <QtConcurrent/QtConcurrentRun>
#include <atomic>

namespace tl::ui {

struct EnsembleRunner::Shared {
    std::atomic<bool> cancel{false};
    std::atomic<quint64> done{0}, total{0};
    QElapsedTimer clock;
};

EnsembleRunner::EnsembleRunner(QObject* parent) : QObject(parent)
{
    poll_.setInterval(100);
    connect(&poll_, &QTimer::timeout, this, &EnsembleRunner::pollProgress);
}

EnsembleRunner::~EnsembleRunner()
{
    if (shared_) shared_->cancel = true;
}

bool EnsembleRunner::start(const tl::Model& model, const tl::ensemble::EnsembleSettings& settings, const QString& scenario)
{
    if (busy()) return false;
    auto shared = std::make_shared<Shared>();
    shared->total = settings.draws;
    shared->clock.start();
    shared_ = shared;
    watcher_ = new QFutureWatcher<std::shared_ptr<const EnsembleOutcome>>(this);
    connect(watcher_, &QFutureWatcherBase::finished, this, &EnsembleRunner::collect);
    watcher_->setFuture(QtConcurrent::run([model, settings, scenario, shared] {
        auto outcome = std::make_shared<EnsembleOutcome>();
        outcome->settings = settings;
        outcome->scenario = scenario;
        outcome->run = tl::ensemble::runEnsemble(model, settings, &shared->cancel, [shared](std::uint64_t done, std::uint64_t total) {
            shared->done = done;
            shared->total = total;
        });
        outcome->seconds = double(shared->clock.elapsed()) / 1000.0;
        return std::shared_ptr<const EnsembleOutcome>(std::move(outcome));
    }));
    poll_.start();
    pollProgress();
    return true;
}

void EnsembleRunner::cancel()
{
    if (shared_) shared_->cancel = true;
}

void EnsembleRunner::waitForIdle()
{
    if (!watcher_) return;
    watcher_->waitForFinished();
    collect();
}

void EnsembleRunner::pollProgress()
{
    if (shared_) emit progressed(shared_->done, shared_->total, double(shared_->clock.elapsed()) / 1000.0);
}

void EnsembleRunner::collect()
{
    if (!watcher_) return;
    poll_.stop();
    auto* watcher = std::exchange(watcher_, nullptr);
    const auto outcome = watcher->result();
    watcher->deleteLater();
    shared_.reset();
    emit finished(outcome);
}

}  // namespace tl::ui
