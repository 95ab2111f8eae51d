// The Ensemble page (issue 15 point 6), offscreen: a run through the page shows the
// core's figures (percentiles, histogram, breakers, drivers) and is stored beside its
// scenario as an undoable edit; a cancel mid-run leaves the page usable; bad settings
// are refused with a message naming the setting. The sample lagoon is invented
// (sample_projects/README.md).
#include <QApplication>
#include <QCheckBox>
#include <QComboBox>
#include <QHeaderView>
#include <QLineEdit>
#include <QProgressBar>
#include <QPushButton>
#include <QSortFilterProxyModel>
#include <QSpinBox>
#include <QTableView>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>

#include "core/ensemble/ensemble.h"
#include "core/ensemble/ensemble_summary.h"
#include "core/sensitivity/strongest_drivers.h"
#include "core/store/model_source.h"
#include "tests/ui/workbench_test_support.h"
#include "ui/document/project_document.h"
#include "ui/ensemble/ensemble_charts.h"
#include "ui/ensemble/ensemble_models.h"
#include "ui/ensemble/ensemble_page.h"
#include "ui/main_window.h"
#include "ui/results/balance_sheet_model.h"
#include "ui/results/balance_sheet_page.h"
#include "ui/results/level_bars_page.h"

using namespace tl::ui;

namespace {

tl::Project lagoon()
{
    tl::ModelSource source = tl::readModelSource(std::string(TL_SAMPLES_DIR) + "/lagoon.tledger");
    return source.project ? std::move(*source.project) : tl::Project{};
}

// The lagoon with narrow CVs (as in ensemble_test), so that most draws balance.
tl::Project narrowLagoon()
{
    tl::Project p = lagoon();
    for (auto& s : p.scenarios) s.model.rules.cvByGrade = {0.05, 0.10, 0.15, 0.20};
    return p;
}

void setSettings(EnsemblePage& page, const QString& draws, const QString& seed, int threads)
{
    page.drawsEdit()->setText(draws);
    page.seedEdit()->setText(seed);
    page.threadsBox()->setValue(threads);
}

}  // namespace

class EnsemblePageTest : public QObject {
    Q_OBJECT
private slots:
    void runShowsTheCoresFiguresAndStoresTheRun();
    void cancelMidRunLeavesThePageUsable();
    void badSettingsAreNamed();
    void theWorkbenchHasThePage();
    void storedRunGivesTheResultsPagesTheirBands();
};

