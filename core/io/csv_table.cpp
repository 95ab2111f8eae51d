#include "core/io/csv_table.h"

#include <fstream>
#include <sstream>
#include <vector>

#include "core/model/problem_codes.h"
#include "core/model/limits.h"
#include "core/model/text.h"

namespace tl {
namespace {

Problem fileProblem(std::string code, const std::string& file, int line, int column, std::string message,
                    std::string hint = {})
{
    Problem p;
    p.code = std::move(code);
    p.severity = Severity::Error;
    p.message = std::move(message);
    p.hint = std::move(hint);
    p.location = FileLocation{file, line, column};
    return p;
}

bool isBlank(const CsvRecord& r)
{
    for (const CsvField& f : r.fields)
        if (!trim(f.text).empty()) return false;
    return true;
}

// Refuses content that is clearly not UTF-8 CSV, with a message saying what it is.
std::optional<Problem> recogniseWrongEncoding(std::string_view text, const std::string& file)
{
    if (text.starts_with("\xFF\xFE") || text.starts_with("\xFE\xFF"))
        return fileProblem(code::kCsvEncoding, file, 1, 1, "the file is UTF-16 text, not UTF-8",
                           "Save it again as \"CSV UTF-8 (comma delimited)\".");
    if (text.starts_with("PK\x03\x04"))
        return fileProblem(code::kCsvEncoding, file, 1, 1, "the file is a spreadsheet workbook (zip archive), not CSV text",
                           "Export the sheet as \"CSV UTF-8 (comma delimited)\".");
    if (const auto nul = text.find('\0'); nul != std::string_view::npos) {
        int line = 1, column = 1;  // the field of the first NUL, counting commas outside quotes
        bool quoted = false;
        for (std::size_t k = 0; k < nul; ++k) {
            if (text[k] == '"') quoted = !quoted;
            else if (text[k] == ',' && !quoted) ++column;
            else if (text[k] == '\n' || (text[k] == '\r' && (k + 1 >= text.size() || text[k + 1] != '\n'))) {
                ++line;
                if (!quoted) column = 1;
            }
        }
        return fileProblem(code::kCsvEncoding, file, line, column, "the file contains NUL bytes; it is not UTF-8 text",
                           "Save it again as \"CSV UTF-8 (comma delimited)\".");
    }
    return std::nullopt;
}

}  // namespace

Problems parseCsvRecords(std::string_view text, const std::string& file, const CsvRecordSink& onRecord)
{
    Problems problems;
    if (text.starts_with("\xEF\xBB\xBF")) text.remove_prefix(3);
    if (auto wrong = recogniseWrongEncoding(text, file)) {
        problems.push_back(std::move(*wrong));
        return problems;
    }

    const std::size_t n = text.size();
    std::size_t i = 0;
    int line = 1;
    CsvRecord record;
    record.line = line;

    // Consumes one line end at i (CRLF, LF or a lone CR) if there is one.
    const auto takeLineEnd = [&]() -> bool {
        if (i < n && text[i] == '\r') {
            ++i;
            if (i < n && text[i] == '\n') ++i;
        } else if (i < n && text[i] == '\n') {
            ++i;
        } else {
            return false;
        }
        ++line;
        return true;
    };
    const auto finishRecord = [&]() {
        const std::size_t width = record.fields.size();
        if (!isBlank(record)) onRecord(record);
        record.fields.clear();  // kept capacity (or, if moved from, the width) saves regrowing the next row
        if (record.fields.capacity() < width) record.fields.reserve(width);
        record.line = line;
    };

    while (true) {
        CsvField field;
        field.line = line;
        field.column = static_cast<int>(record.fields.size()) + 1;

        std::size_t j = i;  // white space before an opening quote is tolerated
        while (j < n && (text[j] == ' ' || text[j] == '\t')) ++j;
        if (j < n && text[j] == '"') {
            i = j + 1;
            bool closed = false;
            while (i < n) {
                const char c = text[i];
                if (c == '"') {
                    if (i + 1 < n && text[i + 1] == '"') {
                        field.text += '"';
                        i += 2;
                    } else {
                        ++i;
                        closed = true;
                        break;
                    }
                } else if (c == '\r' || c == '\n') {
                    takeLineEnd();
                    field.text += '\n';
                } else {
                    field.text += c;
                    ++i;
                }
            }
            if (!closed) {
                problems.push_back(fileProblem(
                    code::kCsvQuote, file, field.line, field.column,
                    "a quoted field opened here is never closed (the file ends inside it)",
                    "Add the closing double quote; a quote inside a quoted field is written twice (\"\")."));
                record.fields.push_back(std::move(field));
                finishRecord();
                break;
            }
            while (i < n && (text[i] == ' ' || text[i] == '\t')) ++i;
            if (i < n && text[i] != ',' && text[i] != '\r' && text[i] != '\n') {
                problems.push_back(fileProblem(
                    code::kCsvQuote, file, line, field.column,
                    "unexpected text after the closing quote of a field",
                    "Put the whole cell inside the quotes, and write a quote inside it twice (\"\")."));
                while (i < n && text[i] != ',' && text[i] != '\r' && text[i] != '\n') field.text += text[i++];
            }
        } else {
            const std::size_t start = i;
            while (i < n && text[i] != ',' && text[i] != '\r' && text[i] != '\n') ++i;
            field.text.assign(text.substr(start, i - start));
        }

        if (const std::string_view plain = unguardFormula(field.text); plain.size() != field.text.size())
            field.text.erase(0, 1);
        if (const std::size_t bad = firstInvalidUtf8(field.text); bad != std::string_view::npos) {
            char byteText[8];
            std::snprintf(byteText, sizeof byteText, "0x%02X", static_cast<unsigned char>(field.text[bad]));
            problems.push_back(fileProblem(
                code::kCsvEncoding, file, field.line, field.column,
                std::string("the cell is not valid UTF-8 text (byte ") + byteText + ")",
                "Save the file as \"CSV UTF-8\"; older exports use a legacy code page for accented letters."));
        }
        record.fields.push_back(std::move(field));

        if (i < n && text[i] == ',') {
            ++i;
            continue;
        }
        takeLineEnd();
        finishRecord();
        if (i >= n) break;
    }
    return problems;
}

CsvParseResult parseCsv(std::string_view text, std::string file)
{
    CsvParseResult out;
    out.table.file = file;
    out.problems = parseCsvRecords(text, file, [&](CsvRecord& r) { out.table.records.push_back(std::move(r)); });
    return out;
}

Problems readCsvFileRecords(const std::filesystem::path& path, const CsvRecordSink& onRecord)
{
    const std::string file = path.string();
    std::error_code ec;
    if (std::filesystem::is_directory(path, ec))
        return {fileProblem(code::kCsvUnreadable, file, 0, 0, "expected a CSV file but found a folder")};
    std::ifstream in(path, std::ios::binary);
    std::string content;
    if (in) {  // read in one piece: a stream buffer would copy the text twice more
        std::error_code sizeError;
        const auto size = std::filesystem::file_size(path, sizeError);
        if (!sizeError && size > limits::kMaxCsvFileBytes)
            return {fileProblem(code::kCsvLimit, file, 0, 0,
                                "the file holds " + limits::byteSize(size) + "; the limit of this version is " +
                                    limits::byteSize(limits::kMaxCsvFileBytes) + " per CSV file")};
        if (!sizeError) {
            content.resize(static_cast<std::size_t>(size));
            in.read(content.data(), static_cast<std::streamsize>(content.size()));
            content.resize(static_cast<std::size_t>(in.gcount()));
            if (in.eof()) in.clear();  // a file that shrank meanwhile: keep what was read
        } else {  // no size to ask for (a pipe, a device): read up to the limit
            std::vector<char> chunk(1 << 16);
            while (in.read(chunk.data(), static_cast<std::streamsize>(chunk.size())) || in.gcount() > 0) {
                content.append(chunk.data(), static_cast<std::size_t>(in.gcount()));
                if (content.size() > limits::kMaxCsvFileBytes)
                    return {fileProblem(code::kCsvLimit, file, 0, 0,
                                        "the file holds more than " + limits::byteSize(limits::kMaxCsvFileBytes) +
                                            ", the limit of this version per CSV file")};
            }
            in.clear();
        }
    }
    if (!in || in.bad()) {
        const bool exists = std::filesystem::exists(path, ec);
        return {fileProblem(code::kCsvUnreadable, file, 0, 0, exists ? "the file cannot be read" : "the file does not exist")};
    }
    return parseCsvRecords(content, file, onRecord);
}

CsvParseResult readCsvFile(const std::filesystem::path& path)
{
    CsvParseResult out;
    out.table.file = path.string();
    out.problems = readCsvFileRecords(path, [&](CsvRecord& r) { out.table.records.push_back(std::move(r)); });
    return out;
}

namespace {

// Apostrophes, then a character a spreadsheet would start a formula with.
bool formulaShaped(std::string_view text, std::size_t minApostrophes)
{
    std::size_t k = 0;
    while (k < text.size() && text[k] == '\'') ++k;
    if (k < minApostrophes || k >= text.size()) return false;
    const char c = text[k];
    return c == '=' || c == '+' || c == '-' || c == '@' || c == '\t' || c == '\r';
}

}  // namespace

std::string guardFormula(std::string_view text)
{
    std::string out;
    if (formulaShaped(text, 0)) out += '\'';
    out.append(text);
    return out;
}

std::string_view unguardFormula(std::string_view text)
{
    return formulaShaped(text, 1) ? text.substr(1) : text;
}

std::string csvField(std::string_view text)
{
    const bool needsQuotes = text.find_first_of(",\"\r\n") != std::string_view::npos ||
                             (!text.empty() && (text.front() == ' ' || text.front() == '\t' ||
                                                text.back() == ' ' || text.back() == '\t'));
    if (!needsQuotes) return std::string(text);
    std::string out = "\"";
    for (const char c : text) {
        if (c == '"') out += '"';
        out += c;
    }
    return out + '"';
}

std::string csvRecord(const std::vector<std::string>& fields)
{
    std::string out;
    for (std::size_t k = 0; k < fields.size(); ++k) {
        if (k > 0) out += ',';
        out += csvField(parseNumber(fields[k]) ? fields[k] : guardFormula(fields[k]));
    }
    return out + '\n';
}

}  // namespace tl
