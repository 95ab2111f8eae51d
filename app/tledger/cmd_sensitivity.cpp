// tledger sensitivity MODEL [--scenario NAME] [--output COMPARTMENT.QUANTITY] [--top N]
//                   [--central-differences] [--json]
// (DESIGN 3.7, 5.2): local elasticities d ln(output) / d ln(input) at the point estimate
// (core/sensitivity/elasticity.h), each output's inputs ranked by magnitude.
// QUANTITY: biomass (or b), pb, qb, ee, pq, tl; an output is a solved value, an EE, a
// consumer's P/Q or TL. The text shows the 10 largest per output when every output is
// listed (all of them for one --output); the JSON all unless --top.
// `--prcc --draws N --seed S [--threads T]`: partial rank correlations of the same outputs
// over the balanced draws of an ensemble of the scenario (core/sensitivity/ensemble_prcc.h,
// core/ensemble), set beside the elasticities (JSON "prcc", the text's last part).
// Every output of a very large web (more than 5e7 elasticities) is refused: name outputs.
// Exit: 0 balanced, 1 the scenario does not balance or does not solve (reported), 2 bad input.
#include <charconv>
#include <iostream>

#include "app/tledger/commands.h"
#include "app/tledger/options.h"
#include <thread>

#include "core/balance/solver.h"
#include "core/ensemble/ensemble.h"
#include "core/ensemble/ensemble_report.h"
#include "core/sensitivity/ensemble_prcc.h"
#include "core/model/text.h"
#include "core/sensitivity/sensitivity_report.h"
#include "core/store/model_source.h"

namespace tl::cli {
namespace {

constexpr const char* kUsage =
    "usage: tledger sensitivity MODEL [--scenario NAME] [--output COMPARTMENT.QUANTITY] [--top N]\n"
    "                           [--central-differences] [--json]\n"
    "                           [--prcc --draws N --seed S [--threads T]]\n"
    "       QUANTITY: biomass (or b), pb, qb, ee, pq, tl\n";

// The outputs of one compartment, for a message.
std::string outputsOf(const Model& model, const BalanceSheet& sheet, std::size_t compartment)
{
    std::string list;
    for (const SensitivityOutput& o : sensitivityOutputs(model, sheet))
        if (o.compartment == compartment) list += (list.empty() ? "" : ", ") + outputName(model, o);
    return list.empty() ? "none" : list;
}

// "COMPARTMENT.QUANTITY" split at the last '.' (names may hold dots), checked against the
// scenario's outputs; a message on std::cerr when it is not one.
std::optional<std::pair<std::size_t, SensitivityOutputKind>> parseOutput(const Model& model, const BalanceSheet& sheet,
                                                                         const std::string& scenario,
                                                                         const std::string& text)
{
    const auto dot = text.rfind('.');
    if (dot == std::string::npos) {
        std::cerr << "tledger sensitivity: --output '" << text
                  << "': expected COMPARTMENT.QUANTITY with QUANTITY one of biomass (or b), pb, qb, ee, pq, tl\n";
        return std::nullopt;
    }
    const std::string name(trim(text.substr(0, dot)));
    const std::string key(trim(text.substr(dot + 1)));
    const auto index = model.indexOf(name);
    if (!index) {
        std::cerr << "tledger sensitivity: --output '" << text << "': scenario '" << scenario
                  << "' has no compartment named '" << name << "'\n";
        return std::nullopt;
    }
    const auto kind = parseOutputKind(key);
    if (!kind) {
        std::cerr << "tledger sensitivity: --output '" << text << "': unknown quantity '" << key
                  << "' (expected biomass (or b), pb, qb, ee, pq or tl)\n";
        return std::nullopt;
    }
    if (!findOutput(model, sheet, *index, *kind)) {
        std::cerr << "tledger sensitivity: --output '" << text << "' is not an output of scenario '" << scenario
                  << "' (outputs are the values the balance solves, EE, and a consumer's P/Q and TL; "
                  << "a given value is an input). Outputs of '" << name << "': " << outputsOf(model, sheet, *index) << "\n";
        return std::nullopt;
    }
    return std::pair{*index, *kind};
}

std::optional<std::size_t> parseCount(const std::string& text)
{
    std::size_t n = 0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), n);
    if (ec != std::errc() || end != text.data() + text.size() || n == 0) return std::nullopt;
    return n;
}

std::optional<std::uint64_t> parseSeed(const std::string& text)
{
    std::uint64_t n = 0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), n);
    if (ec != std::errc() || end != text.data() + text.size()) return std::nullopt;
    return n;
}

