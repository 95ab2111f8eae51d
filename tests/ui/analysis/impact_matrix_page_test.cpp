// Impact matrix page (ui/analysis/impact_matrix_page.h, impact_matrix_model.h,
// impact_colour_map.h). The table must hold exactly the core's mixed trophic impact
// matrix (core/network/mixed_trophic_impact.h, Ulanowicz & Puccia 1990) with the fleets
// as the last rows, whatever the row order; colours must follow the purple (negative) –
// white (0) – green (positive) map; the exported figure must not be blank.
// Set TL_ANALYSIS_SNAPSHOT_DIR to also save a screenshot and the figure for a look.
#include <QSignalSpy>
#include <QTableView>
#include <QTemporaryDir>
#include <QtTest>
#include <cmath>

#include "core/balance/solver.h"
#include "core/io/csv_model.h"
#include "core/network/flow_network.h"
#include "core/network/keystone.h"
#include "core/network/mixed_trophic_impact.h"
#include "ui/analysis/impact_colour_map.h"
#include "ui/analysis/impact_matrix_page.h"
#include "tests/support/test_support.h"

using namespace tl::ui;

namespace {

tl::Model readModel(const char* name) { return tl::testing::fixtureModel(std::string("analysis/") + name); }

bool purpleish(const QColor& c) { return c.red() > c.green() + 8 && c.blue() > c.green() + 8; }
bool greenish(const QColor& c) { return c.green() > c.red() + 8 && c.green() > c.blue() + 8; }

// Checks every cell of the page's model against the core's matrix.
void compareWithCore(const ImpactMatrixModel& m, const tl::MixedTrophicImpact& core)
{
    QCOMPARE(m.rowCount(), static_cast<int>(core.names.size()));
    QCOMPARE(m.columnCount(), static_cast<int>(core.names.size()));
    for (int r = 0; r < m.rowCount(); ++r) {
        const std::size_t i = m.matrixRow(r);
        QCOMPARE(m.headerData(r, Qt::Vertical, Qt::DisplayRole).toString(), QString::fromStdString(core.names[i]));
        for (int c = 0; c < m.columnCount(); ++c) {
            const double expected = core.total(static_cast<Eigen::Index>(i), c);
            QCOMPARE(m.data(m.index(r, c), ImpactMatrixModel::ValueRole).toDouble(), expected);  // exact: same numbers
        }
    }
}

}  // namespace

class ImpactMatrixTest : public QObject {
    Q_OBJECT
private slots:
    void holdsTheCoreMatrixWithFleetsAsLastRows();
    void everyRowOrderKeepsValuesAndFleetsAtTheBottom();
    void keystoneOrderFollowsTheCoreRanking();
    void cellsShowTwoDecimalsAndBlankBelowThreshold();
    void colourMapIsPurpleWhiteGreen();
    void cellColoursFollowTheSign();
    void backgroundAnalysisGivesTheSameMatrix();
    void unsolvableScenarioSaysWhy();
    void pngExportIsNotBlank();
};

void ImpactMatrixTest::holdsTheCoreMatrixWithFleetsAsLastRows()
{
    const tl::Model model = readModel("invented_lake");
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    QVERIFY(sheet.status != tl::BalanceStatus::Invalid);
    ImpactMatrixPage page;
    page.setScenario(model, sheet);
    const tl::MixedTrophicImpact core = tl::mixedTrophicImpact(tl::buildFlowNetwork(model, sheet));
    QVERIFY(!core.singular);
    QCOMPARE(core.nodeCount, model.size());
    QCOMPARE(core.names.size(), model.size() + 2);  // two fleets in the fixture
    compareWithCore(*page.matrixModel(), core);
    const ImpactMatrixModel& m = *page.matrixModel();
    QCOMPARE(m.firstFleetRow(), static_cast<int>(model.size()));
    QCOMPARE(m.headerData(m.rowCount() - 2, Qt::Vertical, Qt::DisplayRole).toString(), QString("Gillnet"));
    QCOMPARE(m.headerData(m.rowCount() - 1, Qt::Vertical, Qt::DisplayRole).toString(), QString("Anglers"));
    QVERIFY(m.data(m.index(m.rowCount() - 1, 0), ImpactMatrixModel::IsFleetRole).toBool());
    QVERIFY(!m.data(m.index(0, 0), ImpactMatrixModel::IsFleetRole).toBool());
    QVERIFY(m.headerData(m.rowCount() - 1, Qt::Vertical, Qt::FontRole).value<QFont>().italic());
    QVERIFY(!m.headerData(m.rowCount() - 1, Qt::Vertical, Qt::ToolTipRole).toString().isEmpty());
    QVERIFY(!m.headerData(0, Qt::Horizontal, Qt::ToolTipRole).toString().isEmpty());
    QVERIFY(page.unavailableReason().isEmpty());
}

