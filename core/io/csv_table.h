// CsvTable: a CSV text split into records and fields per RFC 4180 (comma separator,
// fields optionally enclosed in double quotes, "" for a quote inside a quoted field,
// line breaks allowed inside quotes), remembering where each field starts so that a
// reader can say "file:line:column" about any cell.
//
// Forgiving where spreadsheets and hand edits differ from the RFC: LF, CRLF or CR line
// ends; a UTF-8 byte-order mark is skipped; blank lines (or lines of empty cells, as
// spreadsheets export them) are dropped; a last line without a line end is kept.
// A text cell written with the formula guard (an apostrophe before a leading '=', '+',
// '-', '@', tab or CR; see guardFormula) is read without that apostrophe.
// Refused with a Problem: text that is not UTF-8 (UTF-16, a workbook file), a quoted
// field that never closes, text after a closing quote.
#pragma once

#include <filesystem>
#include <functional>
#include <string>
#include <string_view>
#include <vector>

#include "core/model/problem.h"

namespace tl {

struct CsvField {
    std::string text;  // unquoted content, not trimmed
    int line = 0;      // 1-based physical line where the field starts
    int column = 0;    // 1-based field number in its record (the spreadsheet column)
};

struct CsvRecord {
    std::vector<CsvField> fields;
    int line = 0;  // line of the record's first field
};

struct CsvTable {
    std::string file;                // as named in problems
    std::vector<CsvRecord> records;  // the header, if any, is records[0]
};

struct CsvParseResult {
    CsvTable table;
    Problems problems;  // each with a FileLocation in `table.file`
};

// `file` is only used to name the source in problems.
CsvParseResult parseCsv(std::string_view text, std::string file);

// Reads the file (binary, no newline translation) and parses it. A missing or
// unreadable file gives one error with code "csv-unreadable".
CsvParseResult readCsvFile(const std::filesystem::path& path);

// The same, handing each record to `onRecord` as soon as it is complete instead of
// keeping them all: a wide table of n x n cells then never exists as n x n fields at
// once. The record is reused for the next one (move from it to keep it). Returns the
// problems parseCsv would report.
using CsvRecordSink = std::function<void(CsvRecord&)>;
Problems parseCsvRecords(std::string_view text, const std::string& file, const CsvRecordSink& onRecord);
Problems readCsvFileRecords(const std::filesystem::path& path, const CsvRecordSink& onRecord);

// One field as written: quoted (with quotes doubled) when it holds a comma, a quote,
// a line break or leading/trailing white space; otherwise as is.
std::string csvField(std::string_view text);

// Spreadsheet formula guard. A spreadsheet runs a cell that begins with '=', '+', '-',
// '@', a tab or a carriage return as a formula ("CSV injection", OWASP), so a written
// text cell of that kind gets an apostrophe in front (what spreadsheets themselves use
// to mark text): `=HYPERLINK(...)` is written `'=HYPERLINK(...)`. To keep the round trip
// lossless the rule counts apostrophes already there: text that is apostrophes followed
// by such a character gains one apostrophe on writing and loses one on reading; any
// other text is written and read unchanged. Numbers ("-2.5") are never guarded.
std::string guardFormula(std::string_view text);
// The reading side: drops one apostrophe from a guarded cell, leaves anything else.
std::string_view unguardFormula(std::string_view text);

// Fields joined by commas and terminated by "\n". Each field that is not a number is
// guarded (guardFormula) before it is quoted.
std::string csvRecord(const std::vector<std::string>& fields);

}  // namespace tl
