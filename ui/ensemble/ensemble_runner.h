// EnsembleRunner: runs tl::ensemble::runEnsemble (core/ensemble/ensemble.h) on a worker
// thread (QtConcurrent; the core spreads the draws over its own threads) so that the
// window never waits for the draws. As ReconcileRunner does, the job works on its own
// copy of the model and settings and shares only atomics with the GUI thread: the
// cancel flag the core watches and the progress counters a 100 ms timer reads. A runner
// destroyed while a job runs cancels it; the result then reaches nobody.
#pragma once

#include <QFutureWatcher>
#include <QObject>
#include <QString>
#include <QTimer>
#include <memory>

#include "core/ensemble/ensemble.h"

namespace tl::ui {

// A finished (or cancelled) run with what it was asked.
struct EnsembleOutcome {
    tl::ensemble::EnsembleRun run;
    tl::ensemble::EnsembleSettings settings;
    QString scenario;
    double seconds = 0.0;
};

class EnsembleRunner : public QObject {
    Q_OBJECT
public:
    explicit EnsembleRunner(QObject* parent = nullptr);
    ~EnsembleRunner() override;  // cancels a running job

    // Starts a run; false (and nothing started) while another one runs.
    bool start(const tl::Model& model, const tl::ensemble::EnsembleSettings& settings, const QString& scenario);
    // The core stops at its next chunk of draws; the outcome then has cancelled set and
    // covers the draws run so far.
    void cancel();
    bool busy() const { return watcher_ != nullptr; }
    void waitForIdle();  // blocks until the job ended and finished() was sent (tests)

signals:
    void progressed(quint64 done, quint64 total, double seconds);
    void finished(std::shared_ptr<const tl::ui::EnsembleOutcome> outcome);

private:
    struct Shared;
    void pollProgress();
    void collect();

    std::shared_ptr<Shared> shared_;
    QFutureWatcher<std::shared_ptr<const EnsembleOutcome>>* watcher_ = nullptr;
    QTimer poll_;
};

}  // namespace tl::ui
