#include "core/model/problem.h"

#include <algorithm>

namespace tl {

std::string_view severityKey(Severity s)
{
    switch (s) {
    case Severity::Error: return "error";
    case Severity::Warning: return "warning";
    case Severity::Info: return "info";
    }
    return "error";
}

std::string Problem::describe() const
{
    if (!location) return message;
    std::string out = location->file;
    if (location->line > 0) {
        out += ':' + std::to_string(location->line);
        if (location->column > 0) out += ':' + std::to_string(location->column);
    }
    return out + ": " + message;
}

bool hasErrors(const Problems& problems)
{
    return std::any_of(problems.begin(), problems.end(),
                       [](const Problem& p) { return p.severity == Severity::Error; });
}

}  // namespace tl
