// Reading a model from a path: the one rule for the MODEL argument of every tledger
// command and for the workbench's Open (DESIGN.md 5.2).
//
//   a folder  is a CSV model folder (DESIGN.md 5.1), read as a project of one scenario.
//             That scenario is named after the folder, or `scenario` when given (a CSV
//             folder has no names of its own, so the name is never ignored: it is the
//             name exports and imports give the scenario).
//   a file    is a .tledger project. `scenario` picks one scenario: the project keeps
//             only it and its stored runs; a name the project lacks is an error that
//             lists the names it has. Without `scenario` every scenario is kept.
//
// Nothing throws; a path that is neither is an error naming it.
#pragma once

#include <filesystem>
#include <optional>
#include <string>

#include "core/model/problem.h"
#include "core/store/project.h"
#include "core/store/project_file.h"

namespace tl {

struct ModelSourceOptions {
    std::optional<std::string> scenario;   // see the rule above; blank counts as not given
    OpenMode mode = OpenMode::ReadOnly;    // ReadWrite migrates an older project file in place
};

struct ModelSource {
    std::optional<Project> project;  // empty when the path cannot be used
    Problems problems;               // why not, or the reader's warnings
    bool csvFolder = false;          // the path was a CSV model folder
    bool readOnly = false;           // a project file that can only be read (asked for, newer schema, no permission)
    std::string readOnlyReason;      // why, when it was not asked for
};

ModelSource readModelSource(const std::filesystem::path& path, const ModelSourceOptions& options = {});

// The one scenario of a path: the named one, or the only one. A project of several
// scenarios and no name is an error listing them.
StoreResult<Scenario> readScenarioSource(const std::filesystem::path& path, const std::optional<std::string>& scenario);

}  // namespace tl
