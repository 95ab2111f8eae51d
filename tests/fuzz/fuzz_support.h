// Shared by the fuzz targets: a scratch folder per process (inputs that are files or
// folders are written there), and the split of one input into the files of a CSV model
// folder. Test code only; never linked into the program.
#pragma once

#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

namespace tl::fuzz {

// A folder of its own under the system's temporary folder, created on first use and
// removed when the process ends. Under /dev/shm when it exists: a fuzzer writes
// thousands of files a second.
const std::filesystem::path& scratchFolder();

// Writes `bytes` to `path` (replacing it), in binary.
void writeBytes(const std::filesystem::path& path, std::string_view bytes);

// One input of the CSV model fuzzer is the files of a model folder joined by the
// separator line below, in the order of kCsvModelFiles; a missing section leaves the
// file out, as does the single character '-' as its whole content (an absent file is
// a case of its own). tests/fuzz/make_seed_corpus.py builds seeds the same way.
inline constexpr std::string_view kFileSeparator = "\n%%\n";
inline constexpr const char* kCsvModelFiles[] = {"compartments.csv",     "diet.csv",       "harvest.csv",
                                                 "detritus_routing.csv", "confidence.csv", "settings.csv"};
std::vector<std::string_view> splitSections(std::string_view input);

// Analyses run after a successful read only up to this many compartments, so that a
// fuzzer spends its time on the readers rather than on large dense solves.
inline constexpr std::size_t kAnalyseUpTo = 40;

}  // namespace tl::fuzz

// libFuzzer's entry point; replay_main.cpp calls it for the normal (gcc) build.
extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size);
