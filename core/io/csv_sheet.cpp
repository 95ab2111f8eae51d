// Keyed CSV sheets and their cells, shared by the model-folder reader (csv_model.cpp)
// and the survey readers (core/fieldwork/survey_tables.cpp).
#include "core/io/csv_sheet.h"

#include <algorithm>

#include "core/model/problem_codes.h"
#include "core/model/text.h"

namespace tl::csv {

Problem problemAt(std::string code, Severity severity, const std::string& file, int line, int column,
                  std::string message, std::string hint)
{
    Problem p;
    p.code = std::move(code);
    p.severity = severity;
    p.message = std::move(message);
    p.hint = std::move(hint);
    p.location = FileLocation{file, line, column};
    return p;
}

Problem errorAt(std::string code, const std::string& file, const CsvField& f, std::string message,
                std::string hint)
{
    return problemAt(std::move(code), Severity::Error, file, f.line, f.column, std::move(message), std::move(hint));
}

std::string shown(std::string_view text)
{
    text = trim(text);
    std::string s(text.substr(0, 40));
    if (text.size() > 40) s += "…";
    return "'" + s + "'";
}

std::string lowerAscii(std::string_view s)
{
    std::string out(s);
    for (char& c : out)
        if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
    return out;
}

std::string joinKeys(std::span<const std::string_view> keys)
{
    std::string out;
    for (std::string_view k : keys) out += (out.empty() ? "" : ", ") + std::string(k);
    return out;
}

NumberCell numberCell(const CsvField& f, const std::string& file, const std::string& what, Problems& problems,
                      bool nonNegative)
{
    NumberCell out;
    const std::string_view text = trim(f.text);
    if (text.empty()) return out;
    out.value = parseNumber(text);
    if (!out.value) {
        std::string hint;
        std::string dotted(text);
        std::replace(dotted.begin(), dotted.end(), ',', '.');
        if (text.find(',') != std::string_view::npos && parseNumber(dotted))
            hint = "Write " + dotted + ": the decimal mark is '.', and no thousands separators.";
        else if (text.ends_with("%"))
            hint = "Write a fraction (0.25), not a percentage (25%).";
        else
            hint = "Leave the cell empty if the value is unknown.";
        problems.push_back(errorAt(code::kCsvNumber, file, f,
                                   what + ": expected a number with '.' as decimal mark, found " + shown(text), hint));
        out.bad = true;
    } else if (nonNegative && *out.value < 0) {
        problems.push_back(errorAt(code::kCsvNumber, file, f, what + ": must not be negative, found " + shown(text)));
        out.bad = true;
    }
    return out;
}

bool rowShapeOk(const CsvRecord& r, std::size_t headerSize, const std::string& file, Problems& problems)
{
    const std::string counts = "this row has " + std::to_string(r.fields.size()) + " cells but the header has " +
                               std::to_string(headerSize);
    if (r.fields.size() < headerSize) {
        problems.push_back(problemAt(
            code::kCsvRowCells, Severity::Error, file, r.line, static_cast<int>(r.fields.size()), counts,
            "Every row needs a cell under every column; leave a cell empty (,,) rather than dropping it."));
        return false;
    }
    if (r.fields.size() > headerSize) {
        problems.push_back(errorAt(
            code::kCsvRowCells, file, r.fields[headerSize], counts,
            "A comma inside a name must be quoted (\"Perch, adult\"), and numbers use '.' as decimal mark."));
        return false;
    }
    return true;
}

bool refuseOtherSeparators(const CsvRecord& header, const std::string& file, Problems& problems)
{
    if (header.fields.size() != 1 || header.fields[0].text.find_first_of(";\t") == std::string::npos) return false;
    problems.push_back(errorAt(code::kCsvHeader, file, header.fields[0],
                               "the header is separated by semicolons or tabs; expected commas",
                               "Export as \"CSV UTF-8 (comma delimited)\", with '.' as decimal mark."));
    return true;
}

std::optional<KeyedSheet> openKeyed(const CsvTable& table, std::span<const std::string_view> keys,
                                    std::span<const std::string_view> required, Problems& problems)
{
    KeyedSheet sheet;
    sheet.file = table.file;
    sheet.position.assign(keys.size(), -1);
    if (table.records.empty()) {
        problems.push_back(problemAt(code::kCsvHeader, Severity::Error, table.file, 1, 1,
                                     "the file is empty; expected a header line: " + joinKeys(keys)));
        return std::nullopt;
    }
    const CsvRecord& header = table.records.front();
    if (refuseOtherSeparators(header, table.file, problems)) return std::nullopt;
    bool ok = true;
    std::vector<std::size_t> unnamed;  // header cells left empty: fine if their column is empty
    for (std::size_t c = 0; c < header.fields.size(); ++c) {
        const std::string_view name = trim(header.fields[c].text);
        if (name.empty()) {
            unnamed.push_back(c);
            continue;
        }
        const auto it = std::find(keys.begin(), keys.end(), name);
        if (it == keys.end()) {
            std::string hint = "Expected columns: " + joinKeys(keys) + ".";
            for (std::string_view k : keys)
                if (lowerAscii(name) == k) hint = "Did you mean '" + std::string(k) + "'? Column names are lower case.";
            problems.push_back(errorAt(code::kCsvUnknownColumn, table.file, header.fields[c],
                                       "unknown column " + shown(name), hint));
            ok = false;
            continue;
        }
        const std::size_t key = static_cast<std::size_t>(it - keys.begin());
        if (sheet.position[key] >= 0) {
            problems.push_back(errorAt(code::kCsvDuplicateColumn, table.file, header.fields[c],
                                       "column " + shown(name) + " appears twice (first in column " +
                                           std::to_string(sheet.position[key] + 1) + ")"));
            ok = false;
            continue;
        }
        sheet.position[key] = static_cast<int>(c);
    }
    for (std::string_view r : required) {
        const std::size_t key = static_cast<std::size_t>(std::find(keys.begin(), keys.end(), r) - keys.begin());
        if (sheet.position[key] < 0) {
            problems.push_back(problemAt(code::kCsvMissingColumn, Severity::Error, table.file, header.line, 1,
                                         "the header has no column '" + std::string(r) + "'",
                                         "Expected columns: " + joinKeys(keys) + "."));
            ok = false;
        }
    }
    if (!ok) return std::nullopt;

    for (std::size_t k = 1; k < table.records.size(); ++k) {
        const CsvRecord& r = table.records[k];
        if (!rowShapeOk(r, header.fields.size(), table.file, problems)) continue;
        bool rowOk = true;
        for (std::size_t c : unnamed) {
            if (trim(r.fields[c].text).empty()) continue;
            problems.push_back(errorAt(code::kCsvHeader, table.file, r.fields[c],
                                       "this cell has no column name above it but holds " + shown(r.fields[c].text)));
            rowOk = false;
        }
        if (rowOk) sheet.rows.push_back(&r);
    }
    return sheet;
}

}  // namespace tl::csv
