// The workbench's menus beyond editing (issue 13): File > Export figure and Report
// (item 10), Help > User guide with problem codes, equations and shortcuts (item 11),
// Project > Project settings for units, check rules and discard pools (item 8), copies
// labelled as copies (item 6), and flow-map positions saved and undoable (item 9).
#include <QAction>
#include <QApplication>
#include <QDateTime>
#include <QLabel>
#include <QListWidget>
#include <QComboBox>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QLineEdit>
#include <QMenuBar>
#include <QScrollArea>
#include <QScrollBar>
#include <QTemporaryDir>
#include <QTest>
#include <array>
#include <QTextBrowser>
#include <QToolBar>
#include <QUndoStack>

#include "core/io/balance_report.h"
#include "core/model/problem_codes.h"
#include "ui/document/project_document.h"
#include "ui/main_window.h"
#include "tests/ui/workbench_test_support.h"
#include "ui/results/flow_map_page.h"
#include "ui/tables/diet_table_model.h"
#include "ui/tables/ledger_table_view.h"
#include "ui/widgets/confidence_panel.h"
#include "ui/widgets/editing_pages.h"
#include "ui/widgets/help_window.h"
#include "ui/widgets/project_settings_dialog.h"
#include "ui/widgets/scenario_shelf.h"

using namespace tl::ui;

namespace {

const QString kReservoir = QStringLiteral(TL_SAMPLES_DIR "/reservoir.tledger");

MainWindowOptions testOptions(const QTemporaryDir& dir) { return tl::testing::workbenchTestOptions(dir); }

// Every action reachable from the menu bar, submenus followed.
QList<QAction*> allActions(const QList<QAction*>& top)
{
    QList<QAction*> out;
    for (QAction* a : top) {
        out << a;
        if (a->menu()) out << allActions(a->menu()->actions());
    }
    return out;
}

// With TL_SNAPSHOT_DIR set, keeps a picture of `widget` there for a look.
void keepSnapshot(QWidget& widget, const QString& name)
{
    if (qEnvironmentVariableIsEmpty("TL_SNAPSHOT_DIR")) return;
    QDir().mkpath(qEnvironmentVariable("TL_SNAPSHOT_DIR"));
    widget.grab().save(qEnvironmentVariable("TL_SNAPSHOT_DIR") + "/" + name + ".png");
}

QAction* menuAction(MainWindow& w, const QString& menu, const QString& text)
{
    for (QAction* m : w.menuBar()->actions()) {
        if (QString(m->text()).remove('&') != menu || !m->menu()) continue;
        for (QAction* a : m->menu()->actions())
            if (QString(a->text()).remove('&').remove(QStringLiteral("…")) == text) return a;
    }
    return nullptr;
}

}  // namespace

class WorkbenchMenusTest : public QObject {
    Q_OBJECT
private slots:
    void fileMenuAndToolbarExportTheFigureOfTheResultsPage();
    void reportActionWritesTheProjectReport();
    void userGuideShipsWithTheProgram();
    void projectSettingsAreUndoableAndSaved();
    void projectSettingsRefuseBadValuesNamingTheField();
    void duplicatesAreLabelledAsCopies();
    void dietRowConfidenceIsEditedFromTheDietPage();
    void flowMapDragsAreUndoableAndSaved();
};

