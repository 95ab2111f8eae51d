// ReconcileRunner: runs tl::reconcile (core/reconcile/reconcile.h) on a worker thread
// (QtConcurrent) so that the workbench never waits for SLSQP, which takes seconds on
// large models. The job works on its own copies of the model and options and shares
// only a small block of atomics with the GUI thread: the cancel flag that the core reads
// at every evaluation, and the progress counters that a timer here reads and re-emits.
// Nothing of the job touches a QObject, so a runner (or its dialog) may be destroyed
// while a job still runs: the job is told to stop and its result reaches nobody.
#pragma once

#include <QFutureWatcher>
#include <QObject>
#include <QTimer>
#include <memory>

#include "core/reconcile/reconcile.h"

namespace tl::ui {

class ReconcileRunner : public QObject {
    Q_OBJECT
public:
    explicit ReconcileRunner(QObject* parent = nullptr);
    ~ReconcileRunner() override;  // cancels a running job

    // Starts a run; false (and nothing started) while another one runs.
    bool start(const tl::Model& model, const tl::ReconcileOptions& options);
    // Asks the running job to stop; it ends with status Cancelled at its next
    // evaluation (within one SLSQP iteration). No effect when idle.
    void cancel();
    bool busy() const { return watcher_ != nullptr; }
    // Blocks until the running job has ended and its signal was sent (tests, shutdown).
    void waitForIdle();

signals:
    void progressed(const tl::ReconcileProgress& progress, double seconds);
    void finished(std::shared_ptr<const tl::ReconcileResult> result);

private:
    struct Shared;
    void pollProgress();
    void collect();

    std::shared_ptr<Shared> shared_;
    QFutureWatcher<std::shared_ptr<const tl::ReconcileResult>>* watcher_ = nullptr;
    QTimer poll_;
};

}  // namespace tl::ui
