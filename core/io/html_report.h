// The HTML report of a project (`tledger export --format html`): plain and
// self-contained, per scenario its balance status, balance sheet and problems. Solved
// values are marked *, status is in words (no colour needed), and the decision-support
// notice stands under the title.
#pragma once

#include <string>

#include "core/store/project.h"

namespace tl {

std::string htmlReport(const Project& project);

}  // namespace tl
