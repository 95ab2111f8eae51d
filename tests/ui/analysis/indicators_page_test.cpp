// Indicators page (ui/analysis/indicators_page.h, indicator_rows.h). Every indicator the
// page lists must carry a unit and a definition and hold exactly the core's value
// (core/network/indicators.h, level_decomposition.h); the keystone bars (Libralato et al.
// 2006, core/network/keystone.h) must run from the highest index down; the copied text
// and the exported chart must hold what is shown.
// Set TL_ANALYSIS_SNAPSHOT_DIR to also save a screenshot and the chart for a look.
#include <QSet>
#include <QStandardItemModel>
#include <QTemporaryDir>
#include <QtTest>
#include <algorithm>
#include <cmath>
#include <map>
#include <qcustomplot.h>

#include "core/balance/solver.h"
#include "core/io/csv_model.h"
#include "core/network/flow_network.h"
#include "core/network/indicators.h"
#include "core/network/keystone.h"
#include "core/network/level_decomposition.h"
#include "core/network/mixed_trophic_impact.h"
#include "ui/analysis/analysis_pages.h"
#include "ui/analysis/indicators_page.h"
#include "ui/style/palette.h"
#include "tests/support/network_models.h"
#include "tests/support/test_support.h"

using namespace tl::ui;

namespace {

tl::Model readModel(const char* name) { return tl::testing::fixtureModel(std::string("analysis/") + name); }

bool same(double a, double b) { return (std::isnan(a) && std::isnan(b)) || a == b; }

}  // namespace

class IndicatorsTest : public QObject {
    Q_OBJECT
private slots:
    void everyIndicatorHasUnitDefinitionAndTheCoreValue();
    void tableShowsTheRows();
    void keystoneBarsRunFromHighestDown();
    void copiedTextHoldsEveryRowAndTheNotice();
    void factoryGivesBothPagesWithStableKeys();
    void unsolvableScenarioShowsNoFigures();
    void pngExportIsNotBlank();
};

void IndicatorsTest::everyIndicatorHasUnitDefinitionAndTheCoreValue()
{
    const auto [model, sheet, net] = tl::testing::solvedScenario(readModel("invented_lake"));
    IndicatorsPage page;
    page.setScenario(model, sheet);
    const tl::SystemIndicators s = tl::systemIndicators(model, sheet, net);
    const tl::LevelDecomposition levels = tl::decomposeLevels(net);
    const std::map<QString, double> expected = {
        {"tst", s.tst}, {"tstp", s.tstp}, {"boundary_input", s.boundaryInput},
        {"total_primary_production", s.totalPrimaryProduction}, {"total_respiration", s.totalRespiration},
        {"tpp_over_r", s.tppOverR}, {"tpp_over_b", s.tppOverB}, {"total_biomass", s.totalLivingBiomass},
        {"links", static_cast<double>(s.links)}, {"connectance", s.connectance}, {"system_omnivory", s.systemOmnivory},
        {"fci", s.fci}, {"apl", s.apl}, {"ami", s.ami}, {"ascendency", s.ascendency}, {"capacity", s.capacity},
        {"overhead", s.overhead}, {"mean_te", levels.combined.meanTe}, {"total_catch", s.totalCatch},
        {"catch_ppr", s.catchPpr}, {"catch_ppr_share_of_tpp", s.catchPprShareOfTpp}, {"catch_mean_tl", s.catchMeanTl},
        {"food_web_connectance", s.foodWebConnectance}, {"omnivory_intake_weighted", s.omnivoryIntakeWeighted},
        {"primary_production_consumed", levels.primaryProductionConsumed},
        {"detritus_inflow_consumed", levels.detritusInflowConsumed}, {"catch_ppr_producers_only", s.catchPprProducersOnly},
        {"catch_ppr_producers_only_share_of_tpp", s.catchPprProducersOnlyShare},
        {"catch_mean_tl_with_discards", s.catchMeanTlWithDiscards}};
    QCOMPARE(page.rows().size(), expected.size());
    QSet<QString> seen;
    for (const IndicatorRow& r : page.rows()) {
        QVERIFY2(expected.count(r.key), qPrintable(r.key));
        QVERIFY2(same(r.value, expected.at(r.key)), qPrintable(r.key));
        QVERIFY2(!r.unit.isEmpty() && !r.definition.isEmpty() && !r.name.isEmpty(), qPrintable(r.key));
        // Written for users: a published source or "common practice" / "this program's
        // definition", never a developer's file, section or symbol (issue 13, item 15).
        QVERIFY2(r.definition.contains(QRegularExpression("\\(.*(19|20)\\d\\d|common practice|this program's")),
                 qPrintable(r.key));
        QVERIFY2(!r.definition.contains(QRegularExpression("DESIGN|\\.md\\b|::|\\b3\\.\\d\\b")),
                 qPrintable(r.key + ": " + r.definition));
        seen.insert(r.key);
    }
    QCOMPARE(seen.size(), static_cast<qsizetype>(expected.size()));
    // The fixture fishes, so the catch figures are defined and positive.
    QVERIFY(s.totalCatch > 0 && s.catchPpr > 0 && s.catchMeanTl > 2);
    // Units come from the model's Units.
    const auto unitOf = [&](const char* key) {
        for (const IndicatorRow& r : page.rows())
            if (r.key == key) return r.unit;
        return QString();
    };
    QCOMPARE(unitOf("tst"), QString::fromStdString(model.units.flow()));
    QCOMPARE(unitOf("total_biomass"), QString::fromStdString(model.units.biomass()));
    QCOMPARE(unitOf("tpp_over_b"), QString::fromStdString(model.units.rate()));
    QCOMPARE(unitOf("ami"), QString("bits"));
    QVERIFY(unitOf("ascendency").endsWith("bits"));
    QCOMPARE(page.noticeText(), decisionSupportNotice());
}

