#include "core/fieldwork/stomach_diet.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <random>

#include "core/fieldwork/estimate.h"
#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

// One sample reduced to amounts per prey compartment (index into the prey list).
struct Sample {
    int stomachs = 1;
    std::vector<double> amount;  // per prey compartment
    double total = 0.0;          // of mapped prey
    double leftOut = 0.0;        // of prey mapped to no compartment
};

// Both summaries over a set of samples (indices, repeats allowed).
void summarise(const std::vector<Sample>& samples, const std::vector<std::size_t>& pick, std::size_t preyCount,
               std::vector<double>& meanOfProportions, std::vector<double>& pooled)
{
    meanOfProportions.assign(preyCount, 0.0);
    pooled.assign(preyCount, 0.0);
    double weight = 0.0, total = 0.0;
    for (std::size_t s : pick) {
        const Sample& x = samples[s];
        if (x.total <= 0.0) continue;
        for (std::size_t k = 0; k < preyCount; ++k) {
            meanOfProportions[k] += x.stomachs * x.amount[k] / x.total;
            pooled[k] += x.amount[k];
        }
        weight += x.stomachs;
        total += x.total;
    }
    for (std::size_t k = 0; k < preyCount; ++k) {
        meanOfProportions[k] = weight > 0.0 ? meanOfProportions[k] / weight : 0.0;
        pooled[k] = total > 0.0 ? pooled[k] / total : 0.0;
    }
}

double quantile(std::vector<double> xs, double q)
{
    std::sort(xs.begin(), xs.end());
    const double pos = q * static_cast<double>(xs.size() - 1);
    const std::size_t lo = static_cast<std::size_t>(std::floor(pos));
    const std::size_t hi = std::min(lo + 1, xs.size() - 1);
    return xs[lo] + (pos - static_cast<double>(lo)) * (xs[hi] - xs[lo]);
}

}  // namespace

Confidence::Grade gradeFromStomachs(int n)
{
    return n >= 200 ? Confidence::Grade::A : n >= 50 ? Confidence::Grade::B : n >= 15 ? Confidence::Grade::C
                                                                                         : Confidence::Grade::D;
}

