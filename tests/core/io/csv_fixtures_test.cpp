// The good CSV fixtures (tests/fixtures/csv_models/, invented data, see its README):
// the pond reads cleanly with the values in its files, survives a write/read round
// trip unchanged, writes the same bytes twice, and its spreadsheet-style twin
// (BOM, CRLF, quoted names, stray spaces, trailing blank rows) reads as the same model.
#include <gtest/gtest.h>

#include <filesystem>

#include "core/io/csv_model.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

fs::path pondFolder(std::string_view name) { return fs::path(TL_FIXTURES_DIR) / "csv_models" / name; }

std::string describeAll(const Problems& problems)
{
    std::string s;
    for (const Problem& p : problems) s += "  [" + std::string(severityKey(p.severity)) + "] " + p.describe() + "\n";
    return s;
}

Model readOrFail(const fs::path& folder)
{
    CsvReadResult r = readCsvModel(folder);
    EXPECT_TRUE(r.model.has_value()) << folder << "\n" << describeAll(r.problems);
    EXPECT_FALSE(hasErrors(r.problems)) << describeAll(r.problems);
    return r.model.value_or(Model{});
}

TEST(PondFixture, ReadsTheValuesOfItsFiles)
{
    const Model m = readOrFail(pondFolder("pond"));
    ASSERT_EQ(m.size(), 6u);
    const auto at = [&](std::string_view name) {
        const auto i = m.indexOf(name);
        EXPECT_TRUE(i.has_value()) << name;
        return i.value_or(0);
    };
    const std::size_t phyto = at("Phytoplankton"), zoo = at("Zooplankton"), benthos = at("Benthic invertebrates");
    const std::size_t roach = at("Roach"), pike = at("Pike"), detritus = at("Detritus");
    EXPECT_EQ(m.compartment(phyto).kind, CompartmentKind::Producer);
    EXPECT_EQ(m.compartment(detritus).kind, CompartmentKind::Detritus);
    EXPECT_EQ(m.compartment(roach).value(Param::Biomass), std::nullopt);  // to be solved
    EXPECT_EQ(m.compartment(roach).value(Param::EE), 0.85);
    EXPECT_EQ(m.compartment(zoo).value(Param::Unassim), 0.3);
    EXPECT_EQ(m.compartment(detritus).value(Param::DetritusImport), 5.0);
    EXPECT_EQ(m.diet(zoo, phyto), 0.8);
    EXPECT_EQ(m.diet(benthos, detritus), 0.7);
    EXPECT_EQ(m.diet(pike, roach), 0.9);
    EXPECT_EQ(m.dietImport(pike), 0.05);
    for (std::size_t j : {zoo, benthos, roach, pike}) EXPECT_NEAR(m.dietRowSum(j), 1.0, 1e-12) << j;
    ASSERT_EQ(m.fleets().size(), 1u);
    EXPECT_EQ(m.fleet(0).name, "Anglers");
    EXPECT_EQ(m.fleet(0).landings[roach], 0.5);
    EXPECT_EQ(m.fleet(0).discards[roach], 0.1);
    EXPECT_EQ(m.fleet(0).landings[pike], 0.3);
    EXPECT_DOUBLE_EQ(m.totalCatch(roach), 0.6);
}

TEST(PondFixture, RoundTripIsExactAndByteStable)
{
    const Model original = readOrFail(pondFolder("pond"));
    ScratchDir first("first"), second("second");
    const Problems w1 = writeCsvModel(original, first.path());
    ASSERT_FALSE(hasErrors(w1)) << describeAll(w1);
    const Model reread = readOrFail(first.path());
    EXPECT_EQ(reread, original);

    const Problems w2 = writeCsvModel(reread, second.path());
    ASSERT_FALSE(hasErrors(w2)) << describeAll(w2);
    std::size_t files = 0;
    for (const auto& entry : fs::directory_iterator(first.path())) {
        ++files;
        const fs::path twin = second.path() / entry.path().filename();
        ASSERT_TRUE(fs::exists(twin)) << twin;
        EXPECT_EQ(slurp(entry.path()), slurp(twin)) << entry.path().filename();
        EXPECT_EQ(entry.path().filename().string().find(".tmp"), std::string::npos) << "temporary file left behind";
    }
    EXPECT_GE(files, 3u);  // compartments, diet, harvest at least
    // Writing again over the same folder changes nothing either.
    const std::string before = slurp(first.path() / "compartments.csv");
    ASSERT_FALSE(hasErrors(writeCsvModel(reread, first.path())));
    EXPECT_EQ(slurp(first.path() / "compartments.csv"), before);
}

TEST(PondFixture, SpreadsheetQuirksReadAsTheSameModel)
{
    Model plain = readOrFail(pondFolder("pond"));
    const Model quirky = readOrFail(pondFolder("pond_quirks"));
    ASSERT_EQ(quirky.size(), 6u);
    const auto benthos = quirky.indexOf("Benthic invertebrates, \"mixed\"");
    ASSERT_TRUE(benthos.has_value()) << "quoted name with comma and doubled quotes";
    EXPECT_TRUE(quirky.indexOf("Roach").has_value()) << "names are trimmed";
    plain.compartment(*plain.indexOf("Benthic invertebrates")).name = "Benthic invertebrates, \"mixed\"";
    EXPECT_EQ(quirky, plain);
}

}  // namespace
}  // namespace tl::testing
