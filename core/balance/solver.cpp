// Mass-balance solver (Polovina 1984; Christensen & Pauly 1992): plan + numeric step
// (balance_plan.cpp), then the checks of DESIGN.md 3.2, the derived outputs and the
// trophic levels (Pauly et al. 1993 for the omnivory index).
#include "core/balance/solver.h"

#include <algorithm>
#include <cmath>
#include <charconv>
#include <set>
#include <string>

#include <Eigen/SVD>

#include "core/balance/balance_codes.h"
#include "core/balance/balance_plan.h"
#include "core/balance/production_uses.h"
#include "core/balance/trophic_level.h"

namespace tl {
namespace {

// As printf's %.4g (std::to_chars in general format is specified to match it), without
// printf's cost: the checks of a large model format thousands of numbers.
std::string num(double v)
{
    char buf[32];
    const auto end = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::general, 4).ptr;
    return std::string(buf, end);
}

using code::makeProblem;

// The given values of row i (NaN where not given), from the numeric inputs: defaults
// (U, catch, E, BA) as BalanceInputs::assign applies them, Y = landings + dead discards.
void fillGivenRow(const Compartment& c, const BalanceInputs& in, std::size_t i, CompartmentBalance& row)
{
    const auto k = static_cast<Eigen::Index>(i);
    row.name = c.name;
    row.kind = c.kind;
    row.biomass = in.biomass[k];
    row.biomassAccum = in.biomassAccum[k];
    if (c.isLiving()) {
        row.pb = in.pb[k];
        row.ee = in.ee[k];
        row.unassim = in.unassim[k];
        row.catchTotal = in.catchTotal[k];
        row.netEmigration = in.netEmigration[k];
    }
    if (c.kind == CompartmentKind::Consumer) {
        row.qb = in.qb[k];
        row.pq = in.pq[k];
    }
}

// TL and OI of row i, and the warning of a level that is set or undefined.
void fillTrophicLevel(const TrophicLevels& levels, std::size_t i, CompartmentBalance& row, Problems& problems)
{
    const auto k = static_cast<Eigen::Index>(i);
    row.tl = levels.tl[k];
    row.oi = levels.oi[k];
    const std::string& name = row.name;
    if (levels.note[i] == TrophicLevelNote::NoModelledPrey)
        problems.push_back(makeProblem(code::kTLFromImport, Severity::Warning, name, "diet",
                                       "'" + name + "' eats no modelled compartment (all import or empty "
                                       "diet); its trophic level is set to 2.",
                                       "Check its diet row."));
    else if (levels.note[i] == TrophicLevelNote::Undefined)
        problems.push_back(makeProblem(code::kTLUndefined, Severity::Warning, name, "diet",
                                       "'" + name + "' feeds (directly or through its prey) on a loop of "
                                       "consumers that never reaches a producer or detritus; its trophic "
                                       "level is undefined.",
                                       "Give one compartment of the loop some producer or detritus food."));
}

std::string unknownSymbol(Unknown u)
{
    switch (u) {
    case Unknown::Biomass: return "B";
    case Unknown::PB: return "P/B";
    case Unknown::QB: return "Q/B";
    case Unknown::EE: return "EE";
    case Unknown::QBTiedPB: return "Q/B (with P/B = P/Q Q/B)";
    case Unknown::None: break;
    }
    return "";
}

std::string_view unknownKey(Unknown u)
{
    switch (u) {
    case Unknown::Biomass: return paramKey(Param::Biomass);
    case Unknown::PB: return paramKey(Param::PB);
    case Unknown::QB:
    case Unknown::QBTiedPB: return paramKey(Param::QB);
    case Unknown::EE: return paramKey(Param::EE);
    case Unknown::None: break;
    }
    return "";
}

// Names the compartments whose unknowns a singular system cannot determine:
//  - a private unknown (EE, P/B) whose coefficient B P/B or B EE is 0;
//  - the support of the reduced system's null space (coupled unknowns, from the SVD
//    of the equilibrated C2), and the private unknowns of the prey those enter;
//  - when the full system is square, the equations with no unknown left to close them.
void reportSingular(const Model& model, const BalancePlan& plan, const BalanceValues& given,
                    const BalanceWorkspace& ws, BalanceSheet& sheet)
{
    std::set<std::size_t> involved;
    for (std::size_t i : plan.privateUnknowns()) {
        const auto ii = static_cast<Eigen::Index>(i);
        const double other = plan.unknownOf(i) == Unknown::EE ? given.pb[ii] : given.ee[ii];
        const double coefficient = given.biomass[ii] * other;
        if (!(coefficient != 0.0) || !std::isfinite(coefficient)) involved.insert(i);
    }
    const std::vector<std::size_t>& coupled = plan.coupledUnknowns();
    if (!coupled.empty()) {
        const bool dense = plan.method() == BalancePlan::Method::DenseLU || plan.method() == BalancePlan::Method::DenseQR;
        const Eigen::MatrixXd a = dense ? ws.a : Eigen::MatrixXd(ws.sparseA);  // equilibrated C2
        const auto k = static_cast<Eigen::Index>(coupled.size());
        Eigen::VectorXd sigma;  // empty when C2 has no row: every column is in the null space
        Eigen::MatrixXd v = Eigen::MatrixXd::Identity(k, k);
        if (a.rows() > 0 && k <= 200) {
            Eigen::JacobiSVD<Eigen::MatrixXd> svd(a, Eigen::ComputeFullV);
            sigma = svd.singularValues();
            v = svd.matrixV();
        } else if (a.rows() > 0) {
            Eigen::BDCSVD<Eigen::MatrixXd> svd(a, Eigen::ComputeFullV);
            sigma = svd.singularValues();
            v = svd.matrixV();
        }
        const double tol = BalancePlan::kSingularConditioning * 1e3 * (sigma.size() ? sigma[0] : 0.0);
        std::set<std::size_t> undetermined;
        for (Eigen::Index s = 0; s < k; ++s) {
            if (s < sigma.size() && sigma[s] > tol) continue;
            for (Eigen::Index c = 0; c < k; ++c)
                if (std::abs(v(c, s)) > 1e-6) undetermined.insert(coupled[static_cast<std::size_t>(c)]);
        }
        involved.insert(undetermined.begin(), undetermined.end());
        for (std::size_t j : undetermined)  // their consumption leaves their prey's EE or P/B open too
            for (const auto& [prey, dc] : model.dietRow(j))
                if (dc != 0.0 && (plan.unknownOf(prey) == Unknown::EE || plan.unknownOf(prey) == Unknown::PB))
                    involved.insert(prey);
        if (plan.fullSystemIsSquare()) {
            for (std::size_t r = 0; r < plan.reducedRows().size(); ++r)
                if (a.row(static_cast<Eigen::Index>(r)).cwiseAbs().maxCoeff() == 0.0) involved.insert(plan.reducedRows()[r]);
            for (std::size_t i = 0; i < model.size(); ++i)
                if (plan.rowOf(i) >= 0 && plan.reducedRowOf(i) < 0 && plan.unknownOf(i) != Unknown::EE &&
                    plan.unknownOf(i) != Unknown::PB)
                    involved.insert(i);  // an equation no unknown enters
        }
    }
    if (involved.empty())  // numerically singular without a clear support: name every unknown
        for (std::size_t c = 0; c < plan.unknownCount(); ++c) involved.insert(plan.compartmentOfColumn(c));
    std::string what;
    for (std::size_t i : involved) {
        if (!what.empty()) what += ", ";
        const std::string sym = unknownSymbol(plan.unknownOf(i));
        what += "'" + model.compartment(i).name + "'" + (sym.empty() ? " (no unknown)" : " (" + sym + ")");
    }
    for (std::size_t i : involved)
        sheet.problems.push_back(makeProblem(
            code::kSingularSystem, Severity::Error, model.compartment(i).name,
            unknownKey(plan.unknownOf(i)),
            "The balance equations cannot determine the unknowns of " + what +
                ": they depend on each other (singular system).",
            "Enter one of these values instead of solving for it."));
}

ParamSet solvedParams(Unknown u, PqStandIn s)
{
    ParamSet out;
    if (s == PqStandIn::PBFromPQ) out.insert(Param::PB);
    if (s == PqStandIn::QBFromPQ) out.insert(Param::QB);
    switch (u) {
    case Unknown::Biomass: out.insert(Param::Biomass); break;
    case Unknown::PB: out.insert(Param::PB); break;
    case Unknown::QB: out.insert(Param::QB); break;
    case Unknown::EE: out.insert(Param::EE); break;
    case Unknown::QBTiedPB:
        out.insert(Param::PB);
        out.insert(Param::QB);
        break;
    case Unknown::None: break;
    }
    return out;
}

void fillLiving(const BalancePlan& plan, const BalanceValues& v, std::size_t i,
                CompartmentBalance& row)
{
    const auto k = static_cast<Eigen::Index>(i);
    const bool consumer = row.kind == CompartmentKind::Consumer;
    row.solved = solvedParams(plan.unknownOf(i), plan.pqStandInOf(i));
    row.biomass = v.biomass[k];
    row.pb = v.pb[k];
    row.ee = v.ee[k];
    row.production = v.production[k];
    row.predation = v.predation[k];
    row.flowToDetritus = v.flowToDetritus[k];
    row.residual = v.residual[k];
    row.z = row.pb;
    row.m0 = row.pb * (1.0 - row.ee);
    if (row.biomass > 0.0) {
        row.m2 = row.predation / row.biomass;
        row.f = row.catchTotal / row.biomass;
    }
    if (consumer) {
        row.qb = v.qb[k];
        row.consumption = v.consumption[k];
        row.egestion = row.unassim * row.consumption;
        row.respiration = row.consumption * (1.0 - row.unassim) - row.production;
        if (row.qb != 0.0) row.pq = row.pb / row.qb;
        const double assimilated = row.consumption * (1.0 - row.unassim);
        if (assimilated != 0.0) row.netEfficiency = row.production / assimilated;
        if (row.biomass > 0.0) row.rb = row.respiration / row.biomass;
        if (row.respiration != 0.0) row.pr = row.production / row.respiration;
    } else {
        row.egestion = 0.0;
    }
}

void checkLiving(const Model& model, const BalancePlan& plan, std::size_t i, const BalanceSheet& sheet,
                 const BalanceValues& v, const PredatorIndex& predators, Problems& problems)
{
    const auto k = static_cast<Eigen::Index>(i);
    const Compartment& c = model.compartment(i);
    const CompartmentBalance& row = sheet.rows[i];
    const BalanceRules& rules = model.rules;
    const std::string& name = row.name;

    for (Param p : row.solved) {
        const double value = p == Param::Biomass ? row.biomass : p == Param::PB ? row.pb : p == Param::QB ? row.qb : row.ee;
        if (value < 0.0)
            problems.push_back(makeProblem(code::kNegativeSolvedValue, Severity::Error, name, paramKey(p),
                                       "Solved " + std::string(paramSymbol(p)) + " of '" + name + "' is negative (" +
                                           num(value) + ").",
                                       "Predation and catch on '" + name +
                                           "' are inconsistent with its other inputs; check its predators' diets."));
    }
    if (row.ee > rules.eeMax + kBoundTolerance) {
        // Name the largest takers, so the modeller knows which diet or catch to look at.
        const std::string largest = describeLargestUses(productionUses(model, sheet, i, predators));
        problems.push_back(makeProblem(code::kEEAboveMax, Severity::Error, name, "ee",
                                   "EE of '" + name + "' is " + num(row.ee) + ", above " + num(rules.eeMax) +
                                       ": predation, catch, net emigration and accumulation take more than it produces" +
                                       (largest.empty() ? std::string(".") : " (share of its production: " + largest + ")."),
                                   "Raise its B or P/B, or lower its predators' consumption of it or its catch."));
    }
    if (std::abs(v.residual[k]) > kResidualTolerance * v.residualScale[k]) {
        const bool fullyGiven = plan.unknownOf(i) == Unknown::None;
        std::string message = "The balance equation of '" + name + "' does not close: B P/B EE minus (predation + "
                              "catch + E + BA) = " + num(v.residual[k]) + " " + model.units.flow() + ".";
        if (fullyGiven && row.production > 0.0)
            message += " The EE that would close it is " +
                       num((v.predation[k] + row.catchTotal + row.netEmigration + row.biomassAccum) / row.production) +
                       ".";
        problems.push_back(makeProblem(code::kEquationResidual, Severity::Error, name, fullyGiven ? "ee" : "",
                                   std::move(message),
                                   fullyGiven ? "Leave one of its B, P/B, Q/B or EE empty so that it is solved."
                                              : "The equations are inconsistent; see the other residuals."));
    }
    if (row.kind != CompartmentKind::Consumer) return;
    if (row.respiration < -kBoundTolerance * std::abs(row.consumption))
        problems.push_back(makeProblem(code::kNegativeRespiration, Severity::Error, name, "qb",
                                   "Respiration of '" + name + "' is negative (" + num(row.respiration) + " " + model.units.flow() +
                                       "): it produces more than it assimilates.",
                                   "Raise its Q/B or lower its P/B or U."));
    if (row.pq < rules.pqMin || row.pq > rules.pqMax)
        problems.push_back(makeProblem(code::kPQOutOfRange, Severity::Warning, name, "pq",
                                   "P/Q of '" + name + "' is " + num(row.pq) + ", outside the usual range " +
                                       num(rules.pqMin) + " to " + num(rules.pqMax) + " (rule of thumb).",
                                   "Check its P/B and Q/B."));
    if (c.value(Param::PQ) && c.value(Param::PB) && c.value(Param::QB) && *c.value(Param::QB) != 0.0) {
        const double implied = *c.value(Param::PB) / *c.value(Param::QB);
        if (std::abs(implied - *c.value(Param::PQ)) > 1e-6 * std::abs(*c.value(Param::PQ)))
            problems.push_back(makeProblem(code::kPQInconsistent, Severity::Warning, name, "pq",
                                       "Given P/Q of '" + name + "' (" + num(*c.value(Param::PQ)) +
                                           ") differs from its P/B / Q/B (" + num(implied) + "); P/B and Q/B are used.",
                                       "Leave P/Q empty, or leave P/B or Q/B empty so that P/Q stands in."));
    }
}

}  // namespace

