// Figure export (ui/results/figure_export.h): SVG that parses as XML and carries the
// names as text, PNG at the requested size and resolution and not blank, PDF, the
// offscreen renderer for the CLI, and clear messages for bad requests. With
// TL_SNAPSHOT_DIR set, also writes PNG snapshots of all three views there for a look.
#include <QDir>
#include <QFile>
#include <QImage>
#include <QTemporaryDir>
#include <QXmlStreamReader>
#include <QtTest>
#include <set>

#include "core/balance/solver.h"
#include "core/io/csv_model.h"
#include "ui/results/balance_sheet_page.h"
#include "ui/results/figure_export.h"
#include "ui/results/flow_map_page.h"
#include "ui/results/level_bars_page.h"
#include "tests/support/test_support.h"

using namespace tl::ui;

namespace {

tl::Model readModel(const char* name) { return tl::testing::fixtureModel(std::string("results/") + name); }

// All character data of an SVG file; fails the XML parse loudly.
QString svgText(const QString& path, QString* error)
{
    QFile file(path);
    if (!file.open(QIODevice::ReadOnly)) {
        *error = "cannot open " + path;
        return {};
    }
    QXmlStreamReader xml(&file);
    QString text;
    bool sawSvgRoot = false;
    while (!xml.atEnd()) {
        xml.readNext();
        if (xml.isStartElement() && xml.name() == QStringLiteral("svg")) sawSvgRoot = true;
        if (xml.isCharacters()) text += xml.text().toString() + QLatin1Char('\n');
    }
    if (xml.hasError()) *error = QString("XML error at line %1: %2").arg(xml.lineNumber()).arg(xml.errorString());
    else if (!sawSvgRoot) *error = "no <svg> element";
    return text;
}

// Share of pixels that are not (near) white, and the number of distinct colours.
std::pair<double, std::size_t> inkAndColours(const QImage& image)
{
    std::size_t ink = 0;
    std::set<QRgb> colours;
    for (int y = 0; y < image.height(); y += 2)
        for (int x = 0; x < image.width(); x += 2) {
            const QRgb p = image.pixel(x, y);
            if (qRed(p) < 235 || qGreen(p) < 235 || qBlue(p) < 235) ++ink;
            if (colours.size() < 1000) colours.insert(p & 0xF0F0F0);
        }
    return {double(ink) / (double(image.width() / 2) * double(image.height() / 2)), colours.size()};
}

}  // namespace

class FigureExportTest : public QObject {
    Q_OBJECT
private slots:
    void initTestCase();
    void flowMapSvgParsesAndNamesEveryBox();
    void levelBarsSvgParsesAndCarriesItsLabels();
    void pngHasTheRequestedSizeAndIsNotBlank_data();
    void pngHasTheRequestedSizeAndIsNotBlank();
    void pdfIsWritten();
    void cliRendererWritesTheRequestedView();
    void figuresNameTheirScenarioAndProject_data();
    void figuresNameTheirScenarioAndProject();
    void tledgerFiguresNameScenarioAndProject();
    void badRequestsSayWhatIsWrong();
    void snapshots();

private:
    tl::Model lake_;
    tl::BalanceSheet sheet_;
    QTemporaryDir dir_;
};

void FigureExportTest::initTestCase()
{
    lake_ = readModel("invented_lake");
    // A name that XML must escape, to make the parse check mean something.
    lake_.compartment(*lake_.indexOf("Roach")).name = "Roach & <rudd>";
    sheet_ = tl::solveBalance(lake_);
    QVERIFY(sheet_.status != tl::BalanceStatus::Invalid);
    QVERIFY(dir_.isValid());
}

void FigureExportTest::flowMapSvgParsesAndNamesEveryBox()
{
    FlowMapPage page;
    page.setScenario(lake_, sheet_);
    const QString path = dir_.filePath("flow.svg");
    const auto error = exportFigure(page, FigureFormat::Svg, path);
    QVERIFY2(!error, qPrintable(error.value_or("")));
    QString parseError;
    const QString text = svgText(path, &parseError);
    QVERIFY2(parseError.isEmpty(), qPrintable(parseError));
    for (const auto& c : lake_.compartments())
        QVERIFY2(text.contains(QString::fromStdString(c.name)), c.name.c_str());
    for (const auto& f : lake_.fleets()) QVERIFY2(text.contains(QString::fromStdString(f.name)), f.name.c_str());
    QVERIFY(text.contains("Trophic level"));
}

