// Small invented building blocks shared by the model, balance and network tests (test
// data only, not from any survey).
#pragma once

#include <optional>
#include <string>

#include "core/model/compartment.h"

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

}  // namespace tl::testing
