// Reconcile against a general-purpose reference library: for small invented webs
// (6-12 compartments, diets moving and not, catch moving on some), scipy's SLSQP
// (scipy.optimize.minimize(method="SLSQP"), Debian python3-scipy) on the same
// objective and constraints, written independently in reconcile_scipy.py from the
// model's raw inputs, reaches the same objective within 1e-4 relative.
#include <cstdlib>

#include <gtest/gtest.h>

#include "core/reconcile/reconcile.h"
#include "tests/core/reconcile/reconcile_problem_json.h"
#include "tests/core/reconcile/reconcile_test_models.h"
#include "tests/support/test_support.h"

namespace tl {
namespace {

nlohmann::json runScipy(const std::string& problem, const testing::fs::path& dir, const std::string& name)
{
    const auto file = dir / (name + ".json");
    testing::writeText(file, problem);
    const auto out = dir / (name + ".out");
    const std::string cmd = "/usr/bin/python3 " + testing::shellQuoted(TL_RECONCILE_SCIPY) + " " +
                            testing::shellQuoted(file.string()) + " > " + testing::shellQuoted(out.string());
    if (std::system(cmd.c_str()) != 0) return nullptr;
    return nlohmann::json::parse(testing::slurp(out));
}

struct Case {
    std::uint32_t seed;
    std::size_t size;
    bool moveDiet;
    bool moveCatch;
};

TEST(ReconcileCrosscheck, ScipySlsqpReachesTheSameObjective)
{
    const testing::ScratchDir dir("reconcile_scipy");
    const std::vector<Case> cases = {{1, 6, true, false},   {2, 7, false, false}, {3, 8, true, true},
                                     {4, 9, false, true},   {5, 10, true, false}, {6, 11, false, false},
                                     {7, 12, true, false},  {8, 12, false, true}, {9, 8, true, false},
                                     {10, 10, true, true}};
    int compared = 0;
    for (const Case& c : cases) {
        const Model m = testing::randomFoodWeb(c.seed, c.size);
        ReconcileOptions o;
        o.moveDiet = c.moveDiet;
        o.moveCatch = c.moveCatch;
        const ReconcileResult r = reconcile(m, o);
        ASSERT_TRUE(r.status == ReconcileStatus::Balanced || r.status == ReconcileStatus::Unchanged)
            << "seed " << c.seed << ": " << r.solverResult;
        const nlohmann::json py = runScipy(testing::reconcileProblemJson(m, o), dir.path(), "case" + std::to_string(c.seed));
        ASSERT_FALSE(py.is_null()) << "seed " << c.seed << ": reconcile_scipy.py failed";
        EXPECT_LE(py["max_violation"].get<double>(), 1e-6) << "seed " << c.seed << " " << py.dump();
        const double ref = py["objective"].get<double>();
        EXPECT_NEAR(r.objective, ref, 1e-4 * std::max(std::abs(ref), 1e-12))
            << "seed " << c.seed << " (" << c.size << " compartments, diet " << (c.moveDiet ? "moving" : "fixed")
            << "): C++ " << r.objective << " (" << r.variableCount << " variables, " << r.evaluations << " evaluations, " << r.solverResult << ", elastic " << r.elastic << "), scipy " << py.dump();
        if (ref > 0.0) ++compared;
        if (std::abs(r.objective - ref) > 1e-4 * ref && py.contains("x")) {
            const ReconcileProblem pr = ReconcileProblem::build(m, o);
            Eigen::VectorXd x(static_cast<Eigen::Index>(pr.variableCount())), values;
            for (Eigen::Index k = 0; k < x.size(); ++k) x[k] = py["x"][static_cast<std::size_t>(k)].get<double>();
            pr.evaluate(x, values, nullptr);
            // Diagnosis for a mismatch: scipy's answer in the C++ problem's terms.
            std::printf("seed %u: scipy's x in the C++ problem: objective %g, largest violation %g\n", c.seed, pr.objective(x, nullptr), pr.largestViolation(values));
        }
    }
    EXPECT_GE(compared, 8);  // at least eight webs that needed a change
}

}  // namespace
}  // namespace tl