void WorkbenchMenusTest::fileMenuAndToolbarExportTheFigureOfTheResultsPage()
{
    QTemporaryDir dir;
    MainWindow w(testOptions(dir));
    QString error;
    QVERIFY2(w.openPath(kReservoir, true, &error), qPrintable(error));
    w.runner()->waitForIdle();
    QAction* exportFigure = menuAction(w, "File", "Export figure");
    QAction* report = menuAction(w, "File", "Report");
    QVERIFY(exportFigure && exportFigure == w.exportFigureAction());
    QVERIFY(report && report == w.reportAction());
    auto* bar = w.findChild<QToolBar*>(QStringLiteral("mainToolBar"));
    QVERIFY(bar);
    QVERIFY(bar->actions().contains(exportFigure) && bar->actions().contains(report));
    // Enabled exactly on pages with a figure.
    w.showPage(QStringLiteral("compartments"));
    QVERIFY(!exportFigure->isEnabled());
    QVERIFY(report->isEnabled());
    for (const char* key : {"level-bars", "flow-map", "impact-matrix", "indicators"}) {
        w.showPage(QString::fromLatin1(key));
        QVERIFY2(exportFigure->isEnabled(), key);
    }
    w.showPage(QStringLiteral("balance-sheet"));
    QVERIFY(!exportFigure->isEnabled());
    // The figures carry the scenario and the project; a scenario switch follows.
    auto* flow = tl::testing::workbenchPage<FlowMapPage>(w, QStringLiteral("flow-map"));
    QVERIFY(flow);
    const QString first = QString::fromStdString(w.document()->scenario().name);
    QVERIFY2(flow->figureTitle().contains(first) && flow->figureTitle().contains("reservoir.tledger"),
             qPrintable(flow->figureTitle()));
    QVERIFY(w.document()->project().scenarios.size() > 1);
    w.document()->setCurrentIndex(1);
    const QString second = QString::fromStdString(w.document()->scenario().name);
    QVERIFY2(flow->figureTitle().contains(second), qPrintable(flow->figureTitle()));
}

void WorkbenchMenusTest::reportActionWritesTheProjectReport()
{
    QTemporaryDir dir;
    MainWindow w(testOptions(dir));
    QString error;
    QVERIFY2(w.openPath(kReservoir, true, &error), qPrintable(error));
    const QString path = dir.filePath("report.html");
    QVERIFY2(w.writeReport(path, &error), qPrintable(error));
    QFile file(path);
    QVERIFY(file.open(QIODevice::ReadOnly));
    const QString html = QString::fromUtf8(file.readAll());
    for (const auto& s : w.document()->project().scenarios)
        QVERIFY2(html.contains(QString::fromStdString(s.name).toHtmlEscaped()), s.name.c_str());
    QVERIFY(html.contains(QString::fromUtf8(tl::kDecisionSupportNotice).toHtmlEscaped()));
    // A duplicate is reported as a copy, not as something that follows its parent.
    QVERIFY(!html.contains("Derived from"));
    // A path that cannot be written is an error naming it, and nothing is left behind.
    const QString bad = dir.filePath("no/such/folder/report.html");
    QVERIFY(!w.writeReport(bad, &error));
    QVERIFY2(error.contains("report.html"), qPrintable(error));
}