void EnsemblePageTest::runShowsTheCoresFiguresAndStoresTheRun()
{
    ProjectDocument doc;
    doc.setProject(narrowLagoon(), 0, ProjectDocument::Origin::ProjectFile, QString(), false);
    EnsemblePage page(&doc);
    page.resize(1200, 800);
    page.show();
    setSettings(page, QStringLiteral("3000"), QStringLiteral("7"), 2);
    page.dietCvEdit()->setText(QStringLiteral("0.1"));
    QVERIFY(page.run());
    QVERIFY(page.busy());
    QVERIFY(!page.runButton()->isEnabled());
    page.waitForIdle();
    QVERIFY(!page.busy());
    QVERIFY(page.runButton()->isEnabled());

    // The same run straight from the core: the page must show exactly it.
    tl::ensemble::EnsembleSettings s;
    s.draws = 3000;
    s.seed = 7;
    s.threads = 1;  // any thread count gives the same bits (ensemble_test)
    s.dietCv = 0.1;
    s.analyses.trophicLevels = true;
    const tl::ensemble::EnsembleRun core = tl::ensemble::runEnsemble(doc.model(), s);
    QVERIFY(core.ran());
    const auto& st = core.statistics;
    QVERIFY(st.balanced > 100);
    QVERIFY(page.liveOutcome());
    QVERIFY(page.liveOutcome()->run.statistics == st);

    QAbstractItemModel* table = page.percentileProxy()->sourceModel();
    QCOMPARE(table->rowCount(), int(st.outputNames.size()));
    for (int r = 0; r < table->rowCount(); ++r) {
        const auto p = st.outputs[std::size_t(r)].summary();
        QCOMPARE(table->index(r, 0).data(PercentileTableModel::kOutputNameRole).toString().toStdString(), st.outputNames[std::size_t(r)]);
        if (!p.p50) continue;
        QCOMPARE(table->index(r, PercentileTableModel::kP2_5).data(Qt::UserRole).toDouble(), *p.p2_5);
        QCOMPARE(table->index(r, PercentileTableModel::kP50).data(Qt::UserRole).toDouble(), *p.p50);
        QCOMPARE(table->index(r, PercentileTableModel::kP97_5).data(Qt::UserRole).toDouble(), *p.p97_5);
        QCOMPARE(table->index(r, PercentileTableModel::kP50).data().toString(), formatFigure(*p.p50));
        QCOMPARE(table->index(r, PercentileTableModel::kDraws).data().toString(), QString::number(st.outputs[std::size_t(r)].count()));
    }
    QVERIFY2(page.summaryText().contains(QStringLiteral("Balanced in %1 of 3000 draws").arg(st.balanced)), qPrintable(page.summaryText()));
    QVERIFY(page.noticeText().contains(QStringLiteral("does not replace")));

    // Sorting by the median, largest first, through the header.
    page.percentileView()->sortByColumn(PercentileTableModel::kP50, Qt::DescendingOrder);
    double largest = -HUGE_VAL;
    for (const auto& o : st.outputs)
        if (o.summary().p50) largest = std::max(largest, *o.summary().p50);
    QCOMPARE(page.percentileProxy()->index(0, PercentileTableModel::kP50).data(Qt::UserRole).toDouble(), largest);

    // The histogram of the chosen output (first pick: the first EE), then of another.
    for (const QString& name : {page.chosenOutput(), QStringLiteral("sea bass.tl")}) {
        page.chooseOutput(name);
        std::size_t k = 0;
        while (k < st.outputNames.size() && st.outputNames[k] != name.toStdString()) ++k;
        QVERIFY2(k < st.outputNames.size(), qPrintable(name));
        QCOMPARE(page.chosenOutput(), name);
        const auto expected = tl::ensemble::histogramBars(st.outputs[k], OutputHistogram::kBars);
        QCOMPARE(page.histogram()->bars().counts, expected.counts);
        QCOMPARE(page.histogram()->bars().low, expected.low);
        const auto drivers = tl::strongestDrivers(doc.model(), name.toStdString(), DriversTornado::kMaxRows);
        // As many of the strongest as the chart's height keeps readable (at least 3).
        QVERIFY(page.tornado()->drawn().size() <= drivers.drivers.size());
        QVERIFY(page.tornado()->drawn().size() >= std::min<std::size_t>(3, drivers.drivers.size()));
        for (std::size_t d = 0; d < page.tornado()->drawn().size(); ++d) {
            QCOMPARE(page.tornado()->drawn()[d].input, drivers.drivers[d].input);
            QCOMPARE(page.tornado()->drawn()[d].elasticity, drivers.drivers[d].elasticity);
        }
    }
    QVERIFY(page.chosenOutput().endsWith(QStringLiteral(".ee")) || page.chosenOutput().endsWith(QStringLiteral(".tl")));

    // A given value has no drivers: said, not drawn.
    bool givenSeen = false;
    for (std::size_t k = 0; k < st.outputNames.size(); ++k) {
        const std::string& name = st.outputNames[k];
        if (!tl::strongestDrivers(doc.model(), name, 5).error.empty() && st.outputs[k].count()) {
            page.chooseOutput(QString::fromStdString(name));
            QVERIFY(page.tornado()->drawn().empty());
            QVERIFY2(page.tornado()->title().contains(QStringLiteral("given")), qPrintable(page.tornado()->title()));
            givenSeen = true;
            break;
        }
    }
    QVERIFY(givenSeen);

    // Breakers: one row per compartment that broke a draw, most frequent first.
    std::size_t breakers = 0;
    for (const auto& b : st.breaks) breakers += b.any > 0;
    QCOMPARE(page.breakersView()->model()->rowCount(), int(breakers));

    // Stored beside its scenario as one undoable edit.
    const auto& runs = doc.project().runs;
    QCOMPARE(runs.size(), std::size_t(1));
    QCOMPARE(runs.back().kind, std::string("ensemble"));
    QCOMPARE(runs.back().scenario, doc.scenario().name);
    QCOMPARE(page.storedRunCount(), 1);
    QVERIFY(doc.isModified());
    QVERIFY(page.showStoredRun(0));
    QCOMPARE(page.percentileProxy()->sourceModel()->rowCount(), int(st.outputNames.size()));
    QVERIFY(page.histogram()->bars().counts.empty());  // a stored run keeps no histogram
    doc.undoStack()->undo();
    QVERIFY(doc.project().runs.empty());
    QCOMPARE(page.storedRunCount(), 0);
}

