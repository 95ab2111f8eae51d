// What a new user trips over in the workbench (issue 13): each case reproduces one
// report — the Checks panel after edits, undo and scenario switches; the status word;
// deleting a compartment others eat; typing after naming a new row; near-duplicate
// names and absurd values; EE above its maximum in the tables; one-click fixes; the
// detritus-pool icon, the frozen name column, the duplicate-scenario dialog, the first
// scenario's name and the single "no detritus pool" warning.
//
// Models: the invented tiny lake fixture (tests/fixtures/ui/tiny_lake, no real data).
#include <QAbstractButton>
#include <QApplication>
#include <QDialog>
#include <QDialogButtonBox>
#include <QFileInfo>
#include <QGuiApplication>
#include <QScreen>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QMessageBox>
#include <QPointer>
#include <QPushButton>
#include <QScrollBar>
#include <QSet>
#include <QStatusBar>
#include <QTableView>
#include <QTemporaryDir>
#include <QTest>
#include <QTimer>
#include <QTreeView>
#include <QUndoStack>
#include <cmath>
#include <functional>

#include "core/model/problem_codes.h"
#include "ui/document/project_document.h"
#include "ui/main_window.h"
#include "workbench_test_support.h"
#include "ui/results/balance_sheet_model.h"
#include "ui/results/balance_sheet_page.h"
#include "ui/style/palette.h"
#include "ui/tables/ledger_table_view.h"
#include "ui/widgets/checks_panel.h"
#include "ui/widgets/editing_pages.h"
#include "ui/widgets/scenario_shelf.h"
#include "ui/tables/routing_table_model.h"

using tl::Param;
using tl::ui::CompartmentTableModel;

namespace {

const QString kTinyLake = QStringLiteral(TL_FIXTURES_DIR "/ui/tiny_lake");

QString statusText(const tl::ui::MainWindow& w)
{
    auto* label = w.findChild<QLabel*>(QStringLiteral("balanceStatus"));
    return label ? label->text() : QString();
}

// Every line the Checks panel shows, as "severity|where|message" read from its view.
QStringList shownChecks(tl::ui::ChecksPanel* panel)
{
    QStringList lines;
    auto* view = panel->findChild<QTreeView*>();
    if (!view) return {QStringLiteral("no view")};
    QAbstractItemModel* m = view->model();
    for (int r = 0; r < m->rowCount(); ++r)
        lines << m->index(r, 0).data().toString() + QLatin1Char('|') + m->index(r, 1).data().toString() + QLatin1Char('|') +
                     m->index(r, 2).data().toString().section(QLatin1Char('\n'), 0, 0);
    return lines;
}

// What the panel must show for `problems`: errors, then warnings, then notes.
QStringList expectedChecks(tl::Problems problems)
{
    std::stable_sort(problems.begin(), problems.end(),
                     [](const tl::Problem& a, const tl::Problem& b) { return int(a.severity) < int(b.severity); });
    QStringList lines;
    for (const auto& p : problems)
        lines << tl::ui::severityLabel(p.severity) + QLatin1Char('|') + tl::ui::whereText(p) + QLatin1Char('|') +
                     QString::fromStdString(p.message);
    return lines;
}

// Runs `handle` on the first modal dialog that appears (QMessageBox or QDialog), once.
void whenDialogAppears(std::function<void(QWidget*)> handle, int tries = 100)
{
    QTimer::singleShot(30, qApp, [handle, tries] {
        QWidget* modal = QApplication::activeModalWidget();
        if (modal) return handle(modal);
        if (tries > 0) whenDialogAppears(handle, tries - 1);
    });
}

QAbstractButton* buttonWithText(QWidget* parent, const QString& text)
{
    for (auto* b : parent->findChildren<QAbstractButton*>())
        if (b->text().remove(QLatin1Char('&')) == text) return b;
    return nullptr;
}

// Share of the opaque pixels of two icons at 14 px that overlap (intersection / union).
double silhouetteOverlap(const QIcon& a, const QIcon& b)
{
    const QImage ia = a.pixmap(14, 14).toImage().convertToFormat(QImage::Format_ARGB32);
    const QImage ib = b.pixmap(14, 14).toImage().convertToFormat(QImage::Format_ARGB32);
    int both = 0, either = 0;
    for (int y = 0; y < 14; ++y)
        for (int x = 0; x < 14; ++x) {
            const bool pa = qAlpha(ia.pixel(x, y)) > 96, pb = qAlpha(ib.pixel(x, y)) > 96;
            both += pa && pb;
            either += pa || pb;
        }
    return either ? double(both) / either : 1.0;
}

void setCell(tl::ui::MainWindow& w, int row, Param p, const QString& text)
{
    auto* table = w.compartmentsPage()->compartments();
    QVERIFY2(table->setData(table->index(row, CompartmentTableModel::columnOf(p)), text), qPrintable(table->lastRefusal()));
    w.runner()->waitForIdle();
}

}  // namespace