void WorkbenchMenusTest::userGuideShipsWithTheProgram()
{
    QTemporaryDir dir;
    MainWindow w(testOptions(dir));
    QAction* guide = menuAction(w, "Help", "User guide");
    QVERIFY(guide && guide == w.userGuideAction());
    QCOMPARE(guide->shortcut(), QKeySequence(QKeySequence::HelpContents));
    QVERIFY(menuAction(w, "Help", "Keyboard shortcuts"));
    const QString html = userGuideHtml(w.menuBar()->actions());
    // Every problem code of the registry, with its explanation.
    for (const tl::ProblemCodeInfo& info : tl::problemCodes()) {
        QVERIFY2(html.contains(QString::fromUtf8(info.code.data(), qsizetype(info.code.size()))), info.code.data());
        const QString why = QString::fromUtf8(info.explanation.data(), qsizetype(info.explanation.size())).toHtmlEscaped();
        QVERIFY2(html.contains(why), info.code.data());
    }
    // Every page by its title, and the equations with their published sources.
    for (int i = 0; i < w.pageCount(); ++i) QVERIFY2(html.contains("<b>" + w.pageTitle(i) + "</b>"), qPrintable(w.pageTitle(i)));
    for (const char* source : {"Polovina 1984", "Christensen &amp; Pauly 1992", "Ulanowicz 1995", "Lindeman 1942",
                               "Libralato et al. 2006", "Ulanowicz &amp; Puccia 1990", "Finn 1976", "Pauly et al. 1993"})
        QVERIFY2(html.contains(source), source);
    QVERIFY(html.contains("EE_i = &Sigma;_j B_j (Q/B)_j DC_ij"));
    QVERIFY(html.contains(QString::fromUtf8(tl::kDecisionSupportNotice).left(40)));
    // Every shortcut of the menus, as the menus have it (so the table cannot drift).
    int shortcuts = 0;
    for (QAction* a : allActions(w.menuBar()->actions())) {
        if (a->shortcut().isEmpty() || a->menu()) continue;
        ++shortcuts;
        QVERIFY2(html.contains(a->shortcut().toString(QKeySequence::NativeText).toHtmlEscaped()), qPrintable(a->text()));
    }
    QVERIFY(shortcuts >= 10);
    QVERIFY(!html.contains("<!--"));  // every placeholder filled
    // The window opens non-modal and shows the guide.
    guide->trigger();
    auto* window = w.findChild<HelpWindow*>();
    QVERIFY(window && window->isVisible() && !window->isModal());
    QVERIFY(window->browser()->toPlainText().contains("Building a model"));
    keepSnapshot(*window, "user-guide");
    window->showSection("keys");
    keepSnapshot(*window, "user-guide-keys");
    guide->trigger();
    QCOMPARE(w.findChildren<HelpWindow*>().size(), qsizetype(1));  // raised again, not a second one
}

