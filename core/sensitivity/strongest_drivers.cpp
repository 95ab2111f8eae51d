#include "core/sensitivity/strongest_drivers.h"

#include <algorithm>
#include <cmath>

#include "core/balance/solver.h"

namespace tl {

StrongestDrivers strongestDrivers(const Model& model, const std::string& output, std::size_t top)
{
    StrongestDrivers out;
    out.output = output;
    const auto dot = output.rfind('.');
    const auto compartment = dot == std::string::npos ? std::nullopt : model.indexOf(output.substr(0, dot));
    const auto kind = dot == std::string::npos ? std::nullopt : parseOutputKind(output.substr(dot + 1));
    if (!compartment || !kind) {
        out.error = "'" + output + "' is not COMPARTMENT.QUANTITY of this scenario";
        return out;
    }
    const BalanceSheet sheet = solveBalance(model);
    if (sheet.status == BalanceStatus::Invalid) {
        out.error = "the scenario does not solve";
        return out;
    }
    if (!findOutput(model, sheet, *compartment, *kind)) {
        out.error = "'" + output + "' is given, not computed: no input moves it";
        return out;
    }
    ElasticityOptions options;
    options.only = {{*compartment, *kind}};
    const ElasticityResult r = computeElasticities(model, options);
    if (!r.error.empty() || r.outputs.empty()) {
        out.error = r.error.empty() ? "no elasticities" : r.error;
        return out;
    }
    out.note = std::string(methodKey(r.outputs.front().method)) + (r.methodNote.empty() ? "" : "; " + r.methodNote);
    for (std::size_t k = 0; k < r.inputs.size(); ++k) {
        const double e = r.elasticity(0, static_cast<Eigen::Index>(k));
        // Below 1e-12 is rounding residue (as in the sensitivity report).
        if (std::isfinite(e) && std::abs(e) >= 1e-12) out.drivers.push_back({inputName(model, r.inputs[k]), e});
    }
    std::stable_sort(out.drivers.begin(), out.drivers.end(),
                     [](const Driver& a, const Driver& b) { return std::abs(a.elasticity) > std::abs(b.elasticity); });
    if (out.drivers.size() > top) out.drivers.resize(top);
    return out;
}

}  // namespace tl
