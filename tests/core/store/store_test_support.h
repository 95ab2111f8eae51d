// Helpers shared by the store tests: a small invented model that uses every table
// (values, confidence, diet with import, routing to two pools, two fleets with
// discards and survival), temporary folders, and byte-exact file snapshots.
#pragma once

#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>
#include <sstream>
#include <string>

#include "core/model/model.h"
#include "core/store/project.h"
#include "tests/support/test_support.h"

namespace tl::testing {

// Invented numbers for tests only; they do not describe any real water body.
inline Model inventedModel(double scale = 1.0)
{
    Model m;
    auto add = [&](std::string name, CompartmentKind kind) {
        Compartment c;
        c.name = std::move(name);
        c.kind = kind;
        return m.addCompartment(std::move(c));
    };
    const auto pike = add("pike", CompartmentKind::Consumer);
    const auto roach = add("roach", CompartmentKind::Consumer);
    const auto zoo = add("zooplankton", CompartmentKind::Consumer);
    const auto algae = add("phytoplankton", CompartmentKind::Producer);
    const auto detritus = add("detritus", CompartmentKind::Detritus);
    const auto sediment = add("sediment detritus", CompartmentKind::Detritus);
    auto set = [&](std::size_t i, Param p, double v) { m.compartment(i).value(p) = v * scale; };
    set(pike, Param::Biomass, 0.8);
    set(pike, Param::PB, 0.45);
    set(pike, Param::QB, 3.1);
    set(roach, Param::Biomass, 6.25);
    set(roach, Param::PB, 1.1);
    set(roach, Param::PQ, 0.125);
    m.compartment(roach).value(Param::Unassim) = 0.3;
    set(zoo, Param::PB, 22.0);
    set(zoo, Param::QB, 80.0);
    m.compartment(zoo).value(Param::EE) = 0.9;
    set(algae, Param::Biomass, 14.0);
    set(algae, Param::PB, 120.0);
    m.compartment(detritus).value(Param::DetritusImport) = 0.1 + scale;
    m.compartment(pike).confidenceOf(Param::Biomass) = Confidence{Confidence::Grade::B, std::nullopt, "gill-net survey 2025"};
    m.compartment(roach).confidenceOf(Param::PB) = Confidence{Confidence::Grade::None, 0.35, "catch curve, \"rough\""};
    m.compartment(zoo).confidenceOf(Param::EE) = Confidence{Confidence::Grade::D, std::nullopt, ""};
    m.setDiet(pike, roach, 0.7);
    m.setDiet(pike, zoo, 0.1);
    m.setDietImport(pike, 0.2);
    m.compartment(pike).dietConfidence = Confidence{Confidence::Grade::C, 0.4, "31 stomachs, 2025"};
    m.setDiet(roach, zoo, 0.6);
    m.setDiet(roach, detritus, 0.4);
    m.setDiet(zoo, algae, 0.75);
    m.setDiet(zoo, detritus, 0.25);
    m.setRouting(roach, detritus, 0.6);
    m.setRouting(roach, sediment, 0.4);
    const auto nets = m.addFleet("gill nets");
    m.fleet(nets).landings[pike] = 0.05 * scale;
    m.fleet(nets).landings[roach] = 0.4;
    m.fleet(nets).discards[roach] = 0.02;
    m.fleet(nets).discardSurvival[roach] = 0.5;
    m.fleet(nets).discardPool = sediment;
    const auto anglers = m.addFleet("anglers");
    m.fleet(anglers).landings[pike] = 0.03;
    m.units.currency = "t wet weight";
    return m;
}

inline Project inventedProject(const std::string& title = "invented test project")
{
    Project p;
    p.info.title = title;
    p.info.notes = "Invented data for tests.";
    p.info.units.currency = "t wet weight";
    p.info.units.area = "km²";
    p.info.rules.eeMax = 0.99;
    Scenario base;
    base.name = "baseline";
    base.description = "starting point";
    base.model = inventedModel();
    base.layout["pike"] = LayoutPosition{120.5, -3.25};
    base.layout["roach"] = LayoutPosition{60.0, 40.0};
    Scenario more;
    more.name = "more nets";
    more.parent = "baseline";
    more.description = "twice the gill-net landings";
    more.model = inventedModel(2.0);
    p.scenarios = {base, more};
    for (Scenario& s : p.scenarios) {
        s.model.units = p.info.units;
        s.model.rules = p.info.rules;
    }
    return p;
}

// A fresh, empty folder (tests/support/test_support.h), by default under the system
// temporary directory; removed on destruction.
class TempDir : public ScratchDir {
public:
    explicit TempDir(const std::filesystem::path& base = std::filesystem::temp_directory_path())
        : ScratchDir("store", base)
    {
    }
};

inline std::string fileBytes(const std::filesystem::path& path) { return slurp(path); }
inline void writeBytes(const std::filesystem::path& path, const std::string& bytes) { writeText(path, bytes); }

// The content a user cares about: scenarios and runs, without save timestamps.
inline bool sameContent(const Project& a, const Project& b)
{
    if (a.info.title != b.info.title || a.info.notes != b.info.notes || a.info.units != b.info.units ||
        a.info.rules != b.info.rules || a.scenarios.size() != b.scenarios.size())
        return false;
    for (std::size_t i = 0; i < a.scenarios.size(); ++i) {
        const Scenario& x = a.scenarios[i];
        const Scenario& y = b.scenarios[i];
        if (x.name != y.name || x.description != y.description || x.parent != y.parent || !(x.model == y.model) ||
            x.layout != y.layout)
            return false;
    }
    return true;
}

}  // namespace tl::testing
