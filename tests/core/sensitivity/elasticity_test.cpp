// Local elasticities (core/sensitivity/elasticity.h): a pond worked by hand, the analytic
// derivatives against central differences on random webs of every unknown type, the
// diet path on its simplex, and the central-difference fallback of an over-determined
// system.
#include <array>
#include <cmath>

#include <gtest/gtest.h>

#include "core/balance/solver.h"
#include "core/sensitivity/elasticity.h"
#include "tests/core/sensitivity/sensitivity_models.h"

namespace tl {
namespace {

std::optional<std::size_t> inputIndex(const Model& m, const ElasticityResult& r, const std::string& name)
{
    for (std::size_t k = 0; k < r.inputs.size(); ++k)
        if (inputName(m, r.inputs[k]) == name) return k;
    return std::nullopt;
}

std::optional<std::size_t> outputIndex(const Model& m, const ElasticityResult& r, const std::string& name)
{
    for (std::size_t o = 0; o < r.outputs.size(); ++o)
        if (outputName(m, r.outputs[o]) == name) return o;
    return std::nullopt;
}

double elasticityOf(const Model& m, const ElasticityResult& r, const std::string& output, const std::string& input)
{
    const auto o = outputIndex(m, r, output);
    const auto k = inputIndex(m, r, input);
    if (!o || !k) {
        ADD_FAILURE() << "no " << (o ? "input " + input : "output " + output);
        return std::nan("");
    }
    return r.elasticity(static_cast<Eigen::Index>(*o), static_cast<Eigen::Index>(*k));
}

// handPond (sensitivity_models.h), worked by hand:
//   Grazer: B_G PB_G EE_G = B_P QB_P DC_GP + Y_G, so B_G = (1*5*0.5 + 2) / (5*0.8) = 1.125;
//           its elasticity to B_P, Q/B_P and DC_GP is the share of predation in the demand,
//           2.5 / 4.5 = 5/9; to the catch 2 / 4.5 = 4/9; to P/B_G and EE_G, -1.
//   Pike's diet on the simplex: moving DC_AP (0.3) by d ln = 1 moves DC_GP by
//           -0.5 * 0.3 / (1 - 0.3), i.e. d ln DC_GP = -3/7, so B_G's elasticity is -3/7 * 5/9;
//           moving the import (0.2): d ln DC_GP = -0.2 / 0.8, so -1/4 * 5/9.
//   Algae:  EE_A = (B_G QB_G 0.7 + B_P QB_P 0.3) / (B_A PB_A) = (15.75 + 1.5) / 2000; its
//           elasticity to Q/B_G is 15.75 / 17.25, to the Grazer's catch 15.75/17.25 * 4/9,
//           to B_A and P/B_A -1.
//   Pike:   EE_P = Y_P / (B_P PB_P) = 0.2: elasticity 1 to its catch, -1 to B_P and P/B_P.
//           TL_P = 1 + (2 DC_GP + 1 DC_AP) / (DC_GP + DC_AP) (import left out, TL_G = 2):
//           along DC_GP's path dDC_GP = 0.5, dDC_AP = -0.3 * 0.5 / 0.5 = -0.3, so
//           dTL = (0.7 * 0.8 - 1.3 * 0.2) / 0.8^2 = 0.46875 and e = 0.46875 / 2.625.
//   Grazer's P/Q = 5 / 20: +1 to P/B_G, -1 to Q/B_G.
//   Detritus: EE_D = C / I, C = B_G QB_G 0.3 = 6.75; I = unused production + egestion of all
//           (one pool) = (2000 - 17.25) + (0.2 * 5.625 + 0.2 * 22.5) + (0.8 * 1 + 0.2 * 5)
//           = 1990.175. Algae's B moves only I, by B_A P/B_A = 2000 (its demand is fixed): e =
//           -2000 / I. The Grazer's catch moves B_G by 4/9 (dB_G = 0.5): dC / C = 4/9; dI =
//           -0.7 * 20 * 0.5 (more algae eaten) + 0.2 * 5 * 0.5 + 0.2 * 20 * 0.5 = -4.5.
TEST(Elasticity, PondWorkedByHand)
{
    const Model m = testing::handPond();
    const ElasticityResult r = computeElasticities(m);
    ASSERT_TRUE(r.error.empty()) << r.error;
    EXPECT_TRUE(r.methodNote.empty()) << r.methodNote;
    const double tol = 1e-12;
    const double predation = 5.0 / 9.0, fishing = 4.0 / 9.0;
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.biomass", "Pike.biomass"), predation, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.biomass", "Pike.qb"), predation, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.biomass", "Grazer.catch"), fishing, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.biomass", "Grazer.pb"), -1.0, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.biomass", "Grazer.ee"), -1.0, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.biomass", "Grazer.qb"), 0.0, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.biomass", "Pike.diet:Grazer"), predation, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.biomass", "Pike.diet:Algae"), -3.0 / 7.0 * predation, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.biomass", "Pike.diet:import"), -0.25 * predation, tol);

    const double grazing = 15.75 / 17.25;
    EXPECT_NEAR(elasticityOf(m, r, "Algae.ee", "Grazer.qb"), grazing, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Algae.ee", "Grazer.catch"), grazing * fishing, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Algae.ee", "Grazer.pb"), -grazing, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Algae.ee", "Algae.biomass"), -1.0, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Algae.ee", "Algae.pb"), -1.0, tol);

    EXPECT_NEAR(elasticityOf(m, r, "Pike.ee", "Pike.catch"), 1.0, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Pike.ee", "Pike.biomass"), -1.0, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Pike.ee", "Pike.pb"), -1.0, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Pike.ee", "Grazer.catch"), 0.0, tol);

    EXPECT_NEAR(elasticityOf(m, r, "Pike.tl", "Pike.diet:Grazer"), 0.46875 / 2.625, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Pike.tl", "Pike.diet:import"), 0.0, tol);  // import is renormalised away
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.tl", "Grazer.diet:Algae"), 0.0, tol);  // both prey at level 1
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.pq", "Grazer.pb"), 1.0, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.pq", "Grazer.qb"), -1.0, tol);
    const double inflow = 1990.175;
    EXPECT_NEAR(elasticityOf(m, r, "Detritus.ee", "Algae.biomass"), -2000.0 / inflow, tol);
    EXPECT_NEAR(elasticityOf(m, r, "Detritus.ee", "Grazer.catch"), fishing + 4.5 / inflow, tol);

    // Every output is analytic here, and the outputs are the ones the brief lists.
    for (const SensitivityOutput& o : r.outputs) EXPECT_EQ(o.method, DerivativeMethod::Analytic);
    EXPECT_TRUE(outputIndex(m, r, "Grazer.biomass"));
    EXPECT_TRUE(outputIndex(m, r, "Detritus.ee"));
    EXPECT_FALSE(outputIndex(m, r, "Pike.biomass"));  // given, not solved
    EXPECT_FALSE(outputIndex(m, r, "Algae.tl"));      // a producer's level is 1 by definition
}

