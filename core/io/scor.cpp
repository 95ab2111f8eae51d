#include "core/io/scor.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <map>
#include <sstream>
#include <utility>

#include "core/io/atomic_file.h"
#include "core/model/problem_codes.h"
#include "core/model/limits.h"
#include "core/model/text.h"
#include "core/model/validation.h"

namespace tl {
namespace {

// Splits into lines, accepting LF and CRLF; a final line break does not open a line.
std::vector<std::string_view> splitLines(std::string_view text)
{
    std::vector<std::string_view> lines;
    std::size_t start = 0;
    while (start < text.size()) {
        std::size_t end = text.find('\n', start);
        if (end == std::string_view::npos) end = text.size();
        std::string_view line = text.substr(start, end - start);
        if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
        lines.push_back(line);
        start = end + 1;
    }
    return lines;
}

// Columns [first, first + width) of a line, 0-based, clipped to the line.
std::string_view columns(std::string_view line, std::size_t first, std::size_t width = std::string_view::npos)
{
    if (first >= line.size()) return {};
    return line.substr(first, width);
}

bool isBlank(std::string_view s) { return trim(s).empty(); }

// A Fortran real as SCOR files hold it. The old form without the E (".3480000+04")
// gets an E before the exponent's sign, as enaR's scifix() does.
std::optional<double> parseScorNumber(std::string_view field)
{
    std::string text(trim(field));
    if (text.empty()) return std::nullopt;
    if (text.find_first_of("eEdD") == std::string::npos) {
        const std::size_t sign = text.find_first_of("+-", 1);
        if (sign != std::string::npos) text.insert(sign, "E");
    } else {
        for (char& c : text)
            if (c == 'd' || c == 'D') c = 'E';  // Fortran double-precision exponent
    }
    return parseNumber(text);
}

std::optional<long> parseIndexField(std::string_view field)
{
    const std::string_view t = trim(field);
    if (t.empty()) return std::nullopt;
    long v = 0;
    std::size_t pos = 0;
    const bool negative = t[0] == '-';
    if (negative || t[0] == '+') pos = 1;
    if (pos == t.size()) return std::nullopt;
    for (; pos < t.size(); ++pos) {
        if (t[pos] < '0' || t[pos] > '9') return std::nullopt;
        v = v * 10 + (t[pos] - '0');
        if (v > 1000000) return std::nullopt;
    }
    return negative ? -v : v;
}

bool isTerminator(std::string_view line)
{
    const auto first = parseIndexField(columns(line, 0, 3));
    return first && *first == -1;
}

class ScorParser {
public:
    ScorParser(std::string_view text, std::string fileName) : lines_(splitLines(text)), file_(std::move(fileName)) {}

    ScorReadResult run()
    {
        ScorReadResult result;
        ScorNetwork net;
        if (parse(net)) result.network = std::move(net);
        result.problems = std::move(problems_);
        return result;
    }

private:
    void error(int line, int column, std::string message, std::string code = code::kScorSyntax)
    {
        Problem p;
        p.code = std::move(code);
        p.severity = Severity::Error;
        p.message = std::move(message);
        p.location = FileLocation{file_, line, column};
        problems_.push_back(std::move(p));
    }

    // Line number (1-based) of lines_[i], and "the file ends" checks.
    bool haveLine(std::size_t i, const std::string& expected)
    {
        if (i < lines_.size()) return true;
        // The best place there is: just after the last character of the last line.
        const int last = static_cast<int>(lines_.size());
        const int column = last == 0 ? 1 : static_cast<int>(lines_.back().size()) + 1;
        error(std::max(last, 1), column, "the file ends here; expected " + expected, code::kScorTruncated);
        return false;
    }

