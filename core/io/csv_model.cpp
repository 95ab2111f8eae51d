#include "core/io/csv_model.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>
#include <unordered_map>
#include <utility>
#include <span>

#include "core/io/atomic_file.h"
#include "core/io/csv_sheet.h"
#include "core/io/csv_table.h"
#include "core/model/problem_codes.h"
#include "core/model/limits.h"
#include "core/model/text.h"
#include "core/model/validation.h"

namespace tl {
namespace {

constexpr std::string_view kCompartmentsFile = "compartments.csv";
constexpr std::string_view kDietFile = "diet.csv";
constexpr std::string_view kHarvestFile = "harvest.csv";
constexpr std::string_view kRoutingFile = "detritus_routing.csv";
constexpr std::string_view kConfidenceFile = "confidence.csv";
constexpr std::string_view kSettingsFile = "settings.csv";
constexpr std::string_view kImportColumn = "import";
constexpr std::size_t kMaxProblems = 200;  // beyond this, one summary line

using csv::errorAt;
using csv::joinKeys;
using csv::KeyedSheet;
using csv::lowerAscii;
using csv::numberCell;
using csv::NumberCell;
using csv::openKeyed;
using csv::problemAt;
using csv::rowShapeOk;
using csv::refuseOtherSeparators;
using csv::shown;


// Compartment names -> index, built once compartments.csv is read (no compartment is
// added after that, so the views into the model's names stay valid). Every name in the
// other files is then found in O(1) instead of by a scan of the list, which kept
// reading a large folder quadratic.
class NameIndex {
public:
    explicit NameIndex(const Model& model) : model_(model)
    {
        exact_.reserve(model.size());
        for (std::size_t i = 0; i < model.size(); ++i) exact_.emplace(model.compartment(i).name, i);
    }

    std::optional<std::size_t> find(std::string_view name) const
    {
        const auto it = exact_.find(name);
        return it == exact_.end() ? std::nullopt : std::optional<std::size_t>(it->second);
    }

