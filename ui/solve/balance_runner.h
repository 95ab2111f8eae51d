// BalanceRunner: re-solves the scenario after every edit (DESIGN.md 2) without ever
// freezing the window. A solve that took under 5 ms last time runs inline, at once;
// a slower one runs on the thread pool (QtConcurrent) on a copy of the Model, and
// only the newest request's result is delivered — edits made while a solve runs are
// coalesced into one follow-up solve.
#pragma once

#include <QFutureWatcher>
#include <QObject>
#include <optional>

#include "core/balance/balance_sheet.h"
#include "core/balance/scenario_checks.h"
#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl::ui {

// What the Checks panel and status bar show for one state of the inputs.
struct SolveOutcome {
    tl::BalanceSheet sheet;
    tl::Problems checks;       // validateModel, then the sheet's problems (no duplicates)
    tl::ScenarioState state = tl::ScenarioState::NoCompartments;  // the status bar's word
    double milliseconds = 0.0; // time of solve + validation
    bool inBackground = false;
};

// Runs validation and the solver on `model` (any thread).
SolveOutcome solveAndCheck(const tl::Model& model);

class BalanceRunner : public QObject {
    Q_OBJECT
public:
    explicit BalanceRunner(QObject* parent = nullptr);
    ~BalanceRunner() override;

    void request(const tl::Model& model);
    bool busy() const { return watcher_.isRunning(); }
    // Blocks until the newest request's result has been delivered (tests, snapshot).
    void waitForIdle();
    double inlineLimitMs() const { return inlineLimitMs_; }
    void setInlineLimitMs(double ms) { inlineLimitMs_ = ms; }

signals:
    void started();  // a background solve began (the status bar says "Solving…")
    void solved(const tl::ui::SolveOutcome& outcome);

private:
    void startBackground(const tl::Model& model);
    void onFinished();

    QFutureWatcher<SolveOutcome> watcher_;
    std::optional<tl::Model> pending_;
    double lastMs_ = 0.0;
    bool awaitingDelivery_ = false;  // a background solve's result is yet to be emitted
    double inlineLimitMs_ = 5.0;
};

}  // namespace tl::ui