void FigureExportTest::levelBarsSvgParsesAndCarriesItsLabels()
{
    LevelBarsPage page;
    page.setScenario(lake_, sheet_);
    const QString path = dir_.filePath("levels.svg");
    const auto error = exportFigure(page, FigureFormat::Svg, path);
    QVERIFY2(!error, qPrintable(error.value_or("")));
    QString parseError;
    const QString text = svgText(path, &parseError);
    QVERIFY2(parseError.isEmpty(), qPrintable(parseError));
    QVERIFY2(text.contains(page.figureTitle()), qPrintable(text.left(400)));
    // No transfer efficiency at level I (producers and detritus together): the eaten shares.
    QVERIFY(!text.contains("TE I→II"));
    QVERIFY(text.contains("Level I has no transfer efficiency"));
    QVERIFY(text.contains("TE II→III"));
    for (const char* level : {"I", "II", "III"}) QVERIFY(text.split('\n').contains(level));
    // The widest segment of level I is labelled with its compartment's name.
    const auto& first = page.data().stacks.front();
    const auto widest = std::max_element(first.segments.begin(), first.segments.end(),
                                         [](const auto& a, const auto& b) { return a.value < b.value; });
    QVERIFY(text.contains(QString::fromStdString(lake_.compartment(widest->node).name)));
}

void FigureExportTest::pngHasTheRequestedSizeAndIsNotBlank_data()
{
    QTest::addColumn<QString>("view");
    QTest::addColumn<int>("dpi");
    QTest::newRow("level bars 96 dpi") << "level-bars" << 96;
    QTest::newRow("level bars 192 dpi") << "level-bars" << 192;
    QTest::newRow("flow map 150 dpi") << "flow-map" << 150;
}

void FigureExportTest::pngHasTheRequestedSizeAndIsNotBlank()
{
    QFETCH(QString, view);
    QFETCH(int, dpi);
    LevelBarsPage bars;
    FlowMapPage map;
    FigureSource* source = &bars;
    if (view == "flow-map") source = &map;
    bars.setScenario(lake_, sheet_);
    map.setScenario(lake_, sheet_);
    const QString path = dir_.filePath(view + QString::number(dpi) + ".png");
    FigureOptions options;
    options.dpi = dpi;
    options.size = QSize(800, 500);
    const auto error = exportFigure(*source, FigureFormat::Png, path, options);
    QVERIFY2(!error, qPrintable(error.value_or("")));
    QImage image(path);
    QVERIFY(!image.isNull());
    QCOMPARE(image.size(), QSize(qRound(800 * dpi / 96.0), qRound(500 * dpi / 96.0)));
    QCOMPARE(qRound(image.dotsPerMeterX() * 0.0254), dpi);
    const auto [ink, colours] = inkAndColours(image);
    QVERIFY2(ink > 0.03 && ink < 0.9, qPrintable(QString("ink share %1").arg(ink)));
    QVERIFY2(colours >= 6, qPrintable(QString("%1 colours").arg(colours)));
}

void FigureExportTest::pdfIsWritten()
{
    LevelBarsPage page;
    page.setScenario(lake_, sheet_);
    const QString path = dir_.filePath("levels.pdf");
    const auto error = exportFigure(page, FigureFormat::Pdf, path);
    QVERIFY2(!error, qPrintable(error.value_or("")));
    QFile file(path);
    QVERIFY(file.open(QIODevice::ReadOnly));
    const QByteArray bytes = file.readAll();
    QVERIFY(bytes.startsWith("%PDF-"));
    QVERIFY(bytes.size() > 2000);
}

void FigureExportTest::cliRendererWritesTheRequestedView()
{
    ScenarioFigureRequest request;
    request.view = "flow-map";
    request.format = FigureFormat::Svg;
    request.path = dir_.filePath("cli_flow.svg");
    QVERIFY(!exportScenarioFigure(lake_, sheet_, request));
    QString parseError;
    QVERIFY(svgText(request.path, &parseError).contains("Pikeperch"));
    QVERIFY(parseError.isEmpty());

    request.view = "level-bars";
    request.format = FigureFormat::Png;
    request.quantity = "biomass";
    request.logScale = true;
    request.options.dpi = 100;
    request.path = dir_.filePath("cli_levels.png");
    QVERIFY(!exportScenarioFigure(lake_, sheet_, request));
    QVERIFY(!QImage(request.path).isNull());
}

// Issue 13, item 10: an exported figure says which scenario of which project it shows,
// in SVG (text), PDF (title) and PNG alike; the suggested file name follows the title.
void FigureExportTest::figuresNameTheirScenarioAndProject_data()
{
    QTest::addColumn<QString>("view");
    QTest::newRow("flow map") << "flow-map";
    QTest::newRow("level bars") << "level-bars";
}

