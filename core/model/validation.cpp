#include "core/model/validation.h"

#include "core/model/problem_codes.h"

#include <cmath>
#include <cstdio>
#include <string>
#include <unordered_map>

#include "core/model/text.h"

namespace tl {
namespace {

// Numbers in messages: six significant digits, so a diet summing to 0.95 reads "0.95"
// rather than "0.95000000000000007".
std::string shown(double v)
{
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.6g", v);
    std::string s = buf;
    for (char& c : s)
        if (c == ',') c = '.';  // in case a locale with a decimal comma is active
    return s;
}

std::string quoted(std::string_view name)
{
    // Built by append: GCC 12 gives a false -Wrestrict for "'" + std::string(...).
    std::string out;
    out.reserve(name.size() + 2);
    out.append(1, '\'').append(name).append(1, '\'');
    return out;
}

class Checker {
public:
    explicit Checker(const Model& m) : m_(m) {}

    Problems run()
    {
        checkNames();
        for (std::size_t i = 0; i < m_.size(); ++i) checkParameters(i);
        for (std::size_t i = 0; i < m_.size(); ++i) checkDiet(i);
        for (std::size_t i = 0; i < m_.size(); ++i) checkRouting(i);
        checkHarvest();
        checkDetritusExists();
        return std::move(out_);
    }

private:
    Problem& add(const char* code, std::size_t i, std::string parameter, std::string message, std::string hint,
                 Severity severity = Severity::Error)
    {
        Problem p;
        p.code = code;
        p.severity = severity;
        if (i < m_.size()) p.compartment = m_.compartment(i).name;
        p.parameter = std::move(parameter);
        p.message = std::move(message);
        p.hint = std::move(hint);
        out_.push_back(std::move(p));
        return out_.back();
    }

    std::string name(std::size_t i) const
    {
        const std::string_view n = trim(m_.compartment(i).name);
        return n.empty() ? "compartment " + std::to_string(i + 1) : quoted(n);
    }

    void checkNames()
    {
        std::unordered_map<std::string_view, std::size_t> first;  // trimmed name -> first index using it
        first.reserve(m_.size());
        for (std::size_t i = 0; i < m_.size(); ++i) {
            const std::string_view n = trim(m_.compartment(i).name);
            if (n.empty()) {
                add(check::kEmptyName, i, "", "compartment " + std::to_string(i + 1) + " has no name",
                    "give every compartment a name; diet, harvest and routing refer to compartments by name");
                continue;
            }
            const auto [it, isNew] = first.emplace(n, i);
            if (!isNew)
                add(check::kDuplicateName, i, "",
                    "the name " + quoted(n) + " is used by compartments " + std::to_string(it->second + 1) + " and " +
                        std::to_string(i + 1),
                    "rename one of them; names must be unique");
        }
    }

    void checkParameters(std::size_t i)
    {
        const Compartment& c = m_.compartment(i);
        const auto key = [](Param p) { return std::string(paramKey(p)); };
        const auto sym = [](Param p) { return std::string(paramSymbol(p)); };

        for (Param p : {Param::Biomass, Param::PB, Param::QB, Param::EE, Param::PQ, Param::DetritusImport}) {
            const auto& v = c.value(p);
            if (v && *v < 0)
                add(check::kNegativeValue, i, key(p), sym(p) + " of " + name(i) + " is " + shown(*v) +
                                                          "; it cannot be negative",
                    "enter a value of 0 or more, or leave the cell empty if it is unknown");
        }
        for (Param p : kAllParams) {
            const auto& v = c.value(p);
            if (v && !(std::fabs(*v) <= kMaxInputMagnitude))
                add(check::kValueTooLarge, i, key(p),
                    sym(p) + " of " + name(i) + " is " + shown(*v) + "; values beyond 1e30 would overflow the flows "
                                                                      "computed from them",
                    "check the unit and the exponent of the value");
        }
        if (const auto& u = c.value(Param::Unassim); u && c.isLiving() && (*u < 0 || *u >= 1))
            add(check::kUnassimOutOfRange, i, key(Param::Unassim),
                "U (unassimilated share of consumption) of " + name(i) + " is " + shown(*u) +
                    "; expected a fraction from 0 up to, but not including, 1",
                "common practice is 0.2 for consumers and 0 for producers; leave empty for that default");

        switch (c.kind) {
        case CompartmentKind::Producer:
            for (Param p : {Param::QB, Param::PQ})
                if (c.value(p))
                    add(check::kProducerConsumes, i, key(p),
                        name(i) + " is a producer, and producers do not consume, so " + sym(p) + " must be empty",
                        "clear the " + sym(p) + " cell, or change the kind to consumer if it does eat");
            break;
        case CompartmentKind::Detritus:
            for (Param p : {Param::PB, Param::QB, Param::EE, Param::PQ, Param::Unassim})
                if (c.value(p))
                    add(check::kDetritusRate, i, key(p),
                        name(i) + " is a detritus pool, which has no " + sym(p) + "; the cell must be empty",
                        "a detritus pool takes only biomass, accumulation and import; its EE is computed");
            break;
        case CompartmentKind::Consumer: break;
        }
        if (c.isLiving())
            if (const auto& imp = c.value(Param::DetritusImport); imp && *imp != 0)
                add(check::kImportOnLiving, i, key(Param::DetritusImport),
                    name(i) + " is living, but detritus import applies only to detritus pools",
                    "clear the detritus import cell; food eaten outside the area goes in the diet's import column");
    }

