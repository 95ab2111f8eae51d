#include "ui/reconcile/reconcile_runner.h"

#include <QElapsedTimer>
#include <QtConcurrent/QtConcurrentRun>
#include <atomic>

namespace tl::ui {

// What the job and the GUI thread share: written by the job, read by the timer.
struct ReconcileRunner::Shared {
    std::atomic<bool> cancel{false};
    std::atomic<int> round{0};
    std::atomic<bool> elastic{false};
    std::atomic<int> evaluations{0};
    std::atomic<std::size_t> freeVariables{0};
    QElapsedTimer clock;
};

ReconcileRunner::ReconcileRunner(QObject* parent) : QObject(parent)
{
    poll_.setInterval(100);  // ten updates a second: enough to see it move, cheap to draw
    connect(&poll_, &QTimer::timeout, this, &ReconcileRunner::pollProgress);
}

ReconcileRunner::~ReconcileRunner()
{
    // The job keeps `shared_` alive through its own pointer; it stops at its next
    // evaluation and its result is dropped with the watcher (our child).
    if (shared_) shared_->cancel = true;
}

bool ReconcileRunner::start(const tl::Model& model, const tl::ReconcileOptions& options)
{
    if (busy()) return false;
    auto shared = std::make_shared<Shared>();
    shared->clock.start();
    shared_ = shared;
    watcher_ = new QFutureWatcher<std::shared_ptr<const tl::ReconcileResult>>(this);
    connect(watcher_, &QFutureWatcherBase::finished, this, &ReconcileRunner::collect);
    watcher_->setFuture(QtConcurrent::run([model, options, shared] {
        tl::ReconcileControl control;
        control.cancel = &shared->cancel;
        control.progress = [shared](const tl::ReconcileProgress& p) {
            shared->round = p.round;
            shared->elastic = p.elastic;
            shared->evaluations = p.evaluations;
            shared->freeVariables = p.freeVariables;
        };
        return std::make_shared<const tl::ReconcileResult>(tl::reconcile(model, options, control));
    }));
    poll_.start();
    pollProgress();
    return true;
}

void ReconcileRunner::cancel()
{
    if (shared_) shared_->cancel = true;
}

void ReconcileRunner::waitForIdle()
{
    if (!watcher_) return;
    watcher_->waitForFinished();
    collect();
}

void ReconcileRunner::pollProgress()
{
    if (!shared_) return;
    tl::ReconcileProgress p;
    p.round = shared_->round;
    p.elastic = shared_->elastic;
    p.evaluations = shared_->evaluations;
    p.freeVariables = shared_->freeVariables;
    emit progressed(p, double(shared_->clock.elapsed()) / 1000.0);
}

void ReconcileRunner::collect()
{
    if (!watcher_) return;  // waitForIdle collected it already
    poll_.stop();
    auto* watcher = std::exchange(watcher_, nullptr);
    const auto result = watcher->result();
    watcher->deleteLater();
    shared_.reset();
    emit finished(result);
}

}  // namespace tl::ui
