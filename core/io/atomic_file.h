// Atomic file replacement: the content goes to a temporary file beside the target,
// is flushed to disk, and is then renamed over the target. A reader (or a crash)
// sees either the old file or the new one, never a half-written mix. This relies on
// rename() within one directory being atomic (POSIX; NTFS for same-volume renames).
#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <string_view>

namespace tl {

// Returns an empty optional on success, otherwise a sentence saying what failed
// (the target is then untouched and no temporary file is left behind).
std::optional<std::string> writeFileAtomically(const std::filesystem::path& target, std::string_view content);

// A fresh hidden name beside `target` in the same folder (so that a rename onto the
// target is atomic), for writers that build a file or folder before renaming it in.
std::filesystem::path temporaryBeside(const std::filesystem::path& target);

}  // namespace tl
