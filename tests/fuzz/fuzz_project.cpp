// Fuzz target: the project loader (core/store/model_source.h, what every tledger
// command and the workbench's Open call) on the input as a .tledger file. SQLite's own
// parsing is not ours to fuzz; the header check before SQLite opens a file, the schema
// and version checks, and turning rows into a Project are. Beyond "no crash, no hang,
// no sanitizer report":
//   - no project is returned only with an error saying why;
//   - the file is never changed by reading it (opened read-only);
// and, for small scenarios, the checks `tledger check` runs.
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <iterator>

#include "core/balance/scenario_checks.h"
#include "core/balance/solver.h"
#include "core/store/model_source.h"
#include "tests/fuzz/fuzz_support.h"

namespace {

[[noreturn]] void fail(const char* what)
{
    std::fprintf(stderr, "fuzz_project: %s\n", what);
    std::abort();
}

std::string contentOf(const std::filesystem::path& path)
{
    std::ifstream in(path, std::ios::binary);
    return std::string((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size)
{
    using namespace tl;
    const std::string_view input(reinterpret_cast<const char*>(data), size);
    const std::filesystem::path folder = fuzz::scratchFolder() / "project";
    std::filesystem::remove_all(folder);  // no -wal or -shm left from the last input
    std::filesystem::create_directories(folder);
    const std::filesystem::path file = folder / "input.tledger";
    fuzz::writeBytes(file, input);

    const ModelSource source = readModelSource(file);
    if (!source.project && !hasErrors(source.problems)) fail("no project and no error saying why");
    if (contentOf(file) != input) fail("reading the project changed the file");
    if (!source.project) return 0;
    for (const Scenario& s : source.project->scenarios) {
        if (s.model.size() > fuzz::kAnalyseUpTo) continue;
        const BalanceSheet sheet = solveBalance(s.model);
        (void)scenarioChecks(s.model, sheet);
    }
    return 0;
}
