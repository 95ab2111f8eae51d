// Balance sheet page (ui/results/balance_sheet_model.h, balance_sheet_page.h).
// The table must show exactly what `tledger solve --json` reports for the same model
// (the executable is run as a separate process, so the check does not share the
// page's code path), mark the solved values, and sort, filter, copy and export.
#include <QApplication>
#include <QClipboard>
#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QProcess>
#include <QTableView>
#include <QTemporaryDir>
#include <QtTest>
#include <cmath>

#include "core/balance/production_uses.h"
#include "core/balance/solver.h"
#include "core/io/csv_model.h"
#include "ui/results/balance_sheet_page.h"

using tl::ui::BalanceSheetModel;
using tl::ui::BalanceSheetPage;
using Column = BalanceSheetModel::Column;

namespace {

QString fixture(const char* name) { return QStringLiteral(TL_FIXTURES_DIR "/results/") + name; }

tl::Model readModel(const QString& folder)
{
    auto result = tl::readCsvModel(folder.toStdString());
    if (!result.model) qFatal("fixture %s does not read", qPrintable(folder));
    return *result.model;
}

QJsonObject solveJson(const QString& folder)
{
    QProcess p;
    p.start(QStringLiteral(TL_TLEDGER_EXE), {"solve", folder, "--json"});
    if (!p.waitForFinished(60000)) qFatal("tledger solve did not finish");
    const QJsonDocument doc = QJsonDocument::fromJson(p.readAllStandardOutput());
    if (!doc.isObject()) qFatal("tledger solve --json printed no JSON object: %s", p.readAllStandardError().constData());
    return doc.object();
}

int rowOf(const BalanceSheetModel& m, const QString& name)
{
    for (int r = 0; r < m.rowCount(); ++r)
        if (m.cellText(r, Column::Name) == name) return r;
    return -1;
}

}  // namespace

class BalanceSheetTest : public QObject {
    Q_OBJECT
private slots:
    void valuesEqualTheCliJson_data();
    void valuesEqualTheCliJson();
    void solvedValuesCarryTheIconAndInputsStayAsEntered();
    void statusNamesTheProblem();
    void sortsNumbersWithEmptyCellsLast();
    void filtersByNameKindAndProblems();
    void copiesTabSeparatedText();
    void exportsCsvWithQuotingAndUnits();
    void exportToAnUnwritablePathSaysWhy();
    void currentRowShowsWhoTakesItsProduction();
};

// The "who eats it" line under the table names every taker of the current row's
// production with its share, as core/balance/production_uses.h computes them.
void BalanceSheetTest::currentRowShowsWhoTakesItsProduction()
{
    const tl::Model model = readModel(fixture("invented_lake"));
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    BalanceSheetPage page;
    page.setScenario(model, sheet);
    QVERIFY(page.productionUsesText().startsWith(QStringLiteral("Select a compartment")));
    // The living compartment with the most takers.
    std::size_t best = 0, most = 0;
    for (std::size_t i = 0; i < model.size(); ++i)
        if (const auto n = tl::productionUses(model, sheet, i).size(); n > most) most = n, best = i;
    QVERIFY(most >= 2);
    const QString name = QString::fromStdString(model.compartment(best).name);
    const int row = rowOf(*page.sheetModel(), name);
    QVERIFY(row >= 0);
    page.table()->setCurrentIndex(page.filter()->mapFromSource(page.sheetModel()->index(row, 0)));
    const QString text = page.productionUsesText();
    QVERIFY2(text.contains(name), qPrintable(text));
    for (const tl::ProductionUse& u : tl::productionUses(model, sheet, best)) {
        if (u.kind != tl::ProductionUse::Kind::Predator) continue;
        const QString expected = QStringLiteral("%1 %2 %").arg(QString::fromStdString(u.name))
                                     .arg(QString::number(100.0 * u.shareOfProduction, 'f', 1));
        QVERIFY2(text.contains(expected), qPrintable(text + " lacks " + expected));
    }
}

void BalanceSheetTest::valuesEqualTheCliJson_data()
{
    QTest::addColumn<QString>("folder");
    QTest::newRow("pond") << fixture("pond");
    QTest::newRow("invented_lake") << fixture("invented_lake");
}

