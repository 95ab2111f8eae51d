#include "core/io/csv_model.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <fstream>
#include <map>
#include <random>
#include <regex>
#include <sstream>

#include "core/io/csv_table.h"
#include "core/model/text.h"
#include "core/model/validation.h"

namespace tl {
namespace {

namespace fs = std::filesystem;

// A fresh folder under the system temp dir, removed when the test ends.
class TempFolder {
public:
    explicit TempFolder(const std::string& tag)
    {
        const auto* info = ::testing::UnitTest::GetInstance()->current_test_info();
        path_ = fs::temp_directory_path() / ("tl_csv_model_" + std::string(info->name()) + "_" + tag);
        fs::remove_all(path_);
        fs::create_directories(path_);
    }
    ~TempFolder() { fs::remove_all(path_); }
    const fs::path& path() const { return path_; }

private:
    fs::path path_;
};

void writeText(const fs::path& p, const std::string& text) { std::ofstream(p, std::ios::binary) << text; }

std::string readText(const fs::path& p)
{
    std::ifstream in(p, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

const fs::path kPond = fs::path(TL_FIXTURES_DIR) / "csv_every_file";

// The contract's header (DESIGN.md 5.1), spelled out here rather than taken from the code.
const std::string kCompartmentsHeader =
    "name,kind,biomass,pb,qb,ee,pq,unassim,biomass_accum,net_emigration,detritus_import";

// --- A small valid folder that each error case below spoils in one place -------------

using Files = std::map<std::string, std::string>;

Files validFiles()
{
    return {
        {"compartments.csv", kCompartmentsHeader + "\n"
                             "Algae,producer,10,100,,,,,,,\n"
                             "Grazer,consumer,5,10,40,,,,,,\n"
                             "Fish,consumer,,1.2,5,0.9,,,,,\n"
                             "Detritus,detritus,,,,,,,,,\n"},
        {"diet.csv", "predator,Algae,Grazer,Detritus,import\n"
                     "Grazer,0.8,,0.2,\n"
                     "Fish,,0.9,,0.1\n"},
    };
}

CsvReadResult readFiles(const TempFolder& dir, const Files& files)
{
    for (const auto& [name, text] : files) writeText(dir.path() / name, text);
    return readCsvModel(dir.path());
}

const Problem* findCode(const Problems& problems, const std::string& code)
{
    for (const Problem& p : problems)
        if (p.code == code) return &p;
    return nullptr;
}

std::string listed(const Problems& problems)
{
    std::string out;
    for (const Problem& p : problems) out += "  [" + p.code + "] " + p.describe() + "\n";
    return out;
}

// --- Reading ---------------------------------------------------------------------

TEST(CsvModel, ReadsEveryFileOfTheFixtureFolder)
{
    const CsvReadResult r = readCsvModel(kPond);
    ASSERT_TRUE(r.model) << listed(r.problems);
    EXPECT_TRUE(r.problems.empty()) << listed(r.problems);
    const Model& m = *r.model;

    ASSERT_EQ(m.size(), 8u);
    const std::size_t roach = m.indexOf("Roach, juvenile").value();
    const std::size_t pike = m.indexOf("Pike").value();
    const std::size_t zoo = m.indexOf("Zooplankton").value();
    const std::size_t sediment = m.indexOf("Sediment detritus").value();
    const std::size_t water = m.indexOf("Water-column detritus").value();
    EXPECT_EQ(m.compartment(0).kind, CompartmentKind::Producer);
    EXPECT_EQ(m.compartment(sediment).kind, CompartmentKind::Detritus);

    // Values as typed in compartments.csv; empty cells stay unknown.
    EXPECT_EQ(m.compartment(roach).value(Param::Biomass), std::nullopt);
    EXPECT_EQ(m.compartment(roach).value(Param::PB), 2.1);
    EXPECT_EQ(m.compartment(roach).value(Param::BiomassAccum), 0.2);
    EXPECT_EQ(m.compartment(zoo).value(Param::QB), std::nullopt);
    EXPECT_EQ(m.compartment(zoo).value(Param::PQ), 0.25);
    EXPECT_EQ(m.compartment(pike).value(Param::NetEmigration), -0.05);
    EXPECT_EQ(m.compartment(sediment).value(Param::DetritusImport), 15.0);
    EXPECT_EQ(m.compartment(3).value(Param::Unassim), 0.3);

    // Diet: row = predator, columns matched by name; empty = 0; the import column.
    EXPECT_EQ(m.diet(pike, roach), 0.8);
    EXPECT_EQ(m.diet(pike, pike), 0.05);  // cannibalism is a diagonal entry
    EXPECT_EQ(m.dietImport(pike), 0.1);
    EXPECT_EQ(m.diet(zoo, water), 0.3);
    EXPECT_EQ(m.diet(zoo, 1), 0.0);
    EXPECT_NEAR(m.dietRowSum(roach), 1.0, 1e-12);

    // Harvest: fleets in order of appearance; an empty discards cell is 0.
    ASSERT_EQ(m.fleets().size(), 2u);
    EXPECT_EQ(m.fleet(0).name, "Gill nets");
    EXPECT_EQ(m.fleet(0).landings[roach], 0.02);
    EXPECT_EQ(m.fleet(0).discards[roach], 0.1);
    EXPECT_EQ(m.fleet(1).name, "Anglers");
    EXPECT_EQ(m.fleet(1).discards[pike], 0.0);
    EXPECT_DOUBLE_EQ(m.landings(pike), 0.08);

    // Routing: explicit for two sources, the default (first pool) for the others.
    EXPECT_EQ(m.effectiveRouting(0, water), 0.8);
    EXPECT_EQ(m.effectiveRouting(0, sediment), 0.2);
    EXPECT_EQ(m.effectiveRouting(1, sediment), 1.0);
    EXPECT_EQ(m.effectiveRouting(pike, water), 1.0);

    // Confidence and settings.
    const Confidence& pikeB = m.compartment(pike).confidenceOf(Param::Biomass);
    EXPECT_EQ(pikeB.grade, Confidence::Grade::C);
    EXPECT_EQ(pikeB.cv, 0.4);
    EXPECT_EQ(m.compartment(0).confidenceOf(Param::Biomass).source, "chlorophyll survey, 2 stations (invented)");
    EXPECT_EQ(m.compartment(roach).confidenceOf(Param::PB).grade, Confidence::Grade::D);
    EXPECT_EQ(m.units.currency, "g wet weight");
    EXPECT_EQ(m.units.area, "m²");
    EXPECT_EQ(m.rules, BalanceRules{});  // not in settings.csv: defaults
}

TEST(CsvModel, OnlyTheTwoRequiredFilesAreNeeded)
{
    TempFolder dir("min");
    const CsvReadResult r = readFiles(dir, validFiles());
    ASSERT_TRUE(r.model) << listed(r.problems);
    EXPECT_TRUE(r.problems.empty()) << listed(r.problems);
    EXPECT_TRUE(r.model->fleets().empty());
    EXPECT_EQ(r.model->units, Units{});
    EXPECT_EQ(r.model->diet(2, 1), 0.9);
}

TEST(CsvModel, ForgivesSpreadsheetExportHabits)
{
    // BOM, CRLF, a blank trailing row of commas, spaces around names and numbers,
    // columns in another order, missing optional columns, an empty corner cell.
    TempFolder dir("sheet");
    Files files = {
        {"compartments.csv", "\xEF\xBB\xBFkind,name,biomass,pb,qb\r\n"
                             "producer, Algae ,10,100,\r\n"
                             "consumer,Grazer, 5 ,10,40\r\n"
                             ",,,,\r\n"
                             "detritus,Detritus,,,\r\n"},
        {"diet.csv", ",Detritus,Algae\r\nGrazer ,0.25,0.75\r\n,,\r\n"},
    };
    const CsvReadResult r = readFiles(dir, files);
    ASSERT_TRUE(r.model) << listed(r.problems);
    EXPECT_TRUE(r.problems.empty()) << listed(r.problems);
    EXPECT_EQ(r.model->compartment(0).name, "Algae");
    EXPECT_EQ(r.model->compartment(1).value(Param::Biomass), 5.0);
    EXPECT_EQ(r.model->compartment(1).value(Param::EE), std::nullopt);
    EXPECT_EQ(r.model->diet(1, 0), 0.75);
    EXPECT_EQ(r.model->diet(1, 2), 0.25);
}

struct BadCase {
    std::string label;
    std::string file;      // the file replaced
    std::string text;      // its bad content
    std::string code;      // expected problem code
    int line = 0, column = 0;
    std::string inMessage;  // a piece the message must contain
};

void PrintTo(const BadCase& c, std::ostream* os) { *os << c.label; }

class CsvModelBadInput : public ::testing::TestWithParam<BadCase> {};

TEST_P(CsvModelBadInput, IsReportedWithFileLineAndColumnAndNoModel)
{
    const BadCase& c = GetParam();
    TempFolder dir("bad");
    Files files = validFiles();
    files[c.file] = c.text;
    const CsvReadResult r = readFiles(dir, files);
    EXPECT_FALSE(r.model) << c.label;
    const Problem* p = findCode(r.problems, c.code);
    ASSERT_NE(p, nullptr) << c.label << "\n" << listed(r.problems);
    EXPECT_EQ(p->severity, Severity::Error);
    ASSERT_TRUE(p->location);
    EXPECT_EQ(fs::path(p->location->file).filename(), c.file);
    EXPECT_EQ(p->location->line, c.line) << p->describe();
    EXPECT_EQ(p->location->column, c.column) << p->describe();
    EXPECT_NE(p->message.find(c.inMessage), std::string::npos) << p->describe();
}

const std::string kC = "compartments.csv";
const std::string kHeadAndAlgae = kCompartmentsHeader + "\nAlgae,producer,10,100,,,,,,,\n";
const std::string kFishAndDetritus = "Fish,consumer,,1.2,5,0.9,,,,,\nDetritus,detritus,,,,,,,,,\n";
const std::string kDietHead = "predator,Algae,Grazer,Detritus,import\n";

INSTANTIATE_TEST_SUITE_P(
    Cases, CsvModelBadInput,
    ::testing::Values(
        BadCase{"decimal comma, quoted", kC, kHeadAndAlgae + "Grazer,consumer,5,\"1,5\",40,,,,,,\n" + kFishAndDetritus,
                "csv-number", 3, 4, "'1,5'"},
        BadCase{"decimal comma, unquoted", kC, kHeadAndAlgae + "Grazer,consumer,5,1,5,40,,,,,,\n" + kFishAndDetritus,
                "csv-row-cells", 3, 12, "12 cells"},
        BadCase{"too few cells", kC, kHeadAndAlgae + "Grazer,consumer,5,10,40\n" + kFishAndDetritus,
                "csv-row-cells", 3, 5, "5 cells"},
        BadCase{"text for a number", kC, kHeadAndAlgae + "Grazer,consumer,five,10,40,,,,,,\n" + kFishAndDetritus,
                "csv-number", 3, 3, "biomass of 'Grazer'"},
        BadCase{"unknown kind", kC, kHeadAndAlgae + "Grazer,grazer,5,10,40,,,,,,\n" + kFishAndDetritus,
                "csv-kind", 3, 2, "producer, consumer or detritus"},
        BadCase{"negative biomass", kC, kHeadAndAlgae + "Grazer,consumer,-5,10,40,,,,,,\n" + kFishAndDetritus,
                check::kNegativeValue, 3, 3, "negative"},
        BadCase{"unassimilated above 1", kC, kHeadAndAlgae + "Grazer,consumer,5,10,40,,,1.2,,,\n" + kFishAndDetritus,
                check::kUnassimOutOfRange, 3, 8, "fraction"},
        BadCase{"producer with Q/B", kC, kCompartmentsHeader + "\nAlgae,producer,10,100,30,,,,,,\nGrazer,consumer,5,10,40,,,,,,\n" +
                                             kFishAndDetritus,
                check::kProducerConsumes, 2, 5, "producer"},
        BadCase{"detritus with P/B", kC, kHeadAndAlgae + "Grazer,consumer,5,10,40,,,,,,\nFish,consumer,,1.2,5,0.9,,,,,\n"
                                                         "Detritus,detritus,,2,,,,,,,\n",
                check::kDetritusRate, 5, 4, "'Detritus'"},
        BadCase{"duplicate name", kC, kHeadAndAlgae + "Grazer,consumer,5,10,40,,,,,,\nAlgae,producer,1,1,,,,,,,\n" +
                                          kFishAndDetritus,
                "csv-duplicate-name", 4, 1, "line 2"},
        BadCase{"empty name", kC, kHeadAndAlgae + " ,consumer,5,10,40,,,,,,\n" + kFishAndDetritus, "csv-name", 3, 1,
                "no name"},
        BadCase{"reserved name", kC, kHeadAndAlgae + "import,consumer,5,10,40,,,,,,\n" + kFishAndDetritus, "csv-name",
                3, 1, "reserved"},
        BadCase{"misspelt column", kC,
                "name,kind,bioamss\nAlgae,producer,1\nGrazer,consumer,1\nFish,consumer,1\nDetritus,detritus,\n",
                "csv-unknown-column", 1, 3, "'bioamss'"},
        BadCase{"missing kind column", kC, "name,biomass\nAlgae,1\n", "csv-missing-column", 1, 1, "'kind'"},
        BadCase{"duplicate column", kC, "name,kind,pb,pb\nAlgae,producer,1,1\n", "csv-duplicate-column", 1, 4,
                "twice"},
        BadCase{"semicolons", kC, "name;kind;biomass\nAlgae;producer;1,5\n", "csv-header", 1, 1, "semicolons"},
        BadCase{"empty file", kC, "", "csv-header", 1, 1, "empty"},
        BadCase{"latin-1 name", kC, kHeadAndAlgae + "Gr\xE4zer,consumer,5,10,40,,,,,,\n" + kFishAndDetritus,
                "csv-encoding", 3, 1, "UTF-8"},
        BadCase{"unclosed quote", kC, kHeadAndAlgae + "\"Grazer,consumer,5,10,40,,,,,,\n" + kFishAndDetritus,
                "csv-quote", 3, 1, "never closed"},

        BadCase{"prey column not a compartment", "diet.csv", "predator,algae,Grazer,Detritus\nGrazer,0.8,,0.2\n",
                "csv-unknown-compartment", 1, 2, "'algae'"},
        BadCase{"unknown predator", "diet.csv", kDietHead + "Grazer,0.8,,0.2,\nFsh,,0.9,,0.1\n",
                "csv-unknown-compartment", 3, 1, "'Fsh'"},
        BadCase{"fraction above 1", "diet.csv", kDietHead + "Grazer,80,,20,\nFish,,0.9,,0.1\n", check::kDietFraction,
                2, 2, "fraction"},
        BadCase{"negative fraction", "diet.csv", kDietHead + "Grazer,0.8,,0.2,\nFish,,1,,-0.1\n", check::kDietFraction,
                3, 5, "-0.1"},
        BadCase{"diet not summing to 1", "diet.csv", kDietHead + "Grazer,0.7,,0.2,\nFish,,0.9,,0.1\n", check::kDietSum,
                2, 1, "0.9"},
        BadCase{"producer with a diet", "diet.csv", kDietHead + "Grazer,0.8,,0.2,\nFish,,0.9,,0.1\nAlgae,,,1,\n",
                check::kDietOfNonConsumer, 4, 4, "producer"},
        BadCase{"consumer with an empty row", "diet.csv", kDietHead + "Grazer,,,,\nFish,,0.9,,0.1\n", check::kDietSum,
                2, 1, "empty"},
        BadCase{"duplicate predator", "diet.csv", kDietHead + "Grazer,0.8,,0.2,\nFish,,0.9,,0.1\nGrazer,1,,,\n",
                "csv-duplicate-row", 4, 1, "line 2"},
        BadCase{"duplicate prey column", "diet.csv", "predator,Algae,Algae\nGrazer,0.5,0.5\n",
                "csv-duplicate-column", 1, 3, "twice"},
        BadCase{"corner names a compartment", "diet.csv", "Grazer,Algae,Detritus\nFish,0.5,0.5\n", "csv-header", 1,
                1, "'predator'"},
        BadCase{"cell under an unnamed column", "diet.csv", "predator,Algae,,Detritus\nGrazer,0.8,0.1,0.1\n",
                "csv-header", 2, 3, "no prey name"},
        BadCase{"catch of detritus", "harvest.csv", "fleet,compartment,landings,discards\nNets,Detritus,1,\n",
                check::kCatchFromDetritus, 2, 2, "detritus pool"},
        BadCase{"catch of unknown", "harvest.csv", "fleet,compartment,landings,discards\nNets,Fishh,1,\n",
                "csv-unknown-compartment", 2, 2, "'Fishh'"},
        BadCase{"negative landings", "harvest.csv", "fleet,compartment,landings,discards\nNets,Fish,-1,\n",
                check::kNegativeLandings, 2, 3, "negative"},
        BadCase{"negative discards", "harvest.csv", "fleet,compartment,landings,discards\nNets,Fish,1,-2\n",
                check::kNegativeDiscards, 2, 4, "negative"},
        BadCase{"duplicate catch row", "harvest.csv",
                "fleet,compartment,landings,discards\nNets,Fish,1,\nRods,Fish,1,\nNets,Fish,2,\n",
                "csv-duplicate-row", 4, 2, "line 2"},
        BadCase{"no fleet name", "harvest.csv", "fleet,compartment,landings,discards\n,Fish,1,\n", "csv-name", 2, 1,
                "no name"},
        BadCase{"survival above 1", "harvest.csv",
                "fleet,compartment,landings,discards,discard_survival\nNets,Fish,1,1,2\n",
                check::kDiscardSurvival, 2, 5, "fraction"},
        BadCase{"discard pool not detritus", "harvest.csv",
                "fleet,compartment,landings,discards,discard_pool\nNets,Fish,1,1,Algae\n",
                check::kDiscardPool, 2, 5, "not a detritus pool"},
        BadCase{"two discard pools for one fleet", "harvest.csv",
                "fleet,compartment,discards,discard_pool\nNets,Fish,1,Detritus\nNets,Grazer,1,Algae\n",
                "csv-discard-pool", 3, 4, "already sends"},
        BadCase{"catch without compartment", "harvest.csv", "fleet,compartment,landings,discards\nNets,,1,\n",
                "csv-unknown-compartment", 2, 2, "no compartment"},
        BadCase{"routing to a living compartment", "detritus_routing.csv",
                "source,detritus,fraction\nFish,Grazer,1\n", check::kRoutingToLiving, 2, 2, "'Grazer'"},
        BadCase{"routing not summing to 1", "detritus_routing.csv", "source,detritus,fraction\nFish,Detritus,0.6\n",
                check::kRoutingSum, 2, 1, "0.6"},
        BadCase{"routing without fraction", "detritus_routing.csv", "source,detritus,fraction\nFish,Detritus,\n",
                "csv-missing-value", 2, 3, "empty"},
        BadCase{"bad grade", "confidence.csv", "compartment,parameter,grade\nFish,pb,E\n", "csv-grade", 2, 3,
                "A, B, C, D"},
        BadCase{"bad parameter", "confidence.csv", "compartment,parameter,grade\nFish,P/B,A\n", "csv-parameter", 2,
                2, "'P/B'"},
        BadCase{"bad diet grade", "confidence.csv", "compartment,parameter,grade\nFish,diet,E\n", "csv-grade", 2, 3,
                "grade of diet of 'Fish'"},
        BadCase{"diet confidence twice", "confidence.csv", "compartment,parameter,grade\nFish,diet,A\nFish,diet,B\n",
                "csv-duplicate-row", 3, 2, "line 2"},
        BadCase{"plausible range not positive", "settings.csv", "key,value\nplausible_rate_max,0\n", "csv-number", 2, 2,
                "plausible_rate_max"},
        BadCase{"unknown setting", "settings.csv", "key,value\ncurrency,t\nunits,t\n", "csv-unknown-setting", 3, 1,
                "'units'"},
        BadCase{"setting not a number", "settings.csv", "key,value\nee_max,one\n", "csv-number", 2, 2, "'one'"}),
    [](const ::testing::TestParamInfo<BadCase>& info) {
        std::string name;
        for (char ch : info.param.label) name += std::isalnum(static_cast<unsigned char>(ch)) ? ch : '_';
        return name;
    });

TEST(CsvModel, MissingRequiredFilesAreNamed)
{
    TempFolder dir("nofiles");
    const CsvReadResult none = readCsvModel(dir.path());
    EXPECT_FALSE(none.model);
    const Problem* p = findCode(none.problems, "csv-missing-file");
    ASSERT_NE(p, nullptr) << listed(none.problems);
    EXPECT_EQ(fs::path(p->location->file).filename(), "compartments.csv");

    writeText(dir.path() / "compartments.csv", kCompartmentsHeader + "\nAlgae,producer,1,1,,,,,,,\nGrazer,consumer,1,1,1,,,,,,\n");
    const CsvReadResult noDiet = readCsvModel(dir.path());
    EXPECT_FALSE(noDiet.model);
    p = findCode(noDiet.problems, "csv-missing-file");
    ASSERT_NE(p, nullptr) << listed(noDiet.problems);
    EXPECT_EQ(fs::path(p->location->file).filename(), "diet.csv");

    // Without consumers there is no diet to give.
    writeText(dir.path() / "compartments.csv", kCompartmentsHeader + "\nAlgae,producer,1,1,,,,,,,\n");
    EXPECT_TRUE(readCsvModel(dir.path()).model);

    const CsvReadResult notFolder = readCsvModel(dir.path() / "compartments.csv");
    EXPECT_FALSE(notFolder.model);
    ASSERT_EQ(notFolder.problems.size(), 1u);
    EXPECT_NE(notFolder.problems[0].message.find("found a file"), std::string::npos);
}

TEST(CsvModel, ReportsEveryErrorNotJustTheFirst)
{
    TempFolder dir("many");
    Files files = validFiles();
    files["compartments.csv"] = kHeadAndAlgae + "Grazer,consumer,x,10,40,,,,,,\n" + kFishAndDetritus;
    files["diet.csv"] = kDietHead + "Grazer,0.8,,0.2,\nFish,,9,,0.1\n";
    files["harvest.csv"] = "fleet,compartment,landings,discards\nNets,Detritus,1,\n";
    const CsvReadResult r = readFiles(dir, files);
    EXPECT_FALSE(r.model);
    EXPECT_NE(findCode(r.problems, "csv-number"), nullptr) << listed(r.problems);
    EXPECT_NE(findCode(r.problems, check::kDietFraction), nullptr) << listed(r.problems);
    EXPECT_NE(findCode(r.problems, check::kCatchFromDetritus), nullptr) << listed(r.problems);
}

TEST(CsvModel, ProblemsCarryTheCellTheyAreAbout)
{
    TempFolder dir("cell");
    Files files = validFiles();
    files["diet.csv"] = kDietHead + "Grazer,0.8,,0.2,\nFish,,0.9,,abc\n";
    const CsvReadResult r = readFiles(dir, files);
    const Problem* p = findCode(r.problems, "csv-number");
    ASSERT_NE(p, nullptr) << listed(r.problems);
    EXPECT_EQ(p->compartment, "Fish");
    EXPECT_EQ(p->parameter, "diet");
    EXPECT_EQ(p->prey, "import");
    EXPECT_EQ(p->describe().substr(p->describe().find("diet.csv")), "diet.csv:3:5: " + p->message);
    // The unreadable cell is the fault; its row's sum (0.9 without it) is not reported again.
    EXPECT_EQ(findCode(r.problems, check::kDietSum), nullptr) << listed(r.problems);
    EXPECT_EQ(r.problems.size(), 1u) << listed(r.problems);
}

// Issue 12, defect 5: the best place there is, and one message per problem.
TEST(CsvModel, AConsumerWithoutADietRowIsPlacedOnItsRowInCompartmentsCsv)
{
    TempFolder dir("nodiet");
    Files files = validFiles();
    files["diet.csv"] = kDietHead + "Grazer,0.8,,0.2,\n";  // Fish has no row
    const CsvReadResult r = readFiles(dir, files);
    const Problem* p = findCode(r.problems, check::kDietSum);
    ASSERT_NE(p, nullptr) << listed(r.problems);
    ASSERT_TRUE(p->location);
    EXPECT_EQ(fs::path(p->location->file).filename(), "compartments.csv") << p->describe();
    EXPECT_EQ(p->location->line, 4);    // Fish's row
    EXPECT_EQ(p->location->column, 2);  // its kind: consumer
}

TEST(CsvModel, WholeLineProblemsNameLineAndColumn)
{
    {
        TempFolder dir("nocolumn");
        Files files = validFiles();
        files["compartments.csv"] = "name,biomass\nAlgae,10\n";  // no 'kind'
        const CsvReadResult r = readFiles(dir, files);
        const Problem* p = findCode(r.problems, "csv-missing-column");
        ASSERT_NE(p, nullptr) << listed(r.problems);
        EXPECT_EQ(p->location->line, 1);
        EXPECT_EQ(p->location->column, 1);
    }
    {
        TempFolder dir("nul");
        Files files = validFiles();
        files["compartments.csv"] = kCompartmentsHeader + "\nAlgae,producer,1" + std::string(1, '\0') + "0,100,,,,,,,\n";
        const CsvReadResult r = readFiles(dir, files);
        EXPECT_FALSE(r.model);
        std::size_t aboutCompartments = 0;
        for (const Problem& p : r.problems)
            if (p.location && fs::path(p.location->file).filename() == "compartments.csv") ++aboutCompartments;
        EXPECT_EQ(aboutCompartments, 1u) << "a NUL byte is one problem, not also 'the file is empty'\n" << listed(r.problems);
        const Problem* p = findCode(r.problems, "csv-encoding");
        ASSERT_NE(p, nullptr) << listed(r.problems);
        EXPECT_EQ(p->location->line, 2);
        EXPECT_EQ(p->location->column, 3);  // the biomass cell
        for (const Problem& q : r.problems)
            EXPECT_EQ(q.message.find("empty"), std::string::npos) << listed(r.problems);
    }
    {
        TempFolder dir("nuldiet");
        Files files = validFiles();
        files["diet.csv"] = kDietHead + "Grazer,0.8,,0.2," + std::string(1, '\0') + "\n";
        const CsvReadResult r = readFiles(dir, files);
        std::size_t aboutDiet = 0;
        for (const Problem& p : r.problems)
            if (p.location && fs::path(p.location->file).filename() == "diet.csv") ++aboutDiet;
        EXPECT_EQ(aboutDiet, 1u) << listed(r.problems);
        for (const Problem& q : r.problems)
            EXPECT_EQ(q.message.find("the file is empty"), std::string::npos) << listed(r.problems);
    }
}

TEST(CsvModel, HintsNameTheLikelyFix)
{
    TempFolder dir("hint");
    Files files = validFiles();
    files["compartments.csv"] = kHeadAndAlgae + "Grazer,consumer,5,\"1,5\",40,,,,,,\n" + kFishAndDetritus;
    files["diet.csv"] = "predator,algae,Grazer,Detritus\nGrazer,0.8,,0.2\nFish,,0.9,\n";
    const CsvReadResult r = readFiles(dir, files);
    const Problem* comma = findCode(r.problems, "csv-number");
    ASSERT_NE(comma, nullptr);
    EXPECT_NE(comma->hint.find("Write 1.5"), std::string::npos) << comma->hint;
    const Problem* caseHint = findCode(r.problems, "csv-unknown-compartment");
    ASSERT_NE(caseHint, nullptr);
    EXPECT_NE(caseHint->hint.find("'Algae'"), std::string::npos) << caseHint->hint;

    files = validFiles();
    files["diet.csv"] = kDietHead + "Grazer,80,,20,\nFish,,0.9,,0.1\n";
    const CsvReadResult percent = readFiles(dir, files);
    const Problem* p = findCode(percent.problems, check::kDietFraction);
    ASSERT_NE(p, nullptr) << listed(percent.problems);
    EXPECT_NE(p->hint.find("percentages"), std::string::npos) << p->hint;
}

TEST(CsvModel, ValidationFindingsArePlacedOnTheirCellOnce)
{
    // Semantic checks come from validateModel (core/model/validation.h); the reader only
    // says where. Each fault below must be reported once, on its own cell.
    TempFolder dir("semantic");
    Files files = validFiles();
    files["compartments.csv"] = kCompartmentsHeader + "\nAlgae,producer,10,100,,,,,,,\nGrazer,consumer,5,10,40,,,,,,\n"
                                "Fish,consumer,,1.2,5,0.9,,,,,\nSnail,consumer,1,2,8,,,,,,\nDetritus,detritus,,,,,,,,,\n";
    files["diet.csv"] = kDietHead + "Algae,,0.5,,\nGrazer,0.7,,0.2,\nFish,,0.9,,0.1\n";
    files["detritus_routing.csv"] = "source,detritus,fraction\nFish,Detritus,0.5\n";
    const CsvReadResult r = readFiles(dir, files);
    EXPECT_FALSE(r.model);

    struct Expected {
        const char* code;
        const char* compartment;
        const char* file;
        int line, column;
    };
    for (const Expected& e : {Expected{check::kDietSum, "Grazer", "diet.csv", 3, 1},
                              Expected{check::kDietSum, "Snail", "compartments.csv", 5, 2},  // no diet row: its row, kind
                              Expected{check::kDietOfNonConsumer, "Algae", "diet.csv", 2, 3},
                              Expected{check::kRoutingSum, "Fish", "detritus_routing.csv", 2, 1}}) {
        const auto same = [&](const Problem& p) { return p.code == e.code && p.compartment == e.compartment; };
        ASSERT_EQ(std::count_if(r.problems.begin(), r.problems.end(), same), 1) << e.code << " " << e.compartment
                                                                                << "\n" << listed(r.problems);
        const Problem& p = *std::find_if(r.problems.begin(), r.problems.end(), same);
        ASSERT_TRUE(p.location);
        EXPECT_EQ(fs::path(p.location->file).filename(), e.file);
        EXPECT_EQ(p.location->line, e.line) << p.describe();
        EXPECT_EQ(p.location->column, e.column) << p.describe();
    }
    EXPECT_EQ(r.problems.size(), 4u) << listed(r.problems);
}

TEST(CsvModel, SettingsChangeTheDietSumTolerance)
{
    TempFolder dir("tol");
    Files files = validFiles();
    files["diet.csv"] = kDietHead + "Grazer,0.78,,0.2,\nFish,,0.9,,0.1\n";  // sums to 0.98
    EXPECT_NE(findCode(readFiles(dir, files).problems, check::kDietSum), nullptr);
    files["settings.csv"] = "key,value\ndiet_sum_tolerance,0.05\n";
    const CsvReadResult r = readFiles(dir, files);
    EXPECT_TRUE(r.problems.empty()) << listed(r.problems);
    ASSERT_TRUE(r.model);
    EXPECT_EQ(r.model->rules.dietSumTolerance, 0.05);
}

TEST(CsvModel, TooManyProblemsAreCappedWithASummary)
{
    TempFolder dir("cap");
    std::string text = kCompartmentsHeader + "\n";
    for (int k = 0; k < 300; ++k) {
        text += 'C';  // (not "C" + std::to_string(k): GCC 12 warns falsely, -Wrestrict)
        text += std::to_string(k);
        text += ",consumer,x,y,,,,,,,\n";
    }
    const CsvReadResult r = readFiles(dir, {{"compartments.csv", text}, {"diet.csv", "predator\n"}});
    EXPECT_FALSE(r.model);
    ASSERT_EQ(r.problems.size(), 201u);
    EXPECT_EQ(r.problems.back().code, "csv-too-many-problems");
    EXPECT_EQ(r.problems.back().severity, Severity::Error);
}

// --- Writing ---------------------------------------------------------------------

TEST(CsvModel, FixtureRoundTripsAndKeepsTheContractHeaders)
{
    const CsvReadResult original = readCsvModel(kPond);
    ASSERT_TRUE(original.model);
    TempFolder dir("out");
    const Problems written = writeCsvModel(*original.model, dir.path() / "nested" / "folder");
    ASSERT_TRUE(written.empty()) << listed(written);
    const fs::path out = dir.path() / "nested" / "folder";

    const CsvReadResult again = readCsvModel(out);
    ASSERT_TRUE(again.model) << listed(again.problems);
    EXPECT_TRUE(again.problems.empty()) << listed(again.problems);
    EXPECT_EQ(*again.model, *original.model);

    // First lines as DESIGN.md 5.1 spells them.
    const auto firstLine = [&](const char* name) {
        const std::string text = readText(out / name);
        return text.substr(0, text.find('\n'));
    };
    EXPECT_EQ(firstLine("compartments.csv"), kCompartmentsHeader);
    EXPECT_EQ(firstLine("harvest.csv"), "fleet,compartment,landings,discards");
    EXPECT_EQ(firstLine("detritus_routing.csv"), "source,detritus,fraction");
    EXPECT_EQ(firstLine("diet.csv").rfind("predator,Phytoplankton,", 0), 0u);
    EXPECT_EQ(firstLine("diet.csv").substr(firstLine("diet.csv").size() - 7), ",import");
    EXPECT_NE(readText(out / "compartments.csv").find("\n\"Roach, juvenile\",consumer,,2.1,12,0.95,"),
              std::string::npos);

    // Only the six files, no temporary left behind.
    std::size_t count = 0;
    for (const auto& e : fs::directory_iterator(out)) {
        ++count;
        EXPECT_EQ(e.path().extension(), ".csv") << e.path();
    }
    EXPECT_EQ(count, 6u);
}

TEST(CsvModel, WritingOverAnOlderExportLeavesNoStaleData)
{
    const CsvReadResult pond = readCsvModel(kPond);
    ASSERT_TRUE(pond.model);
    TempFolder dir("stale");
    ASSERT_TRUE(writeCsvModel(*pond.model, dir.path()).empty());
    ASSERT_TRUE(fs::exists(dir.path() / "harvest.csv"));

    // The same model without fleets, routing, confidence and with default units.
    Model smaller = *pond.model;
    while (!smaller.fleets().empty()) smaller.removeFleet(0);
    for (std::size_t s = 0; s < smaller.size(); ++s) {
        for (std::size_t d = 0; d < smaller.size(); ++d) smaller.setRouting(s, d, 0.0);
        for (Param p : kAllParams) smaller.compartment(s).confidenceOf(p) = Confidence{};
        smaller.compartment(s).dietConfidence = Confidence{};
    }
    smaller.units = Units{};
    ASSERT_TRUE(writeCsvModel(smaller, dir.path()).empty());
    for (const char* gone : {"harvest.csv", "detritus_routing.csv", "confidence.csv", "settings.csv"})
        EXPECT_FALSE(fs::exists(dir.path() / gone)) << gone;
    const CsvReadResult again = readCsvModel(dir.path());
    ASSERT_TRUE(again.model) << listed(again.problems);
    EXPECT_EQ(*again.model, smaller);
}

TEST(CsvModel, WriterRefusesNamesTheReaderCouldNotTellApart)
{
    Model m;
    Compartment a;
    a.name = "Perch";
    m.addCompartment(a);
    m.addCompartment(a);
    TempFolder dir("dup");
    const Problems problems = writeCsvModel(m, dir.path() / "out");
    ASSERT_TRUE(hasErrors(problems));
    EXPECT_EQ(problems[0].code, "csv-name");
    EXPECT_FALSE(fs::exists(dir.path() / "out"));  // nothing half-written

    Model padded;
    a.name = " Perch";
    padded.addCompartment(a);
    EXPECT_TRUE(hasErrors(writeCsvModel(padded, dir.path() / "out")));
}

TEST(CsvModel, UnwritableFolderIsReportedNotThrown)
{
    TempFolder dir("blocked");
    writeText(dir.path() / "a_file", "x");
    Model m;
    Compartment c;
    c.name = "Algae";
    c.kind = CompartmentKind::Producer;
    m.addCompartment(c);
    const Problems problems = writeCsvModel(m, dir.path() / "a_file" / "sub");
    ASSERT_TRUE(hasErrors(problems));
    EXPECT_EQ(problems[0].code, "csv-write");
    EXPECT_EQ(readText(dir.path() / "a_file"), "x");
}

// Random valid models (validateModel finds no error) with awkward names and values:
// whatever the writer writes, the reader must read back to an identical Model.
Model randomModel(std::mt19937_64& rng)
{
    const auto chance = [&](double p) { return std::uniform_real_distribution<double>(0, 1)(rng) < p; };
    const auto uniform = [&](double lo, double hi) { return std::uniform_real_distribution<double>(lo, hi)(rng); };
    const std::string pieces[] = {"Perch", "roach", ",", "\"", " ", "\n", "é", "²", "Ærø", "-", "0", "import",
                                  "predator", "'", ";", "\t", "x"};
    const auto text = [&](std::size_t maxPieces) {
        std::string s;
        const std::size_t n = 1 + rng() % maxPieces;
        for (std::size_t k = 0; k < n; ++k) s += pieces[rng() % std::size(pieces)];
        // Names may begin as a spreadsheet formula would (guarded on writing).
        static const char* const starts[] = {"a", "a", "a", "=", "+", "-", "@", "'", "'=", "''-", "@'"};
        return starts[rng() % std::size(starts)] + std::string(trim(s)) + "z";
    };

    Model m;
    if (chance(0.5)) m.units.currency = text(3);
    if (chance(0.5)) m.units.area = text(2);
    if (chance(0.3)) m.units.time = text(2);
    if (chance(0.5)) {
        m.rules.eeMax = uniform(0.5, 1.5);
        m.rules.pqMin = uniform(0, 0.1);
        m.rules.pqMax = uniform(0.3, 0.6);
        for (double& cv : m.rules.cvByGrade) cv = uniform(0, 1);
    }

    const std::size_t n = 1 + rng() % 9;
    while (m.size() < n) {
        Compartment c;
        c.name = text(4);
        if (m.indexOf(c.name)) continue;
        c.kind = m.size() == 0 ? CompartmentKind::Detritus : static_cast<CompartmentKind>(rng() % 3);
        for (Param p : kAllParams) {
            // Only what each kind may carry (validation.h): producers no Q/B or P/Q,
            // detritus pools no rates, detritus import on pools only.
            const bool allowed = c.kind == CompartmentKind::Detritus
                                     ? (p == Param::Biomass || p == Param::BiomassAccum || p == Param::NetEmigration ||
                                        p == Param::DetritusImport)
                                     : p != Param::DetritusImport &&
                                           (c.kind == CompartmentKind::Consumer || (p != Param::QB && p != Param::PQ));
            if (!allowed || chance(0.4)) continue;
            const bool signedValue = p == Param::BiomassAccum || p == Param::NetEmigration;
            double v = p == Param::Unassim ? uniform(0, 0.99) : std::pow(10.0, uniform(-6, 6));
            if (signedValue && chance(0.5)) v = -v;
            c.value(p) = v;
            if (chance(0.3)) {
                Confidence& conf = c.confidenceOf(p);
                conf.grade = static_cast<Confidence::Grade>(rng() % 5);
                if (chance(0.5)) conf.cv = uniform(0, 2);
                if (chance(0.5)) conf.source = text(6);
            }
        }
        m.addCompartment(std::move(c));
    }
    const std::vector<std::size_t> pools = m.detritusPools();
    const std::vector<std::size_t> living = m.living();
    for (std::size_t j = 0; j < m.size(); ++j) {
        if (m.compartment(j).kind != CompartmentKind::Consumer) continue;
        // A diet row that sums to 1 exactly in binary: dyadic shares of 1/64.
        int left = 64;
        for (std::size_t i = 0; i < m.size() && left > 0; ++i) {
            const int share = i + 1 == m.size() ? left : static_cast<int>(rng() % (left + 1));
            m.setDiet(j, i, share / 64.0);
            left -= share;
        }
        m.setDietImport(j, left / 64.0);
        if (chance(0.3)) {  // the diet row's confidence (confidence.csv parameter "diet")
            Confidence& conf = m.compartment(j).dietConfidence;
            conf.grade = static_cast<Confidence::Grade>(rng() % 5);
            if (chance(0.5)) conf.cv = uniform(0, 2);
            if (chance(0.5)) conf.source = text(6);
        }
    }
    for (std::size_t s : living) {
        if (pools.empty() || !chance(0.4)) continue;
        int left = 16;
        for (std::size_t k = 0; k < pools.size(); ++k) {
            const int share = k + 1 == pools.size() ? left : static_cast<int>(rng() % (left + 1));
            m.setRouting(s, pools[k], share / 16.0);
            left -= share;
        }
    }
    const std::size_t fleets = rng() % 4;
    for (std::size_t f = 0; f < fleets; ++f) {
        const std::string name = text(3);
        if (m.fleetIndexOf(name)) continue;
        Fleet& fleet = m.fleet(m.addFleet(name));
        for (std::size_t i : living) {
            if (chance(0.5)) fleet.landings[i] = uniform(0, 10);
            if (chance(0.3)) fleet.discards[i] = uniform(0, 1);
            if (chance(0.2)) fleet.discardSurvival[i] = uniform(0, 1);
        }
        if (chance(0.5)) fleet.discardPool = pools[rng() % pools.size()];
    }
    return m;
}

TEST(CsvModel, RandomModelsRoundTripExactly)
{
    std::mt19937_64 rng(2024);
    TempFolder dir("random");
    for (int trial = 0; trial < 60; ++trial) {
        const Model m = randomModel(rng);
        ASSERT_FALSE(hasErrors(validateModel(m))) << "trial " << trial << ": the generator made an invalid model";
        // Each form on every other model: the writes are synced to disk and dominate the time.
        for (const DietForm form : {trial % 2 == 0 ? DietForm::Wide : DietForm::Long}) {
            const Problems written = writeCsvModel(m, dir.path(), {form});
            ASSERT_TRUE(written.empty()) << "trial " << trial << "\n" << listed(written);
            const std::string header = readText(dir.path() / "diet.csv").substr(0, 20);
            EXPECT_EQ(header == "predator,prey,share\n", form == DietForm::Long) << "trial " << trial;
            const CsvReadResult r = readCsvModel(dir.path());
            ASSERT_TRUE(r.model) << "trial " << trial << "\n" << listed(r.problems);
            ASSERT_EQ(*r.model, m) << "trial " << trial << (form == DietForm::Long ? " (long form)" : " (wide form)");
        }
    }
}

// Issue 12, defect 3: names a spreadsheet would run as formulas are written with the
// apostrophe guard in compartments.csv, diet.csv and harvest.csv, and read back to the
// same names (OWASP "CSV injection"; the guard is the usual spreadsheet text marker).
TEST(CsvModel, FormulaShapedNamesAreGuardedAndReadBackUnchanged)
{
    const std::vector<std::string> names = {"=HYPERLINK(\"http://example.invalid\",\"click\")",
                                            "+1+1",
                                            "@SUM(A1)",
                                            "-2+3",
                                            "=cmd|' /C calc'!A0",
                                            "'=already guarded by hand",
                                            "'plain apostrophe",
                                            "pike"};
    Model m;
    for (std::size_t k = 0; k < names.size(); ++k) {
        Compartment c;
        c.name = names[k];
        c.kind = k == 0 ? CompartmentKind::Detritus : k == 1 ? CompartmentKind::Producer : CompartmentKind::Consumer;
        if (c.kind != CompartmentKind::Detritus) {
            c.value(Param::Biomass) = 1.0 + static_cast<double>(k);
            c.value(Param::PB) = 2.0;
        }
        if (c.kind == CompartmentKind::Consumer) c.value(Param::QB) = 10.0;
        if (k == 3) c.value(Param::NetEmigration) = -0.25;  // a negative number stays a number
        m.addCompartment(std::move(c));
    }
    for (std::size_t j = 2; j < names.size(); ++j) {
        m.setDiet(j, 1, 0.5);
        m.setDiet(j, 0, 0.5);
    }
    Fleet& fleet = m.fleet(m.addFleet("=1+2"));
    fleet.landings[3] = 0.5;
    ASSERT_FALSE(hasErrors(validateModel(m))) << listed(validateModel(m));

    TempFolder dir("formula");
    ASSERT_TRUE(writeCsvModel(m, dir.path(), {DietForm::Wide}).empty());
    // No cell of the three files begins as a formula: '=', '+', '@', a tab, or '-' not
    // starting a number (each optionally inside the field's opening quote).
    const std::regex formulaCell("(^|,)\"?([=+@\t]|-[^0-9.])");
    for (const char* file : {"compartments.csv", "diet.csv", "harvest.csv"}) {
        std::istringstream lines(readText(dir.path() / file));
        std::string line;
        for (int n = 1; std::getline(lines, line); ++n)
            EXPECT_FALSE(std::regex_search(line, formulaCell)) << file << ":" << n << ": " << line;
    }
    // The bytes on disk: the guard is there, the formula is not at the start of a cell.
    const std::string compartments = readText(dir.path() / "compartments.csv");
    EXPECT_NE(compartments.find("\n\"'=HYPERLINK("), std::string::npos) << compartments;
    EXPECT_NE(compartments.find("\n'+1+1,"), std::string::npos) << compartments;
    EXPECT_NE(compartments.find("\n'@SUM(A1),"), std::string::npos) << compartments;
    EXPECT_NE(compartments.find("\n'-2+3,"), std::string::npos) << compartments;
    EXPECT_NE(compartments.find("\n''=already guarded by hand,"), std::string::npos) << compartments;
    EXPECT_NE(compartments.find("\n'plain apostrophe,"), std::string::npos) << compartments;
    EXPECT_NE(compartments.find(",-0.25"), std::string::npos) << compartments;
    EXPECT_NE(readText(dir.path() / "harvest.csv").find("\n'=1+2,"), std::string::npos);
    EXPECT_NE(readText(dir.path() / "diet.csv").find(",'+1+1"), std::string::npos);

    const CsvReadResult back = readCsvModel(dir.path());
    ASSERT_TRUE(back.model) << listed(back.problems);
    EXPECT_EQ(*back.model, m);
}

TEST(CsvTable, FormulaGuardIsLosslessForAnyNumberOfApostrophes)
{
    for (const std::string core : {"=x", "+", "-1-", "@a", "\tx", "\rx", "x", "", "1", "'"}) {
        for (int k = 0; k < 4; ++k) {
            const std::string text = std::string(static_cast<std::size_t>(k), '\'') + core;
            EXPECT_EQ(std::string(unguardFormula(guardFormula(text))), text) << text;
        }
    }
    EXPECT_EQ(guardFormula("=1"), "'=1");
    EXPECT_EQ(guardFormula("pike"), "pike");
    EXPECT_EQ(guardFormula("'pike"), "'pike");
    EXPECT_EQ(unguardFormula("'pike"), "'pike");
}

// --- diet.csv in long form ---------------------------------------------------------

// validFiles() with its diet written one entry per row, the import of Fish first.
Files longFormFiles()
{
    Files files = validFiles();
    files["diet.csv"] = "predator,prey,share\n"
                        "Fish,import,0.1\n"
                        "Grazer,Algae,0.8\n"
                        "Fish,Grazer,0.9\n"
                        "Grazer,Detritus,0.2\n";
    return files;
}

TEST(CsvModel, LongFormDietReadsLikeTheWideForm)
{
    TempFolder wide("wide"), longForm("long");
    const CsvReadResult a = readFiles(wide, validFiles());
    const CsvReadResult b = readFiles(longForm, longFormFiles());
    ASSERT_TRUE(a.model) << listed(a.problems);
    ASSERT_TRUE(b.model) << listed(b.problems);
    EXPECT_TRUE(b.problems.empty()) << listed(b.problems);
    EXPECT_EQ(*b.model, *a.model);
    EXPECT_DOUBLE_EQ(b.model->diet(2, 1), 0.9);
    EXPECT_DOUBLE_EQ(b.model->dietImport(2), 0.1);
}

TEST(CsvModel, LongFormRowSumFindingIsOnThePredatorsFirstLine)
{
    Files files = longFormFiles();
    files["diet.csv"] = "predator,prey,share\n"
                        "Grazer,Algae,0.8\n"
                        "Fish,Grazer,0.5\n"  // Fish: 0.5 + 0.1 = 0.6, its rows on lines 3 and 5
                        "Grazer,Detritus,0.2\n"
                        "Fish,import,0.1\n";
    TempFolder dir("sum");
    const CsvReadResult r = readFiles(dir, files);
    const Problem* sum = findCode(r.problems, check::kDietSum);
    ASSERT_NE(sum, nullptr) << listed(r.problems);
    EXPECT_EQ(sum->compartment, "Fish");
    ASSERT_TRUE(sum->location);
    EXPECT_EQ(sum->location->line, 3);
    EXPECT_EQ(sum->location->column, 1);
    // The same words as in wide form.
    TempFolder wideDir("wide");
    Files wide = validFiles();
    wide["diet.csv"] = "predator,Algae,Grazer,Detritus,import\nGrazer,0.8,,0.2,\nFish,,0.5,,0.1\n";
    const CsvReadResult w = readFiles(wideDir, wide);
    const Problem* wideSum = findCode(w.problems, check::kDietSum);
    ASSERT_NE(wideSum, nullptr) << listed(w.problems);
    EXPECT_EQ(sum->message, wideSum->message);
    EXPECT_EQ(sum->severity, wideSum->severity);
}

TEST(CsvModel, LongFormPercentagesGetTheSameHint)
{
    Files files = longFormFiles();
    files["diet.csv"] = "predator,prey,share\nGrazer,Algae,80\nGrazer,Detritus,20\nFish,Grazer,100\n";
    TempFolder dir("percent");
    const CsvReadResult r = readFiles(dir, files);
    EXPECT_FALSE(r.model);
    const Problem* p = findCode(r.problems, check::kDietFraction);
    ASSERT_NE(p, nullptr) << listed(r.problems);
    ASSERT_TRUE(p->location);
    EXPECT_EQ(p->location->line, 2);
    EXPECT_EQ(p->location->column, 3);
    EXPECT_NE(p->hint.find("percentages"), std::string::npos) << p->hint;
}

TEST(CsvModel, LongFormHeaderWithPreyAndShareCompartmentsIsWide)
{
    // Compartments named 'prey' and 'share' make `predator,prey,share` a wide header.
    Files files;
    files["compartments.csv"] = kCompartmentsHeader + "\n"
                                "prey,producer,10,100,,,,,,,\n"
                                "share,detritus,,,,,,,,,\n"
                                "Grazer,consumer,5,10,40,,,,,,\n";
    files["diet.csv"] = "predator,prey,share\nGrazer,0.75,0.25\n";
    TempFolder dir("ambiguous");
    const CsvReadResult r = readFiles(dir, files);
    ASSERT_TRUE(r.model) << listed(r.problems);
    EXPECT_DOUBLE_EQ(r.model->diet(2, 0), 0.75);
    EXPECT_DOUBLE_EQ(r.model->diet(2, 1), 0.25);
    // ... and the writer keeps such a model in wide form, which reads back the same.
    TempFolder out("ambiguous_out");
    ASSERT_TRUE(writeCsvModel(*r.model, out.path(), {DietForm::Long}).empty());
    const CsvReadResult again = readCsvModel(out.path());
    ASSERT_TRUE(again.model) << listed(again.problems);
    EXPECT_EQ(*again.model, *r.model);
}

// A chain of n compartments: producer, detritus, then consumers eating the two before.
Model chainModel(std::size_t n)
{
    Model m;
    for (std::size_t i = 0; i < n; ++i) {
        Compartment c;
        c.name = "Box " + std::to_string(i);
        c.kind = i == 0 ? CompartmentKind::Producer : i == 1 ? CompartmentKind::Detritus : CompartmentKind::Consumer;
        if (c.kind != CompartmentKind::Detritus) c.value(Param::Biomass) = 1.0 + double(i);
        m.addCompartment(std::move(c));
    }
    for (std::size_t j = 2; j < n; ++j) {
        m.setDiet(j, j - 1, 0.75);
        m.setDiet(j, j - 2, 0.25);
    }
    return m;
}

TEST(CsvModel, WriterChoosesTheDietFormBySize)
{
    for (const std::size_t n : {kWideDietMaxCompartments, kWideDietMaxCompartments + 1}) {
        const Model m = chainModel(n);
        TempFolder dir("n" + std::to_string(n));
        ASSERT_TRUE(writeCsvModel(m, dir.path()).empty());
        const std::string diet = readText(dir.path() / "diet.csv");
        const bool longForm = n > kWideDietMaxCompartments;
        EXPECT_EQ(diet.rfind(longForm ? "predator,prey,share\n" : "predator,Box 0,Box 1,", 0), 0u) << n;
        if (longForm) {  // one line per entry: header + 2 per consumer
            EXPECT_EQ(std::count(diet.begin(), diet.end(), '\n'), std::ptrdiff_t(1 + 2 * (n - 2)));
            EXPECT_NE(diet.find("\nBox 5,Box 3,0.25\nBox 5,Box 4,0.75\n"), std::string::npos);
        }
        const CsvReadResult r = readCsvModel(dir.path());
        ASSERT_TRUE(r.model) << listed(r.problems);
        EXPECT_EQ(*r.model, m);
    }
}

}  // namespace
}  // namespace tl
