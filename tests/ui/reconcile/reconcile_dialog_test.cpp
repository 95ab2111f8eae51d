// The Reconcile dialog (issue 14, GUI): runs off the GUI thread, can be stopped, and its
// "Create scenario" adds a NEW scenario as one undoable edit; cancelling or closing
// leaves the project exactly as it was. The solve itself is tested in
// tests/core/reconcile; here, what the workbench does with it.
#include <QCheckBox>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QPushButton>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QThreadPool>
#include <QUndoStack>

#include "core/balance/solver.h"
#include "core/io/html_report.h"
#include "tests/bench/synthetic_model.h"
#include "tests/ui/workbench_test_support.h"
#include "ui/document/project_document.h"
#include "ui/main_window.h"
#include "ui/reconcile/ee_change_chart.h"
#include "ui/reconcile/reconcile_dialog.h"
#include "ui/reconcile/reconcile_runner.h"

using namespace tl::ui;

namespace {

const QString kReservoir = QStringLiteral(TL_SAMPLES_DIR "/reservoir.tledger");
constexpr int kSolveTimeoutMs = 120000;  // a generous wait on a busy machine, not a speed target

// A model whose reconcile takes long enough to be stopped midway: an invented synthetic
// web (tests/bench/synthetic_model.h) with every fifth consumer's biomass tripled.
tl::Model slowModel()
{
    tl::Model m = tl::bench::syntheticModel(120, tl::bench::UnknownMix::EE, 3).model;
    std::size_t consumer = 0;
    for (std::size_t i = 0; i < m.size(); ++i) {
        tl::Compartment& c = m.compartment(i);
        if (c.kind == tl::CompartmentKind::Consumer && c.value(tl::Param::Biomass) && consumer++ % 5 == 0)
            *c.value(tl::Param::Biomass) *= 3.0;
    }
    return m;
}

int rowOf(const ReconcileDialog& d, const QString& name)
{
    for (int r = 0; r < d.settingsTable()->rowCount(); ++r)
        if (d.settingsTable()->item(r, ReconcileDialog::NameColumn)->text() == name) return r;
    return -1;
}

}  // namespace

class ReconcileDialogTest : public QObject {
    Q_OBJECT
private slots:
    void init()
    {
        doc_ = std::make_unique<ProjectDocument>();
        QString error;
        QVERIFY2(doc_->open(kReservoir, &error, /*asTemplate=*/true), qPrintable(error));
        doc_->setCurrentIndex(0);
    }
    void cleanup()
    {
        QThreadPool::globalInstance()->waitForDone();  // a stopped job ends before the next test
        doc_.reset();
    }

    void runsOffTheGuiThreadAndReports()
    {
        ReconcileDialog dialog(doc_.get());
        QVERIFY(dialog.run());
        // run() returned while the solve goes on: it is not on this thread.
        QVERIFY(dialog.running());
        QVERIFY(!dialog.settingsTable()->isEnabled());
        QTRY_VERIFY_WITH_TIMEOUT(dialog.showingReport(), kSolveTimeoutMs);
        QVERIFY(dialog.result());
        QCOMPARE(dialog.result()->status, tl::ReconcileStatus::Balanced);
        QCOMPARE(dialog.changesTable()->rowCount(), int(dialog.result()->changes.size()));
        QVERIFY(dialog.summaryLabel()->text().contains(QStringLiteral("balance")));
        // The chart shows the compartment that was over-eaten (EE 1.156 before).
        const auto chironomids = *doc_->model().indexOf("Chironomid larvae");
        QVERIFY(std::find(dialog.chart()->rows().begin(), dialog.chart()->rows().end(), chironomids) !=
                dialog.chart()->rows().end());
        QVERIFY(dialog.bindingList()->count() > 0);
        QCOMPARE(dialog.nameEdit()->text(), QStringLiteral("baseline reconciled"));
        QVERIFY(dialog.createButton()->isEnabled());
    }

