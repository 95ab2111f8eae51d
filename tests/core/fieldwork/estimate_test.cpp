// Writing an estimate into a model: the value, its CV and a source note with method,
// inputs and date; the earlier value and source kept in the note; refused where the
// parameter does not belong.
#include <gtest/gtest.h>

#include "core/fieldwork/apply_estimate.h"
#include "core/fieldwork/estimate.h"
#include "core/model/problem_codes.h"

namespace tl::fieldwork {
namespace {

Model twoBoxes()
{
    Model m;
    Compartment algae;
    algae.name = "Algae";
    algae.kind = CompartmentKind::Producer;
    m.addCompartment(algae);
    Compartment perch;
    perch.name = "Perch";
    perch.value(Param::Biomass) = 2.0;
    perch.confidenceOf(Param::Biomass).source = "guess";
    m.addCompartment(perch);
    Compartment det;
    det.name = "Detritus";
    det.kind = CompartmentKind::Detritus;
    m.addCompartment(det);
    return m;
}

TEST(WriteEstimate, ValueCvAndSourceNote)
{
    Model m = twoBoxes();
    Estimate e;
    e.quantity = "B";
    e.value = 3.5;
    e.cv = 0.2;
    e.ciLow = 2.0;
    e.ciHigh = 5.0;
    e.method = "swept area";
    e.inputs = {"hauls 12"};
    e.assumptions = {"catchability X1 = 0.5"};
    e.valid = true;
    EXPECT_TRUE(writeEstimate(m, 1, Param::Biomass, e, "2026-12-02T10:00:00Z").empty());
    const Compartment& c = m.compartment(1);
    EXPECT_EQ(c.value(Param::Biomass), 3.5);
    EXPECT_EQ(c.confidenceOf(Param::Biomass).cv, 0.2);
    const std::string& note = c.confidenceOf(Param::Biomass).source;
    for (const char* part : {"2026-12-02T10:00:00Z", "swept area", "hauls 12", "CV 0.2", "95 % CI 2 to 5",
                             "assumed: catchability X1 = 0.5", "before: 2", "earlier source: guess"})
        EXPECT_NE(note.find(part), std::string::npos) << part << " not in: " << note;

    // No CV (an empirical equation): grade C, CV cleared.
    Estimate q = e;
    q.quantity = "Q/B";
    q.cv.reset();
    EXPECT_TRUE(writeEstimate(m, 1, Param::QB, q, "d").empty());
    EXPECT_EQ(m.compartment(1).confidenceOf(Param::QB).grade, Confidence::Grade::C);
    EXPECT_FALSE(m.compartment(1).confidenceOf(Param::QB).cv);
}

TEST(WriteEstimate, WarnsWhenNothingIsLeftUnknown)
{
    Model m = twoBoxes();
    m.compartment(1).value(Param::Biomass).reset();  // B solved from a given EE
    m.compartment(1).value(Param::EE) = 0.9;
    Estimate e;
    e.value = 2.5;
    e.valid = true;
    const Problems p = writeEstimate(m, 1, Param::Biomass, e, "d");
    ASSERT_EQ(p.size(), 1u);
    EXPECT_EQ(p[0].code, code::kFieldworkNothingUnknown);
    EXPECT_EQ(p[0].severity, Severity::Warning);
    EXPECT_EQ(m.compartment(1).value(Param::Biomass), 2.5);  // written all the same
    // Writing it again (B now given): no warning.
    EXPECT_TRUE(writeEstimate(m, 1, Param::Biomass, e, "d").empty());
}

TEST(WriteEstimate, RefusesWrongTargets)
{
    Model m = twoBoxes();
    Estimate e;
    e.value = 1.0;
    e.valid = true;
    const Model before = m;
    EXPECT_EQ(writeEstimate(m, 0, Param::QB, e, "d").at(0).code, code::kFieldworkTarget);  // producer Q/B
    EXPECT_EQ(writeEstimate(m, 2, Param::PB, e, "d").at(0).code, code::kFieldworkTarget);  // detritus
    EXPECT_EQ(writeEstimate(m, 1, Param::EE, e, "d").at(0).code, code::kFieldworkTarget);  // not an estimate's parameter
    e.valid = false;
    EXPECT_EQ(writeEstimate(m, 1, Param::PB, e, "d").at(0).code, code::kFieldworkTarget);
    EXPECT_EQ(m, before);  // nothing changed
}

}  // namespace
}  // namespace tl::fieldwork

