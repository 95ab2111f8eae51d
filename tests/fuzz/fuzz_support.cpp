#include "tests/fuzz/fuzz_support.h"

#include <cstdlib>
#include <fstream>
#include <system_error>

#include <unistd.h>

namespace tl::fuzz {
namespace {

struct Scratch {
    std::filesystem::path path;
    Scratch()
    {
        std::error_code ec;
        std::filesystem::path base = "/dev/shm";
        if (!std::filesystem::is_directory(base, ec)) base = std::filesystem::temp_directory_path();
        path = base / ("tl-fuzz-" + std::to_string(::getpid()));
        std::filesystem::remove_all(path, ec);
        std::filesystem::create_directories(path);
    }
    ~Scratch()
    {
        std::error_code ec;
        std::filesystem::remove_all(path, ec);
    }
};

}  // namespace

const std::filesystem::path& scratchFolder()
{
    static const Scratch scratch;
    return scratch.path;
}

void writeBytes(const std::filesystem::path& path, std::string_view bytes)
{
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
    if (!out) {  // the harness itself failed: no input can be judged
        std::fprintf(stderr, "fuzz harness: cannot write %s\n", path.c_str());
        std::abort();
    }
}

std::vector<std::string_view> splitSections(std::string_view input)
{
    std::vector<std::string_view> sections;
    for (;;) {
        const std::size_t at = input.find(kFileSeparator);
        if (at == std::string_view::npos) break;
        sections.push_back(input.substr(0, at));
        input.remove_prefix(at + kFileSeparator.size());
    }
    sections.push_back(input);
    return sections;
}

}  // namespace tl::fuzz
