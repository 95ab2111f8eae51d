// tledger fieldwork biomass|mortality|consumption|diet ... [--into PROJECT --scenario NAME
//                  --compartment C] [--json]
// (DESIGN 3.8, 5.2): turns survey data into a model parameter with its uncertainty
// (core/fieldwork) and, with --into, writes it into one scenario of a .tledger project
// (one transaction): the value, its CV and a source note with method, inputs and date.
// --into may also name a CSV model folder (DESIGN 5.1; no --scenario): B, P/B and Q/B are
// written back with their CV and note in confidence.csv; a diet is refused there (the
// folder has no description for its note).
//
//   biomass      --hauls F --taxa F --compartment C [--strata F] [--catchability X1]
//                -> B (swept area); converted to the project's biomass unit when written
//   mortality    --lengths F --taxon T --linf CM --k K [--method catch-curve|mean-length]
//                [--points 4-9|4,5,6] [--cutoff CM]                    -> Z = P/B
//                --method pauly1980 --linf CM --k K --temperature C    -> M
//                --method then-tmax --tmax YEARS | then-growth --linf CM --k K  -> M
//                (written as P/B = M + F, F = catch / B of the scenario)
//   consumption  --winf G --temperature C --aspect-ratio A [--food carnivore|herbivore|
//                detritivore]                                          -> Q/B
//   uncertainty of the empirical equations (M, Q/B): --linf-se|--linf-cv, --k-se|--k-cv,
//                --temperature-se, --tmax-se|--tmax-cv, --winf-se|--winf-cv,
//                --aspect-ratio-se, --residual-sd (SD of ln result) -> a CV and interval
//                (delta method, core/fieldwork/empirical_equations.h) instead of grade C
//   diet         --stomachs F --taxa F --compartment C [--summary mean|pooled]
//                -> the diet row of C (its note goes to the scenario description)
// Warnings (an input outside an equation's fitted range) are part of the text and JSON output.
// Exit: 0 estimated (and written), 2 bad input (the file, line and column, or the option).
#include <algorithm>
#include <cmath>
#include <filesystem>
#include <functional>
#include <iostream>
#include <system_error>

#include "app/tledger/commands.h"
#include "app/tledger/options.h"
#include "core/fieldwork/apply_estimate.h"
#include "core/fieldwork/empirical_equations.h"
#include "core/fieldwork/fieldwork_report.h"
#include "core/fieldwork/unit_conversion.h"
#include "core/io/balance_report.h"
#include "core/io/csv_model.h"
#include "core/model/problem_codes.h"
#include "core/io/text_table.h"
#include "core/model/text.h"
#include "core/store/project_file.h"

