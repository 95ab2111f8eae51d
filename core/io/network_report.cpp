#include "core/io/network_report.h"

#include <cmath>
#include <string>
#include <vector>

#include "core/io/balance_report.h"
#include "core/io/json_writer.h"
#include "core/io/text_table.h"

namespace tl {
namespace {

void writeLevels(JsonWriter& w, const ChainDecomposition& chains)
{
    w.beginArray();
    for (const TrophicLevelBin& bin : chains.levels) {
        w.beginObject();
        w.field("level", bin.level);
        w.field("throughput", bin.throughput);
        w.field("biomass", bin.biomass);
        w.field("production", bin.production);
        w.field("catch", bin.catchTotal);
        w.field("passed_up", bin.passedUp);
        w.field("te", bin.te);  // null at level I: no transfer efficiency through detritus
        w.field("production_ratio", bin.productionRatio);
        w.field("biomass_detritus", bin.biomassDetritus);
        w.endObject();
    }
    w.endArray();
}

}  // namespace

std::string networkReportJson(const NetworkAnalysis& r, const NetworkJsonOptions& options)
{
    const SystemIndicators& s = r.indicators;
    const FlowNetwork& net = r.network;
    JsonWriter w;
    w.beginObject();
    w.field("source", r.fromScor ? "scor" : "model");
    if (r.status) w.field("status", statusKey(*r.status));
    w.field("tst", s.tst);
    w.field("tstp", s.tstp);
    w.field("boundary_input", s.boundaryInput);
    w.field("fci", s.fci);
    w.field("apl", s.apl);
    w.field("ami", s.ami);
    w.field("ascendency", s.ascendency);
    w.field("capacity", s.capacity);
    w.field("overhead", s.overhead);
    w.field("connectance", s.connectance);
    w.field("links", s.links);
    w.field("flow_diversity", s.flowDiversity);
    w.field("link_density", s.linkDensity);
    w.field("total_primary_production", s.totalPrimaryProduction);
    w.field("total_respiration", s.totalRespiration);
    w.field("tpp_over_r", s.tppOverR);
    w.field("tpp_over_b", s.tppOverB);
    w.field("total_biomass", s.totalLivingBiomass);
    w.field("system_omnivory", s.systemOmnivory);  // published: log(Q) weights (Christensen & Pauly 1993)
    w.field("omnivory_intake_weighted", s.omnivoryIntakeWeighted);
    w.field("feeding_links", s.feedingLinks);
    w.field("food_web_connectance", s.foodWebConnectance);
    w.field("producers_identified", s.producersIdentified);
    if (!s.producersIdentified)
        w.field("tpp_note", std::string("no producer can be told apart from the flows: TPP and its ratios are undefined; "
                                        "name the producers (tledger network --producers A,B)"));
    w.field("total_catch", s.totalCatch);
    w.field("total_landings", s.totalLandings);
    w.field("total_detritus_inflow", s.totalDetritusInflow);
    w.field("catch_ppr", s.catchPpr);
    w.field("catch_ppr_share_of_tpp", s.catchPprShareOfTpp);  // over TPP + detritus inflow
    w.field("catch_ppr_producers_only", s.catchPprProducersOnly);
    w.field("catch_ppr_producers_only_share_of_tpp", s.catchPprProducersOnlyShare);
    w.field("catch_mean_tl", s.catchMeanTl);  // on landings (Pauly et al. 1998)
    w.field("catch_mean_tl_with_discards", s.catchMeanTlWithDiscards);
    if (r.hasCatch) w.field("notice", kDecisionSupportNotice);

    // Keys of "tl" and "oi" are the names; a repeated name (some published networks have
    // them) gets " #<position>" so no value is lost. "compartments" lists the keys in order.
    std::vector<std::string> keys;
    for (std::size_t i = 0; i < net.size(); ++i) {
        std::string key = net.names[i];
        for (std::size_t k = 0; k < i; ++k)
            if (net.names[k] == net.names[i]) key = net.names[i] + " #" + std::to_string(i + 1);
        keys.push_back(std::move(key));
    }
    w.key("compartments").beginArray();
    for (const std::string& key : keys) w.value(key);
    w.endArray();
    w.key("tl").beginObject();
    for (std::size_t i = 0; i < net.size(); ++i) w.field(keys[i], r.tl[i]);
    w.endObject();
    w.key("oi").beginObject();
    for (std::size_t i = 0; i < net.size(); ++i) w.field(keys[i], r.oi[i]);
    w.endObject();

    w.field("feeding_cycles", r.levels.cycles == FeedingCycles::Removed ? "removed" : "kept");
    w.field("feeding_cycles_found", r.levels.cycleRemoval.cycles);
    w.field("feeding_cycle_removal_complete", r.levels.cycleRemoval.complete);
    w.field("primary_production_consumed", r.levels.primaryProductionConsumed);
    w.field("detritus_inflow_consumed", r.levels.detritusInflowConsumed);
    {
        const Eigen::VectorXd etl = r.levels.effectiveTrophicLevels();
        w.key("etl").beginObject();  // effective trophic levels of the aggregation
        for (std::size_t i = 0; i < net.size(); ++i) w.field(keys[i], etl[static_cast<Eigen::Index>(i)]);
        w.endObject();
    }
    w.key("levels");
    writeLevels(w, r.levels.combined);
    w.field("mean_te", r.levels.combined.meanTe);
    w.key("levels_from_producers");
    writeLevels(w, r.levels.fromProducers);
    w.field("mean_te_from_producers", r.levels.fromProducers.meanTe);
    w.key("levels_from_detritus");
    writeLevels(w, r.levels.fromDetritus);
    w.field("mean_te_from_detritus", r.levels.fromDetritus.meanTe);

    w.key("mti").beginObject();
    w.key("rows").beginArray();
    for (const std::string& name : r.mti.names) w.value(name);
    w.endArray();
    w.key("cols").beginArray();
    for (const std::string& name : r.mti.names) w.value(name);
    w.endArray();
    if (options.impactMatrix || r.mti.names.size() <= kImpactMatrixJsonLimit) {
        w.key("values").beginArray();
        for (Eigen::Index i = 0; i < r.mti.total.rows(); ++i) {
            w.beginArray();
            for (Eigen::Index j = 0; j < r.mti.total.cols(); ++j) w.value(r.mti.total(i, j));
            w.endArray();
        }
        w.endArray();
    } else {
        w.key("values").null();
        w.field("omitted", std::to_string(r.mti.names.size()) + " rows and columns exceed the " +
                               std::to_string(kImpactMatrixJsonLimit) +
                               " written by default (the matrix grows as n x n); ask for it with --impact-matrix");
    }
    w.endObject();

    w.key("keystone").beginArray();
    for (const KeystoneEntry& k : r.keystone) {
        w.beginObject();
        w.field("name", net.names[k.node]);
        w.field("overall_effect", k.overallEffect);
        w.field("biomass_share", k.biomassShare);
        w.field("keystone_index", k.keystoneIndex);
        w.field("rank", k.rank);
        w.endObject();
    }
    w.endArray();

    if (r.overlap) {
        w.key("diet_overlap").beginObject();
        w.key("predators").beginArray();
        for (std::size_t j : r.overlap->predators) w.value(net.names[j]);
        w.endArray();
        w.key("values").beginArray();
        for (Eigen::Index a = 0; a < r.overlap->overlap.rows(); ++a) {
            w.beginArray();
            for (Eigen::Index b = 0; b < r.overlap->overlap.cols(); ++b) w.value(r.overlap->overlap(a, b));
            w.endArray();
        }
        w.endArray();
        w.endObject();
    }
    w.endObject();
    return w.str() + "\n";
}

std::string networkReportTables(const NetworkAnalysis& r)
{
    const SystemIndicators& s = r.indicators;
    const FlowNetwork& net = r.network;
    std::string out;
    if (r.status) out += "Scenario status: " + std::string(statusKey(*r.status)) + "\n\n";

    TextTable ind;
    ind.addColumn("Indicator", TextTable::Align::Left);
    ind.addColumn("Value");
    ind.addColumn("Unit", TextTable::Align::Left);
    const auto row = [&](const char* name, double v, const std::string& unit) {
        ind.addRow({name, displayNumber(v), unit});
    };
    row("Total system throughput (TST)", s.tst, r.flowUnit());
    row("TST with boundary flows (TSTp)", s.tstp, r.flowUnit());
    row("Boundary input", s.boundaryInput, r.flowUnit());
    row("Finn cycling index", s.fci, "");
    row("Average path length", s.apl, "");
    row("Average mutual information", s.ami, "bits");
    row("Ascendency", s.ascendency, r.flowUnit() + " bits");
    row("Development capacity", s.capacity, r.flowUnit() + " bits");
    row("Overhead", s.overhead, r.flowUnit() + " bits");
    row("Links", static_cast<double>(s.links), "");
    row("Connectance, all internal flows (links/n^2)", s.connectance, "");
    row("Food-web connectance, feeding links among living", s.foodWebConnectance, "");
    row("Total primary production", s.totalPrimaryProduction, r.flowUnit());
    row("Total respiration", s.totalRespiration, r.flowUnit());
    row("TPP / respiration", s.tppOverR, "");
    row("TPP / living biomass", s.tppOverB, "/time");
    row("Living biomass", s.totalLivingBiomass, r.stockUnit());
    row("System omnivory index (log-intake weighted; depends on units)", s.systemOmnivory, "");
    row("Omnivory, intake-weighted mean", s.omnivoryIntakeWeighted, "");
    row("Primary production consumed", r.levels.primaryProductionConsumed, "share");
    row("Detritus inflow consumed", r.levels.detritusInflowConsumed, "share");
    out += "Indicators\n" + ind.render() + "\n";
    if (!s.producersIdentified)
        out += "No producer can be told apart from the flows, so TPP and its ratios are undefined: name them with "
               "--producers A,B.\n\n";

    TextTable nodes;
    nodes.addColumn("Compartment", TextTable::Align::Left);
    nodes.addColumn("TL");
    nodes.addColumn("OI");
    nodes.addColumn("Keystone index");
    nodes.addColumn("Rank");
    std::vector<const KeystoneEntry*> ks(net.size(), nullptr);
    for (const KeystoneEntry& k : r.keystone) ks[k.node] = &k;
    for (std::size_t i = 0; i < net.size(); ++i)
        nodes.addRow({net.names[i], displayNumber(r.tl[i]), displayNumber(r.oi[i]),
                      ks[i] ? displayNumber(ks[i]->keystoneIndex) : "-",
                      ks[i] ? std::to_string(ks[i]->rank) : "-"});
    out += "Trophic levels\n" + nodes.render();
    std::string undefinedKeystone;
    for (const KeystoneEntry& k : r.keystone)
        if (!std::isfinite(k.keystoneIndex)) undefinedKeystone += (undefinedKeystone.empty() ? "" : ", ") + net.names[k.node];
    if (!undefinedKeystone.empty())
        out += "Keystone index undefined for " + undefinedKeystone +
               ": the logarithm of zero (no impact on the other living compartments, or all of the living "
               "biomass; Libralato et al. 2006).\n";
    out += "\n";

    TextTable lv;
    lv.addColumn("Level", TextTable::Align::Left);
    lv.addColumn("Throughput");
    lv.addColumn("Biomass");
    lv.addColumn("Production");
    lv.addColumn("Catch");
    lv.addColumn("TE producer chains");
    lv.addColumn("TE detritus chains");
    lv.addColumn("TE all");
    lv.addColumn("P(k+1)/P(k)");
    // Feeding cycles (when kept) give every level a sliver; the table stops where they become
    // negligible (the JSON has all levels).
    double levelTotal = 0;
    for (const TrophicLevelBin& bin : r.levels.combined.levels) levelTotal += bin.throughput;
    std::size_t shown = r.levels.combined.levels.size();
    while (shown > 4 && r.levels.combined.levels[shown - 1].throughput < 1e-5 * levelTotal) --shown;
    for (std::size_t k = 0; k < shown; ++k) {
        const TrophicLevelBin& bin = r.levels.combined.levels[k];
        lv.addRow({levelName(bin.level), displayNumber(bin.throughput), displayNumber(bin.biomass),
                   displayNumber(bin.production), displayNumber(bin.catchTotal),
                   displayNumber(r.levels.fromProducers.levels[k].te), displayNumber(r.levels.fromDetritus.levels[k].te),
                   displayNumber(bin.te), displayNumber(bin.productionRatio)});
    }
    out += "Level decomposition, feeding cycles " +
           std::string(r.levels.cycles == FeedingCycles::Removed ? "removed first (Ulanowicz 1995)" : "kept (option)") +
           " (throughput in " + r.flowUnit() + ", biomass in " + r.stockUnit() + ")\n" + lv.render();
    if (!r.levels.combined.levels.empty())
        out += "Level I has no transfer efficiency (it mixes producers and detritus): consumers eat " +
               displayNumber(100.0 * r.levels.primaryProductionConsumed) + " % of primary production and " +
               displayNumber(100.0 * r.levels.detritusInflowConsumed) + " % of detritus inflow. Level I biomass: " +
               displayNumber(r.levels.combined.levels[0].biomass - r.levels.combined.levels[0].biomassDetritus) +
               " producers, " + displayNumber(r.levels.combined.levels[0].biomassDetritus) + " detritus.\n";
    if (!r.levels.cycleRemoval.complete)
        out += "The feeding cycles are too many to enumerate; only part of them was removed.\n";
    if (shown < r.levels.combined.levels.size())
        out += "Levels " + levelName(static_cast<int>(shown) + 1) + " and above hold less than 0.001 % of the "
               "throughput and are left out here (--json lists them)\n";
    out += "Mean TE (geometric mean of levels II-IV): producer chains " + displayNumber(r.levels.fromProducers.meanTe) +
           ", detritus chains " + displayNumber(r.levels.fromDetritus.meanTe) + ", all " +
           displayNumber(r.levels.combined.meanTe) + "\n\n";

    constexpr std::size_t kMaxMatrixPrinted = 16;
    if (r.mti.names.size() <= kMaxMatrixPrinted) {
        TextTable m;
        m.addColumn("Impact of (row) on (column)", TextTable::Align::Left);
        for (const std::string& name : r.mti.names) m.addColumn(name);
        for (Eigen::Index i = 0; i < r.mti.total.rows(); ++i) {
            std::vector<std::string> cells{r.mti.names[static_cast<std::size_t>(i)]};
            for (Eigen::Index j = 0; j < r.mti.total.cols(); ++j) cells.push_back(displayNumber(r.mti.total(i, j)));
            m.addRow(std::move(cells));
        }
        out += "Mixed trophic impact\n" + m.render() + "\n";
    } else {
        out += "Mixed trophic impact: " + std::to_string(r.mti.names.size()) +
               " rows and columns, too wide to print; use --json (above " +
               std::to_string(kImpactMatrixJsonLimit) + " compartments with --impact-matrix)\n\n";
    }

    if (!r.fromScor) {
        TextTable c;
        c.addColumn("Catch", TextTable::Align::Left);
        c.addColumn("Value");
        c.addColumn("Unit", TextTable::Align::Left);
        c.addRow({"Total catch", displayNumber(s.totalCatch), r.flowUnit()});
        c.addRow({"Primary production required (PPR)", displayNumber(s.catchPpr), r.flowUnit()});
        c.addRow({"PPR / total primary production", displayNumber(s.catchPprShareOfTpp), ""});
        c.addRow({"Mean trophic level of the catch", displayNumber(s.catchMeanTl), ""});
        out += c.render();
        out += std::string(kDecisionSupportNotice) + "\n";
    }
    return out;
}

}  // namespace tl
