// Fuzz target: the SCOR reader (core/io/scor.h) on the input as a file's text. Beyond
// "no crash, no hang, no sanitizer report":
//   - a network is returned exactly when no error was reported, every problem has a
//     message and a place;
//   - a network read back from writeScor's text has the same counts, stocks, boundary
//     flows and flows (the writer's shortest round-trip numbers);
// and, for small networks, runs what `tledger network --scor` and `tledger import`
// run on it (network analysis, conversion to a model).
#include <cstdio>
#include <cstdlib>

#include "core/io/scor.h"
#include "core/network/network_analysis.h"
#include "core/store/scor_import.h"
#include "tests/fuzz/fuzz_support.h"

namespace {

[[noreturn]] void fail(const char* what)
{
    std::fprintf(stderr, "fuzz_scor: %s\n", what);
    std::abort();
}

bool sameFlows(const tl::ScorNetwork& a, const tl::ScorNetwork& b)
{
    if (a.flows.size() != b.flows.size()) return false;
    for (std::size_t k = 0; k < a.flows.size(); ++k)
        if (a.flows[k].from != b.flows[k].from || a.flows[k].to != b.flows[k].to || a.flows[k].value != b.flows[k].value)
            return false;
    return true;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size)
{
    using namespace tl;
    const std::string_view input(reinterpret_cast<const char*>(data), size);
    const ScorReadResult read = readScor(input, "fuzz.scor");
    if (read.network.has_value() == hasErrors(read.problems)) fail("network returned together with errors, or neither");
    for (const Problem& p : read.problems)
        if (p.message.empty() || !p.location || p.location->file.empty()) fail("a problem without message or place");
    if (!read.network) return 0;
    const ScorNetwork& net = *read.network;

    if (!checkScorWritable(net)) {
        const ScorReadResult again = readScor(writeScor(net), "written.scor");
        if (!again.network) {
            for (const Problem& p : again.problems) std::fprintf(stderr, "%s\n", p.describe().c_str());
            fail("the reader refuses what the writer wrote");
        }
        const ScorNetwork& back = *again.network;
        if (back.names.size() != net.names.size() || back.livingCount != net.livingCount ||
            back.stocks != net.stocks || back.imports != net.imports || back.exports != net.exports ||
            back.respiration != net.respiration || !sameFlows(back, net))
            fail("the SCOR round trip changed the network");
    }
    if (net.names.size() <= fuzz::kAnalyseUpTo) {
        (void)analyseNetwork(net);
        (void)modelFromScor(net, "fuzz.scor");
    }
    return 0;
}