namespace tl::cli {
namespace {

using namespace tl::fieldwork;

constexpr const char* kUsage =
    "usage: tledger fieldwork biomass --hauls F --taxa F --compartment C [--strata F] [--catchability X1]\n"
    "       tledger fieldwork mortality --lengths F --taxon T --linf CM --k K [--method catch-curve|mean-length]\n"
    "                                   [--points 4-9|4,5,6] [--cutoff CM]\n"
    "       tledger fieldwork mortality --method pauly1980 --linf CM --k K --temperature C\n"
    "       tledger fieldwork mortality --method then-tmax --tmax YEARS | --method then-growth --linf CM --k K\n"
    "       tledger fieldwork consumption --winf G --temperature C --aspect-ratio A [--food carnivore|herbivore|detritivore]\n"
    "       tledger fieldwork diet --stomachs F --taxa F --compartment C [--summary mean|pooled]\n"
    "  M and Q/B equations: [--linf-se CM|--linf-cv X] [--k-se K|--k-cv X] [--temperature-se C]\n"
    "                       [--tmax-se YEARS|--tmax-cv X] [--winf-se G|--winf-cv X] [--aspect-ratio-se A]\n"
    "                       [--residual-sd SD-OF-LN]\n"
    "  each: [--into PROJECT --scenario NAME --compartment C] [--level 0.95] [--json]\n"
    "        (--into a CSV model folder: no --scenario; not for diet)\n";

void printProblems(const Problems& problems)
{
    for (const Problem& p : problems)
        std::cerr << (p.severity == Severity::Error ? "" : "warning: ") << p.describe()
                  << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
}

// A number option: absent -> nullopt with ok kept; malformed or not positive -> ok false.
std::optional<double> numberOption(const ParsedOptions& o, const std::string& name, bool& ok, bool positive = true)
{
    const auto text = o.value(name);
    if (!text) return std::nullopt;
    const auto v = parseNumber(trim(*text));
    if (!v || (positive && !(*v > 0.0))) {
        std::cerr << "tledger fieldwork: " << name << " '" << *text << "': expected a " << (positive ? "positive " : "")
                  << "number with '.' as decimal mark\n";
        ok = false;
        return std::nullopt;
    }
    return v;
}

// The options a method needs, each named when missing.
bool require(const ParsedOptions& o, std::initializer_list<const char*> names, const std::string& what)
{
    bool ok = true;
    for (const char* n : names)
        if (!o.value(n)) {
            std::cerr << "tledger fieldwork " << what << ": " << n << " is required\n";
            ok = false;
        }
    return ok;
}

// The standard errors an empirical equation may be given. --NAME-se is in the input's
// own unit, --NAME-cv a fraction of its value (L∞, K, tmax and W∞ only); both for one
// input, a negative number, or one given to a method that does not use it is refused.
constexpr const char* kUncertaintyOptions[] = {"--linf-se", "--linf-cv", "--k-se", "--k-cv", "--temperature-se",
                                                "--tmax-se", "--tmax-cv", "--winf-se", "--winf-cv",
                                                "--aspect-ratio-se", "--residual-sd"};

std::optional<EquationUncertainty> uncertaintyOf(const ParsedOptions& o, const std::string& method,
                                                 std::initializer_list<const char*> used, double level,
                                                 const char* note = "")
{
    bool ok = true;
    for (const char* name : kUncertaintyOptions) {
        const bool isUsed = std::any_of(used.begin(), used.end(), [&](const char* u) {
            return std::string(name).rfind(u, 0) == 0 || std::string(name) == "--residual-sd";
        });
        if (o.value(name) && !isUsed) {
            std::cerr << "tledger fieldwork: " << name << " is not used by " << method
                      << note << '\n';
            ok = false;
        }
    }
    if (!ok) return std::nullopt;
    auto nonNegative = [&](const std::string& name) -> double {
        const auto text = o.value(name);
        if (!text) return 0.0;
        const auto v = parseNumber(trim(*text));
        if (!v || !(*v >= 0.0)) {
            std::cerr << "tledger fieldwork: " << name << " '" << *text
                      << "': expected zero or a positive number with '.' as decimal mark\n";
            ok = false;
            return 0.0;
        }
        return *v;
    };
    // SE of an input from --X-se, or from --X-cv times its value.
    auto seOf = [&](const std::string& stem, std::optional<double> value) -> double {
        const bool hasSe = o.value(stem + "-se").has_value(), hasCv = o.value(stem + "-cv").has_value();
        if (hasSe && hasCv) {
            std::cerr << "tledger fieldwork: give " << stem << "-se or " << stem << "-cv, not both\n";
            ok = false;
            return 0.0;
        }
        return hasCv ? nonNegative(stem + "-cv") * value.value_or(0.0) : nonNegative(stem + "-se");
    };
    bool numbersOk = true;
    EquationUncertainty u;
    u.ciLevel = level;
    u.linfSe = seOf("--linf", numberOption(o, "--linf", numbersOk));
    u.kSe = seOf("--k", numberOption(o, "--k", numbersOk));
    u.tmaxSe = seOf("--tmax", numberOption(o, "--tmax", numbersOk));
    u.winfSe = seOf("--winf", numberOption(o, "--winf", numbersOk));
    u.temperatureSe = nonNegative("--temperature-se");
    u.aspectRatioSe = nonNegative("--aspect-ratio-se");
    u.residualSdLn = nonNegative("--residual-sd");
    if (!ok || !numbersOk) return std::nullopt;
    return u;
}

// "4-9" or "4,5,6" (1-based point numbers as the table prints them) -> 0-based indices.
std::optional<std::vector<std::size_t>> parsePoints(const std::string& text)
{
    std::vector<std::size_t> out;
    std::size_t start = 0;
    while (start <= text.size()) {
        const std::size_t comma = std::min(text.find(',', start), text.size());
        const std::string item(trim(text.substr(start, comma - start)));
        const std::size_t dash = item.find('-');
        const auto from = parseNumber(dash == std::string::npos ? item : item.substr(0, dash));
        const auto to = dash == std::string::npos ? from : parseNumber(item.substr(dash + 1));
        if (!from || !to || *from < 1 || *to < *from || std::floor(*from) != *from || std::floor(*to) != *to)
            return std::nullopt;
        for (auto k = static_cast<std::size_t>(*from); k <= static_cast<std::size_t>(*to); ++k) out.push_back(k - 1);
        start = comma + 1;
    }
    return out;
}

// Where to write, when --into is given.
struct Target {
    std::filesystem::path project;
    std::string scenario, compartment;
};

std::optional<Target> targetOf(const ParsedOptions& o)
{
    const auto into = o.value("--into");
    if (!into) return std::nullopt;
    Target t;
    t.project = *into;
    t.scenario = std::string(trim(o.value("--scenario").value_or("")));
    t.compartment = std::string(trim(o.value("--compartment").value_or("")));
    return t;
}

// Opens the project, loads the scenario, lets `edit` change its model (returning false
// and printing why when it cannot), and saves the scenario in one transaction.
// A CSV model folder (DESIGN 5.1) as the target: read, edited, and its compartments.csv
// and confidence.csv written back (the value's CV and source note go to confidence.csv;
// writeCsvModel's round trip loses nothing). It holds one model and no
// scenario description, so --scenario does not apply and an edit that needs the
// description (a diet's note) is refused before anything is written.
int editCsvFolder(const Target& t, const std::function<bool(Scenario&, std::size_t)>& edit)
{
    const std::string folder = t.project.string();
    if (!t.scenario.empty()) {
        std::cerr << "tledger fieldwork: --scenario does not apply to the CSV model folder " << folder
                  << " (it holds one model); leave it out\n";
        return 2;
    }
    if (t.compartment.empty()) {
        std::cerr << "tledger fieldwork: --into needs --compartment C\n";
        return 2;
    }
    CsvReadResult read = readCsvModel(t.project);
    printProblems(read.problems);
    if (!read.model) {
        std::cerr << "tledger fieldwork: " << folder << " is not a readable CSV model folder; nothing was written\n";
        return 2;
    }
    Scenario scenario;
    scenario.model = std::move(*read.model);
    const auto index = scenario.model.indexOf(t.compartment);
    if (!index) {
        std::cerr << "tledger fieldwork: " << folder << " has no compartment named '" << t.compartment << "'\n";
        return 2;
    }
    if (!edit(scenario, *index)) {
        std::cerr << "tledger fieldwork: nothing was written; " << folder << " is unchanged\n";
        return 2;
    }
    if (!scenario.description.empty()) {
        std::cerr << "tledger fieldwork: a CSV model folder has no scenario description to keep the diet's note "
                     "(method, stomachs, CVs); nothing was written to "
                  << folder << " (write into a .tledger project, or import the folder with tledger import)\n";
        return 2;
    }
    // Only compartments.csv and confidence.csv change: both are written whole into a
    // scratch folder inside the target (same file system), then renamed over the old ones,
    // the note first, so the other files keep their layout and a new value never stands
    // without its note.
    const std::filesystem::path scratch = t.project / ".tledger-fieldwork-write";
    std::error_code ec;
    std::filesystem::remove_all(scratch, ec);
    Problems saved = writeCsvModel(scenario.model, scratch);
    for (const char* name : {"confidence.csv", "compartments.csv"}) {
        if (hasErrors(saved)) break;
        std::filesystem::rename(scratch / name, t.project / name, ec);
        if (ec) {
            Problem p;
            p.code = code::kCsvWrite;
            p.message = "cannot replace " + (t.project / name).string() + ": " + ec.message();
            p.location = FileLocation{(t.project / name).string(), 0, 0};
            saved.push_back(std::move(p));
        }
    }
    std::filesystem::remove_all(scratch, ec);
    printProblems(saved);
    return hasErrors(saved) ? 2 : 0;
}

int editScenario(const Target& t, const std::function<bool(Scenario&, std::size_t)>& edit)
{
    std::error_code ec;
    if (std::filesystem::is_directory(t.project, ec)) return editCsvFolder(t, edit);
    if (t.scenario.empty() || t.compartment.empty()) {
        std::cerr << "tledger fieldwork: --into needs --scenario NAME and --compartment C\n";
        return 2;
    }
    ProjectOpenResult opened = ProjectFile::open(t.project, OpenMode::ReadWrite);
    printProblems(opened.problems);
    if (!opened.file || opened.readOnly) {
        std::cerr << "tledger fieldwork: " << t.project.string() << " cannot be written"
                  << (opened.readOnlyReason.empty() ? "" : " (" + opened.readOnlyReason + ")") << "\n";
        return 2;
    }
    StoreResult<Scenario> loaded = opened.file->loadScenario(t.scenario);
    if (!loaded.value) {
        printProblems(loaded.problems);
        return 2;
    }
    Scenario& scenario = *loaded.value;
    const auto index = scenario.model.indexOf(t.compartment);
    if (!index) {
        std::cerr << "tledger fieldwork: scenario '" << t.scenario << "' of " << t.project.string()
                  << " has no compartment named '" << t.compartment << "'\n";
        return 2;
    }
    if (!edit(scenario, *index)) {
        std::cerr << "tledger fieldwork: nothing was written; " << t.project.string() << " is unchanged\n";
        return 2;
    }
    const Problems saved = opened.file->saveScenario(scenario);
    if (hasErrors(saved)) {
        printProblems(saved);
        return 2;
    }
    return 0;
}

// Writes a scalar estimate into `param` (core/fieldwork/apply_estimate.h: B converted to
// the project's unit, M written as P/B = M + F).
int writeScalar(const Target& t, Param param, const Estimate& e, const ConversionFactors& factors, std::string& written)
{
    return editScenario(t, [&](Scenario& s, std::size_t i) {
        const auto& old = s.model.compartment(i).value(param);
        const std::string before = old ? displayNumber(*old) : std::string("unknown");
        Estimate out;
        const Problems p = applyEstimate(s.model, i, param, e, utcNowIso8601(), factors, &out);
        printProblems(p);  // errors, or a warning that the compartment has nothing left unknown
        if (hasErrors(p)) return false;
        const std::string where = t.scenario.empty() ? "the CSV model folder " + t.project.string()
                                                     : "scenario '" + t.scenario + "' of " + t.project.string();
        written = std::string(paramSymbol(param)) + " of " + t.compartment + " in " + where + ": " +
                  displayNumber(out.value) + " " + out.unit + " (was " + before + ")";
        return true;
    });
}

void printWritten(const std::string& written, bool json)
{
    if (!json && !written.empty()) std::cout << "written: " << written << "\n";
}

// Output of one estimate: JSON (with the extras of its method) or text.
void report(const Estimate& e, bool json, const std::function<void(JsonWriter&)>& extras, const std::string& table,
            const std::string& written)
{
    if (json) {
        JsonWriter w;
        w.beginObject();
        writeEstimateJson(w, e);
        if (extras) extras(w);
        w.key("written");
        if (written.empty()) w.null();
        else w.value(written);
        w.endObject();
        std::cout << w.str() << "\n";
        return;
    }
    std::cout << table << estimateText(e);
    printWritten(written, json);
    std::cout << kDecisionSupportNotice << "\n";
}

// An estimate that cannot be made: its problems on stderr and, with --json, the status JSON
// that the other commands print (issue 12, defect 6), exit 2.
int failed(const ParsedOptions& o, const Problems& problems)
{
    printProblems(problems);
    if (o.has("--json")) std::cout << statusJson("invalid", problems, "the estimate cannot be made from these data");
    return 2;
}

// --- biomass ----------------------------------------------------------------------------
int biomass(const ParsedOptions& o, const ConversionFactors& factors)
{
    if (!require(o, {"--hauls", "--taxa", "--compartment"}, "biomass")) return 2;
    bool ok = true;
    SweptAreaOptions options;
    options.catchability = numberOption(o, "--catchability", ok).value_or(1.0);
    options.ciLevel = numberOption(o, "--level", ok).value_or(0.95);
    if (!ok) return 2;
    const std::string compartment(trim(*o.value("--compartment")));
    const auto hauls = readHauls(*o.value("--hauls"));
    const auto taxa = readTaxa(*o.value("--taxa"));
    std::optional<SurveyRead<std::vector<Stratum>>> strata;
    if (o.value("--strata")) strata = readStrata(*o.value("--strata"));
    Problems problems = hauls.problems;
    problems.insert(problems.end(), taxa.problems.begin(), taxa.problems.end());
    if (strata) problems.insert(problems.end(), strata->problems.begin(), strata->problems.end());
    if (hasErrors(problems)) return failed(o, problems);
    if (options.catchability == 1.0 && !o.value("--catchability"))
        std::cerr << "note: catchability X1 = 1 assumed (every fish in the net's path retained); give --catchability "
                     "for your gear\n";
    SweptAreaResult r = sweptAreaBiomass(*hauls.value, *taxa.value, compartment,
                                         strata ? *strata->value : std::vector<Stratum>{}, options);
    if (!r.estimate.valid) return failed(o, r.estimate.problems);
    std::string written;
    if (const auto t = targetOf(o)) {
        const int rc = writeScalar(*t, Param::Biomass, r.estimate, factors, written);
        if (rc) return rc;
    }
    report(r.estimate, o.has("--json"), [&](JsonWriter& w) { writeSweptAreaJson(w, r); }, sweptAreaTable(r), written);
    return 0;
}

// --- mortality --------------------------------------------------------------------------
int mortality(const ParsedOptions& o, const ConversionFactors& factors)
{
    const std::string method = o.value("--method").value_or("catch-curve");
    bool ok = true;
    const double level = numberOption(o, "--level", ok).value_or(0.95);
    const auto linf = numberOption(o, "--linf", ok);
    const auto k = numberOption(o, "--k", ok);
    if (!ok) return 2;
    Estimate e;
    std::function<void(JsonWriter&)> extras;
    std::string table;
    CatchCurveResult curve;
    MeanLengthResult meanLength;
    if (method == "catch-curve" || method == "mean-length") {
        if (!require(o, {"--lengths", "--taxon", "--linf", "--k"}, "mortality")) return 2;
        if (!uncertaintyOf(o, "mortality --method " + method, {}, level,
                           " (it takes L∞ and K as known)"))
            return 2;
        const auto lengths = readLengths(*o.value("--lengths"));
        if (!lengths.value) return failed(o, lengths.problems);
        const std::string taxon(trim(*o.value("--taxon")));
        const std::vector<LengthClass> classes = classesOf(*lengths.value, taxon);
        if (classes.empty()) {
            std::cerr << "tledger fieldwork mortality: " << *o.value("--lengths") << " has no length class of taxon '"
                      << taxon << "'\n";
            return 2;
        }
        if (method == "catch-curve") {
            std::vector<std::size_t> points;
            if (const auto text = o.value("--points")) {
                const auto parsed = parsePoints(*text);
                if (!parsed) {
                    std::cerr << "tledger fieldwork mortality: --points '" << *text
                              << "': expected point numbers as the table prints them, e.g. 4-9 or 4,5,6,8\n";
                    return 2;
                }
                points = *parsed;
            }
            curve = lengthConvertedCatchCurve(classes, {*linf, *k}, points, level);
            if (!curve.estimate.valid) {
                if (!curve.points.empty()) std::cerr << catchCurveTable(curve);
                return failed(o, curve.estimate.problems);
            }
            e = curve.estimate;
            extras = [&](JsonWriter& w) { writeCatchCurveJson(w, curve); };
            table = catchCurveTable(curve);
        } else {
            const auto cutoff = numberOption(o, "--cutoff", ok);
            if (!ok) return 2;
            meanLength = meanLengthZ(classes, {*linf, *k}, cutoff, level);
            if (!meanLength.estimate.valid) return failed(o, meanLength.estimate.problems);
            e = meanLength.estimate;
            extras = [&](JsonWriter& w) { writeMeanLengthJson(w, meanLength); };
        }
        e.inputs.insert(e.inputs.begin(), "taxon " + taxon);
        e.assumptions.push_back("P/B = Z at steady state (Allen 1971)");
    } else if (method == "pauly1980") {
        if (!require(o, {"--linf", "--k", "--temperature"}, "mortality --method pauly1980")) return 2;
        const auto t = numberOption(o, "--temperature", ok, false);
        const auto u = uncertaintyOf(o, "mortality --method pauly1980", {"--linf", "--k", "--temperature"}, level);
        if (!ok || !u) return 2;
        e = paulyNaturalMortality(*linf, *k, *t, *u);
    } else if (method == "then-tmax") {
        if (!require(o, {"--tmax"}, "mortality --method then-tmax")) return 2;
        const auto tmax = numberOption(o, "--tmax", ok);
        const auto u = uncertaintyOf(o, "mortality --method then-tmax", {"--tmax"}, level);
        if (!ok || !u) return 2;
        e = thenMortalityFromMaxAge(*tmax, *u);
    } else if (method == "then-growth") {
        if (!require(o, {"--linf", "--k"}, "mortality --method then-growth")) return 2;
        const auto u = uncertaintyOf(o, "mortality --method then-growth", {"--linf", "--k"}, level);
        if (!u) return 2;
        e = thenMortalityFromGrowth(*linf, *k, *u);
    } else {
        std::cerr << "tledger fieldwork mortality: --method '" << method
                  << "': expected catch-curve, mean-length, pauly1980, then-tmax or then-growth\n";
        return 2;
    }
    if (!e.valid) return failed(o, e.problems);

    std::string written;
    if (const auto t = targetOf(o)) {
        const int rc = writeScalar(*t, Param::PB, e, factors, written);
        if (rc) return rc;
    }
    report(e, o.has("--json"), extras, table, written);
    return 0;
}

// --- consumption ------------------------------------------------------------------------
int consumption(const ParsedOptions& o, const ConversionFactors& factors)
{
    if (!require(o, {"--winf", "--temperature", "--aspect-ratio"}, "consumption")) return 2;
    bool ok = true;
    const auto winf = numberOption(o, "--winf", ok);
    const auto t = numberOption(o, "--temperature", ok, false);
    const auto a = numberOption(o, "--aspect-ratio", ok);
    const double level = numberOption(o, "--level", ok).value_or(0.95);
    const auto u = uncertaintyOf(o, "consumption", {"--winf", "--temperature", "--aspect-ratio"}, level);
    if (!ok || !u) return 2;
    const std::string food = o.value("--food").value_or("carnivore");
    FeedingType feeding = FeedingType::Carnivore;
    if (food == "herbivore") feeding = FeedingType::Herbivore;
    else if (food == "detritivore") feeding = FeedingType::Detritivore;
    else if (food != "carnivore") {
        std::cerr << "tledger fieldwork consumption: --food '" << food
                  << "': expected carnivore, herbivore or detritivore\n";
        return 2;
    }
    const Estimate e = palomaresPaulyConsumption(*winf, *t, *a, feeding, *u);
    if (!e.valid) return failed(o, e.problems);
    std::string written;
    if (const auto target = targetOf(o)) {
        const int rc = writeScalar(*target, Param::QB, e, factors, written);
        if (rc) return rc;
    }
    report(e, o.has("--json"), nullptr, "", written);
    return 0;
}

// --- diet -------------------------------------------------------------------------------
int diet(const ParsedOptions& o)
{
    if (!require(o, {"--stomachs", "--taxa", "--compartment"}, "diet")) return 2;
    DietOptions options;
    const std::string summary = o.value("--summary").value_or("mean");
    if (summary == "pooled") options.summary = DietSummary::Pooled;
    else if (summary != "mean") {
        std::cerr << "tledger fieldwork diet: --summary '" << summary << "': expected mean or pooled\n";
        return 2;
    }
    bool ok = true;
    options.ciLevel = numberOption(o, "--level", ok).value_or(0.95);
    if (!ok) return 2;
    const auto stomachs = readStomachs(*o.value("--stomachs"));
    const auto taxa = readTaxa(*o.value("--taxa"));
    Problems problems = stomachs.problems;
    problems.insert(problems.end(), taxa.problems.begin(), taxa.problems.end());
    if (hasErrors(problems)) return failed(o, problems);
    const std::string predator(trim(*o.value("--compartment")));
    const StomachDiet d = dietFromStomachs(*stomachs.value, *taxa.value, predator, options);
    if (!d.valid) return failed(o, d.problems);

    std::string written;
    if (const auto t = targetOf(o)) {
        const int rc = editScenario(*t, [&](Scenario& s, std::size_t i) {
            Model& m = s.model;
            std::vector<std::string> names;
            for (const Compartment& c : m.compartments()) names.push_back(c.name);
            const Problems unknown = checkMappingCompartments(*taxa.value, names);
            if (hasErrors(unknown)) {
                printProblems(unknown);
                return false;
            }
            const Problems applied = applyDiet(m, s.description, i, d, utcNowIso8601());
            if (hasErrors(applied)) {
                printProblems(applied);
                return false;
            }
            written = "diet of " + t->compartment + " in scenario '" + t->scenario + "' of " + t->project.string() +
                      " (" + std::to_string(d.shares.size()) + " prey; note in the scenario description)";
            return true;
        });
        if (rc) return rc;
    }
    if (o.has("--json")) {
        JsonWriter w;
        w.beginObject();
        writeDietJson(w, d);
        w.key("written");
        if (written.empty()) w.null();
        else w.value(written);
        w.endObject();
        std::cout << w.str() << "\n";
    } else {
        std::cout << dietText(d);
        printWritten(written, false);
        std::cout << kDecisionSupportNotice << "\n";
    }
    return 0;
}

}  // namespace

int cmdFieldwork(const Args& args)
{
    if (args.empty() || (args[0] != "biomass" && args[0] != "mortality" && args[0] != "consumption" && args[0] != "diet")) {
        std::cerr << (args.empty() ? "" : "tledger fieldwork: unknown estimate '" + args[0] + "'\n") << kUsage;
        return 2;
    }
    const Args rest(args.begin() + 1, args.end());
    const auto o = parseOptions(rest,
                                {"--hauls", "--taxa", "--strata", "--compartment", "--catchability", "--level",
                                 "--lengths", "--taxon", "--linf", "--k", "--method", "--points", "--cutoff",
                                 "--temperature", "--tmax", "--winf", "--aspect-ratio", "--food", "--stomachs",
                                 "--summary", "--into", "--scenario", "--carbon-per-wet", "--kj-per-wet", "--linf-se",
                                 "--linf-cv", "--k-se", "--k-cv", "--temperature-se", "--tmax-se", "--tmax-cv",
                                 "--winf-se", "--winf-cv", "--aspect-ratio-se", "--residual-sd"},
                                {"--json"}, "fieldwork", std::cerr);
    if (!o) return 2;
    if (!o->positional.empty()) {
        std::cerr << "tledger fieldwork: unexpected argument '" << o->positional[0] << "'\n" << kUsage;
        return 2;
    }
    bool ok = true;
    ConversionFactors factors;
    if (const auto f = numberOption(*o, "--carbon-per-wet", ok)) {
        factors.carbonPerWetWeight = *f;
        factors.carbonSource = "given on the command line";
    }
    if (const auto f = numberOption(*o, "--kj-per-wet", ok)) {
        factors.kilojoulePerWetWeight = *f;
        factors.energySource = "given on the command line";
    }
    if (const auto level = numberOption(*o, "--level", ok); level && *level >= 1.0) {
        std::cerr << "tledger fieldwork: --level " << *level << ": expected a confidence level below 1 (e.g. 0.95)\n";
        return 2;
    }
    if (!ok) return 2;
    if ((args[0] == "biomass" || args[0] == "diet") && !uncertaintyOf(*o, args[0], {}, 0.95)) return 2;
    if (args[0] == "biomass") return biomass(*o, factors);
    if (args[0] == "mortality") return mortality(*o, factors);
    if (args[0] == "consumption") return consumption(*o, factors);
    return diet(*o);
}

}  // namespace tl::cli
