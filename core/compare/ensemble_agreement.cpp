// Ensemble agreement of a comparison; the design is in the header.
#include "core/compare/ensemble_agreement.h"

#include <algorithm>
#include <map>

#include <nlohmann/json.hpp>

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
    EnsembleAgreementInfo info;
    info.draws = settings.draws;
    info.seed = settings.seed;
    for (const Scenario* s : scenarios) {
        runs.push_back(ensemble::runEnsemble(s->model, settings, cancel));
        const ensemble::EnsembleRun& run = runs.back();
        if (!run.ran()) {
            result.problems = run.problems;
            for (Problem& p : result.problems) p.message = "Scenario '" + s->name + "': " + p.message;
            return result;
        }
        info.balanced.push_back(run.statistics.balanced);
        info.fingerprints.push_back(run.statistics.fingerprint);
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

std::optional<ensemble::EnsembleSettings> storedEnsembleSettings(const Project& project,
                                                                 const std::vector<const Scenario*>& scenarios,
                                                                 std::string& error, std::vector<std::string>& warnings)
{
    std::optional<ensemble::EnsembleSettings> common;
    std::string first;
    for (const Scenario* s : scenarios) {
        const StoredRun* latest = nullptr;
        for (const StoredRun& run : project.runs)
            if (run.kind == "ensemble" && run.scenario == s->name && (!latest || run.id > latest->id)) latest = &run;
        if (!latest) {
            error = "scenario '" + s->name + "' has no stored ensemble run (run `tledger ensemble PROJECT --scenario '" +
                    s->name + "' --draws N --seed S` first, or give --ensemble N --seed S)";
            return std::nullopt;
        }
        std::string why;
        auto settings = ensemble::readEnsembleSettingsJson(latest->settingsJson, &why);
        if (!settings) {
            error = "the stored ensemble run " + std::to_string(latest->id) + " of scenario '" + s->name +
                    "' cannot be read: " + why;
            return std::nullopt;
        }
        const nlohmann::json summary = nlohmann::json::parse(latest->summaryJson, nullptr, false);
        const std::string stored = summary.is_object() ? summary.value("fingerprint", std::string()) : std::string();
        if (stored != ensemble::ensembleFingerprint(s->model, *settings))
            warnings.push_back("scenario '" + s->name + "' changed since its stored ensemble run " +
                               std::to_string(latest->id) + " (" + latest->created +
                               "); its draws are made from its current values");
        if (!common) {
            common = settings;
            first = s->name;
        } else if (settings->draws != common->draws || settings->seed != common->seed || settings->shape != common->shape ||
                   settings->dietCv != common->dietCv || settings->catchCv != common->catchCv ||
                   settings->holdFlowTerms != common->holdFlowTerms) {
            error = "the stored ensemble runs of '" + first + "' and '" + s->name +
                    "' differ in draws, seed, shape, CVs or held inputs; paired draws need the same settings "
                    "(run both again with the same --draws and --seed, or give --ensemble N --seed S)";
            return std::nullopt;
        }
    }
    return common;
}

}  // namespace tl
