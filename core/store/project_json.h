// JSON view of a project (`tledger export --format json`): the project information and,
// per scenario, its inputs (compartments with values and data confidence, diet, diet
// import, detritus routing, fleets and their catch, flow-map layout). Empty values are
// null. Callers may add members per scenario (the CLI adds the solve result), so
// that this library stays independent of the solver.
//
// Keys are stable (add keys, never rename), like the other JSON contracts of DESIGN 5.3.
#pragma once

#include <functional>
#include <string>
#include <utility>
#include <vector>

#include "core/store/project.h"

namespace tl {

struct ProjectJsonOptions {
    // created/modified/program version stamps; off when comparing content (the
    // sample-project drift test compares two files made at different times).
    bool timestamps = true;
    // Written as "notice" at the top when not empty (the decision-support sentence
    // every exported result carries).
    std::string notice;
};

// Extra members of one scenario's object: key and an already valid JSON value.
using JsonMembers = std::vector<std::pair<std::string, std::string>>;
using ScenarioJsonExtras = std::function<JsonMembers(const Scenario&)>;

std::string projectJson(const Project& project, const ProjectJsonOptions& options = {},
                        const ScenarioJsonExtras& extras = {});

// The inputs of one model as a JSON object (also used per scenario above).
std::string modelInputsJson(const Model& model);

}  // namespace tl