    void acceptCreatesANewScenarioAndSelectsIt()
    {
        const tl::Project before = doc_->project();
        const int undoBefore = doc_->undoStack()->count();
        ReconcileDialog dialog(doc_.get());
        QVERIFY(dialog.run());
        QTRY_VERIFY_WITH_TIMEOUT(dialog.showingReport(), kSolveTimeoutMs);
        dialog.nameEdit()->setText(QStringLiteral("balanced draft"));
        QTest::mouseClick(dialog.createButton(), Qt::LeftButton);

        QCOMPARE(doc_->project().scenarios.size(), before.scenarios.size() + 1);
        QCOMPARE(doc_->currentIndex(), 1);  // inserted after baseline and shown
        const tl::Scenario& made = doc_->scenario();
        QCOMPARE(QString::fromStdString(made.name), QStringLiteral("balanced draft"));
        QCOMPARE(QString::fromStdString(made.parent), QStringLiteral("baseline"));
        QCOMPARE(tl::solveBalance(made.model).status, tl::BalanceStatus::Balanced);
        // Never an overwrite: every scenario that was there is there, unchanged.
        for (const tl::Scenario& s : before.scenarios) {
            const tl::Scenario* now = doc_->project().findScenario(s.name);
            QVERIFY(now);
            QVERIFY(*now == s);
        }
        QCOMPARE(doc_->undoStack()->count(), undoBefore + 1);
        QCOMPARE(doc_->undoStack()->undoText(), QStringLiteral("Reconcile baseline into new scenario balanced draft"));
        QCOMPARE(dialog.result() != nullptr, true);
        QCOMPARE(dialog.result()->status, tl::ReconcileStatus::Balanced);
    }

    // The changes go with the new scenario as a stored run (kind "reconcile"), saved with
    // the project once however often it is saved, and the report lists them from it.
    void theChangesAreKeptAsAStoredRunTheReportReads()
    {
        ReconcileDialog dialog(doc_.get());
        QVERIFY(dialog.run());
        QTRY_VERIFY_WITH_TIMEOUT(dialog.showingReport(), kSolveTimeoutMs);
        QVERIFY(dialog.createScenario());
        QCOMPARE(doc_->project().runs.size(), std::size_t(1));
        const tl::StoredRun run = doc_->project().runs.front();
        QCOMPARE(QString::fromStdString(run.kind), QStringLiteral("reconcile"));
        QCOMPARE(QString::fromStdString(run.scenario), QStringLiteral("baseline reconciled"));
        QVERIFY(run.summaryJson.find("\"changes\"") != std::string::npos);

        QTemporaryDir dir;
        const QString path = dir.filePath(QStringLiteral("kept.tledger"));
        QString error;
        QVERIFY2(doc_->saveAs(path, &error), qPrintable(error));
        QVERIFY2(doc_->saveAs(path, &error), qPrintable(error));  // the run (still id 0 here) is offered again
        ProjectDocument reopened;
        QVERIFY2(reopened.open(path, &error), qPrintable(error));
        QCOMPARE(reopened.project().runs.size(), std::size_t(1));
        QCOMPARE(reopened.project().runs.front().summaryJson, run.summaryJson);

        tl::ReportOptions o;
        o.scenarios = {"baseline reconciled"};
        const std::string html = tl::makeHtmlReport(reopened.project(), o).html;
        const auto at = html.find("<h3>Reconcile changes (");
        QVERIFY(at != std::string::npos);
        QVERIFY(html.find(std::to_string(dialog.result()->changes.size()) + " inputs changed", at) != std::string::npos);
        // Undo takes the run away with the scenario.
        doc_->undoStack()->undo();
        QVERIFY(doc_->project().runs.empty());
    }

    void undoRemovesTheScenarioAndRedoBringsItBack()
    {
        const tl::Project before = doc_->project();
        ReconcileDialog dialog(doc_.get());
        QVERIFY(dialog.run());
        QTRY_VERIFY_WITH_TIMEOUT(dialog.showingReport(), kSolveTimeoutMs);
        QVERIFY(dialog.createScenario());
        const tl::Project after = doc_->project();
        QVERIFY(!(after == before));

        doc_->undoStack()->undo();
        QVERIFY(doc_->project() == before);
        QCOMPARE(doc_->currentIndex(), 0);
        doc_->undoStack()->redo();
        QVERIFY(doc_->project() == after);
        QCOMPARE(QString::fromStdString(doc_->scenario().name), QStringLiteral("baseline reconciled"));
    }

    void cancelLeavesTheProjectUntouched()
    {
        tl::Project big = doc_->project();
        big.scenarios.front().model = slowModel();
        doc_->setProject(big, 0, ProjectDocument::Origin::Untitled, QString(), false);
        const tl::Project before = doc_->project();
        const int undoBefore = doc_->undoStack()->count();

        ReconcileDialog dialog(doc_.get());
        QVERIFY(dialog.run());
        QVERIFY(dialog.running());
        QVERIFY2(dialog.progressLabel()->text().startsWith(QStringLiteral("Solving")),
                 qPrintable(dialog.progressLabel()->text()));
        dialog.cancelRun();
        QCOMPARE(dialog.progressLabel()->text(), QStringLiteral("Stopping…"));
        QTRY_VERIFY_WITH_TIMEOUT(!dialog.running(), kSolveTimeoutMs);
        QVERIFY(!dialog.showingReport());
        QVERIFY(!dialog.result());
        QVERIFY(dialog.messageLabel()->text().contains(QStringLiteral("nothing was changed")));
        QVERIFY(dialog.settingsTable()->isEnabled());
        QVERIFY(doc_->project() == before);
        QCOMPARE(doc_->undoStack()->count(), undoBefore);
        QVERIFY(!doc_->isModified());
    }

