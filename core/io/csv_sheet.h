// Keyed CSV sheets: a CsvTable whose first record is a header of known column keys,
// read cell by cell with problems that name "file:line:column" (the style of every
// reader of the program). Shared by the CSV model folder (csv_model.cpp) and the
// survey files of core/fieldwork, so that both refuse bad cells in the same words.
#pragma once

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "core/io/csv_table.h"
#include "core/model/problem.h"

namespace tl::csv {

Problem problemAt(std::string code, Severity severity, const std::string& file, int line, int column,
                  std::string message, std::string hint = {});
Problem errorAt(std::string code, const std::string& file, const CsvField& f, std::string message,
                std::string hint = {});

// Cell text or a name as quoted in a message: trimmed, shortened when long. Single
// quotes, as validation uses, so they are not mistaken for CSV quoting.
std::string shown(std::string_view text);
std::string lowerAscii(std::string_view s);
std::string joinKeys(std::span<const std::string_view> keys);  // "a, b, c"

struct NumberCell {
    bool bad = false;
    std::optional<double> value;  // empty cell -> nullopt
};

// Parses one numeric cell; reports a problem naming `what` (the column and row). Ranges
// and signs are the caller's job, except where `nonNegative` asks.
NumberCell numberCell(const CsvField& f, const std::string& file, const std::string& what, Problems& problems,
                      bool nonNegative = false);

struct KeyedSheet {
    std::string file;
    std::vector<int> position;           // per key: field index, or -1 when absent
    std::vector<const CsvRecord*> rows;  // data rows with the right number of cells
    const CsvField* field(const CsvRecord& r, std::size_t key) const
    {
        const int p = position[key];
        return p < 0 ? nullptr : &r.fields[static_cast<std::size_t>(p)];
    }
    int column(std::size_t key) const { return position[key] + 1; }  // 0 when absent
};

// Checks that a data row has exactly as many cells as the header. An extra cell, even
// an empty one, is refused: it is how a decimal comma or an unquoted comma in a name
// shows, and accepting it would shift the values after it into the wrong columns.
bool rowShapeOk(const CsvRecord& r, std::size_t headerSize, const std::string& file, Problems& problems);

// A one-cell header holding ';' or a tab: exported with the wrong separator (reported).
bool refuseOtherSeparators(const CsvRecord& header, const std::string& file, Problems& problems);

// Maps the header onto `keys`; every `required` key must be present, no key twice, no
// unknown column. Returns nullopt when the rows cannot be read. The sheet points into
// `table`, which must outlive it.
std::optional<KeyedSheet> openKeyed(const CsvTable& table, std::span<const std::string_view> keys,
                                    std::span<const std::string_view> required, Problems& problems);

}  // namespace tl::csv