    bool parseCounts(std::string_view line, int lineNo, std::size_t& n, std::size_t& nl)
    {
        const auto nField = parseIndexField(columns(line, 0, 3));
        const auto nlField = parseIndexField(columns(line, 3, 3));
        if (!nField) {
            error(lineNo, 1, "expected the number of compartments right-justified in columns 1-3, found '" +
                                 std::string(trim(columns(line, 0, 3))) + "'", code::kScorCounts);
            return false;
        }
        if (!nlField) {
            error(lineNo, 4, "expected the number of living compartments right-justified in columns 4-6, found '" +
                                 std::string(trim(columns(line, 3, 3))) + "'", code::kScorCounts);
            return false;
        }
        if (*nField < 1) {
            error(lineNo, 1, "the number of compartments must be at least 1, found " + std::to_string(*nField),
                  code::kScorCounts);
            return false;
        }
        if (*nlField < 0 || *nlField > *nField) {
            error(lineNo, 4, "the number of living compartments must lie between 0 and " + std::to_string(*nField) +
                                 ", found " + std::to_string(*nlField), code::kScorCounts);
            return false;
        }
        n = static_cast<std::size_t>(*nField);
        nl = static_cast<std::size_t>(*nlField);
        return true;
    }

    // Index field in columns [col, col+3): a compartment number 1..n, returned 0-based.
    std::optional<std::size_t> index(std::string_view line, int lineNo, std::size_t col, std::size_t n,
                                     const char* what)
    {
        const std::string_view field = columns(line, col, 3);
        const auto v = parseIndexField(field);
        if (!v) {
            error(lineNo, static_cast<int>(col) + 1,
                  std::string("expected ") + what + " (a compartment number 1.." + std::to_string(n) +
                      ") in columns " + std::to_string(col + 1) + "-" + std::to_string(col + 3) + ", found '" +
                      std::string(trim(field)) + "'");
            return std::nullopt;
        }
        if (*v < 1 || static_cast<std::size_t>(*v) > n) {
            error(lineNo, static_cast<int>(col) + 1,
                  std::string(what) + " " + std::to_string(*v) + " is out of range: the file declares " +
                      std::to_string(n) + " compartments (1.." + std::to_string(n) + ")",
                  code::kScorIndexRange);
            return std::nullopt;
        }
        return static_cast<std::size_t>(*v - 1);
    }

    std::optional<double> value(std::string_view line, int lineNo, std::size_t col, const std::string& what)
    {
        const std::string_view field = columns(line, col);
        const auto v = parseScorNumber(field);
        if (!v) {
            const std::string shown(trim(field));
            error(lineNo, static_cast<int>(col) + 1,
                  "expected a number for " + what + " from column " + std::to_string(col + 1) + ", found " +
                      (shown.empty() ? std::string("nothing") : "'" + shown + "'"),
                  code::kScorNumber);
            return std::nullopt;
        }
        if (*v > kMaxInputMagnitude) {
            error(lineNo, static_cast<int>(col) + 1,
                  what + " is " + formatNumber(*v) + "; values beyond 1e30 would overflow the network indices",
                  code::kScorNumber);
            return std::nullopt;
        }
        if (*v < 0) {
            error(lineNo, static_cast<int>(col) + 1,
                  what + " is negative (" + formatNumber(*v) + "); SCOR values must be zero or positive",
                  code::kScorNegative);
            return std::nullopt;
        }
        return v;
    }

    // A sparse block "iii value" up to its -1 terminator. Returns false on error.
    bool sparseBlock(std::size_t& i, std::size_t n, const char* blockName, std::vector<double>& out)
    {
        out.assign(n, 0.0);
        std::map<std::size_t, int> seen;
        for (;; ++i) {
            if (!haveLine(i, std::string("a line of the ") + blockName + " block or its terminator -1")) return false;
            const std::string_view line = lines_[i];
            const int lineNo = static_cast<int>(i) + 1;
            if (isTerminator(line)) {
                ++i;
                return true;
            }
            if (isBlank(line)) {
                error(lineNo, 1, std::string("empty line in the ") + blockName +
                                     " block; expected 'index value' or the terminator -1");
                return false;
            }
            const auto k = index(line, lineNo, 0, n, "compartment");
            if (!k) return false;
            const auto v = value(line, lineNo, 3, std::string(blockName) + " of compartment " + std::to_string(*k + 1));
            if (!v) return false;
            if (const auto it = seen.find(*k); it != seen.end()) {
                error(lineNo, 1, std::string("compartment ") + std::to_string(*k + 1) + " appears twice in the " +
                                     blockName + " block (first on line " + std::to_string(it->second) + ")",
                      code::kScorDuplicate);
                return false;
            }
            seen[*k] = lineNo;
            out[*k] = *v;
        }
    }