    // Names are matched exactly; this only finds a likely intended name for the hint.
    std::string didYouMean(std::string_view name) const
    {
        if (folded_.empty())  // built on the first miss only
            for (std::size_t i = 0; i < model_.size(); ++i) folded_.emplace(lowerAscii(model_.compartment(i).name), i);
        const auto it = folded_.find(lowerAscii(trim(name)));
        if (it == folded_.end()) return {};
        return "Did you mean '" + model_.compartment(it->second).name + "'? Names must match exactly, including case.";
    }

private:
    const Model& model_;
    std::unordered_map<std::string_view, std::size_t> exact_;
    mutable std::unordered_map<std::string, std::size_t> folded_;  // lower-case name -> first index
};

// A name longer than limits::kMaxNameLength is refused at its cell.
bool nameTooLong(const CsvField& f, std::string_view name, const std::string& file, const char* what,
                 Problems& problems)
{
    const std::size_t length = limits::characterCount(name);
    if (length <= limits::kMaxNameLength) return false;
    problems.push_back(errorAt(code::kCsvLimit, file, f,
                               std::string("the ") + what + " name " + shown(name) + " has " + std::to_string(length) +
                                   " characters; the limit is " + std::to_string(limits::kMaxNameLength),
                               "Shorten the name; the notes of a compartment can hold the longer description."));
    return true;
}

// ---------------------------------------------------------------------------------
// Where each value came from, so that validation's findings can name their cell
// ---------------------------------------------------------------------------------

struct Cell {
    int line = 0;
    int column = 0;
};

struct Locations {
    std::string compartmentsFile, dietFile, harvestFile, routingFile;
    // compartments.csv
    std::vector<int> compartmentLine;                  // per compartment index
    std::array<int, kParamCount> paramColumn{};        // 0 when the column is absent
    int kindColumn = 0;
    // diet.csv
    bool longDiet = false;                             // long form: one row per (predator, prey)
    std::map<std::size_t, int> dietLine;               // predator -> line of its row (long form: its first row)
    std::map<std::size_t, int> preyColumn;             // wide form: prey -> column in the header
    int importColumn = 0;                              // wide form
    std::size_t dietEntries = 0;                       // non-zero shares read so far (limits::kMaxDietEntries)
    std::unordered_map<std::uint64_t, int> dietEntryLine;  // long form: dietEntryKey -> line of the entry
    // detritus_routing.csv
    struct RoutingRow { int line; int sourceColumn, detritusColumn, fractionColumn; };
    std::map<std::pair<std::size_t, std::size_t>, RoutingRow> routingRow;  // (source, pool)
    std::map<std::size_t, Cell> firstRoutingCell;                           // source -> its first source cell
    // harvest.csv
    struct HarvestRow { int line; std::array<int, 6> column; };
    std::map<std::pair<std::size_t, std::size_t>, HarvestRow> harvestRow;  // (fleet, compartment)
    std::map<std::size_t, Cell> fleetCell;                                 // fleet -> its first fleet cell
    std::map<std::size_t, Cell> discardPoolCell;                           // fleet -> cell naming its pool
    // Compartments whose rows had a structural error: validation findings about them
    // would only repeat the same fault in other words. Key: (compartment, area).
    std::set<std::pair<std::string, std::string>> broken;
    // diet.csv was refused as a whole (not UTF-8 text): every diet finding would repeat that.
    bool dietUnread = false;
};


// Whether `folder/name` exists; reports it missing when it is required.
bool sheetPresent(const std::filesystem::path& folder, std::string_view name, bool required, Problems& problems)
{
    const std::filesystem::path path = folder / name;
    std::error_code ec;
    if (std::filesystem::exists(path, ec)) return true;
    if (required)
        problems.push_back(problemAt(code::kCsvMissingFile, Severity::Error, path.string(), 0, 0,
                                     "the model folder has no " + std::string(name)));
    return false;
}

// Reads `folder/name`. When the file is absent and not required, returns nullopt
// without a problem.
std::optional<CsvTable> readSheet(const std::filesystem::path& folder, std::string_view name, bool required,
                                  Problems& problems)
{
    const std::filesystem::path path = folder / name;
    if (!sheetPresent(folder, name, required, problems)) return std::nullopt;
    CsvParseResult parsed = readCsvFile(path);
    problems.insert(problems.end(), parsed.problems.begin(), parsed.problems.end());
    // Refused as a whole (not UTF-8, NUL bytes): one message, not also "the file is empty".
    if (parsed.table.records.empty() && hasErrors(parsed.problems)) return std::nullopt;
    return std::move(parsed.table);
}

// Looks up a compartment named in a cell; reports an unknown name.
std::optional<std::size_t> knownCompartment(const NameIndex& names, const CsvField& f, const std::string& file,
                                            const std::string& role, Problems& problems)
{
    const std::string_view name = trim(f.text);
    if (const auto i = names.find(name)) return i;
    std::string hint = names.didYouMean(name);
    if (hint.empty()) hint = "Every name must be a compartment of " + std::string(kCompartmentsFile) + ".";
    problems.push_back(errorAt(code::kCsvUnknownCompartment, file, f,
                               name.empty() ? role + ": the cell is empty, expected a compartment name"
                                            : role + " " + shown(name) + " is not a compartment of " +
                                                  std::string(kCompartmentsFile),
                               hint));
    return std::nullopt;
}

// ---------------------------------------------------------------------------------
// The files
// ---------------------------------------------------------------------------------

// settings.csv -----------------------------------------------------------------------
constexpr std::array<std::string_view, 2> kSettingsKeys = {"key", "value"};

std::string* textSetting(Model& m, std::string_view key)
{
    return key == "currency" ? &m.units.currency : key == "area" ? &m.units.area : key == "time" ? &m.units.time : nullptr;
}

double* numberSetting(Model& m, std::string_view key)
{
    BalanceRules& r = m.rules;
    return key == "ee_max"               ? &r.eeMax
           : key == "pq_min"             ? &r.pqMin
           : key == "pq_max"             ? &r.pqMax
           : key == "diet_sum_tolerance" ? &r.dietSumTolerance
           : key == "cv_grade_a"         ? &r.cvByGrade[0]
           : key == "cv_grade_b"         ? &r.cvByGrade[1]
           : key == "cv_grade_c"         ? &r.cvByGrade[2]
           : key == "cv_grade_d"         ? &r.cvByGrade[3]
           : key == "plausible_biomass_max" ? &r.plausible.biomassMax
           : key == "plausible_rate_max"    ? &r.plausible.rateMax
           : key == "plausible_flow_max"    ? &r.plausible.flowMax
                                            : nullptr;
}

void readSettings(const CsvTable& table, Model& model, Problems& problems)
{
    const auto sheet = openKeyed(table, kSettingsKeys, kSettingsKeys, problems);
    if (!sheet) return;
    std::map<std::string, int, std::less<>> seen;
    for (const CsvRecord* r : sheet->rows) {
        const CsvField& keyField = *sheet->field(*r, 0);
        const CsvField& valueField = *sheet->field(*r, 1);
        const std::string key(trim(keyField.text));
        if (const auto it = seen.find(key); it != seen.end()) {
            problems.push_back(errorAt(code::kCsvDuplicateRow, table.file, keyField,
                                       "setting " + shown(key) + " is given twice (first on line " +
                                           std::to_string(it->second) + ")"));
            continue;
        }
        seen.emplace(key, keyField.line);
        if (std::string* text = textSetting(model, key)) {
            if (trim(valueField.text).empty())
                problems.push_back(errorAt(code::kCsvMissingValue, table.file, valueField,
                                           "setting " + shown(key) + " needs a value"));
            else
                *text = std::string(trim(valueField.text));
            continue;
        }
        double* number = numberSetting(model, key);
        if (!number) {
            problems.push_back(errorAt(code::kCsvUnknownSetting, table.file, keyField, "unknown setting " + shown(key),
                                       "Known settings: currency, area, time, ee_max, pq_min, pq_max, "
                                       "diet_sum_tolerance, cv_grade_a, cv_grade_b, cv_grade_c, cv_grade_d, "
                                       "plausible_biomass_max, plausible_rate_max, plausible_flow_max."));
            continue;
        }
        const NumberCell v = numberCell(valueField, table.file, "setting " + shown(key), problems, true);
        if (v.bad) continue;
        if (!v.value) {
            problems.push_back(errorAt(code::kCsvMissingValue, table.file, valueField,
                                       "setting " + shown(key) + " needs a number"));
            continue;
        }
        if (key.starts_with("plausible_") && !(*v.value > 0)) {
            problems.push_back(errorAt(code::kCsvNumber, table.file, valueField,
                                       "setting " + shown(key) + " must be above 0 (a value beyond it is warned about)"));
            continue;
        }
        *number = *v.value;
    }
}

// compartments.csv -------------------------------------------------------------------
// Column order of the contract: name, kind, then the parameters in Param order.
std::array<std::string_view, 2 + kParamCount> compartmentKeys()
{
    std::array<std::string_view, 2 + kParamCount> keys{"name", "kind"};
    for (std::size_t k = 0; k < kParamCount; ++k) keys[2 + k] = paramKey(kAllParams[k]);
    return keys;
}

// Checks a name cell of compartments.csv; returns the trimmed name, or nullopt.
std::optional<std::string> compartmentName(const CsvField& f, const std::string& file,
                                           std::map<std::string, int, std::less<>>& seen, Problems& problems)
{
    const std::string name(trim(f.text));
    if (name.empty()) {
        problems.push_back(errorAt(code::kCsvName, file, f, "the compartment has no name",
                                   "Give every compartment a name; diet, harvest and routing refer to it by name."));
        return std::nullopt;
    }
    if (nameTooLong(f, name, file, "compartment", problems)) return std::nullopt;
    if (name == kImportColumn) {
        problems.push_back(errorAt(code::kCsvName, file, f, "'import' is reserved for the import column of diet.csv",
                                   "Choose another name, e.g. 'imported food'."));
        return std::nullopt;
    }
    if (const auto it = seen.find(name); it != seen.end()) {
        problems.push_back(errorAt(code::kCsvDuplicateName, file, f,
                                   "compartment " + shown(name) + " is already defined on line " +
                                       std::to_string(it->second),
                                   "Compartment names must be unique."));
        return std::nullopt;
    }
    seen.emplace(name, f.line);
    return name;
}

void readCompartments(const CsvTable& table, Model& model, Locations& loc, Problems& problems)
{
    const auto keys = compartmentKeys();
    constexpr std::array<std::string_view, 2> required = {"name", "kind"};
    const auto sheet = openKeyed(table, keys, required, problems);
    if (!sheet) return;
    for (std::size_t k = 0; k < kParamCount; ++k) loc.paramColumn[k] = sheet->column(2 + k);
    loc.kindColumn = sheet->column(1);
    if (sheet->rows.empty() && table.records.size() == 1)
        problems.push_back(problemAt(code::kCsvNoRows, Severity::Error, table.file, 2, 1,
                                     "the file lists no compartments, only its header"));
    if (sheet->rows.size() > limits::kMaxCompartments) {  // refused whole: no model comes of it anyway
        problems.push_back(problemAt(code::kCsvLimit, Severity::Error, table.file, sheet->rows[limits::kMaxCompartments]->line,
                                     1, "more than " + limits::groupedNumber(limits::kMaxCompartments) +
                                            " compartments (this is row " +
                                            limits::groupedNumber(limits::kMaxCompartments + 1) +
                                            "); the limit of this version is " +
                                            limits::groupedNumber(limits::kMaxCompartments),
                                     "Aggregate compartments, or split the model into sub-systems."));
        return;
    }
    std::map<std::string, int, std::less<>> seen;
    model.reserve(sheet->rows.size());
    for (const CsvRecord* r : sheet->rows) {
        const std::size_t before = problems.size();
        const auto name = compartmentName(*sheet->field(*r, 0), table.file, seen, problems);
        const CsvField& kindField = *sheet->field(*r, 1);
        const auto kind = parseKind(kindField.text);
        if (!kind)
            problems.push_back(errorAt(code::kCsvKind, table.file, kindField,
                                       "kind of " + (name ? shown(*name) : std::string("this compartment")) +
                                           ": expected producer, consumer or detritus, found " +
                                           shown(kindField.text)));
        if (!name) continue;
        Compartment c;
        c.name = *name;
        c.kind = kind.value_or(CompartmentKind::Consumer);
        for (std::size_t k = 0; k < kParamCount; ++k) {
            const CsvField* f = sheet->field(*r, 2 + k);
            if (!f) continue;
            const Param p = kAllParams[k];
            const NumberCell v = numberCell(*f, table.file, std::string(paramKey(p)) + " of " + shown(*name), problems);
            if (v.bad) {
                problems.back().compartment = *name;
                problems.back().parameter = paramKey(p);
                continue;
            }
            c.value(p) = v.value;
        }
        if (problems.size() != before) loc.broken.insert({*name, "*"});
        model.addCompartment(std::move(c));
        loc.compartmentLine.push_back(r->line);
    }
}

// diet.csv ---------------------------------------------------------------------------
// Two forms, told apart by the header (DESIGN 5.1). Wide: `predator,<prey 1>,...[,import]`,
// one row per predator, what people edit in a spreadsheet. Long: `predator,prey,share`, one
// row per non-zero entry, so a large model costs its entries rather than n x n cells.
constexpr std::array<std::string_view, 3> kLongDietKeys = {"predator", "prey", "share"};
constexpr int kLongPredatorColumn = 1, kLongShareColumn = 3;

// Key of a long-form entry; the import column counts as prey index n.
std::uint64_t dietEntryKey(const Model& model, std::size_t predator, std::size_t prey)
{
    return static_cast<std::uint64_t>(predator) * (model.size() + 1) + prey;
}

bool isLongDietHeader(const CsvRecord& header, const NameIndex& names)
{
    if (header.fields.size() != kLongDietKeys.size()) return false;
    for (std::size_t c = 0; c < kLongDietKeys.size(); ++c)
        if (trim(header.fields[c].text) != kLongDietKeys[c]) return false;
    // A wide diet whose only prey are compartments named 'prey' and 'share' reads the same.
    return !(names.find(kLongDietKeys[1]) && names.find(kLongDietKeys[2]));
}

// Counts one non-zero diet share; false (and one error, at the first share too many)
// once the model holds limits::kMaxDietEntries.
bool dietEntryAllowed(const std::string& file, const CsvField& shareField, Locations& loc, Problems& problems)
{
    if (++loc.dietEntries <= limits::kMaxDietEntries) return true;
    if (loc.dietEntries == limits::kMaxDietEntries + 1)
        problems.push_back(errorAt(code::kCsvLimit, file, shareField,
                                   "more than " + limits::groupedNumber(limits::kMaxDietEntries) +
                                       " non-zero diet shares; the limit of this version is " +
                                       limits::groupedNumber(limits::kMaxDietEntries),
                                   "Leave out shares too small to matter, or aggregate prey."));
    return false;
}

// One row of the long form, whose header isLongDietHeader has accepted.
void readLongDietRow(const CsvRecord& r, const std::string& file, Model& model, const NameIndex& names,
                     Locations& loc, Problems& problems)
{
    if (!rowShapeOk(r, kLongDietKeys.size(), file, problems)) return;
    const std::size_t importIndex = model.size();
    const CsvField& predatorField = r.fields[0];
    const CsvField& preyField = r.fields[1];
    const CsvField& shareField = r.fields[2];
    const auto predator = knownCompartment(names, predatorField, file, "predator", problems);
    const bool isImport = trim(preyField.text) == kImportColumn;
    const auto prey = isImport ? std::optional<std::size_t>(importIndex)
                               : knownCompartment(names, preyField, file, "prey", problems);
    if (!predator || !prey) {
        if (predator) loc.broken.insert({model.compartment(*predator).name, "diet"});
        return;
    }
    const std::string& predatorName = model.compartment(*predator).name;
    const std::string_view preyName = isImport ? kImportColumn : std::string_view(model.compartment(*prey).name);
    loc.dietLine.emplace(*predator, r.line);  // keeps the predator's first line
    const auto [entry, isNew] = loc.dietEntryLine.emplace(dietEntryKey(model, *predator, *prey), r.line);
    if (!isNew) {
        problems.push_back(errorAt(code::kCsvDuplicateRow, file, preyField,
                                   "the share of " + shown(preyName) + " in the diet of " + shown(predatorName) +
                                       " is already given on line " + std::to_string(entry->second),
                                   "Give one row per predator and prey."));
        loc.broken.insert({predatorName, "diet"});
        return;
    }
    if (const auto share = parseNumber(trim(shareField.text))) {  // the common case, without message text
        if (*share != 0.0 && !dietEntryAllowed(file, shareField, loc, problems)) return;
        if (isImport) model.setDietImport(*predator, *share);
        else model.setDiet(*predator, *prey, *share);
        return;
    }
    const std::string what = "share of " + shown(preyName) + " in the diet of " + shown(predatorName);
    const NumberCell v = numberCell(shareField, file, what, problems);
    if (!v.bad && !v.value)
        problems.push_back(errorAt(code::kCsvMissingValue, file, shareField, what + ": the cell is empty",
                                   "Give the share (0 to 1), or delete the row."));
    Problem& p = problems.back();  // numberCell accepts what parseNumber refused only when empty
    p.compartment = predatorName;
    p.parameter = "diet";
    p.prey = std::string(preyName);
    loc.broken.insert({predatorName, "diet"});
}

// The wide form, read row by row as the file is parsed (see readDiet).
class WideDietReader {
public:
    WideDietReader(Model& model, const NameIndex& names, Locations& loc, Problems& problems, std::string file)
        : model_(model), names_(names), loc_(loc), problems_(problems), file_(std::move(file))
    {
    }

