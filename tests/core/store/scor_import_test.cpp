// core/store/scor_import: a published SCOR flow network turned into a Model must give
// back, through the mass-balance solver, the network's own flows, respiration and
// trophic levels.
//
// Network: Charca de Maspalomas lagoon (Almunia et al. 1999, Estuar Coast Shelf Sci
// 49:221), as distributed with the R package enaR (Borrett & Lau 2014); see
// tests/fixtures/store/README.md. Expected trophic levels: the reference data's `TL`
// (computed on the flows, checked against networkx 2.8.8 trophic_levels).
#include "core/store/scor_import.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <random>

#include "core/balance/solver.h"
#include "core/io/scor.h"

namespace tl {
namespace {

const std::filesystem::path kCharca = std::filesystem::path(TL_FIXTURES_DIR) / "store" / "charca_de_maspalomas_lagoon.scor";

// reference.json, model charca_de_maspalomas_lagoon, "TL" (node order of the file).
const std::vector<double> kExpectedTl = {1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 2.0, 2.034460675412359, 2.467326290103853,
                                         3.2822011820094663, 2.0, 2.025276694768526, 2.1150441525455648,
                                         3.1150441525455648, 2.1858406920909275, 2.0, 3.675601429327282,
                                         3.2683185015752128, 1.0, 1.0, 1.0};

double relDiff(double a, double b) { return std::abs(a - b) / std::max({std::abs(a), std::abs(b), 1e-300}); }

class CharcaImport : public ::testing::Test {
protected:
    void SetUp() override
    {
        auto read = readScorFile(kCharca);
        ASSERT_TRUE(read.network) << (read.problems.empty() ? "" : read.problems[0].describe());
        net = *read.network;
        imported = modelFromScor(net, kCharca.string());
        ASSERT_TRUE(imported.model);
        sheet = solveBalance(*imported.model);
    }
    ScorNetwork net;
    ScorImport imported;
    BalanceSheet sheet;
};

TEST_F(CharcaImport, KindsFollowLivingFlagsAndIntake)
{
    const Model& m = *imported.model;
    ASSERT_EQ(m.size(), 21u);
    EXPECT_EQ(m.compartment(0).kind, CompartmentKind::Producer);     // Cyanobacteria
    EXPECT_EQ(m.compartment(5).kind, CompartmentKind::Producer);     // Periphyton
    EXPECT_EQ(m.compartment(6).kind, CompartmentKind::Consumer);     // Pelagic bacteria (eat DOC)
    EXPECT_EQ(m.compartment(17).kind, CompartmentKind::Consumer);    // Dicentrarchus
    EXPECT_EQ(m.compartment(18).kind, CompartmentKind::Detritus);    // DOC
    EXPECT_EQ(m.compartment(20).kind, CompartmentKind::Detritus);    // Sedimented POC
    for (std::size_t i = 0; i < m.size(); ++i) {
        if (m.compartment(i).kind == CompartmentKind::Consumer) {
            EXPECT_NEAR(m.dietRowSum(i), 1.0, 1e-12) << m.compartment(i).name;
        }
    }
}

TEST_F(CharcaImport, FlowsBetweenDetritusPoolsAreReportedNotLost)
{
    // 20 -> 19 (27097) and 20 -> 21 (93467) in the file: a Model cannot route detritus
    // into detritus, so each is a warning naming both pools.
    int warnings = 0;
    for (const Problem& p : imported.problems) {
        EXPECT_EQ(p.severity, Severity::Warning) << p.describe();
        if (p.code == "scor-detritus-to-detritus") {
            ++warnings;
            EXPECT_EQ(p.compartment, "Suspended POC");
            EXPECT_EQ(p.location->file, kCharca.string());
        }
    }
    EXPECT_EQ(warnings, 2);
}

TEST_F(CharcaImport, SolvedModelReproducesTheNetworksFeedingFlowsAndRespiration)
{
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);
    const Model& m = *imported.model;
    // Every feeding flow F(prey -> predator) = B_j (Q/B)_j DC_ij.
    int checked = 0;
    for (const ScorFlow& f : net.flows) {
        if (!m.compartment(f.to).isLiving()) continue;
        const CompartmentBalance& pred = sheet.rows[f.to];
        EXPECT_LT(relDiff(pred.consumption * m.diet(f.to, f.from), f.value), 1e-12)
            << m.compartment(f.from).name << " -> " << m.compartment(f.to).name;
        ++checked;
    }
    EXPECT_GT(checked, 30);
    for (std::size_t i = 0; i < m.size(); ++i) {
        if (m.compartment(i).kind != CompartmentKind::Consumer) continue;
        EXPECT_LT(relDiff(sheet.rows[i].respiration, net.respiration[i]), 1e-12) << m.compartment(i).name;
        // The network is balanced, so the solved EE leaves exactly its flows to detritus.
        double toDetritus = 0.0;
        for (const ScorFlow& f : net.flows)
            if (f.from == i && !m.compartment(f.to).isLiving()) toDetritus += f.value;
        EXPECT_LT(relDiff(sheet.rows[i].flowToDetritus, toDetritus), 1e-9) << m.compartment(i).name;
        EXPECT_LE(sheet.rows[i].ee, 1.0 + 1e-12) << m.compartment(i).name;
    }
}

TEST_F(CharcaImport, TrophicLevelsMatchTheReferenceData)
{
    ASSERT_EQ(sheet.rows.size(), kExpectedTl.size());
    for (std::size_t i = 0; i < kExpectedTl.size(); ++i)
        EXPECT_NEAR(sheet.rows[i].tl, kExpectedTl[i], 1e-9) << sheet.rows[i].name;
}

TEST_F(CharcaImport, FlowOrderInTheNetworkDoesNotChangeTheModel)
{
    ScorNetwork shuffled = net;
    std::mt19937 rng(7);
    std::shuffle(shuffled.flows.begin(), shuffled.flows.end(), rng);
    const ScorImport again = modelFromScor(shuffled, kCharca.string());
    ASSERT_TRUE(again.model);
    EXPECT_EQ(*again.model, *imported.model);
}

TEST(ScorImport, RepeatedFlowsBetweenTheSamePairAreSummed)
{
    ScorNetwork net;
    net.names = {"algae", "grazer", "detritus"};
    net.livingCount = 2;
    net.stocks = {5.0, 2.0, 10.0};
    net.imports = {100.0, 0.0, 0.0};
    net.exports = {0.0, 0.0, 40.0};
    net.respiration = {40.0, 10.0, 0.0};
    net.flows = {{0, 1, 30.0}, {0, 2, 30.0}, {1, 2, 20.0}};
    ScorNetwork split = net;  // algae -> grazer given as 10 + 20, out of order
    split.flows = {{1, 2, 20.0}, {0, 1, 10.0}, {0, 2, 30.0}, {0, 1, 20.0}};
    const ScorImport a = modelFromScor(net, "tiny.scor"), b = modelFromScor(split, "tiny.scor");
    ASSERT_TRUE(a.model);
    ASSERT_TRUE(b.model);
    EXPECT_EQ(*b.model, *a.model);
    EXPECT_DOUBLE_EQ(b.model->compartment(1).value(Param::QB).value_or(0), 30.0 / 2.0);
    EXPECT_DOUBLE_EQ(b.model->diet(1, 0), 1.0);
}

TEST(ScorImport, LivingNodeWithoutStockIsAnError)
{
    ScorNetwork net;
    net.names = {"algae", "grazer", "detritus"};
    net.livingCount = 2;
    net.stocks = {5.0, 0.0, 10.0};
    net.imports = {100.0, 0.0, 0.0};
    net.exports = {0.0, 0.0, 40.0};
    net.respiration = {40.0, 10.0, 0.0};
    net.flows = {{0, 1, 30.0}, {0, 2, 30.0}, {1, 2, 20.0}};
    const ScorImport result = modelFromScor(net, "tiny.scor");
    EXPECT_FALSE(result.model);
    ASSERT_EQ(result.problems.size(), 1u);
    EXPECT_EQ(result.problems[0].code, "scor-no-biomass");
    EXPECT_EQ(result.problems[0].compartment, "grazer");
    EXPECT_EQ(result.problems[0].location->file, "tiny.scor");
}

}  // namespace
}  // namespace tl
