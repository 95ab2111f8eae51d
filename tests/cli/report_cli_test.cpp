// `tledger export --format html|pdf` (issue 16) as a user runs it: the report of one
// scenario or a comparison. The PDF is read back with poppler-utils (pdftotext,
// pdfinfo, pdftoppm; Debian package in TL_PACKAGES): it holds the title, every
// compartment and the caution, and every page renders. With TL_SNAPSHOT_DIR set the
// rendered pages are kept there to be looked at.
#include <gtest/gtest.h>

#include <cctype>
#include <cstdlib>
#include <filesystem>
#include <string>

#include "core/io/balance_report.h"
#include "core/store/model_source.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

const fs::path kLagoon = fs::path(TL_SAMPLES_DIR) / "lagoon.tledger";
const fs::path kReservoir = fs::path(TL_SAMPLES_DIR) / "reservoir.tledger";

// Output of a shell command (stdout), or nullopt when it fails.
std::optional<std::string> capture(const std::string& command)
{
    const ScratchDir dir("capture");
    const std::string out = (dir / "out").string();
    if (std::system((command + " >" + shellQuoted(out) + " 2>/dev/null").c_str()) != 0) return std::nullopt;
    return slurp(out);
}

// Text without any white space (table cells and lines wrap names anywhere) and with the
// typographic ligatures a font may draw (ff, fi, fl, ffi, ffl) spelt out again.
std::string squeezed(const std::string& text)
{
    std::string out;
    for (unsigned char c : text)
        if (!std::isspace(c)) out += static_cast<char>(c);
    const std::pair<const char*, const char*> ligatures[] = {
        {"\xEF\xAC\x80", "ff"}, {"\xEF\xAC\x81", "fi"}, {"\xEF\xAC\x82", "fl"}, {"\xEF\xAC\x83", "ffi"}, {"\xEF\xAC\x84", "ffl"}};
    for (const auto& [ligature, letters] : ligatures)
        for (std::size_t at; (at = out.find(ligature)) != std::string::npos;) out.replace(at, 3, letters);
    return out;
}

std::vector<std::string> compartmentNames(const fs::path& project)
{
    std::vector<std::string> names;
    const ModelSource source = readModelSource(project);
    for (const Scenario& s : source.project->scenarios)
        for (const Compartment& c : s.model.compartments()) names.push_back(c.name);
    return names;
}

TEST(ReportCli, HtmlProvenanceMatchesTheFile)
{
    const CliRun run = runTledger("export " + shellQuoted(kLagoon.string()) + " --scenario baseline --format html --out -");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const auto digest = capture("/usr/bin/python3 -c 'import hashlib,sys; print(hashlib.sha256(open(sys.argv[1],\"rb\").read()).hexdigest())' " +
                                shellQuoted(kLagoon.string()));
    ASSERT_TRUE(digest);
    EXPECT_NE(run.out.find(digest->substr(0, 64)), std::string::npos) << "the SHA-256 of Python's hashlib";
    EXPECT_NE(run.out.find("lagoon.tledger"), std::string::npos);
    EXPECT_NE(run.out.find("<h2>Scenario: baseline</h2>"), std::string::npos);
    EXPECT_EQ(run.out.find("Scenario: clam raking closed"), std::string::npos);
    // The day: SOURCE_DATE_EPOCH when set (1 700 000 000 s is 2023-11-14 UTC).
    ASSERT_EQ(::setenv("SOURCE_DATE_EPOCH", "1700000000", 1), 0);
    const CliRun fixed = runTledger("export " + shellQuoted(kLagoon.string()) + " --format html --out -");
    ::unsetenv("SOURCE_DATE_EPOCH");
    EXPECT_NE(fixed.out.find("2023-11-14 (UTC)"), std::string::npos);
}

