// Project file timings (issue 9): open and save a project of 5 scenarios of 200
// compartments (synthetic models, synthetic_model.h, mix "ee", one seed per scenario),
// the way the workbench does them: open = ProjectFile::open + load (everything);
// save = a new file beside the target (ProjectFile::create) renamed over it; also
// saving into the open file and one scenario alone. Prints figures; asserts nothing.
//   store_bench [--benchmark_filter=/200$]
#include <benchmark/benchmark.h>

#include <unistd.h>

#include <filesystem>

#include "core/store/project_file.h"
#include "tests/bench/bench_support.h"

namespace {

using namespace tl::bench;
namespace fs = std::filesystem;

constexpr int kScenarios = 5;

tl::Project benchProject(std::size_t n)
{
    tl::Project project;
    project.info.title = "store bench (invented synthetic models)";
    for (int s = 0; s < kScenarios; ++s) {
        tl::Scenario sc;
        sc.name = "scenario " + std::to_string(s + 1);
        sc.model = syntheticModel(n, UnknownMix::EE, kSeed + static_cast<std::uint64_t>(s)).model;
        project.scenarios.push_back(std::move(sc));
    }
    return project;
}

// A scratch folder that removes itself.
struct Scratch {
    fs::path dir = fs::temp_directory_path() / ("tl_store_bench_" + std::to_string(::getpid()));
    Scratch() { fs::create_directories(dir); }
    ~Scratch()
    {
        std::error_code ec;
        fs::remove_all(dir, ec);
    }
    void removeFile(const fs::path& p) const
    {
        std::error_code ec;
        for (const char* s : {"", "-wal", "-shm", "-journal"}) fs::remove(fs::path(p).concat(s), ec);
    }
};

void saveAs(benchmark::State& state, std::size_t n)
{
    const tl::Project project = benchProject(n);
    Scratch scratch;
    const fs::path target = scratch.dir / "project.tledger", temp = scratch.dir / "project.tledger.saving";
    for (auto _ : state) {
        scratch.removeFile(temp);
        {
            tl::ProjectOpenResult created = tl::ProjectFile::create(temp, project);
            if (!created.file) {
                state.SkipWithError("cannot create the project file");
                return;
            }
        }
        fs::rename(temp, target);
    }
    state.counters["file_kib"] = static_cast<double>(fs::file_size(target)) / 1024.0;
}

void open(benchmark::State& state, std::size_t n)
{
    Scratch scratch;
    const fs::path path = scratch.dir / "project.tledger";
    if (!tl::ProjectFile::create(path, benchProject(n)).file) {
        state.SkipWithError("cannot create the project file");
        return;
    }
    std::size_t scenarios = 0;
    for (auto _ : state) {
        tl::ProjectOpenResult opened = tl::ProjectFile::open(path);
        if (!opened.file) {
            state.SkipWithError("cannot open the project file");
            return;
        }
        const tl::StoreResult<tl::Project> loaded = opened.file->load();
        scenarios = loaded.value ? loaded.value->scenarios.size() : 0;
    }
    state.counters["scenarios"] = static_cast<double>(scenarios);
}

void saveInPlace(benchmark::State& state, std::size_t n, bool oneScenario)
{
    const tl::Project project = benchProject(n);
    Scratch scratch;
    std::unique_ptr<tl::ProjectFile> file = tl::ProjectFile::create(scratch.dir / "project.tledger", project).file;
    if (!file) {
        state.SkipWithError("cannot create the project file");
        return;
    }
    for (auto _ : state) benchmark::DoNotOptimize(oneScenario ? file->saveScenario(project.scenarios[2]).size() : file->save(project).size());
}

}  // namespace

int main(int argc, char** argv)
{
    for (std::size_t n : {std::size_t{10}, std::size_t{200}}) {
        const std::string size = std::to_string(kScenarios) + "_scenarios";
        benchmark::RegisterBenchmark(("project_open/" + size + "/" + std::to_string(n)).c_str(), open, n)
            ->Unit(benchmark::kMillisecond)->UseRealTime();
        benchmark::RegisterBenchmark(("project_save/" + size + "/" + std::to_string(n)).c_str(), saveAs, n)
            ->Unit(benchmark::kMillisecond)->UseRealTime();
        benchmark::RegisterBenchmark(("project_save_in_place/" + size + "/" + std::to_string(n)).c_str(), saveInPlace, n, false)
            ->Unit(benchmark::kMillisecond)->UseRealTime();
        benchmark::RegisterBenchmark(("project_save_one_scenario/" + size + "/" + std::to_string(n)).c_str(), saveInPlace, n, true)
            ->Unit(benchmark::kMillisecond)->UseRealTime();
    }
    benchmark::Initialize(&argc, argv);
    if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
    benchmark::RunSpecifiedBenchmarks();
    benchmark::Shutdown();
    return 0;
}
