// Fuzz target: the CSV model reader (core/io/csv_model.h) on a whole model folder.
// The input is split into the folder's files (fuzz_support.h). Beyond "no crash, no
// hang, no sanitizer report" it holds the reader to its contract:
//   - a model is returned exactly when no error was reported;
//   - every problem says what is wrong and names its file;
//   - a model read back from what writeCsvModel wrote equals the model (the round
//     trip the header promises), when the writer accepts its names;
// and, for small models, runs the checks `tledger check` runs (solver included).
#include <cstdio>
#include <cstdlib>

#include "core/balance/scenario_checks.h"
#include "core/balance/solver.h"
#include "core/io/csv_model.h"
#include "tests/fuzz/fuzz_support.h"

namespace {

[[noreturn]] void fail(const char* what)
{
    std::fprintf(stderr, "fuzz_csv_model: %s\n", what);
    std::abort();
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size)
{
    using namespace tl;
    const std::string_view input(reinterpret_cast<const char*>(data), size);
    const std::filesystem::path folder = fuzz::scratchFolder() / "model";
    std::filesystem::remove_all(folder);
    std::filesystem::create_directories(folder);
    const auto sections = fuzz::splitSections(input);
    for (std::size_t k = 0; k < sections.size() && k < std::size(fuzz::kCsvModelFiles); ++k)
        if (sections[k] != "-") fuzz::writeBytes(folder / fuzz::kCsvModelFiles[k], sections[k]);

    const CsvReadResult read = readCsvModel(folder);
    if (read.model.has_value() == hasErrors(read.problems)) fail("model returned together with errors, or neither");
    for (const Problem& p : read.problems) {
        if (p.message.empty()) fail("a problem without a message");
        if (!p.location || p.location->file.empty()) fail("a problem that names no file");
    }
    if (!read.model) return 0;

    const std::filesystem::path copy = fuzz::scratchFolder() / "written";
    std::filesystem::remove_all(copy);
    if (!hasErrors(writeCsvModel(*read.model, copy))) {
        const CsvReadResult again = readCsvModel(copy);
        if (!again.model) fail("the reader refuses what the writer wrote");
        if (!(*again.model == *read.model)) fail("the CSV round trip changed the model");
    }
    if (read.model->size() <= fuzz::kAnalyseUpTo) {
        const BalanceSheet sheet = solveBalance(*read.model);
        (void)scenarioChecks(*read.model, sheet);
    }
    return 0;
}