// The ensemble settings of --prcc, or a message on std::cerr and nothing.
std::optional<ensemble::EnsembleSettings> prccSettings(const ParsedOptions& opts)
{
    const auto draws = opts.value("--draws");
    const auto seed = opts.value("--seed");
    if (!opts.has("--prcc") || !draws || !seed) {
        std::cerr << "tledger sensitivity: partial rank correlations need all of --prcc, --draws N and --seed S\n" << kUsage;
        return std::nullopt;
    }
    ensemble::EnsembleSettings s;
    const auto n = parseCount(*draws);
    if (!n || *n > 100000000) {
        std::cerr << "tledger sensitivity: --draws '" << *draws << "': expected a whole number from 1 to 100000000\n";
        return std::nullopt;
    }
    const auto sv = parseSeed(*seed);
    if (!sv) {
        std::cerr << "tledger sensitivity: --seed '" << *seed << "': expected a whole number from 0 to 18446744073709551615\n";
        return std::nullopt;
    }
    s.draws = *n;
    s.seed = *sv;
    s.threads = std::max(1u, std::thread::hardware_concurrency());
    if (const auto t = opts.value("--threads")) {
        const auto tv = parseCount(*t);
        if (!tv || *tv > 256) {
            std::cerr << "tledger sensitivity: --threads '" << *t << "': expected a whole number from 1 to 256\n";
            return std::nullopt;
        }
        s.threads = static_cast<unsigned>(*tv);
    }
    s.keepBalancedDraws = true;
    s.analyses.trophicLevels = true;  // TL is an output of the elasticities too
    return s;
}

}  // namespace

int cmdSensitivity(const Args& args)
{
    const auto opts = parseOptions(args, {"--scenario", "--output", "--top", "--draws", "--seed", "--threads"},
                                   {"--json", "--central-differences", "--prcc"}, "sensitivity", std::cerr);
    if (!opts) return 2;
    if (opts->positional.size() != 1) {
        std::cerr << "tledger sensitivity: expected one MODEL (a CSV folder or a .tledger project)\n" << kUsage;
        return 2;
    }
    std::optional<ensemble::EnsembleSettings> prcc;
    if (opts->has("--prcc") || opts->value("--draws") || opts->value("--seed") || opts->value("--threads")) {
        prcc = prccSettings(*opts);
        if (!prcc) return 2;
    }
    std::optional<std::size_t> top;
    if (const auto text = opts->value("--top")) {
        top = parseCount(*text);
        if (!top) {
            std::cerr << "tledger sensitivity: --top '" << *text << "': expected a whole number of at least 1\n";
            return 2;
        }
    }

    const StoreResult<Scenario> loaded = readScenarioSource(opts->positional[0], opts->value("--scenario"));
    for (const Problem& p : loaded.problems)
        std::cerr << (p.severity == Severity::Error ? "" : "warning: ") << p.describe()
                  << (p.hint.empty() ? "" : " (" + p.hint + ")") << '\n';
    if (!loaded.value) return 2;
    const Scenario& scenario = *loaded.value;
    const Model& model = scenario.model;

    ElasticityOptions options;
    options.forceCentralDifferences = opts->has("--central-differences");
    if (const auto output = opts->value("--output")) {
        const BalanceSheet sheet = solveBalance(model);
        if (sheet.status == BalanceStatus::Invalid) {
            // Nothing solved, so no output to name: report why (below) rather than the name.
        } else if (const auto chosen = parseOutput(model, sheet, scenario.name, *output)) {
            options.only.push_back(*chosen);
        } else {
            return 2;
        }
    }
    const ElasticityResult result = computeElasticities(model, options);
    if (result.tooLarge) {
        std::cerr << "tledger sensitivity: " << result.error << "\n";
        return 2;
    }

    SensitivityReportOptions report;
    report.scenario = scenario.name;
    report.top = top;
    if (!top && !opts->has("--json") && options.only.empty()) report.top = 10;
    EnsemblePrcc drawn;
    SensitivityReportOptions::PrccEnsemble source;
    if (prcc) {
        const ensemble::EnsembleRun run = ensemble::runEnsemble(model, *prcc);
        if (!run.ran()) {
            for (const Problem& p : run.problems) std::cerr << p.describe() << '\n';
            std::cerr << "tledger sensitivity: the ensemble of scenario '" << scenario.name << "' cannot be run\n";
            return result.status == BalanceStatus::Balanced ? 2 : 1;
        }
        // The outputs the elasticities have (solved values, EE, P/Q, TL): a given value is an
        // input and would only correlate with itself.
        std::vector<std::string> outputs;
        for (const SensitivityOutput& o : result.outputs) outputs.push_back(outputName(model, o));
        drawn = prccOfKeptDraws(run.kept, outputs);
        source = {prcc->draws, prcc->seed, run.statistics.balanced, drawn.leftOut, ensemble::heldFixed(run.statistics)};
        report.prcc = &drawn.table;
        report.prccEnsemble = &source;
        if (run.statistics.balanced < 10)
            std::cerr << "tledger sensitivity: only " << run.statistics.balanced << " of " << prcc->draws
                      << " draws balance; the partial rank correlations are undefined or weak (narrow the CVs or add draws)\n";
    }
    std::cout << (opts->has("--json") ? sensitivityJson(model, result, report) : sensitivityText(model, result, report));
    if (!result.error.empty()) std::cerr << "tledger sensitivity: " << result.error << "\n";
    return result.status == BalanceStatus::Balanced ? 0 : 1;
}

}  // namespace tl::cli