void BalanceSheetTest::valuesEqualTheCliJson()
{
    QFETCH(QString, folder);
    const tl::Model model = readModel(folder);
    BalanceSheetModel m;
    m.setScenario(model, tl::solveBalance(model));
    const QJsonObject json = solveJson(folder);
    const QJsonArray rows = json.value("compartments").toArray();
    QCOMPARE(rows.size(), m.rowCount());
    const Column numeric[] = {Column::Biomass, Column::Pb, Column::Qb, Column::Ee, Column::Pq,
                              Column::TrophicLevel, Column::Omnivory, Column::Production, Column::Consumption,
                              Column::Respiration, Column::FlowToDetritus};
    int compared = 0;
    for (const QJsonValue& v : rows) {
        const QJsonObject c = v.toObject();
        const int r = rowOf(m, c.value("name").toString());
        QVERIFY2(r >= 0, qPrintable(c.value("name").toString()));
        QCOMPARE(m.cellText(r, Column::Kind), c.value("kind").toString());
        for (Column col : numeric) {
            const QString key = BalanceSheetModel::jsonKey(col);
            QVERIFY(!key.isEmpty());
            const double shown = m.index(r, BalanceSheetModel::column(col)).data(BalanceSheetModel::kValueRole).toDouble();
            const QJsonValue expected = c.value(key);
            if (expected.isNull() || expected.isUndefined()) {
                QVERIFY2(std::isnan(shown), qPrintable(c.value("name").toString() + " " + key));
            } else {
                QVERIFY2(std::abs(shown - expected.toDouble()) <= 1e-12 * std::max(1.0, std::abs(expected.toDouble())),
                         qPrintable(QString("%1 %2: table %3, CLI %4").arg(c.value("name").toString(), key)
                                        .arg(shown, 0, 'g', 17).arg(expected.toDouble(), 0, 'g', 17)));
                ++compared;
            }
        }
        // The solved list of the CLI is exactly the set of cells carrying the solved mark.
        QStringList solvedCli;
        for (const QJsonValue& s : c.value("solved").toArray()) solvedCli << s.toString();
        QStringList solvedTable;
        for (Column col : {Column::Biomass, Column::Pb, Column::Qb, Column::Ee, Column::Pq})
            if (m.index(r, BalanceSheetModel::column(col)).data(BalanceSheetModel::kSolvedRole).toBool())
                solvedTable << BalanceSheetModel::jsonKey(col);
        solvedCli.sort();
        solvedTable.sort();
        QCOMPARE(solvedTable, solvedCli);
    }
    QVERIFY(compared > rows.size() * 5);  // most cells hold numbers
}

void BalanceSheetTest::solvedValuesCarryTheIconAndInputsStayAsEntered()
{
    const tl::Model model = readModel(fixture("invented_lake"));
    BalanceSheetModel m;
    m.setScenario(model, tl::solveBalance(model));
    const int roach = rowOf(m, "Roach");
    QVERIFY(roach >= 0);
    const QModelIndex bIn = m.index(roach, BalanceSheetModel::column(Column::BiomassIn));
    const QModelIndex b = m.index(roach, BalanceSheetModel::column(Column::Biomass));
    QVERIFY(std::isnan(bIn.data(BalanceSheetModel::kValueRole).toDouble()));  // entered empty
    QVERIFY(bIn.data(Qt::DisplayRole).toString().isEmpty());
    QVERIFY(b.data(BalanceSheetModel::kSolvedRole).toBool());
    QVERIFY(!b.data(Qt::DecorationRole).value<QIcon>().isNull());
    QVERIFY(b.data(BalanceSheetModel::kValueRole).toDouble() > 0);
    // Hand check of Roach B from the fixture's numbers (Polovina 1984: B P/B EE = predation
    // + catch): predation 30x0.15 + 5.4x0.35 + 3.04x0.6 + 1.8x0.5 = 9.114, catch 0.7
    // landed + 0.05 discarded; B = 9.864 / (0.9 x 0.8) = 13.7.
    QVERIFY(std::abs(b.data(BalanceSheetModel::kValueRole).toDouble() - 13.7) < 1e-9);
    const QModelIndex pb = m.index(roach, BalanceSheetModel::column(Column::Pb));
    QVERIFY(!pb.data(BalanceSheetModel::kSolvedRole).toBool());
    QVERIFY(pb.data(Qt::DecorationRole).value<QIcon>().isNull());
    // Units in the headers.
    QVERIFY(m.headerData(BalanceSheetModel::column(Column::Biomass), Qt::Horizontal).toString().contains("t wet weight/km²"));
    QVERIFY(m.headerData(BalanceSheetModel::column(Column::Production), Qt::Horizontal).toString().contains("/year"));
}

void BalanceSheetTest::statusNamesTheProblem()
{
    tl::Model model = readModel(fixture("pond"));
    // Make Pike's predators eat more than it produces: its EE must come out above 1.
    const auto pike = *model.indexOf("Pike");
    model.compartment(pike).value(tl::Param::Biomass) = 0.05;
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    BalanceSheetModel m;
    m.setScenario(model, sheet);
    const int r = rowOf(m, "Pike");
    bool pikeProblem = false;
    for (const auto& p : sheet.problems) pikeProblem |= p.compartment == "Pike";
    QVERIFY(pikeProblem);
    QVERIFY(m.worstSeverity(r).has_value());
    const QString status = m.index(r, BalanceSheetModel::column(Column::Status)).data().toString();
    QVERIFY2(status != "OK" && !status.isEmpty(), qPrintable(status));
    QVERIFY(!m.index(r, BalanceSheetModel::column(Column::Status)).data(Qt::DecorationRole).value<QIcon>().isNull());
    const int phyto = rowOf(m, "Phytoplankton");
    if (!m.worstSeverity(phyto)) QCOMPARE(m.index(phyto, BalanceSheetModel::column(Column::Status)).data().toString(), QString("OK"));
}

