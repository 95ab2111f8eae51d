// The CLI and the workbench give the same numbers for the same scenario because they
// call the same functions: the workbench opens a sample project through its document
// (core/store/model_source.h), solves it with its balance runner and analyses it with
// its analysis runner (tl::analyseNetwork underneath); `tledger network --json` reads,
// solves and analyses the same scenario and writes it with core/io/network_report.h.
// The JSON is parsed (nlohmann::json) and compared value by value. Numbers are written
// as the shortest text that reads back to the same double, so they must agree exactly.
#include <QtTest>
#include <cmath>
#include <memory>

#include "tests/support/test_support.h"
#include "ui/analysis/scenario_analysis.h"
#include "ui/document/project_document.h"
#include "ui/solve/balance_runner.h"

using namespace tl::ui;
using nlohmann::json;

namespace {

// JSON writes NaN and infinities as null.
bool sameNumber(const json& j, double v)
{
    if (j.is_null()) return !std::isfinite(v);
    return j.is_number() && j.get<double>() == v;
}

#define EXPECT_SAME(j, v, what)                                                                                  \
    QVERIFY2(sameNumber(j, v), qPrintable(QStringLiteral("%1: CLI %2, GUI %3")                                   \
                                              .arg(what, QString::fromStdString((j).dump()))                     \
                                              .arg(v, 0, 'g', 17)))

}  // namespace

class CliGuiAgreementTest : public QObject {
    Q_OBJECT
private slots:
    void sameNumbersForEveryScenario_data()
    {
        QTest::addColumn<QString>("project");
        QTest::newRow("reservoir") << QStringLiteral(TL_SAMPLES_DIR "/reservoir.tledger");
        QTest::newRow("lagoon") << QStringLiteral(TL_SAMPLES_DIR "/lagoon.tledger");
    }

    void sameNumbersForEveryScenario()
    {
        QFETCH(QString, project);
        ProjectDocument doc;
        QString error;
        QVERIFY2(doc.open(project, &error, true), qPrintable(error));
        QVERIFY(doc.project().scenarios.size() >= 2);
        for (int s = 0; s < int(doc.project().scenarios.size()); ++s) {
            doc.setCurrentIndex(s);
            const std::string name = doc.scenario().name;

            // The workbench's path: balance runner, then analysis runner (inline).
            const SolveOutcome solved = solveAndCheck(doc.model());
            AnalysisRunner runner;
            std::shared_ptr<const ScenarioAnalysis> gui;
            connect(&runner, &AnalysisRunner::finished, this,
                    [&](std::shared_ptr<const ScenarioAnalysis> a) { gui = std::move(a); });
            runner.setInlineLimit(1000);
            runner.start(doc.model(), solved.sheet);
            QVERIFY(gui && gui->available());

            // The CLI's path.
            const tl::testing::CliRun run = tl::testing::runTledger(
                "network " + tl::testing::shellQuoted(project.toStdString()) + " --scenario " +
                tl::testing::shellQuoted(name) + " --json");
            QVERIFY2(run.exitCode == 0 || run.exitCode == 1, run.err.c_str());
            const json cli = run.json();

            QCOMPARE(QString::fromStdString(cli.at("status").get<std::string>()),
                     QString::fromStdString(std::string(tl::statusKey(solved.sheet.status))));
            const tl::SystemIndicators& s0 = gui->indicators;
            const std::pair<const char*, double> indicators[] = {
                {"tst", s0.tst},         {"tstp", s0.tstp},         {"boundary_input", s0.boundaryInput},
                {"fci", s0.fci},         {"apl", s0.apl},           {"ami", s0.ami},
                {"ascendency", s0.ascendency}, {"capacity", s0.capacity}, {"overhead", s0.overhead},
                {"connectance", s0.connectance}, {"total_catch", s0.totalCatch}, {"catch_ppr", s0.catchPpr},
                {"catch_mean_tl", s0.catchMeanTl}, {"system_omnivory", s0.systemOmnivory},
                {"mean_te", gui->levels.combined.meanTe}};
            for (const auto& [key, value] : indicators) EXPECT_SAME(cli.at(key), value, QString::fromLatin1(key));
            QCOMPARE(cli.at("links").get<std::size_t>(), s0.links);

            // Trophic levels per compartment, in order.
            const json& names = cli.at("compartments");
            QCOMPARE(names.size(), gui->network.size());
            for (std::size_t i = 0; i < gui->network.size(); ++i) {
                QCOMPARE(QString::fromStdString(names[i].get<std::string>()),
                         QString::fromStdString(gui->network.names[i]));
                EXPECT_SAME(cli.at("tl").at(names[i].get<std::string>()), gui->tl[i], QString::fromStdString(name));
            }
            // Level decomposition.
            const json& levels = cli.at("levels");
            QCOMPARE(levels.size(), gui->levels.combined.levels.size());
            for (std::size_t k = 0; k < levels.size(); ++k) {
                EXPECT_SAME(levels[k].at("throughput"), gui->levels.combined.levels[k].throughput, "level throughput");
                EXPECT_SAME(levels[k].at("te"), gui->levels.combined.levels[k].te, "level TE");
            }
            // Mixed trophic impact, every cell.
            const json& values = cli.at("mti").at("values");
            QCOMPARE(Eigen::Index(values.size()), gui->mti.total.rows());
            for (Eigen::Index i = 0; i < gui->mti.total.rows(); ++i)
                for (Eigen::Index j = 0; j < gui->mti.total.cols(); ++j)
                    EXPECT_SAME(values[std::size_t(i)][std::size_t(j)], gui->mti.total(i, j), "MTI cell");
            // Keystone indices.
            const json& keystone = cli.at("keystone");
            QCOMPARE(keystone.size(), gui->keystone.size());
            for (std::size_t k = 0; k < keystone.size(); ++k) {
                EXPECT_SAME(keystone[k].at("keystone_index"), gui->keystone[k].keystoneIndex, "keystone index");
                QCOMPARE(keystone[k].at("rank").get<int>(), gui->keystone[k].rank);
            }
        }
    }
};

QTEST_MAIN(CliGuiAgreementTest)
#include "cli_gui_agreement_test.moc"
