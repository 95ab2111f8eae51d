#include "core/store/project_file_detail.h"

#include <cstdio>
#include <fstream>
#include <system_error>

#include "core/model/problem_codes.h"
#include "core/store/schema.h"

namespace tl::store::detail {
namespace {

std::string hex32(std::uint32_t v)
{
    char text[16];
    std::snprintf(text, sizeof text, "0x%08X", v);
    return text;
}

std::uint32_t bigEndian32(const unsigned char* p)
{
    return (std::uint32_t(p[0]) << 24) | (std::uint32_t(p[1]) << 16) | (std::uint32_t(p[2]) << 8) | std::uint32_t(p[3]);
}

}  // namespace

// Checks the 100-byte SQLite header without letting SQLite near the file, so that a
// file of another kind is refused before anything could write to it.
std::optional<Problem> checkHeader(const fs::path& path)
{
    std::error_code ec;
    const auto status = fs::status(path, ec);
    if (ec || !fs::exists(status))
        return fileProblem(path, code::kStoreNotFound, "no such project file");
    if (!fs::is_regular_file(status))
        return fileProblem(path, code::kStoreNotProject, "not a Trophic Ledger project: it is not a regular file");
    std::ifstream in(path, std::ios::binary);
    if (!in) return fileProblem(path, code::kStoreUnreadable, "cannot be read (permission denied?)");
    unsigned char header[100] = {};
    in.read(reinterpret_cast<char*>(header), sizeof header);
    const std::streamsize got = in.gcount();
    if (got == 0) return fileProblem(path, code::kStoreNotProject, "not a Trophic Ledger project: the file is empty");
    static constexpr char kMagic[] = "SQLite format 3";  // 16 bytes with the terminating NUL
    if (got < 100 || std::char_traits<char>::compare(reinterpret_cast<const char*>(header), kMagic, 16) != 0) {
        if (got >= 16 && std::char_traits<char>::compare(reinterpret_cast<const char*>(header), kMagic, 16) == 0)
            return fileProblem(path, code::kStoreDamaged, "damaged: the file is cut short (shorter than its own header)",
                               "The file was left unchanged; restore it from a backup.");
        return fileProblem(path, code::kStoreNotProject, "not a Trophic Ledger project: it is not a SQLite database");
    }
    const std::uint32_t appId = bigEndian32(header + 68);
    if (appId != static_cast<std::uint32_t>(store::kApplicationId)) {
        return fileProblem(path, code::kStoreForeignDatabase,
                           appId == 0 ? "not a Trophic Ledger project: a SQLite database of another program "
                                        "(it carries no Trophic Ledger application id); it was left unchanged"
                                      : "not a Trophic Ledger project: a SQLite database of another program "
                                        "(application id " + hex32(appId) + "); it was left unchanged");
    }
    // Truncation: the page count in the header (valid when the "version valid for"
    // number equals the change counter) must fit in the file. Skipped while a WAL
    // holds pages that a checkpoint has not yet copied back.
    const std::uint32_t pageSizeField = (std::uint32_t(header[16]) << 8) | header[17];
    const std::uint64_t pageSize = pageSizeField == 1 ? 65536u : pageSizeField;
    const std::uint32_t pages = bigEndian32(header + 28);
    const bool pagesValid = bigEndian32(header + 92) == bigEndian32(header + 24) && pages > 0;
    fs::path wal = path;
    wal += "-wal";
    const bool walHasContent = fs::exists(wal, ec) && fs::file_size(wal, ec) > 0;
    const auto size = fs::file_size(path, ec);
    if (!ec && pagesValid && !walHasContent && pageSize > 0 && size < pageSize * pages)
        return fileProblem(path, code::kStoreDamaged,
                           "damaged: the file is cut short (" + std::to_string(size) + " bytes of " +
                               std::to_string(pageSize * pages) + ")",
                           "The file was left unchanged; restore it from a backup.");
    return std::nullopt;
}

}  // namespace tl::store::detail
