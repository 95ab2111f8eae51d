// Compartment: one box of the food web (a producer, a consumer or a detritus pool)
// with its per-compartment inputs (DESIGN.md 3.1). An empty value means "unknown"
// (to be solved) or "not applicable"; the solver and validation decide which.
#pragma once

#include <array>
#include <cmath>
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace tl {

enum class CompartmentKind { Producer, Consumer, Detritus };

std::string_view kindKey(CompartmentKind kind);                 // "producer", "consumer", "detritus"
std::optional<CompartmentKind> parseKind(std::string_view text);  // exact key, after trimming
inline bool isLiving(CompartmentKind k) { return k != CompartmentKind::Detritus; }

// Per-compartment parameters, in the column order of compartments.csv (DESIGN 5.1).
enum class Param : std::size_t {
    Biomass,        // B, currency per area
    PB,             // P/B, per year
    QB,             // Q/B, per year
    EE,             // ecotrophic efficiency, dimensionless
    PQ,             // P/Q gross efficiency, dimensionless
    Unassim,        // U, unassimilated fraction of consumption
    BiomassAccum,   // BA, currency per area per year (absolute)
    NetEmigration,  // E = emigration - immigration, currency per area per year
    DetritusImport  // external import into a detritus pool, per area per year
};
inline constexpr std::size_t kParamCount = 9;
inline constexpr std::array<Param, kParamCount> kAllParams = {
    Param::Biomass, Param::PB,           Param::QB,           Param::EE,           Param::PQ,
    Param::Unassim, Param::BiomassAccum, Param::NetEmigration, Param::DetritusImport};

std::string_view paramKey(Param p);     // CSV/JSON key: "biomass", "pb", ...
std::string_view paramSymbol(Param p);  // trade symbol for display: "B", "P/B", ...
std::optional<Param> parseParamKey(std::string_view key);

// Data confidence of one parameter (DESIGN 3.1, 3.7): a grade A-D or an explicit CV,
// plus a free-text source note.
struct Confidence {
    enum class Grade { None, A, B, C, D };
    Grade grade = Grade::None;
    std::optional<double> cv;  // explicit coefficient of variation; wins over the grade
    std::string source;        // where the value comes from (survey, paper, guess)

    bool operator==(const Confidence&) const = default;
};
std::string_view gradeKey(Confidence::Grade g);  // "", "A".."D"
std::optional<Confidence::Grade> parseGrade(std::string_view text);

struct Compartment {
    std::string name;
    CompartmentKind kind = CompartmentKind::Consumer;
    std::array<std::optional<double>, kParamCount> values{};
    std::array<Confidence, kParamCount> confidence{};
    // Confidence of this predator's diet row as a whole: every share of the row carries
    // it (a stomach-content sample gives one sample size per predator, issue 17). Used by
    // reconcile (1/CV^2 weight of each share, issue 14) and by the ensemble (the row's
    // Dirichlet concentration, issue 15). Stored from schema 3 on.
    Confidence dietConfidence{};

    std::optional<double>& value(Param p) { return values[static_cast<std::size_t>(p)]; }
    const std::optional<double>& value(Param p) const { return values[static_cast<std::size_t>(p)]; }
    double valueOr(Param p, double fallback) const { return value(p).value_or(fallback); }
    Confidence& confidenceOf(Param p) { return confidence[static_cast<std::size_t>(p)]; }
    const Confidence& confidenceOf(Param p) const { return confidence[static_cast<std::size_t>(p)]; }

    // U when the cell is empty: 0.2 for consumers, 0 otherwise (common practice, no source).
    double unassimilatedOrDefault() const;

    bool isLiving() const { return tl::isLiving(kind); }
    bool operator==(const Compartment&) const = default;
};

}  // namespace tl