class WorkbenchFirstUseTest : public QObject {
    Q_OBJECT
private slots:
    // The program's style sheet, as app/gui/main.cpp applies it: its paddings and fonts
    // change row heights and widths, where stale or cut rows would show.
    void initTestCase() { qApp->setStyleSheet(tl::ui::styleSheet()); }

    // Item 1: after every edit, undo and scenario switch the panel lists exactly the
    // problems of the scenario on screen, and draws them as a fresh panel would.
    void checksPanelShowsExactlyTheCurrentProblems()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(kTinyLake, true));
        w.resize(1400, 880);
        w.show();
        QVERIFY(QTest::qWaitForWindowExposed(&w));
        w.runner()->waitForIdle();
        auto agree = [&w](const char* when) {
            w.runner()->waitForIdle();
            QApplication::processEvents();
            const QStringList shown = shownChecks(w.checks());
            const QStringList expected = expectedChecks(w.lastOutcome().checks);
            QVERIFY2(shown == expected, qPrintable(QStringLiteral("%1:\nshown    %2\nexpected %3")
                                                       .arg(QLatin1String(when), shown.join(QStringLiteral(" / ")),
                                                            expected.join(QStringLiteral(" / ")))));
            // What is on screen (the window's backing store, which the offscreen platform
            // grabs) is what the panel draws now: nothing stale is left from before.
            QApplication::processEvents();
            const QRect r(w.checks()->mapTo(&w, QPoint(0, 0)), w.checks()->size());
            const QImage onScreen = QGuiApplication::primaryScreen()
                                        ->grabWindow(w.winId(), r.x(), r.y(), r.width(), r.height())
                                        .toImage()
                                        .convertToFormat(QImage::Format_RGB32);
            const QImage drawnNow = w.checks()->grab().toImage().convertToFormat(QImage::Format_RGB32);
            QVERIFY2(onScreen.size() == drawnNow.size(), when);
            int differing = 0;
            for (int y = 0; y < onScreen.height(); ++y)
                for (int x = 0; x < onScreen.width(); ++x) differing += onScreen.pixel(x, y) != drawnNow.pixel(x, y);
            QVERIFY2(differing == 0, qPrintable(QStringLiteral("%1: %2 pixels on screen differ from the panel's drawing")
                                                    .arg(QLatin1String(when)).arg(differing)));
        };
        agree("opened");
        auto* diet = w.dietPage()->diet();
        const int pikeRow = diet->rowOfPredator(3);
        QVERIFY(diet->setData(diet->index(pikeRow, 2), QStringLiteral("0.5")));  // Pike's diet sums to 0.5
        agree("diet broken");
        QVERIFY(w.checks()->count() > 0);
        auto* table = w.compartmentsPage()->compartments();
        QVERIFY(!table->setData(table->index(1, CompartmentTableModel::columnOf(Param::Biomass)), QStringLiteral("-3")));
        agree("refused input");  // refused: nothing changes
        setCell(w, 2, Param::EE, QStringLiteral("0.95"));
        agree("EE edited");
        // Fixed again as a user does it: click the line (which selects the cell), type 1, Enter.
        {
            auto* view = w.checks()->findChild<QTreeView*>();
            int line = -1;
            for (int i = 0; i < w.checks()->count(); ++i)
                if (w.checks()->problems()[std::size_t(i)].compartment == "Pike") line = i;
            QVERIFY(line >= 0);
            const QRect rect = view->visualRect(view->model()->index(line, 1));
            QTest::mouseClick(view->viewport(), Qt::LeftButton, {}, rect.center());
            QApplication::processEvents();
            w.showPage(QStringLiteral("diet"));
            w.dietPage()->view()->goToCell(pikeRow, 2);
            QTest::keyClicks(w.dietPage()->view(), QStringLiteral("1"));
            QWidget* editor = QApplication::focusWidget();
            QVERIFY(qobject_cast<QLineEdit*>(editor));
            QCOMPARE(qobject_cast<QLineEdit*>(editor)->text(), QStringLiteral("1"));  // typing overwrites
            QTest::keyClick(editor, Qt::Key_Return);
            QApplication::processEvents();  // the delegate commits Enter through the event loop
            QCOMPARE(w.document()->model().diet(3, 2), 1.0);
        }
        agree("diet fixed by typing");
        w.document()->undoStack()->undo();
        agree("undo");
        w.document()->undoStack()->redo();
        agree("redo");
        QVERIFY(w.shelf()->newScenario(QStringLiteral("Empty draft")));
        agree("new empty scenario");
        w.document()->setCurrentIndex(0);
        agree("back to the first scenario");
    }

    // Item 1: in a narrow panel a long message wraps, and its row is tall enough to show
    // every line (it was cut off under the next row), also after the panel is widened.
    void checksRowsAreAsTallAsTheirWrappedText()
    {
        tl::ui::ChecksPanel panel;
        panel.resize(520, 300);
        panel.show();
        QVERIFY(QTest::qWaitForWindowExposed(&panel));
        tl::Problem p;
        p.code = tl::code::kEEAboveMax;
        p.severity = tl::Severity::Error;
        p.compartment = "Roach juveniles";
        p.parameter = "ee";
        p.message = "EE of 'Roach juveniles' is 1.083, above 1: predation, catch, net emigration and accumulation take "
                    "more than it produces (share of its production: Perch adults 60 %, Zander adults 22 %).";
        p.hint = "Raise its B or P/B, or lower its predators' consumption of it or its catch.";
        panel.setProblems({p, p});
        auto* view = panel.findChild<QTreeView*>();
        for (int width : {520, 900}) {
            panel.resize(width, 300);
            QApplication::processEvents();
            QApplication::processEvents();
            const QModelIndex cell = view->model()->index(0, 2);
            const QRect need = view->fontMetrics().boundingRect(QRect(0, 0, view->header()->sectionSize(2) - 10, 1 << 20),
                                                               Qt::TextWordWrap, cell.data().toString());
            QVERIFY2(view->visualRect(cell).height() >= need.height(),
                     qPrintable(QStringLiteral("%1 px wide: row %2 px, text %3 px").arg(width).arg(view->visualRect(cell).height()).arg(need.height())));
        }
    }

    // Item 2: "Balanced" only for a valid, solved scenario without errors.
    void statusNamesWhatTheScenarioIs()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        w.runner()->waitForIdle();
        QVERIFY2(statusText(w).startsWith(QStringLiteral("No compartments yet")), qPrintable(statusText(w)));

        QVERIFY(w.openPath(kTinyLake, true));
        w.runner()->waitForIdle();
        QVERIFY2(statusText(w).startsWith(QStringLiteral("Balanced")), qPrintable(statusText(w)));

        // Zooplankton's diet emptied: the scenario is incomplete, whatever the solver says.
        auto* diet = w.dietPage()->diet();
        const int zooRow = diet->rowOfPredator(1);
        QVERIFY(diet->setData(diet->index(zooRow, 0), QString()));
        QVERIFY(diet->setData(diet->index(zooRow, 4), QString()));
        w.runner()->waitForIdle();
        QVERIFY(tl::hasErrors(w.lastOutcome().checks));
        QVERIFY2(statusText(w).startsWith(QStringLiteral("Incomplete")), qPrintable(statusText(w)));
        QVERIFY(!statusText(w).contains(QStringLiteral("Balanced")));
        // The Balance sheet page says the same word.
        w.showPage(QStringLiteral("balance-sheet"));
        bool pageSays = false;
        for (auto* l : w.findChild<tl::ui::BalanceSheetPage*>()->findChildren<QLabel*>())
            pageSays = pageSays || l->text().startsWith(QStringLiteral("<b>Incomplete.</b>"));
        QVERIFY(pageSays);
        w.showPage(QStringLiteral("compartments"));
        w.document()->undoStack()->undo();
        w.document()->undoStack()->undo();
        w.runner()->waitForIdle();
        QVERIFY2(statusText(w).startsWith(QStringLiteral("Balanced")), qPrintable(statusText(w)));

        // A heavy Pike stock eats more Roach than Zooplankton can feed: solved, not balanced.
        setCell(w, 3, Param::Biomass, QStringLiteral("40"));
        bool eeAbove = false;
        for (const auto& row : w.lastOutcome().sheet.rows) eeAbove = eeAbove || row.ee > 1.0;
        QVERIFY(eeAbove);
        QVERIFY2(statusText(w).startsWith(QStringLiteral("Not balanced")), qPrintable(statusText(w)));
    }

    // Item 3: removing a compartment that others eat asks first, naming who is affected.
    void removingAnEatenCompartmentAsksAndUndoRestoresAll()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(kTinyLake, true));
        w.show();
        w.runner()->waitForIdle();
        const tl::Model before = w.document()->model();
        auto* page = w.compartmentsPage();
        QPushButton* remove = nullptr;
        for (auto* b : page->findChildren<QPushButton*>())
            if (b->text() == QStringLiteral("Remove")) remove = b;
        QVERIFY(remove);

        // Cancel first: nothing changes.
        page->view()->goToCell(2, CompartmentTableModel::kNameColumn);  // Roach: Pike eats it, Gill nets catch it
        QString asked;
        whenDialogAppears([&asked](QWidget* box) {
            auto* mb = qobject_cast<QMessageBox*>(box);
            asked = mb ? mb->text() + QLatin1Char('\n') + mb->informativeText() : QString();
            if (mb) mb->reject();
        });
        remove->click();
        QVERIFY2(asked.contains(QStringLiteral("Pike")), qPrintable(asked));
        QVERIFY2(asked.contains(QStringLiteral("100 %")), qPrintable(asked));  // Pike's diet is all Roach
        QVERIFY2(asked.contains(QStringLiteral("Gill nets")), qPrintable(asked));
        QVERIFY(w.document()->model() == before);

        // Then yes: removed; one undo brings back the compartment, the diet and the catch.
        whenDialogAppears([](QWidget* box) {
            if (auto* b = buttonWithText(box, QStringLiteral("Remove"))) b->click();
        });
        page->view()->goToCell(2, CompartmentTableModel::kNameColumn);
        remove->click();
        QVERIFY(!w.document()->model().indexOf("Roach"));
        w.document()->undoStack()->undo();
        QVERIFY(w.document()->model() == before);
    }

    // Item 4: Add producer, type a name, Tab, type a number, Tab: both are kept.
    void tabAndEnterAfterNamingANewRowKeepWhatIsTyped()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(kTinyLake, true));
        w.show();
        QVERIFY(QTest::qWaitForWindowExposed(&w));
        QTest::failOnWarning(QRegularExpression(QStringLiteral("closeEditor|does not belong")));
        auto* page = w.compartmentsPage();
        auto button = [page](const QString& text) {
            for (auto* b : page->findChildren<QPushButton*>())
                if (b->text() == text) return b;
            return static_cast<QPushButton*>(nullptr);
        };
        page->view()->goToCell(0, 0);
        button(QStringLiteral("Add producer"))->click();
        QApplication::processEvents();
        QVERIFY(qobject_cast<QLineEdit*>(QApplication::focusWidget()));
        QTest::keyClicks(QApplication::focusWidget(), QStringLiteral("Periphyton"));
        QTest::keyClick(QApplication::focusWidget(), Qt::Key_Tab);
        QApplication::processEvents();
        QVERIFY2(qobject_cast<QLineEdit*>(QApplication::focusWidget()), "Tab opens the next cell for typing");
        QTest::keyClicks(QApplication::focusWidget(), QStringLiteral("12"));
        QTest::keyClick(QApplication::focusWidget(), Qt::Key_Tab);
        QApplication::processEvents();
        const auto row = w.document()->model().indexOf("Periphyton");
        QVERIFY(row);
        QCOMPARE(w.document()->model().compartment(*row).value(Param::Biomass).value_or(-1.0), 12.0);

        // Enter does the same for a new row: name, Enter, B, Enter.
        page->view()->goToCell(int(*row), 0);
        button(QStringLiteral("Add consumer"))->click();
        QApplication::processEvents();
        QVERIFY(qobject_cast<QLineEdit*>(QApplication::focusWidget()));
        QTest::keyClicks(QApplication::focusWidget(), QStringLiteral("Mysids"));
        QTest::keyClick(QApplication::focusWidget(), Qt::Key_Return);
        QApplication::processEvents();
        QVERIFY2(qobject_cast<QLineEdit*>(QApplication::focusWidget()), "Enter opens the next cell for typing");
        QTest::keyClicks(QApplication::focusWidget(), QStringLiteral("3.5"));
        QTest::keyClick(QApplication::focusWidget(), Qt::Key_Return);
        QApplication::processEvents();
        const auto mysids = w.document()->model().indexOf("Mysids");
        QVERIFY(mysids);
        QCOMPARE(w.document()->model().compartment(*mysids).value(Param::Biomass).value_or(-1.0), 3.5);
    }

    // Item 5: names are trimmed and must differ by more than case or spaces; absurd
    // values are warned about.
    void nearDuplicateNamesAreRefusedAndAbsurdValuesWarned()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(kTinyLake, true));
        auto* table = w.compartmentsPage()->compartments();
        const QModelIndex pikeName = table->index(3, CompartmentTableModel::kNameColumn);
        QVERIFY(!table->setData(pikeName, QStringLiteral("zooplankton ")));
        QVERIFY2(table->lastRefusal().contains(QStringLiteral("Zooplankton")), qPrintable(table->lastRefusal()));
        QVERIFY(!table->setData(pikeName, QStringLiteral("ROACH")));
        QVERIFY(table->setData(pikeName, QStringLiteral("  Northern pike  ")));
        QCOMPARE(w.document()->model().compartment(3).name, std::string("Northern pike"));

        setCell(w, 3, Param::Biomass, QStringLiteral("1e300"));
        bool warned = false;
        for (const auto& p : w.lastOutcome().checks)
            warned = warned || (p.compartment == "Northern pike" && p.parameter == "biomass" && p.severity == tl::Severity::Warning);
        QVERIFY2(warned, "B = 1e300 must not pass silently");
    }

    // Item 7: an EE above its maximum is marked by an icon and words in both tables.
    void eeAboveItsMaximumIsMarkedInTheTables()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(kTinyLake, true));
        w.show();
        setCell(w, 3, Param::Biomass, QStringLiteral("40"));
        int over = -1;
        for (std::size_t i = 0; i < w.lastOutcome().sheet.rows.size(); ++i)
            if (w.lastOutcome().sheet.rows[i].ee > 1.0) over = int(i);
        QVERIFY(over >= 0);
        auto* table = w.compartmentsPage()->compartments();
        const QModelIndex ee = table->index(over, CompartmentTableModel::columnOf(Param::EE));
        QVERIFY2(!ee.data(Qt::DecorationRole).value<QIcon>().isNull(), "an icon beside the EE");
        QVERIFY2(ee.data(Qt::DisplayRole).toString().contains(QStringLiteral("above")), qPrintable(ee.data().toString()));

        w.showPage(QStringLiteral("balance-sheet"));
        tl::ui::BalanceSheetPage* page = w.findChild<tl::ui::BalanceSheetPage*>();
        QVERIFY(page);
        const QModelIndex cell = page->sheetModel()->index(over, tl::ui::BalanceSheetModel::column(tl::ui::BalanceSheetModel::Column::Ee));
        QVERIFY2(!cell.data(Qt::DecorationRole).value<QIcon>().isNull(), "an icon beside the EE");
        QVERIFY2(cell.data(Qt::DisplayRole).toString().contains(QStringLiteral("above")), qPrintable(cell.data().toString()));
        // An EE within bounds carries no such mark.
        const QModelIndex fine = table->index(4, CompartmentTableModel::columnOf(Param::EE));
        QVERIFY(!fine.data(Qt::DisplayRole).toString().contains(QStringLiteral("above")));
    }

    // Item 12: a diet that does not sum to 1 and a routing short of 1 with one pool are
    // fixed in one click each, one undo step each.
    void oneClickFixesAreUndoable()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(kTinyLake, true));
        auto* diet = w.dietPage()->diet();
        const int pikeRow = diet->rowOfPredator(3);
        QVERIFY(diet->setData(diet->index(pikeRow, 2), QStringLiteral("0.5")));
        auto* routing = w.routingPage()->routing();
        const int zooRow = routing->rowOfCompartment(1);
        QVERIFY(zooRow >= 0);
        QVERIFY(routing->setData(routing->index(zooRow, 0), QStringLiteral("0.4")));
        w.runner()->waitForIdle();
        auto lineOf = [&w](const char* code, const char* compartment) {
            for (int i = 0; i < w.checks()->count(); ++i)
                if (w.checks()->problems()[std::size_t(i)].code == code && w.checks()->problems()[std::size_t(i)].compartment == compartment)
                    return i;
            return -1;
        };
        const int dietLine = lineOf(tl::code::kDietSum, "Pike");
        QVERIFY(dietLine >= 0);
        QCOMPARE(w.checks()->fixLabel(dietLine), QStringLiteral("Scale the diet of Pike so that it sums to 1"));
        QVERIFY(w.checks()->fix(dietLine));
        w.runner()->waitForIdle();
        QCOMPARE(w.document()->model().diet(3, 2), 1.0);
        QCOMPARE(w.document()->undoStack()->undoText(), QStringLiteral("Scale the diet of Pike so that it sums to 1"));
        QCOMPARE(lineOf(tl::code::kDietSum, "Pike"), -1);

        const int routeLine = lineOf(tl::code::kRoutingSum, "Zooplankton");
        QVERIFY(routeLine >= 0);
        QVERIFY(w.checks()->fix(routeLine));
        w.runner()->waitForIdle();
        QCOMPARE(w.document()->model().routing(1, 4), 1.0);
        w.document()->undoStack()->undo();
        QCOMPARE(w.document()->model().routing(1, 4), 0.4);
        w.document()->undoStack()->undo();
        QCOMPARE(w.document()->model().diet(3, 2), 0.5);
        // A problem without an unambiguous remedy offers none.
        w.document()->undoStack()->undo();  // the routing edit
        w.runner()->waitForIdle();
        QVERIFY(diet->setData(diet->index(pikeRow, 2), QString()));  // Pike's diet empty
        w.runner()->waitForIdle();
        const int empty = lineOf(tl::code::kDietSum, "Pike");
        QVERIFY(empty >= 0);
        QVERIFY(w.checks()->fixLabel(empty).isEmpty());
        QVERIFY(!w.checks()->fix(empty));
    }

    // Item 14: every diet-matrix column is at least as wide as its header's longest word.
    void dietHeadersAreNotClipped()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QString error;
        QVERIFY2(w.openPath(QStringLiteral(TL_SAMPLES_DIR "/reservoir.tledger"), true, &error), qPrintable(error));
        w.resize(1024, 700);
        w.show();
        w.showPage(QStringLiteral("diet"));
        QApplication::processEvents();
        auto* page = w.dietPage();
        const QFontMetrics fm(page->view()->horizontalHeader()->font());
        for (int c = 0; c < page->diet()->columnCount(); ++c) {
            if (page->view()->isColumnHidden(c)) continue;
            const QString header = page->diet()->headerData(c, Qt::Horizontal, Qt::DisplayRole).toString();
            int word = 0;
            for (const QString& part : header.split(QLatin1Char(' '), Qt::SkipEmptyParts)) word = std::max(word, fm.horizontalAdvance(part));
            const bool icon = !page->diet()->headerData(c, Qt::Horizontal, Qt::DecorationRole).isNull();
            QVERIFY2(page->view()->columnWidth(c) >= word + (icon ? 16 : 0) + 8,
                     qPrintable(QStringLiteral("%1: %2 px for a %3 px word").arg(header).arg(page->view()->columnWidth(c)).arg(word)));
        }
    }

    // Item 14: a detritus pool's icon is not the warning triangle.
    void detritusPoolIconIsNotTheWarningShape()
    {
        const double overlap = silhouetteOverlap(tl::ui::kindIcon(tl::CompartmentKind::Detritus),
                                                 tl::ui::severityIcon(tl::Severity::Warning));
        // Same silhouette scores about 0.9 at 14 px (the old triangle: 0.91); different
        // convex shapes about 0.5.
        QVERIFY2(overlap < 0.7, qPrintable(QString::number(overlap)));
    }

    // Item 14: the first scenario of a new project has the samples' name for it.
    void theFirstScenarioHasOneName()
    {
        tl::ui::ProjectDocument sample;
        QString error;
        QVERIFY2(sample.open(QStringLiteral(TL_SAMPLES_DIR "/reservoir.tledger"), &error, true), qPrintable(error));
        tl::ui::ProjectDocument fresh;
        fresh.newProject();
        QCOMPARE(fresh.project().scenarios.front().name, sample.project().scenarios.front().name);
    }

    // Item 14: one "no detritus pool" warning, in one wording wherever it is shown
    // (the Checks panel lists validation's, the Balance sheet page the solver's).
    void oneNoDetritusPoolWarning()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(kTinyLake, true));
        w.compartmentsPage()->compartments()->removeCompartments({4});
        w.runner()->waitForIdle();
        int inChecks = 0;
        QSet<QString> wordings;
        for (const auto& p : w.lastOutcome().checks)
            if (p.code == tl::code::kNoDetritusPool) ++inChecks, wordings << QString::fromStdString(p.message);
        for (const auto& p : w.lastOutcome().sheet.problems)
            if (p.code == tl::code::kNoDetritusPool) wordings << QString::fromStdString(p.message);
        QCOMPARE(inChecks, 1);
        QVERIFY2(wordings.size() == 1, qPrintable(QStringList(wordings.values()).join(QStringLiteral(" / "))));
    }

    // Item 14: the Balance sheet keeps the names in view when scrolled to the right.
    void balanceSheetNamesStayInViewWhenScrolled()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(kTinyLake, true));
        w.resize(1024, 700);
        w.show();
        QVERIFY(QTest::qWaitForWindowExposed(&w));
        w.showPage(QStringLiteral("balance-sheet"));
        auto* page = w.findChild<tl::ui::BalanceSheetPage*>();
        QTableView* table = page->table();
        QApplication::processEvents();
        table->horizontalScrollBar()->setValue(table->horizontalScrollBar()->maximum());
        QApplication::processEvents();
        QVERIFY(table->horizontalScrollBar()->maximum() > 0);
        // Some widget on the page shows "Pike" at the left of the table, whatever the scroll.
        bool shown = false;
        for (QHeaderView* h : page->findChildren<QHeaderView*>())
            if (h->orientation() == Qt::Vertical && h->isVisible() && h->width() > 20)
                for (int r = 0; r < h->count(); ++r)
                    shown = shown || h->model()->headerData(r, Qt::Vertical).toString() == QStringLiteral("Pike");
        for (QTableView* v : page->findChildren<QTableView*>())
            if (v != table && v->isVisible())
                for (int r = 0; r < v->model()->rowCount(); ++r)
                    shown = shown || v->model()->index(r, 0).data().toString() == QStringLiteral("Pike");
        QVERIFY2(shown, "the compartment names scroll out of view");
    }

    // Item 14: a clashing name in the duplicate dialog is corrected in the dialog.
    void duplicateDialogLetsTheUserCorrectAClashingName()
    {
        QTemporaryDir dir;
        tl::ui::MainWindow w(tl::testing::workbenchTestOptions(dir));
        QVERIFY(w.openPath(kTinyLake, true));
        const std::string first = w.document()->scenario().name;
        bool stayedOpen = false;
        QString said;
        whenDialogAppears([&](QWidget* dialog) {
            auto* edit = dialog->findChild<QLineEdit*>();
            auto* ok = buttonWithText(dialog, QStringLiteral("OK"));
            if (!edit || !ok) return dialog->close(), void();
            QPointer<QWidget> guard(dialog);
            edit->setText(QString::fromStdString(first));
            ok->click();
            QApplication::processEvents();
            stayedOpen = guard && dialog->isVisible();
            if (!stayedOpen) {
                // The dialog closed on the clash: close the message box that follows.
                whenDialogAppears([&said](QWidget* box) {
                    if (auto* mb = qobject_cast<QMessageBox*>(box)) said += mb->text();
                    box->close();
                });
                return;
            }
            for (auto* l : dialog->findChildren<QLabel*>()) said += l->text();
            edit->setText(QStringLiteral("Second try"));
            ok->click();
        });
        w.shelf()->askDuplicate();
        QVERIFY2(stayedOpen, "the dialog closed on a clashing name");
        QVERIFY2(said.contains(QStringLiteral("already exists")), qPrintable(said));
        QCOMPARE(w.document()->project().scenarios.size(), std::size_t(2));
        QCOMPARE(w.document()->scenario().name, std::string("Second try"));
    }
};

QTEST_MAIN(WorkbenchFirstUseTest)
#include "workbench_first_use_test.moc"
