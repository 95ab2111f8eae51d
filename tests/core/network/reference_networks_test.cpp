// The 58 published flow networks of the enaR data collection (Borrett & Lau 2014,
// Methods Ecol Evol 5:1206; each network's own literature source is listed in
// tests/fixtures/reference/README.md): every system indicator and every trophic level
// must match the reference figures (numpy implementation of Finn 1976 and Ulanowicz
// 1986, cross-checked there against enaR; TL cross-checked against networkx 2.8.8).
#include <cmath>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "tests/support/test_support.h"

#include "core/io/scor.h"
#include "core/network/flow_network.h"
#include "core/network/flow_trophic_level.h"
#include "core/network/indicators.h"

namespace tl {
namespace {

const std::string kReference = std::string(TL_FIXTURES_DIR) + "/reference";

using testing::readTsv;

double relativeDifference(double actual, double expected)
{
    if (expected == 0.0) return std::abs(actual);
    return std::abs(actual - expected) / std::abs(expected);
}

FlowNetwork loadNetwork(const std::string& slug)
{
    const ScorReadResult read = readScorFile(kReference + "/scor/" + slug + ".scor");
    EXPECT_TRUE(read.network.has_value()) << slug << ": " << (read.problems.empty() ? "" : read.problems[0].describe());
    return read.network ? flowNetworkFromScor(*read.network) : FlowNetwork{};
}

TEST(ReferenceNetworks, EveryIndicatorMatchesWithin1e4Relative)
{
    std::map<std::string, std::map<std::string, double>> expected;
    for (const auto& row : readTsv(kReference + "/expected_indices.tsv")) expected[row[0]][row[1]] = std::stod(row[2]);
    ASSERT_EQ(expected.size(), 58u);

    constexpr double kTolerance = 1e-4;  // the brief's bound; the actual worst case is printed
    double worst = 0.0;
    std::string worstWhere;
    for (const auto& [slug, figures] : expected) {
        const FlowNetwork net = loadNetwork(slug);
        ASSERT_GT(net.size(), 0u) << slug;
        const SystemIndicators s = systemIndicators(net);
        const std::map<std::string, double> actual = {
            {"Boundary", s.boundaryInput}, {"TST", s.tst}, {"TSTp", s.tstp}, {"APL", s.apl},
            {"FCI", s.fci}, {"AMI", s.ami}, {"H", s.flowDiversity}, {"ASC", s.ascendency},
            {"CAP", s.capacity}, {"OH", s.overhead}, {"L", static_cast<double>(s.links)},
            {"C", s.connectance}, {"LD", s.linkDensity}};
        ASSERT_EQ(figures.size(), actual.size()) << slug;
        for (const auto& [key, want] : figures) {
            const double got = actual.at(key);
            const double rel = relativeDifference(got, want);
            EXPECT_LE(rel, kTolerance) << slug << " " << key << ": got " << got << ", reference " << want;
            if (rel > worst) {
                worst = rel;
                worstWhere = slug + " " + key;
            }
        }
    }
    std::cout << "worst relative difference over 58 networks: " << worst << " (" << worstWhere << ")\n";
}

TEST(ReferenceNetworks, TrophicLevelsMatchReferenceAndLivingFlags)
{
    std::map<std::string, std::vector<std::pair<double, bool>>> expected;
    for (const auto& row : readTsv(kReference + "/expected_tl.tsv"))
        expected[row[0]].emplace_back(std::stod(row[2]), row[3] == "1");
    ASSERT_EQ(expected.size(), 58u);
    std::size_t compared = 0;
    for (const auto& [slug, nodes] : expected) {
        const FlowNetwork net = loadNetwork(slug);
        ASSERT_EQ(net.size(), nodes.size()) << slug;
        const FlowTrophicLevels levels = flowTrophicLevels(net);
        ASSERT_FALSE(levels.singular) << slug;
        for (std::size_t j = 0; j < nodes.size(); ++j) {
            EXPECT_EQ(net.isLiving(j), nodes[j].second) << slug << " node " << j + 1;
            EXPECT_LE(relativeDifference(levels.tl[j], nodes[j].first), 1e-9)
                << slug << " node " << j + 1 << " (" << net.names[j] << "): got " << levels.tl[j] << ", reference "
                << nodes[j].first;
            ++compared;
        }
    }
    EXPECT_EQ(compared, 2162u);
}

// Lake Findley (Richey et al. 1978, Science 202:1183), read from its SCOR file: the
// throughflow of zooplankton, worked by hand from the file: inflow 0.3 (self) + 2.2
// (from particulate organic carbon), no import: T = 2.5.
TEST(ReferenceNetworks, LakeFindleyThroughflowByHand)
{
    const FlowNetwork net = loadNetwork("lake_findley");
    ASSERT_EQ(net.size(), 4u);
    EXPECT_EQ(net.names[0], "ZOOPLANKTON");
    EXPECT_DOUBLE_EQ(net.throughflow(0), 2.5);
    EXPECT_DOUBLE_EQ(net.throughflow(2), 16.3);  // import only
    EXPECT_EQ(net.roles[0], NodeRole::Consumer);
    EXPECT_EQ(net.roles[2], NodeRole::Detritus);
}

}  // namespace
}  // namespace tl