void expectAnalyticMatchesCentral(const Model& m, const std::string& label)
{
    const ElasticityResult analytic = computeElasticities(m);
    ASSERT_TRUE(analytic.error.empty()) << label << ": " << analytic.error;
    ASSERT_TRUE(analytic.methodNote.empty()) << label << ": " << analytic.methodNote;
    ElasticityOptions o;
    o.forceCentralDifferences = true;
    const ElasticityResult central = computeElasticities(m, o);
    ASSERT_EQ(analytic.elasticity.rows(), central.elasticity.rows());
    ASSERT_EQ(analytic.elasticity.cols(), central.elasticity.cols());
    int compared = 0;
    for (Eigen::Index r = 0; r < analytic.elasticity.rows(); ++r)
        for (Eigen::Index c = 0; c < analytic.elasticity.cols(); ++c) {
            const double a = analytic.elasticity(r, c), d = central.elasticity(r, c);
            ASSERT_EQ(std::isfinite(a), std::isfinite(d))
                << label << ": " << outputName(m, analytic.outputs[static_cast<std::size_t>(r)]) << " / "
                << inputName(m, analytic.inputs[static_cast<std::size_t>(c)]) << " analytic " << a << " central " << d;
            if (!std::isfinite(a)) continue;
            EXPECT_NEAR(a, d, 1e-6 + 1e-5 * std::abs(a))
                << label << ": " << outputName(m, analytic.outputs[static_cast<std::size_t>(r)]) << " / "
                << inputName(m, analytic.inputs[static_cast<std::size_t>(c)]);
            compared += a != 0.0;
        }
    EXPECT_GT(compared, 10) << label;
}

TEST(Elasticity, PondAnalyticMatchesCentralDifferences) { expectAnalyticMatchesCentral(testing::handPond(), "hand pond"); }

