#include "core/model/problem_codes.h"

#include <algorithm>
#include <array>

namespace tl {
namespace {

constexpr Severity E = Severity::Error;
constexpr Severity W = Severity::Warning;

constexpr std::array kCodes = std::to_array<ProblemCodeInfo>({
    // Inputs.
    {code::kEmptyName, E, "A compartment has no name; diet, harvest and routing refer to compartments by name."},
    {code::kDuplicateName, E, "Two compartments share a name, so diet, harvest and routing entries would be ambiguous."},
    {code::kNegativeValue, E, "An entered amount or rate (B, P/B, Q/B, EE, P/Q, detritus import) is below zero."},
    {code::kUnassimOutOfRange, E, "The unassimilated share of consumption U must lie in [0, 1)."},
    {code::kProducerConsumes, E, "A producer has a consumption rate, P/Q or a diet; producers do not consume."},
    {code::kDetritusRate, E, "A detritus pool has a production or consumption rate, EE or P/Q; pools take none."},
    {code::kImportOnLiving, E, "Only detritus pools receive an import of detritus."},
    {code::kDietSum, E, "A consumer's diet shares, import included, do not add up to 1."},
    {code::kDietFraction, E, "A diet share lies outside [0, 1]."},
    {code::kDietOfNonConsumer, E, "A producer or detritus pool has a diet; only consumers eat."},
    {code::kRoutingSum, E, "The detritus routing of a compartment does not add up to 1."},
    {code::kRoutingFraction, E, "A detritus routing share lies outside [0, 1]."},
    {code::kRoutingToLiving, E, "Detritus is routed to a compartment that is not a detritus pool."},
    {code::kNegativeLandings, E, "A fleet's landings are below zero."},
    {code::kNegativeDiscards, E, "A fleet's discards are below zero."},
    {code::kDiscardSurvival, E, "The surviving share of discards lies outside [0, 1]."},
    {code::kCatchFromDetritus, E, "A fleet catches from a detritus pool; only living compartments are caught."},
    {code::kDiscardPool, E, "A fleet's discards are sent to a compartment that is not a detritus pool."},
    {code::kEmptyFleetName, E, "A fleet has no name."},
    {code::kDuplicateFleet, E, "Two fleets share a name."},
    {code::kNoDetritusPool, W,
     "The scenario has no detritus pool, so egestion, other mortality and dead discards have nowhere to go."},
    // Balance.
    {code::kUnderdetermined, E, "A compartment has more than one unknown among B, P/B, Q/B and EE; give one more value."},
    {code::kSingularSystem, E, "The unknown values depend on each other in a loop the balance cannot resolve."},
    {code::kInvalidValue, E, "A value cannot be used by the balance (for example P/Q of zero)."},
    {code::kIllConditioned, W, "The balance equations are nearly dependent; small input changes move solved values a lot."},
    {code::kEquationResidual, E, "A compartment with nothing unknown does not balance: production and its uses differ."},
    {code::kEEAboveMax, E, "More of a compartment's production is used than it produces (EE above the allowed maximum)."},
    {code::kNegativeRespiration, E, "A consumer produces more than it assimilates, so its respiration would be negative."},
    {code::kNegativeSolvedValue, E, "The balance solved a B, P/B, Q/B or EE below zero: the inputs cannot all hold."},
    {code::kDetritusEEAboveOne, E, "A detritus pool is eaten faster than detritus flows into it."},
    {code::kPQOutOfRange, W, "A consumer's P/Q lies outside the usual range set in the project's rules."},
    {code::kPQInconsistent, W, "The given P/Q differs from P/B divided by Q/B."},
    {code::kRoutingFromPoolIgnored, W, "Routing given for a detritus pool is ignored: a pool's surplus is exported."},
    {code::kTLFromImport, W, "A consumer eats only imported food, so its trophic level is set to 2."},
    {code::kTLUndefined, W, "A feeding loop has no producer or detritus below it, so its trophic level is undefined."},
    // Flow network.
    {code::kNetworkShortfallImport, W,
     "An unbalanced flow would be negative; the shortfall enters the flow network as an import."},
    // CSV model folders.
    {"csv-unreadable", E, "A CSV file cannot be read."},
    {"csv-encoding", E, "A CSV file is not UTF-8 text (for example UTF-16 or a spreadsheet workbook)."},
    {"csv-quote", E, "A quoted CSV field is not closed or has text after its closing quote."},
    {"csv-missing-file", E, "A required CSV file (compartments.csv, diet.csv) is missing from the folder."},
    {"csv-header", E, "A CSV file's header is not the one expected."},
    {"csv-missing-column", E, "A required column is missing from a CSV header."},
    {"csv-unknown-column", E, "A CSV header has a column the reader does not know."},
    {"csv-duplicate-column", E, "A CSV header names a column twice."},
    {"csv-no-rows", E, "A CSV file has a header but no rows."},
    {"csv-row-cells", E, "A CSV row has a different number of cells than its header."},
    {"csv-name", E, "A compartment has no name."},
    {"csv-kind", E, "A compartment kind is not producer, consumer or detritus."},
    {"csv-number", E, "A cell that should hold a number does not (decimal mark is '.')."},
    {"csv-missing-value", E, "A required cell is empty."},
    {"csv-duplicate-name", E, "A compartment or fleet is named twice in a CSV file."},
    {"csv-duplicate-row", E, "The same entry appears on two rows of a CSV file."},
    {"csv-unknown-compartment", E, "A CSV cell names a compartment that compartments.csv does not have."},
    {"csv-parameter", E, "A confidence row names a parameter that is not a column of compartments.csv."},
    {"csv-grade", E, "A confidence grade is not A, B, C or D."},
    {"csv-discard-pool", E, "A fleet's discards are sent to two different pools, or to a compartment that is not a pool."},
    {"csv-unknown-setting", E, "settings.csv has a key the reader does not know."},
    {"csv-too-many-problems", E, "More problems were found than are listed (a warning when only warnings were left out)."},
    {"csv-write", E, "A CSV file could not be written."},
    {"csv-limit", E, "A CSV model exceeds a limit of this version (compartments, name length, diet entries or file size)."},
    // SCOR files.
    {"scor-open", E, "The SCOR file cannot be opened."},
    {"scor-limit", E, "The SCOR file exceeds a limit of this version (name length or file size)."},
    {"scor-syntax", E, "A line of the SCOR file is not in the expected form."},
    {"scor-number", E, "A SCOR entry that should be a number is not."},
    {"scor-counts", E, "The node counts on the SCOR header do not fit the file."},
    {"scor-index-range", E, "A SCOR entry refers to a node number outside the network."},
    {"scor-duplicate", E, "A SCOR section lists the same node or flow twice."},
    {"scor-negative", E, "A SCOR flow or stock is below zero."},
    {"scor-truncated", E, "The SCOR file ends before all its sections are complete."},
    {"scor-trailing-text", W, "The SCOR file has text after its last section; it is ignored."},
    {"scor-no-biomass", E, "A living SCOR node has no positive stock; a scenario needs its biomass."},
    {"scor-no-production", E, "A SCOR consumer respires so much of its consumption that it has no production left."},
    {"scor-no-detritus", W, "The SCOR network has no non-living node to serve as a detritus pool."},
    {"scor-detritus-respiration", W, "A non-living SCOR node respires; the scenario cannot keep that flow."},
    {"scor-detritus-to-detritus", W, "A SCOR flow runs between two non-living nodes; the scenario cannot keep it."},
    // Project files.
    {"store-not-found", E, "No file or folder at the given path."},
    {"store-limit", E, "A scenario exceeds a limit of this version (compartments, name length or diet entries)."},
    {"store-not-project", E, "The file is not a Trophic Ledger project; it is left untouched."},
    {"store-foreign-database", E, "The file is a database of another program; it is left untouched."},
    {"store-damaged", E, "The project file is damaged; it is left as it is."},
    {"store-unreadable", E, "The project file cannot be read."},
    {"store-open-failed", E, "The project file cannot be opened."},
    {"store-newer-version", W, "The project was made by a newer version; it opens read-only to keep what it holds."},
    {"store-migration-failed", E, "The project could not be brought to the current format; the file is unchanged."},
    {"store-read-only", E, "The project can only be read, so the change was refused."},
    {"store-busy", E, "Another program held the project file too long; nothing was changed."},
    {"store-read-failed", E, "Reading the project file failed."},
    {"store-write-failed", E, "Writing the project file failed; nothing was changed."},
    {"store-create-failed", E, "The project file could not be created."},
    {"store-exists", E, "A file already exists where a new project was to be created."},
    {"store-invalid-name", E, "A scenario name is empty."},
    {"store-duplicate-name", E, "Two scenarios share a name."},
    {"store-invalid-value", E, "A value cannot be stored (not a finite number)."},
    {"store-invalid-fraction", E, "A share to be stored lies outside [0, 1]."},
    {"store-unknown-scenario", E, "The project has no scenario of that name."},
    {"store-scenario-needed", E, "The project holds several scenarios; name the one to use."},
    {"store-no-scenario", E, "The project holds no scenario yet."},
    {"store-unknown-run", E, "The project has no stored run of that number."},
});

}  // namespace

std::span<const ProblemCodeInfo> problemCodes() { return kCodes; }

const ProblemCodeInfo* findProblemCode(std::string_view code)
{
    const auto it = std::find_if(kCodes.begin(), kCodes.end(), [&](const ProblemCodeInfo& i) { return i.code == code; });
    return it == kCodes.end() ? nullptr : &*it;
}

}  // namespace tl
