// PRCC (core/sensitivity/prcc.h; Marino et al. 2008 J Theor Biol 254:178) against an
// independent computation: tests/crosscheck/prcc_scipy.py ranks with
// scipy.stats.rankdata, regresses with numpy.linalg.lstsq and correlates the residuals
// with scipy.stats.pearsonr, step by step, on the same draws written to CSV; the
// p-values of the t test come from scipy.stats.t.sf. The C++
// uses the precision-matrix identity (or its own step-by-step path when the ranked
// covariance is singular), so the two share no code.
//
// Draws: the ensemble's own kept draws (core/ensemble, every kind of input: parameters,
// diet shares less one per row, flow terms) fed through prccOfKeptDraws; a small ensemble
// of the invented hand-worked pond (tests/core/sensitivity), solved draw by draw, with a constant column, a column of heavy ties and two diet
// shares whose sum is fixed (exactly collinear ranks); and plain random matrices.
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <random>

#include <gtest/gtest.h>

#include "core/balance/solver.h"
#include "core/sensitivity/ensemble_prcc.h"
#include "core/sensitivity/prcc.h"
#include "tests/core/sensitivity/sensitivity_models.h"
#include "tests/support/test_support.h"

namespace tl {
namespace {

nlohmann::json runScipy(const Eigen::MatrixXd& x, const Eigen::VectorXd& y, const testing::ScratchDir& dir,
                        const std::string& name)
{
    const auto csv = dir / (name + ".csv");
    std::string text;
    for (Eigen::Index j = 0; j < x.cols(); ++j) {
        text += 'x';
        text += std::to_string(j);
        text += ',';
    }
    text += "y\n";
    char cell[40];
    for (Eigen::Index r = 0; r < x.rows(); ++r) {
        for (Eigen::Index j = 0; j < x.cols(); ++j) {
            std::snprintf(cell, sizeof cell, "%.17g,", x(r, j));
            text += cell;
        }
        std::snprintf(cell, sizeof cell, "%.17g\n", y[r]);
        text += cell;
    }
    testing::writeText(csv, text);
    const auto out = dir / (name + ".json");
    const std::string cmd = "/usr/bin/python3 " + testing::shellQuoted(TL_PRCC_SCIPY) + " " +
                            testing::shellQuoted(csv.string()) + " > " + testing::shellQuoted(out.string());
    if (std::system(cmd.c_str()) != 0) return nullptr;
    return nlohmann::json::parse(testing::slurp(out));
}

void expectSame(const Eigen::MatrixXd& x, const Eigen::VectorXd& y, const testing::ScratchDir& dir,
                const std::string& name, int* defined)
{
    const nlohmann::json py = runScipy(x, y, dir, name);
    ASSERT_FALSE(py.is_null()) << name << ": prcc_scipy.py failed";
    ASSERT_EQ(py.at("draws").get<Eigen::Index>(), x.rows());
    const PrccResult ours = partialRankCorrelation(x, y);
    for (Eigen::Index j = 0; j < x.cols(); ++j) {
        const auto& ref = py.at("prcc")[static_cast<std::size_t>(j)];
        if (ref.is_null()) {
            EXPECT_TRUE(std::isnan(ours.coefficient[j])) << name << " input " << j << ": C++ " << ours.coefficient[j];
            continue;
        }
        EXPECT_NEAR(ours.coefficient[j], ref.get<double>(), 1e-9) << name << " input " << j;
        // p-values span hundreds of decades: compared relatively (scipy.stats.t.sf).
        const double p = py.at("p")[static_cast<std::size_t>(j)].get<double>();
        EXPECT_NEAR(ours.pValue[j], p, 1e-7 * p + 1e-300) << name << " input " << j;
        ++*defined;
    }
}

TEST(PrccCrosscheck, PondEnsembleMatchesScipy)
{
    const testing::ScratchDir dir("prcc_scipy");
    const Model base = testing::handPond();
    std::mt19937 rng(2026);
    std::normal_distribution<double> z(0.0, 1.0);
    std::uniform_real_distribution<double> u(0.0, 1.0);
    const int draws = 400;
    // Columns: Pike B, Pike Q/B, Grazer P/B, Grazer EE, Grazer catch (ties: steps of 0.5),
    // Algae B, Pike's Grazer share, Pike's Algae share (0.8 minus the Grazer share), and
    // the Detritus import (constant).
    Eigen::MatrixXd x(draws, 9);
    Eigen::VectorXd grazerB(draws), algaeEE(draws);
    for (int d = 0; d < draws; ++d) {
        Model m = base;
        auto lognormal = [&](double mean, double cv) { return mean * std::exp(cv * z(rng) - 0.5 * cv * cv); };
        const double share = 0.3 + 0.4 * u(rng);
        x.row(d) << lognormal(1.0, 0.3), lognormal(5.0, 0.2), lognormal(5.0, 0.25), std::min(0.95, lognormal(0.8, 0.1)),
            0.5 * std::round(2.0 * lognormal(2.0, 0.3)), lognormal(20.0, 0.4), share, 0.8 - share, 3.0;
        m.compartment(2).value(Param::Biomass) = x(d, 0);
        m.compartment(2).value(Param::QB) = x(d, 1);
        m.compartment(1).value(Param::PB) = x(d, 2);
        m.compartment(1).value(Param::EE) = x(d, 3);
        m.fleet(0).landings[1] = x(d, 4);
        m.compartment(0).value(Param::Biomass) = x(d, 5);
        m.setDiet(2, 1, x(d, 6));
        m.setDiet(2, 0, x(d, 7));
        m.compartment(3).value(Param::DetritusImport) = x(d, 8);
        const BalanceSheet sheet = solveBalance(m);
        ASSERT_NE(sheet.status, BalanceStatus::Invalid);
        grazerB[d] = sheet.rows[1].biomass;
        algaeEE[d] = sheet.rows[0].ee;
    }
    int defined = 0;
    expectSame(x, grazerB, dir, "pond_grazer_b", &defined);
    expectSame(x, algaeEE, dir, "pond_algae_ee", &defined);
    EXPECT_GE(defined, 12);  // 6 defined inputs per output (the diet pair is collinear, import constant)
    // The drivers come out as the balance says: B_G rises with Pike's B and falls with EE_G.
    const PrccResult r = partialRankCorrelation(x, grazerB);
    EXPECT_GT(r.coefficient[0], 0.5);
    EXPECT_LT(r.coefficient[3], -0.3);
    EXPECT_EQ(r.note[8], PrccNote::ConstantInput);
    EXPECT_EQ(r.note[6], PrccNote::Collinear);
}

// The ensemble-fed path as `tledger sensitivity --prcc` takes it: the pond's ensemble at
// 10-20 % CVs, its kept balanced draws, one diet share per row left out; scipy gets the
// same reduced input matrix and each output column, the C++ its table.
TEST(PrccCrosscheck, EnsembleFedPrccMatchesScipy)
{
    const testing::ScratchDir dir("prcc_scipy");
    Model m = testing::handPond();
    m.rules.cvByGrade = {0.1, 0.1, 0.15, 0.2};
    m.compartment(1).value(Param::NetEmigration) = 0.3;  // a flow term with a grade
    m.compartment(1).confidenceOf(Param::NetEmigration).grade = Confidence::Grade::B;
    ensemble::EnsembleSettings s;
    s.draws = 600;
    s.seed = 8;
    s.threads = 2;
    s.dietCv = 0.1;
    s.keepBalancedDraws = true;
    s.analyses.trophicLevels = true;
    const ensemble::EnsembleRun run = ensemble::runEnsemble(m, s);
    ASSERT_TRUE(run.ran());
    const ensemble::KeptDraws& kept = run.kept;
    ASSERT_GT(kept.draw.size(), 200u);
    const std::vector<std::string> outputs = {"Grazer.biomass", "Algae.ee", "Pike.ee", "Pike.tl"};
    const EnsemblePrcc prcc = prccOfKeptDraws(kept, outputs);
    ASSERT_EQ(prcc.table.outputNames, outputs);
    // Inputs: parameters, diets less one share per row, and flow terms (E, catch).
    for (const char* name : {"Pike.biomass", "Pike.diet:Grazer", "Grazer.net_emigration", "Grazer.catch", "Pike.catch"})
        EXPECT_NE(std::find(prcc.table.inputNames.begin(), prcc.table.inputNames.end(), name), prcc.table.inputNames.end())
            << name;
    Eigen::MatrixXd x(kept.inputs.rows(), static_cast<Eigen::Index>(prcc.table.inputNames.size()));
    for (std::size_t c = 0; c < prcc.table.inputNames.size(); ++c) {
        const auto at = std::find(kept.inputNames.begin(), kept.inputNames.end(), prcc.table.inputNames[c]);
        x.col(static_cast<Eigen::Index>(c)) = kept.inputs.col(at - kept.inputNames.begin());
    }
    int defined = 0;
    for (std::size_t o = 0; o < outputs.size(); ++o) {
        const auto at = std::find(kept.outputNames.begin(), kept.outputNames.end(), outputs[o]);
        const Eigen::VectorXd y = kept.outputs.col(at - kept.outputNames.begin());
        const nlohmann::json py = runScipy(x, y, dir, "ensemble_" + std::to_string(o));
        ASSERT_FALSE(py.is_null()) << outputs[o] << ": prcc_scipy.py failed";
        const PrccResult& ours = prcc.table.outputs[o];
        for (Eigen::Index j = 0; j < x.cols(); ++j) {
            const auto& ref = py.at("prcc")[static_cast<std::size_t>(j)];
            if (ref.is_null()) {
                EXPECT_TRUE(std::isnan(ours.coefficient[j])) << outputs[o] << " " << prcc.table.inputNames[static_cast<std::size_t>(j)];
                continue;
            }
            EXPECT_NEAR(ours.coefficient[j], ref.get<double>(), 1e-9) << outputs[o] << " " << prcc.table.inputNames[static_cast<std::size_t>(j)];
            const double p = py.at("p")[static_cast<std::size_t>(j)].get<double>();
            EXPECT_NEAR(ours.pValue[j], p, 1e-7 * p + 1e-300) << outputs[o];
            ++defined;
        }
    }
    // No input is constant or collinear once a share per row is left out: all defined.
    EXPECT_EQ(defined, static_cast<int>(outputs.size()) * static_cast<int>(x.cols()));
}

TEST(PrccCrosscheck, RandomMatricesMatchScipy)
{
    const testing::ScratchDir dir("prcc_scipy");
    int defined = 0;
    for (std::uint32_t seed = 1; seed <= 6; ++seed) {
        std::mt19937 rng(seed);
        std::uniform_real_distribution<double> u(0.0, 1.0);
        const Eigen::Index rows = 30 + 40 * seed, cols = 2 + seed;
        Eigen::MatrixXd x(rows, cols);
        for (Eigen::Index r = 0; r < rows; ++r)
            for (Eigen::Index c = 0; c < cols; ++c) x(r, c) = u(rng);
        x.col(1) = (x.col(1) * 3.0).array().floor();  // ties
        Eigen::VectorXd y(rows);
        for (Eigen::Index r = 0; r < rows; ++r)
            y[r] = std::exp(x(r, 0)) - 0.5 * x(r, 1) + 0.3 * std::sin(3.0 * x(r, cols - 1)) + 0.5 * u(rng);
        expectSame(x, y, dir, "random" + std::to_string(seed), &defined);
    }
    EXPECT_GE(defined, 30);
}

}  // namespace
}  // namespace tl
