// Level bars page (ui/results/level_bars_page.h, level_bars_data.h). The stacks must
// hold the core's level decomposition (core/network/level_decomposition.h): each
// level's segments add up to the core's figure for that level, and the levels add up
// to the system totals (total throughflow, total biomass), since each compartment's
// level shares sum to one (Ulanowicz 1995).
#include <QtTest>
#include <cmath>
#include <qcustomplot.h>

#include "core/balance/solver.h"
#include "core/io/csv_model.h"
#include "core/network/flow_network.h"
#include "core/network/level_decomposition.h"
#include "ui/results/level_bars_page.h"
#include "tests/support/test_support.h"

using namespace tl::ui;

namespace {

tl::Model readModel(const char* name) { return tl::testing::fixtureModel(std::string("results/") + name); }

bool close(double a, double b, double rel = 1e-9) { return std::abs(a - b) <= rel * std::max({1.0, std::abs(a), std::abs(b)}); }

double segmentSum(const LevelStack& s)
{
    double sum = 0;
    for (const auto& seg : s.segments) sum += seg.value;
    return sum;
}

}  // namespace

class LevelBarsTest : public QObject {
    Q_OBJECT
private slots:
    void stacksEqualTheCoreDecomposition_data();
    void stacksEqualTheCoreDecomposition();
    void chainsFromProducersAndDetritusAddUpToCombined();
    void drawsOneRectanglePerSegmentAndHoverNamesIt();
    void logScaleKeepsSharesWithinEachBar();
    void unsolvedScenarioShowsWhyInsteadOfBars();
    void romanNumerals();
    void narrowSegmentsAreNamedOutsideTheirBar();
};

// Issue 13, item 9: a segment too narrow for its name gets it just above its bar (under
// the lowest bar only), clear of every bar and every other name; the legend sits in a
// row of its own, off the bars and their values.
void LevelBarsTest::narrowSegmentsAreNamedOutsideTheirBar()
{
    const tl::Model model = readModel("invented_lake");
    LevelBarsPage page;
    page.setScenario(model, tl::solveBalance(model));
    page.resize(900, 620);
    page.show();
    QVERIFY(QTest::qWaitForWindowExposed(&page));
    QTRY_VERIFY(!page.segmentLabels().empty());
    const std::vector<QRectF> bars = page.segmentPixelRects();
    const auto& labels = page.segmentLabels();
    int outside = 0, narrow = 0;
    const QFontMetricsF fm(QFont(page.font().family(), 8));
    for (const QRectF& b : bars) narrow += b.width() < 30;
    double lowestTop = -1e9;
    for (const QRectF& b : bars) lowestTop = std::max(lowestTop, b.top());
    for (std::size_t i = 0; i < labels.size(); ++i) {
        const auto& l = labels[i];
        QVERIFY2(l.segment < bars.size(), qPrintable(QString("label %1 of segment %2, %3 segments").arg(l.name).arg(l.segment).arg(bars.size())));
        const QRectF own = bars[l.segment];
        for (std::size_t k = 0; k < bars.size(); ++k)
            if (k != l.segment || l.outside) QVERIFY2(!bars[k].intersects(l.pixels), qPrintable(l.name));
        for (std::size_t j = i + 1; j < labels.size(); ++j)
            QVERIFY2(!labels[j].pixels.intersects(l.pixels), qPrintable(l.name + " / " + labels[j].name));
        QVERIFY2(std::abs(l.pixels.center().x() - own.center().x()) < 1.0, qPrintable(l.name));
        if (!l.outside) {
            QVERIFY(own.contains(l.pixels));
            continue;
        }
        ++outside;
        const bool above = std::abs(l.pixels.bottom() - (own.top() - 2)) < 1.0;
        const bool belowLowest = std::abs(l.pixels.top() - (own.bottom() + 2)) < 1.0 && own.top() == lowestTop;
        QVERIFY2(above || belowLowest, qPrintable(l.name));
        QVERIFY2(fm.horizontalAdvance(l.name) + 6 > own.width(), qPrintable(l.name));  // only when it does not fit inside
    }
    QVERIFY2(narrow > 0, "the fixture should have narrow segments");
    QVERIFY2(outside > 0, qPrintable(QString("%1 narrow segments, none named outside").arg(narrow)));
    QCustomPlot* plot = page.plot();
    QVERIFY(plot->legend->visible());
    QVERIFY(!plot->axisRect()->rect().intersects(plot->legend->outerRect()));
}

void LevelBarsTest::stacksEqualTheCoreDecomposition_data()
{
    QTest::addColumn<QString>("fixture");
    QTest::addColumn<int>("quantity");
    for (const char* f : {"pond", "invented_lake"})
        for (int q = 0; q < 3; ++q)
            QTest::newRow(qPrintable(QString("%1 quantity %2").arg(f).arg(q))) << QString(f) << q;
}

