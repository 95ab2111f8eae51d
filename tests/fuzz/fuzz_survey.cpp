// Fuzz target: the survey readers of core/fieldwork/survey_tables.h (hauls, strata,
// lengths, stomachs and taxa CSV files a research crew brings) and the estimators
// `tledger fieldwork` runs on what they read. The input is the five files joined by the
// separator of fuzz_support.h, in the order of kSurveyFiles ('-' or a missing section:
// the file is absent). Beyond "no crash, no hang, no sanitizer report" it holds the
// readers to their contract:
//   - a value is returned exactly when no error was reported;
//   - every problem says what is wrong and names its file, line and column;
// and the estimators to theirs: an estimate is valid exactly when it has no errors,
// and a valid one has finite numbers only (no NaN or infinity reaches any output).
#include <array>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <set>

#include "core/fieldwork/fieldwork_report.h"
#include "core/fieldwork/length_mortality.h"
#include "core/fieldwork/stomach_diet.h"
#include "core/fieldwork/survey_tables.h"
#include "core/fieldwork/swept_area.h"
#include "core/io/json_writer.h"
#include "tests/fuzz/fuzz_support.h"

namespace {

using namespace tl;
using namespace tl::fieldwork;

inline constexpr const char* kSurveyFiles[] = {"hauls.csv", "strata.csv", "lengths.csv", "stomachs.csv", "taxa.csv"};

// Estimators run for at most this many compartments or taxa per input, so that the
// fuzzer spends its time on the readers.
constexpr std::size_t kEstimatesPerInput = 3;

[[noreturn]] void fail(const char* what)
{
    std::fprintf(stderr, "fuzz_survey: %s\n", what);
    std::abort();
}

template <typename T>
void checkRead(const SurveyRead<T>& read)
{
    if (read.value.has_value() == hasErrors(read.problems)) fail("a value returned together with errors, or neither");
    for (const Problem& p : read.problems) {
        if (p.message.empty()) fail("a problem without a message");
        if (!p.location || p.location->file.empty()) fail("a problem that names no file");
        if (p.location->line < 1 || p.location->column < 1) fail("a problem without line and column");
    }
}

// Reads one file when it is present and holds the reader to its contract.
template <typename T>
std::optional<T> readChecked(bool present, SurveyRead<T> (*reader)(const std::filesystem::path&),
                             const std::filesystem::path& path)
{
    if (!present) return std::nullopt;
    SurveyRead<T> read = reader(path);
    checkRead(read);
    return std::move(read.value);
}

bool finiteOrAbsent(const std::optional<double>& v) { return !v || std::isfinite(*v); }

void checkEstimate(const Estimate& e)
{
    if (e.valid == hasErrors(e.problems)) fail("an estimate valid together with errors, or neither");
    if (!e.valid) return;
    if (!std::isfinite(e.value) || !finiteOrAbsent(e.cv) || !finiteOrAbsent(e.ciLow) || !finiteOrAbsent(e.ciHigh))
        fail("a valid estimate with a NaN or infinite number");
    JsonWriter w;  // the writers must take whatever a valid estimate holds
    w.beginObject();
    writeEstimateJson(w, e);
    w.endObject();
    (void)estimateText(e);
}

// The compartments the mapping names, in order, without "import" and the left-out "".
std::vector<std::string> compartmentsOf(const TaxonMapping& mapping)
{
    std::set<std::string> seen;
    for (const auto& [taxon, compartment] : mapping.compartmentOf)
        if (!compartment.empty() && compartment != "import") seen.insert(compartment);
    return {seen.begin(), seen.end()};
}

void estimateBiomass(const HaulSurvey& hauls, const TaxonMapping& taxa, const std::vector<Stratum>* strata)
{
    const auto names = compartmentsOf(taxa);
    for (std::size_t k = 0; k < names.size() && k < kEstimatesPerInput; ++k) {
        const SweptAreaResult r = sweptAreaBiomass(hauls, taxa, names[k], strata ? *strata : std::vector<Stratum>{},
                                                   {.catchability = 0.5, .ciLevel = 0.95});
        checkEstimate(r.estimate);
        if (r.estimate.valid) (void)sweptAreaTable(r);
    }
}

void estimateMortality(const std::vector<LengthClass>& lengths)
{
    std::set<std::string> taxa;
    for (const LengthClass& c : lengths) taxa.insert(c.taxon);
    std::size_t done = 0;
    for (const std::string& taxon : taxa) {
        if (done++ == kEstimatesPerInput) break;
        const auto classes = classesOf(lengths, taxon);
        const GrowthParameters growth{.linfCm = 40.0, .k = 0.3};  // plausible for a mid-sized fish; any would do
        const CatchCurveResult curve = lengthConvertedCatchCurve(classes, growth);
        checkEstimate(curve.estimate);
        if (curve.estimate.valid) (void)catchCurveTable(curve);
        checkEstimate(meanLengthZ(classes, growth).estimate);
    }
}

void estimateDiets(const std::vector<StomachRecord>& stomachs, const TaxonMapping& taxa)
{
    const auto names = compartmentsOf(taxa);
    for (std::size_t k = 0; k < names.size() && k < kEstimatesPerInput; ++k) {
        DietOptions options;
        options.bootstrapDraws = 50;  // the bootstrap is not what is fuzzed here
        const StomachDiet d = dietFromStomachs(stomachs, taxa, names[k], options);
        if (d.valid == hasErrors(d.problems)) fail("a diet valid together with errors, or neither");
        if (!d.valid) continue;
        double sum = 0.0;
        for (const PreyShare& s : d.shares) {
            if (!std::isfinite(s.share) || !std::isfinite(s.cv) || !std::isfinite(s.ciLow) || !std::isfinite(s.ciHigh))
                fail("a diet share that is NaN or infinite");
            sum += s.share;
        }
        if (!d.shares.empty() && std::abs(sum - 1.0) > 1e-9) fail("diet shares that do not sum to 1");
        (void)dietText(d);
    }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size)
{
    const std::string_view input(reinterpret_cast<const char*>(data), size);
    const std::filesystem::path folder = fuzz::scratchFolder() / "survey";
    std::filesystem::remove_all(folder);
    std::filesystem::create_directories(folder);
    const auto sections = fuzz::splitSections(input);
    std::array<bool, std::size(kSurveyFiles)> present{};
    for (std::size_t k = 0; k < sections.size() && k < std::size(kSurveyFiles); ++k)
        if (sections[k] != "-") {
            fuzz::writeBytes(folder / kSurveyFiles[k], sections[k]);
            present[k] = true;
        }

    // The readers as tledger fieldwork calls them: from the files (size limit, encoding).
    const auto at = [&](std::size_t k) { return folder / kSurveyFiles[k]; };
    const auto hauls = readChecked<HaulSurvey>(present[0], readHauls, at(0));
    const auto strata = readChecked<std::vector<Stratum>>(present[1], readStrata, at(1));
    const auto lengths = readChecked<std::vector<LengthClass>>(present[2], readLengths, at(2));
    const auto stomachs = readChecked<std::vector<StomachRecord>>(present[3], readStomachs, at(3));
    const auto taxa = readChecked<TaxonMapping>(present[4], readTaxa, at(4));

    if (hauls && taxa) estimateBiomass(*hauls, *taxa, strata ? &*strata : nullptr);
    if (lengths) estimateMortality(*lengths);
    if (stomachs && taxa) estimateDiets(*stomachs, *taxa);
    return 0;
}
