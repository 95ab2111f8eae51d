#include "core/io/csv_table.h"

#include <gtest/gtest.h>

#include <cstdio>
#include <fstream>
#include <random>
#include <sstream>

namespace tl {
namespace {

namespace fs = std::filesystem;

std::vector<std::vector<std::string>> texts(const CsvTable& t)
{
    std::vector<std::vector<std::string>> out;
    for (const CsvRecord& r : t.records) {
        out.emplace_back();
        for (const CsvField& f : r.fields) out.back().push_back(f.text);
    }
    return out;
}

using Rows = std::vector<std::vector<std::string>>;

TEST(CsvTable, SplitsQuotedFieldsPerRfc4180)
{
    const auto r = parseCsv("name,note\n\"Perch, adult\",\"said \"\"hi\"\"\"\n\"two\nlines\",\n", "t.csv");
    EXPECT_TRUE(r.problems.empty());
    EXPECT_EQ(texts(r.table), (Rows{{"name", "note"}, {"Perch, adult", "said \"hi\""}, {"two\nlines", ""}}));
}

TEST(CsvTable, RemembersLineAndColumnOfEachField)
{
    const auto r = parseCsv("a,b,c\n\"x\ny\",2,3\n4,5,6", "t.csv");
    ASSERT_EQ(r.table.records.size(), 3u);
    const CsvRecord& second = r.table.records[1];
    EXPECT_EQ(second.line, 2);
    EXPECT_EQ(second.fields[0].line, 2);
    EXPECT_EQ(second.fields[1].line, 3);  // after the line break inside the quotes
    EXPECT_EQ(second.fields[2].column, 3);
    EXPECT_EQ(r.table.records[2].line, 4);
    EXPECT_EQ(r.table.records[2].fields[2].text, "6");  // last line without a line end
}

TEST(CsvTable, AcceptsCrlfCrAndBomAndDropsBlankLines)
{
    const auto r = parseCsv("\xEF\xBB\xBFkey,value\r\n\r\nx,1\r,,\ny,\"2\r\n3\"\r\n", "t.csv");
    EXPECT_TRUE(r.problems.empty());
    EXPECT_EQ(texts(r.table), (Rows{{"key", "value"}, {"x", "1"}, {"y", "2\n3"}}));
    EXPECT_EQ(r.table.records[1].line, 3);
    EXPECT_EQ(r.table.records[2].line, 5);
}

TEST(CsvTable, RecordByRecordSeesWhatTheTableHolds)
{
    // Rows of different widths, quotes, a line break inside quotes, a blank line, a bad quote.
    const std::string text = "a,b,c\n1,2\n\n\"x\ny\",\"q\"z,3,4,5\n,,\nlast";
    const CsvParseResult whole = parseCsv(text, "t.csv");
    std::vector<CsvRecord> seen;
    int calls = 0;
    const Problems problems = parseCsvRecords(text, "t.csv", [&](CsvRecord& r) {
        ++calls;
        seen.push_back(r);  // a copy: the parser reuses r for the next record
    });
    EXPECT_EQ(calls, 4);
    ASSERT_EQ(seen.size(), whole.table.records.size());
    for (std::size_t k = 0; k < seen.size(); ++k) {
        EXPECT_EQ(seen[k].line, whole.table.records[k].line);
        ASSERT_EQ(seen[k].fields.size(), whole.table.records[k].fields.size()) << "record " << k;
        for (std::size_t c = 0; c < seen[k].fields.size(); ++c) {
            EXPECT_EQ(seen[k].fields[c].text, whole.table.records[k].fields[c].text);
            EXPECT_EQ(seen[k].fields[c].line, whole.table.records[k].fields[c].line);
            EXPECT_EQ(seen[k].fields[c].column, whole.table.records[k].fields[c].column);
        }
    }
    ASSERT_EQ(problems.size(), whole.problems.size());
    ASSERT_EQ(problems.size(), 1u);  // text after the closing quote of "q"
    EXPECT_EQ(problems[0].message, whole.problems[0].message);
}

TEST(CsvTable, EmptyTextHasNoRecords)
{
    EXPECT_TRUE(parseCsv("", "t.csv").table.records.empty());
    EXPECT_TRUE(parseCsv("\n\n  \n", "t.csv").table.records.empty());
}

TEST(CsvTable, UnclosedQuoteIsReportedWhereItOpens)
{
    const auto r = parseCsv("a,b\n1,\"open\n2,3\n", "diet.csv");
    ASSERT_EQ(r.problems.size(), 1u);
    const Problem& p = r.problems[0];
    EXPECT_EQ(p.code, "csv-quote");
    EXPECT_EQ(p.severity, Severity::Error);
    ASSERT_TRUE(p.location);
    EXPECT_EQ(p.location->file, "diet.csv");
    EXPECT_EQ(p.location->line, 2);
    EXPECT_EQ(p.location->column, 2);
    EXPECT_EQ(p.describe().rfind("diet.csv:2:2: ", 0), 0u) << p.describe();
}

TEST(CsvTable, TextAfterClosingQuoteIsReportedAndParsingGoesOn)
{
    const auto r = parseCsv("a,b\n\"x\"y,1\n\"z\"  ,2\n", "t.csv");
    ASSERT_EQ(r.problems.size(), 1u);  // spaces after a closing quote are tolerated
    EXPECT_EQ(r.problems[0].code, "csv-quote");
    EXPECT_EQ(r.problems[0].location->line, 2);
    EXPECT_EQ(r.problems[0].location->column, 1);
    ASSERT_EQ(r.table.records.size(), 3u);
    EXPECT_EQ(r.table.records[2].fields[0].text, "z");
}

TEST(CsvTable, RefusesWhatIsNotUtf8Text)
{
    struct Case {
        std::string text;
        int line, column;
    };
    const Case cases[] = {
        {std::string("\xFF\xFE" "a\0,\0", 6), 1, 1},                // UTF-16 LE with BOM
        {std::string("PK\x03\x04\x14\x00", 6), 1, 1},              // a workbook (zip)
        {std::string("a,b\nc,d\0\n", 9), 2, 2},                     // NUL bytes: its line and field
        {"name\nPerche \xE0 jeun\n", 2, 1},                          // Latin-1 accent
        {"name,x\nok,\xC0\xAF\n", 2, 2},                             // overlong form
        {"name,x\nok,\xED\xA0\x80\n", 2, 2},                         // surrogate
    };
    for (const Case& c : cases) {
        const auto r = parseCsv(c.text, "t.csv");
        ASSERT_EQ(r.problems.size(), 1u) << c.text;
        EXPECT_EQ(r.problems[0].code, "csv-encoding");
        EXPECT_EQ(r.problems[0].location->line, c.line) << c.text;
        EXPECT_EQ(r.problems[0].location->column, c.column) << c.text;
    }
    // Valid multi-byte text passes: 2-, 3- and 4-byte sequences.
    EXPECT_TRUE(parseCsv("Ærø,km²,𝛼\n", "t.csv").problems.empty());
}

TEST(CsvTable, MissingFileAndFolderAreReportedNotThrown)
{
    const auto missing = readCsvFile(fs::temp_directory_path() / "tl_no_such_file.csv");
    ASSERT_EQ(missing.problems.size(), 1u);
    EXPECT_EQ(missing.problems[0].code, "csv-unreadable");
    const auto folder = readCsvFile(fs::temp_directory_path());
    ASSERT_EQ(folder.problems.size(), 1u);
    EXPECT_EQ(folder.problems[0].code, "csv-unreadable");
}

TEST(CsvTable, WriterQuotesOnlyWhatNeedsIt)
{
    EXPECT_EQ(csvField("Perch"), "Perch");
    EXPECT_EQ(csvField("Perch, adult"), "\"Perch, adult\"");
    EXPECT_EQ(csvField("5\" long"), "\"5\"\" long\"");
    EXPECT_EQ(csvField("a\nb"), "\"a\nb\"");
    EXPECT_EQ(csvField(" padded"), "\" padded\"");
    EXPECT_EQ(csvRecord({"a", "", "b,c"}), "a,,\"b,c\"\n");
}

TEST(CsvTable, WriterOutputReadsBackToTheSameFields)
{
    std::mt19937 rng(7);
    const std::string alphabet[] = {"a", "Z", "0", ",", "\"", "\n", " ", ";", "é", "²", "'"};
    for (int trial = 0; trial < 300; ++trial) {
        Rows rows(1 + rng() % 5, std::vector<std::string>(1 + rng() % 4));
        for (auto& row : rows)
            for (auto& field : row) {
                const std::size_t len = 1 + rng() % 8;  // non-empty: rows of empty cells are dropped
                for (std::size_t k = 0; k < len; ++k) field += alphabet[rng() % std::size(alphabet)];
                if (field.find_first_not_of(" \n") == std::string::npos) field = "x" + field;
            }
        std::string text;
        for (const auto& row : rows) text += csvRecord(row);
        const auto r = parseCsv(text, "t.csv");
        ASSERT_TRUE(r.problems.empty()) << text;
        ASSERT_EQ(texts(r.table), rows) << text;
    }
}

// --- Against an independent reader ------------------------------------------------

std::string fixture(const std::string& name) { return std::string(TL_FIXTURES_DIR) + "/csv_table/" + name; }

TEST(CsvTable, ReadsQuotedNamesOfAPublishedNetworkAsPythonCsvDoes)
{
    // Expected values read with Python's csv module (see fixtures/csv_table/README.md).
    const auto flows = readCsvFile(fixture("cypress_dry_flows.csv"));
    ASSERT_TRUE(flows.problems.empty());
    ASSERT_EQ(flows.table.records.size(), 69u);
    for (const CsvRecord& r : flows.table.records) ASSERT_EQ(r.fields.size(), 69u) << "line " << r.line;
    EXPECT_EQ(flows.table.records[0].fields[20].text, "Small Fish, herb + omniv");
    EXPECT_EQ(flows.table.records[0].fields[21].text, "Small Fish, prim. carniv");

    const auto nodes = readCsvFile(fixture("cypress_dry_nodes.csv"));
    ASSERT_TRUE(nodes.problems.empty());
    ASSERT_EQ(nodes.table.records.size(), 69u);
    const CsvRecord& fish = nodes.table.records[20];
    EXPECT_EQ(fish.line, 21);
    ASSERT_EQ(fish.fields.size(), 6u);
    EXPECT_EQ(fish.fields[0].text, "Small Fish, herb + omniv");
    EXPECT_EQ(fish.fields[2].text, "0.1164369");
    EXPECT_EQ(fish.fields[5].text, "0.875");
}

// Runs Python's csv.reader on each file (one python3 start for all) and returns their
// rows, with rows of empty cells dropped and line ends inside cells made "\n" (the two
// things this reader normalises); nullopt when python3 is not available.
std::optional<std::vector<Rows>> pythonRows(const std::vector<fs::path>& files)
{
    const fs::path dir = fs::temp_directory_path();
    const fs::path scriptPath = dir / "tl_csv_py_reader.py";
    {
        std::ofstream(scriptPath)
            << "import csv,sys\n"
               "args = sys.argv[1:]\n"
               "for src, dst in zip(args[0::2], args[1::2]):\n"
               "    with open(src, newline='', encoding='utf-8-sig') as f, open(dst, 'w') as o:\n"
               "        for row in csv.reader(f):\n"
               "            if all(c.strip() == '' for c in row): continue\n"
               "            o.write(' '.join(c.replace('\\r\\n', '\\n').replace('\\r', '\\n').encode().hex() or '-'"
               " for c in row) + '\\n')\n";
    }
    std::string cmd = "python3 '" + scriptPath.string() + "'";
    std::vector<fs::path> outputs;
    for (const fs::path& f : files) {
        outputs.push_back(dir / ("tl_csv_py_" + f.filename().string() + ".txt"));
        cmd += " '" + f.string() + "' '" + outputs.back().string() + "'";
    }
    if (std::system((cmd + " 2>/dev/null").c_str()) != 0) return std::nullopt;
    std::vector<Rows> all;
    for (const fs::path& out : outputs) {
        Rows rows;
        std::ifstream in(out);
        for (std::string line; std::getline(in, line);) {
            rows.emplace_back();
            std::istringstream words(line);
            for (std::string hex; words >> hex;) {
                std::string text;
                if (hex != "-")
                    for (std::size_t k = 0; k + 1 < hex.size(); k += 2)
                        text += static_cast<char>(std::stoi(hex.substr(k, 2), nullptr, 16));
                rows.back().push_back(text);
            }
        }
        all.push_back(std::move(rows));
    }
    return all;
}

TEST(CsvTable, AgreesWithPythonCsvReaderOnTrickyInput)
{
    const fs::path tricky = fs::temp_directory_path() / "tl_csv_tricky.csv";
    {
        std::ofstream o(tricky, std::ios::binary);
        o << "\xEF\xBB\xBF" "name,note,x\r\n"
          << "\"Perch, adult\",\"a \"\"quoted\"\" word\",1\r\n"
          << "\"multi\r\nline\",,\r\n"
          << ",,\r\n"
          << "Ærø,\"\",3.5\n"
          << "last,\"x,y\",\"\"\"\"";
    }
    const std::vector<fs::path> files = {tricky, fixture("cypress_dry_nodes.csv"), fixture("cypress_dry_flows.csv")};
    const auto py = pythonRows(files);
    if (!py) GTEST_SKIP() << "python3 not available";
    for (std::size_t k = 0; k < files.size(); ++k) {
        const auto ours = readCsvFile(files[k]);
        ASSERT_TRUE(ours.problems.empty()) << files[k];
        EXPECT_EQ(texts(ours.table), (*py)[k]) << files[k];
    }
    EXPECT_EQ((*py)[0].size(), 5u);  // the row of empty cells is dropped by both
}

}  // namespace
}  // namespace tl
