// tledger fieldwork as a user runs it: the invented reservoir survey fills a scenario
// end to end (sample_projects/reservoir_survey/fill_reservoir.sh), every written value
// is the one the command prints, with its CV and source note; bad input exits 2 naming
// the cell or option and leaves the project as it was.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <string>

#include "core/store/project_file.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

const fs::path kSurvey = fs::path(TL_SAMPLES_DIR) / "reservoir_survey";

std::string q(const fs::path& p) { return shellQuoted(p.string()); }

std::string surveyFile(const char* name) { return q(kSurvey / name); }

Scenario loadScenario(const fs::path& project, const std::string& name)
{
    ProjectOpenResult opened = ProjectFile::open(project, OpenMode::ReadOnly);
    EXPECT_TRUE(opened.file);
    StoreResult<Scenario> s = opened.file->loadScenario(name);
    EXPECT_TRUE(s.value) << name;
    return s.value.value_or(Scenario{});
}

class FieldworkCli : public ::testing::Test {
protected:
    void SetUp() override { fs::copy_file(fs::path(TL_SAMPLES_DIR) / "reservoir.tledger", project_); }
    ScratchDir dir_{"fieldwork_cli"};
    fs::path project_ = dir_ / "reservoir.tledger";
};

TEST_F(FieldworkCli, TheInventedSurveyFillsTheReservoirEndToEnd)
{
    const std::string cmd = "TLEDGER=" + shellQuoted(TL_TLEDGER_EXE) + " " + q(kSurvey / "fill_reservoir.sh") + " " +
                            q(project_) + " > " + q(dir_ / "fill.out") + " 2>&1";
    ASSERT_EQ(std::system(cmd.c_str()), 0) << slurp(dir_ / "fill.out");
    const Scenario filled = loadScenario(project_, "survey 2026");
    const Scenario baseline = loadScenario(project_, "baseline");
    const Model& m = filled.model;
    ASSERT_GT(m.size(), 10u);

    // B of roach adults: the value and CV the command prints, and its source note.
    const CliRun b = runTledger("fieldwork biomass --hauls " + surveyFile("hauls.csv") + " --strata " +
                                surveyFile("strata.csv") + " --taxa " + surveyFile("taxa.csv") +
                                " --catchability 0.5 --compartment 'Roach adults' --json");
    ASSERT_EQ(b.exitCode, 0) << b.err;
    const nlohmann::json bj = b.json();
    const Compartment& roach = m.compartment(*m.indexOf("Roach adults"));
    EXPECT_DOUBLE_EQ(*roach.value(Param::Biomass), bj["value"].get<double>());
    EXPECT_DOUBLE_EQ(*roach.confidenceOf(Param::Biomass).cv, bj["cv"].get<double>());
    EXPECT_EQ(bj["strata"].size(), 3u);
    const std::string& note = roach.confidenceOf(Param::Biomass).source;
    for (const char* part : {"fieldwork 20", "swept area (Sparre & Venema 1998)", "catchability X1 = 0.5", "before: 13"})
        EXPECT_NE(note.find(part), std::string::npos) << part << " not in: " << note;
    // The invented survey was drawn around the baseline's 13 t/km²: the interval holds it.
    EXPECT_LE(bj["ci_low"].get<double>(), 13.0);
    EXPECT_GE(bj["ci_high"].get<double>(), 13.0);

    // P/B of perch adults from the catch curve, with the regression in the JSON.
    const CliRun z = runTledger("fieldwork mortality --lengths " + surveyFile("lengths.csv") +
                                " --taxon 'perch adult' --linf 40 --k 0.25 --json");
    ASSERT_EQ(z.exitCode, 0) << z.err;
    const nlohmann::json zj = z.json();
    const Compartment& perch = m.compartment(*m.indexOf("Perch adults"));
    EXPECT_DOUBLE_EQ(*perch.value(Param::PB), zj["value"].get<double>());
    EXPECT_DOUBLE_EQ(-zj["slope"].get<double>(), zj["value"].get<double>());
    EXPECT_NE(perch.confidenceOf(Param::PB).source.find("Allen 1971"), std::string::npos);
    // Q/B from the consumption equation: no sampling CV, so grade C.
    EXPECT_FALSE(perch.confidenceOf(Param::QB).cv);
    EXPECT_EQ(perch.confidenceOf(Param::QB).grade, Confidence::Grade::C);
    EXPECT_NE(perch.confidenceOf(Param::QB).source.find("Palomares & Pauly 1998"), std::string::npos);

    // Pike: P/B = M + F, M = 4.899 x 15^-0.916 (Then et al. 2015), F = catch / B of the scenario.
    const std::size_t pike = *m.indexOf("Pike");
    const double f = m.totalCatch(pike) / *m.compartment(pike).value(Param::Biomass);
    EXPECT_NEAR(*m.compartment(pike).value(Param::PB), 4.899 * std::pow(15.0, -0.916) + f, 1e-12);

    // Diets: rows sum to 1 and follow the printed shares; the note is in the description.
    const CliRun d = runTledger("fieldwork diet --stomachs " + surveyFile("stomachs.csv") + " --taxa " +
                                surveyFile("taxa.csv") + " --compartment 'Zander adults' --json");
    ASSERT_EQ(d.exitCode, 0) << d.err;
    const std::size_t zander = *m.indexOf("Zander adults");
    EXPECT_NEAR(m.dietRowSum(zander), 1.0, 1e-12);
    const nlohmann::json dj = d.json();  // kept alive across the loop
    ASSERT_GE(dj["shares"].size(), 5u);
    for (const auto& share : dj["shares"])
        EXPECT_DOUBLE_EQ(m.diet(zander, *m.indexOf(share["prey"].get<std::string>())), share["share"].get<double>());
    EXPECT_NE(filled.description.find("diet of Zander adults from stomach contents"), std::string::npos);

    // The baseline is untouched, and the refilled scenario solves.
    EXPECT_EQ(*baseline.model.compartment(*baseline.model.indexOf("Roach adults")).value(Param::Biomass), 13.0);
    const CliRun solved = runTledger("solve " + q(project_) + " --scenario 'survey 2026' --json");
    ASSERT_NE(solved.exitCode, 2) << solved.err;
    EXPECT_NE(solved.json()["status"], "invalid");
}

