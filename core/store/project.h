// Project: the in-memory content of one .tledger file (DESIGN.md 2, 4): project
// information, its scenarios (each a full Model plus flow-map layout) and stored runs
// (settings and summary of ensemble / reconcile runs, kept for later reports).
// Plain data; reading and writing the file is project_file.h.
#pragma once

#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/model/model.h"

namespace tl {

struct ProjectInfo {
    std::string title;
    // The project's units and check rules. Every scenario's Model carries a copy: the
    // loader sets it from here, and a save writes these values (not the scenarios').
    Units units;
    BalanceRules rules;
    std::string notes;
    std::string created;         // ISO 8601 UTC, e.g. "2026-12-02T04:10:00Z"
    std::string modified;        // set by every save
    std::string programVersion;  // version of the program that last saved the file

    bool operator==(const ProjectInfo&) const = default;
};

// Position of a compartment's box on the flow map, in the map's own coordinates.
struct LayoutPosition {
    double x = 0.0;
    double y = 0.0;
    bool operator==(const LayoutPosition&) const = default;
};

struct Scenario {
    std::string name;         // unique within the project; non-empty after trimming
    std::string description;
    std::string parent;       // name of the scenario it was derived from, or empty
    std::string created;      // ISO 8601 UTC
    Model model;
    std::map<std::string, LayoutPosition> layout;  // by compartment name; may be partial

    bool operator==(const Scenario&) const = default;
};

// A kept result of a long run (ensemble, reconcile, ...): what was asked and what came
// out, both as JSON text the store does not interpret.
struct StoredRun {
    std::int64_t id = 0;      // assigned by the file on insert
    std::string scenario;     // scenario it was run on, or empty
    std::string kind;         // "ensemble", "reconcile", ...
    std::string settingsJson;
    std::string summaryJson;
    std::string created;      // ISO 8601 UTC

    bool operator==(const StoredRun&) const = default;
};

struct Project {
    ProjectInfo info;
    std::vector<Scenario> scenarios;  // in the order the user sees them
    std::vector<StoredRun> runs;

    Scenario* findScenario(std::string_view name);
    const Scenario* findScenario(std::string_view name) const;
    std::vector<std::string> scenarioNames() const;

    bool operator==(const Project&) const = default;
};

// Current UTC time as ISO 8601 with seconds ("2026-12-02T04:10:00Z").
std::string utcNowIso8601();

}  // namespace tl
