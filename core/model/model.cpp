#include "core/model/model.h"

#include <algorithm>

namespace tl {
namespace {

template <typename T>
void moveElement(std::vector<T>& v, std::size_t from, std::size_t to)
{
    T item = std::move(v[from]);
    v.erase(v.begin() + static_cast<std::ptrdiff_t>(from));
    v.insert(v.begin() + static_cast<std::ptrdiff_t>(to), std::move(item));
}

}  // namespace

std::optional<std::size_t> Model::indexOf(std::string_view name) const
{
    for (std::size_t i = 0; i < compartments_.size(); ++i)
        if (compartments_[i].name == name) return i;
    return std::nullopt;
}

std::size_t Model::addCompartment(Compartment c, std::optional<std::size_t> at)
{
    const std::size_t i = std::min(at.value_or(size()), size());
    compartments_.insert(compartments_.begin() + static_cast<std::ptrdiff_t>(i), std::move(c));
    diet_.insertRow(i);
    diet_.insertColumn(i);
    dietImport_.insert(dietImport_.begin() + static_cast<std::ptrdiff_t>(i), 0.0);
    routing_.insertRow(i);
    routing_.insertColumn(i);
    for (Fleet& f : fleets_) {
        f.landings.insert(f.landings.begin() + static_cast<std::ptrdiff_t>(i), 0.0);
        f.discards.insert(f.discards.begin() + static_cast<std::ptrdiff_t>(i), 0.0);
        f.discardSurvival.insert(f.discardSurvival.begin() + static_cast<std::ptrdiff_t>(i), 0.0);
        if (f.discardPool && *f.discardPool >= i) ++*f.discardPool;
    }
    return i;
}

void Model::reserve(std::size_t n)
{
    compartments_.reserve(n);
    dietImport_.reserve(n);
    diet_.reserveRows(n);
    routing_.reserveRows(n);
}

void Model::removeCompartment(std::size_t i)
{
    compartments_.erase(compartments_.begin() + static_cast<std::ptrdiff_t>(i));
    diet_.removeRow(i);
    diet_.removeColumn(i);
    dietImport_.erase(dietImport_.begin() + static_cast<std::ptrdiff_t>(i));
    routing_.removeRow(i);
    routing_.removeColumn(i);
    for (Fleet& f : fleets_) {
        f.landings.erase(f.landings.begin() + static_cast<std::ptrdiff_t>(i));
        f.discards.erase(f.discards.begin() + static_cast<std::ptrdiff_t>(i));
        f.discardSurvival.erase(f.discardSurvival.begin() + static_cast<std::ptrdiff_t>(i));
        if (f.discardPool == i) f.discardPool.reset();
        else if (f.discardPool && *f.discardPool > i) --*f.discardPool;
    }
}

void Model::moveCompartment(std::size_t from, std::size_t to)
{
    if (from == to) return;
    moveElement(compartments_, from, to);
    diet_.moveRow(from, to);
    diet_.moveColumn(from, to);
    moveElement(dietImport_, from, to);
    routing_.moveRow(from, to);
    routing_.moveColumn(from, to);
    for (Fleet& f : fleets_) {
        moveElement(f.landings, from, to);
        moveElement(f.discards, from, to);
        moveElement(f.discardSurvival, from, to);
        if (f.discardPool) {
            std::size_t p = *f.discardPool;
            if (p == from) p = to;
            else if (from < p && p <= to) --p;
            else if (to <= p && p < from) ++p;
            f.discardPool = p;
        }
    }
}

std::vector<std::size_t> Model::detritusPools() const
{
    std::vector<std::size_t> out;
    for (std::size_t i = 0; i < size(); ++i)
        if (compartments_[i].kind == CompartmentKind::Detritus) out.push_back(i);
    return out;
}

std::vector<std::size_t> Model::living() const
{
    std::vector<std::size_t> out;
    for (std::size_t i = 0; i < size(); ++i)
        if (compartments_[i].isLiving()) out.push_back(i);
    return out;
}

double Model::effectiveRouting(std::size_t source, std::size_t pool) const
{
    if (hasExplicitRouting(source)) return routing_(source, pool);
    for (std::size_t d = 0; d < size(); ++d)
        if (compartments_[d].kind == CompartmentKind::Detritus) return d == pool ? 1.0 : 0.0;
    return 0.0;
}

std::optional<std::size_t> Model::fleetIndexOf(std::string_view name) const
{
    for (std::size_t f = 0; f < fleets_.size(); ++f)
        if (fleets_[f].name == name) return f;
    return std::nullopt;
}

std::size_t Model::addFleet(std::string name, std::optional<std::size_t> at)
{
    const std::size_t f = std::min(at.value_or(fleets_.size()), fleets_.size());
    Fleet fleet;
    fleet.name = std::move(name);
    fleet.landings.assign(size(), 0.0);
    fleet.discards.assign(size(), 0.0);
    fleet.discardSurvival.assign(size(), 0.0);
    fleets_.insert(fleets_.begin() + static_cast<std::ptrdiff_t>(f), std::move(fleet));
    return f;
}

void Model::removeFleet(std::size_t f)
{
    fleets_.erase(fleets_.begin() + static_cast<std::ptrdiff_t>(f));
}

double Model::landings(std::size_t i) const
{
    double y = 0;
    for (const Fleet& f : fleets_) y += f.landings[i];
    return y;
}

double Model::deadDiscards(std::size_t i) const
{
    double y = 0;
    for (const Fleet& f : fleets_) y += f.discards[i] * (1.0 - f.discardSurvival[i]);
    return y;
}

std::optional<double> statedCv(const Confidence& confidence, const BalanceRules& rules)
{
    if (confidence.cv && *confidence.cv > 0.0) return *confidence.cv;
    if (confidence.grade == Confidence::Grade::None) return std::nullopt;
    return rules.cvByGrade[static_cast<std::size_t>(confidence.grade) - 1];
}

}  // namespace tl