TEST_F(FieldworkCli, BadInputNamesTheCellOrOptionAndWritesNothing)
{
    const std::string before = slurp(project_);
    writeText(dir_ / "hauls.csv", "station,haul,date,swept_area_km2,taxon,catch_kg\n"
                                  "A,1,2026-07-01,0.02,roach adult,4\n"
                                  "B,1,2026-07-01,0.02,roach adult,four\n");
    CliRun r = runTledger("fieldwork biomass --hauls " + q(dir_ / "hauls.csv") + " --taxa " + surveyFile("taxa.csv") +
                          " --compartment 'Roach adults' --into " + q(project_) + " --scenario baseline");
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("hauls.csv:3:6:"), std::string::npos) << r.err;

    // A taxon the mapping lacks, named at its cell.
    writeText(dir_ / "hauls.csv", "station,haul,date,swept_area_km2,taxon,catch_kg\n"
                                  "A,1,2026-07-01,0.02,roach adult,4\n"
                                  "B,1,2026-07-01,0.02,gudgeon,1\n");
    r = runTledger("fieldwork biomass --hauls " + q(dir_ / "hauls.csv") + " --taxa " + surveyFile("taxa.csv") +
                   " --compartment 'Roach adults'");
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("hauls.csv:3:5:"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("gudgeon"), std::string::npos);

    // A compartment the scenario lacks; a folder as --into; --into without --scenario.
    r = runTledger("fieldwork consumption --winf 900 --temperature 11 --aspect-ratio 1.5 --into " + q(project_) +
                   " --scenario baseline --compartment 'Walleye'");
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("no compartment named 'Walleye'"), std::string::npos) << r.err;
    r = runTledger("fieldwork consumption --winf 900 --temperature 11 --aspect-ratio 1.5 --into " + q(dir_.path()) +
                   " --scenario baseline --compartment Pike");
    EXPECT_EQ(r.exitCode, 2);
    r = runTledger("fieldwork consumption --winf 900 --temperature 11 --aspect-ratio 1.5 --into " + q(project_) +
                   " --compartment Pike");
    EXPECT_EQ(r.exitCode, 2);
    // Q/B of a producer, P/B = M + F without B (predatory zooplankton's B is solved).
    r = runTledger("fieldwork consumption --winf 900 --temperature 11 --aspect-ratio 1.5 --into " + q(project_) +
                   " --scenario baseline --compartment Phytoplankton");
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("producer"), std::string::npos) << r.err;
    r = runTledger("fieldwork mortality --method then-tmax --tmax 3 --into " + q(project_) +
                   " --scenario baseline --compartment 'Predatory zooplankton'");
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("needs the biomass"), std::string::npos) << r.err;

    // Options: missing, malformed, unknown.
    r = runTledger("fieldwork mortality --lengths " + surveyFile("lengths.csv") + " --taxon 'perch adult' --k 0.25");
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("--linf is required"), std::string::npos) << r.err;
    r = runTledger("fieldwork mortality --lengths " + surveyFile("lengths.csv") +
                   " --taxon 'perch adult' --linf 40 --k 0,25");
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("--k '0,25'"), std::string::npos) << r.err;
    r = runTledger("fieldwork mortality --lengths " + surveyFile("lengths.csv") +
                   " --taxon 'perch adult' --linf 40 --k 0.25 --points 9-4");
    EXPECT_EQ(r.exitCode, 2);
    r = runTledger("fieldwork mortality --lengths " + surveyFile("lengths.csv") + " --taxon 'pike' --linf 40 --k 0.25");
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("no length class of taxon 'pike'"), std::string::npos) << r.err;
    r = runTledger("fieldwork weight --hauls x");
    EXPECT_EQ(r.exitCode, 2);
    r = runTledger("fieldwork consumption --winf 900 --temperature 11 --aspect-ratio 1.5 --food omnivore");
    EXPECT_EQ(r.exitCode, 2);

    EXPECT_EQ(slurp(project_), before) << "a refused command changed the project";
}