void BalanceSheetTest::sortsNumbersWithEmptyCellsLast()
{
    const tl::Model model = readModel(fixture("invented_lake"));
    BalanceSheetPage page;
    page.setScenario(model, tl::solveBalance(model));
    for (Qt::SortOrder order : {Qt::AscendingOrder, Qt::DescendingOrder}) {
        const int col = BalanceSheetModel::column(Column::QbIn);  // empty for producers, detritus, Smelt
        page.table()->sortByColumn(col, order);
        auto* f = page.filter();
        bool seenEmpty = false;
        double previous = order == Qt::AscendingOrder ? -INFINITY : INFINITY;
        for (int r = 0; r < f->rowCount(); ++r) {
            const double v = f->index(r, col).data(BalanceSheetModel::kValueRole).toDouble();
            if (std::isnan(v)) {
                seenEmpty = true;
                continue;
            }
            QVERIFY2(!seenEmpty, "a number after an empty cell");
            QVERIFY(order == Qt::AscendingOrder ? v >= previous : v <= previous);
            previous = v;
        }
        QVERIFY(seenEmpty);
    }
}

void BalanceSheetTest::filtersByNameKindAndProblems()
{
    const tl::Model model = readModel(fixture("invented_lake"));
    BalanceSheetPage page;
    page.setScenario(model, tl::solveBalance(model));
    auto* f = page.filter();
    QCOMPARE(f->rowCount(), static_cast<int>(model.size()));
    f->setNameFilter("PIKE");
    QCOMPARE(f->rowCount(), 2);  // Pike, Pikeperch
    f->setNameFilter("");
    f->setKindFilter(tl::CompartmentKind::Detritus);
    QCOMPARE(f->rowCount(), 2);
    f->setKindFilter(tl::CompartmentKind::Producer);
    QCOMPARE(f->rowCount(), 2);
    f->setKindFilter(std::nullopt);
    f->setProblemsOnly(true);
    int withProblems = 0;
    for (int r = 0; r < page.sheetModel()->rowCount(); ++r) withProblems += page.sheetModel()->worstSeverity(r) ? 1 : 0;
    QCOMPARE(f->rowCount(), withProblems);
}

void BalanceSheetTest::copiesTabSeparatedText()
{
    const tl::Model model = readModel(fixture("pond"));
    BalanceSheetPage page;
    page.setScenario(model, tl::solveBalance(model));
    page.table()->selectRow(1);
    page.copy();
    const QStringList lines = QApplication::clipboard()->text().split('\n', Qt::SkipEmptyParts);
    QCOMPARE(lines.size(), 2);  // header + the selected row
    QCOMPARE(lines[0].split('\t').size(), BalanceSheetModel::column(Column::Count));
    const QStringList cells = lines[1].split('\t');
    QCOMPARE(cells.size(), BalanceSheetModel::column(Column::Count));
    QCOMPARE(cells[0], QString::fromStdString(model.compartment(1).name));
    QVERIFY(lines[0].contains("B [t wet weight/km²]"));
    // Full precision: the copied biomass reads back to the exact double.
    const double b = cells[BalanceSheetModel::column(Column::Biomass)].toDouble();
    QCOMPARE(b, page.sheetModel()->sheet().rows[1].biomass);
    page.table()->clearSelection();
    QCOMPARE(page.selectionAsText().count('\n'), static_cast<int>(model.size()) + 1);  // no selection: all rows
}

void BalanceSheetTest::exportsCsvWithQuotingAndUnits()
{
    tl::Model model = readModel(fixture("pond"));
    model.compartment(2).name = "Benthic invertebrates, \"mixed\"";
    BalanceSheetPage page;
    page.setScenario(model, tl::solveBalance(model));
    QTemporaryDir dir;
    const QString path = dir.filePath("sheet.csv");
    QString error;
    QVERIFY2(page.exportCsv(path, &error), qPrintable(error));
    QFile file(path);
    QVERIFY(file.open(QIODevice::ReadOnly));
    const QString text = QString::fromUtf8(file.readAll());
    QVERIFY(text.contains("\"Benthic invertebrates, \"\"mixed\"\"\""));
    QVERIFY(text.startsWith("Compartment,Kind,Status,B (input) [t wet weight/km²]"));
    QCOMPARE(text.count('\n'), static_cast<int>(model.size()) + 1);
}

void BalanceSheetTest::exportToAnUnwritablePathSaysWhy()
{
    const tl::Model model = readModel(fixture("pond"));
    BalanceSheetPage page;
    page.setScenario(model, tl::solveBalance(model));
    QString error;
    QVERIFY(!page.exportCsv("/nonexistent-folder/sheet.csv", &error));
    QVERIFY2(error.contains("/nonexistent-folder/sheet.csv"), qPrintable(error));
}

QTEST_MAIN(BalanceSheetTest)
#include "balance_sheet_model_test.moc"
