// Flow terms of an ensemble (core/ensemble/ensemble_inputs.h): U, BA, E, detritus import
// and catch drawn from their data confidence, after the parameters and diets, so that
// holding them changes nothing else; BA and E keep their sign; a catch draw scales
// landings and dead discards together; a draw written into a model reads back as the
// same balance inputs.
#include <cmath>

#include <gtest/gtest.h>

#include "core/balance/balance_plan.h"
#include "core/ensemble/ensemble.h"
#include "tests/support/small_models.h"

namespace tl::ensemble {
namespace {

// The invented three-box pond with every flow term set (test data only).
Model pondWithFlowTerms()
{
    Model m = testing::threeBoxPond(0.4);
    Compartment& algae = m.compartment(0);
    algae.value(Param::Biomass) = 10.0;
    algae.value(Param::PB) = 50.0;
    algae.value(Param::BiomassAccum) = -0.5;
    algae.confidenceOf(Param::BiomassAccum).cv = 0.3;
    Compartment& grazer = m.compartment(1);
    grazer.value(Param::Biomass) = 2.0;
    grazer.value(Param::PB) = 1.5;
    grazer.value(Param::QB) = 8.0;
    grazer.value(Param::Unassim) = 0.25;
    grazer.confidenceOf(Param::Unassim).cv = 0.2;
    grazer.value(Param::NetEmigration) = 0.2;
    grazer.confidenceOf(Param::NetEmigration).grade = Confidence::Grade::D;
    Compartment& detritus = m.compartment(2);
    detritus.value(Param::DetritusImport) = 1.0;
    detritus.confidenceOf(Param::DetritusImport).grade = Confidence::Grade::B;
    m.fleet(0).discards[1] = 0.2;
    m.fleet(0).discardSurvival[1] = 0.5;  // dead discards 0.1: Y = 0.4 + 0.1
    return m;
}

EnsembleInputs inputsOf(const Model& m, const EnsembleSettings& s) { return EnsembleInputs::build(m, BalancePlan::build(m), s); }

std::size_t column(const EnsembleInputs& in, const std::string& name)
{
    for (std::size_t k = 0; k < in.size(); ++k)
        if (in.names()[k] == name) return k;
    ADD_FAILURE() << "no input named " << name;
    return 0;
}

TEST(EnsembleFlowTerms, DrawnAfterParametersAndDietsWithTheirConfidence)
{
    const Model m = pondWithFlowTerms();
    EnsembleSettings s;
    s.catchCv = 0.15;
    const EnsembleInputs in = inputsOf(m, s);
    const std::vector<std::string> expectedTail = {"Algae.biomass_accum", "Grazer.unassim", "Grazer.net_emigration",
                                                   "Detritus.detritus_import", "Grazer.catch"};
    ASSERT_EQ(in.flowTerms().size(), expectedTail.size());
    const std::size_t first = in.size() - expectedTail.size();
    for (std::size_t k = 0; k < expectedTail.size(); ++k) EXPECT_EQ(in.names()[first + k], expectedTail[k]);
    // Diet columns sit between the parameters and the flow terms.
    ASSERT_EQ(in.dietRows().size(), 1u);
    EXPECT_EQ(in.dietColumns(0), (std::pair<std::size_t, std::size_t>{in.parameters().size(), 2}));
    EXPECT_EQ(in.parameters().size() + 2, first);

    s.holdFlowTerms = true;
    const EnsembleInputs held = inputsOf(m, s);
    EXPECT_TRUE(held.flowTerms().empty());
    EXPECT_EQ(held.size(), first);
    EXPECT_NE(held.fingerprint(), in.fingerprint());
    // Same stream for what both draw: parameters and diets are the same numbers.
    BalanceInputs a = in.pointInputs(), b = held.pointInputs();
    std::vector<double> va(in.size()), vb(held.size());
    for (std::uint64_t d = 0; d < 200; ++d) {
        in.draw(5, d, a, va.data());
        held.draw(5, d, b, vb.data());
        for (std::size_t k = 0; k < first; ++k) ASSERT_EQ(va[k], vb[k]) << "draw " << d << " input " << k;
        EXPECT_EQ(b.catchTotal, held.pointInputs().catchTotal);
        EXPECT_EQ(b.biomassAccum, held.pointInputs().biomassAccum);
    }
}

// Over 100 000 draws the sample mean of each lognormal flow term is its point value and
// its sample CV the CV of its confidence (input_distribution.h: mean and CV exact). The
// bound on the mean is 5 standard errors; on the CV 5 % relative (its standard error at
// n = 1e5 is below 1 % of it for CV <= 0.8; a lognormal's fourth moment, from memory).
TEST(EnsembleFlowTerms, MeansAndCvsMatchTheirConfidenceAndSignsAreKept)
{
    const Model m = pondWithFlowTerms();
    EnsembleSettings s;
    s.catchCv = 0.15;
    const EnsembleInputs in = inputsOf(m, s);
    struct Expect {
        const char* name;
        double mean, cv;
    };
    const Expect expected[] = {{"Algae.biomass_accum", -0.5, 0.3},  {"Grazer.unassim", 0.25, 0.2},
                               {"Grazer.net_emigration", 0.2, 0.8}, {"Detritus.detritus_import", 1.0, 0.25},
                               {"Grazer.catch", 0.5, 0.15}};
    constexpr int kDraws = 100000;
    std::vector<double> sum(in.size()), sum2(in.size());
    BalanceInputs b = in.pointInputs();
    std::vector<double> v(in.size());
    const double pointDeadShare = b.deadDiscards[1] / b.catchTotal[1];
    ASSERT_NEAR(pointDeadShare, 0.2, 1e-15);
    bool signKept = true, discardsScaled = true;
    for (int d = 0; d < kDraws; ++d) {
        in.draw(11, static_cast<std::uint64_t>(d), b, v.data());
        for (std::size_t k = 0; k < v.size(); ++k) {
            sum[k] += v[k];
            sum2[k] += v[k] * v[k];
        }
        signKept = signKept && b.biomassAccum[0] < 0.0 && b.netEmigration[1] > 0.0;
        discardsScaled = discardsScaled && std::abs(b.deadDiscards[1] / b.catchTotal[1] - pointDeadShare) < 1e-12 &&
                         std::abs(b.discardsToPool.coeff(1, 2) - b.deadDiscards[1]) < 1e-12;
    }
    EXPECT_TRUE(signKept);
    EXPECT_TRUE(discardsScaled);
    for (const Expect& e : expected) {
        const std::size_t k = column(in, e.name);
        const double mean = sum[k] / kDraws;
        const double sd = std::sqrt(sum2[k] / kDraws - mean * mean);
        const double trueSd = e.cv * std::abs(e.mean);
        EXPECT_NEAR(mean, e.mean, 5.0 * trueSd / std::sqrt(double(kDraws))) << e.name;
        EXPECT_NEAR(sd / std::abs(mean), e.cv, 0.05 * e.cv) << e.name;
    }
}

TEST(EnsembleFlowTerms, ADrawWrittenIntoAModelReadsBackAsTheSameBalanceInputs)
{
    const Model m = pondWithFlowTerms();
    const EnsembleInputs in = inputsOf(m, EnsembleSettings{});
    BalanceInputs b = in.pointInputs();
    std::vector<double> v(in.size());
    Model drawn = m;
    for (std::uint64_t d = 0; d < 50; ++d) {
        in.draw(3, d, b, v.data());
        in.applyToModel(v.data(), drawn);  // repeatedly on one copy, as the workers do
        const BalanceInputs back = BalanceInputs::fromModel(drawn);
        for (auto [x, y] : {std::pair{&back.catchTotal, &b.catchTotal}, {&back.deadDiscards, &b.deadDiscards},
                            {&back.unassim, &b.unassim}, {&back.biomassAccum, &b.biomassAccum},
                            {&back.netEmigration, &b.netEmigration}, {&back.detritusImport, &b.detritusImport},
                            {&back.biomass, &b.biomass}})
            for (Eigen::Index i = 0; i < x->size(); ++i) {
                if (std::isnan((*y)[i])) EXPECT_TRUE(std::isnan((*x)[i])) << "draw " << d;  // detritus B: none
                else EXPECT_NEAR((*x)[i], (*y)[i], 1e-12 * std::abs((*y)[i])) << "draw " << d;
            }
        EXPECT_NEAR(back.discardsToPool.coeff(1, 2), b.discardsToPool.coeff(1, 2), 1e-12);
    }
}

}  // namespace
}  // namespace tl::ensemble
