// The invented sample reservoir (sample_projects/reservoir, README there) solves, and
// is unbalanced exactly where its README says it is.
#include <gtest/gtest.h>

#include <filesystem>

#include "core/balance/balance_codes.h"
#include "core/balance/solver.h"
#include "core/io/csv_model.h"

namespace tl {
namespace {

TEST(SampleReservoir, SolvesWithTwoEEsSlightlyAboveOne)
{
    const CsvReadResult read = readCsvModel(std::filesystem::path(TL_SAMPLES_DIR) / "reservoir");
    ASSERT_TRUE(read.model) << (read.problems.empty() ? "" : read.problems.front().describe());
    for (const Problem& p : read.problems) EXPECT_NE(p.severity, Severity::Error) << p.describe();
    const Model& m = *read.model;
    EXPECT_EQ(m.size(), 20u);
    EXPECT_EQ(m.fleets().size(), 2u);
    EXPECT_EQ(m.detritusPools().size(), 2u);

    const BalanceSheet sheet = solveBalance(m);
    ASSERT_EQ(sheet.status, BalanceStatus::Unbalanced);
    std::vector<std::string> above;
    for (const Problem& p : sheet.problems) {
        if (p.severity != Severity::Error) continue;
        EXPECT_EQ(p.code, code::kEEAboveMax) << p.message;  // no other breach
        above.push_back(p.compartment);
    }
    EXPECT_EQ(above, (std::vector<std::string>{"Chironomid larvae", "Roach juveniles"}));
    for (const CompartmentBalance& r : sheet.rows) {
        if (r.name == "Chironomid larvae" || r.name == "Roach juveniles") {
            EXPECT_GT(r.ee, 1.05) << r.name;
            EXPECT_LT(r.ee, 1.2) << r.name;
        } else if (r.kind != CompartmentKind::Detritus) {
            EXPECT_LE(r.ee, 1.0) << r.name;
            EXPECT_GE(r.ee, 0.0) << r.name;
        } else {
            EXPECT_LT(r.ee, 1.0) << r.name;
        }
        if (r.kind == CompartmentKind::Consumer) {
            EXPECT_GT(r.respiration, 0.0) << r.name;
        }
        EXPECT_FALSE(std::isnan(r.tl)) << r.name;
    }
}

}  // namespace
}  // namespace tl
