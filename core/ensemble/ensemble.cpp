// Monte Carlo ensemble of a scenario (DESIGN.md 3.7): draws, solve, checks, streaming
// statistics, threads. The design is described in ensemble.h.
#include "core/ensemble/ensemble.h"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <condition_variable>
#include <cstdio>
#include <mutex>
#include <numeric>
#include <thread>

#include "core/balance/solver.h"
#include "core/balance/trophic_level.h"
#include "core/model/problem_codes.h"
#include "core/network/flow_network.h"
#include "core/network/indicators.h"
#include "core/network/level_decomposition.h"

namespace tl::ensemble {
namespace {

constexpr std::uint64_t kChunk = 64;  // draws taken at a time by a worker
constexpr std::uint64_t kMaxRangeDraws = 0xffffffffULL;

Problem problem(const char* code, std::string message, std::string hint = {})
{
    Problem p;
    p.code = code;
    p.severity = Severity::Error;
    p.message = std::move(message);
    p.hint = std::move(hint);
    return p;
}

// The indicators an ensemble summarises, with their keys in `tledger network --json`.
struct IndicatorOutput {
    const char* key;
    double SystemIndicators::* member;
};
constexpr IndicatorOutput kIndicatorOutputs[] = {
    {"tst", &SystemIndicators::tst},
    {"tstp", &SystemIndicators::tstp},
    {"fci", &SystemIndicators::fci},
    {"apl", &SystemIndicators::apl},
    {"ami", &SystemIndicators::ami},
    {"ascendency", &SystemIndicators::ascendency},
    {"capacity", &SystemIndicators::capacity},
    {"overhead", &SystemIndicators::overhead},
    {"total_primary_production", &SystemIndicators::totalPrimaryProduction},
    {"tpp_over_r", &SystemIndicators::tppOverR},
    {"tpp_over_b", &SystemIndicators::tppOverB},
    {"total_biomass", &SystemIndicators::totalLivingBiomass},
    {"system_omnivory", &SystemIndicators::systemOmnivory},
    {"catch_mean_tl", &SystemIndicators::catchMeanTl},
};
constexpr const char* kLevelNames[] = {"II", "III", "IV", "V"};

bool hasCatch(const BalanceInputs& in) { return in.catchTotal.size() > 0 && in.catchTotal.maxCoeff() > 0.0; }

// The outputs of a draw, in one fixed order (names() and evaluate() walk the same loops).
class OutputLayout {
public:
    OutputLayout(const Model& model, const Analyses& analyses, const BalanceInputs& point)
        : analyses_(analyses), catch_(hasCatch(point))
    {
        for (std::size_t i = 0; i < model.size(); ++i) {
            const Compartment& c = model.compartment(i);
            if (c.kind == CompartmentKind::Detritus) {
                names_.push_back(c.name + ".ee");
                continue;
            }
            for (const char* q : {"biomass", "pb", "ee"}) names_.push_back(c.name + "." + q);
            if (c.kind == CompartmentKind::Consumer)
                for (const char* q : {"qb", "pq"}) names_.push_back(c.name + "." + q);
        }
        if (analyses.trophicLevels)
            for (const Compartment& c : model.compartments())
                if (c.kind == CompartmentKind::Consumer) names_.push_back(c.name + ".tl");
        if (analyses.levels) {
            for (const char* level : kLevelNames) names_.push_back(std::string("system.te_") + level);
            names_.push_back("system.mean_te");
            names_.push_back("system.primary_production_consumed");
            names_.push_back("system.detritus_inflow_consumed");
        }
        if (analyses.indicators)
            for (const IndicatorOutput& o : kIndicatorOutputs)
                if (catch_ || std::string_view(o.key) != "catch_mean_tl") names_.push_back(std::string("system.") + o.key);
        for (const Compartment& c : model.compartments()) basal_.push_back(c.kind != CompartmentKind::Consumer);
    }

    const std::vector<std::string>& names() const { return names_; }
    bool needsNetwork() const { return analyses_.levels || analyses_.indicators; }

