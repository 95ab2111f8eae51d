// Store timings: create, open, load, save of a project file with invented random food
// webs (150 compartments, dense-ish diets, 3 fleets; 5 scenarios). Prints milliseconds
// per operation; nothing here is asserted (speed targets never sit in unit tests).
//   ninja store_bench && tests/bench/store_bench [folder for the scratch file]
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <random>
#include <string>

#include "core/store/project_file.h"

namespace {

tl::Model randomModel(std::size_t n, std::mt19937& rng)
{
    std::uniform_real_distribution<double> u(0.0, 1.0);
    tl::Model m;
    for (std::size_t i = 0; i < n; ++i) {
        tl::Compartment c;
        c.name = "group " + std::to_string(i);
        c.kind = i < 5 ? tl::CompartmentKind::Producer : i + 3 >= n ? tl::CompartmentKind::Detritus : tl::CompartmentKind::Consumer;
        c.value(tl::Param::Biomass) = 0.1 + 10 * u(rng);
        c.value(tl::Param::PB) = 0.2 + 5 * u(rng);
        if (c.kind == tl::CompartmentKind::Consumer) c.value(tl::Param::QB) = 2 + 20 * u(rng);
        c.confidenceOf(tl::Param::Biomass) = tl::Confidence{tl::Confidence::Grade::C, std::nullopt, "invented"};
        m.addCompartment(std::move(c));
    }
    for (std::size_t j = 5; j + 3 < n; ++j) {
        double sum = 0;
        std::vector<std::pair<std::size_t, double>> prey;
        for (int k = 0; k < 12; ++k) {
            const std::size_t i = static_cast<std::size_t>(u(rng) * static_cast<double>(n));
            const double w = u(rng);
            prey.emplace_back(i, w);
            sum += w;
        }
        for (auto [i, w] : prey) m.setDiet(j, i, m.diet(j, i) + w / sum);
    }
    for (int f = 0; f < 3; ++f) {
        const std::size_t k = m.addFleet("fleet " + std::to_string(f));
        for (std::size_t i = 5; i < n; i += 7) m.fleet(k).landings[i] = u(rng);
    }
    return m;
}

template <typename F>
double millis(F&& f)
{
    const auto t0 = std::chrono::steady_clock::now();
    f();
    return std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - t0).count();
}

}  // namespace

int main(int argc, char** argv)
{
    const std::filesystem::path dir = argc > 1 ? argv[1] : std::filesystem::temp_directory_path();
    const auto path = dir / "tl_store_bench.tledger";
    std::error_code ec;
    for (const char* s : {"", "-wal", "-shm"}) std::filesystem::remove(path.string() + s, ec);

    std::mt19937 rng(17);
    tl::Project project;
    project.info.title = "store bench (invented)";
    for (int s = 0; s < 5; ++s) {
        tl::Scenario sc;
        sc.name = "scenario " + std::to_string(s);
        sc.model = randomModel(150, rng);
        project.scenarios.push_back(std::move(sc));
    }
    std::unique_ptr<tl::ProjectFile> file;
    const double create = millis([&] { file = tl::ProjectFile::create(path, project).file; });
    if (!file) {
        std::fprintf(stderr, "cannot create %s\n", path.c_str());
        return 1;
    }
    const double saveAll = millis([&] { file->save(project); });
    const double saveOne = millis([&] { file->saveScenario(project.scenarios[2]); });
    const double load = millis([&] { (void)file->load(); });
    file.reset();
    const double open = millis([&] { file = tl::ProjectFile::open(path).file; });
    std::printf("project of 5 scenarios x 150 compartments, %s\n", path.c_str());
    std::printf("  create      %8.1f ms\n  save all    %8.1f ms\n  save one    %8.1f ms\n  load all    %8.1f ms\n"
                "  open        %8.1f ms (header check + quick_check)\n  file size   %8.1f KiB\n",
                create, saveAll, saveOne, load, open, static_cast<double>(std::filesystem::file_size(path)) / 1024.0);
    file.reset();
    for (const char* s : {"", "-wal", "-shm"}) std::filesystem::remove(path.string() + s, ec);
    return 0;
}
