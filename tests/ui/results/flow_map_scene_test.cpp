// Flow map (ui/results/flow_map_scene.h, flow_map_page.h): one box per compartment and
// fleet, one ribbon per non-zero flow of the core's flow network (plus each fleet's
// catch) above the threshold, no two boxes overlapping, hover highlighting of prey and
// predators, and box positions that can be read, restored and reset.
#include <QGraphicsItem>
#include <QSlider>
#include <QtTest>
#include <algorithm>
#include <cmath>

#include "core/balance/solver.h"
#include "core/io/csv_model.h"
#include "core/network/flow_network.h"
#include "ui/results/flow_map_page.h"
#include "tests/support/test_support.h"

using namespace tl::ui;

namespace {

tl::Model readModel(const char* name) { return tl::testing::fixtureModel(std::string("results/") + name); }

// Flows counted straight from the core's network and the model's harvest table.
std::vector<double> expectedFlows(const tl::Model& model, const tl::BalanceSheet& sheet)
{
    const tl::FlowNetwork net = tl::buildFlowNetwork(model, sheet);
    std::vector<double> flows;
    for (Eigen::Index i = 0; i < net.flows.rows(); ++i)
        for (Eigen::Index j = 0; j < net.flows.cols(); ++j)
            if (net.flows(i, j) > 0) flows.push_back(net.flows(i, j));
    for (const auto& fleet : model.fleets())
        for (std::size_t i = 0; i < model.size(); ++i) {
            const double dead = fleet.discards[i] * (1.0 - fleet.discardSurvival[i]);
            if (fleet.landings[i] + dead > 0) flows.push_back(fleet.landings[i] + dead);
        }
    return flows;
}

int movableItems(const QGraphicsScene& scene)
{
    int n = 0;
    for (const QGraphicsItem* item : scene.items()) n += (item->flags() & QGraphicsItem::ItemIsMovable) ? 1 : 0;
    return n;
}

}  // namespace

class FlowMapTest : public QObject {
    Q_OBJECT
private slots:
    void oneBoxPerCompartmentAndFleet_data();
    void oneBoxPerCompartmentAndFleet();
    void oneRibbonPerFlowAboveTheThreshold();
    void boxesDoNotOverlapAndDetritusIsAtTheBottom();
    void hoverKeepsPreyAndPredatorsBright();
    void positionsRoundTripAndSurviveARefresh();
    void sliderHidesSmallFlows();
    void unsolvedScenarioShowsWhy();
};

void FlowMapTest::oneBoxPerCompartmentAndFleet_data()
{
    QTest::addColumn<QString>("fixture");
    QTest::newRow("pond") << "pond";
    QTest::newRow("invented_lake") << "invented_lake";
}

void FlowMapTest::oneBoxPerCompartmentAndFleet()
{
    QFETCH(QString, fixture);
    const tl::Model model = readModel(qPrintable(fixture));
    FlowMapScene scene;
    scene.setScenario(model, tl::solveBalance(model));
    QVERIFY(scene.unavailableReason().isEmpty());
    QCOMPARE(scene.compartmentCount(), model.size());
    QCOMPARE(scene.nodes().size(), model.size() + model.fleets().size());
    QCOMPARE(movableItems(scene), static_cast<int>(model.size() + model.fleets().size()));
    for (std::size_t i = 0; i < model.size(); ++i) QCOMPARE(scene.nodes()[i].name, model.compartment(i).name);
}

void FlowMapTest::oneRibbonPerFlowAboveTheThreshold()
{
    const tl::Model model = readModel("invented_lake");
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    FlowMapScene scene;
    scene.setScenario(model, sheet);
    std::vector<double> flows = expectedFlows(model, sheet);
    QCOMPARE(scene.edges().size(), flows.size());
    QCOMPARE(scene.visibleRibbonCount(), static_cast<int>(flows.size()));
    std::sort(flows.begin(), flows.end());
    const double median = flows[flows.size() / 2];
    scene.setThreshold(median);
    const auto above = std::count_if(flows.begin(), flows.end(), [&](double f) { return f >= median; });
    QCOMPARE(scene.visibleRibbonCount(), static_cast<int>(above));
    scene.setThreshold(0);
    QCOMPARE(scene.visibleRibbonCount(), static_cast<int>(flows.size()));
    // Width follows log(flow): equal ratios of flow give equal steps of width.
    const double lo = scene.minFlow(), hi = scene.maxFlow();
    const double mid = std::sqrt(lo * hi);
    QVERIFY(std::abs((scene.ribbonWidth(mid) - scene.ribbonWidth(lo)) - (scene.ribbonWidth(hi) - scene.ribbonWidth(mid))) < 1e-9);
    QVERIFY(scene.ribbonWidth(hi) > scene.ribbonWidth(lo));
}

