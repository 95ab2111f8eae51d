// One-click fixes (issue 13): for a problem whose remedy leaves nothing to choose, a
// sentence saying what the fix does (the undo text) and the corrected model. Only these:
//   diet-sum       a diet that sums to s > 0 is scaled by 1/s, import included, so the
//                  shares keep their proportions (DC_ij are shares of j's diet, summing
//                  to 1: Christensen & Pauly 1992);
//   routing-sum, routing-to-non-detritus
//                  with ONE detritus pool: all of the source's detritus goes to it;
//                  with several: an explicit row over pools summing to s > 0 is scaled by 1/s;
//   discard-pool-not-detritus
//                  with ONE detritus pool: the fleet's discards go to it.
// Anything else (an empty diet, a share outside 0..1, two pools to choose from for a bad
// entry) needs a person: no fix is offered.
#pragma once

#include <optional>
#include <string>

#include "core/model/model.h"
#include "core/model/problem.h"

namespace tl {

// What the fix would do ("Scale the diet of Pike so that it sums to 1"), or nothing when
// the problem has no unambiguous fix. Cheap: the model is not copied.
std::optional<std::string> fixLabel(const Model& model, const Problem& problem);

struct ProblemFix {
    std::string label;
    Model fixed;
};
std::optional<ProblemFix> unambiguousFix(const Model& model, const Problem& problem);

}  // namespace tl
