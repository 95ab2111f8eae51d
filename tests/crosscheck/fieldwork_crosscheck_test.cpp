// The fieldwork estimators against scipy (tests/crosscheck/fieldwork_scipy.py, which
// computes them independently from the raw data): the length-converted catch curve's
// slope, its SE and t interval (scipy.stats.linregress, t.ppf) on 40 seeded random
// length-frequency samples with random point choices; the stratified swept-area mean,
// SE, Satterthwaite df and interval on 30 random surveys; Student's t quantiles at
// fractional degrees of freedom.
#include <cstdlib>
#include <random>

#include <gtest/gtest.h>

#include "core/fieldwork/length_mortality.h"
#include "core/fieldwork/student_t.h"
#include "core/fieldwork/swept_area.h"
#include "tests/support/test_support.h"

namespace tl::fieldwork {
namespace {

using nlohmann::json;

json runScipy(const json& cases, const testing::fs::path& dir)
{
    testing::writeText(dir / "cases.json", cases.dump());
    const std::string cmd = "/usr/bin/python3 " + testing::shellQuoted(TL_FIELDWORK_SCIPY) + " " +
                            testing::shellQuoted((dir / "cases.json").string()) + " > " +
                            testing::shellQuoted((dir / "out.json").string());
    if (std::system(cmd.c_str()) != 0) return nullptr;
    return json::parse(testing::slurp(dir / "out.json"));
}

TEST(FieldworkCrosscheck, CatchCurveSweptAreaAndTAgainstScipy)
{
    const testing::ScratchDir dir("fieldwork_scipy");
    std::mt19937_64 rng(20261202);
    json cases = json::array();
    std::vector<CatchCurveResult> curves;
    std::vector<SweptAreaResult> surveys;
    std::vector<double> tValues;

    for (int c = 0; c < 40; ++c) {
        const double linf = std::uniform_real_distribution<>(30, 120)(rng);
        const double k = std::uniform_real_distribution<>(0.1, 0.8)(rng);
        const double width = std::uniform_real_distribution<>(1, 5)(rng);
        std::vector<LengthClass> classes;
        json from = json::array(), to = json::array(), count = json::array();
        for (double lo = 0.1 * linf; lo + width < 0.95 * linf; lo += width) {
            const double n = std::floor(std::uniform_real_distribution<>(1, 500)(rng) * std::exp(-lo / linf * 3));
            classes.push_back({"x", lo, lo + width, std::max(1.0, n), {}});
            from.push_back(lo);
            to.push_back(lo + width);
            count.push_back(std::max(1.0, n));
        }
        std::vector<std::size_t> selected;
        for (std::size_t i = 0; i < classes.size(); ++i)
            if (std::bernoulli_distribution(0.7)(rng)) selected.push_back(i);
        if (selected.size() < 3) selected = {0, 1, 2};
        CatchCurveResult r = lengthConvertedCatchCurve(classes, {linf, k}, selected, 0.95);
        if (!r.estimate.valid) continue;  // a rising random sample: nothing to compare
        curves.push_back(r);
        cases.push_back({{"kind", "catch_curve"}, {"linf", linf}, {"k", k}, {"from", from}, {"to", to},
                         {"count", count}, {"selected", selected}, {"level", 0.95}});
    }
    ASSERT_GE(curves.size(), 20u);
    const std::size_t firstSurvey = cases.size();

    for (int s = 0; s < 30; ++s) {
        const int strata = std::uniform_int_distribution<>(1, 4)(rng);
        std::string hauls = "station,haul,date,stratum,swept_area_km2,taxon,catch_kg\n";
        std::string strataCsv = "stratum,area_km2\n";
        json areas = json::array(), cpua = json::array();
        for (int h = 0; h < strata; ++h) {
            const double area = std::uniform_real_distribution<>(1, 50)(rng);
            strataCsv += "s" + std::to_string(h) + "," + std::to_string(area) + "\n";
            areas.push_back(std::stod(std::to_string(area)));
            json group = json::array();
            const int n = std::uniform_int_distribution<>(2, 9)(rng);
            for (int i = 0; i < n; ++i) {
                const double swept = std::uniform_real_distribution<>(0.005, 0.05)(rng);
                const double kg = std::lognormal_distribution<>(1.0, 1.0)(rng);
                const std::string sweptText = std::to_string(swept), kgText = std::to_string(kg);
                // Appended piece by piece: GCC 12 warns wrongly (-Wrestrict) about the chained '+'.
                hauls.append("h").append(std::to_string(h)).append("_").append(std::to_string(i));
                hauls.append(",1,2026-07-01,s").append(std::to_string(h)).append(",").append(sweptText);
                hauls.append(",fish,").append(kgText).append("\n");
                group.push_back(std::stod(kgText) / std::stod(sweptText));
            }
            cpua.push_back(group);
        }
        const auto survey = parseHauls(hauls, "h.csv");
        const auto st = parseStrata(strataCsv, "s.csv");
        ASSERT_TRUE(survey.value && st.value);
        TaxonMapping m;
        m.compartmentOf["fish"] = "Fish";
        SweptAreaOptions o;
        o.catchability = std::uniform_real_distribution<>(0.3, 1.0)(rng);
        const SweptAreaResult r = sweptAreaBiomass(*survey.value, m, "Fish", *st.value, o);
        ASSERT_TRUE(r.estimate.valid);
        surveys.push_back(r);
        cases.push_back({{"kind", "swept_area"}, {"areas", areas}, {"cpua", cpua}, {"x1", o.catchability}, {"level", 0.95}});
    }
    const std::size_t firstT = cases.size();
    for (double df : {0.6, 1.3, 2.39, 7.7, 55.5})
        for (double p : {0.9, 0.975, 0.995}) {
            tValues.push_back(studentTQuantile(p, df));
            cases.push_back({{"kind", "t"}, {"p", p}, {"df", df}, {"at", tValues.back()}});
        }

    const json py = runScipy(cases, dir.path());
    ASSERT_FALSE(py.is_null()) << "fieldwork_scipy.py failed";
    ASSERT_EQ(py.size(), cases.size());
    for (std::size_t i = 0; i < curves.size(); ++i) {
        const json& ref = py[i];
        const CatchCurveResult& r = curves[i];
        const double z = ref["z"].get<double>();
        EXPECT_NEAR(r.estimate.value, z, 1e-9 * std::max(1.0, std::abs(z))) << "case " << i;
        EXPECT_NEAR(r.slopeSe, ref["slope_se"].get<double>(), 1e-9) << "case " << i;
        EXPECT_NEAR(r.intercept, ref["intercept"].get<double>(), 1e-8) << "case " << i;
        EXPECT_NEAR(r.r2, ref["r2"].get<double>(), 1e-9) << "case " << i;
        EXPECT_NEAR(*r.estimate.ciLow, ref["ci_low"].get<double>(), 1e-8) << "case " << i;
        EXPECT_NEAR(*r.estimate.ciHigh, ref["ci_high"].get<double>(), 1e-8) << "case " << i;
    }
    for (std::size_t i = 0; i < surveys.size(); ++i) {
        const json& ref = py[firstSurvey + i];
        const SweptAreaResult& r = surveys[i];
        const double mean = ref["mean"].get<double>();
        EXPECT_NEAR(r.densityKgPerKm2, mean, 1e-9 * mean) << "survey " << i;
        EXPECT_NEAR(r.seKgPerKm2, ref["se"].get<double>(), 1e-9 * mean) << "survey " << i;
        EXPECT_NEAR(r.degreesOfFreedom, ref["df"].get<double>(), 1e-9 * ref["df"].get<double>()) << "survey " << i;
        EXPECT_NEAR(*r.estimate.ciLow * 1000, ref["ci_low"].get<double>(), 1e-8 * mean) << "survey " << i;
        EXPECT_NEAR(*r.estimate.ciHigh * 1000, ref["ci_high"].get<double>(), 1e-8 * mean) << "survey " << i;
    }
    // Quantiles to 1e-8 relative: scipy's t.ppf is itself off by about 1.3e-9 at df 1.3, p 0.975
    // (its own t.cdf at its ppf gives 0.02499999996 in the upper tail; integrating the
    // density with scipy.integrate.quad gives 0.025 at ours). The CDF at our quantile is
    // held to 1e-12: that is where the accuracy shows.
    for (std::size_t i = 0; i < tValues.size(); ++i) {
        const json& ref = py[firstT + i];
        EXPECT_NEAR(tValues[i], ref["t"].get<double>(), 1e-8 * std::abs(tValues[i])) << cases[firstT + i].dump();
        EXPECT_NEAR(cases[firstT + i]["p"].get<double>(), ref["cdf_at"].get<double>(), 1e-12) << cases[firstT + i].dump();
    }
}

}  // namespace
}  // namespace tl::fieldwork