void WorkbenchMenusTest::projectSettingsAreUndoableAndSaved()
{
    QTemporaryDir dir;
    MainWindow w(testOptions(dir));
    QString error;
    QVERIFY2(w.openPath(kReservoir, true, &error), qPrintable(error));
    ProjectDocument* doc = w.document();
    QVERIFY(menuAction(w, "Project", "Project settings") == w.settingsAction());
    const tl::Project before = doc->project();
    const tl::Model& m = doc->model();
    QVERIFY2(!m.fleets().empty() && m.detritusPools().size() >= 1, "the sample needs a fleet and a pool");

    ProjectSettingsDialog dialog(doc);
    QCOMPARE(dialog.currencyEdit()->text(), QString::fromStdString(before.info.units.currency));
    QCOMPARE(dialog.poolCombos().size(), m.fleets().size());
    dialog.currencyEdit()->setText("  g C ");
    dialog.areaEdit()->setText("m²");
    dialog.timeEdit()->setText("month");
    dialog.eeMaxEdit()->setText("0.95");
    dialog.pqMinEdit()->setText("0.1");
    dialog.pqMaxEdit()->setText("0.35");
    dialog.biomassMaxEdit()->setText("5000");
    dialog.rateMaxEdit()->setText("200");
    dialog.flowMaxEdit()->setText("1e5");
    QCOMPARE(dialog.gradeCvEdit(2)->text(), QStringLiteral("0.5"));  // the project's grade C
    const std::array<double, 4> gradeCvs = {0.05, 0.2, 0.4, 0.9};
    for (int g = 0; g < 4; ++g) dialog.gradeCvEdit(g)->setText(QString::number(gradeCvs[std::size_t(g)]));
    const std::size_t lastPool = m.detritusPools().back();
    dialog.poolCombos().front()->setCurrentIndex(dialog.poolCombos().front()->count() - 1);
    dialog.show();
    QVERIFY(QTest::qWaitForWindowExposed(&dialog));
    keepSnapshot(dialog, "project-settings");
    // Sized for its content: no scroll bar where the screen has room for everything.
    auto* scroll = dialog.findChild<QScrollArea*>();
    QVERIFY(scroll);
    QVERIFY2(!scroll->verticalScrollBar()->isVisible(),
             qPrintable(QStringLiteral("content %1 px high in a %2 px viewport")
                            .arg(scroll->widget()->sizeHint().height())
                            .arg(scroll->viewport()->height())));
    dialog.accept();
    QCOMPARE(dialog.result(), int(QDialog::Accepted));
    QCOMPARE(doc->undoStack()->count(), 1);  // one edit for the whole dialog

    QCOMPARE(doc->project().info.units.currency, std::string("g C"));
    QCOMPARE(doc->project().info.rules.eeMax, 0.95);
    QCOMPARE(doc->project().info.rules.plausible, (tl::PlausibleRanges{5000, 200, 1e5}));
    QCOMPARE(doc->project().info.rules.cvByGrade, gradeCvs);
    for (const auto& s : doc->project().scenarios) {  // every scenario carries the project's copy
        QCOMPARE(s.model.units.flow(), std::string("g C/m²/month"));
        QCOMPARE(s.model.rules.pqMax, 0.35);
    }
    QCOMPARE(doc->model().fleet(0).discardPool, std::optional<std::size_t>(lastPool));
    w.runner()->waitForIdle();
    QCOMPARE(w.lastOutcome().sheet.rows.size(), doc->model().size());  // re-solved with the new rules

    doc->undoStack()->undo();
    QVERIFY(doc->project() == before);
    doc->undoStack()->redo();

    // Saved and read back.
    const QString path = dir.filePath("settings.tledger");
    QVERIFY2(w.saveTo(path, &error), qPrintable(error));
    ProjectDocument reread;
    QVERIFY2(reread.open(path, &error), qPrintable(error));
    QCOMPARE(reread.project().info.units.time, std::string("month"));
    QCOMPARE(reread.project().info.rules.pqMin, 0.1);
    QCOMPARE(reread.model().rules.plausible, (tl::PlausibleRanges{5000, 200, 1e5}));
    QCOMPARE(reread.model().units.area, std::string("m²"));
    QCOMPARE(reread.model().rules.cvByGrade, gradeCvs);  // what the ensemble and reconcile read
    QCOMPARE(reread.model().fleet(0).discardPool, std::optional<std::size_t>(lastPool));

    // Unchanged settings push no command.
    const int count = doc->undoStack()->count();
    QString why = "x";
    QVERIFY(!applySettings(doc, currentSettings(doc->project(), doc->currentIndex()), &why));
    QVERIFY(why.isEmpty());
    QCOMPARE(doc->undoStack()->count(), count);
}

void WorkbenchMenusTest::projectSettingsRefuseBadValuesNamingTheField()
{
    QTemporaryDir dir;
    MainWindow w(testOptions(dir));
    QString error;
    QVERIFY2(w.openPath(kReservoir, true, &error), qPrintable(error));
    ProjectDocument* doc = w.document();
    const tl::Project before = doc->project();
    struct Case { QLineEdit* (ProjectSettingsDialog::*edit)() const; const char* text; const char* names; };
    const Case cases[] = {{&ProjectSettingsDialog::currencyEdit, "  ", "Currency"},
                          {&ProjectSettingsDialog::eeMaxEdit, "abc", "Highest EE"},
                          {&ProjectSettingsDialog::eeMaxEdit, "-1", "Highest EE"},
                          {&ProjectSettingsDialog::pqMinEdit, "0.6", "P/Q"},
                          {&ProjectSettingsDialog::pqMaxEdit, "1.5", "Highest P/Q"},
                          {&ProjectSettingsDialog::dietToleranceEdit, "0", "diet sums"},
                          {&ProjectSettingsDialog::biomassMaxEdit, "0", "Plausible B"},
                          {&ProjectSettingsDialog::rateMaxEdit, "-5", "Plausible P/B"},
                          {&ProjectSettingsDialog::flowMaxEdit, "many", "Plausible flows"}};
    for (const Case& c : cases) {
        ProjectSettingsDialog dialog(doc);
        (dialog.*c.edit)()->setText(QString::fromLatin1(c.text));
        dialog.accept();
        QVERIFY2(dialog.result() != QDialog::Accepted, c.text);
        QVERIFY2(dialog.errorLabel()->text().contains(QString::fromLatin1(c.names)), qPrintable(dialog.errorLabel()->text()));
        QVERIFY(doc->project() == before);  // nothing applied, nothing lost
        QCOMPARE(doc->undoStack()->count(), 0);
    }
    // A grade's CV: above 0, at most 10, and no smaller than the better grade's.
    const struct { int grade; const char* text; const char* names; } gradeCases[] = {
        {0, "0", "grade A"}, {3, "11", "grade D"}, {1, "0.05", "grade B"}, {2, "x", "grade C"}};
    for (const auto& c : gradeCases) {
        ProjectSettingsDialog dialog(doc);
        dialog.gradeCvEdit(c.grade)->setText(QString::fromLatin1(c.text));
        dialog.accept();
        QVERIFY2(dialog.result() != QDialog::Accepted, c.text);
        QVERIFY2(dialog.errorLabel()->text().contains(QString::fromLatin1(c.names)), qPrintable(dialog.errorLabel()->text()));
        QVERIFY(doc->project() == before);
        QCOMPARE(doc->undoStack()->count(), 0);
    }
}