void EnsemblePageTest::cancelMidRunLeavesThePageUsable()
{
    ProjectDocument doc;
    doc.setProject(lagoon(), 0, ProjectDocument::Origin::ProjectFile, QString(), false);
    EnsemblePage page(&doc);
    page.show();
    // Far more draws than a test waits for: only a cancel ends it.
    setSettings(page, QStringLiteral("400000000"), QStringLiteral("3"), 2);
    page.levelsBox()->setChecked(true);
    QVERIFY(page.run());
    // The window keeps handling events: the progress timer moves the bar.
    QTRY_VERIFY_WITH_TIMEOUT(page.progressBar()->format().contains(QStringLiteral(" of ")) &&
                                 !page.progressBar()->format().startsWith(QStringLiteral("0 of")),
                             30000);
    QVERIFY(page.busy());
    QVERIFY(page.cancelButton()->isEnabled());
    QTest::mouseClick(page.cancelButton(), Qt::LeftButton);
    QTRY_VERIFY_WITH_TIMEOUT(!page.busy(), 30000);
    QVERIFY2(page.statusText().startsWith(QStringLiteral("Cancelled after")), qPrintable(page.statusText()));
    QVERIFY(page.liveOutcome() && page.liveOutcome()->run.statistics.cancelled);
    QVERIFY(page.liveOutcome()->run.statistics.drawsRun < 400000000u);
    QVERIFY(doc.project().runs.empty());  // a cancelled run is not stored
    QVERIFY(page.runButton()->isEnabled());
    QVERIFY(page.drawsEdit()->isEnabled());

    // And the page runs again.
    setSettings(page, QStringLiteral("500"), QStringLiteral("3"), 1);
    page.levelsBox()->setChecked(false);
    QVERIFY(page.run());
    page.waitForIdle();
    QVERIFY(!page.liveOutcome()->run.statistics.cancelled);
    QCOMPARE(page.liveOutcome()->run.statistics.drawsRun, quint64(500));
    QCOMPARE(doc.project().runs.size(), std::size_t(1));
}

void EnsemblePageTest::badSettingsAreNamed()
{
    ProjectDocument doc;
    doc.setProject(lagoon(), 0, ProjectDocument::Origin::ProjectFile, QString(), false);
    EnsemblePage page(&doc);
    struct Case { QString draws, seed, dietCv, expected; };
    const Case cases[] = {
        {QStringLiteral("0"), QStringLiteral("1"), QString(), QStringLiteral("Draws: '0' is not a whole number from 1")},
        {QStringLiteral("12.5"), QStringLiteral("1"), QString(), QStringLiteral("Draws: '12.5'")},
        {QStringLiteral("ten"), QStringLiteral("1"), QString(), QStringLiteral("Draws: 'ten'")},
        {QString(), QStringLiteral("1"), QString(), QStringLiteral("Draws: ''")},
        {QStringLiteral("100"), QStringLiteral("-4"), QString(), QStringLiteral("Seed: '-4' is not a whole number")},
        {QStringLiteral("100"), QStringLiteral("1"), QStringLiteral("abc"), QStringLiteral("Diet CV: 'abc' is not a CV")},
        {QStringLiteral("100"), QStringLiteral("1"), QStringLiteral("-0.2"), QStringLiteral("Diet CV: '-0.2'")},
    };
    for (const Case& c : cases) {
        page.drawsEdit()->setText(c.draws);
        page.seedEdit()->setText(c.seed);
        page.dietCvEdit()->setText(c.dietCv);
        QVERIFY(!page.run());
        QVERIFY(!page.busy());
        QVERIFY2(page.statusText().startsWith(c.expected), qPrintable(page.statusText() + QStringLiteral(" / expected ") + c.expected));
    }
    QVERIFY(doc.project().runs.empty());
    QVERIFY(!page.liveOutcome());
}

void EnsemblePageTest::theWorkbenchHasThePage()
{
    QTemporaryDir dir;
    MainWindow window(tl::testing::workbenchTestOptions(dir));
    auto* page = tl::testing::workbenchPage<EnsemblePage>(window, QStringLiteral("ensemble"));
    QVERIFY(page);
    QCOMPARE(page, window.ensemblePage());
    window.showPage(QStringLiteral("ensemble"));
    QCOMPARE(window.currentPage(), static_cast<QWidget*>(page));
}

