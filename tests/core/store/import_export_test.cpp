// `tledger import` / `tledger export` and the .tledger branch of solve, run as a user
// would: round trips (CSV -> project -> CSV byte for byte; project -> JSON), and bad
// input (exit 2, a message naming the file, nothing written or changed).
#include <gtest/gtest.h>
#include <sys/wait.h>

#include <cstdlib>
#include <set>

#include "core/io/csv_model.h"
#include "core/io/scor.h"
#include "core/store/model_source.h"
#include "core/store/project_file.h"
#include "core/store/project_json.h"
#include "tests/core/store/store_test_support.h"

namespace tl {
namespace {

namespace fs = std::filesystem;
using testing::fileBytes;
using testing::TempDir;
using testing::writeBytes;

const fs::path kLagoon = fs::path(TL_SAMPLES_DIR) / "lagoon";
const fs::path kScor = fs::path(TL_FIXTURES_DIR) / "store" / "charca_de_maspalomas_lagoon.scor";

std::string quoted(const std::string& s)
{
    std::string out = "'";
    for (char c : s) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
    return out + "'";
}

struct CliRun {
    int code = -1;
    std::string out, err;
};

// Runs tledger with `dir` as the working folder (a relative --out lands there).
CliRun tledger(const TempDir& dir, const std::vector<std::string>& args)
{
    std::string cmd = "cd " + quoted(dir.path().string()) + " && " + quoted(TL_TLEDGER_EXE);
    // Appended piece by piece: GCC 12 gives a false -Wrestrict for " " + std::string.
    for (const std::string& a : args) cmd.append(" ").append(quoted(a));
    const fs::path out = dir / "stdout.txt", err = dir / "stderr.txt";
    cmd.append(" >").append(quoted(out.string())).append(" 2>").append(quoted(err.string()));
    const int status = std::system(cmd.c_str());
    CliRun r;
    r.code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
    r.out = fileBytes(out);
    r.err = fileBytes(err);
    fs::remove(out);
    fs::remove(err);
    return r;
}

std::set<std::string> filesIn(const fs::path& folder)
{
    std::set<std::string> names;
    for (const auto& e : fs::directory_iterator(folder)) names.insert(e.path().filename().string());
    return names;
}

// The lagoon sample written once by the CSV writer: its canonical form.
fs::path canonicalLagoon(const TempDir& dir)
{
    auto read = readCsvModel(kLagoon);
    EXPECT_TRUE(read.model);
    const fs::path folder = dir / "lagoon_canonical";
    EXPECT_TRUE(writeCsvModel(*read.model, folder).empty());
    return folder;
}

TEST(ImportExport, CsvToProjectToCsvGivesIdenticalFiles)
{
    TempDir dir;
    const fs::path source = canonicalLagoon(dir);
    const fs::path project = dir / "lagoon.tledger";
    CliRun r = tledger(dir, {"import", source.string(), "--into", project.string(), "--scenario", "baseline"});
    ASSERT_EQ(r.code, 0) << r.err;
    EXPECT_NE(r.out.find("imported 32 compartments"), std::string::npos) << r.out;
    const fs::path back = dir / "back";
    r = tledger(dir, {"export", project.string(), "--scenario", "baseline", "--format", "csv", "--out", back.string()});
    ASSERT_EQ(r.code, 0) << r.err;
    ASSERT_EQ(filesIn(back), filesIn(source));
    for (const std::string& name : filesIn(source))
        EXPECT_EQ(fileBytes(back / name), fileBytes(source / name)) << name << " changed on the way through the project";
    // And the model itself, compared field by field.
    auto loaded = readScenarioSource(project, std::string("baseline"));
    ASSERT_TRUE(loaded.value);
    EXPECT_EQ(loaded.value->model, *readCsvModel(source).model);
}

TEST(ImportExport, ProjectToJsonMatchesTheProjectInMemory)
{
    TempDir dir;
    const fs::path path = dir / "p.tledger";
    Project original = testing::inventedProject();
    original.runs.push_back(StoredRun{0, "baseline", "ensemble", R"({"draws": 10})", R"({"balanced_share": 1})", "x"});
    ASSERT_TRUE(ProjectFile::create(path, original).file);
    auto loaded = readModelSource(path);
    ASSERT_TRUE(loaded.project);
    original.runs[0].id = loaded.project->runs.at(0).id;
    ProjectJsonOptions noStamps;
    noStamps.timestamps = false;
    const std::string fromFile = projectJson(*loaded.project, noStamps);
    EXPECT_EQ(fromFile, projectJson(original, noStamps));
    EXPECT_NE(fromFile.find("\"more nets\""), std::string::npos);
    EXPECT_NE(fromFile.find("\"catch curve, \\\"rough\\\"\""), std::string::npos) << "quotes escaped";

    // The CLI's JSON is valid JSON with one solve result per scenario (checked by Python's
    // json module when it is there).
    const fs::path json = dir / "p.json";
    CliRun r = tledger(dir, {"export", path.string(), "--format", "json", "--out", json.string()});
    ASSERT_EQ(r.code, 0) << r.err;
    const std::string text = fileBytes(json);
    EXPECT_NE(text.find("\"notice\": \"Model output supports, and does not replace"), std::string::npos);
    if (std::system("python3 -c 'import json' >/dev/null 2>&1") == 0) {
        const std::string check = "python3 -c \"import json,sys; d=json.load(open(sys.argv[1])); "
                                  "assert [s['name'] for s in d['scenarios']] == ['baseline', 'more nets']; "
                                  "assert all(s['result']['status'] in ('balanced','unbalanced','invalid') for s in d['scenarios']); "
                                  "assert d['scenarios'][0]['inputs']['compartments'][0]['biomass'] == 0.8\" " +
                                  quoted(json.string());
        EXPECT_EQ(std::system(check.c_str()), 0) << text.substr(0, 2000);
    }
}

TEST(ImportExport, SolveAndCheckReadProjectScenarios)
{
    TempDir dir;
    const fs::path project = dir / "two.tledger";
    ASSERT_TRUE(ProjectFile::create(project, testing::inventedProject()).file);
    CliRun r = tledger(dir, {"solve", project.string()});
    EXPECT_EQ(r.code, 2);
    EXPECT_NE(r.err.find(project.string()), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("'baseline', 'more nets'"), std::string::npos) << r.err;
    r = tledger(dir, {"solve", project.string(), "--scenario", "more nets", "--json"});
    EXPECT_TRUE(r.code == 0 || r.code == 1) << r.err;
    EXPECT_NE(r.out.find("\"status\""), std::string::npos);
    r = tledger(dir, {"check", project.string(), "--scenario", "nope"});
    EXPECT_EQ(r.code, 2);
    EXPECT_NE(r.err.find("no scenario named 'nope'"), std::string::npos) << r.err;
}

TEST(ImportExport, ImportIntoAnExistingProject)
{
    TempDir dir;
    const fs::path source = canonicalLagoon(dir);
    const fs::path project = dir / "p.tledger";
    ASSERT_EQ(tledger(dir, {"import", source.string(), "--into", project.string(), "--scenario", "a"}).code, 0);
    CliRun r = tledger(dir, {"import", source.string(), "--into", project.string(), "--scenario", "b", "--parent", "a",
                          "--description", "second, \"quoted\""});
    ASSERT_EQ(r.code, 0) << r.err;
    const std::string before = fileBytes(project);
    r = tledger(dir, {"import", source.string(), "--into", project.string(), "--scenario", "b"});
    EXPECT_EQ(r.code, 2);
    EXPECT_NE(r.err.find("already has a scenario named 'b'"), std::string::npos) << r.err;
    EXPECT_EQ(fileBytes(project), before);
    r = tledger(dir, {"import", source.string(), "--into", project.string(), "--scenario", "c", "--parent", "ghost"});
    EXPECT_EQ(r.code, 2);
    EXPECT_EQ(fileBytes(project), before);
    ASSERT_EQ(tledger(dir, {"import", source.string(), "--into", project.string(), "--scenario", "b", "--replace"}).code, 0);
    auto list = ProjectFile::open(project, OpenMode::ReadOnly).file->listScenarios();
    ASSERT_EQ(list.value->size(), 2u);
    EXPECT_EQ((*list.value)[1].parent, "a");
}

TEST(ImportExport, BadCsvIsRefusedAndNoProjectIsCreated)
{
    TempDir dir;
    const fs::path source = canonicalLagoon(dir);
    writeBytes(source / "compartments.csv", "name,kind,biomass,pb,qb,ee,pq,unassim,biomass_accum,net_emigration,detritus_import\n"
                                            "algae,producer,lots,100,,,,,,,\n");
    const fs::path project = dir / "never.tledger";
    CliRun r = tledger(dir, {"import", source.string(), "--into", project.string(), "--scenario", "x"});
    EXPECT_EQ(r.code, 2);
    EXPECT_NE(r.err.find("compartments.csv:2:3"), std::string::npos) << r.err;
    EXPECT_FALSE(fs::exists(project));
}

TEST(ImportExport, ImportRefusesATargetThatIsNotAProject)
{
    TempDir dir;
    const fs::path source = canonicalLagoon(dir);
    const fs::path notes = dir / "notes.tledger";
    writeBytes(notes, "my notes, not a project\n");
    CliRun r = tledger(dir, {"import", source.string(), "--into", notes.string(), "--scenario", "x"});
    EXPECT_EQ(r.code, 2);
    EXPECT_NE(r.err.find(notes.string()), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("not a Trophic Ledger project"), std::string::npos) << r.err;
    EXPECT_EQ(fileBytes(notes), "my notes, not a project\n");
}

TEST(ImportExport, ExportWithBadInputWritesNothing)
{
    TempDir dir;
    const fs::path project = dir / "p.tledger";
    ASSERT_TRUE(ProjectFile::create(project, testing::inventedProject()).file);
    const fs::path out = dir / "out";
    CliRun r = tledger(dir, {"export", (dir / "missing.tledger").string(), "--format", "json", "--out", out.string()});
    EXPECT_EQ(r.code, 2);
    EXPECT_NE(r.err.find("missing.tledger"), std::string::npos);
    r = tledger(dir, {"export", project.string(), "--scenario", "ghost", "--format", "csv", "--out", out.string()});
    EXPECT_EQ(r.code, 2);
    EXPECT_NE(r.err.find("no scenario named 'ghost'"), std::string::npos) << r.err;
    r = tledger(dir, {"export", project.string(), "--format", "csv", "--out", out.string()});
    EXPECT_EQ(r.code, 2) << "two scenarios and no --scenario";
    EXPECT_NE(r.err.find("say which one"), std::string::npos) << r.err;
    r = tledger(dir, {"export", project.string(), "--scenario", "baseline", "--format", "xml", "--out", out.string()});
    EXPECT_EQ(r.code, 2);
    EXPECT_FALSE(fs::exists(out));
    // Only the project, and no stray temporary file, is in the folder.
    EXPECT_EQ(filesIn(dir.path()), (std::set<std::string>{"p.tledger"}));

    writeBytes(out, "keep me");
    r = tledger(dir, {"export", project.string(), "--scenario", "baseline", "--format", "csv", "--out", out.string()});
    EXPECT_EQ(r.code, 2);
    EXPECT_EQ(fileBytes(out), "keep me");
}

TEST(ImportExport, HtmlReportEscapesNamesAndStatesItsLimits)
{
    TempDir dir;
    Project p = testing::inventedProject();
    p.scenarios[0].model.compartment(0).name = "<script>alert('pike')</script> & co";
    const fs::path project = dir / "p.tledger";
    ASSERT_TRUE(ProjectFile::create(project, p).file);
    const fs::path report = dir / "report.html";
    CliRun r = tledger(dir, {"export", project.string(), "--format", "html", "--out", report.string()});
    ASSERT_EQ(r.code, 0) << r.err;
    const std::string text = fileBytes(report);
    EXPECT_EQ(text.find("<script>"), std::string::npos) << "names are escaped";
    EXPECT_NE(text.find("&lt;script&gt;alert(&#39;pike&#39;)&lt;/script&gt; &amp; co"), std::string::npos);
    EXPECT_NE(text.find("does not replace, stock assessment"), std::string::npos);
    EXPECT_NE(text.find("Scenario: more nets"), std::string::npos);
    EXPECT_NE(text.find("Balance status: <strong>"), std::string::npos);
    // A duplicate is a frozen copy (issue 13, item 6): never "derived", which suggests it follows.
    EXPECT_NE(text.find("Copied from scenario baseline"), std::string::npos);
    EXPECT_EQ(text.find("Derived from"), std::string::npos);
}

// `--out -` is standard output (issue 13, item 16): the bytes are those the same export
// writes into a file, and no file named "-" appears; a CSV folder cannot go there.
TEST(ImportExport, OutDashWritesToStandardOutput)
{
    TempDir dir;
    const fs::path project = dir / "p.tledger";
    ASSERT_TRUE(ProjectFile::create(project, testing::inventedProject()).file);
    for (const std::string format : {"html", "scor", "json"}) {
        SCOPED_TRACE(format);
        std::vector<std::string> args{"export", project.string(), "--scenario", "baseline", "--format", format};
        const fs::path file = dir / ("p." + format);
        std::vector<std::string> toFile = args, toStdout = args;
        toFile.insert(toFile.end(), {"--out", file.string()});
        toStdout.insert(toStdout.end(), {"--out", "-"});
        ASSERT_EQ(tledger(dir, toFile).code, 0);
        const CliRun r = tledger(dir, toStdout);
        ASSERT_EQ(r.code, 0) << r.err;
        EXPECT_FALSE(fs::exists(dir / "-")) << "a file named '-' was written";
        EXPECT_EQ(r.out, fileBytes(file));  // no time stamp of the export in any of them
        EXPECT_FALSE(r.out.empty());
    }
    const CliRun csv = tledger(dir, {"export", project.string(), "--scenario", "baseline", "--format", "csv", "--out", "-"});
    EXPECT_EQ(csv.code, 2);
    EXPECT_NE(csv.err.find("standard output"), std::string::npos) << csv.err;
    EXPECT_FALSE(fs::exists(dir / "-"));
}

TEST(ImportExport, ScorFileImportsAndExportsBack)
{
    TempDir dir;
    const fs::path project = dir / "charca.tledger";
    CliRun r = tledger(dir, {"import", kScor.string(), "--into", project.string(), "--scenario", "published"});
    ASSERT_EQ(r.code, 0) << r.err;
    EXPECT_NE(r.err.find("Suspended POC"), std::string::npos) << "warnings about detritus-to-detritus flows are shown";
    r = tledger(dir, {"solve", project.string(), "--json"});
    EXPECT_TRUE(r.code == 0 || r.code == 1) << r.err;
    const fs::path scor = dir / "back.scor";
    r = tledger(dir, {"export", project.string(), "--format", "scor", "--out", scor.string()});
    ASSERT_EQ(r.code, 0) << r.err;
    auto back = readScorFile(scor);
    ASSERT_TRUE(back.network) << (back.problems.empty() ? "" : back.problems[0].describe());
    EXPECT_EQ(back.network->names.size(), 21u);
    EXPECT_EQ(back.network->livingCount, 18u);
}

}  // namespace
}  // namespace tl