StomachDiet dietFromStomachs(const std::vector<StomachRecord>& records, const TaxonMapping& mapping,
                             const std::string& predator, const DietOptions& options)
{
    StomachDiet out;
    out.predator = predator;
    out.summary = options.summary;
    out.ciLevel = options.ciLevel;
    std::vector<std::string> prey;  // compartment names in order of first appearance
    std::map<std::string, std::size_t> preyIndex;
    std::map<std::string, std::size_t> sampleIndex;
    std::vector<Sample> samples;
    double leftOut = 0.0, mapped = 0.0;

    for (const StomachRecord& r : records) {
        const auto pred = mapping.compartmentOf.find(r.predator);
        if (pred == mapping.compartmentOf.end()) {
            out.problems.push_back(surveyProblem(code::kSurveyUnknownTaxon, r.predatorCell,
                                                 "predator taxon '" + r.predator + "' is not in the taxon mapping"));
            continue;
        }
        if (pred->second != predator) continue;
        auto [it, added] = sampleIndex.try_emplace(r.sample, samples.size());
        if (added) {
            samples.emplace_back();
            samples.back().stomachs = r.stomachs;
        }
        Sample& s = samples[it->second];
        if (r.prey.empty()) continue;  // an empty stomach
        const auto py = mapping.compartmentOf.find(r.prey);
        if (py == mapping.compartmentOf.end()) {
            out.problems.push_back(surveyProblem(code::kSurveyUnknownTaxon, r.preyCell,
                                                 "prey taxon '" + r.prey + "' is not in the taxon mapping",
                                                 "Add it to taxa.csv; an empty compartment leaves it out of the diet."));
            continue;
        }
        if (py->second.empty()) {
            s.leftOut += r.amount;
            leftOut += r.amount;
            continue;
        }
        const auto [pi, newPrey] = preyIndex.try_emplace(py->second, prey.size());
        if (newPrey) {
            prey.push_back(py->second);
            for (Sample& x : samples) x.amount.resize(prey.size(), 0.0);
        }
        s.amount.resize(prey.size(), 0.0);
        s.amount[pi->second] += r.amount;
        s.total += r.amount;
        mapped += r.amount;
    }
    for (Sample& x : samples) x.amount.resize(prey.size(), 0.0);
    if (hasErrors(out.problems)) return out;

    out.samples = static_cast<int>(samples.size());
    int nonEmpty = 0;
    std::vector<std::size_t> all;
    for (std::size_t s = 0; s < samples.size(); ++s) {
        out.stomachs += samples[s].stomachs;
        if (samples[s].total > 0.0) nonEmpty += samples[s].stomachs;
        else out.emptyStomachs += samples[s].stomachs;
        all.push_back(s);
    }
    if (nonEmpty == 0) {
        Problem p;
        p.code = code::kFieldworkTooFewData;
        p.compartment = predator;
        p.message = samples.empty() ? "no stomach of a taxon mapped to '" + predator + "' is in the file"
                                    : "every stomach of '" + predator + "' is empty (or holds only prey left out)";
        out.problems.push_back(std::move(p));
        return out;
    }
    out.leftOutShare = leftOut / (leftOut + mapped);
    out.grade = gradeFromStomachs(nonEmpty);

    std::vector<double> mop, pooled;
    summarise(samples, all, prey.size(), mop, pooled);
    const bool byMean = options.summary == DietSummary::MeanOfProportions;

    // Bootstrap over samples.
    std::vector<std::vector<double>> draws(prey.size());
    std::mt19937_64 rng(options.seed);
    std::uniform_int_distribution<std::size_t> pickOne(0, samples.size() - 1);
    std::vector<std::size_t> pick(samples.size());
    std::vector<double> bm, bp;
    for (int b = 0; b < options.bootstrapDraws; ++b) {
        for (std::size_t& s : pick) s = pickOne(rng);
        summarise(samples, pick, prey.size(), bm, bp);
        double sum = 0.0;
        for (double v : byMean ? bm : bp) sum += v;
        if (sum <= 0.0) continue;  // a resample of empty stomachs only
        for (std::size_t k = 0; k < prey.size(); ++k) draws[k].push_back((byMean ? bm : bp)[k]);
    }
    const double alpha = (1.0 - options.ciLevel) / 2.0;
    for (std::size_t k = 0; k < prey.size(); ++k) {
        PreyShare s;
        s.prey = prey[k];
        s.meanOfProportions = mop[k];
        s.pooled = pooled[k];
        s.share = byMean ? mop[k] : pooled[k];
        if (!draws[k].empty()) {
            double m = 0.0, ss = 0.0;
            for (double v : draws[k]) m += v;
            m /= static_cast<double>(draws[k].size());
            for (double v : draws[k]) ss += (v - m) * (v - m);
            const double sd = draws[k].size() > 1 ? std::sqrt(ss / static_cast<double>(draws[k].size() - 1)) : 0.0;
            s.cv = s.share > 0.0 ? sd / s.share : 0.0;
            s.ciLow = quantile(draws[k], alpha);
            s.ciHigh = quantile(draws[k], 1.0 - alpha);
        }
        out.shares.push_back(std::move(s));
    }
    std::stable_sort(out.shares.begin(), out.shares.end(),
                     [](const PreyShare& a, const PreyShare& b) { return a.share > b.share; });
    out.method = std::string(byMean ? "mean of proportions" : "pooled") + " of " + std::to_string(nonEmpty) +
                 " non-empty stomachs in " + std::to_string(out.samples) + " samples (bootstrap " +
                 std::to_string(options.bootstrapDraws) + " resamples of samples)";
    if (out.leftOutShare > 0.0) {
        Problem p;
        p.code = code::kFieldworkTooFewData;
        p.severity = Severity::Warning;
        p.compartment = predator;
        p.message = shortNumber(out.leftOutShare * 100) +
                    " % of the stomach contents is prey mapped to no compartment; it is left out and the rest "
                    "renormalised";
        out.warnings.push_back(std::move(p));
    }
    out.valid = true;
    return out;
}

std::string dietNote(const StomachDiet& diet, const std::string& date)
{
    std::string note = "fieldwork " + date + ": diet of " + diet.predator + " from stomach contents, " + diet.method +
                       ", grade " + std::string(gradeKey(diet.grade)) + ":";
    for (const PreyShare& s : diet.shares)
        note += " " + s.prey + " " + shortNumber(s.share) + " (CV " + shortNumber(s.cv) + ");";
    if (diet.leftOutShare > 0.0) note += " left out (unmapped prey) " + shortNumber(diet.leftOutShare * 100) + " %;";
    note.pop_back();
    return note;
}

}  // namespace tl::fieldwork
