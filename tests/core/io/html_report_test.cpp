// The HTML report (core/io/html_report.h, issue 16): it names every compartment, holds
// every figure as inline SVG and fetches nothing, escapes user text, carries the caution
// and the provenance; a comparison lists what differs. Projects: the invented samples
// (sample_projects/README.md) and invented small models.
#include "core/io/html_report.h"

#include <gtest/gtest.h>

#include "core/io/balance_report.h"
#include "core/store/model_source.h"
#include "tests/support/small_models.h"
#include "tests/support/test_support.h"

namespace tl {
namespace {

namespace fs = std::filesystem;

Project sample(const std::string& file)
{
    ModelSource source = readModelSource(fs::path(TL_SAMPLES_DIR) / file);
    if (!source.project) ADD_FAILURE() << file << " does not open";
    return source.project ? std::move(*source.project) : Project{};
}

std::size_t count(const std::string& text, const std::string& what)
{
    std::size_t n = 0;
    for (std::size_t at = text.find(what); at != std::string::npos; at = text.find(what, at + what.size())) ++n;
    return n;
}

ReportOptions provenance()
{
    ReportOptions o;
    o.provenance = {"9.9.9-test", "lagoon.tledger", std::string(64, 'a'), "2026-12-02"};
    return o;
}

TEST(HtmlReport, NamesEveryCompartmentAndHoldsEveryFigureInline)
{
    const Project project = sample("lagoon.tledger");
    const HtmlReport report = makeHtmlReport(project, provenance());
    ASSERT_TRUE(report.error.empty()) << report.error;
    for (const Scenario& s : project.scenarios)
        for (const Compartment& c : s.model.compartments())
            EXPECT_NE(report.html.find(xmlEscape(c.name)), std::string::npos) << c.name;
    // Per scenario: level bars, flow map and impact matrix, each drawn.
    ASSERT_EQ(report.figures.size(), 3 * project.scenarios.size());
    std::size_t drawn = 0;
    for (const SvgFigure& f : report.figures) {
        if (f.svg.empty()) continue;
        ++drawn;
        EXPECT_NE(report.html.find(f.svg), std::string::npos) << f.title << " is inline";
        EXPECT_EQ(f.svg.rfind("<svg xmlns=\"http://www.w3.org/2000/svg\"", 0), 0u) << f.title;
    }
    EXPECT_EQ(drawn, report.figures.size()) << "the lagoon (32 compartments) has every figure";
    EXPECT_EQ(count(report.html, "<svg "), drawn);
    EXPECT_EQ(count(report.html, "</svg>"), drawn);
    // Self-contained: nothing is fetched or run.
    for (const char* fetch : {"<img", "<link", "<script", "<iframe", "<object", "src=", "href=", "url(", "@import"})
        EXPECT_EQ(report.html.find(fetch), std::string::npos) << fetch;
    EXPECT_EQ(count(report.html, "http"), drawn) << "only the SVG namespace names a URL";
}

TEST(HtmlReport, CautionUnitsAndProvenance)
{
    const Project project = sample("lagoon.tledger");
    const HtmlReport report = makeHtmlReport(project, provenance());
    // Under the title and at the end (the sample's notes quote it too).
    const std::string notice = "<p class=\"notice\">" + xmlEscape(kDecisionSupportNotice) + "</p>";
    EXPECT_EQ(count(report.html, notice), 2u);
    EXPECT_LT(report.html.find(notice), report.html.find("<h2>"));
    EXPECT_GT(report.html.rfind(notice), report.html.rfind("</svg>"));
    for (const char* text : {"9.9.9-test", "lagoon.tledger", "2026-12-02 (UTC)", "t wet weight/km²/year", "Checks still open",
                             "Inputs, data confidence and sources", "Balance sheet", "System indicators", "Level bars",
                             "Flow map", "Impact matrix"})
        EXPECT_NE(report.html.find(text), std::string::npos) << text;
    EXPECT_NE(report.html.find(std::string(64, 'a')), std::string::npos);
    // A source note of the sample (invented) is shown beside its value.
    EXPECT_NE(report.html.find("quadrat survey of the meadows"), std::string::npos);
}

// A compartment, a scenario, a source note and the project notes holding markup appear
// as text, in the tables and in the SVG alike.
TEST(HtmlReport, UserTextIsEscaped)
{
    Project project;
    project.info.title = "Pond <b>bold</b>";
    project.info.notes = "notes with <script>alert(2)</script> & more";
    Scenario s;
    s.name = "base <i>";
    s.model = testing::threeBoxPond(1.0);
    Compartment& algae = s.model.compartment(0);
    algae.value(Param::Biomass) = 10.0;
    algae.value(Param::PB) = 100.0;
    Compartment& grazer = s.model.compartment(1);
    grazer.name = "<script>alert(1)</script>";
    grazer.value(Param::Biomass) = 5.0;
    grazer.value(Param::PB) = 2.0;
    grazer.value(Param::QB) = 10.0;
    grazer.confidenceOf(Param::Biomass).source = "\"quoted\" <source>";
    project.scenarios.push_back(s);
    const HtmlReport report = makeHtmlReport(project, {});
    EXPECT_EQ(report.html.find("<script"), std::string::npos);
    EXPECT_EQ(report.html.find("<b>bold"), std::string::npos);
    EXPECT_EQ(report.html.find("<i>"), std::string::npos);
    EXPECT_GE(count(report.html, "&lt;script&gt;alert(1)&lt;/script&gt;"), 3u) << "inputs, balance sheet and figures";
    EXPECT_NE(report.html.find("&quot;quoted&quot; &lt;source&gt;"), std::string::npos);
    EXPECT_NE(report.html.find("notes with &lt;script&gt;alert(2)&lt;/script&gt; &amp; more"), std::string::npos);
    bool inFigure = false;
    for (const SvgFigure& f : report.figures)
        inFigure = inFigure || f.svg.find("&lt;script&gt;alert(1)&lt;/script&gt;") != std::string::npos;
    EXPECT_TRUE(inFigure);
}

TEST(HtmlReport, ComparisonListsWhatDiffers)
{
    const Project project = sample("lagoon.tledger");
    ReportOptions o = provenance();
    o.scenarios = {"baseline", "clam raking closed"};
    o.compare = true;
    const HtmlReport report = makeHtmlReport(project, o);
    ASSERT_TRUE(report.error.empty()) << report.error;
    EXPECT_EQ(report.title, "Comparison report: lagoon");
    for (const char* text : {"Inputs that differ (8)", "Outputs that differ (", "Level bars side by side",
                             "Largest relative changes: clam raking closed", "Fleet clam rakes", "▲ up", "▼ down"})
        EXPECT_NE(report.html.find(text), std::string::npos) << text;
    // Two comparison figures, then three per scenario.
    EXPECT_EQ(report.figures.size(), 2u + 3u * 2u);

    o.scenarios = {"baseline", "no such"};
    const HtmlReport bad = makeHtmlReport(project, o);
    EXPECT_TRUE(bad.html.empty());
    EXPECT_NE(bad.error.find("no scenario named 'no such'"), std::string::npos) << bad.error;
}

// A web too large for a legible page keeps its level bars; the flow map and impact matrix
// say why they are left out (invented chain of 70 consumers on one producer).
TEST(HtmlReport, LargeWebsSayWhyAFigureIsLeftOut)
{
    Project project;
    project.info.title = "chain";
    Scenario s;
    s.name = "long chain";
    s.model.addCompartment(testing::makeCompartment("algae", CompartmentKind::Producer, 100.0, 50.0));
    s.model.addCompartment(testing::makeCompartment("detritus", CompartmentKind::Detritus));
    for (int k = 0; k < 70; ++k) {
        const std::size_t i = s.model.addCompartment(
            testing::makeCompartment("grazer " + std::to_string(k), CompartmentKind::Consumer, 0.5, 2.0, 10.0));
        s.model.setDiet(i, 0, 1.0);
    }
    project.scenarios.push_back(s);
    const HtmlReport report = makeHtmlReport(project, {});
    ASSERT_EQ(report.figures.size(), 3u);
    EXPECT_FALSE(report.figures[0].svg.empty()) << "level bars";
    EXPECT_TRUE(report.figures[1].svg.empty());
    EXPECT_NE(report.figures[1].caption.find("72 compartments is not legible"), std::string::npos) << report.figures[1].caption;
    EXPECT_TRUE(report.figures[2].svg.empty());
    EXPECT_NE(report.html.find(xmlEscape(report.figures[2].caption)), std::string::npos) << "the reason is in the report";
}

TEST(HtmlReport, OneScenarioAndFigureMarkers)
{
    const Project project = sample("reservoir.tledger");
    ReportOptions o = provenance();
    o.scenarios = {"Invasive Mussel"};
    o.figureMarkers = true;
    const HtmlReport report = makeHtmlReport(project, o);
    ASSERT_TRUE(report.error.empty()) << report.error;
    EXPECT_NE(report.html.find("<h2>Scenario: invasive mussel</h2>"), std::string::npos);
    EXPECT_EQ(report.html.find("Scenario: baseline"), std::string::npos);
    EXPECT_EQ(report.html.find("<svg"), std::string::npos);
    for (std::size_t k = 0; k < report.figures.size(); ++k)
        EXPECT_EQ(report.html.find(figureMarker(k)) != std::string::npos, !report.figures[k].svg.empty()) << k;
}

// The preview is built with figure markers; the HTML saved from it puts the SVGs back and
// must be byte for byte the report built without markers.
TEST(HtmlReport, InlineFiguresGiveTheMarkerlessReport)
{
    const Project project = sample("lagoon.tledger");
    ReportOptions o = provenance();
    o.scenarios = {"baseline", "clam raking closed"};
    o.compare = true;
    const HtmlReport plain = makeHtmlReport(project, o);
    o.figureMarkers = true;
    const HtmlReport marked = makeHtmlReport(project, o);
    ASSERT_NE(marked.html, plain.html);
    EXPECT_EQ(withInlineFigures(marked), plain.html);
    EXPECT_EQ(withInlineFigures(plain), plain.html) << "a report without markers is left as it is";
}

}  // namespace
}  // namespace tl