    void closingWhileRunningLeavesTheProjectUntouched()
    {
        const tl::Project before = doc_->project();
        {
            tl::Project big = doc_->project();
            big.scenarios.front().model = slowModel();
            doc_->setProject(big, 0, ProjectDocument::Origin::Untitled, QString(), false);
        }
        const tl::Project started = doc_->project();
        auto dialog = std::make_unique<ReconcileDialog>(doc_.get());
        QVERIFY(dialog->run());
        dialog->reject();
        dialog.reset();  // the job is told to stop; nothing of it reaches the document
        QThreadPool::globalInstance()->waitForDone();
        QCoreApplication::processEvents();
        QVERIFY(doc_->project() == started);
        QCOMPARE(doc_->undoStack()->count(), 0);
        Q_UNUSED(before);
    }

    void badCellsAreNamedAndNothingRuns()
    {
        ReconcileDialog dialog(doc_.get());
        const int pike = rowOf(dialog, QStringLiteral("Pike"));
        QVERIFY(pike >= 0);
        dialog.settingsTable()->item(pike, ReconcileDialog::EEMaxColumn)->setText(QStringLiteral("abc"));
        QVERIFY(!dialog.run());
        QVERIFY(!dialog.running());
        QVERIFY2(dialog.messageLabel()->text().contains(QStringLiteral("EE max of Pike")),
                 qPrintable(dialog.messageLabel()->text()));
        dialog.settingsTable()->item(pike, ReconcileDialog::EEMaxColumn)->setText(QStringLiteral("1"));
        dialog.settingsTable()->item(pike, ReconcileDialog::PQMinColumn)->setText(QStringLiteral("0.4"));
        dialog.settingsTable()->item(pike, ReconcileDialog::PQMaxColumn)->setText(QStringLiteral("0.2"));
        QString why;
        QVERIFY(!dialog.options(&why));
        QVERIFY2(why.contains(QStringLiteral("P/Q min of Pike")), qPrintable(why));
        for (QCheckBox* box : {dialog.moveCheck(tl::AdjustParam::Biomass), dialog.moveCheck(tl::AdjustParam::PB),
                               dialog.moveCheck(tl::AdjustParam::QB), dialog.moveCheck(tl::AdjustParam::Diet)})
            box->setChecked(false);
        dialog.settingsTable()->item(pike, ReconcileDialog::PQMinColumn)->setText(QStringLiteral("0.05"));
        dialog.settingsTable()->item(pike, ReconcileDialog::PQMaxColumn)->setText(QStringLiteral("0.5"));
        QVERIFY(!dialog.options(&why));
        QVERIFY2(why.contains(QStringLiteral("at least one kind")), qPrintable(why));
        dialog.moveCheck(tl::AdjustParam::Diet)->setChecked(true);
        dialog.dietCvEdit()->setText(QStringLiteral("0"));
        QVERIFY(!dialog.options(&why));
        QVERIFY2(why.contains(QStringLiteral("Diet share CV")), qPrintable(why));
        dialog.dietCvEdit()->setText(QStringLiteral("0.2"));
        const auto o = dialog.options(&why);
        QVERIFY2(o, qPrintable(why));
        QCOMPARE(o->dietCv, 0.2);
    }