// Issues 14, 15, 17: a diet row's data confidence is edited in the Data confidence
// panel when a row of the Diet page is current; one undoable edit; saved with the project.
void WorkbenchMenusTest::dietRowConfidenceIsEditedFromTheDietPage()
{
    QTemporaryDir dir;
    MainWindow w(testOptions(dir));
    QString error;
    QVERIFY2(w.openPath(kReservoir, true, &error), qPrintable(error));
    w.resize(1400, 900);
    w.show();
    QVERIFY(QTest::qWaitForWindowExposed(&w));
    ProjectDocument* doc = w.document();
    w.showPage(QStringLiteral("diet"));
    auto* diet = w.dietPage()->diet();
    const int row = 1;
    const std::size_t predator = diet->predatorOf(row);
    const QString name = QString::fromStdString(doc->model().compartment(predator).name);
    w.dietPage()->view()->goToCell(row, 0);
    QApplication::processEvents();
    auto* panel = w.confidencePanel();
    auto* title = panel->findChild<QLabel*>(QStringLiteral("panelTitle"));
    QVERIFY(title);
    QVERIFY2(title->text().contains(QStringLiteral("the diet of %1").arg(name)), qPrintable(title->text()));
    auto* grade = panel->findChild<QComboBox*>();
    QVERIFY(grade);
    const int undoBefore = doc->undoStack()->count();
    const auto parameterConfidence = doc->model().compartment(predator).confidence;
    grade->setCurrentIndex(grade->findData(QStringLiteral("B")));
    QCOMPARE(doc->model().compartment(predator).dietConfidence.grade, tl::Confidence::Grade::B);
    QCOMPARE(doc->undoStack()->count(), undoBefore + 1);
    // The parameters' confidence of the same compartment is untouched.
    QVERIFY(doc->model().compartment(predator).confidence == parameterConfidence);
    doc->undoStack()->undo();
    QCOMPARE(doc->model().compartment(predator).dietConfidence, tl::Confidence{});
    doc->undoStack()->redo();
    const QString path = dir.filePath("diet-confidence.tledger");
    QVERIFY2(w.saveTo(path, &error), qPrintable(error));
    ProjectDocument reread;
    QVERIFY2(reread.open(path, &error), qPrintable(error));
    QCOMPARE(reread.model().compartment(predator).dietConfidence.grade, tl::Confidence::Grade::B);
}