void FigureExportTest::figuresNameTheirScenarioAndProject()
{
    QFETCH(QString, view);
    const QString scenario = QStringLiteral("Dry year 2031"), project = QStringLiteral("north_basin.tledger");
    std::unique_ptr<QWidget> owner;
    FigureSource* source = nullptr;
    if (view == "flow-map") {
        auto* page = new FlowMapPage;
        page->setScenario(lake_, sheet_);
        source = page;
        owner.reset(page);
    } else {
        auto* page = new LevelBarsPage;
        page->setScenario(lake_, sheet_);
        source = page;
        owner.reset(page);
    }
    const QString bare = source->figureTitle();
    QVERIFY(!bare.contains(scenario));
    source->setFigureContext(scenario, project);
    QVERIFY2(source->figureTitle().startsWith(bare) && source->figureTitle().contains(scenario) &&
                 source->figureTitle().contains(project),
             qPrintable(source->figureTitle()));
    const QString svgPath = dir_.filePath(view + "_context.svg");
    const auto error = exportFigure(*source, FigureFormat::Svg, svgPath);
    QVERIFY2(!error, qPrintable(error.value_or("")));
    QString parseError;
    const QString text = svgText(svgPath, &parseError);
    QVERIFY2(parseError.isEmpty(), qPrintable(parseError));
    QVERIFY2(text.contains(scenario) && text.contains(project), qPrintable(text.left(600)));
    const QString pdfPath = dir_.filePath(view + "_context.pdf");
    QVERIFY(!exportFigure(*source, FigureFormat::Pdf, pdfPath));
    QFile pdf(pdfPath);
    QVERIFY(pdf.open(QIODevice::ReadOnly));
    QVERIFY(pdf.size() > 1000);
    const QString name = suggestedFigureFileName(*source, FigureFormat::Svg);
    QVERIFY2(name.endsWith(".svg") && name.contains("dry_year_2031") && !name.contains(' '), qPrintable(name));
}

void FigureExportTest::tledgerFiguresNameScenarioAndProject()
{
    const QString sample = QStringLiteral(TL_SAMPLES_DIR "/reservoir.tledger");
    QVERIFY2(QFile::exists(sample), qPrintable(sample));
    const QString out = dir_.filePath("cli_context.svg");
    const auto run = tl::testing::runTledger("export " + tl::testing::shellQuoted(sample.toStdString()) +
                                             " --scenario baseline --format svg --view level-bars --out " +
                                             tl::testing::shellQuoted(out.toStdString()));
    QVERIFY2(run.exitCode == 0, run.err.c_str());
    QString parseError;
    const QString text = svgText(out, &parseError);
    QVERIFY2(text.contains("baseline") && text.contains("reservoir.tledger"), qPrintable(text.left(600)));
}

void FigureExportTest::badRequestsSayWhatIsWrong()
{
    ScenarioFigureRequest request;
    request.path = dir_.filePath("x.svg");
    request.view = "pie-chart";
    auto error = exportScenarioFigure(lake_, sheet_, request);
    QVERIFY(error && error->contains("pie-chart") && error->contains("flow-map"));
    request.view = "level-bars";
    request.quantity = "weight";
    error = exportScenarioFigure(lake_, sheet_, request);
    QVERIFY(error && error->contains("weight"));
    request.quantity = "throughput";
    request.path = "/nonexistent-folder/x.svg";
    error = exportScenarioFigure(lake_, sheet_, request);
    QVERIFY(error && error->contains("/nonexistent-folder/x.svg"));
    QVERIFY(!QFile::exists("/nonexistent-folder/x.svg"));
    QVERIFY(!parseFigureFormat("jpeg"));
    QCOMPARE(parseFigureFormat(" SVG "), std::optional(FigureFormat::Svg));

    tl::Model broken = readModel("pond");
    broken.compartment(*broken.indexOf("Pike")).value(tl::Param::Biomass).reset();
    request.view = "flow-map";
    request.path = dir_.filePath("broken.svg");
    error = exportScenarioFigure(broken, tl::solveBalance(broken), request);
    QVERIFY(error && !error->isEmpty());
    QVERIFY(!QFile::exists(request.path));
}

void FigureExportTest::snapshots()
{
    const QString out = qEnvironmentVariable("TL_SNAPSHOT_DIR");
    if (out.isEmpty()) QSKIP("set TL_SNAPSHOT_DIR to write snapshots");
    QDir().mkpath(out);
    const tl::Model lake = readModel("invented_lake");
    const tl::BalanceSheet sheet = tl::solveBalance(lake);
    BalanceSheetPage table;
    table.resize(1500, 520);
    table.setScenario(lake, sheet);
    table.show();
    QVERIFY(QTest::qWaitForWindowExposed(&table));
    QVERIFY(table.grab().save(out + "/balance_sheet.png"));
    FigureOptions options;
    options.dpi = 110;
    LevelBarsPage bars;
    bars.setScenario(lake, sheet);
    QVERIFY(!exportFigure(bars, FigureFormat::Png, out + "/level_bars.png", options));
    bars.setLogScale(true);
    bars.setQuantity(LevelQuantity::Biomass);
    QVERIFY(!exportFigure(bars, FigureFormat::Png, out + "/level_bars_log_biomass.png", options));
    FlowMapPage map;
    map.setScenario(lake, sheet);
    QVERIFY(!exportFigure(map, FigureFormat::Png, out + "/flow_map.png", options));
    const tl::Model pond = readModel("pond");
    map.setScenario(pond, tl::solveBalance(pond));
    QVERIFY(!exportFigure(map, FigureFormat::Png, out + "/flow_map_pond.png", options));
}

QTEST_MAIN(FigureExportTest)
#include "figure_export_test.moc"
