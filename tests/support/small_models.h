// Small invented building blocks shared by the model, balance and network tests (test
// data only, not from any survey).
#pragma once

#include <optional>
#include <string>

#include "core/model/compartment.h"
#include "core/model/model.h"

namespace tl::testing {

inline Compartment makeCompartment(std::string name, CompartmentKind kind, std::optional<double> b = std::nullopt,
                                   std::optional<double> pb = std::nullopt, std::optional<double> qb = std::nullopt,
                                   std::optional<double> ee = std::nullopt, std::optional<double> u = std::nullopt)
{
    Compartment c;
    c.name = std::move(name);
    c.kind = kind;
    c.value(Param::Biomass) = b;
    c.value(Param::PB) = pb;
    c.value(Param::QB) = qb;
    c.value(Param::EE) = ee;
    c.value(Param::Unassim) = u;
    return c;
}

// Invented three-box pond: algae, a grazer eating algae (0.7) and detritus (0.3),
// detritus, and one fleet "Nets" landing `grazerLandings` of the grazer. No rates: each
// test gives the values it needs.
inline Model threeBoxPond(double grazerLandings)
{
    Model m;
    m.addCompartment(makeCompartment("Algae", CompartmentKind::Producer));
    m.addCompartment(makeCompartment("Grazer", CompartmentKind::Consumer));
    m.addCompartment(makeCompartment("Detritus", CompartmentKind::Detritus));
    m.setDiet(1, 0, 0.7);
    m.setDiet(1, 2, 0.3);
    const std::size_t nets = m.addFleet("Nets");
    m.fleet(nets).landings[1] = grazerLandings;
    return m;
}

}  // namespace tl::testing