namespace {

// The rows in one pass: given values, trophic levels (with their warnings) and, when
// `solved` is given, the solved values and derived outputs.
void fillRows(const Model& model, const BalancePlan& plan, const BalanceInputs& in, const TrophicLevels& levels,
              const BalanceValues* solved, BalanceSheet& sheet)
{
    // Copies of one blank row: value-initialising each would zero it before setting its NaNs.
    const CompartmentBalance blank;
    sheet.rows.assign(model.size(), blank);
    for (std::size_t i = 0; i < model.size(); ++i) {
        CompartmentBalance& row = sheet.rows[i];
        fillGivenRow(model.compartment(i), in, i, row);
        fillTrophicLevel(levels, i, row, sheet.problems);
        if (!solved) continue;
        if (row.kind != CompartmentKind::Detritus) {
            fillLiving(plan, *solved, i, row);
            continue;
        }
        const auto k = static_cast<Eigen::Index>(i);
        row.solved = {Param::EE};
        row.ee = solved->detritusEE[k];
        row.predation = solved->predation[k];
        row.detritusInflow = solved->detritusInflow[k];
        row.detritusConsumption = solved->predation[k];
        row.detritusExport = solved->detritusExport[k];
    }
}

// The checks of DESIGN 3.2 on a sheet whose rows fillRows filled with solved values.
void checkSolvedSheet(const Model& model, const BalancePlan& plan, const BalanceValues& values, BalanceSheet& sheet)
{
    sheet.conditioning = values.conditioning;
    if (values.conditioning < kIllConditioned)
        sheet.problems.push_back(makeProblem(code::kIllConditioned, Severity::Warning, "", "",
                                         "The balance equations are nearly singular (conditioning " +
                                             num(values.conditioning) + "): solved values are sensitive to the inputs.",
                                         "Give directly some of the values being solved."));

    // The checks of one compartment read its predators' consumption: every row is filled first.
    bool anyEEAboveMax = false;
    for (const CompartmentBalance& row : sheet.rows)
        anyEEAboveMax = anyEEAboveMax || (row.kind != CompartmentKind::Detritus && row.ee > model.rules.eeMax + kBoundTolerance);
    PredatorIndex predators;  // only read for an EE above its maximum
    if (anyEEAboveMax) predators = predatorIndex(model);
    for (std::size_t i = 0; i < model.size(); ++i) {
        const CompartmentBalance& row = sheet.rows[i];
        if (row.kind == CompartmentKind::Detritus) {
            if (row.ee > 1.0 + kBoundTolerance || std::isnan(row.ee))
                sheet.problems.push_back(makeProblem(
                    code::kDetritusEEAboveOne, Severity::Error, row.name, "ee",
                    "Detritus pool '" + row.name + "' is consumed beyond its inflow (consumption " +
                        num(row.detritusConsumption) + ", inflow " + num(row.detritusInflow) + " " +
                        model.units.flow() + ").",
                    "Lower the detritus share in its consumers' diets, or add a detritus import."));
            continue;
        }
        checkLiving(model, plan, i, sheet, values, predators, sheet.problems);
    }
    sheet.status = hasErrors(sheet.problems) ? BalanceStatus::Unbalanced : BalanceStatus::Balanced;
}

// Producers and detritus pools are the basal nodes of the trophic levels.
void computeLevels(const Model& model, const BalanceInputs& in, BalanceScratch& scratch)
{
    scratch.basal.resize(model.size());
    for (std::size_t i = 0; i < model.size(); ++i) scratch.basal[i] = model.compartment(i).kind != CompartmentKind::Consumer;
    computeTrophicLevels(in.diet, scratch.basal, scratch.levelWork, scratch.levels);
}

}  // namespace