    void header(const CsvRecord& header)
    {
        const std::string_view corner = trim(header.fields[0].text);
        if (!corner.empty() && corner != "predator") {
            problems_.push_back(errorAt(code::kCsvHeader, file_, header.fields[0],
                                        "the first column must be headed 'predator', found " + shown(corner),
                                        "Column 1 holds predator names; each further column is a prey (or 'import')."));
            refused_ = true;
            return;
        }
        prey_.assign(header.fields.size(), kUnusable);
        std::map<std::string, int, std::less<>> seenColumn;
        for (std::size_t col = 1; col < header.fields.size(); ++col) {
            const CsvField& f = header.fields[col];
            const std::string name(trim(f.text));
            if (name.empty()) {
                prey_[col] = kUnnamed;
                continue;
            }
            if (const auto it = seenColumn.find(name); it != seenColumn.end()) {
                problems_.push_back(errorAt(code::kCsvDuplicateColumn, file_, f,
                                            "prey column " + shown(name) + " appears twice (first in column " +
                                                std::to_string(it->second) + ")"));
                continue;
            }
            seenColumn.emplace(name, f.column);
            if (name == kImportColumn) {
                prey_[col] = kImport;
                loc_.importColumn = f.column;
            } else if (const auto i = names_.find(name)) {
                prey_[col] = static_cast<long>(*i);
                loc_.preyColumn[*i] = f.column;
            } else {
                std::string hint = names_.didYouMean(name);
                if (hint.empty()) hint = "Each prey column must be a compartment of compartments.csv, or 'import'.";
                problems_.push_back(errorAt(code::kCsvUnknownCompartment, file_, f,
                                            "prey column " + shown(name) + " is not a compartment of compartments.csv",
                                            hint));
            }
        }
    }