namespace tl::fieldwork {
namespace {

TEST(ApplyEstimate, ConvertsBiomassAndWritesMAsPBPlusF)
{
    Model m = twoBoxes();
    m.units.currency = "g C";
    m.units.area = "m²";
    m.addFleet("nets");
    m.fleet(0).landings[1] = 0.5;  // catch of Perch, g C/m²/year
    Estimate b = newEstimate("B", "t wet weight/km²");
    b.value = 0.45;
    b.cv = 0.2;
    b.ciLow = 0.3;
    b.ciHigh = 0.6;
    b.valid = true;
    Estimate written;
    ASSERT_TRUE(applyEstimate(m, 1, Param::Biomass, b, "d", {}, &written).empty());
    // 0.45 t wet weight/km² = 0.45 g wet weight/m² = 0.045 g C/m² (0.1 g C per g wet weight).
    EXPECT_NEAR(*m.compartment(1).value(Param::Biomass), 0.045, 1e-15);
    EXPECT_NEAR(*written.ciHigh, 0.06, 1e-15);
    EXPECT_EQ(written.unit, "g C/m²");
    EXPECT_NE(m.compartment(1).confidenceOf(Param::Biomass).source.find("0.1 g C per g wet weight"), std::string::npos);

    // M 0.4 -> P/B = 0.4 + F, F = 0.5 / 0.045.
    Estimate mort = newEstimate("M", "/year");
    mort.value = 0.4;
    mort.valid = true;
    ASSERT_TRUE(applyEstimate(m, 1, Param::PB, mort, "d").empty());
    EXPECT_NEAR(*m.compartment(1).value(Param::PB), 0.4 + 0.5 / 0.045, 1e-12);
    EXPECT_NE(m.compartment(1).confidenceOf(Param::PB).source.find("Allen 1971"), std::string::npos);

    // M with a CV 0.25 and interval 0.3-0.55: F is taken as known, so the SD of P/B is
    // that of M (0.1): CV 0.1 / (0.4 + F); the interval moves by F.
    Estimate uncertain = mort;
    uncertain.cv = 0.25;
    uncertain.ciLow = 0.3;
    uncertain.ciHigh = 0.55;
    const double f = 0.5 / 0.045;
    Estimate pb;
    ASSERT_TRUE(applyEstimate(m, 1, Param::PB, uncertain, "d", {}, &pb).empty());
    EXPECT_NEAR(*pb.cv, 0.1 / (0.4 + f), 1e-12);
    EXPECT_NEAR(*m.compartment(1).confidenceOf(Param::PB).cv, 0.1 / (0.4 + f), 1e-12);
    EXPECT_NEAR(*pb.ciLow, 0.3 + f, 1e-12);
    EXPECT_NEAR(*pb.ciHigh, 0.55 + f, 1e-12);

    // Without B there is no F: refused, nothing changed.
    m.compartment(1).value(Param::Biomass).reset();
    const Model before = m;
    EXPECT_EQ(applyEstimate(m, 1, Param::PB, mort, "d").at(0).code, code::kFieldworkTarget);
    EXPECT_EQ(m, before);
}

TEST(ApplyEstimate, DietRowReplacedAndNoted)
{
    Model m = twoBoxes();
    m.setDiet(1, 2, 1.0);  // Perch ate only detritus
    StomachDiet d;
    d.predator = "Perch";
    d.valid = true;
    d.method = "test";
    d.grade = Confidence::Grade::B;
    d.stomachs = 40;
    d.emptyStomachs = 3;
    d.shares = {{"Algae", 0.7, 0.7, 0.6, 0.1, 0.5, 0.9}, {"import", 0.3, 0.3, 0.4, 0.2, 0.1, 0.5}};
    std::string description = "baseline";
    ASSERT_TRUE(applyDiet(m, description, 1, d, "2026-12-02").empty());
    EXPECT_EQ(m.diet(1, 2), 0.0);
    EXPECT_EQ(m.diet(1, 0), 0.7);
    EXPECT_EQ(m.dietImport(1), 0.3);
    EXPECT_NE(description.find("baseline; fieldwork 2026-12-02: diet of Perch"), std::string::npos) << description;
    // The row's confidence: the stomach-count grade and the largest share's bootstrap CV.
    EXPECT_EQ(m.compartment(1).dietConfidence.grade, d.grade);
    EXPECT_EQ(m.compartment(1).dietConfidence.cv, std::optional<double>(0.1));
    EXPECT_NE(m.compartment(1).dietConfidence.source.find("fieldwork 2026-12-02"), std::string::npos);
    // Not a consumer; unknown prey.
    EXPECT_FALSE(applyDiet(m, description, 0, d, "d").empty());
    d.shares[0].prey = "Roach";
    const Model before = m;
    EXPECT_FALSE(applyDiet(m, description, 1, d, "d").empty());
    EXPECT_EQ(m, before);
}

}  // namespace
}  // namespace tl::fieldwork
