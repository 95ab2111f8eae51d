// The drawn inputs of an ensemble (DESIGN.md 3.7); what is drawn and what is held is
// stated in the header.
#include "core/ensemble/ensemble_inputs.h"

#include <bit>
#include <cmath>

#include "core/model/text.h"

namespace tl::ensemble {
namespace {

Eigen::VectorXd& vectorOf(BalanceInputs& in, Param p)
{
    switch (p) {
    case Param::Biomass: return in.biomass;
    case Param::PB: return in.pb;
    case Param::QB: return in.qb;
    case Param::EE: return in.ee;
    default: return in.pq;
    }
}

std::string trimmedCv(double cv)
{
    std::string s = std::to_string(cv);
    while (!s.empty() && s.back() == '0') s.pop_back();
    if (!s.empty() && s.back() == '.') s.pop_back();
    return s;
}

struct Fnv {
    std::uint64_t h = 0xcbf29ce484222325ULL;
    void bytes(const void* p, std::size_t n)
    {
        const auto* b = static_cast<const unsigned char*>(p);
        for (std::size_t k = 0; k < n; ++k) h = (h ^ b[k]) * 0x100000001b3ULL;
    }
    void u64(std::uint64_t v) { bytes(&v, sizeof v); }
    void f64(double v) { u64(std::bit_cast<std::uint64_t>(v)); }
    void vec(const Eigen::VectorXd& v)
    {
        u64(static_cast<std::uint64_t>(v.size()));
        for (Eigen::Index k = 0; k < v.size(); ++k) f64(v[k]);
    }
};

}  // namespace

std::optional<Analyses> parseAnalyses(const std::string& list, std::string* bad)
{
    Analyses a;
    std::size_t start = 0;
    for (;;) {
        const std::size_t comma = list.find(',', start);
        const std::string word(trim(list.substr(start, comma == std::string::npos ? std::string::npos : comma - start)));
        if (word == "tl") a.trophicLevels = true;
        else if (word == "levels") a.levels = true;
        else if (word == "indicators") a.indicators = true;
        else if (word != "balance") {
            if (bad) *bad = word;
            return std::nullopt;
        }
        if (comma == std::string::npos) break;
        start = comma + 1;
    }
    return a;
}

std::vector<std::string> analysesKeys(const Analyses& a)
{
    std::vector<std::string> keys = {"balance"};
    if (a.trophicLevels) keys.push_back("tl");
    if (a.levels) keys.push_back("levels");
    if (a.indicators) keys.push_back("indicators");
    return keys;
}

std::pair<double, std::string> confidenceCv(const Compartment& c, Param p, const BalanceRules& rules)
{
    const Confidence& conf = c.confidenceOf(p);
    if (conf.cv && *conf.cv > 0.0) return {*conf.cv, "CV " + trimmedCv(*conf.cv)};
    if (conf.grade != Confidence::Grade::None) {
        const auto g = static_cast<std::size_t>(conf.grade) - 1;
        return {rules.cvByGrade[g], "grade " + std::string(gradeKey(conf.grade))};
    }
    return {rules.cvByGrade[2], "no grade (C assumed)"};
}

EnsembleInputs EnsembleInputs::build(const Model& model, const BalancePlan& plan, const EnsembleSettings& settings)
{
    EnsembleInputs e;
    e.point_ = BalanceInputs::fromModel(model);
    for (std::size_t i = 0; i < model.size(); ++i) {
        const Compartment& c = model.compartment(i);
        if (!c.isLiving()) continue;
        const bool consumer = c.kind == CompartmentKind::Consumer;
        const bool pqRead = plan.pqStandInOf(i) != PqStandIn::None || plan.unknownOf(i) == Unknown::QBTiedPB;
        for (Param p : {Param::Biomass, Param::PB, Param::QB, Param::EE, Param::PQ}) {
            if ((p == Param::QB || p == Param::PQ) && !consumer) continue;
            if (p == Param::PQ && !pqRead) continue;
            const std::optional<double>& v = c.value(p);
            if (!v || !(*v > 0.0) || !std::isfinite(*v)) continue;
            const auto [cv, source] = confidenceCv(c, p, model.rules);
            const auto own = settings.shapeOf.find({i, p});
            const Shape shape = own != settings.shapeOf.end() ? own->second : settings.shape;
            InputDistribution d(shape, *v, cv);
            if (d.constant()) continue;
            e.parameters_.push_back({i, p, d, source});
            e.names_.push_back(c.name + "." + std::string(paramKey(p)));
        }
    }
    const SparseColumns& diet = e.point_.diet;
    const double defaultDietCv = settings.dietCv.value_or(model.rules.cvByGrade[2]);
    for (std::size_t j = 0; j < model.size(); ++j) {
        if (model.compartment(j).kind != CompartmentKind::Consumer) continue;
        DrawnDietRow row;
        row.predator = j;
        std::vector<double> shares;
        const auto col = static_cast<Eigen::Index>(j);
        for (Eigen::Index k = diet.outerIndexPtr()[col]; k < diet.outerIndexPtr()[col + 1]; ++k) {
            if (!(diet.valuePtr()[k] > 0.0)) continue;
            row.prey.push_back(static_cast<std::size_t>(diet.innerIndexPtr()[k]));
            row.position.push_back(k);
            shares.push_back(diet.valuePtr()[k]);
        }
        if (model.dietImport(j) > 0.0) {
            row.import = true;
            shares.push_back(model.dietImport(j));
        }
        row.rowSum = 0.0;
        for (double v : shares) row.rowSum += v;
        // A per-run CV for this row wins; then the row's own data confidence; then the default.
        const auto own = settings.dietCvOf.find(j);
        const double rowCv = own != settings.dietCvOf.end()
                                 ? own->second
                                 : statedCv(model.compartment(j).dietConfidence, model.rules).value_or(defaultDietCv);
        row.distribution = DirichletRow(shares, rowCv);
        if (row.distribution.constant()) continue;
        // The Dirichlet draws shares summing to 1; a row entered with another sum keeps it.
        const std::string& pred = model.compartment(j).name;
        for (std::size_t prey : row.prey) e.names_.push_back(pred + ".diet:" + model.compartment(prey).name);
        if (row.import) e.names_.push_back(pred + ".diet:import");
        e.dietRows_.push_back(std::move(row));
    }
    if (!settings.holdFlowTerms) e.addFlowTerms(model, settings);
    return e;
}

void EnsembleInputs::addFlowTerms(const Model& model, const EnsembleSettings& settings)
{
    auto shapeFor = [&](std::size_t i, Param p) {
        const auto own = settings.shapeOf.find({i, p});
        return own != settings.shapeOf.end() ? own->second : settings.shape;
    };
    for (std::size_t i = 0; i < model.size(); ++i) {
        const Compartment& c = model.compartment(i);
        for (Param p : {Param::Unassim, Param::BiomassAccum, Param::NetEmigration, Param::DetritusImport}) {
            if (p == Param::Unassim && c.kind != CompartmentKind::Consumer) continue;
            if (p == Param::DetritusImport ? c.kind != CompartmentKind::Detritus : !c.isLiving()) continue;
            const std::optional<double>& v = c.value(p);
            if (!v || *v == 0.0 || !std::isfinite(*v)) continue;
            if (p != Param::BiomassAccum && p != Param::NetEmigration && *v < 0.0) continue;  // only BA and E are signed
            const auto [cv, source] = confidenceCv(c, p, model.rules);
            DrawnFlowTerm t;
            t.compartment = i;
            t.param = p;
            t.sign = *v < 0.0 ? -1.0 : 1.0;
            t.distribution = InputDistribution(shapeFor(i, p), std::abs(*v), cv);
            t.cvSource = source;
            if (t.distribution.constant()) continue;
            flowTerms_.push_back(std::move(t));
            names_.push_back(c.name + "." + std::string(paramKey(p)));
        }
    }
    const double catchCv = settings.catchCv.value_or(model.rules.cvByGrade[2]);
    const std::string catchSource = settings.catchCv ? "catch CV " + trimmedCv(catchCv) : "catch: grade C assumed";
    const SparseColumns& discards = point_.discardsToPool;
    for (std::size_t i = 0; i < model.size(); ++i) {
        const auto e = static_cast<Eigen::Index>(i);
        if (!model.compartment(i).isLiving() || !(point_.catchTotal[e] > 0.0)) continue;
        DrawnFlowTerm t;
        t.compartment = i;
        t.kind = DrawnFlowTerm::Kind::Catch;
        t.distribution = InputDistribution(settings.shape, point_.catchTotal[e], catchCv);
        t.cvSource = catchSource;
        if (t.distribution.constant()) continue;
        t.deadDiscards = point_.deadDiscards[e];
        for (Eigen::Index col = 0; col < discards.outerSize(); ++col)
            for (Eigen::Index k = discards.outerIndexPtr()[col]; k < discards.outerIndexPtr()[col + 1]; ++k)
                if (discards.innerIndexPtr()[k] == e) t.discardsToPool.emplace_back(k, discards.valuePtr()[k]);
        for (const Fleet& f : model.fleets()) t.fleetCatch.emplace_back(f.landings[i], f.discards[i]);
        flowTerms_.push_back(std::move(t));
        names_.push_back(model.compartment(i).name + ".catch");
    }
}

std::pair<std::size_t, std::size_t> EnsembleInputs::dietColumns(std::size_t r) const
{
    std::size_t first = parameters_.size();
    for (std::size_t k = 0; k < r; ++k) first += dietRows_[k].distribution.size();
    return {first, dietRows_[r].distribution.size()};
}

void EnsembleInputs::draw(std::uint64_t seed, std::uint64_t draw, BalanceInputs& in, double* values) const
{
    DrawStream stream(seed, draw);
    std::size_t k = 0;
    for (const DrawnParameter& p : parameters_) {
        const double v = p.distribution.draw(stream);
        vectorOf(in, p.param)[static_cast<Eigen::Index>(p.compartment)] = v;
        values[k++] = v;
    }
    double* dietValues = in.diet.valuePtr();
    for (const DrawnDietRow& row : dietRows_) {
        double* shares = values + k;
        row.distribution.draw(stream, shares);
        if (row.rowSum != 1.0)
            for (std::size_t s = 0; s < row.distribution.size(); ++s) shares[s] *= row.rowSum;
        for (std::size_t s = 0; s < row.position.size(); ++s) dietValues[row.position[s]] = shares[s];
        k += row.distribution.size();
    }
    double* discardValues = in.discardsToPool.valuePtr();
    for (const DrawnFlowTerm& t : flowTerms_) {
        const double v = t.distribution.draw(stream);
        values[k++] = t.sign * v;
        const auto e = static_cast<Eigen::Index>(t.compartment);
        if (t.kind == DrawnFlowTerm::Kind::Catch) {
            // Landings and dead discards scaled together, so their routing stays as entered.
            const double factor = v / t.distribution.value();
            in.catchTotal[e] = v;
            in.deadDiscards[e] = t.deadDiscards * factor;
            for (const auto& [at, point] : t.discardsToPool) discardValues[at] = point * factor;
            continue;
        }
        switch (t.param) {
        case Param::Unassim: in.unassim[e] = v; break;
        case Param::BiomassAccum: in.biomassAccum[e] = t.sign * v; break;
        case Param::NetEmigration: in.netEmigration[e] = t.sign * v; break;
        default: in.detritusImport[e] = v; break;
        }
    }
}

void EnsembleInputs::applyToModel(const double* values, Model& model) const
{
    std::size_t k = 0;
    for (const DrawnParameter& p : parameters_) model.compartment(p.compartment).value(p.param) = values[k++];
    for (const DrawnDietRow& row : dietRows_) {
        for (std::size_t s = 0; s < row.prey.size(); ++s) model.setDiet(row.predator, row.prey[s], values[k + s]);
        if (row.import) model.setDietImport(row.predator, values[k + row.prey.size()]);
        k += row.distribution.size();
    }
    for (const DrawnFlowTerm& t : flowTerms_) {
        const double v = values[k++];
        if (t.kind == DrawnFlowTerm::Kind::Parameter) {
            model.compartment(t.compartment).value(t.param) = v;
            continue;
        }
        const double factor = v / t.distribution.value();
        for (std::size_t f = 0; f < t.fleetCatch.size(); ++f) {
            model.fleet(f).landings[t.compartment] = t.fleetCatch[f].first * factor;
            model.fleet(f).discards[t.compartment] = t.fleetCatch[f].second * factor;
        }
    }
}

std::uint64_t EnsembleInputs::fingerprint() const
{
    Fnv f;
    for (const Eigen::VectorXd* v : {&point_.biomass, &point_.pb, &point_.qb, &point_.ee, &point_.pq, &point_.unassim,
                                     &point_.catchTotal, &point_.deadDiscards, &point_.netEmigration,
                                     &point_.biomassAccum, &point_.detritusImport})
        f.vec(*v);
    for (const SparseColumns* m : {&point_.diet, &point_.routing, &point_.discardsToPool}) {
        f.u64(static_cast<std::uint64_t>(m->nonZeros()));
        for (Eigen::Index k = 0; k < m->nonZeros(); ++k) {
            f.f64(m->valuePtr()[k]);
            f.u64(static_cast<std::uint64_t>(m->innerIndexPtr()[k]));
        }
        for (Eigen::Index k = 0; k <= m->outerSize(); ++k) f.u64(static_cast<std::uint64_t>(m->outerIndexPtr()[k]));
    }
    for (const DrawnParameter& p : parameters_) {
        f.u64(p.compartment);
        f.u64(static_cast<std::uint64_t>(p.param));
        f.u64(static_cast<std::uint64_t>(p.distribution.shape()));
        f.f64(p.distribution.value());
        f.f64(p.distribution.cv());
    }
    for (const DrawnDietRow& row : dietRows_) {
        f.u64(row.predator);
        f.f64(row.distribution.concentration());
        f.f64(row.rowSum);
        for (double s : row.distribution.shares()) f.f64(s);
    }
    for (const DrawnFlowTerm& t : flowTerms_) {
        f.u64(t.compartment);
        f.u64(static_cast<std::uint64_t>(t.kind) * 16 + static_cast<std::uint64_t>(t.param));
        f.u64(static_cast<std::uint64_t>(t.distribution.shape()));
        f.f64(t.sign);
        f.f64(t.distribution.value());
        f.f64(t.distribution.cv());
    }
    for (const std::string& n : names_) f.bytes(n.data(), n.size() + 1);
    return f.h;
}

}  // namespace tl::ensemble