    // The balance part (and TL) from the numeric step; the network part from `model`
    // (a copy of the scenario holding the draw's values), solved the full way.
    void evaluate(const Model& model, const BalanceInputs& in, const BalanceValues& v, BalanceScratch& scratch,
                  double* out) const
    {
        std::size_t k = 0;
        for (std::size_t i = 0; i < model.size(); ++i) {
            const auto e = static_cast<Eigen::Index>(i);
            const CompartmentKind kind = model.compartment(i).kind;
            if (kind == CompartmentKind::Detritus) {
                out[k++] = v.detritusEE[e];
                continue;
            }
            out[k++] = v.biomass[e];
            out[k++] = v.pb[e];
            out[k++] = v.ee[e];
            if (kind == CompartmentKind::Consumer) {
                out[k++] = v.qb[e];
                out[k++] = v.qb[e] != 0.0 ? v.pb[e] / v.qb[e] : std::numeric_limits<double>::quiet_NaN();
            }
        }
        if (analyses_.trophicLevels) {
            // The worker's kept buffers and feeding loops (trophic_level.h): no allocation per draw.
            computeTrophicLevels(in.diet, basal_, scratch.levelWork, scratch.levels);
            const TrophicLevels& levels = scratch.levels;
            for (std::size_t i = 0; i < model.size(); ++i)
                if (!basal_[i]) out[k++] = levels.tl[static_cast<Eigen::Index>(i)];
        }
        if (!needsNetwork()) return;
        const BalanceSheet sheet = solveBalance(model, scratch);
        const double nan = std::numeric_limits<double>::quiet_NaN();
        if (sheet.status == BalanceStatus::Invalid) {
            std::fill(out + k, out + names_.size(), nan);
            return;
        }
        const FlowNetwork network = buildFlowNetwork(model, sheet);
        if (analyses_.levels) {
            const LevelDecomposition d = decomposeLevels(network);
            for (std::size_t level = 2; level <= 5; ++level)
                out[k++] = level <= d.combined.levels.size() ? d.combined.levels[level - 1].te : nan;
            out[k++] = d.combined.meanTe;
            out[k++] = d.primaryProductionConsumed;
            out[k++] = d.detritusInflowConsumed;
        }
        if (analyses_.indicators) {
            const SystemIndicators s = systemIndicators(model, sheet, network);
            for (const IndicatorOutput& o : kIndicatorOutputs)
                if (catch_ || std::string_view(o.key) != "catch_mean_tl") out[k++] = s.*(o.member);
        }
    }

private:
    Analyses analyses_;
    bool catch_ = false;
    std::vector<std::string> names_;
    std::vector<bool> basal_;
};

// Which values the solve determined for a compartment (as solver.cpp's solvedParams).
bool solvedNegative(const BalancePlan& plan, const BalanceValues& v, std::size_t i)
{
    const auto e = static_cast<Eigen::Index>(i);
    bool neg = false;
    switch (plan.pqStandInOf(i)) {
    case PqStandIn::PBFromPQ: neg |= v.pb[e] < 0.0; break;
    case PqStandIn::QBFromPQ: neg |= v.qb[e] < 0.0; break;
    case PqStandIn::None: break;
    }
    switch (plan.unknownOf(i)) {
    case Unknown::Biomass: neg |= v.biomass[e] < 0.0; break;
    case Unknown::PB: neg |= v.pb[e] < 0.0; break;
    case Unknown::QB: neg |= v.qb[e] < 0.0; break;
    case Unknown::EE: neg |= v.ee[e] < 0.0; break;
    case Unknown::QBTiedPB: neg |= v.pb[e] < 0.0 || v.qb[e] < 0.0; break;
    case Unknown::None: break;
    }
    return neg;
}

// The error checks of solveBalance (solver.cpp, finishSolvedSheet) on a numeric step's
// values; counts each broken condition against its compartment. True if none broke.
bool checkDraw(const Model& model, const BalancePlan& plan, const BalanceInputs& in, const BalanceValues& v,
               std::vector<BreakCounts>& breaks)
{
    bool balanced = true;
    const double eeMax = model.rules.eeMax + kBoundTolerance;
    for (std::size_t i = 0; i < model.size(); ++i) {
        const auto e = static_cast<Eigen::Index>(i);
        const CompartmentKind kind = model.compartment(i).kind;
        BreakCounts& b = breaks[i];
        bool broke = false;
        if (kind == CompartmentKind::Detritus) {
            const double ee = v.detritusEE[e];
            if (ee > 1.0 + kBoundTolerance || std::isnan(ee)) {
                ++b.detritusOverConsumed;
                broke = true;
            }
        } else {
            if (solvedNegative(plan, v, i)) {
                ++b.negativeValue;
                broke = true;
            }
            if (v.ee[e] > eeMax) {
                ++b.eeAboveMax;
                broke = true;
            }
            if (std::abs(v.residual[e]) > kResidualTolerance * v.residualScale[e]) {
                ++b.residual;
                broke = true;
            }
            if (kind == CompartmentKind::Consumer) {
                const double q = v.consumption[e];
                const double r = q * (1.0 - in.unassim[e]) - v.production[e];
                if (r < -kBoundTolerance * std::abs(q)) {
                    ++b.negativeRespiration;
                    broke = true;
                }
            }
        }
        if (broke) {
            ++b.any;
            balanced = false;
        }
    }
    return balanced;
}

std::string hex(std::uint64_t v)
{
    char buf[17];
    std::snprintf(buf, sizeof buf, "%016llx", static_cast<unsigned long long>(v));
    return buf;
}

std::string fingerprintOf(const EnsembleInputs& inputs, const Analyses& analyses)
{
    std::uint64_t fp = inputs.fingerprint();
    fp ^= (analyses.trophicLevels ? 1u : 0u) | (analyses.levels ? 2u : 0u) | (analyses.indicators ? 4u : 0u);
    return hex(fp);
}

// One thread's share of the work: its buffers and its statistics.
struct Worker {
    BalanceInputs in;
    BalanceWorkspace ws;
    BalanceValues values;
    Model model;            // for the network analyses
    BalanceScratch scratch;  // ditto
    std::vector<double> inputRow, outputRow;
    std::uint64_t drawsRun = 0, solved = 0, balanced = 0, singular = 0;
    std::vector<BreakCounts> breaks;
    std::vector<OutputStatistics> outputs;
    std::vector<std::uint64_t> keptDraws;
    std::vector<double> keptInputs, keptOutputs;
};

}  // namespace

BreakCounts& BreakCounts::operator+=(const BreakCounts& o)
{
    any += o.any;
    eeAboveMax += o.eeAboveMax;
    negativeRespiration += o.negativeRespiration;
    negativeValue += o.negativeValue;
    residual += o.residual;
    detritusOverConsumed += o.detritusOverConsumed;
    return *this;
}

bool EnsembleStatistics::merge(const EnsembleStatistics& o, std::string* why)
{
    auto refuse = [&](std::string reason) {
        if (why) *why = std::move(reason);
        return false;
    };
    if (cancelled || o.cancelled) return refuse("a cancelled run is not a slice and cannot be merged");
    if (o.fingerprint != fingerprint || o.seed != seed || o.totalDraws != totalDraws || !(o.analyses == analyses) ||
        o.outputNames != outputNames || o.compartments != compartments || o.shape != shape ||
        o.flowTermsHeld != flowTermsHeld)
        return refuse("it comes from another ensemble (scenario, seed, draws, analyses or distributions differ)");
    for (const DrawRange& a : ranges)
        for (const DrawRange& b : o.ranges)
            if (a.first <= b.last && b.first <= a.last)
                return refuse("its draws " + std::to_string(b.first) + ":" + std::to_string(b.last) +
                              " overlap draws already merged (" + std::to_string(a.first) + ":" + std::to_string(a.last) + ")");
    std::vector<DrawRange> all = ranges;
    all.insert(all.end(), o.ranges.begin(), o.ranges.end());
    std::sort(all.begin(), all.end(), [](const DrawRange& a, const DrawRange& b) { return a.first < b.first; });
    ranges.clear();
    for (const DrawRange& r : all) {
        if (!ranges.empty() && ranges.back().last + 1 == r.first) ranges.back().last = r.last;
        else ranges.push_back(r);
    }
    drawsRun += o.drawsRun;
    solved += o.solved;
    balanced += o.balanced;
    singular += o.singular;
    for (std::size_t i = 0; i < breaks.size(); ++i) breaks[i] += o.breaks[i];
    for (std::size_t k = 0; k < outputs.size(); ++k) outputs[k].merge(o.outputs[k]);
    return true;
}

EnsembleRun runEnsemble(const Model& model, const EnsembleSettings& settings, const std::atomic<bool>* cancel,
                        const EnsembleProgress& progress)
{
    EnsembleRun run;
    if (settings.draws == 0) {
        run.problems.push_back(problem(code::kEnsembleSettings, "An ensemble needs at least one draw."));
        return run;
    }
    const DrawRange range = settings.range.value_or(DrawRange{0, settings.draws - 1});
    if (range.first > range.last || range.last >= settings.draws) {
        run.problems.push_back(problem(code::kEnsembleSettings,
                                       "The draw range " + std::to_string(range.first) + ":" + std::to_string(range.last) +
                                           " is not within draws 0:" + std::to_string(settings.draws - 1) + ".",
                                       "Give FIRST:LAST with 0 <= FIRST <= LAST < draws."));
        return run;
    }
    if (range.size() > kMaxRangeDraws) {
        run.problems.push_back(problem(code::kEnsembleSettings,
                                       "One run takes at most 4 294 967 295 draws; split larger ensembles into slices.",
                                       "Use --draw-range and ensemble-merge."));
        return run;
    }
    const BalancePlan plan = BalancePlan::build(model);
    if (plan.hasStructuralErrors()) {
        run.problems = plan.problems();
        run.problems.push_back(problem(code::kEnsembleUnsolvable,
                                       "The scenario's balance equations cannot be set up, so no draw can be solved.",
                                       "Fix the problems above (see tledger check)."));
        return run;
    }

    const EnsembleInputs inputs = EnsembleInputs::build(model, plan, settings);
    const OutputLayout layout(model, settings.analyses, inputs.pointInputs());
    const std::size_t nOut = layout.names().size();
    const std::size_t nIn = inputs.size();
    // Kept draws live in memory (worker rows, the draw-ordered matrix, then the CSV text:
    // about five times the numbers at the peak), so a run that could keep more than
    // kMaxKeptNumbers is refused up front rather than exhausting memory half way (issue 12,
    // item 11). Counted on the draws asked for: which of them balance is not known yet.
    if (settings.keepBalancedDraws) {
        const std::uint64_t perDraw = nIn + nOut + 1;
        if (range.size() > kMaxKeptNumbers / perDraw) {
            const std::uint64_t fit = kMaxKeptNumbers / perDraw;
            run.problems.push_back(problem(
                code::kEnsembleSettings,
                "Keeping the balanced draws of " + std::to_string(range.size()) + " draws of " + std::to_string(perDraw) +
                    " numbers each could take " + std::to_string(range.size() * perDraw * 8 / (1u << 20)) +
                    " MiB in memory; one run keeps at most " + std::to_string(fit) + " draws of this scenario.",
                "Keep the draws of a smaller run (--draws " + std::to_string(fit) +
                    " or fewer); the statistics of a large run need no kept draws."));
            return run;
        }
    }

    // The point estimate sets each output's scale (output_statistics.h). Every slice
    // computes it the same way, so their statistics share bins.
    std::vector<double> pointOutputs(nOut);
    {
        BalanceInputs in = inputs.pointInputs();
        BalanceWorkspace ws = plan.makeWorkspace();
        BalanceValues v = plan.makeValues();
        plan.solve(in, ws, v);
        BalanceScratch scratch;
        if (v.status == NumericStatus::Solved) layout.evaluate(model, in, v, scratch, pointOutputs.data());
        else std::fill(pointOutputs.begin(), pointOutputs.end(), std::numeric_limits<double>::quiet_NaN());
    }

    EnsembleStatistics& stats = run.statistics;
    stats.fingerprint = fingerprintOf(inputs, settings.analyses);
    stats.seed = settings.seed;
    stats.totalDraws = settings.draws;
    stats.analyses = settings.analyses;
    stats.shape = std::string(shapeKey(settings.shape));
    stats.ranges = {range};
    for (const Compartment& c : model.compartments()) stats.compartments.push_back(c.name);
    stats.breaks.assign(model.size(), {});
    stats.outputNames = layout.names();
    stats.inputNames = inputs.names();
    stats.flowTermsHeld = settings.holdFlowTerms;
    for (double p : pointOutputs) stats.outputs.emplace_back(OutputStatistics::scaleExponentOf(p));

    const unsigned threads = std::max(1u, std::min<unsigned>(settings.threads, static_cast<unsigned>(
                                                                                   (range.size() + kChunk - 1) / kChunk)));
    std::vector<Worker> workers(threads);
    for (Worker& w : workers) {
        w.in = inputs.pointInputs();
        w.ws = plan.makeWorkspace();
        w.values = plan.makeValues();
        if (layout.needsNetwork()) w.model = model;
        w.inputRow.resize(nIn);
        w.outputRow.resize(nOut);
        w.breaks.assign(model.size(), {});
        w.outputs = stats.outputs;
    }

    std::atomic<std::uint64_t> next{range.first};
    std::atomic<std::uint64_t> done{0};
    std::atomic<unsigned> finished{0};
    std::mutex mutex;
    std::condition_variable allDone;
    const std::uint64_t end = range.last + 1;

    auto work = [&](Worker& w) {
        for (;;) {
            if (cancel && cancel->load(std::memory_order_relaxed)) break;
            const std::uint64_t first = next.fetch_add(kChunk, std::memory_order_relaxed);
            if (first >= end) break;
            const std::uint64_t last = std::min(end, first + kChunk);
            for (std::uint64_t d = first; d < last; ++d) {
                inputs.draw(settings.seed, d, w.in, w.inputRow.data());
                plan.solve(w.in, w.ws, w.values);
                ++w.drawsRun;
                if (w.values.status != NumericStatus::Solved) {
                    ++w.singular;
                    continue;
                }
                ++w.solved;
                if (!checkDraw(model, plan, w.in, w.values, w.breaks)) continue;
                ++w.balanced;
                if (layout.needsNetwork()) inputs.applyToModel(w.inputRow.data(), w.model);
                layout.evaluate(layout.needsNetwork() ? w.model : model, w.in, w.values, w.scratch, w.outputRow.data());
                for (std::size_t k = 0; k < nOut; ++k) w.outputs[k].add(w.outputRow[k]);
                if (settings.keepBalancedDraws) {
                    w.keptDraws.push_back(d);
                    w.keptInputs.insert(w.keptInputs.end(), w.inputRow.begin(), w.inputRow.end());
                    w.keptOutputs.insert(w.keptOutputs.end(), w.outputRow.begin(), w.outputRow.end());
                }
            }
            done.fetch_add(last - first, std::memory_order_relaxed);
        }
        {
            std::lock_guard lock(mutex);
            ++finished;
        }
        allDone.notify_one();
    };

    std::vector<std::thread> pool;
    pool.reserve(threads);
    for (Worker& w : workers) pool.emplace_back(work, std::ref(w));
    {
        std::unique_lock lock(mutex);
        while (!allDone.wait_for(lock, std::chrono::milliseconds(100), [&] { return finished == threads; }))
            if (progress) {
                lock.unlock();
                progress(done.load(), range.size());
                lock.lock();
            }
    }
    for (std::thread& t : pool) t.join();
    if (progress) progress(done.load(), range.size());

    // Integer sums and min / max: the order of the workers does not change a bit.
    for (Worker& w : workers) {
        stats.drawsRun += w.drawsRun;
        stats.solved += w.solved;
        stats.balanced += w.balanced;
        stats.singular += w.singular;
        for (std::size_t i = 0; i < model.size(); ++i) stats.breaks[i] += w.breaks[i];
        for (std::size_t k = 0; k < nOut; ++k) stats.outputs[k].merge(w.outputs[k]);
    }
    stats.cancelled = stats.drawsRun < range.size();

    if (settings.keepBalancedDraws) {
        KeptDraws& kept = run.kept;
        kept.inputNames = inputs.names();
        kept.outputNames = layout.names();
        for (std::size_t r = 0; r < inputs.dietRows().size(); ++r) kept.dietColumns.push_back(inputs.dietColumns(r));
        std::vector<std::pair<std::uint64_t, std::pair<std::size_t, std::size_t>>> order;  // draw, (worker, row)
        for (std::size_t wi = 0; wi < workers.size(); ++wi)
            for (std::size_t r = 0; r < workers[wi].keptDraws.size(); ++r) order.push_back({workers[wi].keptDraws[r], {wi, r}});
        std::sort(order.begin(), order.end());
        const auto rows = static_cast<Eigen::Index>(order.size());
        kept.inputs.resize(rows, static_cast<Eigen::Index>(nIn));
        kept.outputs.resize(rows, static_cast<Eigen::Index>(nOut));
        for (Eigen::Index r = 0; r < rows; ++r) {
            const auto [d, where] = order[static_cast<std::size_t>(r)];
            const Worker& w = workers[where.first];
            kept.draw.push_back(d);
            for (std::size_t c = 0; c < nIn; ++c) kept.inputs(r, static_cast<Eigen::Index>(c)) = w.keptInputs[where.second * nIn + c];
            for (std::size_t c = 0; c < nOut; ++c)
                kept.outputs(r, static_cast<Eigen::Index>(c)) = w.keptOutputs[where.second * nOut + c];
        }
    }
    return run;
}

std::string ensembleFingerprint(const Model& model, const EnsembleSettings& settings)
{
    const BalancePlan plan = BalancePlan::build(model);
    if (plan.hasStructuralErrors()) return {};
    return fingerprintOf(EnsembleInputs::build(model, plan, settings), settings.analyses);
}

}  // namespace tl::ensemble
