#include "core/store/project.h"

#include <chrono>
#include <ctime>

namespace tl {

Scenario* Project::findScenario(std::string_view name)
{
    for (Scenario& s : scenarios)
        if (s.name == name) return &s;
    return nullptr;
}

const Scenario* Project::findScenario(std::string_view name) const
{
    for (const Scenario& s : scenarios)
        if (s.name == name) return &s;
    return nullptr;
}

std::vector<std::string> Project::scenarioNames() const
{
    std::vector<std::string> names;
    names.reserve(scenarios.size());
    for (const Scenario& s : scenarios) names.push_back(s.name);
    return names;
}

std::string utcNowIso8601()
{
    const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
    std::tm utc{};
    gmtime_r(&now, &utc);
    char text[32];
    std::strftime(text, sizeof text, "%Y-%m-%dT%H:%M:%SZ", &utc);
    return text;
}

}  // namespace tl
