// Stand-in for libFuzzer's main in the normal build (gcc, no libFuzzer): runs the
// target once on every file named on the command line or found (recursively) in a
// folder named there, so ctest replays the committed corpora and kept crash inputs.
// A crash or sanitizer report fails the test like any other; so does finding no input
// at all (a moved corpus must not turn the test into one that cannot fail).
#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

#include "tests/fuzz/fuzz_support.h"

namespace {

bool replayFile(const std::filesystem::path& path)
{
    std::ifstream in(path, std::ios::binary);
    if (!in) {
        std::fprintf(stderr, "cannot read %s\n", path.c_str());
        return false;
    }
    const std::string bytes((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    LLVMFuzzerTestOneInput(reinterpret_cast<const std::uint8_t*>(bytes.data()), bytes.size());
    return true;
}

}  // namespace

int main(int argc, char** argv)
{
    std::size_t replayed = 0;
    bool ok = true;
    for (int a = 1; a < argc; ++a) {
        const std::filesystem::path arg = argv[a];
        std::error_code ec;
        if (std::filesystem::is_directory(arg, ec)) {
            std::vector<std::filesystem::path> files;
            for (const auto& e : std::filesystem::recursive_directory_iterator(arg))
                if (e.is_regular_file() && e.path().filename() != "README.md") files.push_back(e.path());
            std::sort(files.begin(), files.end());  // the same order on every machine
            for (const auto& f : files) replayed += replayFile(f) ? 1 : 0;
        } else if (std::filesystem::is_regular_file(arg, ec)) {
            replayed += replayFile(arg) ? 1 : 0;
        } else {
            std::fprintf(stderr, "no such file or folder: %s\n", arg.c_str());
            ok = false;
        }
    }
    std::printf("replayed %zu inputs\n", replayed);
    if (replayed == 0) {
        std::fprintf(stderr, "no input found to replay\n");
        return 1;
    }
    return ok ? 0 : 1;
}