TEST(Elasticity, AnalyticMatchesCentralDifferencesOnRandomWebs)
{
    int unknownKinds[6] = {};
    std::array<int, 11> inputKinds{};  // per SensitivityInputKind
    for (std::uint32_t seed = 1; seed <= 40; ++seed) {
        const Model m = testing::randomSquareWeb(seed, 4 + seed % 9);
        const BalanceSheet sheet = solveBalance(m);
        ASSERT_NE(sheet.status, BalanceStatus::Invalid)
            << "seed " << seed << ": " << (sheet.problems.empty() ? "" : sheet.problems.front().message);
        for (const CompartmentBalance& row : sheet.rows) {
            if (row.solved.contains(Param::Biomass)) ++unknownKinds[0];
            if (row.solved.contains(Param::PB) && row.solved.contains(Param::QB)) ++unknownKinds[1];
            else if (row.solved.contains(Param::PB)) ++unknownKinds[2];
            else if (row.solved.contains(Param::QB)) ++unknownKinds[3];
            if (row.solved.contains(Param::EE) && isLiving(row.kind)) ++unknownKinds[4];
        }
        for (const SensitivityInput& input : sensitivityInputs(m)) ++inputKinds[static_cast<std::size_t>(input.kind)];
        expectAnalyticMatchesCentral(m, "seed " + std::to_string(seed));
    }
    // ... and every kind of input.
    for (std::size_t k = 0; k < inputKinds.size(); ++k) EXPECT_GT(inputKinds[k], 5) << "input kind " << k;
    // The webs did exercise every kind of unknown (B, tied P/B and Q/B, P/B, Q/B from P/Q, EE).
    for (int k = 0; k < 5; ++k) EXPECT_GT(unknownKinds[k], 5) << "unknown kind " << k;
}

// Q/B solved through a fully given prey's equation (the only equation it enters).
TEST(Elasticity, SolvedConsumptionRateMatchesCentralDifferences)
{
    Model m = testing::handPond();
    // Algae fully given: its equation determines the Grazer's Q/B.
    m.compartment(0).value(Param::EE) = 0.01;
    m.compartment(1).value(Param::QB).reset();
    m.compartment(1).value(Param::Biomass) = 1.125;
    const BalanceSheet sheet = solveBalance(m);
    ASSERT_NE(sheet.status, BalanceStatus::Invalid);
    ASSERT_TRUE(sheet.rows[1].solved.contains(Param::QB));
    expectAnalyticMatchesCentral(m, "Q/B solved");
    // By hand: QB_G = (EE_A B_A PB_A - B_P QB_P 0.3) / (B_G 0.7), so its elasticity to EE_A
    // is 20 / (20 - 1.5).
    const ElasticityResult r = computeElasticities(m);
    EXPECT_NEAR(elasticityOf(m, r, "Grazer.qb", "Algae.ee"), 20.0 / 18.5, 1e-12);
}

TEST(Elasticity, DietPathKeepsTheRowOnItsSimplex)
{
    const Model m = testing::handPond();
    for (const SensitivityInput& input : sensitivityInputs(m)) {
        if (input.kind != SensitivityInputKind::Diet) continue;
        for (double h : {0.3, -0.3}) {
            const Model moved = perturbedModel(m, input, h);
            EXPECT_NEAR(moved.dietRowSum(input.compartment), m.dietRowSum(input.compartment), 1e-15);
            const double now = input.prey == kImportPrey ? moved.dietImport(input.compartment)
                                                          : moved.diet(input.compartment, input.prey);
            EXPECT_NEAR(now, input.value * std::exp(h), 1e-15);
        }
    }
    // A single-entry diet (the Grazer eating only Algae) has no path: not an input.
    Model single = testing::handPond();
    single.setDiet(1, 3, 0.0);
    single.setDiet(1, 0, 1.0);
    for (const SensitivityInput& input : sensitivityInputs(single))
        EXPECT_FALSE(input.kind == SensitivityInputKind::Diet && input.compartment == 1);
}

TEST(Elasticity, OverDeterminedSystemUsesCentralDifferences)
{
    Model m = testing::handPond();
    // Algae fully given while the Grazer's B is solved: Algae's equation involves B_G too,
    // so the solver fits two equations to one unknown by least squares and every output
    // uses central differences. EE_A is chosen so that both equations hold at the point.
    // Pike's EE has its own equation only, so its elasticities are known exactly.
    m.compartment(0).value(Param::EE) = 17.25 / 2000.0;
    const ElasticityResult r = computeElasticities(m);
    ASSERT_TRUE(r.error.empty()) << r.error;
    EXPECT_FALSE(r.methodNote.empty());
    for (const SensitivityOutput& o : r.outputs) EXPECT_EQ(o.method, DerivativeMethod::CentralDifference);
    EXPECT_NEAR(elasticityOf(m, r, "Pike.ee", "Pike.catch"), 1.0, 1e-8);
    EXPECT_NEAR(elasticityOf(m, r, "Pike.ee", "Pike.pb"), -1.0, 1e-8);
    EXPECT_TRUE(std::isfinite(elasticityOf(m, r, "Grazer.biomass", "Pike.biomass")));
}

