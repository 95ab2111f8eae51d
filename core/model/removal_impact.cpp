#include "core/model/removal_impact.h"

namespace tl {

RemovalImpact removalImpact(const Model& model, const std::vector<std::size_t>& removed)
{
    std::vector<bool> gone(model.size(), false);
    for (std::size_t i : removed)
        if (i < model.size()) gone[i] = true;
    RemovalImpact impact;
    for (std::size_t pred = 0; pred < model.size(); ++pred) {
        if (gone[pred]) continue;
        RemovalImpact::DietLoss loss;
        for (const auto& [prey, share] : model.dietRow(pred))
            if (gone[prey] && share != 0.0) {
                loss.share += share;
                loss.prey.push_back(model.compartment(prey).name);
            }
        if (!loss.prey.empty()) {
            loss.predator = model.compartment(pred).name;
            impact.diets.push_back(std::move(loss));
        }
        for (const auto& [pool, share] : model.routingRow(pred))
            if (gone[pool] && share != 0.0) {
                impact.routedTo.push_back(model.compartment(pred).name);
                break;
            }
    }
    for (const Fleet& f : model.fleets()) {
        bool catches = false;
        for (std::size_t i = 0; i < model.size() && !catches; ++i)
            catches = gone[i] && ((i < f.landings.size() && f.landings[i] != 0.0) ||
                                  (i < f.discards.size() && f.discards[i] != 0.0));
        if (catches) impact.fleetsCatching.push_back(f.name);
        if (f.discardPool && *f.discardPool < model.size() && gone[*f.discardPool])
            impact.fleetsDiscardingTo.push_back(f.name);
    }
    return impact;
}

}  // namespace tl