void IndicatorsTest::tableShowsTheRows()
{
    const tl::Model model = readModel("invented_lake");
    IndicatorsPage page;
    page.setScenario(model, tl::solveBalance(model));
    const QStandardItemModel& t = *page.tableModel();
    QCOMPARE(t.rowCount(), static_cast<int>(page.rows().size()));
    QCOMPARE(t.columnCount(), static_cast<int>(IndicatorsPage::ColumnCount));
    for (int r = 0; r < t.rowCount(); ++r) {
        const IndicatorRow& row = page.rows()[static_cast<std::size_t>(r)];
        QCOMPARE(t.item(r, IndicatorsPage::NameColumn)->text(), row.name);
        QVERIFY(same(t.item(r, IndicatorsPage::ValueColumn)->data(IndicatorsPage::ValueRole).toDouble(), row.value));
        QCOMPARE(t.item(r, IndicatorsPage::ValueColumn)->text(), displayIndicatorValue(row));
        QCOMPARE(t.item(r, IndicatorsPage::UnitColumn)->text(), row.unit);
        QCOMPARE(t.item(r, IndicatorsPage::DefinitionColumn)->text(), row.definition);
        // The shown value is the exact one rounded to 4 significant figures at most.
        if (std::isfinite(row.value) && row.value != 0)
            QVERIFY(std::abs(displayIndicatorValue(row).toDouble() - row.value) <= 5e-4 * std::abs(row.value) + 1e-12);
    }
}

void IndicatorsTest::keystoneBarsRunFromHighestDown()
{
    const auto [model, sheet, net] = tl::testing::solvedScenario(readModel("invented_lake"));
    IndicatorsPage page;
    page.setScenario(model, sheet);
    const auto ks = tl::keystoneIndices(net, tl::mixedTrophicImpact(net));

    // What the page lists: the core's values, highest first, at descending bar positions.
    const auto& bars = page.keystoneBars();
    QCOMPARE(bars.size(), ks.size());  // every living compartment has a finite index here
    for (std::size_t b = 0; b < bars.size(); ++b) {
        if (b > 0) {
            QVERIFY(bars[b - 1].keystoneIndex >= bars[b].keystoneIndex);
            QVERIFY(bars[b - 1].position > bars[b].position);
        }
        const auto it = std::find_if(ks.begin(), ks.end(), [&](const tl::KeystoneEntry& k) { return k.rank == int(b) + 1; });
        QVERIFY(it != ks.end());
        QCOMPARE(bars[b].name, QString::fromStdString(net.names[it->node]));
        QCOMPARE(bars[b].keystoneIndex, it->keystoneIndex);
    }

    // What the plot draws: read the bars back, top (largest key) to bottom.
    std::vector<std::pair<double, double>> drawn;  // key, value
    for (int p = 0; p < page.plot()->plottableCount(); ++p) {
        auto* series = qobject_cast<QCPBars*>(page.plot()->plottable(p));
        QVERIFY(series);
        for (auto it = series->data()->constBegin(); it != series->data()->constEnd(); ++it) drawn.push_back({it->key, it->value});
        // Coloured by kind with the shared palette.
        QVERIFY(series->brush().color() == kindColour(tl::CompartmentKind::Producer) ||
                series->brush().color() == kindColour(tl::CompartmentKind::Consumer));
    }
    QCOMPARE(drawn.size(), ks.size());
    std::sort(drawn.begin(), drawn.end(), [](auto a, auto b) { return a.first > b.first; });
    for (std::size_t b = 1; b < drawn.size(); ++b) QVERIFY(drawn[b - 1].second >= drawn[b].second);
    QCOMPARE(drawn.front().second, bars.front().keystoneIndex);
}