TEST(Elasticity, UnsolvableScenarioIsAnErrorNotNumbers)
{
    Model m = testing::handPond();
    m.compartment(2).value(Param::Biomass).reset();  // Pike: B and EE both unknown
    const ElasticityResult r = computeElasticities(m);
    EXPECT_EQ(r.status, BalanceStatus::Invalid);
    EXPECT_NE(r.error.find("does not solve"), std::string::npos) << r.error;
    EXPECT_NE(r.error.find("Pike"), std::string::npos) << r.error;
    EXPECT_EQ(r.elasticity.size(), 0);
}

TEST(Elasticity, OnlyTheAskedOutputIsComputed)
{
    const Model m = testing::handPond();
    ElasticityOptions o;
    o.only = {{1, SensitivityOutputKind::Biomass}};
    const ElasticityResult one = computeElasticities(m, o);
    ASSERT_EQ(one.outputs.size(), 1u);
    const ElasticityResult all = computeElasticities(m);
    const auto row = outputIndex(m, all, "Grazer.biomass");
    ASSERT_TRUE(row);
    for (Eigen::Index k = 0; k < one.elasticity.cols(); ++k)
        EXPECT_EQ(one.elasticity(0, k), all.elasticity(static_cast<Eigen::Index>(*row), k));
}

TEST(Elasticity, TooManyElasticitiesAreRefusedWithAReason)
{
    const Model m = testing::handPond();
    ElasticityOptions o;
    o.maxEntries = 10;
    const ElasticityResult r = computeElasticities(m, o);
    EXPECT_TRUE(r.tooLarge);
    EXPECT_NE(r.error.find("--output"), std::string::npos) << r.error;
    EXPECT_TRUE(r.outputs.empty());
    o.only = {{1, SensitivityOutputKind::Biomass}};  // one output x 15 inputs: above 10 still
    EXPECT_TRUE(computeElasticities(m, o).tooLarge);
    o.maxEntries = 100;
    EXPECT_FALSE(computeElasticities(m, o).tooLarge);
}

// Damaged inputs (values removed, zeroed, negated, diets cut to one entry) never crash the
// computation: either a reason and no numbers, or a matrix of the listed size.
TEST(Elasticity, DamagedWebsGiveAReasonOrAFullMatrix)
{
    int refused = 0, computed = 0;
    for (std::uint32_t seed = 100; seed < 300; ++seed) {
        Model m = testing::randomSquareWeb(seed, 3 + seed % 7);
        std::mt19937 rng(seed);
        for (int damage = 0; damage < 3; ++damage) {
            const std::size_t i = rng() % m.size();
            Compartment& c = m.compartment(i);
            const Param p = kAllParams[rng() % 5];
            switch (rng() % 4) {
            case 0: c.value(p).reset(); break;
            case 1: c.value(p) = 0.0; break;
            case 2: c.value(p) = -c.valueOr(p, 1.0); break;
            default:
                if (!m.dietRow(i).empty()) {
                    const std::size_t keep = m.dietRow(i).front().col;
                    for (const GridEntry e : std::vector<GridEntry>(m.dietRow(i).begin(), m.dietRow(i).end()))
                        m.setDiet(i, e.col, e.col == keep ? 1.0 : 0.0);
                    m.setDietImport(i, 0.0);
                }
            }
        }
        const ElasticityResult r = computeElasticities(m);
        if (!r.error.empty()) {
            ++refused;
            EXPECT_EQ(r.elasticity.size(), 0) << seed;
            continue;
        }
        ++computed;
        EXPECT_EQ(r.elasticity.rows(), static_cast<Eigen::Index>(r.outputs.size())) << seed;
        EXPECT_EQ(r.elasticity.cols(), static_cast<Eigen::Index>(r.inputs.size())) << seed;
    }
    EXPECT_GT(refused, 10);
    EXPECT_GT(computed, 10);
}

TEST(Elasticity, OutputNamesParse)
{
    EXPECT_EQ(parseOutputKind("b"), SensitivityOutputKind::Biomass);
    EXPECT_EQ(parseOutputKind("biomass"), SensitivityOutputKind::Biomass);
    EXPECT_EQ(parseOutputKind("tl"), SensitivityOutputKind::TL);
    EXPECT_FALSE(parseOutputKind("TL"));
    EXPECT_FALSE(parseOutputKind("catch"));
}

}  // namespace
}  // namespace tl
