// SHA-256 (FIPS 180-4, Secure Hash Standard, NIST 2015): the fingerprint a report gives
// of the project file it was made from, so a reader can tell which file it describes.
// Checked against the standard's "abc" example and Python's hashlib (tests/core/io).
#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <string_view>

namespace tl {

// 64 lower-case hexadecimal digits.
std::string sha256Hex(std::string_view bytes);
// The file's digest, or nothing when it cannot be read.
std::optional<std::string> fileSha256(const std::filesystem::path& path);

}  // namespace tl