void ImpactMatrixTest::everyRowOrderKeepsValuesAndFleetsAtTheBottom()
{
    const tl::Model model = readModel("invented_lake");
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    ImpactMatrixPage page;
    page.setScenario(model, sheet);
    const tl::MixedTrophicImpact core = tl::mixedTrophicImpact(tl::buildFlowNetwork(model, sheet));
    for (auto order : {ImpactRowOrder::ByName, ImpactRowOrder::ByKeystoneIndex, ImpactRowOrder::ByOverallEffect,
                       ImpactRowOrder::AsEntered}) {
        page.setRowOrder(order);
        compareWithCore(*page.matrixModel(), core);
        const ImpactMatrixModel& m = *page.matrixModel();
        for (int r = 0; r < m.rowCount(); ++r) QCOMPARE(m.isFleet(m.matrixRow(r)), r >= static_cast<int>(core.nodeCount));
        if (order == ImpactRowOrder::ByName)
            for (int r = 1; r < static_cast<int>(core.nodeCount); ++r)
                QVERIFY(QString::localeAwareCompare(m.name(m.matrixRow(r - 1)), m.name(m.matrixRow(r))) <= 0);
        if (order == ImpactRowOrder::ByOverallEffect)
            for (int r = 1; r < static_cast<int>(core.nodeCount); ++r)
                QVERIFY(m.overallEffect(m.matrixRow(r - 1)) >= m.overallEffect(m.matrixRow(r)));
    }
}

void ImpactMatrixTest::keystoneOrderFollowsTheCoreRanking()
{
    const tl::Model model = readModel("invented_lake");
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    ImpactMatrixPage page;
    page.setScenario(model, sheet);
    page.setRowOrder(ImpactRowOrder::ByKeystoneIndex);
    const tl::FlowNetwork net = tl::buildFlowNetwork(model, sheet);
    const auto ks = tl::keystoneIndices(net, tl::mixedTrophicImpact(net));
    // Rank 1 first, then 2, ... (the core's ranking), then detritus pools (no index), then fleets.
    const ImpactMatrixModel& m = *page.matrixModel();
    std::vector<std::size_t> byRank(ks.size());
    for (const auto& k : ks) byRank[static_cast<std::size_t>(k.rank - 1)] = k.node;
    for (std::size_t r = 0; r < byRank.size(); ++r) QCOMPARE(m.matrixRow(static_cast<int>(r)), byRank[r]);
    QVERIFY(std::isnan(m.keystoneIndex(m.matrixRow(static_cast<int>(ks.size())))));  // a detritus pool next
}

void ImpactMatrixTest::cellsShowTwoDecimalsAndBlankBelowThreshold()
{
    const tl::Model model = readModel("invented_lake");
    ImpactMatrixPage page;
    page.setScenario(model, tl::solveBalance(model));
    const ImpactMatrixModel& m = *page.matrixModel();
    int blank = 0, written = 0;
    for (int r = 0; r < m.rowCount(); ++r)
        for (int c = 0; c < m.columnCount(); ++c) {
            const double v = m.value(r, c);
            const QString text = m.data(m.index(r, c), Qt::DisplayRole).toString();
            if (std::abs(v) < ImpactMatrixModel::kBlankBelow) {
                QVERIFY2(text.isEmpty(), qPrintable(text));
                ++blank;
            } else {
                QCOMPARE(text, QString::number(v, 'f', 2));
                QCOMPARE(text.section('.', 1).size(), 2);
                ++written;
            }
            QVERIFY(!m.data(m.index(r, c), Qt::ToolTipRole).toString().isEmpty());
        }
    QVERIFY(blank > 0);
    QVERIFY(written > 0);
}

void ImpactMatrixTest::colourMapIsPurpleWhiteGreen()
{
    QCOMPARE(impactColour(0.0, 1.0), QColor(Qt::white));
    QCOMPARE(impactColour(std::nan(""), 1.0), QColor(Qt::white));
    for (double v : {0.2, 0.5, 1.0, 3.0}) {  // 3.0: clamped to the end of the range
        QVERIFY2(purpleish(impactColour(-v, 1.0)), qPrintable(impactColour(-v, 1.0).name()));
        QVERIFY2(greenish(impactColour(v, 1.0)), qPrintable(impactColour(v, 1.0).name()));
    }
    // Stronger impacts are darker on both sides, and the map is symmetric in lightness.
    QVERIFY(impactColour(-0.9, 1.0).lightness() < impactColour(-0.3, 1.0).lightness());
    QVERIFY(impactColour(0.9, 1.0).lightness() < impactColour(0.3, 1.0).lightness());
    QCOMPARE(impactColour(0.5, 2.0), impactColour(0.25, 1.0));  // only value/range matters
    QCOMPARE(textColourOn(impactColour(-1.0, 1.0)), QColor(Qt::white));
    QCOMPARE(textColourOn(Qt::white), QColor(Qt::black));
}

