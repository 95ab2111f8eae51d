// Small invented models shared by the network tests (test data only, not from any survey).
#pragma once

#include <optional>
#include <string>

#include "core/model/model.h"
#include "core/network/flow_network.h"
#include "tests/support/small_models.h"

namespace tl::testing {

// A four-level chain with 10 % transfer at every step (common practice, no source):
// algae P = 1000 -> grazers Q = 100, P = 10 -> predators Q = 10, P = 1 -> top Q = 1,
// P = 0.1, all of it landed by one fleet. Every EE is left for the solver.
inline Model tenPercentChain()
{
    Model m;
    m.addCompartment(makeCompartment("Algae", CompartmentKind::Producer, 100.0, 10.0, std::nullopt));
    m.addCompartment(makeCompartment("Grazers", CompartmentKind::Consumer, 10.0, 1.0, 10.0, std::nullopt, 0.2));
    m.addCompartment(makeCompartment("Predators", CompartmentKind::Consumer, 1.0, 1.0, 10.0, std::nullopt, 0.2));
    m.addCompartment(makeCompartment("Top", CompartmentKind::Consumer, 0.1, 1.0, 10.0, std::nullopt, 0.2));
    m.addCompartment(makeCompartment("Detritus", CompartmentKind::Detritus, std::nullopt, std::nullopt, std::nullopt));
    m.setDiet(1, 0, 1.0);
    m.setDiet(2, 1, 1.0);
    m.setDiet(3, 2, 1.0);
    const std::size_t f = m.addFleet("Nets");
    m.fleet(f).landings[3] = 0.1;
    return m;
}

// A web with omnivory, detritivory, cannibalism, imported food, immigration, two
// detritus pools with explicit routing, and a fleet with discards (invented values).
inline Model richWeb()
{
    Model m;
    m.addCompartment(makeCompartment("Phytoplankton", CompartmentKind::Producer, 20.0, 80.0, std::nullopt));
    m.addCompartment(makeCompartment("Macrophytes", CompartmentKind::Producer, 50.0, 4.0, std::nullopt));
    m.addCompartment(makeCompartment("Zooplankton", CompartmentKind::Consumer, 6.0, 20.0, 70.0, std::nullopt, 0.3));
    m.addCompartment(makeCompartment("Benthos", CompartmentKind::Consumer, 12.0, 3.0, 15.0, std::nullopt, 0.4));
    m.addCompartment(makeCompartment("Planktivores", CompartmentKind::Consumer, 2.0, 1.5, 9.0, std::nullopt, 0.2));
    m.addCompartment(makeCompartment("Piscivores", CompartmentKind::Consumer, 0.5, 0.8, 4.0, std::nullopt, 0.2));
    m.addCompartment(makeCompartment("Detritus", CompartmentKind::Detritus, 100.0, std::nullopt, std::nullopt));
    m.addCompartment(makeCompartment("Plant litter", CompartmentKind::Detritus, 40.0, std::nullopt, std::nullopt));
    // diet(predator, prey)
    m.setDiet(2, 0, 0.8);
    m.setDiet(2, 6, 0.2);
    m.setDiet(3, 6, 0.6);
    m.setDiet(3, 7, 0.3);
    m.setDiet(3, 2, 0.1);
    m.setDiet(4, 2, 0.7);
    m.setDiet(4, 3, 0.2);
    m.setDietImport(4, 0.1);
    m.setDiet(5, 4, 0.6);
    m.setDiet(5, 3, 0.3);
    m.setDiet(5, 5, 0.1);  // cannibalism
    m.setRouting(1, 7, 1.0);  // macrophytes to plant litter
    m.setRouting(3, 6, 0.5);
    m.setRouting(3, 7, 0.5);
    m.compartment(4).value(Param::NetEmigration) = -0.2;  // immigration
    m.compartment(6).value(Param::DetritusImport) = 30.0;
    const std::size_t f = m.addFleet("Gillnets");
    m.fleet(f).landings[4] = 0.3;
    m.fleet(f).landings[5] = 0.1;
    m.fleet(f).discards[4] = 0.1;
    m.fleet(f).discardSurvival[4] = 0.5;
    return m;
}

// Invented three-node web: plants eaten by a herbivore and an omnivore, the omnivore
// also eating the herbivore (half plants, half herbivore). The plants' and the
// herbivore's respiration are the callers' (each test balances its own boundary).
inline FlowNetwork omnivoreWeb(double plantRespiration, double herbivoreRespiration)
{
    FlowNetwork net;
    net.names = {"Plants", "Herbivore", "Omnivore"};
    net.roles = {NodeRole::Producer, NodeRole::Consumer, NodeRole::Consumer};
    net.stocks = {10, 4, 2};
    net.imports = {100, 0, 0};
    net.foodImport = {0, 0, 0};
    net.exports = {0, 0, 0.5};
    net.respiration = {plantRespiration, herbivoreRespiration, 3.5};
    net.production = {100, 2, 0.5};
    net.flows = Eigen::MatrixXd::Zero(3, 3);
    net.flows(0, 1) = 20;
    net.flows(0, 2) = 2;
    net.flows(1, 2) = 2;
    return net;
}

}  // namespace tl::testing
