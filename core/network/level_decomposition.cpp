#include "core/network/level_decomposition.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <Eigen/LU>

namespace tl {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kNegligibleShare = 1e-12;

// A consumer takes food from other nodes; a node that takes nothing from others starts
// chains at level I (as its trophic level is fixed at 1).
bool isFed(const FlowNetwork& net, const Eigen::MatrixXd& flows, std::size_t j)
{
    if (net.roles[j] != NodeRole::Consumer) return false;
    const auto J = static_cast<Eigen::Index>(j);
    return flows.col(J).sum() - flows(J, J) > 0.0;
}

// The network's flows with the feeding cycles among living compartments removed.
Eigen::MatrixXd withoutFeedingCycles(const FlowNetwork& net, FeedingCycleRemoval& removal)
{
    std::vector<Eigen::Index> living;
    for (std::size_t i = 0; i < net.size(); ++i)
        if (net.isLiving(i)) living.push_back(static_cast<Eigen::Index>(i));
    const auto L = static_cast<Eigen::Index>(living.size());
    Eigen::MatrixXd block(L, L);
    Eigen::VectorXd inputs(L);
    for (Eigen::Index r = 0; r < L; ++r) {
        inputs[r] = net.imports[static_cast<std::size_t>(living[static_cast<std::size_t>(r)])];
        for (Eigen::Index c = 0; c < L; ++c) block(r, c) = net.flows(living[static_cast<std::size_t>(r)], living[static_cast<std::size_t>(c)]);
    }
    removal = removeFeedingCycles(block, inputs);
    Eigen::MatrixXd flows = net.flows;
    for (Eigen::Index r = 0; r < L; ++r)
        for (Eigen::Index c = 0; c < L; ++c)
            flows(living[static_cast<std::size_t>(r)], living[static_cast<std::size_t>(c)]) = removal.residual(r, c);
    return flows;
}

// Shares s_jk for chains seeded at level I where `seed` is 1 and at level II where
// `seedAtII` is 1 (consumers living on imported food only).
Eigen::MatrixXd chainShares(const FlowNetwork& net, const Eigen::MatrixXd& feeding, const std::vector<bool>& fed,
                            const Eigen::VectorXd& seed, const Eigen::VectorXd& seedAtII, int maxLevels)
{
    const auto N = static_cast<Eigen::Index>(net.size());
    std::vector<Eigen::VectorXd> levels{seed};
    Eigen::VectorXd next(N);
    for (;;) {
        next = feeding.transpose() * levels.back();  // next_j = sum_i a_ij s_ik
        for (Eigen::Index j = 0; j < N; ++j)
            if (!fed[static_cast<std::size_t>(j)]) next(j) = 0.0;
        if (levels.size() == 1) next += seedAtII;
        if (next.size() == 0 || next.maxCoeff() < kNegligibleShare) break;
        if (static_cast<int>(levels.size()) == maxLevels) {
            // Longer chains (feeding cycles, deep webs): their whole remainder,
            // sum_{t>=0} (A^T)^t next = (I - A^T)^-1 next, goes to the last level kept.
            const Eigen::FullPivLU<Eigen::MatrixXd> lu(Eigen::MatrixXd::Identity(N, N) - feeding.transpose());
            if (lu.isInvertible()) levels.back() += lu.solve(next);
            break;
        }
        levels.push_back(next);
    }
    Eigen::MatrixXd shares(N, static_cast<Eigen::Index>(levels.size()));
    for (std::size_t k = 0; k < levels.size(); ++k) shares.col(static_cast<Eigen::Index>(k)) = levels[k];
    return shares;
}

ChainDecomposition summarise(const FlowNetwork& net, const std::vector<bool>& fed, Eigen::MatrixXd shares, int levelCount)
{
    const std::size_t n = net.size();
    const auto N = static_cast<Eigen::Index>(n);
    if (shares.cols() < levelCount) {
        const Eigen::Index old = shares.cols();
        shares.conservativeResize(N, levelCount);
        shares.rightCols(levelCount - old).setZero();
    }
    bool productionKnown = false;
    for (std::size_t j = 0; j < n; ++j)
        if (net.isLiving(j) && std::isfinite(net.production[j])) productionKnown = true;

    // Food each node passes to consumers.
    std::vector<double> passed(n, 0.0);
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j < n; ++j)
            if (fed[j]) passed[i] += net.flows(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j));

    ChainDecomposition out;
    for (int k = 0; k < levelCount; ++k) {
        TrophicLevelBin bin;
        bin.level = k + 1;
        for (std::size_t j = 0; j < n; ++j) {
            const double s = shares(static_cast<Eigen::Index>(j), k);
            if (s == 0.0) continue;
            bin.throughput += s * net.throughflow(j);
            bin.biomass += s * net.stocks[j];
            if (net.roles[j] == NodeRole::Detritus) bin.biomassDetritus += s * net.stocks[j];
            if (std::isfinite(net.production[j])) bin.production += s * net.production[j];
            const double caught = net.catchTotal(j);
            bin.catchTotal += s * caught;
            bin.passedUp += s * passed[j];
            bin.exportOther += s * (net.exports[j] - net.landings(j));
        }
        if (!productionKnown) bin.production = kNaN;
        bin.te = k > 0 && bin.throughput > 0.0 ? (bin.passedUp + bin.catchTotal + bin.exportOther) / bin.throughput : kNaN;
        out.levels.push_back(bin);
    }
    for (std::size_t k = 0; k < out.levels.size(); ++k) {
        TrophicLevelBin& bin = out.levels[k];
        const bool last = k + 1 == out.levels.size();
        bin.productionRatio = !last && bin.production > 0.0 ? out.levels[k + 1].production / bin.production : kNaN;
    }
    out.meanTe = kNaN;
    if (out.levels.size() >= 4) {
        const double a = out.levels[1].te, b = out.levels[2].te, c = out.levels[3].te;
        if (a > 0 && b > 0 && c > 0) out.meanTe = std::cbrt(a * b * c);
    }
    out.share = std::move(shares);
    return out;
}

}  // namespace