void LevelBarsTest::stacksEqualTheCoreDecomposition()
{
    QFETCH(QString, fixture);
    QFETCH(int, quantity);
    const tl::Model model = readModel(qPrintable(fixture));
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    QVERIFY(sheet.status != tl::BalanceStatus::Invalid);
    LevelBarsPage page;
    page.setScenario(model, sheet);
    page.setQuantity(static_cast<LevelQuantity>(quantity));

    const tl::FlowNetwork net = tl::buildFlowNetwork(model, sheet);
    const tl::LevelDecomposition dec = tl::decomposeLevels(net);
    const LevelBarsData& data = page.data();
    QVERIFY(!data.stacks.empty());
    QVERIFY(data.stacks.size() + static_cast<std::size_t>(data.droppedLevels) == dec.combined.levels.size());
    double systemTotal = 0;
    for (std::size_t j = 0; j < net.size(); ++j) {
        const double v = quantity == 0 ? net.throughflow(j) : quantity == 1 ? net.stocks[j] : net.production[j];
        if (std::isfinite(v)) systemTotal += v;
    }
    for (std::size_t k = 0; k < data.stacks.size(); ++k) {
        const LevelStack& s = data.stacks[k];
        const tl::TrophicLevelBin& bin = dec.combined.levels[k];
        const double core = quantity == 0 ? bin.throughput : quantity == 1 ? bin.biomass : bin.production;
        QCOMPARE(s.level, static_cast<int>(k) + 1);
        QVERIFY2(close(s.total, core), qPrintable(QString("level %1: %2 vs core %3").arg(k + 1).arg(s.total).arg(core)));
        QVERIFY2(close(segmentSum(s), core, 1e-8),
                 qPrintable(QString("level %1: segments %2 vs core %3").arg(k + 1).arg(segmentSum(s)).arg(core)));
        if (std::isfinite(bin.te)) QVERIFY(close(s.te, bin.te));
    }
    QVERIFY2(close(data.grandTotal, systemTotal, 1e-8),
             qPrintable(QString("levels sum to %1, system total %2").arg(data.grandTotal).arg(systemTotal)));
}

void LevelBarsTest::chainsFromProducersAndDetritusAddUpToCombined()
{
    const tl::Model model = readModel("invented_lake");
    LevelBarsPage page;
    page.setScenario(model, tl::solveBalance(model));
    page.setChains(LevelChains::FromProducers);
    const double producers = page.data().grandTotal;
    page.setChains(LevelChains::FromDetritus);
    const double detritus = page.data().grandTotal;
    page.setChains(LevelChains::Combined);
    QVERIFY(producers > 0 && detritus > 0);
    QVERIFY2(close(producers + detritus, page.data().grandTotal, 1e-8),
             qPrintable(QString("%1 + %2 vs %3").arg(producers).arg(detritus).arg(page.data().grandTotal)));
}

void LevelBarsTest::drawsOneRectanglePerSegmentAndHoverNamesIt()
{
    const tl::Model model = readModel("invented_lake");
    LevelBarsPage page;
    page.resize(900, 600);
    page.setScenario(model, tl::solveBalance(model));
    page.show();
    QVERIFY(QTest::qWaitForWindowExposed(&page));
    QCoreApplication::processEvents();
    std::size_t segments = 0;
    for (const auto& s : page.data().stacks) segments += s.segments.size();
    int rects = 0;
    for (int i = 0; i < page.plot()->itemCount(); ++i)
        rects += qobject_cast<QCPItemRect*>(page.plot()->item(i)) ? 1 : 0;
    QCOMPARE(rects, static_cast<int>(segments));
    // Level I is centred on 0: its first segment starts at -total/2 in linear mode.
    const LevelStack& first = page.data().stacks.front();
    const QString tip = page.segmentToolTip(-first.total / 2 + first.segments.front().value / 2, 1.0);
    QVERIFY2(tip.contains(QString::fromStdString(model.compartment(first.segments.front().node).name)), qPrintable(tip));
    QVERIFY(tip.contains("%"));
    QVERIFY(page.segmentToolTip(first.total, 1.0).isEmpty());  // beyond the bar
}

void LevelBarsTest::logScaleKeepsSharesWithinEachBar()
{
    const tl::Model model = readModel("invented_lake");
    LevelBarsPage page;
    page.setScenario(model, tl::solveBalance(model));
    page.setLogScale(true);
    page.show();
    QVERIFY(QTest::qWaitForWindowExposed(&page));
    QCoreApplication::processEvents();
    QVERIFY(page.logScale());
    for (const auto& s : page.data().stacks) {
        double shares = 0;
        for (const auto& seg : s.segments) shares += seg.share;
        QVERIFY(close(shares, 1.0, 1e-8));
    }
    // Hover still finds the compartment at the centre of level II's first segment.
    const LevelStack& two = page.data().stacks.at(1);
    double minPositive = INFINITY;
    for (const auto& s : page.data().stacks) if (s.total > 0) minPositive = std::min(minPositive, s.total);
    const double length = std::log10(two.total) - (std::floor(std::log10(minPositive)) - 1.0);
    const QString tip = page.segmentToolTip(-length / 2 + length * two.segments.front().share / 2, 2.0);
    QVERIFY2(tip.contains(QString::fromStdString(model.compartment(two.segments.front().node).name)), qPrintable(tip));
}

void LevelBarsTest::unsolvedScenarioShowsWhyInsteadOfBars()
{
    tl::Model model = readModel("pond");
    model.compartment(*model.indexOf("Pike")).value(tl::Param::Biomass).reset();  // B and EE unknown: under-determined
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    QCOMPARE(sheet.status, tl::BalanceStatus::Invalid);
    LevelBarsPage page;
    page.setScenario(model, sheet);
    page.show();
    QVERIFY(QTest::qWaitForWindowExposed(&page));
    QVERIFY(page.data().stacks.empty());
    QVERIFY(!page.unavailableReason().isEmpty());
}

void LevelBarsTest::romanNumerals()
{
    QCOMPARE(romanNumeral(1), QString("I"));
    QCOMPARE(romanNumeral(4), QString("IV"));
    QCOMPARE(romanNumeral(9), QString("IX"));
    QCOMPARE(romanNumeral(14), QString("XIV"));
    QCOMPARE(romanNumeral(30), QString("XXX"));
}

QTEST_MAIN(LevelBarsTest)
#include "level_bars_page_test.moc"