// Issue 15: "Level bars and the balance sheet show uncertainty bands when a run exists."
void EnsemblePageTest::storedRunGivesTheResultsPagesTheirBands()
{
    QTemporaryDir dir;
    MainWindow window(tl::testing::workbenchTestOptions(dir));
    window.document()->setProject(narrowLagoon(), 0, ProjectDocument::Origin::ProjectFile, QString(), false);
    auto* sheetPage = tl::testing::workbenchPage<BalanceSheetPage>(window, QStringLiteral("balance-sheet"));
    auto* levelPage = tl::testing::workbenchPage<LevelBarsPage>(window, QStringLiteral("level-bars"));
    QVERIFY(sheetPage && levelPage);
    BalanceSheetModel* sheet = sheetPage->sheetModel();
    QVERIFY(!sheet->hasEnsemble());
    QCOMPARE(sheet->columnCount(), BalanceSheetModel::column(BalanceSheetModel::Column::Count));
    QVERIFY(levelPage->teBandText(2).isEmpty());

    EnsemblePage* page = window.ensemblePage();
    setSettings(*page, QStringLiteral("2000"), QStringLiteral("5"), 2);
    page->levelsBox()->setChecked(true);
    QVERIFY(page->run());
    page->waitForIdle();
    const auto& st = page->liveOutcome()->run.statistics;
    QVERIFY(st.balanced > 100);
    auto output = [&](const std::string& name) -> std::optional<tl::ensemble::PercentileSummary> {
        for (std::size_t k = 0; k < st.outputNames.size(); ++k)
            if (st.outputNames[k] == name) return st.outputs[k].summary();
        return std::nullopt;
    };

    // Balance sheet: an EE interval column, shown right after EE, with the run's 2.5 and 97.5 %.
    // (A results page off screen catches up with the solve when shown.)
    window.runner()->waitForIdle();
    window.showPage(QStringLiteral("balance-sheet"));
    QTRY_VERIFY(sheet->rowCount() > 0);
    QVERIFY(sheet->hasEnsemble());
    QCOMPARE(sheet->columnCount(), BalanceSheetModel::kEeIntervalColumn + 1);
    const QHeaderView* header = sheetPage->table()->horizontalHeader();
    QCOMPARE(header->visualIndex(BalanceSheetModel::kEeIntervalColumn),
             header->visualIndex(BalanceSheetModel::column(BalanceSheetModel::Column::Ee)) + 1);
    int checked = 0;
    for (int r = 0; r < sheet->rowCount(); ++r) {
        const std::string name = window.document()->model().compartment(std::size_t(r)).name;
        const QString text = sheet->index(r, BalanceSheetModel::kEeIntervalColumn).data().toString();
        const auto p = output(name + ".ee");
        if (!p || !p->p2_5) {
            QVERIFY2(text.isEmpty(), qPrintable(text));
            continue;
        }
        const QStringList ends = text.split(QStringLiteral(" – "));
        QCOMPARE(ends.size(), 2);
        QVERIFY2(std::abs(ends[0].toDouble() - *p->p2_5) <= 1e-3 * std::abs(*p->p2_5) + 1e-12, qPrintable(text));
        QVERIFY2(std::abs(ends[1].toDouble() - *p->p97_5) <= 1e-3 * std::abs(*p->p97_5) + 1e-12, qPrintable(text));
        QVERIFY(sheet->index(r, BalanceSheetModel::column(BalanceSheetModel::Column::Ee)).data(Qt::ToolTipRole).toString().contains(
            QStringLiteral("middle 95 %")));
        ++checked;
    }
    QVERIFY2(checked > 20, qPrintable(QString::number(checked)));

    // Level bars: TE of level II with the run's 95 %, only in the view the ensemble computes.
    const auto te = output("system.te_II");
    QVERIFY(te && te->p2_5 && te->p97_5);
    const QString band = levelPage->teBandText(2);
    QVERIFY2(band.contains(QString::number(100.0 * *te->p2_5, 'f', 1)) && band.contains(QString::number(100.0 * *te->p97_5, 'f', 1)),
             qPrintable(band));
    QVERIFY(!levelPage->teBandText(0).isEmpty());  // the mean TE
    levelPage->setChains(LevelChains::FromDetritus);
    QVERIFY(levelPage->teBandText(2).isEmpty());
    levelPage->setChains(LevelChains::Combined);

    // Undo the stored run: the bands go with it.
    window.document()->undoStack()->undo();
    QVERIFY(window.document()->project().runs.empty());
    QVERIFY(!sheet->hasEnsemble());
    QVERIFY(levelPage->teBandText(2).isEmpty());
}

QTEST_MAIN(EnsemblePageTest)
#include "ensemble_page_test.moc"
