#include "ui/solve/balance_runner.h"

#include <QCoreApplication>
#include <QtConcurrent/QtConcurrentRun>
#include <chrono>

#include "core/balance/solver.h"
#include "core/balance/scenario_checks.h"

namespace tl::ui {

SolveOutcome solveAndCheck(const tl::Model& model)
{
    const auto t0 = std::chrono::steady_clock::now();
    SolveOutcome out;
    out.sheet = tl::solveBalance(model);
    out.checks = tl::scenarioChecks(model, out.sheet);
    out.state = tl::scenarioState(model, out.sheet, out.checks);
    out.milliseconds = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - t0).count();
    return out;
}

BalanceRunner::BalanceRunner(QObject* parent) : QObject(parent)
{
    connect(&watcher_, &QFutureWatcher<SolveOutcome>::finished, this, &BalanceRunner::onFinished);
}

BalanceRunner::~BalanceRunner() { watcher_.waitForFinished(); }

void BalanceRunner::request(const tl::Model& model)
{
    if (watcher_.isRunning()) {
        pending_ = model;  // the running result is stale; solve the newest state next
        return;
    }
    if (lastMs_ < inlineLimitMs_) {
        SolveOutcome out = solveAndCheck(model);
        lastMs_ = out.milliseconds;
        emit solved(out);
        return;
    }
    startBackground(model);
}

void BalanceRunner::startBackground(const tl::Model& model)
{
    awaitingDelivery_ = true;
    emit started();
    watcher_.setFuture(QtConcurrent::run([m = model]() {
        SolveOutcome out = solveAndCheck(m);
        out.inBackground = true;
        return out;
    }));
}

void BalanceRunner::onFinished()
{
    SolveOutcome out = watcher_.result();
    lastMs_ = out.milliseconds;
    if (pending_) {
        tl::Model next = std::move(*pending_);
        pending_.reset();
        startBackground(next);  // stale result dropped; the newest inputs are being solved
        return;
    }
    awaitingDelivery_ = false;
    emit solved(out);
}

void BalanceRunner::waitForIdle()
{
    // The watcher reports "finished" through the event loop: keep it turning until the
    // newest result has actually been delivered.
    while (awaitingDelivery_ || pending_) {
        watcher_.waitForFinished();
        QCoreApplication::processEvents(QEventLoop::AllEvents, 20);
    }
}

}  // namespace tl::ui