    void row(const CsvRecord& r)
    {
        if (refused_ || !rowShapeOk(r, prey_.size(), file_, problems_)) return;
        const auto predator = knownCompartment(names_, r.fields[0], file_, "predator", problems_);
        if (!predator) return;
        const std::string& predatorName = model_.compartment(*predator).name;
        if (const auto it = loc_.dietLine.find(*predator); it != loc_.dietLine.end()) {
            problems_.push_back(errorAt(code::kCsvDuplicateRow, file_, r.fields[0],
                                        "the diet of " + shown(predatorName) + " is already given on line " +
                                            std::to_string(it->second)));
            return;
        }
        loc_.dietLine.emplace(*predator, r.line);

        const std::size_t before = problems_.size();
        for (std::size_t col = 1; col < prey_.size(); ++col) {
            const CsvField& f = r.fields[col];
            if (prey_[col] == kUnusable) continue;
            if (prey_[col] == kUnnamed) {
                if (!trim(f.text).empty())
                    problems_.push_back(errorAt(code::kCsvHeader, file_, f,
                                                "this cell has no prey name above it but holds " + shown(f.text)));
                continue;
            }
            if (trim(f.text).empty()) continue;  // 0, and most cells of a wide diet: no message text to build
            const std::string preyName =
                prey_[col] == kImport ? std::string(kImportColumn) : model_.compartment(prey_[col]).name;
            const NumberCell v = numberCell(
                f, file_, "share of " + shown(preyName) + " in the diet of " + shown(predatorName), problems_);
            if (v.bad) {
                Problem& p = problems_.back();
                p.compartment = predatorName;
                p.parameter = "diet";
                p.prey = preyName;
                continue;
            }
            if (!v.value) continue;
            if (*v.value != 0.0 && !dietEntryAllowed(file_, f, loc_, problems_)) break;
            if (prey_[col] == kImport) model_.setDietImport(*predator, *v.value);
            else model_.setDiet(*predator, static_cast<std::size_t>(prey_[col]), *v.value);
        }
        if (problems_.size() != before) loc_.broken.insert({predatorName, "diet"});
    }

