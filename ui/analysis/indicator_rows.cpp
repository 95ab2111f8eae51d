#include "ui/analysis/indicator_rows.h"

#include <QObject>
#include <cmath>

namespace tl::ui {

std::vector<IndicatorRow> indicatorRows(const ScenarioAnalysis& a)
{
    const SystemIndicators& s = a.indicators;
    const QString flow = QString::fromStdString(a.units.flow());
    const QString stock = QString::fromStdString(a.units.biomass());
    const QString rate = QString::fromStdString(a.units.rate());
    const QString none = QObject::tr("dimensionless");
    const QString flowBits = flow + QStringLiteral(" · bits");
    const auto tr = [](const char* text) { return QObject::tr(text); };
    return {
        {"tst", tr("Total system throughput (TST)"), s.tst, flow,
         tr("Sum over compartments of their throughflow (inflows + imports) (Finn 1976, J Theor Biol 56:363)")},
        {"tstp", tr("Throughput with boundary flows (TSTp)"), s.tstp, flow,
         tr("Every flow: internal flows, imports, exports and respiration (Ulanowicz 1986, Growth and Development)")},
        {"boundary_input", tr("Boundary input"), s.boundaryInput, flow,
         tr("All imports into the system, primary production of producers included (Finn 1976)")},
        {"total_primary_production", tr("Total primary production (TPP)"), s.totalPrimaryProduction, flow,
         tr("Net production of all producers (their P), the food the web is built on (Odum 1969, Science 164:262)")},
        {"total_respiration", tr("Total respiration (R)"), s.totalRespiration, flow,
         tr("What the consumers burn: consumption minus egestion minus production, Q (1 − U) − P, summed over consumers; "
            "producers enter with their net production, so they add none (Odum 1969)")},
        {"tpp_over_r", tr("TPP / R"), s.tppOverR, none,
         tr("Primary production over respiration; tends towards 1 as systems mature (Odum 1969, Science 164:262)")},
        {"tpp_over_b", tr("TPP / B"), s.tppOverB, rate,
         tr("Primary production over living biomass; falls as systems mature (Odum 1969)")},
        {"total_biomass", tr("Total living biomass (B)"), s.totalLivingBiomass, stock,
         tr("Biomass of producers and consumers together; detritus pools are left out (this program's definition)")},
        {"links", tr("Links"), static_cast<double>(s.links), tr("count"),
         tr("Number of flows between compartments (feeding and flows to detritus), a compartment eating its own kind "
            "counted once (network analysis, Ulanowicz 1986)")},
        {"connectance", tr("Connectance, all internal flows"), s.connectance, none,
         tr("Links divided by the number of compartments squared, over every flow between compartments, flows to "
            "detritus included (network analysis, Ulanowicz 1986)")},
        {"food_web_connectance", tr("Food-web connectance"), s.foodWebConnectance, none,
         tr("Feeding links among living compartments / (living compartments)², cannibalism counted "
            "(directed connectance of food-web studies, Martinez 1992, Am Nat 139:1208, recalled from memory)")},
        {"system_omnivory", tr("System omnivory index"), s.systemOmnivory, none,
         tr("Consumers' omnivory index weighted by the logarithm of their intake (Christensen & Pauly 1993, "
            "ICLARM Conf Proc 26). Depends on the units: log Q is negative when Q < 1")},
        {"omnivory_intake_weighted", tr("Omnivory, intake-weighted mean"), s.omnivoryIntakeWeighted, none,
         tr("Consumers' omnivory index (Pauly et al. 1993) weighted by their intake Q: this project's variant, "
            "independent of units")},
        {"primary_production_consumed", tr("Primary production consumed"), a.levels.primaryProductionConsumed, none,
         tr("Share of the producers' production that consumers eat. Level I mixes producers and detritus and has no "
            "transfer efficiency, so this share stands in its place (Lindeman 1942, Ecology 23:399)")},
        {"detritus_inflow_consumed", tr("Detritus inflow consumed"), a.levels.detritusInflowConsumed, none,
         tr("Share of what flows into the detritus pools that consumers eat; shown at level I beside primary "
            "production consumed (this program's definition)")},
        {"fci", tr("Finn cycling index (FCI)"), s.fci, none,
         tr("Share of the throughput that is recycled (Finn 1976)")},
        {"apl", tr("Average path length (APL)"), s.apl, none,
         tr("TST / boundary input: compartments an inflowing unit passes on average (Finn 1976)")},
        {"ami", tr("Average mutual information (AMI)"), s.ami, tr("bits"),
         tr("How constrained the flows are, log base 2 over the flows with boundary terms (Ulanowicz 1986, 2004)")},
        {"ascendency", tr("Ascendency"), s.ascendency, flowBits,
         tr("TSTp × AMI: size and organisation of the network together (Ulanowicz 1986)")},
        {"capacity", tr("Development capacity"), s.capacity, flowBits,
         tr("TSTp × flow diversity: the upper bound of ascendency (Ulanowicz 1986)")},
        {"overhead", tr("Overhead"), s.overhead, flowBits,
         tr("Development capacity − ascendency: the reserve of flexibility (Ulanowicz 1986)")},
        {"mean_te", tr("Mean transfer efficiency, levels II–IV"), a.levels.combined.meanTe, none,
         tr("Geometric mean of the transfer efficiency of levels II, III and IV, all food chains "
            "(Lindeman 1942, Ecology 23:399; the mean: common practice, no source)")},
        {"total_catch", tr("Total catch"), s.totalCatch, flow,
         tr("Everything the fleets kill: landings plus the discards that do not survive, summed over fleets and "
            "compartments (common practice, no source)"), true},
        {"catch_ppr", tr("PPR of the catch, detritus counted as level-I supply"), s.catchPpr, flow,
         tr("Primary production required to produce the catch (Pauly & Christensen 1995, Nature 374:255), each unit "
            "of detritus eaten counted as one unit of level-I supply"),
         true},
        {"catch_ppr_share_of_tpp", tr("PPR (detritus counted) / (TPP + detritus inflow)"), s.catchPprShareOfTpp, none,
         tr("The PPR above divided by its matching total, primary production plus the detritus pools' inflow "
            "(Pauly & Christensen 1995)"),
         true},
        {"catch_ppr_producers_only", tr("PPR of the catch, producers only"), s.catchPprProducersOnly, flow,
         tr("Primary production required, detritus eaten needing none further (Pauly & Christensen 1995; "
            "the two readings are this project's labels)"),
         true},
        {"catch_ppr_producers_only_share_of_tpp", tr("PPR (producers only) / TPP"), s.catchPprProducersOnlyShare,
         none, tr("The producers-only PPR divided by total primary production (Pauly & Christensen 1995)"), true},
        {"catch_mean_tl", tr("Mean trophic level of the catch (landings)"), s.catchMeanTl, tr("trophic level"),
         tr("Landings-weighted mean trophic level, as in the analyses of fishing down food webs "
            "(Pauly et al. 1998, Science 279:860)"),
         true},
        {"catch_mean_tl_with_discards", tr("Mean trophic level of landings + dead discards"),
         s.catchMeanTlWithDiscards, tr("trophic level"),
         tr("The same mean, weighted by everything the fleets kill: landings plus dead discards (Pauly et al. 1998)"), true},
    };
}

QString displayIndicatorValue(const IndicatorRow& row)
{
    const double v = row.value;
    if (!std::isfinite(v)) return QStringLiteral("–");
    if (row.key == QLatin1String("links")) return QString::number(static_cast<qlonglong>(std::llround(v)));
    const double magnitude = std::abs(v);
    if (magnitude == 0) return QStringLiteral("0");
    if (magnitude >= 1e7 || magnitude < 1e-4) return QString::number(v, 'g', 4);
    const int digits = std::max(0, 3 - static_cast<int>(std::floor(std::log10(magnitude))));
    return QString::number(v, 'f', digits);
}

}  // namespace tl::ui