BalanceSheet balanceSheetFromValues(const Model& model, const BalancePlan& plan, const BalanceValues& values)
{
    BalanceScratch scratch;
    scratch.inputs.assign(model);
    computeLevels(model, scratch.inputs, scratch);
    BalanceSheet sheet;
    sheet.problems = plan.problems();
    fillRows(model, plan, scratch.inputs, scratch.levels, &values, sheet);
    checkSolvedSheet(model, plan, values, sheet);
    return sheet;
}

BalanceSheet solveBalance(const Model& model)
{
    // Up to this many compartments the buffers are kept between calls, one set per
    // thread: allocating them is a large share of a small solve (the GUI re-solves after
    // every edit), a negligible one of a large solve whose buffers are not worth holding
    // on to. This project's choice.
    constexpr std::size_t kKeepBuffersUpTo = 1000;
    if (model.size() > kKeepBuffersUpTo) {
        BalanceScratch scratch;
        return solveBalance(model, scratch);
    }
    thread_local BalanceScratch kept;
    return solveBalance(model, kept);
}

BalanceSheet solveBalance(const Model& model, BalanceScratch& scratch)
{
    scratch.plan.rebuild(model);
    scratch.inputs.assign(model);
    computeLevels(model, scratch.inputs, scratch);
    const BalancePlan& plan = scratch.plan;
    const BalanceInputs& inputs = scratch.inputs;
    BalanceSheet sheet;
    sheet.problems = plan.problems();
    if (plan.hasStructuralErrors()) {
        fillRows(model, plan, inputs, scratch.levels, nullptr, sheet);
        sheet.status = BalanceStatus::Invalid;
        return sheet;
    }
    plan.sizeWorkspace(scratch.workspace);
    plan.sizeValues(scratch.values);
    const BalanceValues& values = scratch.values;
    plan.solve(inputs, scratch.workspace, scratch.values);
    if (values.status == NumericStatus::Singular) {
        fillRows(model, plan, inputs, scratch.levels, nullptr, sheet);
        sheet.conditioning = values.conditioning;
        reportSingular(model, plan, values, scratch.workspace, sheet);
        sheet.status = BalanceStatus::Invalid;
        return sheet;
    }
    fillRows(model, plan, inputs, scratch.levels, &values, sheet);
    checkSolvedSheet(model, plan, values, sheet);
    return sheet;
}

}  // namespace tl
