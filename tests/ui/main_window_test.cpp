// The workbench window (ui/main_window.*): opens a project, solves live, lists checks
// that lead to their cell, runs scenario operations through undo, and renders every
// page to a non-blank image (the --snapshot path).
#include <QApplication>
#include <QClipboard>
#include <QDir>
#include <QFile>
#include <QSignalSpy>
#include <QFileInfo>
#include <QImage>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>
#include <QTreeWidget>
#include <cmath>
#include <memory>

#include "core/model/problem_codes.h"

#include "ui/document/project_document.h"
#include "ui/main_window.h"
#include "workbench_test_support.h"
#include "ui/results/balance_sheet_page.h"
#include "ui/tables/ledger_table_view.h"
#include "ui/widgets/checks_panel.h"
#include "ui/widgets/editing_pages.h"
#include "ui/widgets/scenario_shelf.h"

namespace {

// The reservoir sample when it exists (sample_projects/), else the invented tiny lake
// fixture, so the window is always tested on a model that solves.
QString sampleProject()
{
    const QString samples = QStringLiteral(TL_SAMPLES_DIR);
    if (QFileInfo::exists(samples + QStringLiteral("/reservoir.tledger"))) return samples + QStringLiteral("/reservoir.tledger");
    if (QFileInfo::exists(samples + QStringLiteral("/reservoir/compartments.csv"))) return samples + QStringLiteral("/reservoir");
    return QStringLiteral(TL_FIXTURES_DIR "/ui/tiny_lake");
}

// Standard deviation of the grey level: a blank (one-colour) image has none.
double greyStdDev(const QImage& image)
{
    const QImage g = image.convertToFormat(QImage::Format_Grayscale8);
    double sum = 0, sum2 = 0;
    const double n = double(g.width()) * g.height();
    for (int y = 0; y < g.height(); ++y) {
        const uchar* row = g.constScanLine(y);
        for (int x = 0; x < g.width(); ++x) sum += row[x], sum2 += double(row[x]) * row[x];
    }
    const double mean = sum / n;
    return std::sqrt(std::max(0.0, sum2 / n - mean * mean));
}

}  // namespace