    // Text that is not UTF-8, or holds NUL bytes, would otherwise reach names, the
    // terminal and JSON as it is: refused with its place, as the CSV reader does.
    bool plainText()
    {
        int reported = 0;
        for (std::size_t i = 0; i < lines_.size() && reported < 10; ++i) {
            const std::string_view line = lines_[i];
            const std::size_t nul = line.find('\0');
            const std::size_t bad = std::min(nul, firstInvalidUtf8(line));
            if (bad == std::string_view::npos) continue;
            char byteText[8];
            std::snprintf(byteText, sizeof byteText, "0x%02X", static_cast<unsigned char>(line[bad]));
            error(static_cast<int>(i) + 1, static_cast<int>(bad) + 1,
                  bad == nul ? std::string("a NUL byte; a SCOR file is plain text")
                             : std::string("not valid UTF-8 text (byte ") + byteText + "); save the file as UTF-8",
                  code::kScorEncoding);
            ++reported;
        }
        return reported == 0;
    }

    bool parse(ScorNetwork& net)
    {
        if (!plainText()) return false;
        if (!haveLine(0, "a title line")) return false;
        net.title = std::string(trim(lines_[0]));
        if (!haveLine(1, "the counts line (n in columns 1-3, living n in columns 4-6)")) return false;
        std::size_t n = 0, nl = 0;
        if (!parseCounts(lines_[1], 2, n, nl)) return false;
        net.livingCount = nl;

        std::size_t i = 2;
        for (std::size_t k = 0; k < n; ++k, ++i) {
            if (!haveLine(i, "the name of compartment " + std::to_string(k + 1) + " of " + std::to_string(n)))
                return false;
            net.names.emplace_back(trim(lines_[i]));
            if (const std::size_t length = limits::characterCount(net.names.back()); length > limits::kMaxNameLength) {
                error(static_cast<int>(i) + 1, 1,
                      "the name of compartment " + std::to_string(k + 1) + " has " + std::to_string(length) +
                          " characters; the limit of this version is " + std::to_string(limits::kMaxNameLength),
                      code::kScorLimit);
                return false;
            }
        }

        // Stocks: exactly n lines, taken by position, each value put at the index it names.
        net.stocks.assign(n, 0.0);
        std::map<std::size_t, int> seenStock;
        for (std::size_t k = 0; k < n; ++k, ++i) {
            if (!haveLine(i, "the stock of compartment " + std::to_string(k + 1) + " of " + std::to_string(n)))
                return false;
            const std::string_view line = lines_[i];
            const int lineNo = static_cast<int>(i) + 1;
            if (isTerminator(line)) {
                error(lineNo, 1, "the stock block ends after " + std::to_string(k) + " lines; expected " +
                                     std::to_string(n) + " (one per compartment, zeros included)",
                      code::kScorCounts);
                return false;
            }
            const auto idx = index(line, lineNo, 0, n, "compartment");
            if (!idx) return false;
            const auto v = value(line, lineNo, 3, "the stock of compartment " + std::to_string(*idx + 1));
            if (!v) return false;
            if (const auto it = seenStock.find(*idx); it != seenStock.end()) {
                error(lineNo, 1, "compartment " + std::to_string(*idx + 1) +
                                     " appears twice in the stock block (first on line " +
                                     std::to_string(it->second) + ")", code::kScorDuplicate);
                return false;
            }
            seenStock[*idx] = lineNo;
            net.stocks[*idx] = *v;
        }
        if (!haveLine(i, "the terminator -1 of the stock block")) return false;
        if (!isTerminator(lines_[i])) {
            error(static_cast<int>(i) + 1, 1,
                  "expected the terminator -1 after the " + std::to_string(n) +
                      " stock lines, found '" + std::string(trim(lines_[i])) +
                      "' (does line 2 declare the right number of compartments?)",
                  code::kScorCounts);
            return false;
        }
        ++i;

        if (!sparseBlock(i, n, "imports", net.imports)) return false;
        if (!sparseBlock(i, n, "exports", net.exports)) return false;
        if (!sparseBlock(i, n, "respiration", net.respiration)) return false;

        std::map<std::pair<std::size_t, std::size_t>, int> seenFlow;
        for (;; ++i) {
            if (!haveLine(i, "a flow line 'source destination value' or the final terminator -1 -1")) return false;
            const std::string_view line = lines_[i];
            const int lineNo = static_cast<int>(i) + 1;
            if (isTerminator(line)) {
                ++i;
                break;
            }
            if (isBlank(line)) {
                error(lineNo, 1, "empty line in the flows block; expected 'source destination value' or -1 -1");
                return false;
            }
            const auto from = index(line, lineNo, 0, n, "source compartment");
            if (!from) return false;
            const auto to = index(line, lineNo, 3, n, "destination compartment");
            if (!to) return false;
            const auto v = value(line, lineNo, 6,
                                 "the flow " + std::to_string(*from + 1) + " -> " + std::to_string(*to + 1));
            if (!v) return false;
            const auto key = std::make_pair(*from, *to);
            if (const auto it = seenFlow.find(key); it != seenFlow.end()) {
                error(lineNo, 1, "the flow " + std::to_string(*from + 1) + " -> " + std::to_string(*to + 1) +
                                     " appears twice (first on line " + std::to_string(it->second) + ")",
                      code::kScorDuplicate);
                return false;
            }
            seenFlow[key] = lineNo;
            if (*v > 0.0) net.flows.push_back({*from, *to, *v});
        }

        for (; i < lines_.size(); ++i) {
            if (isBlank(lines_[i])) continue;
            Problem p;
            p.code = code::kScorTrailingText;
            p.severity = Severity::Warning;
            p.message = "text after the final terminator -1 -1 is ignored";
            p.location = FileLocation{file_, static_cast<int>(i) + 1, 1};
            problems_.push_back(std::move(p));
            break;
        }
        return true;
    }

