// Model: the inputs of one scenario (DESIGN.md 3.1), the single source of truth that
// the UI edits and the solver reads. Compartment-indexed tables (diet, routing, harvest)
// are kept in step with the compartment list by the insert/remove/move operations here.
#pragma once

#include <array>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "core/model/compartment.h"
#include "core/model/grid.h"

namespace tl {

// Units of a project: every displayed number carries them (DESIGN.md 2).
struct Units {
    std::string currency = "t wet weight";  // or "g C", "kJ", ...
    std::string area = "km²";
    std::string time = "year";

    std::string biomass() const { return currency + "/" + area; }            // B
    std::string flow() const { return currency + "/" + area + "/" + time; }  // P, Q, catch
    std::string rate() const { return "/" + time; }                           // P/B, Q/B
    bool operator==(const Units&) const = default;
};

// Plausible ranges of entered values (issue 13): a value far above them, in the
// project's units, is most likely a slip of the keyboard or of the units (B = 1e300),
// so it is warned about (core/model/plausible_ranges.h), never refused. The defaults
// are wide enough for any lake, reservoir or coastal water (common practice, no source):
//   B 1e6 currency/area; P/B, Q/B 1e4 per time unit; BA, E, detritus import 1e7 flow.
struct PlausibleRanges {
    double biomassMax = 1e6;
    double rateMax = 1e4;
    double flowMax = 1e7;
    bool operator==(const PlausibleRanges&) const = default;
};

// Rule-of-thumb bounds used by the checks; editable per project.
struct BalanceRules {
    double eeMax = 1.0;
    double pqMin = 0.05;  // consumers' P/Q below this is flagged (common practice, no source)
    double pqMax = 0.5;   // consumers' P/Q above this is flagged (common practice, no source)
    double dietSumTolerance = 1e-3;
    // Default CV by confidence grade A..D (this project's own convention, DESIGN 3.7).
    std::array<double, 4> cvByGrade = {0.10, 0.25, 0.50, 0.80};
    PlausibleRanges plausible;  // stored from schema 3 on
    bool operator==(const BalanceRules&) const = default;
};

// The CV a confidence stands for: its explicit CV when positive, else the project's CV
// of its grade (DESIGN 3.7); empty when neither is given (the caller picks its default).
std::optional<double> statedCv(const Confidence& confidence, const BalanceRules& rules);

// A fleet takes landings and discards from compartments. Dead discards go to a detritus
// pool (the first one unless discardPool is set); the surviving share is returned alive.
struct Fleet {
    std::string name;
    std::vector<double> landings;         // per compartment index, currency/area/year
    std::vector<double> discards;         // per compartment index
    std::vector<double> discardSurvival;  // per compartment index, fraction in [0,1]
    std::optional<std::size_t> discardPool;

    bool operator==(const Fleet&) const = default;
};

class Model {
public:
    Units units;
    BalanceRules rules;

    // --- compartments -------------------------------------------------------------
    std::size_t size() const { return compartments_.size(); }
    const std::vector<Compartment>& compartments() const { return compartments_; }
    const Compartment& compartment(std::size_t i) const { return compartments_[i]; }
    Compartment& compartment(std::size_t i) { return compartments_[i]; }
    std::optional<std::size_t> indexOf(std::string_view name) const;

    // Inserts at `at` (default: the end) and returns the index. Diet, routing and
    // harvest gain an empty row/column for it; appending is amortised O(1) in the grids.
    std::size_t addCompartment(Compartment c, std::optional<std::size_t> at = std::nullopt);
    void removeCompartment(std::size_t i);
    // Room for n compartments, so that a reader appending them moves none of them again.
    void reserve(std::size_t n);
    void moveCompartment(std::size_t from, std::size_t to);

    std::vector<std::size_t> detritusPools() const;  // indices of detritus compartments, in order
    std::vector<std::size_t> living() const;         // producers and consumers, in order

    // --- diet matrix: row = predator, column = prey; DC(prey, predator) in DESIGN 3.2 ---
    double diet(std::size_t predator, std::size_t prey) const { return diet_(predator, prey); }
    void setDiet(std::size_t predator, std::size_t prey, double fraction) { diet_.set(predator, prey, fraction); }
    // The non-zero prey entries of one predator, sorted by prey index (import not included).
    std::span<const GridEntry> dietRow(std::size_t predator) const { return diet_.row(predator); }
    double dietImport(std::size_t predator) const { return dietImport_[predator]; }
    void setDietImport(std::size_t predator, double fraction) { dietImport_[predator] = fraction; }
    double dietRowSum(std::size_t predator) const { return diet_.rowSum(predator) + dietImport_[predator]; }
    const Grid& dietGrid() const { return diet_; }

    // --- detritus routing: fraction of a source's detritus flow going to a pool -------
    // A source with no explicit entries sends everything to the first pool.
    double routing(std::size_t source, std::size_t pool) const { return routing_(source, pool); }
    void setRouting(std::size_t source, std::size_t pool, double fraction) { routing_.set(source, pool, fraction); }
    // The explicit non-zero routing entries of one source, sorted by pool index.
    std::span<const GridEntry> routingRow(std::size_t source) const { return routing_.row(source); }
    bool hasExplicitRouting(std::size_t source) const { return routing_.rowSum(source) > 0.0; }
    double effectiveRouting(std::size_t source, std::size_t pool) const;
    const Grid& routingGrid() const { return routing_; }

    // --- harvest ------------------------------------------------------------------
    const std::vector<Fleet>& fleets() const { return fleets_; }
    Fleet& fleet(std::size_t f) { return fleets_[f]; }
    const Fleet& fleet(std::size_t f) const { return fleets_[f]; }
    std::optional<std::size_t> fleetIndexOf(std::string_view name) const;
    std::size_t addFleet(std::string name, std::optional<std::size_t> at = std::nullopt);
    void removeFleet(std::size_t f);
    double landings(std::size_t i) const;      // summed over fleets
    double deadDiscards(std::size_t i) const;  // discards x (1 - survival), summed over fleets
    double totalCatch(std::size_t i) const { return landings(i) + deadDiscards(i); }  // Y_i in DESIGN 3.2

    bool operator==(const Model&) const = default;

private:
    std::vector<Compartment> compartments_;
    Grid diet_;                       // size() x size()
    std::vector<double> dietImport_;  // size()
    Grid routing_;                    // size() x size(); only detritus columns are used
    std::vector<Fleet> fleets_;
};

}  // namespace tl
