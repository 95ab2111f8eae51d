#include "core/fieldwork/survey_tables.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <set>

#include "core/io/csv_sheet.h"
#include "core/io/csv_table.h"
#include "core/model/problem_codes.h"
#include "core/model/text.h"
#include "core/model/validation.h"

namespace tl::fieldwork {
namespace {

// "YYYY-MM-DD" (digits already checked) names a real day: month 1-12, day within the
// month, 29 February only in a Gregorian leap year.
bool isCalendarDate(const std::string& d)
{
    const int year = std::stoi(d.substr(0, 4)), month = std::stoi(d.substr(5, 2)), day = std::stoi(d.substr(8, 2));
    if (month < 1 || month > 12 || day < 1) return false;
    static constexpr int kDays[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
    const bool leap = (year % 4 == 0 && year % 100 != 0) || year % 400 == 0;
    return day <= kDays[month - 1] + (month == 2 && leap ? 1 : 0);
}


using csv::shown;

CellRef refOf(const std::string& file, const CsvField& f) { return {file, f.line, f.column}; }

// Stomachs pooled in one sample: more than any crew pools (this project's own bound, no
// source); it keeps the count a safe int.
constexpr double kMaxStomachsPerSample = 1e6;

// Reads one keyed survey sheet cell by cell; collects the problems of the whole file.
class SheetReader {
public:
    SheetReader(const CsvTable& table, std::span<const std::string_view> keys, std::span<const std::string_view> required,
                Problems& problems)
        : keys_(keys), problems_(problems)
    {
        sheet_ = csv::openKeyed(table, keys, required, problems);
        if (sheet_ && sheet_->rows.empty())
            problems.push_back(csv::problemAt(code::kCsvNoRows, Severity::Error, table.file, 1, 1,
                                              "the file has a header but no rows"));
    }
    bool ok() const { return sheet_ && !sheet_->rows.empty(); }
    const std::vector<const CsvRecord*>& rows() const { return sheet_->rows; }
    const std::string& file() const { return sheet_->file; }
    bool has(std::size_t key) const { return sheet_->position[key] >= 0; }

    const CsvField* cell(const CsvRecord& r, std::size_t key) const { return sheet_->field(r, key); }

    std::string text(const CsvRecord& r, std::size_t key) const
    {
        const CsvField* f = cell(r, key);
        return f ? std::string(trim(f->text)) : std::string();
    }

    // A text cell that must not be empty.
    std::optional<std::string> requiredText(const CsvRecord& r, std::size_t key)
    {
        std::string t = text(r, key);
        if (!t.empty()) return t;
        problems_.push_back(csv::errorAt(code::kCsvMissingValue, file(), *cell(r, key),
                                         "column '" + std::string(keys_[key]) + "' is empty; it needs a value"));
        return std::nullopt;
    }

    // A number cell: nullopt when empty (and `required` reports it) or bad. `min` is the
    // smallest allowed value; `strict` refuses min itself.
    std::optional<double> number(const CsvRecord& r, std::size_t key, bool required, double min, bool strict,
                                 bool& bad)
    {
        const CsvField* f = cell(r, key);
        if (!f) return std::nullopt;
        const std::string what = "column '" + std::string(keys_[key]) + "'";
        const csv::NumberCell n = csv::numberCell(*f, file(), what, problems_);
        if (n.bad) {
            bad = true;
            return std::nullopt;
        }
        if (!n.value) {
            if (required) {
                problems_.push_back(csv::errorAt(code::kCsvMissingValue, file(), *f, what + " is empty; it needs a number"));
                bad = true;
            }
            return std::nullopt;
        }
        // Beyond this a sum of a few cells overflows to infinity (issue 12, defect 7); the
        // model's own inputs have the same bound.
        if (!(std::fabs(*n.value) <= kMaxInputMagnitude)) {
            problems_.push_back(csv::errorAt(code::kValueTooLarge, file(), *f,
                                             what + ": " + shown(f->text) + " is beyond the largest value accepted, " +
                                                 formatNumber(kMaxInputMagnitude)));
            bad = true;
            return std::nullopt;
        }
        if (*n.value < min || (strict && *n.value == min)) {
            problems_.push_back(csv::errorAt(code::kSurveyValue, file(), *f,
                                             what + ": expected a number " + (strict ? "above " : "of at least ") +
                                                 csv::shown(formatNumber(min)) + ", found " + shown(f->text)));
            bad = true;
            return std::nullopt;
        }
        return n.value;
    }

    Problems& problems() { return problems_; }

private:
    std::span<const std::string_view> keys_;
    Problems& problems_;
    std::optional<csv::KeyedSheet> sheet_;
};

template <typename T>
SurveyRead<T> finish(T value, Problems problems)
{
    SurveyRead<T> out;
    out.problems = std::move(problems);
    if (!hasErrors(out.problems)) out.value = std::move(value);
    return out;
}

// hauls.csv ---------------------------------------------------------------------------
SurveyRead<HaulSurvey> haulsFrom(CsvParseResult parsed)
{
    const std::string file = parsed.table.file;
    enum Key : std::size_t { Station, HaulKey, Date, Stratum, Gear, SweptArea, TowLength, WingSpread, Taxon, Catch, Count };
    static constexpr std::array<std::string_view, 11> keys = {"station",        "haul",          "date",
                                                              "stratum",        "gear",          "swept_area_km2",
                                                              "tow_length_km",  "wing_spread_m", "taxon",
                                                              "catch_kg",       "count"};
    static constexpr std::array<std::string_view, 5> required = {"station", "haul", "date", "taxon", "catch_kg"};
    Problems problems = std::move(parsed.problems);
    HaulSurvey survey;
    if (hasErrors(problems)) return finish(std::move(survey), std::move(problems));
    SheetReader s(parsed.table, keys, required, problems);
    if (!s.ok()) return finish(std::move(survey), std::move(problems));
    if (!s.has(SweptArea) && !(s.has(TowLength) && s.has(WingSpread))) {
        problems.push_back(csv::problemAt(code::kCsvMissingColumn, Severity::Error, file, 1, 1,
                                          "the header has neither 'swept_area_km2' nor both 'tow_length_km' and "
                                          "'wing_spread_m'",
                                          "Give each haul's swept area in km², or its tow length (km) and the net's "
                                          "wing spread (m)."));
        return finish(std::move(survey), std::move(problems));
    }

    std::map<std::pair<std::string, std::string>, std::size_t> haulIndex;
    std::set<std::pair<std::size_t, std::string>> taxaSeen;
    for (const CsvRecord* r : s.rows()) {
        bool bad = false;
        const auto station = s.requiredText(*r, Station);
        const auto haulName = s.requiredText(*r, HaulKey);
        const auto date = s.requiredText(*r, Date);
        const std::string taxon = s.text(*r, Taxon);
        const auto catchKg = s.number(*r, Catch, true, 0.0, false, bad);
        const auto count = s.number(*r, Count, false, 0.0, false, bad);
        std::optional<double> area;
        const CsvField* areaCell = s.cell(*r, SweptArea);
        if (areaCell && !trim(areaCell->text).empty()) {
            area = s.number(*r, SweptArea, true, 0.0, true, bad);
        } else if (s.has(TowLength) && s.has(WingSpread)) {
            const auto length = s.number(*r, TowLength, true, 0.0, true, bad);
            const auto spread = s.number(*r, WingSpread, true, 0.0, true, bad);
            if (length && spread) area = *length * *spread / 1000.0;  // km x m -> km²
            areaCell = s.cell(*r, TowLength);
        } else {
            problems.push_back(csv::errorAt(code::kCsvMissingValue, file, *areaCell,
                                            "column 'swept_area_km2' is empty; it needs the haul's swept area in km²"));
            bad = true;
        }
        if (date && !bad) {
            // ISO 8601 calendar date, so that a spreadsheet's local format (02/12/26) is caught.
            const std::string& d = *date;
            const bool iso = d.size() == 10 && d[4] == '-' && d[7] == '-' &&
                             std::all_of(d.begin(), d.end(), [](char c) { return c == '-' || (c >= '0' && c <= '9'); });
            if (iso && !isCalendarDate(d)) {
                problems.push_back(csv::errorAt(code::kSurveyValue, file, *s.cell(*r, Date),
                                                "column 'date': " + shown(d) +
                                                    " is not a day of the calendar (month 01-12, day within the month)"));
                bad = true;
            } else if (!iso) {
                problems.push_back(csv::errorAt(code::kSurveyValue, file, *s.cell(*r, Date),
                                                "column 'date': expected a date as YYYY-MM-DD, found " + shown(d)));
                bad = true;
            }
        }
        if (taxon.empty() && catchKg && *catchKg > 0.0) {
            problems.push_back(csv::errorAt(code::kCsvMissingValue, file, *s.cell(*r, Taxon),
                                            "column 'taxon' is empty but the row has a catch of " +
                                                formatNumber(*catchKg) + " kg",
                                            "An empty taxon marks a haul that caught nothing (catch 0)."));
            bad = true;
        }
        if (!station || !haulName || !date || !catchKg || !area || bad) continue;

        const std::string stratum = s.text(*r, Stratum);
        const auto key = std::pair{*station, *haulName};
        auto [it, inserted] = haulIndex.try_emplace(key, survey.hauls.size());
        if (inserted) {
            Haul h;
            h.station = *station;
            h.haul = *haulName;
            h.date = *date;
            h.stratum = stratum;
            h.gear = s.text(*r, Gear);
            h.sweptAreaKm2 = *area;
            h.where = refOf(file, *s.cell(*r, Station));
            survey.hauls.push_back(std::move(h));
            if (!stratum.empty()) survey.stratified = true;
        } else {
            const Haul& h = survey.hauls[it->second];
            const std::string first = " (line " + std::to_string(h.where.line) + " has ";
            if (std::abs(h.sweptAreaKm2 - *area) > 1e-9 * std::max(1.0, h.sweptAreaKm2)) {
                problems.push_back(csv::errorAt(code::kSurveyInconsistent, file, *areaCell,
                                                "haul " + shown(*haulName) + " at station " + shown(*station) +
                                                    ": swept area " + formatNumber(*area) + " km² differs" + first +
                                                    formatNumber(h.sweptAreaKm2) + " km²)"));
                continue;
            }
            if (h.stratum != stratum) {
                problems.push_back(csv::errorAt(code::kSurveyInconsistent, file, *s.cell(*r, Stratum),
                                                "haul " + shown(*haulName) + " at station " + shown(*station) +
                                                    ": stratum " + shown(stratum) + " differs" + first + shown(h.stratum) +
                                                    ")"));
                continue;
            }
            if (h.date != *date) {
                problems.push_back(csv::errorAt(code::kSurveyInconsistent, file, *s.cell(*r, Date),
                                                "haul " + shown(*haulName) + " at station " + shown(*station) +
                                                    ": date " + shown(*date) + " differs" + first + shown(h.date) + ")"));
                continue;
            }
        }
        if (!taxon.empty() && !taxaSeen.insert({it->second, taxon}).second) {
            problems.push_back(csv::errorAt(code::kCsvDuplicateRow, file, *s.cell(*r, Taxon),
                                            "taxon " + shown(taxon) + " appears twice in haul " + shown(*haulName) +
                                                " at station " + shown(*station),
                                            "Add the catches up into one row per haul and taxon."));
            continue;
        }
        HaulCatch c;
        c.haul = it->second;
        c.taxon = taxon;
        c.catchKg = *catchKg;
        c.count = count;
        c.taxonCell = refOf(file, *s.cell(*r, Taxon));
        survey.catches.push_back(std::move(c));
    }
    if (survey.stratified)
        for (const Haul& h : survey.hauls)
            if (h.stratum.empty())
                problems.push_back(surveyProblem(code::kSurveyUnknownStratum, h.where,
                                                 "haul " + shown(h.haul) + " at station " + shown(h.station) +
                                                     " has no stratum while other hauls have one",
                                                 "Give every haul its stratum, or none."));
    return finish(std::move(survey), std::move(problems));
}

// strata.csv --------------------------------------------------------------------------
SurveyRead<std::vector<Stratum>> strataFrom(CsvParseResult parsed)
{
    const std::string file = parsed.table.file;
    enum Key : std::size_t { Name, Area };
    static constexpr std::array<std::string_view, 2> keys = {"stratum", "area_km2"};
    Problems problems = std::move(parsed.problems);
    std::vector<Stratum> strata;
    if (hasErrors(problems)) return finish(std::move(strata), std::move(problems));
    SheetReader s(parsed.table, keys, keys, problems);
    if (!s.ok()) return finish(std::move(strata), std::move(problems));
    std::set<std::string> seen;
    for (const CsvRecord* r : s.rows()) {
        bool bad = false;
        const auto name = s.requiredText(*r, Name);
        const auto area = s.number(*r, Area, true, 0.0, true, bad);
        if (!name || !area) continue;
        if (!seen.insert(*name).second) {
            problems.push_back(csv::errorAt(code::kCsvDuplicateRow, file, *s.cell(*r, Name),
                                            "stratum " + shown(*name) + " is listed twice"));
            continue;
        }
        strata.push_back({*name, *area, refOf(file, *s.cell(*r, Name))});
    }
    return finish(std::move(strata), std::move(problems));
}

// lengths.csv -------------------------------------------------------------------------
SurveyRead<std::vector<LengthClass>> lengthsFrom(CsvParseResult parsed)
{
    const std::string file = parsed.table.file;
    enum Key : std::size_t { Taxon, From, To, Count };
    static constexpr std::array<std::string_view, 4> keys = {"taxon", "length_from_cm", "length_to_cm", "count"};
    Problems problems = std::move(parsed.problems);
    std::vector<LengthClass> classes;
    if (hasErrors(problems)) return finish(std::move(classes), std::move(problems));
    SheetReader s(parsed.table, keys, keys, problems);
    if (!s.ok()) return finish(std::move(classes), std::move(problems));
    for (const CsvRecord* r : s.rows()) {
        bool bad = false;
        const auto taxon = s.requiredText(*r, Taxon);
        const auto from = s.number(*r, From, true, 0.0, false, bad);
        const auto to = s.number(*r, To, true, 0.0, true, bad);
        const auto count = s.number(*r, Count, true, 0.0, false, bad);
        if (!taxon || !from || !to || !count) continue;
        if (*to <= *from) {
            problems.push_back(csv::errorAt(code::kSurveyValue, file, *s.cell(*r, To),
                                            "column 'length_to_cm': the class ends at " + formatNumber(*to) +
                                                " cm, not above its start " + formatNumber(*from) + " cm"));
            continue;
        }
        // Overlap with an earlier class of the same taxon.
        bool overlaps = false;
        for (const LengthClass& c : classes) {
            if (c.taxon != *taxon || *from >= c.toCm || *to <= c.fromCm) continue;
            problems.push_back(csv::errorAt(code::kSurveyInconsistent, file, *s.cell(*r, From),
                                            "the class " + formatNumber(*from) + "-" + formatNumber(*to) + " cm of " +
                                                shown(*taxon) + " overlaps the class " + formatNumber(c.fromCm) + "-" +
                                                formatNumber(c.toCm) + " cm on line " + std::to_string(c.where.line)));
            overlaps = true;
            break;
        }
        if (overlaps) continue;
        classes.push_back({*taxon, *from, *to, *count, refOf(file, *s.cell(*r, Taxon))});
    }
    std::stable_sort(classes.begin(), classes.end(), [](const LengthClass& a, const LengthClass& b) {
        return a.taxon != b.taxon ? a.taxon < b.taxon : a.fromCm < b.fromCm;
    });
    return finish(std::move(classes), std::move(problems));
}

// stomachs.csv ------------------------------------------------------------------------
SurveyRead<std::vector<StomachRecord>> stomachsFrom(CsvParseResult parsed)
{
    const std::string file = parsed.table.file;
    enum Key : std::size_t { Sample, Predator, Prey, Amount, Stomachs };
    static constexpr std::array<std::string_view, 5> keys = {"sample", "predator", "prey", "amount", "stomachs"};
    static constexpr std::array<std::string_view, 4> required = {"sample", "predator", "prey", "amount"};
    Problems problems = std::move(parsed.problems);
    std::vector<StomachRecord> records;
    if (hasErrors(problems)) return finish(std::move(records), std::move(problems));
    SheetReader s(parsed.table, keys, required, problems);
    if (!s.ok()) return finish(std::move(records), std::move(problems));
    std::map<std::string, std::size_t> firstOfSample;  // sample -> index of its first record
    std::set<std::pair<std::string, std::string>> preySeen;
    for (const CsvRecord* r : s.rows()) {
        bool bad = false;
        const auto sample = s.requiredText(*r, Sample);
        const auto predator = s.requiredText(*r, Predator);
        const std::string prey = s.text(*r, Prey);
        const auto amount = s.number(*r, Amount, true, 0.0, false, bad);
        const auto stomachs = s.number(*r, Stomachs, false, 1.0, false, bad);
        if (stomachs && (std::floor(*stomachs) != *stomachs || *stomachs > kMaxStomachsPerSample)) {
            problems.push_back(csv::errorAt(code::kSurveyValue, file, *s.cell(*r, Stomachs),
                                            "column 'stomachs': expected a whole number of stomachs up to " +
                                                formatNumber(kMaxStomachsPerSample) + ", found " +
                                                shown(s.text(*r, Stomachs))));
            bad = true;
        }
        if (prey.empty() && amount && *amount > 0.0) {
            problems.push_back(csv::errorAt(code::kCsvMissingValue, file, *s.cell(*r, Prey),
                                            "column 'prey' is empty but the amount is " + formatNumber(*amount),
                                            "An empty prey marks an empty stomach (amount 0); name the prey, or "
                                            "'unidentified' for remains that cannot be named."));
            bad = true;
        }
        if (!sample || !predator || !amount || bad) continue;
        StomachRecord rec;
        rec.sample = *sample;
        rec.predator = *predator;
        rec.prey = prey;
        rec.amount = *amount;
        rec.stomachs = stomachs ? static_cast<int>(*stomachs) : 1;
        rec.predatorCell = refOf(file, *s.cell(*r, Predator));
        rec.preyCell = refOf(file, *s.cell(*r, Prey));
        const auto [it, first] = firstOfSample.try_emplace(rec.sample, records.size());
        if (!first) {
            const StomachRecord& f = records[it->second];
            if (f.predator != rec.predator) {
                problems.push_back(surveyProblem(code::kSurveyInconsistent, rec.predatorCell,
                                                 "sample " + shown(rec.sample) + ": predator " + shown(rec.predator) +
                                                     " differs from " + shown(f.predator) + " on line " +
                                                     std::to_string(f.predatorCell.line),
                                                 "A sample holds the stomachs of one predator; give other predators "
                                                 "their own sample names."));
                continue;
            }
            if (f.stomachs != rec.stomachs) {
                problems.push_back(csv::errorAt(code::kSurveyInconsistent, file, *s.cell(*r, Stomachs),
                                                "sample " + shown(rec.sample) + ": " + std::to_string(rec.stomachs) +
                                                    " stomachs differs from " + std::to_string(f.stomachs) +
                                                    " on line " + std::to_string(f.predatorCell.line)));
                continue;
            }
        }
        if (!prey.empty() && !preySeen.insert({rec.sample, prey}).second) {
            problems.push_back(surveyProblem(code::kCsvDuplicateRow, rec.preyCell,
                                             "prey " + shown(prey) + " appears twice in sample " + shown(rec.sample),
                                             "Add the amounts up into one row per sample and prey."));
            continue;
        }
        records.push_back(std::move(rec));
    }
    return finish(std::move(records), std::move(problems));
}

// taxa.csv ----------------------------------------------------------------------------
SurveyRead<TaxonMapping> taxaFrom(CsvParseResult parsed)
{
    const std::string file = parsed.table.file;
    enum Key : std::size_t { Taxon, Compartment };
    static constexpr std::array<std::string_view, 2> keys = {"taxon", "compartment"};
    Problems problems = std::move(parsed.problems);
    TaxonMapping mapping;
    if (hasErrors(problems)) return finish(std::move(mapping), std::move(problems));
    SheetReader s(parsed.table, keys, keys, problems);
    if (!s.ok()) return finish(std::move(mapping), std::move(problems));
    for (const CsvRecord* r : s.rows()) {
        const auto taxon = s.requiredText(*r, Taxon);
        if (!taxon) continue;
        const std::string compartment = s.text(*r, Compartment);
        if (mapping.compartmentOf.count(*taxon)) {
            problems.push_back(csv::errorAt(code::kCsvDuplicateRow, file, *s.cell(*r, Taxon),
                                            "taxon " + shown(*taxon) + " is mapped twice (first on line " +
                                                std::to_string(mapping.cellOf[*taxon].line) + ")"));
            continue;
        }
        mapping.compartmentOf.emplace(*taxon, compartment);
        mapping.cellOf.emplace(*taxon, refOf(file, *s.cell(*r, Compartment)));
    }
    return finish(std::move(mapping), std::move(problems));
}

}  // namespace

Problem surveyProblem(const char* code, const CellRef& where, std::string message, std::string hint)
{
    return csv::problemAt(code, Severity::Error, where.file, where.line, where.column, std::move(message),
                          std::move(hint));
}

Problems checkMappingCompartments(const TaxonMapping& mapping, const std::vector<std::string>& names)
{
    Problems problems;
    const std::set<std::string, std::less<>> known(names.begin(), names.end());
    for (const auto& [taxon, compartment] : mapping.compartmentOf) {
        if (compartment.empty() || compartment == "import" || known.count(compartment)) continue;
        std::string hint;
        for (const std::string& n : names)
            if (csv::lowerAscii(n) == csv::lowerAscii(compartment)) hint = "Did you mean '" + n + "'? Names must match exactly.";
        problems.push_back(surveyProblem(code::kSurveyUnknownCompartment, mapping.cellOf.at(taxon),
                                         "taxon " + shown(taxon) + " is mapped to " + shown(compartment) +
                                             ", which the scenario does not have",
                                         hint));
    }
    return problems;
}

SurveyRead<HaulSurvey> parseHauls(std::string_view text, const std::string& file)
{
    return haulsFrom(parseCsv(text, file));
}
SurveyRead<HaulSurvey> readHauls(const std::filesystem::path& path) { return haulsFrom(readCsvFile(path)); }

SurveyRead<std::vector<Stratum>> parseStrata(std::string_view text, const std::string& file)
{
    return strataFrom(parseCsv(text, file));
}
SurveyRead<std::vector<Stratum>> readStrata(const std::filesystem::path& path) { return strataFrom(readCsvFile(path)); }

SurveyRead<std::vector<LengthClass>> parseLengths(std::string_view text, const std::string& file)
{
    return lengthsFrom(parseCsv(text, file));
}
SurveyRead<std::vector<LengthClass>> readLengths(const std::filesystem::path& path) { return lengthsFrom(readCsvFile(path)); }

SurveyRead<std::vector<StomachRecord>> parseStomachs(std::string_view text, const std::string& file)
{
    return stomachsFrom(parseCsv(text, file));
}
SurveyRead<std::vector<StomachRecord>> readStomachs(const std::filesystem::path& path) { return stomachsFrom(readCsvFile(path)); }

SurveyRead<TaxonMapping> parseTaxa(std::string_view text, const std::string& file)
{
    return taxaFrom(parseCsv(text, file));
}
SurveyRead<TaxonMapping> readTaxa(const std::filesystem::path& path) { return taxaFrom(readCsvFile(path)); }

}  // namespace tl::fieldwork
