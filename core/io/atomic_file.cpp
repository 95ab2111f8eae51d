#include "core/io/atomic_file.h"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <random>

#if defined(__unix__) || defined(__APPLE__)
#include <fcntl.h>
#include <unistd.h>
#define TL_HAVE_FSYNC 1
#endif

namespace tl {

std::filesystem::path temporaryBeside(const std::filesystem::path& target)
{
    // Random suffix so that two writers of the same target never share a temporary.
    std::random_device rd;
    const unsigned long long tag = (static_cast<unsigned long long>(rd()) << 32) ^ rd();
    char suffix[32];
    std::snprintf(suffix, sizeof suffix, ".tmp-%016llx", tag);
    std::string name = ".";  // hidden, so that folder listings do not show it mid-write
    name += target.filename().string();
    name += suffix;
    return target.parent_path() / name;
}

namespace {

#ifdef TL_HAVE_FSYNC
// Flushes the directory entry too, so that the rename itself survives a power cut.
void syncDirectory(const std::filesystem::path& dir)
{
    const std::string name = dir.empty() ? std::string(".") : dir.string();
    const int fd = ::open(name.c_str(), O_RDONLY);
    if (fd < 0) return;
    ::fsync(fd);
    ::close(fd);
}
#endif

}  // namespace

std::optional<std::string> writeFileAtomically(const std::filesystem::path& target, std::string_view content)
{
    const std::filesystem::path temp = temporaryBeside(target);
    std::FILE* f = std::fopen(temp.string().c_str(), "wb");
    if (!f) return "cannot create " + temp.string() + ": " + std::strerror(errno);

    bool ok = std::fwrite(content.data(), 1, content.size(), f) == content.size();
    int err = ok ? 0 : errno;
    if (ok && std::fflush(f) != 0) ok = false, err = errno;
#ifdef TL_HAVE_FSYNC
    if (ok && ::fsync(::fileno(f)) != 0) ok = false, err = errno;
#endif
    if (std::fclose(f) != 0 && ok) ok = false, err = errno;
    if (!ok) {
        std::error_code ignored;
        std::filesystem::remove(temp, ignored);
        return "cannot write " + temp.string() + ": " + std::strerror(err);
    }

    std::error_code ec;
    std::filesystem::rename(temp, target, ec);
    if (ec) {
        std::error_code ignored;
        std::filesystem::remove(temp, ignored);
        return "cannot replace " + target.string() + ": " + ec.message();
    }
#ifdef TL_HAVE_FSYNC
    syncDirectory(target.parent_path());
#endif
    return std::nullopt;
}

}  // namespace tl