TEST_F(FieldworkCli, ChosenPointsAndWarningsReachTheOutput)
{
    const CliRun all = runTledger("fieldwork mortality --lengths " + surveyFile("lengths.csv") +
                                  " --taxon 'roach adult' --linf 35 --k 0.22 --json");
    const CliRun some = runTledger("fieldwork mortality --lengths " + surveyFile("lengths.csv") +
                                   " --taxon 'roach adult' --linf 35 --k 0.22 --points 5-9 --json");
    ASSERT_EQ(all.exitCode, 0) << all.err;
    ASSERT_EQ(some.exitCode, 0) << some.err;
    const nlohmann::json chosen = some.json();  // kept alive across the loop
    int selected = 0;
    for (const auto& p : chosen["points"]) selected += p["selected"].get<bool>();
    EXPECT_EQ(selected, 5);
    EXPECT_TRUE(chosen["points"][4]["selected"].get<bool>());   // point 5
    EXPECT_FALSE(chosen["points"][3]["selected"].get<bool>());  // point 4
    EXPECT_NE(all.json()["value"], chosen["value"]);

    // 35 °C is beyond the equation's data: a warning in the text and in the JSON.
    const CliRun hot = runTledger("fieldwork mortality --method pauly1980 --linf 30 --k 0.5 --temperature 35");
    ASSERT_EQ(hot.exitCode, 0) << hot.err;
    EXPECT_NE(hot.out.find("warning: T = 35"), std::string::npos) << hot.out;
    EXPECT_NE(hot.out.find("does not replace"), std::string::npos);
    const CliRun hotJson = runTledger("fieldwork mortality --method pauly1980 --linf 30 --k 0.5 --temperature 35 --json");
    EXPECT_EQ(hotJson.json()["warnings"][0]["code"], "fieldwork-outside-range");
    EXPECT_TRUE(hotJson.json()["cv"].is_null());
}

}  // namespace
}  // namespace tl::testing
