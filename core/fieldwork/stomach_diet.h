// A predator's diet row from stomach contents (DESIGN.md 3.1, 3.8): the share of each
// prey compartment in the food of one predator compartment, from the weight or volume
// of each prey in each sample (one stomach, or several pooled).
//
// Two published ways to summarise them (both e.g. in Hyslop 1980, J Fish Biol 17:411,
// and Chipps & Garvey 2007; from memory):
//   mean of proportions  p_k = sum_s n_s (a_sk / A_s) / sum_s n_s over non-empty samples s,
//                         with a_sk the amount of prey k, A_s the sample's total and n_s
//                         its number of stomachs: each stomach weighs the same;
//   pooled               p_k = sum_s a_sk / sum_s A_s: each gram weighs the same, so a
//                         few full stomachs dominate.
// Prey taxa mapped to no compartment (unidentified remains, taxa not modelled) are left
// out and the rest renormalised; their share is reported. Prey mapped to `import` go to
// the diet's import column.
//
// Uncertainty: a bootstrap over samples (Efron & Tibshirani 1993; 1000 resamples with
// a fixed seed, so the result is reproducible) gives each share's CV and its percentile
// interval. A confidence grade follows the number of non-empty stomachs: A at 200 or
// more, B at 50, C at 15, D below (this project's own convention, no source).
#pragma once

#include <string>
#include <vector>

#include "core/fieldwork/survey_tables.h"
#include "core/model/compartment.h"
#include "core/model/problem.h"

namespace tl::fieldwork {

enum class DietSummary { MeanOfProportions, Pooled };

struct DietOptions {
    DietSummary summary = DietSummary::MeanOfProportions;
    int bootstrapDraws = 1000;
    unsigned long long seed = 20261202;
    double ciLevel = 0.95;
};

struct PreyShare {
    std::string prey;  // compartment name, or "import"
    double share = 0.0;              // of the chosen summary
    double meanOfProportions = 0.0;  // both summaries, for comparison
    double pooled = 0.0;
    double cv = 0.0, ciLow = 0.0, ciHigh = 0.0;  // bootstrap of the chosen summary
};

struct StomachDiet {
    std::string predator;       // compartment
    DietSummary summary = DietSummary::MeanOfProportions;
    std::vector<PreyShare> shares;  // sorted by share, largest first; sum to 1
    int samples = 0, stomachs = 0, emptyStomachs = 0;
    double leftOutShare = 0.0;  // of the total amount, prey mapped to no compartment
    Confidence::Grade grade = Confidence::Grade::D;
    std::string method;         // for the source note
    double ciLevel = 0.95;      // of the shares' intervals
    bool valid = false;
    Problems problems, warnings;
};

Confidence::Grade gradeFromStomachs(int nonEmptyStomachs);

// `predator` is a compartment: every predator taxon mapped to it is counted. Prey taxa
// the mapping lacks are errors at their cell.
StomachDiet dietFromStomachs(const std::vector<StomachRecord>& records, const TaxonMapping& mapping,
                             const std::string& predator, const DietOptions& options = {});

// One line for a scenario description: "diet of X from N stomachs (method), DATE: prey a
// 0.41 (CV 0.1), ..."
std::string dietNote(const StomachDiet& diet, const std::string& date);

}  // namespace tl::fieldwork
