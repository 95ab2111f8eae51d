// EnsembleInputs: which inputs of a scenario an ensemble draws, from which distribution
// (DESIGN.md 3.7), and how one draw is written into the balance plan's numeric inputs.
//
// Drawn: every value the balance reads that the scenario gives with a positive point
// value: B, P/B, EE of living compartments, Q/B of consumers, and P/Q where it stands in
// for P/B or Q/B; each with its CV (explicit CV, else the project's CV of its grade,
// else grade C, as reconcile assumes) and the settings' shape (or a per-parameter one).
// Diet: each consumer row with two or more non-zero shares (import counted as a share)
// from a Dirichlet (input_distribution.h) with the row's CV: EnsembleSettings::dietCvOf,
// else the row's data confidence (Compartment::dietConfidence), else dietCv, else the
// project's grade-C CV.
// Flow terms (issue 15: every input drawn), unless EnsembleSettings::holdFlowTerms:
// U of a consumer whose U is given (the 0.2 default is a convention, not data, and is
// held), BA and E where given and non-zero, a pool's detritus import where positive,
// each with its own data confidence; and each compartment's catch Y: one factor drawn
// per compartment scales the landings and discards of every fleet together (the model
// keeps no confidence for catch: EnsembleSettings::catchCv, else the project's grade-C
// CV). BA and E may be negative: their magnitude is drawn and their sign kept (the sign
// is the modeller's statement; this project's choice).
// Held at their point values (stated in every report): detritus routing. Zero diet
// shares stay zero (the diet's pattern is kept).
//
// A draw's inputs are a plain row of numbers, one per drawn input in names() order:
// the parameters first, then each diet row's shares (modelled prey in prey order, then
// import), then the flow terms ("C.unassim", "C.biomass_accum", "C.net_emigration",
// "C.detritus_import", "C.catch" = Y drawn). The flow terms come last so that the
// parameters and diets of draw d are the same numbers whether flow terms are drawn or
// held (the stream is consumed in this order). Kept draws (ensemble.h) are these rows, for PRCC and other global analyses
// (note: a diet row's shares sum to 1, so they are collinear; drop one per row before a
// regression).
#pragma once

#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "core/balance/balance_plan.h"
#include "core/ensemble/input_distribution.h"
#include "core/model/model.h"

namespace tl::ensemble {

// What each draw computes beyond the balance (solved values, EE, P/Q).
struct Analyses {
    bool trophicLevels = false;  // "tl": trophic level of every consumer
    bool levels = false;         // "levels": transfer efficiency by integer level (Ulanowicz 1995)
    bool indicators = false;     // "indicators": system indicators (Finn 1976; Ulanowicz 1986, 2004)
    bool operator==(const Analyses&) const = default;
};
// "balance", "tl", "levels", "indicators", comma-separated; returns nothing on an
// unknown word (the word is written to *bad).
std::optional<Analyses> parseAnalyses(const std::string& list, std::string* bad = nullptr);
std::vector<std::string> analysesKeys(const Analyses& a);

struct DrawRange {
    std::uint64_t first = 0, last = 0;  // inclusive, 0-based
    std::uint64_t size() const { return last - first + 1; }
    bool operator==(const DrawRange&) const = default;
};

struct EnsembleSettings {
    std::uint64_t draws = 1000;
    std::uint64_t seed = 1;
    std::optional<DrawRange> range;  // a slice of 0..draws-1; empty: all of them
    unsigned threads = 1;
    Analyses analyses;
    Shape shape = Shape::Lognormal;
    std::map<std::pair<std::size_t, Param>, Shape> shapeOf;  // per parameter, overrides `shape`
    std::optional<double> dietCv;                            // rows without a confidence; default grade C
    std::map<std::size_t, double> dietCvOf;                  // per predator
    bool keepBalancedDraws = false;
    bool holdFlowTerms = false;    // hold catch, U, BA, E and detritus import at their point values
    std::optional<double> catchCv;  // CV of each compartment's catch; default: the project's grade-C CV
};

struct DrawnParameter {
    std::size_t compartment = 0;
    Param param = Param::Biomass;
    InputDistribution distribution;
    std::string cvSource;  // "CV 0.3", "grade B", "no grade (C assumed)"
};

struct DrawnDietRow {
    std::size_t predator = 0;
    std::vector<std::size_t> prey;      // per modelled share, prey index
    std::vector<Eigen::Index> position; // per modelled share, index into the diet's value array
    bool import = false;                // the last share is import
    double rowSum = 1.0;                // the row's sum as entered (kept by every draw)
    DirichletRow distribution;
};

// A flow term drawn (see the top of this file).
struct DrawnFlowTerm {
    enum class Kind : std::uint8_t { Parameter, Catch };
    std::size_t compartment = 0;
    Kind kind = Kind::Parameter;
    Param param = Param::Unassim;     // Kind::Parameter: Unassim, BiomassAccum, NetEmigration, DetritusImport
    double sign = 1.0;                // the point value's sign; the distribution draws its magnitude
    InputDistribution distribution;   // of |value| (of Y for catch)
    std::string cvSource;
    // Kind::Catch: the point values the drawn factor Y_drawn / Y scales.
    double deadDiscards = 0.0;
    std::vector<std::pair<Eigen::Index, double>> discardsToPool;  // (entry in its value array, point value)
    std::vector<std::pair<double, double>> fleetCatch;             // per fleet: (landings, discards)
};

class EnsembleInputs {
public:
    // plan: BalancePlan::build(model), without structural errors.
    static EnsembleInputs build(const Model& model, const BalancePlan& plan, const EnsembleSettings& settings);

    const std::vector<DrawnParameter>& parameters() const { return parameters_; }
    const std::vector<DrawnDietRow>& dietRows() const { return dietRows_; }
    const std::vector<DrawnFlowTerm>& flowTerms() const { return flowTerms_; }
    // Columns of names() that hold diet row r's shares: [first, first + size).
    std::pair<std::size_t, std::size_t> dietColumns(std::size_t r) const;
    const std::vector<std::string>& names() const { return names_; }
    std::size_t size() const { return names_.size(); }
    const BalanceInputs& pointInputs() const { return point_; }

    // Draw `draw` of the ensemble seeded `seed`: writes the drawn values into `in` (a
    // copy of pointInputs(); entries not drawn are never touched) and into values[0..size()).
    void draw(std::uint64_t seed, std::uint64_t draw, BalanceInputs& in, double* values) const;
    // Writes a draw's values into a model (a copy of the scenario), for the analyses that
    // need a Model and for tests that solve a draw the slow way.
    void applyToModel(const double* values, Model& model) const;
    // FNV-1a hash of everything that decides the draws (point inputs, distributions).
    std::uint64_t fingerprint() const;

private:
    void addFlowTerms(const Model& model, const EnsembleSettings& settings);

    std::vector<DrawnParameter> parameters_;
    std::vector<DrawnDietRow> dietRows_;
    std::vector<DrawnFlowTerm> flowTerms_;
    std::vector<std::string> names_;
    BalanceInputs point_;
};

// The CV used for one given value and where it comes from (DESIGN 3.7).
std::pair<double, std::string> confidenceCv(const Compartment& c, Param p, const BalanceRules& rules);

}  // namespace tl::ensemble
