// PRCC over an ensemble (issue 15 point 3; DESIGN 3.7): the kept balanced draws of
// core/ensemble turned into the input matrix prcc.h expects, and PRCC of the chosen
// outputs on it.
//
// One diet share per drawn diet row is left out of the inputs. A row's shares sum to its
// entered total in every draw, so each share is an exact linear function of the others:
// with two shares their ranks are exactly reversed (rank x2 = n + 1 - rank x1) and the
// step-1 rank regression of either on the rest is singular; with more, the ranks are
// nearly collinear and the coefficients unstable. Leaving one out makes the design full
// rank; the effect of the share left out is carried by the row's other shares (a rise of
// any of them is a fall of the rest). The share left out is the row's last: import when
// the row has import, else its last prey. Its name is reported.
#pragma once

#include <string>
#include <vector>

#include "core/ensemble/ensemble.h"
#include "core/sensitivity/prcc.h"

namespace tl {

struct EnsemblePrcc {
    PrccTable table;
    std::vector<std::string> leftOut;  // the diet share left out of each drawn row
};

// PRCC of each output named in `outputs` (in that order; names the draws lack are skipped;
// all of kept.outputNames when empty) against the drawn inputs, one share per diet row
// left out.
EnsemblePrcc prccOfKeptDraws(const ensemble::KeptDraws& kept, const std::vector<std::string>& outputs = {});

}  // namespace tl
