#include "core/fieldwork/length_mortality.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/fieldwork/student_t.h"
#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

Problem invalid(const char* code, std::string message)
{
    Problem p;
    p.code = code;
    p.message = std::move(message);
    return p;
}

bool growthOk(const GrowthParameters& g, Problems& problems)
{
    if (g.linfCm > 0.0 && g.k > 0.0 && std::isfinite(g.linfCm) && std::isfinite(g.k)) return true;
    problems.push_back(invalid(code::kFieldworkInvalidInput,
                               "L∞ and K must be positive numbers (L∞ in cm, K per year); found L∞ = " +
                                   shortNumber(g.linfCm) + ", K = " + shortNumber(g.k)));
    return false;
}

void growthInputs(Estimate& e, const GrowthParameters& g)
{
    e.inputs.push_back(labelled("L∞", g.linfCm, "cm"));
    e.inputs.push_back(labelled("K", g.k, "/year"));
    e.assumptions.push_back("growth parameters L∞ and K known exactly (their uncertainty is not in the CV)");
}

}  // namespace

std::vector<LengthClass> classesOf(const std::vector<LengthClass>& all, const std::string& taxon)
{
    std::vector<LengthClass> out;
    for (const LengthClass& c : all)
        if (c.taxon == taxon) out.push_back(c);
    std::sort(out.begin(), out.end(), [](const LengthClass& a, const LengthClass& b) { return a.fromCm < b.fromCm; });
    return out;
}

MeanLengthResult meanLengthZ(const std::vector<LengthClass>& classes, const GrowthParameters& growth,
                             std::optional<double> cutOffCm, double ciLevel)
{
    MeanLengthResult out;
    out.estimate = newEstimate("Z", "/year", ciLevel);
    Estimate& e = out.estimate;
    if (!growthOk(growth, e.problems)) return out;
    if (classes.empty()) {
        e.problems.push_back(invalid(code::kFieldworkTooFewData, "there are no length classes for this taxon"));
        return out;
    }
    if (!cutOffCm) {
        const auto mode = std::max_element(classes.begin(), classes.end(),
                                           [](const LengthClass& a, const LengthClass& b) { return a.count < b.count; });
        cutOffCm = mode->fromCm;
        e.assumptions.push_back("cut-off L' = " + shortNumber(*cutOffCm) +
                                " cm, the lower limit of the most frequent class (taken as fully recruited)");
    }
    out.cutOffCm = *cutOffCm;
    double n = 0.0, sum = 0.0, sumSq = 0.0;
    for (const LengthClass& c : classes) {
        if (c.fromCm < *cutOffCm) continue;
        n += c.count;
        sum += c.count * c.midCm();
        sumSq += c.count * c.midCm() * c.midCm();
    }
    if (n < 2.0) {
        e.problems.push_back(invalid(code::kFieldworkTooFewData,
                                     "fewer than 2 fish at or above the cut-off length " + shortNumber(*cutOffCm) + " cm"));
        return out;
    }
    const double lmean = sum / n;
    const double sd = std::sqrt(std::max(0.0, (sumSq - n * lmean * lmean) / (n - 1.0)));
    out.meanLengthCm = lmean;
    out.sdCm = sd;
    out.fish = n;
    const double linf = growth.linfCm, lc = *cutOffCm, k = growth.k;
    if (!(lmean > lc && lmean < linf)) {
        e.problems.push_back(invalid(code::kFieldworkInvalidInput,
                                     "the mean length " + shortNumber(lmean) + " cm must lie between the cut-off " +
                                         shortNumber(lc) + " cm and L∞ " + shortNumber(linf) + " cm"));
        return out;
    }
    auto z = [&](double lm) { return k * (linf - lm) / (lm - lc); };
    e.value = z(lmean);
    const double se = sd / std::sqrt(n);
    const double dzdl = k * (lc - linf) / ((lmean - lc) * (lmean - lc));  // derivative of Z in Lmean
    e.cv = std::abs(dzdl) * se / e.value;
    const double t = studentTTwoSided(ciLevel, n - 1.0);
    const double hiL = std::min(lmean + t * se, linf), loL = lmean - t * se;
    e.ciLow = z(hiL);
    e.ciHigh = loL > lc ? z(loL) : std::numeric_limits<double>::infinity();
    if (!std::isfinite(*e.ciHigh)) e.ciHigh.reset();
    e.method = "mean length (Beverton & Holt 1956)";
    growthInputs(e, growth);
    e.inputs.push_back(labelled("L'", lc, "cm"));
    e.inputs.push_back("mean length " + shortNumber(lmean) + " cm of " + shortNumber(n) + " fish");
    e.assumptions.push_back("steady state: constant recruitment and mortality above L'");
    e.valid = true;
    return out;
}

