// SCOR reader and writer (layout: Ulanowicz & Kay 1991, Environ Software 6:131, as
// described in shared/reference/SCOR_FORMAT.md). Good files must parse to the exact
// values; every malformed file must give one error naming its line (and column) and
// what was expected.
#include <filesystem>
#include <string>

#include <gtest/gtest.h>

#include "core/io/scor.h"

namespace tl {
namespace {

const std::string kExamples = std::string(TL_FIXTURES_DIR) + "/reference/scor_examples";

// A small valid network written by hand: 3 compartments, 2 living.
const char* kSmall =
    "Test pond; g C m^-2 yr^-1; written by hand for this test\n"
    "  3  2\n"
    "Algae\n"
    "Snails\n"
    "Detritus\n"
    "  1 10.5\n"
    "  2 2.0\n"
    "  3 100\n"
    " -1\n"
    "  1 50\n"
    " -1\n"
    "  3 5\n"
    " -1\n"
    "  1 20\n"
    "  2 8\n"
    " -1\n"
    "  1  2 12\n"
    "  1  3 18\n"
    "  2  3 4\n"
    "  3  2 1\n"
    " -1 -1\n";

const Problem& firstError(const ScorReadResult& r)
{
    static const Problem none{};
    for (const Problem& p : r.problems)
        if (p.severity == Severity::Error) return p;
    return none;
}

ScorReadResult readWith(std::string text, const std::string& from, const std::string& to)
{
    const std::size_t at = text.find(from);
    EXPECT_NE(at, std::string::npos) << from;
    text.replace(at, from.size(), to);
    return readScor(text, "bad.scor");
}

TEST(ScorReader, ReadsHandWrittenNetwork)
{
    const ScorReadResult r = readScor(kSmall, "small.scor");
    ASSERT_TRUE(r.network) << firstError(r).describe();
    EXPECT_TRUE(r.problems.empty());
    const ScorNetwork& n = *r.network;
    EXPECT_EQ(n.title, "Test pond; g C m^-2 yr^-1; written by hand for this test");
    ASSERT_EQ(n.names.size(), 3u);
    EXPECT_EQ(n.names[1], "Snails");
    EXPECT_EQ(n.livingCount, 2u);
    EXPECT_EQ(n.stocks, (std::vector<double>{10.5, 2.0, 100.0}));
    EXPECT_EQ(n.imports, (std::vector<double>{50.0, 0.0, 0.0}));
    EXPECT_EQ(n.exports, (std::vector<double>{0.0, 0.0, 5.0}));
    EXPECT_EQ(n.respiration, (std::vector<double>{20.0, 8.0, 0.0}));
    ASSERT_EQ(n.flows.size(), 4u);
    EXPECT_EQ(n.flows[3].from, 2u);
    EXPECT_EQ(n.flows[3].to, 1u);
    EXPECT_EQ(n.flows[3].value, 1.0);
}

TEST(ScorReader, AcceptsCrlfAndTrailingBlanks)
{
    std::string crlf;
    for (const char* c = kSmall; *c; ++c) {
        if (*c == '\n') crlf += "   \r\n";
        else crlf += *c;
    }
    const ScorReadResult r = readScor(crlf, "crlf.scor");
    ASSERT_TRUE(r.network) << firstError(r).describe();
    EXPECT_EQ(r.network->names[2], "Detritus");
    EXPECT_EQ(r.network->flows[1].value, 18.0);
}

TEST(ScorReader, OldStyleOysterReefExampleParses)
{
    // Oyster reef, Dame & Patten, Mar Ecol Prog Ser 5:115 (as the file's title cites it; the
    // year, 1981, from memory): values checked against the file.
    const ScorReadResult r = readScorFile(kExamples + "/oyster.dat");
    ASSERT_TRUE(r.network) << firstError(r).describe();
    const ScorNetwork& n = *r.network;
    ASSERT_EQ(n.names.size(), 6u);
    EXPECT_EQ(n.livingCount, 5u);
    EXPECT_EQ(n.names[5], "Deposited Detritus");
    EXPECT_DOUBLE_EQ(n.stocks[1], 2.4121);
    EXPECT_DOUBLE_EQ(n.imports[0], 41.47);  // written "4.1470E+1"
    for (double e : n.exports) EXPECT_EQ(e, 0.0);  // empty exports block
    EXPECT_DOUBLE_EQ(n.respiration[0], 25.165);
    ASSERT_EQ(n.flows.size(), 12u);
    EXPECT_EQ(n.flows[0].from, 5u);
    EXPECT_EQ(n.flows[0].to, 1u);
    EXPECT_DOUBLE_EQ(n.flows[0].value, 8.1721);
}

TEST(ScorReader, OldStyleChesapeakeExampleWithFortranNumbersParses)
{
    // Chesapeake Bay mesohaline carbon network (Baird & Ulanowicz 1989 as the title cites it;
    // Ecol Monogr 59:329 from memory):
    // CRLF, numbers such as ".3480000+04" (0.348e4), dummy values after terminators.
    const ScorReadResult r = readScorFile(kExamples + "/chesapeake_mesohaline_C_annual.dat");
    ASSERT_TRUE(r.network) << firstError(r).describe();
    const ScorNetwork& n = *r.network;
    ASSERT_EQ(n.names.size(), 36u);
    EXPECT_EQ(n.livingCount, 33u);
    EXPECT_EQ(n.names[0], "Phytoplankton");
    EXPECT_DOUBLE_EQ(n.stocks[0], 3480.0);
    EXPECT_DOUBLE_EQ(n.stocks[35], 305000.0);
    EXPECT_DOUBLE_EQ(n.imports[0], 522650.0);
    EXPECT_DOUBLE_EQ(n.imports[34], 185150.4);
    EXPECT_DOUBLE_EQ(n.exports[7], 18720.24);
    EXPECT_DOUBLE_EQ(n.flows.front().value, 33671.45);
    EXPECT_EQ(n.flows.back().from, 35u);
    EXPECT_EQ(n.flows.back().to, 18u);
    EXPECT_DOUBLE_EQ(n.flows.back().value, 1417.696);
}

TEST(ScorReader, ThreeDigitFieldsRunTogether)
{
    // 100 compartments, 99 living: "100 99"; flow "100 99 ..." and "99100 ...".
    std::string text = "Big\n100 99\n";
    for (int i = 1; i <= 100; ++i) {
        text += 'n';
        text += std::to_string(i);
        text += '\n';
    }
    for (int i = 1; i <= 100; ++i) {
        char buf[32];
        std::snprintf(buf, sizeof buf, "%3d 1\n", i);
        text += buf;
    }
    text += " -1\n -1\n -1\n -1\n";
    text += " 99100 1.94e-07\n100 99 2\n -1 -1\n";
    std::string runTogether = text;
    runTogether.replace(runTogether.find("100 99\n"), 7, "100099\n");  // n=100, nl=99 ("%3d%3d" pads 99 to " 99")
    const ScorReadResult r = readScor(text, "big.scor");
    ASSERT_TRUE(r.network) << firstError(r).describe();
    EXPECT_EQ(r.network->livingCount, 99u);
    ASSERT_EQ(r.network->flows.size(), 2u);
    EXPECT_EQ(r.network->flows[0].from, 98u);
    EXPECT_EQ(r.network->flows[0].to, 99u);
    EXPECT_DOUBLE_EQ(r.network->flows[0].value, 1.94e-07);
    const ScorReadResult r2 = readScor(runTogether, "big.scor");
    ASSERT_TRUE(r2.network) << firstError(r2).describe();
    EXPECT_EQ(r2.network->livingCount, 99u);
}

TEST(ScorReader, NameContainingMinusOneDoesNotEndABlock)
{
    const ScorReadResult r = readWith(kSmall, "Snails\n", " -1 Snails\n");
    ASSERT_TRUE(r.network) << firstError(r).describe();
    EXPECT_EQ(r.network->names[1], "-1 Snails");
}

TEST(ScorReader, TooFewStockLinesForTheDeclaredCount)
{
    // Declares 4 compartments but gives 3: the 4th "name" is the first stock line and
    // the stock block meets the terminator early.
    const ScorReadResult r = readWith(kSmall, "  3  2\n", "  4  2\n");
    EXPECT_FALSE(r.network);
    const Problem& p = firstError(r);
    ASSERT_TRUE(p.location);
    EXPECT_EQ(p.location->file, "bad.scor");
    EXPECT_EQ(p.location->line, 9);  // 4 name lines (3-6), stocks on 7-8, terminator on 9
    EXPECT_EQ(p.code, "scor-counts");
    EXPECT_NE(p.message.find("expected 4"), std::string::npos) << p.message;
}

TEST(ScorReader, MoreStockLinesThanDeclared)
{
    const ScorReadResult r = readWith(kSmall, "  3 100\n -1\n", "  3 100\n  3 7\n -1\n");
    EXPECT_FALSE(r.network);
    const Problem& p = firstError(r);
    ASSERT_TRUE(p.location);
    EXPECT_EQ(p.location->line, 9);
    EXPECT_NE(p.message.find("terminator -1"), std::string::npos) << p.message;
}

TEST(ScorReader, CountsThatAreNotNumbers)
{
    const ScorReadResult r = readWith(kSmall, "  3  2\n", "  x  2\n");
    EXPECT_FALSE(r.network);
    const Problem& p = firstError(r);
    EXPECT_EQ(p.location->line, 2);
    EXPECT_EQ(p.location->column, 1);
    EXPECT_NE(p.message.find("columns 1-3"), std::string::npos) << p.message;

    const ScorReadResult r2 = readWith(kSmall, "  3  2\n", "  3  4\n");  // more living than compartments
    EXPECT_FALSE(r2.network);
    EXPECT_EQ(firstError(r2).location->line, 2);
    EXPECT_EQ(firstError(r2).location->column, 4);
}

TEST(ScorReader, FlowIndexOutOfRange)
{
    const ScorReadResult r = readWith(kSmall, "  3  2 1\n", "  3  7 1\n");
    EXPECT_FALSE(r.network);
    const Problem& p = firstError(r);
    EXPECT_EQ(p.code, "scor-index-range");
    EXPECT_EQ(p.location->line, 20);
    EXPECT_EQ(p.location->column, 4);
    EXPECT_NE(p.message.find("7"), std::string::npos);
    EXPECT_NE(p.message.find("1..3"), std::string::npos) << p.message;
}

TEST(ScorReader, ImportIndexOutOfRange)
{
    const ScorReadResult r = readWith(kSmall, "  1 50\n", "  0 50\n");
    EXPECT_FALSE(r.network);
    EXPECT_EQ(firstError(r).code, "scor-index-range");
    EXPECT_EQ(firstError(r).location->line, 10);
}

TEST(ScorReader, MissingFinalTerminator)
{
    std::string text = kSmall;
    text.erase(text.find(" -1 -1\n"));
    const ScorReadResult r = readScor(text, "bad.scor");
    EXPECT_FALSE(r.network);
    const Problem& p = firstError(r);
    EXPECT_EQ(p.code, "scor-truncated");
    // Issue 12, defect 5: the last line, just after its last character (it used to be
    // line 21, after the end, with no column).
    EXPECT_EQ(p.location->line, 20);
    EXPECT_EQ(p.location->column, 9);  // the last line is "  3  2 1"
    EXPECT_NE(p.message.find("-1 -1"), std::string::npos) << p.message;
}

// Issue 12, defect 4: names with invalid UTF-8 or NUL bytes never reach JSON or the
// terminal; the file is refused with line and column, once per bad line.
TEST(ScorReader, InvalidUtf8AndNulBytesAreRefusedWithLineAndColumn)
{
    const ScorReadResult latin1 = readWith(kSmall, "Snails", "Sn\xE4ils");  // a legacy code page
    EXPECT_FALSE(latin1.network);
    ASSERT_EQ(latin1.problems.size(), 1u);
    EXPECT_EQ(latin1.problems[0].code, "scor-encoding");
    EXPECT_EQ(latin1.problems[0].location->line, 4);
    EXPECT_EQ(latin1.problems[0].location->column, 3);
    EXPECT_NE(latin1.problems[0].message.find("0xE4"), std::string::npos) << latin1.problems[0].message;
    EXPECT_EQ(latin1.problems[0].describe().rfind("bad.scor:4:3", 0), 0u) << latin1.problems[0].describe();

    const ScorReadResult nul = readWith(kSmall, "Detritus", std::string("Detr\0tus", 8));
    EXPECT_FALSE(nul.network);
    ASSERT_EQ(nul.problems.size(), 1u);
    EXPECT_EQ(nul.problems[0].code, "scor-encoding");
    EXPECT_EQ(nul.problems[0].location->line, 5);
    EXPECT_EQ(nul.problems[0].location->column, 5);
    EXPECT_NE(nul.problems[0].message.find("NUL"), std::string::npos);
}

TEST(ScorReader, MissingBlockTerminatorSwallowsTheNextBlock)
{
    // Without the exports terminator the respiration block is read as exports, the flows
    // as respiration, and the first flow line "  1  2 12" has text where a number goes.
    const ScorReadResult r = readWith(kSmall, "  3 5\n -1\n", "  3 5\n");
    EXPECT_FALSE(r.network);
    EXPECT_FALSE(r.problems.empty());
    EXPECT_TRUE(firstError(r).location);
}

TEST(ScorReader, NegativeFlow)
{
    const ScorReadResult r = readWith(kSmall, "  1  3 18\n", "  1  3 -18\n");
    EXPECT_FALSE(r.network);
    const Problem& p = firstError(r);
    EXPECT_EQ(p.code, "scor-negative");
    EXPECT_EQ(p.location->line, 18);
    EXPECT_EQ(p.location->column, 7);
    EXPECT_NE(p.message.find("1 -> 3"), std::string::npos) << p.message;
}

TEST(ScorReader, TextInANumber)
{
    const ScorReadResult r = readWith(kSmall, "  2 2.0\n", "  2 two\n");
    EXPECT_FALSE(r.network);
    const Problem& p = firstError(r);
    EXPECT_EQ(p.code, "scor-number");
    EXPECT_EQ(p.location->line, 7);
    EXPECT_EQ(p.location->column, 4);
    EXPECT_NE(p.message.find("'two'"), std::string::npos) << p.message;
    EXPECT_EQ(p.describe().rfind("bad.scor:7:4: ", 0), 0u) << p.describe();

    const ScorReadResult r2 = readWith(kSmall, "  2  3 4\n", "  2  3 4.0x\n");
    EXPECT_FALSE(r2.network);
    EXPECT_EQ(firstError(r2).location->line, 19);
}

TEST(ScorReader, DuplicateFlow)
{
    const ScorReadResult r = readWith(kSmall, "  2  3 4\n", "  2  3 4\n  2  3 5\n");
    EXPECT_FALSE(r.network);
    EXPECT_EQ(firstError(r).code, "scor-duplicate");
    EXPECT_EQ(firstError(r).location->line, 20);
    EXPECT_NE(firstError(r).message.find("line 19"), std::string::npos);
}

TEST(ScorReader, EmptyAndMissingFiles)
{
    const ScorReadResult empty = readScor("", "empty.scor");
    EXPECT_FALSE(empty.network);
    EXPECT_EQ(firstError(empty).location->line, 1);

    const ScorReadResult missing = readScorFile("/nonexistent/dir/none.scor");
    EXPECT_FALSE(missing.network);
    EXPECT_EQ(firstError(missing).code, "scor-open");
    EXPECT_NE(firstError(missing).describe().find("none.scor"), std::string::npos);
}

TEST(ScorReader, TextAfterFinalTerminatorIsAWarning)
{
    const ScorReadResult r = readScor(std::string(kSmall) + "something else\n", "x.scor");
    ASSERT_TRUE(r.network);
    ASSERT_EQ(r.problems.size(), 1u);
    EXPECT_EQ(r.problems[0].severity, Severity::Warning);
    EXPECT_EQ(r.problems[0].location->line, 22);
}

TEST(ScorWriter, RoundTripIsExact)
{
    ScorNetwork net;
    net.title = "Round trip; invented values for this test";
    net.names = {"Phytoplankton", "Grazers -1 class", "Detritus"};
    net.livingCount = 2;
    net.stocks = {0.1, 1.0 / 3.0, 0.0};
    net.imports = {1234.5678901234567, 0.0, 1e-300};
    net.exports = {0.0, 2.5e7, 0.1 + 0.2};
    net.respiration = {3.0, 0.0, 7.0};
    net.flows = {{0, 1, 9.87654321e-5}, {1, 1, 0.5}, {1, 2, 12.0}, {2, 1, 1e20}};
    ASSERT_FALSE(checkScorWritable(net));
    const std::string text = writeScor(net);
    EXPECT_EQ(text.find('\r'), std::string::npos);
    EXPECT_NE(text.find("\n  3  2\n"), std::string::npos);
    EXPECT_NE(text.find("\n  2  2 0.5\n"), std::string::npos);
    const ScorReadResult r = readScor(text, "rt.scor");
    ASSERT_TRUE(r.network) << firstError(r).describe();
    EXPECT_EQ(r.network->stocks, net.stocks);
    EXPECT_EQ(r.network->imports, net.imports);
    EXPECT_EQ(r.network->exports, net.exports);
    EXPECT_EQ(r.network->respiration, net.respiration);
    ASSERT_EQ(r.network->flows.size(), net.flows.size());
    for (std::size_t k = 0; k < net.flows.size(); ++k) {
        EXPECT_EQ(r.network->flows[k].from, net.flows[k].from);
        EXPECT_EQ(r.network->flows[k].to, net.flows[k].to);
        EXPECT_EQ(r.network->flows[k].value, net.flows[k].value);
    }
    EXPECT_EQ(r.network->names[1].find(" -1"), std::string::npos);  // sanitised for other readers
}

TEST(ScorWriter, RefusesWhatTheFormatCannotHold)
{
    ScorNetwork net;
    net.names = {"a"};
    net.livingCount = 1;
    net.stocks = {1};
    net.imports = {-1};
    net.exports = {0};
    net.respiration = {0};
    ASSERT_TRUE(checkScorWritable(net));
    EXPECT_NE(checkScorWritable(net)->find("import"), std::string::npos);
    const auto path = std::filesystem::temp_directory_path() / "tl_scor_refused.scor";
    std::filesystem::remove(path);
    EXPECT_TRUE(writeScorFile(net, path));
    EXPECT_FALSE(std::filesystem::exists(path));
}

}  // namespace
}  // namespace tl