    void checkDiet(std::size_t predator)
    {
        const Compartment& c = m_.compartment(predator);
        if (c.kind != CompartmentKind::Consumer) {
            std::optional<std::string> firstPrey;
            if (const auto row = m_.dietRow(predator); !row.empty()) firstPrey = m_.compartment(row.front().col).name;
            if (!firstPrey && m_.dietImport(predator) != 0) firstPrey = "import";
            if (firstPrey) {
                const bool producer = c.kind == CompartmentKind::Producer;
                add(check::kDietOfNonConsumer, predator, "diet",
                    name(predator) + " is a " + (producer ? "producer" : "detritus pool") +
                        " and does not eat, but has a diet (" + quoted(*firstPrey) + ")",
                    "clear its diet row, or change its kind to consumer")
                    .prey = *firstPrey;
            }
            return;
        }
        const auto checkFraction = [&](double v, const std::string& prey) {
            if (v >= 0 && v <= 1) return;
            add(check::kDietFraction, predator, "diet",
                "the share of " + quoted(prey) + " in the diet of " + name(predator) + " is " + shown(v) +
                    "; expected a fraction from 0 to 1",
                "diet entries are shares of the predator's food; each row sums to 1")
                .prey = prey;
        };
        for (const GridEntry& e : m_.dietRow(predator)) checkFraction(e.value, m_.compartment(e.col).name);
        checkFraction(m_.dietImport(predator), "import");

        const double sum = m_.dietRowSum(predator);
        if (std::abs(sum - 1.0) <= m_.rules.dietSumTolerance) return;
        if (sum == 0)
            add(check::kDietSum, predator, "diet", name(predator) + " is a consumer but its diet is empty (sums to 0)",
                "enter the share of each prey in its diet row so that the row sums to 1");
        else
            add(check::kDietSum, predator, "diet",
                "the diet of " + name(predator) + " sums to " + shown(sum) + "; expected 1 (within " +
                    shown(m_.rules.dietSumTolerance) + ")",
                "adjust the shares, or put food eaten outside the area in the import column");
    }

    void checkRouting(std::size_t source)
    {
        const auto row = m_.routingRow(source);
        if (row.empty()) return;  // default: everything to the first pool

        double sum = 0;
        for (const auto& [pool, f] : row) {
            sum += f;
            const std::string poolName = m_.compartment(pool).name;
            if (f < 0 || f > 1)
                add(check::kRoutingFraction, source, "routing",
                    "the share of the detritus of " + name(source) + " sent to " + quoted(poolName) + " is " +
                        shown(f) + "; expected a fraction from 0 to 1",
                    "routing fractions of one source sum to 1")
                    .prey = poolName;
            if (m_.compartment(pool).kind != CompartmentKind::Detritus)
                add(check::kRoutingToLiving, source, "routing",
                    name(source) + " sends detritus to " + quoted(poolName) + ", which is not a detritus pool",
                    "route detritus only to compartments of kind detritus")
                    .prey = poolName;
        }
        if (std::abs(sum - 1.0) > m_.rules.dietSumTolerance)
            add(check::kRoutingSum, source, "routing",
                "the detritus routing of " + name(source) + " sums to " + shown(sum) + "; expected 1",
                "adjust the fractions so that all of its detritus goes somewhere");
    }

