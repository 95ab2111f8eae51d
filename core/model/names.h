// When two names are the same to a person (issue 13): "Zooplankton" and
// " zooplankton " must not name two compartments, fleets or scenarios.
#pragma once

#include <string>
#include <string_view>

namespace tl {

// Trimmed, runs of white space made one space, ASCII letters lower-cased. Letters
// beyond ASCII are compared as written.
std::string nameKey(std::string_view name);

inline bool sameName(std::string_view a, std::string_view b) { return nameKey(a) == nameKey(b); }

}  // namespace tl
