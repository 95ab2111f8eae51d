// The bad-input fixtures under tests/fixtures/bad_csv/<case>/ and what the CSV reader
// must say about each: the file, line and column of the offending cell (column = field
// number, as a spreadsheet counts; 0 = the whole line or file) and words the message
// must contain. Shared by the library test (tests/core/io/csv_bad_input_test.cpp) and
// the CLI test (tests/cli/check_bad_input_test.cpp). Each fixture is a tiny invented
// three-box pond (Algae, Snail, Detritus) broken in one place.
#pragma once

#include <ostream>
#include <string_view>
#include <vector>

namespace tl::fixtures {

struct BadCsvCase {
    std::string_view folder;  // under tests/fixtures/bad_csv/
    std::string_view file;    // file named in the problem's location
    int line;
    int column;
    std::vector<std::string_view> words;  // all must appear in the message (any case)
};

// So that GoogleTest names a failing case by its folder rather than by its bytes.
inline void PrintTo(const BadCsvCase& c, std::ostream* os) { *os << c.folder; }

inline const std::vector<BadCsvCase>& badCsvCases()
{
    static const std::vector<BadCsvCase> cases = {
        // compartments.csv: structure
        {"unknown_column", "compartments.csv", 1, 3, {"unknown column", "biomas"}},
        {"missing_kind_column", "compartments.csv", 1, 1, {"kind"}},  // the header line, column 1 (issue 12)
        {"empty_compartments_file", "compartments.csv", 1, 1, {"empty"}},
        {"semicolons", "compartments.csv", 1, 1, {"semicolon"}},
        {"too_many_fields", "compartments.csv", 3, 12, {"12", "11"}},
        {"too_few_fields", "compartments.csv", 3, 3, {"3", "11"}},
        {"unterminated_quote", "compartments.csv", 3, 1, {"quote"}},
        {"not_utf8", "compartments.csv", 3, 1, {"UTF-8"}},
        // compartments.csv: names and kinds
        {"duplicate_name", "compartments.csv", 5, 1, {"Snail", "line 3"}},
        {"empty_name", "compartments.csv", 3, 1, {"no name"}},
        {"unknown_kind", "compartments.csv", 3, 2, {"grazer", "producer", "consumer", "detritus"}},
        // compartments.csv: numbers
        {"text_in_number", "compartments.csv", 3, 3, {"number", "abc"}},
        {"nan_in_number", "compartments.csv", 3, 4, {"number", "nan"}},
        {"inf_in_number", "compartments.csv", 3, 5, {"number", "inf"}},
        {"comma_decimal", "compartments.csv", 3, 3, {"2,5"}},
        {"negative_biomass", "compartments.csv", 3, 3, {"negative", "-2"}},
        {"negative_rate", "compartments.csv", 3, 5, {"negative", "-20"}},
        {"unassim_above_one", "compartments.csv", 3, 8, {"fraction", "1.2"}},
        {"producer_with_qb", "compartments.csv", 2, 5, {"Algae", "producer"}},
        {"detritus_with_pb", "compartments.csv", 4, 4, {"Detritus", "detritus"}},
        // diet.csv
        {"missing_diet_file", "diet.csv", 0, 0, {"diet.csv"}},
        {"diet_sum", "diet.csv", 2, 1, {"Snail", "0.9"}},
        {"diet_percentages", "diet.csv", 2, 2, {"fraction", "60"}},
        {"diet_unknown_prey", "diet.csv", 1, 2, {"Algea"}},
        {"diet_unknown_predator", "diet.csv", 2, 1, {"Snial"}},
        {"diet_duplicate_row", "diet.csv", 3, 1, {"Snail", "line 2"}},
        {"consumer_without_diet", "compartments.csv", 3, 2, {"Snail"}},  // no diet row: its own row, kind cell
        {"producer_with_diet", "diet.csv", 3, 3, {"Algae", "producer"}},
        // diet.csv in long form (predator,prey,share): the same findings, on the entry's row
        {"long_diet_sum", "diet.csv", 2, 1, {"Snail", "0.9"}},
        {"long_diet_duplicate_pair", "diet.csv", 4, 2, {"Algae", "Snail", "line 2"}},
        {"long_diet_unknown_prey", "diet.csv", 2, 2, {"Algea"}},
        {"long_diet_unknown_predator", "diet.csv", 2, 1, {"Snial"}},
        {"long_diet_text_share", "diet.csv", 2, 3, {"number", "abc"}},
        {"long_diet_negative_share", "diet.csv", 3, 3, {"fraction", "-0.2"}},
        {"long_diet_empty_share", "diet.csv", 2, 3, {"Algae", "empty"}},
        // harvest.csv
        {"harvest_unknown_compartment", "harvest.csv", 2, 2, {"Pike"}},
        {"harvest_negative_landings", "harvest.csv", 2, 3, {"negative", "-1"}},
        {"harvest_from_detritus", "harvest.csv", 2, 2, {"Detritus", "detritus pool"}},
        // detritus_routing.csv
        {"routing_sum", "detritus_routing.csv", 2, 1, {"Snail", "0.8"}},
        {"routing_to_living", "detritus_routing.csv", 2, 2, {"Algae", "not a detritus pool"}},
    };
    return cases;
}

}  // namespace tl::fixtures