    void pinsAndBoundsReachTheSolve()
    {
        ReconcileDialog dialog(doc_.get());
        const int chironomids = rowOf(dialog, QStringLiteral("Chironomid larvae"));
        const int cormorant = rowOf(dialog, QStringLiteral("Great cormorant"));
        dialog.settingsTable()->item(chironomids, ReconcileDialog::PinBColumn)->setCheckState(Qt::Checked);
        dialog.settingsTable()->item(chironomids, ReconcileDialog::PinPBColumn)->setCheckState(Qt::Checked);
        dialog.settingsTable()->item(cormorant, ReconcileDialog::PQMinColumn)->setText(QStringLiteral("0.002"));
        dialog.settingsTable()->item(cormorant, ReconcileDialog::PQMaxColumn)->setText(QStringLiteral("0.02"));
        QString why;
        const auto o = dialog.options(&why);
        QVERIFY2(o, qPrintable(why));
        const std::size_t c = *doc_->model().indexOf("Chironomid larvae");
        const std::size_t bird = *doc_->model().indexOf("Great cormorant");
        QCOMPARE(o->pins.size(), std::size_t(2));
        QCOMPARE(o->pqRange.at(bird).first, 0.002);
        QVERIFY(dialog.run());
        QTRY_VERIFY_WITH_TIMEOUT(dialog.showingReport(), kSolveTimeoutMs);
        QCOMPARE(dialog.result()->status, tl::ReconcileStatus::Balanced);
        for (const tl::ReconcileChange& ch : dialog.result()->changes) {
            QVERIFY(!(ch.compartment == c && (ch.param == tl::AdjustParam::Biomass || ch.param == tl::AdjustParam::PB)));
            if (ch.compartment == bird) QVERIFY(ch.param != tl::AdjustParam::PB);  // its own P/Q range holds
        }
    }

    void aModelThatCannotBalanceShowsTheConflict()
    {
        // Only catch may move: nothing reaches the over-eaten chironomid larvae, so the
        // answer is least-violating and names the EE in conflict with what to relax.
        ReconcileDialog dialog(doc_.get());
        for (auto p : {tl::AdjustParam::Biomass, tl::AdjustParam::PB, tl::AdjustParam::QB, tl::AdjustParam::Diet})
            dialog.moveCheck(p)->setChecked(false);
        dialog.moveCheck(tl::AdjustParam::Catch)->setChecked(true);
        dialog.resize(1100, 760);
        dialog.show();
        QVERIFY(dialog.run());
        QTRY_VERIFY_WITH_TIMEOUT(dialog.showingReport(), kSolveTimeoutMs);
        QCOMPARE(dialog.result()->status, tl::ReconcileStatus::LeastViolating);
        QVERIFY(dialog.conflictList()->isVisible());
        QVERIFY(dialog.conflictList()->count() >= 1);
        const QString first = dialog.conflictList()->item(0)->text();
        QVERIFY2(first.contains(QStringLiteral("Chironomid larvae")) || dialog.conflictList()->count() > 1, qPrintable(first));
        QVERIFY2(first.contains(QStringLiteral("to relax")), qPrintable(first));
        QVERIFY(dialog.summaryLabel()->text().contains(QStringLiteral("cannot balance")));
        QVERIFY(dialog.createButton()->text().contains(QStringLiteral("not balanced")));
        QVERIFY(first.contains(QStringLiteral("tick it under Inputs that may move")));
        // Nothing moved (only catch may, and no catch reaches the larvae): nothing to keep.
        QVERIFY(dialog.result()->changes.empty());
        QVERIFY(!dialog.createButton()->isEnabled());
        if (!qEnvironmentVariableIsEmpty("TL_SNAPSHOT_DIR"))
            dialog.grab().save(qEnvironmentVariable("TL_SNAPSHOT_DIR") + QStringLiteral("/reconcile-conflict.png"));
    }

    void takenNameIsRefusedAndNothingChanges()
    {
        const tl::Project before = doc_->project();
        ReconcileDialog dialog(doc_.get());
        QVERIFY(dialog.run());
        QTRY_VERIFY_WITH_TIMEOUT(dialog.showingReport(), kSolveTimeoutMs);
        dialog.nameEdit()->setText(QStringLiteral(" Baseline "));
        QVERIFY(!dialog.createScenario());
        QVERIFY(doc_->project() == before);
        QCOMPARE(doc_->undoStack()->count(), 0);
    }

    void workbenchOffersItAndSnapshotsShowIt()
    {
        QTemporaryDir dir;
        MainWindow window(tl::testing::workbenchTestOptions(dir));
        QString error;
        QVERIFY(window.openPath(kReservoir, true, &error));
        QVERIFY(window.reconcileAction());
        QVERIFY(window.reconcileAction()->isEnabled());
        const QStringList files = window.renderSnapshots(dir.path() + QStringLiteral("/shots"), &error);
        QVERIFY2(error.isEmpty(), qPrintable(error));
        QVERIFY(files.filter(QStringLiteral("reconcile-settings")).size() == 1);
        QVERIFY(files.filter(QStringLiteral("reconcile-report")).size() == 1);
        QCOMPARE(window.document()->project().scenarios.size(), std::size_t(3));  // snapshots create nothing
        QCOMPARE(window.document()->undoStack()->count(), 0);
    }

private:
    std::unique_ptr<ProjectDocument> doc_;
};

QTEST_MAIN(ReconcileDialogTest)
#include "reconcile_dialog_test.moc"