Eigen::VectorXd LevelDecomposition::effectiveTrophicLevels() const
{
    const Eigen::MatrixXd& s = combined.share;
    Eigen::VectorXd etl = Eigen::VectorXd::Zero(s.rows());
    for (Eigen::Index k = 0; k < s.cols(); ++k) etl += static_cast<double>(k + 1) * s.col(k);
    return etl;
}

LevelDecomposition decomposeLevels(const FlowNetwork& net, int maxLevels, FeedingCycles cycles)
{
    maxLevels = std::max(maxLevels, 2);
    const std::size_t n = net.size();
    const auto N = static_cast<Eigen::Index>(n);
    LevelDecomposition out;
    out.cycles = cycles;
    const Eigen::MatrixXd flows = cycles == FeedingCycles::Removed ? withoutFeedingCycles(net, out.cycleRemoval) : net.flows;
    std::vector<bool> fed(n);
    Eigen::MatrixXd feeding = Eigen::MatrixXd::Zero(N, N);  // a_ij = F_ij / sum_k F_kj for fed j
    Eigen::VectorXd producerSeed = Eigen::VectorXd::Zero(N), detritusSeed = Eigen::VectorXd::Zero(N);
    Eigen::VectorXd importFedSeed = Eigen::VectorXd::Zero(N), none = Eigen::VectorXd::Zero(N);
    for (std::size_t j = 0; j < n; ++j) {
        const auto J = static_cast<Eigen::Index>(j);
        fed[j] = isFed(net, flows, j);
        if (fed[j]) feeding.col(J) = flows.col(J) / flows.col(J).sum();
        else if (net.roles[j] == NodeRole::Detritus) detritusSeed(J) = 1.0;
        else if (net.roles[j] == NodeRole::Producer) producerSeed(J) = 1.0;
        else importFedSeed(J) = 1.0;  // imported food counts as level-I food, as in core/balance/trophic_level.h
    }
    Eigen::MatrixXd fromProducers = chainShares(net, feeding, fed, producerSeed, importFedSeed, maxLevels);
    Eigen::MatrixXd fromDetritus = chainShares(net, feeding, fed, detritusSeed, none, maxLevels);
    const int levelCount = static_cast<int>(std::max(fromProducers.cols(), fromDetritus.cols()));
    const auto pad = [&](Eigen::MatrixXd& m) {
        const Eigen::Index old = m.cols();
        m.conservativeResize(N, levelCount);
        m.rightCols(levelCount - old).setZero();
    };
    pad(fromProducers);
    pad(fromDetritus);
    const Eigen::MatrixXd combined = fromProducers + fromDetritus;

    // Level I: shares of primary production and of detritus inflow that consumers eat.
    double primary = 0, primaryEaten = 0, detritusIn = 0, detritusEaten = 0;
    for (std::size_t i = 0; i < n; ++i) {
        if (net.roles[i] == NodeRole::Consumer) continue;
        double eaten = 0;
        for (std::size_t j = 0; j < n; ++j)
            if (net.roles[j] == NodeRole::Consumer) eaten += net.flows(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j));
        if (net.roles[i] == NodeRole::Producer) {
            primary += net.imports[i];
            primaryEaten += eaten;
        } else {
            detritusIn += net.throughflow(i);
            detritusEaten += eaten;
        }
    }
    out.primaryProductionConsumed = primary > 0.0 ? primaryEaten / primary : kNaN;
    out.detritusInflowConsumed = detritusIn > 0.0 ? detritusEaten / detritusIn : kNaN;

    out.fromProducers = summarise(net, fed, std::move(fromProducers), levelCount);
    out.fromDetritus = summarise(net, fed, std::move(fromDetritus), levelCount);
    out.combined = summarise(net, fed, combined, levelCount);
    return out;
}

std::string levelName(int level)
{
    static const char* names[] = {"I",  "II",  "III",  "IV",  "V",  "VI",  "VII",  "VIII",  "IX",  "X",
                                  "XI", "XII", "XIII", "XIV", "XV", "XVI", "XVII", "XVIII", "XIX", "XX"};
    return level >= 1 && level <= 20 ? names[level - 1] : std::to_string(level);
}

}  // namespace tl