void IndicatorsTest::copiedTextHoldsEveryRowAndTheNotice()
{
    const tl::Model model = readModel("invented_lake");
    IndicatorsPage page;
    page.setScenario(model, tl::solveBalance(model));
    const QStringList lines = page.tabSeparatedText().split('\n', Qt::SkipEmptyParts);
    QCOMPARE(lines.size(), static_cast<qsizetype>(page.rows().size() + 2));
    for (qsizetype l = 0; l + 1 < lines.size(); ++l) QCOMPARE(lines[l].count('\t'), 3);
    for (std::size_t r = 0; r < page.rows().size(); ++r) {
        const QStringList cells = lines[static_cast<qsizetype>(r) + 1].split('\t');
        const IndicatorRow& row = page.rows()[r];
        QCOMPARE(cells[0], row.name);
        if (std::isfinite(row.value)) QCOMPARE(cells[1].toDouble(), row.value);  // full precision round-trips
        QCOMPARE(cells[2], row.unit);
    }
    QCOMPARE(lines.back(), decisionSupportNotice());
    page.copyToClipboard();
    QCOMPARE(QApplication::clipboard()->text(), page.tabSeparatedText());
}

void IndicatorsTest::factoryGivesBothPagesWithStableKeys()
{
    QWidget parent;
    const auto pages = createAnalysisPages(&parent);
    QCOMPARE(pages.size(), std::size_t{2});
    QCOMPARE(pages[0]->key(), QString("impact-matrix"));
    QCOMPARE(pages[1]->key(), QString("indicators"));
    for (auto* p : pages) QCOMPARE(p->parent(), &parent);
}

void IndicatorsTest::unsolvableScenarioShowsNoFigures()
{
    tl::Model model = readModel("invented_lake");
    for (auto p : {tl::Param::Biomass, tl::Param::PB, tl::Param::QB}) model.compartment(7).value(p).reset();  // Perch
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    QCOMPARE(sheet.status, tl::BalanceStatus::Invalid);
    IndicatorsPage page;
    page.setScenario(model, sheet);
    QVERIFY(page.rows().empty());
    QCOMPARE(page.tableModel()->rowCount(), 0);
    QVERIFY(page.keystoneBars().empty());
    QCOMPARE(page.plot()->plottableCount(), 0);
    // Then a solvable scenario again fills everything.
    const tl::Model good = readModel("invented_lake");
    page.setScenario(good, tl::solveBalance(good));
    QVERIFY(!page.rows().empty());
    QVERIFY(!page.keystoneBars().empty());
}

void IndicatorsTest::pngExportIsNotBlank()
{
    const tl::Model model = readModel("invented_lake");
    IndicatorsPage page;
    page.setScenario(model, tl::solveBalance(model));
    QTemporaryDir dir;
    const QString path = dir.filePath("keystone.png");
    const auto error = exportFigure(page, FigureFormat::Png, path, FigureOptions{96, {}});
    QVERIFY2(!error, error ? qPrintable(*error) : "");
    const QImage image(path);
    QVERIFY(!image.isNull());
    const QColor consumer = kindColour(tl::CompartmentKind::Consumer);
    int bar = 0, dark = 0;
    for (int y = 0; y < image.height(); y += 2)
        for (int x = 0; x < image.width(); x += 2) {
            const QColor c = image.pixelColor(x, y);
            bar += std::abs(c.red() - consumer.red()) + std::abs(c.green() - consumer.green()) +
                       std::abs(c.blue() - consumer.blue()) < 30;
            dark += c.lightness() < 60;
        }
    QVERIFY2(bar > 200 && dark > 100, qPrintable(QString("%1 %2").arg(bar).arg(dark)));

    // For a look (not a check): TL_ANALYSIS_SNAPSHOT_DIR=dir, optionally
    // TL_ANALYSIS_SNAPSHOT_MODEL=<CSV model folder> to show another scenario.
    if (const QByteArray out = qgetenv("TL_ANALYSIS_SNAPSHOT_DIR"); !out.isEmpty()) {
        const QByteArray folder = qgetenv("TL_ANALYSIS_SNAPSHOT_MODEL");
        const auto other = folder.isEmpty() ? std::nullopt : tl::readCsvModel(folder.toStdString()).model;
        const tl::Model& shown = other ? *other : model;
        IndicatorsPage snapshot;
        snapshot.setScenario(shown, tl::solveBalance(shown));
        const QString prefix = QString(out) + "/" + (other ? QFileInfo(QString(folder)).fileName() + "_" : QString());
        exportFigure(snapshot, FigureFormat::Png, prefix + "keystone_figure.png", FigureOptions{96, {}});
        snapshot.resize(1300, 900);
        snapshot.show();
        QTest::qWait(50);
        snapshot.grab().save(prefix + "indicators_page.png");
    }
}

QTEST_MAIN(IndicatorsTest)
#include "indicators_page_test.moc"