    void checkHarvest()
    {
        for (std::size_t f = 0; f < m_.fleets().size(); ++f) {
            const Fleet& fleet = m_.fleet(f);
            const std::string fleetName = quoted(fleet.name);
            const auto addFleet = [&](const char* code, std::size_t i, std::string message, std::string hint,
                                      Severity severity = Severity::Error) {
                add(code, i, "harvest", std::move(message), std::move(hint), severity).fleet = fleet.name;
            };
            if (trim(fleet.name).empty())
                addFleet(check::kEmptyFleetName, m_.size(), "fleet " + std::to_string(f + 1) + " has no name",
                         "give every fleet a name");
            for (std::size_t g = 0; g < f; ++g)
                if (m_.fleet(g).name == fleet.name && !trim(fleet.name).empty()) {
                    addFleet(check::kDuplicateFleet, m_.size(), "two fleets are called " + fleetName,
                             "rename one of them, or merge their catches");
                    break;
                }
            for (std::size_t i = 0; i < m_.size(); ++i) {
                const double landed = fleet.landings[i], discarded = fleet.discards[i];
                const double survival = fleet.discardSurvival[i];
                if (!(std::fabs(landed) <= kMaxInputMagnitude) || !(std::fabs(discarded) <= kMaxInputMagnitude))
                    addFleet(check::kValueTooLarge, i,
                             "the catch of " + name(i) + " by " + fleetName + " is " +
                                 shown(std::fabs(landed) > std::fabs(discarded) ? landed : discarded) +
                                 "; values beyond 1e30 would overflow the flows computed from them",
                             "check the unit and the exponent of the value");
                if (landed < 0)
                    addFleet(check::kNegativeLandings, i,
                             "landings of " + name(i) + " by " + fleetName + " are " + shown(landed) +
                                 "; they cannot be negative",
                             "enter the landed amount (0 or more); stocking is not a negative catch");
                if (discarded < 0)
                    addFleet(check::kNegativeDiscards, i,
                             "discards of " + name(i) + " by " + fleetName + " are " + shown(discarded) +
                                 "; they cannot be negative",
                             "enter the discarded amount (0 or more)");
                if (survival < 0 || survival > 1)
                    addFleet(check::kDiscardSurvival, i,
                             "discard survival of " + name(i) + " in " + fleetName + " is " + shown(survival) +
                                 "; expected a fraction from 0 to 1",
                             "the share of discards returned alive: 0 when all die, 1 when all survive");
                if (m_.compartment(i).kind == CompartmentKind::Detritus && (landed > 0 || discarded > 0))
                    addFleet(check::kCatchFromDetritus, i,
                             fleetName + " catches from " + name(i) + ", which is a detritus pool",
                             "harvest applies to producers and consumers only");
            }
            if (fleet.discardPool &&
                (*fleet.discardPool >= m_.size() || m_.compartment(*fleet.discardPool).kind != CompartmentKind::Detritus))
                addFleet(check::kDiscardPool, *fleet.discardPool,
                         "the discards of " + fleetName + " are sent to a compartment that is not a detritus pool",
                         "choose a detritus pool for its discards, or leave it to the default (the first pool)");
        }
    }

    void checkDetritusExists()
    {
        if (!m_.detritusPools().empty()) return;
        bool discards = false;
        for (const Fleet& f : m_.fleets())
            for (double d : f.discards) discards = discards || d > 0;
        if (m_.living().empty() && !discards) return;
        add(check::kNoDetritusPool, m_.size(), "routing", code::kNoDetritusPoolMessage, code::kNoDetritusPoolHint,
            Severity::Warning);
    }

    const Model& m_;
    Problems out_;
};

}  // namespace

Problems validateModel(const Model& model) { return Checker(model).run(); }

}  // namespace tl