void FlowMapTest::boxesDoNotOverlapAndDetritusIsAtTheBottom()
{
    const tl::Model model = readModel("invented_lake");
    FlowMapScene scene;
    scene.setScenario(model, tl::solveBalance(model));
    const std::size_t n = scene.nodes().size();
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = i + 1; j < n; ++j)
            QVERIFY2(!scene.footprintRect(i).intersects(scene.footprintRect(j)),
                     qPrintable(QString::fromStdString(scene.nodes()[i].name + " / " + scene.nodes()[j].name)));
    double lowestLiving = -1e300, highestDetritus = 1e300;
    for (std::size_t i = 0; i < model.size(); ++i) {
        if (model.compartment(i).isLiving()) lowestLiving = std::max(lowestLiving, scene.footprintRect(i).bottom());
        else highestDetritus = std::min(highestDetritus, scene.boxRect(i).top());
    }
    QVERIFY(lowestLiving < highestDetritus);
    // Trophic level runs left to right: Pike (TL > 3) right of Zooplankton right of Phytoplankton.
    auto cx = [&](const char* name) { return scene.boxRect(*model.indexOf(name)).center().x(); };
    QVERIFY(cx("Phytoplankton") < cx("Zooplankton"));
    QVERIFY(cx("Zooplankton") < cx("Pike"));
}

void FlowMapTest::hoverKeepsPreyAndPredatorsBright()
{
    const tl::Model model = readModel("invented_lake");
    FlowMapScene scene;
    scene.setScenario(model, tl::solveBalance(model));
    const std::size_t zoo = *model.indexOf("Zooplankton");
    scene.highlight(zoo);
    for (const char* bright : {"Zooplankton", "Phytoplankton", "Sediment detritus", "Smelt", "Roach", "Perch"})
        QVERIFY2(!scene.isDimmed(*model.indexOf(bright)), bright);
    for (const char* dim : {"Pike", "Pikeperch", "Macrophytes", "Cormorants"})
        QVERIFY2(scene.isDimmed(*model.indexOf(dim)), dim);
    scene.highlight(std::nullopt);
    for (std::size_t i = 0; i < scene.nodes().size(); ++i) QVERIFY(!scene.isDimmed(i));
}

void FlowMapTest::positionsRoundTripAndSurviveARefresh()
{
    const tl::Model model = readModel("invented_lake");
    const tl::BalanceSheet sheet = tl::solveBalance(model);
    FlowMapScene scene;
    scene.setScenario(model, sheet);
    const auto laidOut = scene.positions();
    QCOMPARE(laidOut.size(), static_cast<qsizetype>(scene.nodes().size()));
    QVERIFY(laidOut.contains("Pike"));
    QVERIFY(laidOut.contains("fleet:Anglers"));
    scene.setPositions({{"Pike", QPointF(5000, 4000)}});
    QCOMPARE(scene.boxRect(*model.indexOf("Pike")).topLeft(), QPointF(5000, 4000));
    scene.setScenario(model, sheet);  // a re-solve after an edit keeps the user's placement
    QCOMPARE(scene.boxRect(*model.indexOf("Pike")).topLeft(), QPointF(5000, 4000));
    QCOMPARE(scene.positions().value("Pike"), QPointF(5000, 4000));
    scene.resetLayout();
    QCOMPARE(scene.positions().value("Pike"), laidOut.value("Pike"));
}

void FlowMapTest::sliderHidesSmallFlows()
{
    const tl::Model model = readModel("invented_lake");
    FlowMapPage page;
    page.setScenario(model, tl::solveBalance(model));
    const int all = page.scene()->visibleRibbonCount();
    page.thresholdSlider()->setValue(page.thresholdSlider()->maximum());
    QCOMPARE(page.scene()->visibleRibbonCount(), 1);  // only the largest flow reaches the top of the range
    QVERIFY(std::abs(page.scene()->threshold() - page.scene()->maxFlow()) <= 1e-9 * page.scene()->maxFlow());
    page.thresholdSlider()->setValue(0);
    QCOMPARE(page.scene()->visibleRibbonCount(), all);
}

void FlowMapTest::unsolvedScenarioShowsWhy()
{
    tl::Model model = readModel("pond");
    model.compartment(*model.indexOf("Pike")).value(tl::Param::Biomass).reset();
    FlowMapScene scene;
    scene.setScenario(model, tl::solveBalance(model));
    QVERIFY(!scene.unavailableReason().isEmpty());
    QCOMPARE(movableItems(scene), 0);
    QCOMPARE(scene.visibleRibbonCount(), 0);
}

QTEST_MAIN(FlowMapTest)
#include "flow_map_scene_test.moc"