    void finish()
    {
        // A prey column that could not be read leaves every row's sum in doubt.
        if (!refused_ && std::find(prey_.begin() + 1, prey_.end(), kUnusable) != prey_.end())
            for (const Compartment& c : model_.compartments()) loc_.broken.insert({c.name, "diet"});
    }

private:
    // What each column after the first holds: a compartment index, or one of these.
    static constexpr long kImport = -1, kUnnamed = -2, kUnusable = -3;
    Model& model_;
    const NameIndex& names_;
    Locations& loc_;
    Problems& problems_;
    const std::string file_;
    std::vector<long> prey_;
    bool refused_ = false;
};

// Reads diet.csv while it is parsed, row by row: a wide diet is n x n cells, and holding
// them all as parsed fields cost more (memory, page faults) than reading them. Problems
// keep the order of the other files: the parser's first, then the reader's.
void readDiet(const std::filesystem::path& path, Model& model, const NameIndex& names, Locations& loc,
              Problems& problems)
{
    const std::string file = path.string();
    Problems found;
    enum class Form { None, Refused, Wide, Long } form = Form::None;
    WideDietReader wide(model, names, loc, found, file);
    Problems parsing = readCsvFileRecords(path, [&](CsvRecord& r) {
        switch (form) {
        case Form::None:
            if (refuseOtherSeparators(r, file, found)) {
                form = Form::Refused;
            } else if (isLongDietHeader(r, names)) {
                form = Form::Long;
                loc.longDiet = true;
            } else {
                form = Form::Wide;
                wide.header(r);
            }
            break;
        case Form::Long: readLongDietRow(r, file, model, names, loc, found); break;
        case Form::Wide: wide.row(r); break;
        case Form::Refused: break;
        }
    });
    loc.dietUnread = form == Form::None && hasErrors(parsing);
    if (form == Form::None && !hasErrors(parsing))  // a file that could not be parsed is not also "empty"
        found.push_back(problemAt(code::kCsvHeader, Severity::Error, file, 1, 1,
                                  "the file is empty; expected a header: predator, then one column per prey"));
    if (form == Form::Wide) wide.finish();
    problems.insert(problems.end(), std::make_move_iterator(parsing.begin()), std::make_move_iterator(parsing.end()));
    problems.insert(problems.end(), std::make_move_iterator(found.begin()), std::make_move_iterator(found.end()));
}

// harvest.csv ------------------------------------------------------------------------
constexpr std::array<std::string_view, 6> kHarvestKeys = {"fleet",    "compartment",      "landings",
                                                          "discards", "discard_survival", "discard_pool"};
constexpr std::array<std::string_view, 2> kHarvestRequired = {"fleet", "compartment"};

void readHarvest(const CsvTable& table, Model& model, const NameIndex& names, Locations& loc, Problems& problems)
{
    const auto sheet = openKeyed(table, kHarvestKeys, kHarvestRequired, problems);
    if (!sheet) return;
    bool fleetLimitReported = false;
    for (const CsvRecord* r : sheet->rows) {
        const CsvField& fleetField = *sheet->field(*r, 0);
        const std::string fleetName(trim(fleetField.text));
        if (fleetName.empty()) {
            problems.push_back(errorAt(code::kCsvName, table.file, fleetField, "the fleet has no name",
                                       "Give the fleet (gear, sector or licence group) a name."));
            continue;
        }
        const std::size_t fleet = model.fleetIndexOf(fleetName).value_or(model.fleets().size());
        if (fleet == model.fleets().size()) {
            if (nameTooLong(fleetField, fleetName, table.file, "fleet", problems)) continue;
            if (fleet == limits::kMaxFleets) {  // each fleet holds a catch per compartment
                if (std::exchange(fleetLimitReported, true)) continue;
                problems.push_back(errorAt(code::kCsvLimit, table.file, fleetField,
                                           "fleet " + shown(fleetName) + " would be fleet " +
                                               std::to_string(fleet + 1) + "; the limit of this version is " +
                                               std::to_string(limits::kMaxFleets) + " fleets",
                                           "Group gears or licence groups into fewer fleets."));
                continue;
            }
            model.addFleet(fleetName);
            loc.fleetCell[fleet] = {fleetField.line, fleetField.column};
        }
        const std::string fleetLabel = " of fleet " + shown(fleetName);

        // Discard pool: one per fleet, named on any of its rows.
        if (const CsvField* poolField = sheet->field(*r, 5); poolField && !trim(poolField->text).empty()) {
            if (const auto pool = knownCompartment(names, *poolField, table.file, "discard pool", problems)) {
                Fleet& f = model.fleet(fleet);
                if (f.discardPool && *f.discardPool != *pool)
                    problems.push_back(errorAt(code::kCsvDiscardPool, table.file, *poolField,
                                               "fleet " + shown(fleetName) + " already sends its discards to " +
                                                   shown(model.compartment(*f.discardPool).name) + " (line " +
                                                   std::to_string(loc.discardPoolCell[fleet].line) + ")",
                                               "A fleet has one discard pool; give the same pool on every row."));
                else if (!f.discardPool) {
                    f.discardPool = *pool;
                    loc.discardPoolCell[fleet] = {poolField->line, poolField->column};
                }
            }
        }

        const CsvField& compartmentField = *sheet->field(*r, 1);
        if (trim(compartmentField.text).empty()) {
            // A row with a fleet only declares the fleet; it may not carry a catch.
            for (std::size_t key = 2; key <= 4; ++key)
                if (const CsvField* f = sheet->field(*r, key); f && !trim(f->text).empty()) {
                    problems.push_back(errorAt(code::kCsvUnknownCompartment, table.file, compartmentField,
                                               "this row" + fleetLabel + " gives " + std::string(kHarvestKeys[key]) +
                                                   " but no compartment"));
                    break;
                }
            continue;
        }
        const auto i = knownCompartment(names, compartmentField, table.file, "compartment", problems);
        if (!i) continue;
        const std::string& name = model.compartment(*i).name;
        if (const auto it = loc.harvestRow.find({fleet, *i}); it != loc.harvestRow.end()) {
            problems.push_back(errorAt(code::kCsvDuplicateRow, table.file, compartmentField,
                                       "the catch of " + shown(name) + fleetLabel + " is already given on line " +
                                           std::to_string(it->second.line),
                                       "Give one row per fleet and compartment."));
            continue;
        }
        Locations::HarvestRow where{r->line, {}};
        for (std::size_t key = 0; key < kHarvestKeys.size(); ++key) where.column[key] = sheet->column(key);
        loc.harvestRow.emplace(std::make_pair(fleet, *i), where);

        Fleet& f = model.fleet(fleet);
        std::vector<double>* targets[] = {&f.landings, &f.discards, &f.discardSurvival};
        for (std::size_t key = 2; key <= 4; ++key) {
            const CsvField* cell = sheet->field(*r, key);
            if (!cell) continue;
            const NumberCell v = numberCell(*cell, table.file,
                                            std::string(kHarvestKeys[key]) + " of " + shown(name) + fleetLabel, problems);
            if (v.bad) {
                problems.back().compartment = name;
                problems.back().parameter = "harvest";
                problems.back().fleet = fleetName;
                loc.broken.insert({name, "harvest"});
                continue;
            }
            (*targets[key - 2])[*i] = v.value.value_or(0.0);
        }
    }
}

// detritus_routing.csv -----------------------------------------------------------------
constexpr std::array<std::string_view, 3> kRoutingKeys = {"source", "detritus", "fraction"};

void readRouting(const CsvTable& table, Model& model, const NameIndex& names, Locations& loc, Problems& problems)
{
    const auto sheet = openKeyed(table, kRoutingKeys, kRoutingKeys, problems);
    if (!sheet) return;
    for (const CsvRecord* r : sheet->rows) {
        const CsvField& sourceField = *sheet->field(*r, 0);
        const CsvField& poolField = *sheet->field(*r, 1);
        const auto source = knownCompartment(names, sourceField, table.file, "source", problems);
        const auto pool = knownCompartment(names, poolField, table.file, "detritus pool", problems);
        if (!source || !pool) {
            if (source) loc.broken.insert({model.compartment(*source).name, "routing"});
            continue;
        }
        const std::string& sourceName = model.compartment(*source).name;
        const std::string& poolName = model.compartment(*pool).name;
        if (const auto it = loc.routingRow.find({*source, *pool}); it != loc.routingRow.end()) {
            problems.push_back(errorAt(code::kCsvDuplicateRow, table.file, poolField,
                                       "the share of " + shown(sourceName) + " going to " + shown(poolName) +
                                           " is already given on line " + std::to_string(it->second.line)));
            continue;
        }
        loc.routingRow.emplace(std::make_pair(*source, *pool),
                               Locations::RoutingRow{r->line, sheet->column(0), sheet->column(1), sheet->column(2)});
        loc.firstRoutingCell.emplace(*source, Cell{sourceField.line, sourceField.column});

        const CsvField& fractionField = *sheet->field(*r, 2);
        const std::string what = "share of " + shown(sourceName) + " going to " + shown(poolName);
        const NumberCell v = numberCell(fractionField, table.file, what, problems);
        if (!v.bad && !v.value)
            problems.push_back(errorAt(code::kCsvMissingValue, table.file, fractionField, what + ": the cell is empty",
                                       "Give the fraction (0 to 1), or delete the row."));
        if (v.bad || !v.value) {
            problems.back().compartment = sourceName;
            problems.back().parameter = "routing";
            problems.back().prey = poolName;
            loc.broken.insert({sourceName, "routing"});
            continue;
        }
        model.setRouting(*source, *pool, *v.value);
    }
}

// confidence.csv ---------------------------------------------------------------------
constexpr std::array<std::string_view, 5> kConfidenceKeys = {"compartment", "parameter", "grade", "cv", "source"};
constexpr std::array<std::string_view, 2> kConfidenceRequired = {"compartment", "parameter"};
constexpr std::string_view kDietConfidenceKey = "diet";

void readConfidence(const CsvTable& table, Model& model, const NameIndex& names, Problems& problems)
{
    const auto sheet = openKeyed(table, kConfidenceKeys, kConfidenceRequired, problems);
    if (!sheet) return;
    const auto keys = compartmentKeys();
    const std::string paramList = joinKeys(std::span(keys).subspan(2));
    std::map<std::pair<std::size_t, std::size_t>, int> seen;
    for (const CsvRecord* r : sheet->rows) {
        const auto i = knownCompartment(names, *sheet->field(*r, 0), table.file, "compartment", problems);
        const CsvField& paramField = *sheet->field(*r, 1);
        // "diet": the confidence of the compartment's diet row as a whole (every share).
        const bool isDiet = trim(paramField.text) == kDietConfidenceKey;
        const auto param = parseParamKey(trim(paramField.text));
        if (!param && !isDiet)
            problems.push_back(errorAt(code::kCsvParameter, table.file, paramField,
                                       "unknown parameter " + shown(paramField.text),
                                       "Expected a parameter column of compartments.csv (" + paramList +
                                           ") or diet."));
        if (!i || (!param && !isDiet)) continue;
        const std::string& name = model.compartment(*i).name;
        const std::string what = std::string(isDiet ? kDietConfidenceKey : paramKey(*param)) + " of " + shown(name);
        const std::size_t p = isDiet ? kParamCount : static_cast<std::size_t>(*param);
        if (const auto it = seen.find({*i, p}); it != seen.end()) {
            problems.push_back(errorAt(code::kCsvDuplicateRow, table.file, paramField,
                                       "the confidence of " + what + " is already given on line " +
                                           std::to_string(it->second)));
            continue;
        }
        seen.emplace(std::make_pair(*i, p), paramField.line);

        Compartment& c = model.compartment(*i);
        Confidence& conf = isDiet ? c.dietConfidence : c.confidenceOf(*param);
        if (const CsvField* g = sheet->field(*r, 2)) {
            if (const auto grade = parseGrade(g->text)) conf.grade = *grade;
            else
                problems.push_back(errorAt(code::kCsvGrade, table.file, *g,
                                           "grade of " + what + ": expected A, B, C, D or empty, found " +
                                               shown(g->text)));
        }
        if (const CsvField* cv = sheet->field(*r, 3)) {
            const NumberCell v = numberCell(*cv, table.file, "cv of " + what, problems, true);
            if (!v.bad) conf.cv = v.value;
        }
        if (const CsvField* s = sheet->field(*r, 4)) conf.source = std::string(trim(s->text));
    }
}

// ---------------------------------------------------------------------------------
// Validation findings, placed on the cell the value came from
// ---------------------------------------------------------------------------------

bool isHidden(const Problem& p, const Locations& loc)
{
    return loc.broken.contains({p.compartment, "*"}) || loc.broken.contains({p.compartment, p.parameter}) ||
           (loc.dietUnread && p.parameter == "diet");
}

void placeOnCell(Problem& p, const Model& model, const NameIndex& names, const Locations& loc)
{
    const auto at = [&](const std::string& file, int line, int column) { p.location = FileLocation{file, line, column}; };
    const auto i = names.find(p.compartment);
    if (const auto param = parseParamKey(p.parameter); param && i) {
        at(loc.compartmentsFile, loc.compartmentLine[*i], loc.paramColumn[static_cast<std::size_t>(*param)]);
    } else if (p.parameter == "diet") {
        at(loc.dietFile, 0, 0);
        if (!i) return;
        const auto row = loc.dietLine.find(*i);
        if (row == loc.dietLine.end()) {  // no row in diet.csv: the compartment's row in compartments.csv
            if (*i < loc.compartmentLine.size() && loc.compartmentLine[*i] > 0)
                at(loc.compartmentsFile, loc.compartmentLine[*i], loc.kindColumn > 0 ? loc.kindColumn : 1);
            return;
        }
        if (loc.longDiet) {  // the entry's share cell, or for the row sum the predator's first line
            const auto prey = p.prey == kImportColumn ? std::optional<std::size_t>(model.size()) : names.find(p.prey);
            const auto entry = prey ? loc.dietEntryLine.find(dietEntryKey(model, *i, *prey)) : loc.dietEntryLine.end();
            if (entry != loc.dietEntryLine.end()) at(loc.dietFile, entry->second, kLongShareColumn);
            else at(loc.dietFile, row->second, kLongPredatorColumn);
            return;
        }
        int column = 1;
        if (p.prey == kImportColumn) column = loc.importColumn;
        else if (const auto prey = names.find(p.prey))
            if (const auto c = loc.preyColumn.find(*prey); c != loc.preyColumn.end()) column = c->second;
        at(loc.dietFile, row->second, column > 0 ? column : 1);
    } else if (p.parameter == "routing" && i) {
        at(loc.routingFile, 0, 0);
        if (const auto pool = names.find(p.prey)) {
            if (const auto row = loc.routingRow.find({*i, *pool}); row != loc.routingRow.end()) {
                const bool aboutPool = p.code == check::kRoutingToLiving;
                at(loc.routingFile, row->second.line, aboutPool ? row->second.detritusColumn : row->second.fractionColumn);
                return;
            }
        }
        if (const auto c = loc.firstRoutingCell.find(*i); c != loc.firstRoutingCell.end())
            at(loc.routingFile, c->second.line, c->second.column);
    } else if (p.parameter == "harvest") {
        at(loc.harvestFile, 0, 0);
        const auto fleet = model.fleetIndexOf(p.fleet);
        if (!fleet) return;
        if (p.code == check::kDiscardPool) {
            if (const auto c = loc.discardPoolCell.find(*fleet); c != loc.discardPoolCell.end())
                at(loc.harvestFile, c->second.line, c->second.column);
            return;
        }
        if (i)
            if (const auto row = loc.harvestRow.find({*fleet, *i}); row != loc.harvestRow.end()) {
                const std::size_t key = p.code == check::kNegativeLandings  ? 2
                                        : p.code == check::kNegativeDiscards ? 3
                                        : p.code == check::kDiscardSurvival  ? 4
                                                                             : 1;  // the compartment cell
                at(loc.harvestFile, row->second.line, row->second.column[key]);
                return;
            }
        if (const auto c = loc.fleetCell.find(*fleet); c != loc.fleetCell.end())
            at(loc.harvestFile, c->second.line, c->second.column);
    } else if (i && *i < loc.compartmentLine.size() && loc.compartmentLine[*i] > 0) {
        at(loc.compartmentsFile, loc.compartmentLine[*i], 1);  // about a compartment: its row
    } else {
        at(loc.compartmentsFile, 0, 0);  // about the model as a whole
    }
}

// Hints that only the reader can give, knowing what was typed.
void addReaderHints(Problem& p, const Model& model, const NameIndex& names)
{
    if (p.code != check::kDietFraction) return;
    const auto i = names.find(p.compartment);
    if (i && std::abs(model.dietRowSum(*i) - 100.0) < 0.5)
        p.hint = "This row sums to 100: write fractions (0.25), not percentages (25).";
}

// ---------------------------------------------------------------------------------
// Writing
// ---------------------------------------------------------------------------------

std::string optionalNumber(const std::optional<double>& v) { return v ? formatNumber(*v) : std::string(); }

// Names the reader would refuse or could not tell apart.
Problems unwritableNames(const Model& model)
{
    Problems out;
    const auto refuse = [&](std::string message) {
        Problem p;
        p.code = code::kCsvName;
        p.message = std::move(message);
        p.hint = "Rename it before exporting; names must be unique, non-empty and without spaces around them.";
        out.push_back(std::move(p));
    };
    for (const std::string& beyond : limits::exceededLimits(model)) {  // the reader would refuse the folder
        refuse(beyond);
        out.back().code = code::kCsvLimit;
        out.back().hint.clear();
    }
    std::set<std::string, std::less<>> seen;
    for (const Compartment& c : model.compartments()) {
        if (trim(c.name).empty()) refuse("a compartment has no name");
        else if (trim(c.name) != c.name) refuse("compartment " + shown(c.name) + " has spaces around its name");
        else if (c.name == kImportColumn) refuse("'import' is reserved for the import column of diet.csv");
        else if (!seen.insert(c.name).second) refuse("two compartments are named " + shown(c.name));
    }
    std::set<std::string, std::less<>> fleets;
    for (const Fleet& f : model.fleets()) {
        if (trim(f.name).empty()) refuse("a fleet has no name");
        else if (trim(f.name) != f.name) refuse("fleet " + shown(f.name) + " has spaces around its name");
        else if (!fleets.insert(f.name).second) refuse("two fleets are named " + shown(f.name));
    }
    return out;
}

std::string compartmentsText(const Model& model)
{
    const auto keys = compartmentKeys();
    std::string out = csvRecord(std::vector<std::string>(keys.begin(), keys.end()));
    for (const Compartment& c : model.compartments()) {
        std::vector<std::string> row = {c.name, std::string(kindKey(c.kind))};
        for (Param p : kAllParams) row.push_back(optionalNumber(c.value(p)));
        out += csvRecord(row);
    }
    return out;
}

bool hasDiet(const Model& model, std::size_t j)
{
    return model.dietImport(j) != 0.0 || !model.dietRow(j).empty();
}

bool writesLongDiet(const Model& model, const CsvWriteOptions& options)
{
    // With compartments named 'prey' and 'share' the reader takes that header for wide form.
    if (model.indexOf(kLongDietKeys[1]) && model.indexOf(kLongDietKeys[2])) return false;
    switch (options.dietForm) {
    case DietForm::Wide: return false;
    case DietForm::Long: return true;
    case DietForm::Automatic: break;
    }
    return model.size() > kWideDietMaxCompartments;
}

std::string longDietText(const Model& model)
{
    std::string out = csvRecord(std::vector<std::string>(kLongDietKeys.begin(), kLongDietKeys.end()));
    for (std::size_t j = 0; j < model.size(); ++j) {
        const std::string& predator = model.compartment(j).name;
        for (const GridEntry& e : model.dietRow(j))
            out += csvRecord({predator, model.compartment(e.col).name, formatNumber(e.value)});
        if (model.dietImport(j) != 0.0)
            out += csvRecord({predator, std::string(kImportColumn), formatNumber(model.dietImport(j))});
    }
    return out;
}

std::string wideDietText(const Model& model)
{
    std::vector<std::string> header = {"predator"};
    for (const Compartment& c : model.compartments()) header.push_back(c.name);
    header.emplace_back(kImportColumn);
    std::string out = csvRecord(header);
    for (std::size_t j = 0; j < model.size(); ++j) {
        // Consumers always get a row; others only if they hold a diet (kept, not lost).
        if (model.compartment(j).kind != CompartmentKind::Consumer && !hasDiet(model, j)) continue;
        std::vector<std::string> row = {model.compartment(j).name};
        for (std::size_t i = 0; i < model.size(); ++i) row.push_back(formatNumber(model.diet(j, i)));
        row.push_back(formatNumber(model.dietImport(j)));
        out += csvRecord(row);
    }
    return out;
}

// Empty when the model has no fleet.
std::string harvestText(const Model& model)
{
    if (model.fleets().empty()) return {};
    bool extended = false;  // the two optional columns only when they carry something
    for (const Fleet& f : model.fleets())
        extended = extended || f.discardPool ||
                   std::any_of(f.discardSurvival.begin(), f.discardSurvival.end(), [](double s) { return s != 0.0; });
    std::string out = csvRecord(std::vector<std::string>(kHarvestKeys.begin(), kHarvestKeys.begin() + (extended ? 6 : 4)));
    for (const Fleet& f : model.fleets()) {
        const std::string pool = f.discardPool ? model.compartment(*f.discardPool).name : std::string();
        bool wroteRow = false;
        for (std::size_t i = 0; i < model.size(); ++i) {
            if (f.landings[i] == 0.0 && f.discards[i] == 0.0 && f.discardSurvival[i] == 0.0) continue;
            std::vector<std::string> row = {f.name, model.compartment(i).name, formatNumber(f.landings[i]),
                                            formatNumber(f.discards[i])};
            if (extended) {
                row.push_back(formatNumber(f.discardSurvival[i]));
                row.push_back(pool);
            }
            out += csvRecord(row);
            wroteRow = true;
        }
        if (!wroteRow) {  // a fleet without catch yet: a row naming the fleet only
            std::vector<std::string> row = {f.name, "", "", ""};
            if (extended) {
                row.emplace_back();
                row.push_back(pool);
            }
            out += csvRecord(row);
        }
    }
    return out;
}

// Empty when every source uses the default routing.
std::string routingText(const Model& model)
{
    std::string rows;
    for (std::size_t s = 0; s < model.size(); ++s)
        for (const GridEntry& e : model.routingRow(s))
            rows += csvRecord({model.compartment(s).name, model.compartment(e.col).name, formatNumber(e.value)});
    return rows.empty() ? rows : csvRecord({"source", "detritus", "fraction"}) + rows;
}

std::string dietText(const Model& model, const CsvWriteOptions& options)
{
    return writesLongDiet(model, options) ? longDietText(model) : wideDietText(model);
}

// Empty when no parameter has a confidence.
std::string confidenceText(const Model& model)
{
    std::string rows;
    for (const Compartment& c : model.compartments())
        for (Param p : kAllParams) {
            const Confidence& conf = c.confidenceOf(p);
            if (conf == Confidence{}) continue;
            rows += csvRecord({c.name, std::string(paramKey(p)), std::string(gradeKey(conf.grade)),
                               optionalNumber(conf.cv), conf.source});
        }
    for (const Compartment& c : model.compartments()) {
        const Confidence& conf = c.dietConfidence;
        if (conf == Confidence{}) continue;
        rows += csvRecord({c.name, std::string(kDietConfidenceKey), std::string(gradeKey(conf.grade)),
                           optionalNumber(conf.cv), conf.source});
    }
    return rows.empty() ? rows
                        : csvRecord(std::vector<std::string>(kConfidenceKeys.begin(), kConfidenceKeys.end())) + rows;
}

// Empty when units and rules are the defaults; otherwise the settings that differ.
std::string settingsText(const Model& model)
{
    Model defaults;
    std::string rows;
    for (const char* key : {"currency", "area", "time"})
        if (*textSetting(const_cast<Model&>(model), key) != *textSetting(defaults, key))
            rows += csvRecord({key, *textSetting(const_cast<Model&>(model), key)});
    for (const char* key : {"ee_max", "pq_min", "pq_max", "diet_sum_tolerance", "cv_grade_a", "cv_grade_b",
                            "cv_grade_c", "cv_grade_d", "plausible_biomass_max", "plausible_rate_max",
                            "plausible_flow_max"})
        if (*numberSetting(const_cast<Model&>(model), key) != *numberSetting(defaults, key))
            rows += csvRecord({key, formatNumber(*numberSetting(const_cast<Model&>(model), key))});
    return rows.empty() ? rows : csvRecord({"key", "value"}) + rows;
}

}  // namespace

CsvReadResult readCsvModel(const std::filesystem::path& folder)
{
    CsvReadResult result;
    Problems& problems = result.problems;
    std::error_code ec;
    if (!std::filesystem::is_directory(folder, ec)) {
        problems.push_back(problemAt(code::kCsvMissingFile, Severity::Error, folder.string(), 0, 0,
                                     std::filesystem::exists(folder, ec)
                                         ? "expected a CSV model folder but found a file"
                                         : "the CSV model folder does not exist"));
        return result;
    }

    Model model;
    Locations loc;
    loc.compartmentsFile = (folder / kCompartmentsFile).string();
    loc.dietFile = (folder / kDietFile).string();
    loc.harvestFile = (folder / kHarvestFile).string();
    loc.routingFile = (folder / kRoutingFile).string();

    if (const auto t = readSheet(folder, kSettingsFile, false, problems)) readSettings(*t, model, problems);
    const auto compartments = readSheet(folder, kCompartmentsFile, true, problems);
    if (compartments) readCompartments(*compartments, model, loc, problems);
    const bool anyConsumer = std::any_of(model.compartments().begin(), model.compartments().end(),
                                         [](const Compartment& c) { return c.kind == CompartmentKind::Consumer; });
    const NameIndex names(model);  // no compartment is added from here on
    // Without compartments.csv, a missing diet.csv would only add noise.
    if (sheetPresent(folder, kDietFile, compartments && anyConsumer, problems))
        readDiet(folder / kDietFile, model, names, loc, problems);
    if (const auto t = readSheet(folder, kHarvestFile, false, problems)) readHarvest(*t, model, names, loc, problems);
    if (const auto t = readSheet(folder, kRoutingFile, false, problems)) readRouting(*t, model, names, loc, problems);
    if (const auto t = readSheet(folder, kConfidenceFile, false, problems)) readConfidence(*t, model, names, problems);

    // The semantic checks are validation's (one place for them); the reader adds where.
    if (compartments) {
        for (Problem& p : validateModel(model)) {
            if (isHidden(p, loc)) continue;
            placeOnCell(p, model, names, loc);
            addReaderHints(p, model, names);
            problems.push_back(std::move(p));
        }
    }

    if (problems.size() > kMaxProblems) {
        const std::size_t more = problems.size() - kMaxProblems;
        const bool errorsHidden = std::any_of(problems.begin() + kMaxProblems, problems.end(),
                                              [](const Problem& p) { return p.severity == Severity::Error; });
        problems.resize(kMaxProblems);
        Problem summary = problemAt(code::kCsvTooManyProblems, errorsHidden ? Severity::Error : Severity::Warning,
                                    folder.string(), 0, 0,
                                    "and " + std::to_string(more) + " more problems not listed",
                                    "Fix the ones above first; they often cause the rest.");
        problems.push_back(std::move(summary));
    }
    if (!hasErrors(problems)) result.model = std::move(model);
    return result;
}

Problems writeCsvModel(const Model& model, const std::filesystem::path& folder, const CsvWriteOptions& options)
{
    Problems problems = unwritableNames(model);
    if (hasErrors(problems)) return problems;

    std::error_code ec;
    std::filesystem::create_directories(folder, ec);
    if (ec || !std::filesystem::is_directory(folder, ec)) {
        Problem p;
        p.code = code::kCsvWrite;
        p.message = "cannot create the folder " + folder.string() + (ec ? ": " + ec.message() : std::string());
        p.location = FileLocation{folder.string(), 0, 0};
        return {p};
    }
    // An empty text means "this file has nothing to say": it is not written, and one
    // left from an earlier write is removed so that it cannot be read back as current.
    const std::pair<std::string_view, std::string> files[] = {
        {kCompartmentsFile, compartmentsText(model)}, {kDietFile, dietText(model, options)},
        {kHarvestFile, harvestText(model)},           {kRoutingFile, routingText(model)},
        {kConfidenceFile, confidenceText(model)},     {kSettingsFile, settingsText(model)},
    };
    for (const auto& [name, content] : files) {
        const std::filesystem::path path = folder / name;
        std::optional<std::string> error;
        if (!content.empty()) {
            error = writeFileAtomically(path, content);
        } else if (std::filesystem::remove(path, ec); ec) {
            error = "cannot remove the outdated " + path.string() + ": " + ec.message();
        }
        if (error) {
            Problem p;
            p.code = code::kCsvWrite;
            p.message = *error;
            p.location = FileLocation{path.string(), 0, 0};
            problems.push_back(std::move(p));
        }
    }
    return problems;
}

}  // namespace tl
