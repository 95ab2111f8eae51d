// tledger export MODEL [--scenario NAME] --format csv|json|scor|html|pdf --out PATH
// tledger export PROJECT --scenarios A,B[,C...] --format html|pdf --out PATH   (a comparison report)
// tledger export MODEL [--scenario NAME] --format svg|png|pdf --view level-bars|flow-map
//                [--dpi N] --out PATH          (figures; only in builds with the GUI)
// (DESIGN 5.2). MODEL is a CSV model folder or a .tledger project.
//   csv   the scenario as a CSV model folder (DESIGN 5.1, plus confidence/settings files)
//   json  the project: information, every scenario (or the one named) with its inputs
//         and its solve result (the `tledger solve --json` object under "result")
//   scor  the solved scenario's flow network in SCOR format
//   html  a plain, self-contained report (core/io/html_report.h): every scenario, the one
//         named, or with --scenarios a comparison; charts inline as SVG
//   pdf   without --view: the same report as PDF with vector charts (ui/report, drawn by
//         tledger-figures); with --view: one figure
// Bad input exits 2 naming the file, and nothing is written: output goes to a
// temporary path first and is renamed into place only when complete. `--out -` writes
// the file to standard output instead (the Unix convention; a CSV folder cannot be).
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <fstream>
#include <iostream>
#include <system_error>
#include <vector>

#include <unistd.h>  // execv: figures are drawn by the sibling program tledger-figures

#include "app/tledger/commands.h"
#include "app/tledger/options.h"
#include "core/balance/solver.h"
#include "core/io/atomic_file.h"
#include "core/io/balance_report.h"
#include "core/io/csv_model.h"
#include "core/io/scor.h"
#include "core/model/text.h"
#include "core/network/flow_network.h"
#include "core/io/html_report.h"
#include "core/io/sha256.h"
#include "core/compare/scenario_comparison.h"
#include "core/store/model_source.h"
#include "core/store/project_json.h"
#ifdef TL_HAVE_FIGURES
#include "ui/report/report_pdf.h"
#include "ui/results/figure_export_cli.h"
#endif