void ImpactMatrixTest::cellColoursFollowTheSign()
{
    const tl::Model model = readModel("invented_lake");
    ImpactMatrixPage page;
    page.setScenario(model, tl::solveBalance(model));
    const ImpactMatrixModel& m = *page.matrixModel();
    QVERIFY(m.range() > 0);
    bool sawNegative = false, sawPositive = false;
    for (int r = 0; r < m.rowCount(); ++r)
        for (int c = 0; c < m.columnCount(); ++c) {
            const double v = m.value(r, c);
            const QColor colour = m.data(m.index(r, c), Qt::BackgroundRole).value<QBrush>().color();
            if (v < -0.25 * m.range()) {
                QVERIFY2(purpleish(colour), qPrintable(colour.name()));
                sawNegative = true;
            } else if (v > 0.25 * m.range()) {
                QVERIFY2(greenish(colour), qPrintable(colour.name()));
                sawPositive = true;
            } else if (v == 0) {
                QCOMPARE(colour, QColor(Qt::white));
            }
        }
    QVERIFY(sawNegative);
    QVERIFY(sawPositive);
}

void ImpactMatrixTest::backgroundAnalysisGivesTheSameMatrix()
{
    const tl::Model model = readModel("invented_lake");
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    ImpactMatrixPage page;
    page.runner()->setInlineLimit(0);  // force QtConcurrent
    QSignalSpy spy(page.runner(), &AnalysisRunner::finished);
    page.setScenario(model, sheet);
    page.setScenario(model, sheet);  // the first result is superseded and dropped
    QVERIFY(page.runner()->busy());
    QVERIFY(spy.wait(5000));
    QTRY_VERIFY(!page.runner()->busy());
    QCOMPARE(spy.count(), 1);
    compareWithCore(*page.matrixModel(), tl::mixedTrophicImpact(tl::buildFlowNetwork(model, sheet)));
}

void ImpactMatrixTest::unsolvableScenarioSaysWhy()
{
    tl::Model model = readModel("invented_lake");
    auto& perch = model.compartment(7);
    QCOMPARE(QString::fromStdString(perch.name), QString("Perch"));
    perch.values[static_cast<std::size_t>(tl::Param::Biomass)].reset();
    perch.values[static_cast<std::size_t>(tl::Param::PB)].reset();
    perch.values[static_cast<std::size_t>(tl::Param::QB)].reset();
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    QCOMPARE(sheet.status, tl::BalanceStatus::Invalid);
    ImpactMatrixPage page;
    page.setScenario(model, sheet);
    QCOMPARE(page.matrixModel()->rowCount(), 0);
    QVERIFY(page.unavailableReason().contains("could not be solved"));
}

void ImpactMatrixTest::pngExportIsNotBlank()
{
    const tl::Model model = readModel("invented_lake");
    ImpactMatrixPage page;
    page.setScenario(model, tl::solveBalance(model));
    QTemporaryDir dir;
    const QString path = dir.filePath("impact.png");
    const auto error = exportFigure(page, FigureFormat::Png, path, FigureOptions{96, {}});
    QVERIFY2(!error, error ? qPrintable(*error) : "");
    const QImage image(path);
    QVERIFY(!image.isNull());
    QCOMPARE(image.size(), page.figureSize());
    int purple = 0, green = 0, dark = 0;
    for (int y = 0; y < image.height(); y += 2)
        for (int x = 0; x < image.width(); x += 2) {
            const QColor c = image.pixelColor(x, y);
            purple += purpleish(c);
            green += greenish(c);
            dark += c.lightness() < 60;
        }
    QVERIFY2(purple > 100 && green > 100 && dark > 100, qPrintable(QString("%1 %2 %3").arg(purple).arg(green).arg(dark)));
    QVERIFY(!exportFigure(page, FigureFormat::Svg, dir.filePath("impact.svg")));
    QVERIFY(QFileInfo(dir.filePath("impact.svg")).size() > 1000);

    // For a look (not a check): TL_ANALYSIS_SNAPSHOT_DIR=dir, optionally
    // TL_ANALYSIS_SNAPSHOT_MODEL=<CSV model folder> to show another scenario.
    if (const QByteArray out = qgetenv("TL_ANALYSIS_SNAPSHOT_DIR"); !out.isEmpty()) {
        const QByteArray folder = qgetenv("TL_ANALYSIS_SNAPSHOT_MODEL");
        const auto other = folder.isEmpty() ? std::nullopt : tl::readCsvModel(folder.toStdString()).model;
        const tl::Model& shown = other ? *other : model;
        ImpactMatrixPage snapshot;
        snapshot.setScenario(shown, tl::solveBalance(shown));
        const QString prefix = QString(out) + "/" + (other ? QFileInfo(QString(folder)).fileName() + "_" : QString());
        exportFigure(snapshot, FigureFormat::Png, prefix + "impact_figure.png", FigureOptions{96, {}});
        snapshot.resize(1300, 800);
        snapshot.show();
        QTest::qWait(50);
        snapshot.grab().save(prefix + "impact_page.png");
    }
}

QTEST_MAIN(ImpactMatrixTest)
#include "impact_matrix_page_test.moc"
