#include "core/fieldwork/apply_estimate.h"

#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

Problem targetProblem(const std::string& compartment, std::string message)
{
    Problem p;
    p.code = code::kFieldworkTarget;
    p.compartment = compartment;
    p.message = std::move(message);
    return p;
}

}  // namespace

Problems prepareForParameter(const Model& model, std::size_t compartment, Param param, Estimate& e,
                             const ConversionFactors& factors)
{
    Problems problems;
    const Compartment& c = model.compartment(compartment);
    if (param == Param::Biomass) {
        const auto unit = parseBiomassUnit(model.units, problems);
        if (!unit) return problems;
        const BiomassUnit from = tonnesWetWeightPerKm2();
        auto convert = [&](double v) { return convertBiomass(v, from, *unit, factors); };
        e.value = convert(e.value);
        if (e.ciLow) e.ciLow = convert(*e.ciLow);
        if (e.ciHigh) e.ciHigh = convert(*e.ciHigh);
        e.unit = model.units.biomass();
        if (const std::string note = conversionNote(from.currency, unit->currency, factors); !note.empty())
            e.assumptions.push_back("converted from wet weight with " + note);
    } else if (param == Param::PB && e.quantity == "M") {
        const auto& b = c.value(Param::Biomass);
        if (!b || !(*b > 0.0)) {
            problems.push_back(targetProblem(c.name, "P/B = M + F needs the biomass of " + c.name +
                                                         " to work out F = catch / B; give B first"));
            return problems;
        }
        const double m = e.value, f = model.totalCatch(compartment) / *b;
        e.quantity = "P/B";
        e.value = m + f;
        e.inputs.push_back(labelled("M", m, "/year"));
        e.inputs.push_back(labelled("F = catch / B =", f, "/year (from the scenario)"));
        e.assumptions.push_back("P/B = Z = M + F at steady state (Allen 1971)");
        // M's spread carries over unchanged (F taken as known): the SD stays, the CV
        // shrinks by M / (M + F), the interval shifts by F.
        if (e.cv) {
            e.cv = *e.cv * m / (m + f);
            e.assumptions.push_back("F taken as known: the CV is that of M, rescaled to M + F");
        }
        if (e.ciLow) e.ciLow = *e.ciLow + f;
        if (e.ciHigh) e.ciHigh = *e.ciHigh + f;
    }
    return problems;
}

Problems applyEstimate(Model& model, std::size_t compartment, Param param, Estimate e, const std::string& date,
                       const ConversionFactors& factors, Estimate* written)
{
    Problems problems = prepareForParameter(model, compartment, param, e, factors);
    if (hasErrors(problems)) return problems;
    problems = writeEstimate(model, compartment, param, e, date);
    if (written && !hasErrors(problems)) *written = e;
    return problems;
}

Problems applyDiet(Model& model, std::string& description, std::size_t predator, const StomachDiet& diet,
                   const std::string& date)
{
    Problems problems;
    const Compartment& c = model.compartment(predator);
    if (c.kind != CompartmentKind::Consumer) {
        problems.push_back(targetProblem(c.name, c.name + " is not a consumer; only consumers have a diet"));
        return problems;
    }
    if (!diet.valid) {
        problems.push_back(targetProblem(c.name, "there is no usable diet to write for " + c.name));
        return problems;
    }
    for (const PreyShare& s : diet.shares)
        if (s.prey != "import" && !model.indexOf(s.prey))
            problems.push_back(targetProblem(c.name, "the diet names prey '" + s.prey +
                                                         "', which the scenario does not have"));
    if (hasErrors(problems)) return problems;
    const std::vector<GridEntry> old(model.dietRow(predator).begin(), model.dietRow(predator).end());
    for (const GridEntry& g : old) model.setDiet(predator, g.col, 0.0);
    model.setDietImport(predator, 0.0);
    for (const PreyShare& s : diet.shares) {
        if (s.prey == "import") model.setDietImport(predator, s.share);
        else model.setDiet(predator, *model.indexOf(s.prey), s.share);
    }
    // The row's data confidence: the grade from the number of stomachs, and the bootstrap
    // CV of the largest share, the share the ensemble's Dirichlet concentration is set by
    // (core/ensemble/input_distribution.h, DirichletRow::concentrationFor).
    Confidence rowConfidence;
    rowConfidence.grade = diet.grade;
    if (!diet.shares.empty() && diet.shares.front().cv > 0.0) rowConfidence.cv = diet.shares.front().cv;
    rowConfidence.source = "fieldwork " + date + ": " + std::to_string(diet.stomachs - diet.emptyStomachs) +
                           " stomachs with food, " + diet.method;
    model.compartment(predator).dietConfidence = rowConfidence;
    description += (description.empty() ? "" : "; ") + dietNote(diet, date);
    return problems;
}

}  // namespace tl::fieldwork
