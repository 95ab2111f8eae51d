// Ensemble agreement of a comparison; the design is in the header.
#include "core/compare/ensemble_agreement.h"

#include <algorithm>
#include <map>

#include "core/ensemble/ensemble_report.h"

namespace tl {

std::string comparisonKeyOf(std::string_view name)
{
    constexpr std::string_view system = "system.", te = "system.te_";
    if (name.starts_with(te)) return std::string(name.substr(te.size())) + ".te";
    if (name.starts_with(system)) return std::string(name.substr(system.size()));
    return std::string(name);
}

EnsembleAgreementRun attachEnsembleRuns(ScenarioComparison& comparison, const std::vector<const Scenario*>& scenarios,
                                        ensemble::EnsembleSettings settings, const std::atomic<bool>* cancel)
{
    EnsembleAgreementRun result;
    settings.keepBalancedDraws = true;
    settings.range.reset();
    settings.analyses = {true, true, true};
    std::vector<ensemble::EnsembleRun> runs;
    EnsembleAgreementInfo info{settings.draws, settings.seed, {}, 0, {}};
    for (const Scenario* s : scenarios) {
        runs.push_back(ensemble::runEnsemble(s->model, settings, cancel));
        const ensemble::EnsembleRun& run = runs.back();
        if (!run.ran()) {
            result.problems = run.problems;
            for (Problem& p : result.problems) p.message = "Scenario '" + s->name + "': " + p.message;
            return result;
        }
        info.balanced.push_back(run.statistics.balanced);
        info.held = ensemble::heldFixed(run.statistics);
    }
    // Draws balanced in every scenario, and each one's row in each run's kept draws.
    std::map<std::uint64_t, std::vector<Eigen::Index>> rowsOf;
    for (std::size_t s = 0; s < runs.size(); ++s)
        for (std::size_t r = 0; r < runs[s].kept.draw.size(); ++r) rowsOf[runs[s].kept.draw[r]].push_back(static_cast<Eigen::Index>(r));
    std::vector<std::vector<Eigen::Index>> paired;  // per paired draw, the row in each run
    for (auto& [draw, rows] : rowsOf)
        if (rows.size() == runs.size()) paired.push_back(std::move(rows));
    info.paired = paired.size();
    comparison.ensemble = info;

    std::vector<std::map<std::string, Eigen::Index, std::less<>>> columnOf(runs.size());
    for (std::size_t s = 0; s < runs.size(); ++s)
        for (std::size_t k = 0; k < runs[s].kept.outputNames.size(); ++k)
            columnOf[s][comparisonKeyOf(runs[s].kept.outputNames[k])] = static_cast<Eigen::Index>(k);
    std::vector<std::string> names = comparison.scenarios;
    result.filled = attachEnsembleAgreement(comparison, [&](std::string_view scenario, std::string_view key)
                                                            -> std::optional<std::vector<double>> {
        const auto at = std::find(names.begin(), names.end(), scenario);
        if (at == names.end() || paired.empty()) return std::nullopt;
        const auto s = static_cast<std::size_t>(at - names.begin());
        const auto column = columnOf[s].find(key);
        if (column == columnOf[s].end()) return std::nullopt;
        std::vector<double> draws;
        draws.reserve(paired.size());
        for (const std::vector<Eigen::Index>& rows : paired) draws.push_back(runs[s].kept.outputs(rows[s], column->second));
        return draws;
    });
    return result;
}

}  // namespace tl