class MainWindowTest : public QObject {
    Q_OBJECT
private slots:
    void opensTheSampleAndSolvesIt()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QString error;
        QVERIFY2(w.openPath(QStringLiteral(TL_FIXTURES_DIR "/ui/tiny_lake"), true, &error), qPrintable(error));
        w.runner()->waitForIdle();
        QCOMPARE(w.document()->origin(), tl::ui::ProjectDocument::Origin::Template);
        QVERIFY(w.windowTitle().contains(QStringLiteral("[*]")));
        QVERIFY(!w.isWindowModified());
        // The fixture has one unknown per living compartment: the solver completes it.
        const auto& sheet = w.lastOutcome().sheet;
        QCOMPARE(sheet.rows.size(), std::size_t(5));
        QVERIFY2(sheet.status != tl::BalanceStatus::Invalid, "the tiny lake fixture should solve");
        QVERIFY(std::isfinite(sheet.rows[2].biomass));  // Roach B solved
        // An edit marks the window modified and re-solves.
        auto* table = w.compartmentsPage()->compartments();
        QVERIFY(table->setData(table->index(3, tl::ui::CompartmentTableModel::columnOf(tl::Param::Biomass)), QStringLiteral("0.9")));
        w.runner()->waitForIdle();
        QVERIFY(w.isWindowModified());
        QCOMPARE(w.lastOutcome().sheet.rows[3].biomass, 0.9);
    }

    // Only the page on screen follows each edit at once (the time from an edit to its
    // redraw); a results page off screen must catch up the moment it is shown.
    void resultsPageOffScreenCatchesUpWhenShown()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(QStringLiteral(TL_FIXTURES_DIR "/ui/tiny_lake"), true));
        w.show();
        w.showPage(QStringLiteral("balance-sheet"));
        w.runner()->waitForIdle();
        tl::ui::BalanceSheetPage* page = nullptr;
        for (auto* p : w.findChildren<tl::ui::BalanceSheetPage*>()) page = p;
        QVERIFY(page);
        QCOMPARE(page->sheetModel()->sheet().rows[3].biomass, w.lastOutcome().sheet.rows[3].biomass);

        w.showPage(QStringLiteral("compartments"));
        auto* table = w.compartmentsPage()->compartments();
        QVERIFY(table->setData(table->index(3, tl::ui::CompartmentTableModel::columnOf(tl::Param::Biomass)), QStringLiteral("0.9")));
        w.runner()->waitForIdle();
        QCOMPARE(w.lastOutcome().sheet.rows[3].biomass, 0.9);
        QVERIFY(page->sheetModel()->sheet().rows[3].biomass != 0.9);  // off screen: not redrawn yet

        w.showPage(QStringLiteral("balance-sheet"));
        QCOMPARE(page->sheetModel()->sheet().rows[3].biomass, 0.9);
    }

    void clickingACheckSelectsTheOffendingCell()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(QStringLiteral(TL_FIXTURES_DIR "/ui/tiny_lake"), true));
        // Break Pike's diet: the row no longer sums to 1.
        auto* diet = w.dietPage()->diet();
        const int pikeRow = diet->rowOfPredator(3);
        QVERIFY(diet->setData(diet->index(pikeRow, 2), QStringLiteral("0.5")));  // Roach share 0.5
        w.runner()->waitForIdle();
        int line = -1;
        for (int i = 0; i < w.checks()->count(); ++i) {
            const auto& p = w.checks()->problems()[std::size_t(i)];
            if (p.compartment == "Pike" && p.parameter == "diet") line = i;
        }
        QVERIFY2(line >= 0, "a diet-sum check for Pike should be listed");
        w.showPage(QStringLiteral("compartments"));
        w.checks()->activate(line);
        const QModelIndex cur = w.dietPage()->view()->currentIndex();
        QCOMPARE(cur.row(), pikeRow);
        QVERIFY(w.dietPage()->isVisibleTo(&w) || true);
        QCOMPARE(w.pageKey(0), QStringLiteral("compartments"));
    }

    // Each check's tooltip carries its code and the registry's sentence
    // (core/model/problem_codes.h); Help lists every registered code.
    void checksExplainTheirCodes()
    {
        tl::ui::ChecksPanel panel;
        tl::Problem p;
        p.code = tl::code::kDietSum;
        p.compartment = "Pike";
        p.parameter = "diet";
        p.message = "the diet of Pike sums to 0.9";
        panel.setProblems({p});
        auto* tree = panel.findChild<QTreeWidget*>();
        QVERIFY(tree);
        const QString tip = tree->topLevelItem(0)->toolTip(2);
        QVERIFY2(tip.contains(QStringLiteral("[diet-sum]")), qPrintable(tip));
        QVERIFY2(tip.contains(tl::ui::codeExplanation(p.code)) && !tl::ui::codeExplanation(p.code).isEmpty(), qPrintable(tip));

        std::unique_ptr<QWidget> help(tl::ui::problemCodesTable());
        auto* table = qobject_cast<QTreeWidget*>(help.get());
        QVERIFY(table);
        QCOMPARE(table->topLevelItemCount(), int(tl::problemCodes().size()));
    }

    // Save, edit, save again into the same file: the second save replaces the project
    // in place (core/store/project_save.h), and reopening gives the edit back.
    void savingTwiceIntoTheSameFileKeepsTheLatest()
    {
        QTemporaryDir dir;
        tl::ui::ProjectDocument doc;
        QString error;
        QVERIFY2(doc.open(QStringLiteral(TL_FIXTURES_DIR "/ui/tiny_lake"), &error), qPrintable(error));
        const QString path = dir.path() + QStringLiteral("/lake.tledger");
        QVERIFY2(doc.saveAs(path, &error), qPrintable(error));
        tl::Model edited = doc.model();
        edited.compartment(0).value(tl::Param::Biomass) = 42.5;
        doc.editModel(edited, QStringLiteral("Set B"));
        QVERIFY(doc.isModified());
        QVERIFY2(doc.save(&error), qPrintable(error));
        QVERIFY(!doc.isModified());
        QCOMPARE(QDir(dir.path()).entryList(QDir::Files).size(), 1);  // nothing left beside it

        tl::ui::ProjectDocument again;
        QVERIFY2(again.open(path, &error), qPrintable(error));
        QCOMPARE(again.model().compartment(0).value(tl::Param::Biomass).value_or(0.0), 42.5);
        QCOMPARE(again.origin(), tl::ui::ProjectDocument::Origin::ProjectFile);

        // A file that is not a project is never written over.
        const QString notes = dir.path() + QStringLiteral("/notes.tledger");
        {
            QFile f(notes);
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write("field notes\n");
        }
        QVERIFY(!again.saveAs(notes, &error));
        QVERIFY2(error.contains(notes), qPrintable(error));
        QFile f(notes);
        QVERIFY(f.open(QIODevice::ReadOnly));
        QCOMPARE(f.readAll(), QByteArray("field notes\n"));
    }

    void scenarioOperationsAreUndoable()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(QStringLiteral(TL_FIXTURES_DIR "/ui/tiny_lake"), true));
        auto* doc = w.document();
        const std::string base = doc->scenario().name;
        QVERIFY(w.shelf()->duplicateScenario(0, QStringLiteral("More nets")));
        QCOMPARE(doc->project().scenarios.size(), std::size_t(2));
        QCOMPARE(doc->scenario().parent, base);
        QVERIFY(doc->model() == doc->project().scenarios[0].model);
        QString why;
        QVERIFY(!w.shelf()->renameScenario(1, QString::fromStdString(base), &why));
        QVERIFY(why.contains(QStringLiteral("already exists")));
        QVERIFY(w.shelf()->renameScenario(0, QStringLiteral("Reference")));
        QCOMPARE(doc->project().scenarios[1].parent, std::string("Reference"));  // child follows
        QVERIFY(w.shelf()->deleteScenario(1));
        QCOMPARE(doc->project().scenarios.size(), std::size_t(1));
        QVERIFY(!w.shelf()->deleteScenario(0, &why));  // the last one stays
        doc->undoStack()->undo();
        QCOMPARE(doc->project().scenarios.size(), std::size_t(2));
        QCOMPARE(doc->undoStack()->undoText(), QStringLiteral("Rename scenario %1 to Reference").arg(QString::fromStdString(base)));
    }

    void slowSolvesRunInTheBackgroundAndOnlyTheNewestResultArrives()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(QStringLiteral(TL_FIXTURES_DIR "/ui/tiny_lake"), true));
        w.runner()->waitForIdle();
        w.runner()->setInlineLimitMs(-1.0);  // treat every solve as slow
        QSignalSpy started(w.runner(), &tl::ui::BalanceRunner::started);
        int solved = 0;
        connect(w.runner(), &tl::ui::BalanceRunner::solved, this, [&solved] { ++solved; });
        auto* table = w.compartmentsPage()->compartments();
        const int b = tl::ui::CompartmentTableModel::columnOf(tl::Param::Biomass);
        QVERIFY(table->setData(table->index(3, b), QStringLiteral("0.7")));
        QVERIFY(table->setData(table->index(3, b), QStringLiteral("0.75")));  // while the first may still run
        QCOMPARE(started.count() >= 1, true);
        w.runner()->waitForIdle();
        QCOMPARE(solved, 1);  // the first, stale result was dropped
        QCOMPARE(w.lastOutcome().sheet.rows[3].biomass, 0.75);  // the newest inputs, not a stale result
        QVERIFY(w.lastOutcome().inBackground);
    }

    void keyboardPasteDeleteAndFillDownInATable()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(QStringLiteral(TL_FIXTURES_DIR "/ui/tiny_lake"), true));
        w.show();
        QVERIFY(QTest::qWaitForWindowExposed(&w));
        tl::ui::LedgerTableView* view = w.compartmentsPage()->view();
        const int bcol = tl::ui::CompartmentTableModel::columnOf(tl::Param::Biomass);
        view->goToCell(1, bcol);
        QApplication::clipboard()->setText(QStringLiteral("13\n4\n"));
        QTest::keySequence(view, QKeySequence::Paste);
        const tl::Model& m = w.document()->model();
        QCOMPARE(*m.compartment(1).value(tl::Param::Biomass), 13.0);
        QCOMPARE(*m.compartment(2).value(tl::Param::Biomass), 4.0);
        view->goToCell(2, bcol);
        QTest::keyClick(view, Qt::Key_Delete);
        QVERIFY(!w.document()->model().compartment(2).value(tl::Param::Biomass).has_value());
        view->goToCell(2, bcol);
        QTest::keyClick(view, Qt::Key_D, Qt::ControlModifier);  // takes the value above
        QCOMPARE(*w.document()->model().compartment(2).value(tl::Param::Biomass), 13.0);
        QCOMPARE(w.document()->undoStack()->count(), 3);
    }

    void snapshotOfTheSampleGivesNonBlankImagesForEveryPage()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QString error;
        QVERIFY2(w.openPath(sampleProject(), true, &error), qPrintable(error));
        const QStringList files = w.renderSnapshots(dir.path() + QStringLiteral("/shots"), &error);
        QVERIFY2(error.isEmpty(), qPrintable(error));
        // Every page, the Ensemble page after a run (percentiles, distribution; issue 15),
        // then the Reconcile dialog's settings and report (issue 14).
        QCOMPARE(files.size(), w.pageCount() + 4);
        QVERIFY(files.contains(QStringLiteral("%1/shots/%2-ensemble-distribution.png").arg(dir.path()).arg(w.pageCount() + 2)));
        QVERIFY(files.last().endsWith(QStringLiteral("reconcile-report.png")));
        QVERIFY(w.pageCount() >= 4);
        for (const QString& f : files) {
            QImage image(f);
            QVERIFY2(!image.isNull(), qPrintable(f));
            QVERIFY(image.width() > 800 && image.height() > 500);
            const double sd = greyStdDev(image);
            QVERIFY2(sd > 10.0, qPrintable(QStringLiteral("%1 looks blank (grey s.d. %2)").arg(f).arg(sd)));
        }
        // Each page draws something different from the others.
        for (int i = 1; i < files.size(); ++i) QVERIFY(QImage(files[i]) != QImage(files[i - 1]));
    }
};

QTEST_MAIN(MainWindowTest)
#include "main_window_test.moc"