    std::vector<std::string_view> lines_;
    std::string file_;
    Problems problems_;
};

std::string sanitiseLine(std::string s)
{
    for (char& c : s)
        if (c == '\n' || c == '\r') c = ' ';
    for (std::size_t at = s.find(" -1"); at != std::string::npos; at = s.find(" -1", at + 1)) s.replace(at, 3, " - 1");
    return s;
}

std::string padIndex(std::size_t oneBased)
{
    char buf[24];
    std::snprintf(buf, sizeof buf, "%3zu", oneBased);
    return buf;
}

}  // namespace

ScorReadResult readScor(std::string_view text, const std::string& fileName)
{
    return ScorParser(text, fileName).run();
}

ScorReadResult readScorFile(const std::filesystem::path& path)
{
    std::ifstream in(path, std::ios::binary);
    if (!in) {
        ScorReadResult result;
        Problem p;
        p.code = code::kScorOpen;
        p.message = "cannot open the SCOR file (does it exist and is it readable?)";
        p.location = FileLocation{path.string(), 0, 0};
        result.problems.push_back(std::move(p));
        return result;
    }
    // SCOR indices have three digits (at most 999 nodes), so a real file is far below the
    // limit. Asked first where the file has a size; counted while reading where not (a pipe).
    const auto tooLarge = [&] {
        ScorReadResult result;
        Problem p;
        p.code = code::kScorLimit;
        p.message = "the file holds more than " + limits::byteSize(limits::kMaxScorFileBytes) +
                    ", the limit of this version for a SCOR file";
        p.location = FileLocation{path.string(), 0, 0};
        result.problems.push_back(std::move(p));
        return result;
    };
    std::error_code sizeError;
    const auto size = std::filesystem::file_size(path, sizeError);
    if (!sizeError && size > limits::kMaxScorFileBytes) return tooLarge();
    std::string text;
    std::vector<char> chunk(1 << 16);
    while (in.read(chunk.data(), static_cast<std::streamsize>(chunk.size())) || in.gcount() > 0) {
        text.append(chunk.data(), static_cast<std::size_t>(in.gcount()));
        if (text.size() > limits::kMaxScorFileBytes) return tooLarge();
    }
    return readScor(text, path.string());
}

std::optional<std::string> checkScorWritable(const ScorNetwork& net)
{
    const std::size_t n = net.names.size();
    if (n == 0) return "a SCOR file needs at least one compartment";
    if (n > 999) return "SCOR holds at most 999 compartments (three-digit index fields); this network has " +
                        std::to_string(n);
    if (net.livingCount > n) return "more living compartments than compartments";
    for (std::size_t k = 0; k < n; ++k)  // as written: sanitiseLine may lengthen a name; the reader must take it back
        if (const std::size_t length = limits::characterCount(sanitiseLine(net.names[k]));
            length > limits::kMaxNameLength)
            return "the name of compartment " + std::to_string(k + 1) + " would be written with " +
                   std::to_string(length) + " characters; the limit of this version is " +
                   std::to_string(limits::kMaxNameLength);
    const auto checkVector = [&](const std::vector<double>& v, const char* what) -> std::optional<std::string> {
        if (v.size() != n) return std::string(what) + ": expected one value per compartment";
        for (std::size_t k = 0; k < n; ++k)
            if (!std::isfinite(v[k]) || v[k] < 0)
                return std::string(what) + " of '" + net.names[k] + "' is " + formatNumber(v[k]) +
                       "; SCOR needs finite values >= 0";
        return std::nullopt;
    };
    if (auto e = checkVector(net.stocks, "stock")) return e;
    if (auto e = checkVector(net.imports, "import")) return e;
    if (auto e = checkVector(net.exports, "export")) return e;
    if (auto e = checkVector(net.respiration, "respiration")) return e;
    for (const ScorFlow& f : net.flows) {
        if (f.from >= n || f.to >= n) return "a flow names a compartment outside the network";
        if (!std::isfinite(f.value) || f.value < 0)
            return "the flow '" + net.names[f.from] + "' -> '" + net.names[f.to] + "' is " + formatNumber(f.value) +
                   "; SCOR needs finite values >= 0";
    }
    return std::nullopt;
}

std::string writeScor(const ScorNetwork& net)
{
    const std::size_t n = net.names.size();
    std::string out = sanitiseLine(net.title) + "\n";
    out += padIndex(n) + padIndex(net.livingCount) + "\n";
    for (const std::string& name : net.names) {
        std::string line = sanitiseLine(name);
        if (trim(line).empty()) line = "unnamed";
        out += line + "\n";
    }
    for (std::size_t k = 0; k < n; ++k) out += padIndex(k + 1) + " " + formatNumber(net.stocks[k]) + "\n";
    out += " -1\n";
    for (const auto* block : {&net.imports, &net.exports, &net.respiration}) {
        for (std::size_t k = 0; k < n; ++k)
            if ((*block)[k] != 0.0) out += padIndex(k + 1) + " " + formatNumber((*block)[k]) + "\n";
        out += " -1\n";
    }
    for (const ScorFlow& f : net.flows)
        if (f.value != 0.0) out += padIndex(f.from + 1) + padIndex(f.to + 1) + " " + formatNumber(f.value) + "\n";
    out += " -1 -1\n";
    return out;
}

std::optional<std::string> writeScorFile(const ScorNetwork& net, const std::filesystem::path& path)
{
    if (auto e = checkScorWritable(net)) return e;
    return writeFileAtomically(path, writeScor(net));
}

}  // namespace tl