void WorkbenchMenusTest::duplicatesAreLabelledAsCopies()
{
    QTemporaryDir dir;
    MainWindow w(testOptions(dir));
    QString error;
    QVERIFY2(w.openPath(kReservoir, true, &error), qPrintable(error));
    const QString base = QString::fromStdString(w.document()->project().scenarios.front().name);
    QVERIFY(w.shelf()->duplicateScenario(0, "Wet year", &error));
    const tl::Scenario& copy = *w.document()->project().findScenario("Wet year");
    const QString label = copyLabel(copy);
    const QString today = QDateTime::currentDateTimeUtc().date().toString(Qt::ISODate);
    QCOMPARE(label, QStringLiteral("copied from %1 on %2").arg(base, today));
    QVERIFY(copyLabel(w.document()->project().scenarios.front()).isEmpty());
    // A reconciled scenario says so (its description is reconcileDescription's).
    tl::Scenario reconciled = copy;
    reconciled.description = "reconciled from '" + base.toStdString() + "': smallest confidence-weighted change";
    reconciled.created = "2026-11-30T23:10:00Z";
    QCOMPARE(copyLabel(reconciled), QStringLiteral("reconciled from %1 on 2026-11-30").arg(base));
    // The shelf shows the label and never claims derivation.
    auto* list = w.shelf()->findChild<QListWidget*>();
    QVERIFY(list);
    bool shown = false;
    for (int i = 0; i < list->count(); ++i) {
        QVERIFY(!list->item(i)->text().contains("derived"));
        shown |= list->item(i)->text().contains(label);
    }
    QVERIFY(shown);
}

void WorkbenchMenusTest::flowMapDragsAreUndoableAndSaved()
{
    QTemporaryDir dir;
    MainWindow w(testOptions(dir));
    w.resize(1400, 900);
    w.show();
    QString error;
    QVERIFY2(w.openPath(kReservoir, true, &error), qPrintable(error));
    w.runner()->waitForIdle();
    w.showPage(QStringLiteral("flow-map"));
    QApplication::processEvents();
    auto* page = tl::testing::workbenchPage<FlowMapPage>(w, QStringLiteral("flow-map"));
    QVERIFY(page);
    ProjectDocument* doc = w.document();
    QVERIFY(doc->scenario().layout.empty());
    const QString name = QString::fromStdString(doc->model().compartment(0).name);
    const QPointF start = page->positions().value(name);

    // A drag, as the scene reports it when the mouse is released.
    QHash<QString, QPointF> moved{{name, start + QPointF(80, 40)}};
    page->scene()->setPositions(moved);
    emit page->positionsChanged();
    QTRY_COMPARE(doc->undoStack()->count(), 1);
    QVERIFY2(doc->undoStack()->text(0).contains(name), qPrintable(doc->undoStack()->text(0)));
    QCOMPARE(doc->scenario().layout.size(), std::size_t(1));
    QCOMPARE(doc->scenario().layout.at(name.toStdString()).x, start.x() + 80);

    doc->undoStack()->undo();
    QVERIFY(doc->scenario().layout.empty());
    QTRY_COMPARE(page->positions().value(name), start);  // the box is back
    doc->undoStack()->redo();
    QTRY_COMPARE(page->positions().value(name), start + QPointF(80, 40));

    // Saved with the project and shown again on opening.
    const QString path = dir.filePath("layout.tledger");
    QVERIFY2(w.saveTo(path, &error), qPrintable(error));
    MainWindow again(testOptions(dir));
    again.resize(1400, 900);
    again.show();
    QVERIFY2(again.openPath(path, false, &error), qPrintable(error));
    again.runner()->waitForIdle();
    again.showPage(QStringLiteral("flow-map"));
    auto* page2 = tl::testing::workbenchPage<FlowMapPage>(again, QStringLiteral("flow-map"));
    QVERIFY(page2);
    QTRY_COMPARE(page2->positions().value(name), start + QPointF(80, 40));
}

QTEST_MAIN(WorkbenchMenusTest)
#include "workbench_menus_test.moc"