CatchCurveResult lengthConvertedCatchCurve(const std::vector<LengthClass>& classes, const GrowthParameters& growth,
                                           const std::vector<std::size_t>& selected, double ciLevel)
{
    CatchCurveResult out;
    out.estimate = newEstimate("Z", "/year", ciLevel);
    Estimate& e = out.estimate;
    if (!growthOk(growth, e.problems)) return out;
    const double linf = growth.linfCm, k = growth.k;
    for (const LengthClass& c : classes) {
        CatchCurvePoint p;
        p.fromCm = c.fromCm;
        p.toCm = c.toCm;
        p.count = c.count;
        if (c.toCm < linf) {
            p.dt = std::log((linf - c.fromCm) / (linf - c.toCm)) / k;
            p.age = -std::log(1.0 - c.midCm() / linf) / k;
            if (c.count > 0.0) p.lnCdt = std::log(c.count / p.dt);
        }
        // A class far below an enormous L∞ has dt and age that round to 0 in double
        // precision, so ln(C/dt) is infinite: such a point is not usable either (issue 12).
        p.usable = c.count > 0.0 && c.toCm < linf && p.dt > 0.0 && std::isfinite(p.dt) && std::isfinite(p.age) &&
                   std::isfinite(p.lnCdt);
        out.points.push_back(p);
    }
    if (selected.empty()) {
        // The descending limb: after the highest ln(C/dt) to the last usable class.
        std::optional<std::size_t> peak, last;
        for (std::size_t i = 0; i < out.points.size(); ++i) {
            if (!out.points[i].usable) continue;
            if (!peak || out.points[i].lnCdt > out.points[*peak].lnCdt) peak = i;
            last = i;
        }
        if (peak)
            for (std::size_t i = *peak + 1; i <= *last; ++i) out.points[i].selected = out.points[i].usable;
        e.assumptions.push_back("points: the classes after the peak of ln(C/dt) (not fully recruited before it)");
    } else {
        for (std::size_t i : selected) {
            if (i >= out.points.size()) {
                e.problems.push_back(invalid(code::kFieldworkInvalidInput,
                                             "point " + std::to_string(i + 1) + " was chosen but there are only " +
                                                 std::to_string(out.points.size()) + " length classes"));
                return out;
            }
            if (!out.points[i].usable) {
                e.problems.push_back(invalid(code::kFieldworkInvalidInput,
                                             "point " + std::to_string(i + 1) + " (" + shortNumber(out.points[i].fromCm) +
                                                 "-" + shortNumber(out.points[i].toCm) +
                                                 " cm) cannot be used: it has no fish, reaches L∞, or its age "
                                                 "cannot be computed for this L∞"));
                return out;
            }
            out.points[i].selected = true;
        }
    }
    std::vector<double> xs, ys;
    for (const CatchCurvePoint& p : out.points)
        if (p.selected) {
            xs.push_back(p.age);
            ys.push_back(p.lnCdt);
        }
    const std::size_t n = xs.size();
    out.used = static_cast<int>(n);
    if (n < 3) {
        e.problems.push_back(invalid(code::kFieldworkTooFewData,
                                     "the catch curve has " + std::to_string(n) +
                                         " point(s) to regress; a slope and its interval need at least 3"));
        return out;
    }
    double mx = 0.0, my = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        mx += xs[i];
        my += ys[i];
    }
    mx /= static_cast<double>(n);
    my /= static_cast<double>(n);
    double sxx = 0.0, sxy = 0.0, syy = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        sxx += (xs[i] - mx) * (xs[i] - mx);
        sxy += (xs[i] - mx) * (ys[i] - my);
        syy += (ys[i] - my) * (ys[i] - my);
    }
    if (!(sxx > 0.0)) {  // every chosen point of the same age: no line through them
        e.problems.push_back(invalid(code::kFieldworkInvalidInput,
                                     "the chosen points all have the same age, so they give no slope; choose classes "
                                     "of different lengths"));
        return out;
    }
    out.slope = sxy / sxx;
    out.intercept = my - out.slope * mx;
    const double sse = std::max(0.0, syy - out.slope * sxy);
    out.slopeSe = std::sqrt(sse / static_cast<double>(n - 2) / sxx);
    out.r2 = syy > 0.0 ? 1.0 - sse / syy : 1.0;
    e.value = -out.slope;
    if (!(e.value > 0.0)) {
        e.problems.push_back(invalid(code::kFieldworkInvalidInput,
                                     "the chosen points rise with age (slope " + shortNumber(out.slope) +
                                         "): choose points on the descending limb"));
        return out;
    }
    const double t = studentTTwoSided(ciLevel, static_cast<double>(n - 2));
    e.cv = out.slopeSe / e.value;
    e.ciLow = std::max(0.0, e.value - t * out.slopeSe);
    e.ciHigh = e.value + t * out.slopeSe;
    e.method = "length-converted catch curve (Pauly 1983; Sparre & Venema 1998)";
    growthInputs(e, growth);
    const auto first = std::find_if(out.points.begin(), out.points.end(), [](const auto& p) { return p.selected; });
    const auto lastSel = std::find_if(out.points.rbegin(), out.points.rend(), [](const auto& p) { return p.selected; });
    e.inputs.push_back(std::to_string(n) + " classes " + shortNumber(first->fromCm) + "-" + shortNumber(lastSel->toCm) +
                       " cm, r² " + shortNumber(out.r2));
    e.assumptions.push_back("steady state: constant recruitment and mortality over the chosen classes");
    e.valid = true;
    return out;
}

}  // namespace tl::fieldwork
