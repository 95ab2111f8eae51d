// Small invented models and networks shared by the network tests (test data only, not
// from any survey), and the set-up most of them share: solve a model, build its network.
#pragma once

#include <initializer_list>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "core/balance/solver.h"
#include "core/model/model.h"
#include "core/network/flow_network.h"
#include "tests/support/small_models.h"

namespace tl::testing {

// One node of a network worked by hand (no food import).
struct HandNode {
    std::string name;
    NodeRole role = NodeRole::Consumer;
    double stock = 0, imports = 0, exports = 0, respiration = 0, production = 0;
};

// One flow of a network worked by hand: `value` from node `from` to node `to`.
struct HandFlow {
    Eigen::Index from = 0, to = 0;
    double value = 0;
};

// A network worked by hand: the nodes in order and the flows between them; no fleets
// (a caller that needs them sets fleetNames, fleetLandings and fleetDeadDiscards).
inline FlowNetwork handNetwork(const std::vector<HandNode>& nodes, std::initializer_list<HandFlow> flows)
{
    FlowNetwork net;
    for (const HandNode& node : nodes) {
        net.names.push_back(node.name);
        net.roles.push_back(node.role);
        net.stocks.push_back(node.stock);
        net.imports.push_back(node.imports);
        net.foodImport.push_back(0.0);
        net.exports.push_back(node.exports);
        net.respiration.push_back(node.respiration);
        net.production.push_back(node.production);
    }
    const auto n = static_cast<Eigen::Index>(nodes.size());
    net.flows = Eigen::MatrixXd::Zero(n, n);
    for (const HandFlow& f : flows) net.flows(f.from, f.to) += f.value;
    return net;
}

// A model with its balance sheet and, unless the sheet is Invalid, its flow network:
// the set-up of most network tests, which then assert on sheet.status.
//   const auto [model, sheet, net] = testing::solvedScenario(testing::richWeb());
struct SolvedScenario {
    Model model;
    BalanceSheet sheet;
    FlowNetwork net;
};

inline SolvedScenario solvedScenario(Model model)
{
    BalanceSheet sheet = solveBalance(model);
    FlowNetwork net = sheet.status == BalanceStatus::Invalid ? FlowNetwork{} : buildFlowNetwork(model, sheet);
    return {std::move(model), std::move(sheet), std::move(net)};
}

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
    return handNetwork({{"Plants", NodeRole::Producer, 10, 100, 0, plantRespiration, 100},
                        {"Herbivore", NodeRole::Consumer, 4, 0, 0, herbivoreRespiration, 2},
                        {"Omnivore", NodeRole::Consumer, 2, 0, 0.5, 3.5, 0.5}},
                       {{0, 1, 20}, {0, 2, 2}, {1, 2, 2}});
}

}  // namespace tl::testing
