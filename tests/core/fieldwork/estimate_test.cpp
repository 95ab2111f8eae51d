// Writing an estimate into a model: the value, its CV and a source note with method,
// inputs and date; the earlier value and source kept in the note; refused where the
// parameter does not belong.
#include <gtest/gtest.h>

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
