#include "core/model/problem_fixes.h"

#include <vector>

#include "core/model/problem_codes.h"

namespace tl {
namespace {

// Each helper returns the label when a fix exists, and writes the fix into `out` when
// given (a copy of the model), so that asking for the label costs no copy.
std::optional<std::string> normaliseDiet(const Model& model, std::size_t pred, Model* out)
{
    const Compartment& c = model.compartment(pred);
    const double sum = model.dietRowSum(pred);
    if (c.kind != CompartmentKind::Consumer || !(sum > 0.0)) return std::nullopt;
    if (model.dietImport(pred) < 0.0 || model.dietImport(pred) > 1.0) return std::nullopt;
    for (const auto& [prey, share] : model.dietRow(pred))
        if (share < 0.0 || share > 1.0) return std::nullopt;  // a bad share is not a matter of scale
    if (out) {
        const std::vector<GridEntry> row(model.dietRow(pred).begin(), model.dietRow(pred).end());
        for (const auto& [prey, share] : row) out->setDiet(pred, prey, share / sum);
        out->setDietImport(pred, model.dietImport(pred) / sum);
    }
    return "Scale the diet of " + c.name + " so that it sums to 1";
}

std::optional<std::string> fixRouting(const Model& model, std::size_t source, Model* out)
{
    const std::vector<std::size_t> pools = model.detritusPools();
    const std::string& name = model.compartment(source).name;
    const std::vector<GridEntry> row(model.routingRow(source).begin(), model.routingRow(source).end());
    if (pools.size() == 1) {
        if (out) {
            for (const auto& [target, share] : row) out->setRouting(source, target, 0.0);
            out->setRouting(source, pools.front(), 1.0);
        }
        return "Send all the detritus of " + name + " to " + model.compartment(pools.front()).name;
    }
    double sum = 0.0;
    for (const auto& [target, share] : row) {
        if (model.compartment(target).kind != CompartmentKind::Detritus || share < 0.0 || share > 1.0) return std::nullopt;
        sum += share;
    }
    if (pools.empty() || !(sum > 0.0)) return std::nullopt;
    if (out)
        for (const auto& [target, share] : row) out->setRouting(source, target, share / sum);
    return "Scale the detritus routing of " + name + " so that it sums to 1";
}

std::optional<std::string> fixDiscardPool(const Model& model, const Problem& problem, Model* out)
{
    const auto f = model.fleetIndexOf(problem.fleet);
    const std::vector<std::size_t> pools = model.detritusPools();
    if (!f || pools.size() != 1) return std::nullopt;
    if (out) out->fleet(*f).discardPool = pools.front();
    return "Send the discards of " + problem.fleet + " to " + model.compartment(pools.front()).name;
}

std::optional<std::string> fix(const Model& model, const Problem& problem, Model* out)
{
    const std::string_view c = problem.code;
    if (c == code::kDiscardPool) return fixDiscardPool(model, problem, out);
    const auto i = model.indexOf(problem.compartment);
    if (!i) return std::nullopt;
    if (c == code::kDietSum) return normaliseDiet(model, *i, out);
    if (c == code::kRoutingSum || c == code::kRoutingToLiving) return fixRouting(model, *i, out);
    return std::nullopt;
}

}  // namespace

std::optional<std::string> fixLabel(const Model& model, const Problem& problem) { return fix(model, problem, nullptr); }

std::optional<ProblemFix> unambiguousFix(const Model& model, const Problem& problem)
{
    if (!fixLabel(model, problem)) return std::nullopt;
    ProblemFix result{{}, model};
    result.label = *fix(model, problem, &result.fixed);
    return result;
}

}  // namespace tl