namespace tl::cli {
namespace {

namespace fs = std::filesystem;

void printProblems(const Problems& problems)
{
    for (const Problem& p : problems) std::cerr << p.describe() << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
}

// MODEL as a project, by the one rule of core/store/model_source.h.
std::optional<Project> loadProject(const fs::path& path, const std::optional<std::string>& scenario)
{
    ModelSource source = readModelSource(path, {scenario, OpenMode::ReadOnly});
    printProblems(source.problems);
    return std::move(source.project);
}

// The one scenario a csv or scor export needs.
const Scenario* singleScenario(const Project& project, const fs::path& model)
{
    if (project.scenarios.size() == 1) return &project.scenarios.front();
    std::string names;
    for (const std::string& n : project.scenarioNames()) names += (names.empty() ? "'" : ", '") + n + "'";
    std::cerr << model.string() << ": "
              << (project.scenarios.empty() ? "holds no scenario to export"
                                            : "holds " + std::to_string(project.scenarios.size()) + " scenarios (" +
                                                  names + "); say which one with --scenario NAME")
              << '\n';
    return nullptr;
}

int exportCsv(const Scenario& scenario, const fs::path& out)
{
    std::error_code ec;
    if (fs::exists(out, ec) && !fs::is_directory(out, ec)) {
        std::cerr << out.string() << ": exists and is not a folder; a CSV export writes a folder\n";
        return 2;
    }
    if (fs::is_directory(out, ec)) {
        // Each file is replaced atomically, and no file is stale afterwards (csv_model.h).
        const Problems problems = writeCsvModel(scenario.model, out);
        printProblems(problems);
        return hasErrors(problems) ? 2 : 0;
    }
    const fs::path temp = temporaryBeside(out);
    const Problems problems = writeCsvModel(scenario.model, temp);
    printProblems(problems);
    if (hasErrors(problems)) {
        fs::remove_all(temp, ec);
        return 2;
    }
    fs::rename(temp, out, ec);
    if (ec) {
        std::cerr << out.string() << ": cannot be written (" << ec.message() << ")\n";
        fs::remove_all(temp, ec);
        return 2;
    }
    return 0;
}

// `--out -` means standard output (common practice of Unix tools, no source).
bool isStandardOutput(const fs::path& out) { return out == "-"; }

// Writes `content` to `out`: atomically into a file, or whole to standard output.
int writeOutput(const fs::path& out, const std::string& content)
{
    if (isStandardOutput(out)) {
        std::cout.write(content.data(), static_cast<std::streamsize>(content.size()));
        std::cout.flush();
        return std::cout ? 0 : 2;
    }
    if (const auto error = writeFileAtomically(out, content)) {
        std::cerr << out.string() << ": " << *error << '\n';
        return 2;
    }
    return 0;
}

std::string withoutTrailingSpace(std::string s)
{
    while (!s.empty() && (s.back() == '\n' || s.back() == ' ')) s.pop_back();
    return s;
}

int exportJson(const Project& project, const fs::path& out)
{
    ProjectJsonOptions options;
    options.notice = kDecisionSupportNotice;
    const std::string json = projectJson(project, options, [](const Scenario& s) {
        return JsonMembers{{"result", withoutTrailingSpace(balanceSheetJson(solveBalance(s.model)))}};
    });
    return writeOutput(out, json);
}

int exportScor(const Project& project, const Scenario& scenario, const fs::path& out)
{
    const BalanceSheet sheet = solveBalance(scenario.model);
    if (sheet.status == BalanceStatus::Invalid) {
        printProblems(sheet.problems);
        std::cerr << "tledger export: scenario '" << scenario.name
                  << "' cannot be solved, so it has no flow network to export; nothing was written\n";
        return 1;
    }
    const FlowNetwork network = buildFlowNetwork(scenario.model, sheet);
    const ScorNetwork scor = scorFromFlowNetwork(network, project.info.title + " - " + scenario.name);
    if (const auto error = checkScorWritable(scor)) {
        std::cerr << out.string() << ": " << *error << "; nothing was written\n";
        return 2;
    }
    if (isStandardOutput(out)) {
        if (writeOutput(out, writeScor(scor)) != 0) return 2;
    } else if (const auto error = writeScorFile(scor, out)) {
        std::cerr << out.string() << ": " << *error << '\n';
        return 2;
    }
    if (sheet.status == BalanceStatus::Unbalanced)
        std::cerr << "tledger export: note: scenario '" << scenario.name
                  << "' does not balance; the exported flows are those of its current inputs\n";
    return 0;
}

// The day of the report (UTC): SOURCE_DATE_EPOCH when set (the reproducible-builds
// convention, so a report can be made again byte for byte), else today.
std::string reportDate()
{
    if (const char* epoch = std::getenv("SOURCE_DATE_EPOCH")) {
        if (const auto seconds = parseNumber(epoch); seconds && *seconds >= 0 && *seconds < 253402300800.0) {
            const std::time_t t = static_cast<std::time_t>(*seconds);
            std::tm utc{};
            gmtime_r(&t, &utc);
            char text[16];
            std::strftime(text, sizeof text, "%Y-%m-%d", &utc);
            return text;
        }
    }
    return utcNowIso8601().substr(0, 10);
}

// What the report needs beyond the project: which scenarios, and its provenance.
ReportOptions reportOptions(const ParsedOptions& opts, const fs::path& model)
{
    ReportOptions options;
    if (const auto list = opts.value("--scenarios")) {
        options.scenarios = splitScenarioList(*list);
        options.compare = true;
    } else if (const auto one = opts.value("--scenario")) {
        options.scenarios = {*one};
    }
    options.provenance.programVersion = TL_VERSION;
    options.provenance.date = reportDate();
    std::error_code ec;
    if (fs::is_regular_file(model, ec)) {
        options.provenance.projectFile = model.filename().string();
        options.provenance.projectSha256 = fileSha256(model).value_or("");
    } else {
        options.provenance.projectFile = model.filename().string() + " (CSV model folder)";
    }
    return options;
}

int exportHtml(const Project& project, const ParsedOptions& opts, const fs::path& out)
{
    const HtmlReport report = makeHtmlReport(project, reportOptions(opts, opts.positional[0]));
    if (!report.error.empty()) {
        std::cerr << "tledger export: " << opts.positional[0] << ": " << report.error << '\n';
        return 2;
    }
    return writeOutput(out, report.html);
}

// The report as PDF (vector charts; ui/report). Only in tledger-figures.
int exportPdfReport(const Project& project, const ParsedOptions& opts, const fs::path& out)
{
#ifdef TL_HAVE_FIGURES
    ReportOptions options = reportOptions(opts, opts.positional[0]);
    options.figureMarkers = true;
    const HtmlReport report = makeHtmlReport(project, options);
    if (!report.error.empty()) {
        std::cerr << "tledger export: " << opts.positional[0] << ": " << report.error << '\n';
        return 2;
    }
    const bool toStdout = isStandardOutput(out);
    std::error_code ec;
    const fs::path target = toStdout ? temporaryBeside(fs::temp_directory_path(ec) / "tledger-report.pdf") : out;
    if (const std::string error = ui::writeReportPdf(report, target.string()); !error.empty()) {
        std::cerr << "tledger export: " << error << '\n';
        return 2;
    }
    if (!toStdout) return 0;
    std::ifstream in(target, std::ios::binary);
    std::cout << in.rdbuf();
    std::cout.flush();
    in.close();
    fs::remove(target, ec);
    return std::cout ? 0 : 2;
#else
    (void)project, (void)opts, (void)out;
    std::cerr << "tledger export: --format pdf needs a build with the GUI (TL_BUILD_GUI=ON)\n";
    return 2;
#endif
}

bool isFigureFormat(const std::string& format) { return format == "svg" || format == "png" || format == "pdf"; }

// Renders one results view of the solved scenario (the chart code lives in ui/results).
int exportFigure(const Scenario& scenario, const ParsedOptions& opts, const std::string& format, const fs::path& out)
{
#ifdef TL_HAVE_FIGURES
    const auto view = opts.value("--view");
    if (!view) {
        std::cerr << "tledger export: --format " << format << " needs --view level-bars|flow-map\n";
        return 2;
    }
    ui::CliFigureRequest request;
    request.view = *view;
    request.format = format;
    request.path = out.string();
    request.scenario = scenario.name;  // the figure's title names scenario and project
    request.project = fs::path(opts.positional.at(0)).filename().string();
    if (const auto dpi = opts.value("--dpi")) {
        const auto parsed = parseNumber(*dpi);
        if (!parsed || *parsed < 30 || *parsed > 2400 || *parsed != std::floor(*parsed)) {
            std::cerr << "tledger export: --dpi '" << *dpi << "' is not a whole number between 30 and 2400\n";
            return 2;
        }
        request.dpi = static_cast<int>(*parsed);
    }
    // To standard output: drawn into a private temporary file first (the renderers
    // write files), then copied out byte for byte.
    const bool toStdout = isStandardOutput(out);
    std::error_code ec;
    const fs::path temp = toStdout ? temporaryBeside(fs::temp_directory_path(ec) / ("tledger-figure." + format)) : out;
    if (toStdout) request.path = temp.string();
    const BalanceSheet sheet = solveBalance(scenario.model);
    const std::string error = ui::exportFigureForCli(scenario.model, sheet, request);
    if (!error.empty()) {
        if (toStdout) fs::remove(temp, ec);
        std::cerr << "tledger export: " << error << '\n';
        return 2;
    }
    if (!toStdout) return 0;
    std::ifstream in(temp, std::ios::binary);
    std::cout << in.rdbuf();
    std::cout.flush();
    in.close();
    fs::remove(temp, ec);
    return std::cout ? 0 : 2;
#else
    (void)scenario, (void)opts, (void)out;
    std::cerr << "tledger export: --format " << format << " needs a build with the GUI (TL_BUILD_GUI=ON)\n";
    return 2;
#endif
}

#ifndef TL_HAVE_FIGURES
// tledger links no Qt (it would slow every start); figures are drawn by the sibling
// program tledger-figures, which runs the same export command. Returns only when that
// program cannot be started (then the caller reports that figures need the GUI build).
void handOverToFigureProgram(const Args& args)
{
    std::error_code error;
    const fs::path self = fs::read_symlink("/proc/self/exe", error);
    if (error) return;
    const fs::path figures = self.parent_path() / "tledger-figures";
    if (!fs::exists(figures, error)) return;
    std::vector<std::string> words{figures.string(), "export"};
    words.insert(words.end(), args.begin(), args.end());
    std::vector<char*> argv;
    for (std::string& w : words) argv.push_back(w.data());
    argv.push_back(nullptr);
    std::cout.flush();
    ::execv(figures.c_str(), argv.data());
}
#endif

}  // namespace

int cmdExport(const Args& args)
{
    const auto opts = parseOptions(args, {"--scenario", "--scenarios", "--format", "--out", "--view", "--dpi"}, {}, "export",
                                   std::cerr);
    if (!opts) return 2;
    const auto format = opts->value("--format");
    const auto out = opts->value("--out");
    if (opts->positional.size() != 1 || !format || !out || out->empty()) {
        std::cerr << "tledger export: usage: tledger export MODEL [--scenario NAME] --format csv|json|scor|html|pdf --out PATH\n"
                     "       tledger export PROJECT --scenarios A,B[,C...] --format html|pdf --out PATH\n"
                     "       tledger export MODEL [--scenario NAME] --format svg|png|pdf --view level-bars|flow-map [--dpi N] --out PATH\n";
        return 2;
    }
    if (*format != "csv" && *format != "json" && *format != "scor" && *format != "html" && !isFigureFormat(*format)) {
        std::cerr << "tledger export: unknown --format '" << *format << "' (expected csv, json, scor, html, svg, png or pdf)\n";
        return 2;
    }
#ifndef TL_HAVE_FIGURES
    if (isFigureFormat(*format)) handOverToFigureProgram(args);
#endif
    if (*format == "csv" && isStandardOutput(*out)) {
        std::cerr << "tledger export: --format csv writes a folder of several files, which cannot go to standard "
                     "output (--out -); give a folder path, or use --format json for one stream\n";
        return 2;
    }
    const bool pdfReport = *format == "pdf" && !opts->value("--view");
    if (opts->value("--scenarios") && *format != "html" && !pdfReport) {
        std::cerr << "tledger export: --scenarios (a comparison) goes with --format html or pdf (a report)\n";
        return 2;
    }
    if (opts->value("--scenarios") && opts->value("--scenario")) {
        std::cerr << "tledger export: give --scenario NAME (one scenario) or --scenarios A,B (a comparison), not both\n";
        return 2;
    }
    const fs::path model = opts->positional[0];
    // A comparison picks its scenarios itself (and names a wrong one with the others);
    // --scenario keeps the MODEL rule (a CSV folder's scenario takes that name).
    const auto project = loadProject(model, opts->value("--scenarios") ? std::nullopt : opts->value("--scenario"));
    if (!project) return 2;

    int code = 2;
    if (*format == "json") {
        code = exportJson(*project, *out);
    } else if (*format == "html") {
        code = exportHtml(*project, *opts, *out);
    } else if (pdfReport) {
        code = exportPdfReport(*project, *opts, *out);
    } else {
        const Scenario* scenario = singleScenario(*project, model);
        if (!scenario) return 2;
        if (isFigureFormat(*format)) code = exportFigure(*scenario, *opts, *format, *out);
        else code = *format == "csv" ? exportCsv(*scenario, *out) : exportScor(*project, *scenario, *out);
    }
    // On standard output the content is the whole output: no note is added to it.
    if (code == 0 && !isStandardOutput(*out)) std::cout << "wrote " << *out << '\n';
    return code;
}

}  // namespace tl::cli