TEST(ReportCli, BadScenarioNamesAndOptions)
{
    CliRun run = runTledger("export " + shellQuoted(kLagoon.string()) + " --scenarios 'baseline,clam raking' --format html --out -");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("no scenario named 'clam raking'"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("'clam raking closed'"), std::string::npos) << run.err;
    EXPECT_TRUE(run.out.empty());
    run = runTledger("export " + shellQuoted(kLagoon.string()) + " --scenarios 'baseline,clam raking closed' --format json --out -");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("--scenarios"), std::string::npos) << run.err;
    run = runTledger("export " + shellQuoted(kLagoon.string()) + " --scenario nope --format html --out -");
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("no scenario named 'nope'"), std::string::npos) << run.err;
    EXPECT_NE(run.err.find("'clam raking closed'"), std::string::npos) << run.err;
    // A CSV folder's scenario takes the name --scenario gives it (the MODEL rule).
    const fs::path folder = fs::path(TL_SAMPLES_DIR) / "lagoon";
    run = runTledger("export " + shellQuoted(folder.string()) + " --scenario 'my lagoon' --format html --out -");
    EXPECT_EQ(run.exitCode, 0) << run.err;
    EXPECT_NE(run.out.find("<h2>Scenario: my lagoon</h2>"), std::string::npos);
    EXPECT_NE(run.out.find("lagoon (CSV model folder)"), std::string::npos);
}

#ifdef TL_HAVE_FIGURE_PROGRAM
TEST(ReportCli, PdfComparisonHoldsTitleCompartmentsAndCautionAndRenders)
{
    ASSERT_TRUE(capture("command -v pdftotext && command -v pdftoppm && command -v pdfinfo"))
        << "poppler-utils is missing (it is in TL_PACKAGES of app/bootstrap.sh)";
    const ScratchDir dir("report_pdf");
    const fs::path pdf = dir / "lagoon comparison.pdf";
    const CliRun run = runTledger("export " + shellQuoted(kLagoon.string()) +
                                  " --scenarios 'baseline,clam raking closed' --format pdf --out " + shellQuoted(pdf.string()));
    ASSERT_EQ(run.exitCode, 0) << run.err;
    ASSERT_TRUE(fs::exists(pdf));
    const auto text = capture("pdftotext -enc UTF-8 " + shellQuoted(pdf.string()) + " -");
    ASSERT_TRUE(text) << "pdftotext could not read the PDF";
    const std::string flat = squeezed(*text);
    EXPECT_NE(flat.find(squeezed("Comparison report: lagoon")), std::string::npos);
    EXPECT_NE(flat.find(squeezed(kDecisionSupportNotice)), std::string::npos);
    for (const std::string& name : compartmentNames(kLagoon)) EXPECT_NE(flat.find(squeezed(name)), std::string::npos) << name;
    EXPECT_NE(flat.find("Inputsthatdiffer(8)"), std::string::npos);

    const auto info = capture("pdfinfo " + shellQuoted(pdf.string()));
    ASSERT_TRUE(info);
    const std::size_t at = info->find("Pages:");
    ASSERT_NE(at, std::string::npos);
    const int pages = std::atoi(info->c_str() + at + 6);
    EXPECT_GT(pages, 3);
    const char* keep = std::getenv("TL_SNAPSHOT_DIR");
    const fs::path out = keep ? fs::path(keep) : dir.path();
    fs::create_directories(out);
    ASSERT_TRUE(capture("pdftoppm -r 40 -png " + shellQuoted(pdf.string()) + " " + shellQuoted((out / "report-page").string())));
    int rendered = 0;
    for (const auto& entry : fs::directory_iterator(out))
        if (entry.path().filename().string().rfind("report-page", 0) == 0 && entry.path().extension() == ".png" &&
            fs::file_size(entry.path()) > 1000)
            ++rendered;
    EXPECT_EQ(rendered, pages);
}

TEST(ReportCli, PdfOfOneScenarioToStandardOutput)
{
    const CliRun run = runTledger("export " + shellQuoted(kReservoir.string()) + " --scenario 'invasive mussel' --format pdf --out -");
    ASSERT_EQ(run.exitCode, 0) << run.err;
    EXPECT_EQ(run.out.rfind("%PDF-", 0), 0u);
    const ScratchDir dir("report_pdf");
    writeText(dir / "r.pdf", run.out);
    const auto text = capture("pdftotext -enc UTF-8 " + shellQuoted((dir / "r.pdf").string()) + " -");
    ASSERT_TRUE(text);
    const std::string flat = squeezed(*text);
    EXPECT_NE(flat.find(squeezed("Report: ")), std::string::npos);
    EXPECT_NE(flat.find(squeezed(kDecisionSupportNotice)), std::string::npos);
    const ModelSource source = readModelSource(kReservoir, {std::string("invasive mussel")});
    for (const Compartment& c : source.project->scenarios.front().model.compartments())
        EXPECT_NE(flat.find(squeezed(c.name)), std::string::npos) << c.name;
}
#endif

}  // namespace
}  // namespace tl::testing
