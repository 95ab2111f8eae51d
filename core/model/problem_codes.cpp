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
    {code::kValueTooLarge, E, "An entered value is beyond 1e30, where the flows computed from it would overflow."},
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
    {code::kImplausibleValue, W,
     "An entered value lies far above the plausible range set in the project's rules; check the units and the digits."},
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
    // Reconcile (core/reconcile).
    {code::kReconcileUnsolvable, E, "Reconcile needs a scenario the balance can solve, with positive B, P/B and Q/B."},
    {code::kReconcileOption, E, "A reconcile pin or bound names a compartment or parameter that cannot move."},
    {code::kReconcileConflict, E, "No change within the pins and bounds satisfies this constraint together with the others."},
    // Ensemble (core/ensemble).
    {code::kEnsembleUnsolvable, E, "An ensemble needs a scenario whose balance equations can be set up (at most one unknown per compartment)."},
    {code::kEnsembleSettings, E, "An ensemble setting is out of range (draws, draw range, threads or a CV)."},
    {code::kEnsemblePartial, E, "A partial ensemble result cannot be read or does not belong with the others being merged."},
    // Fieldwork (core/fieldwork).
    {code::kSurveyValue, E, "A survey cell holds a value outside its allowed range (a negative catch, a swept area of zero)."},
    {code::kSurveyInconsistent, E, "Rows of the same haul or stomach sample disagree (swept area, stratum, predator, stomachs)."},
    {code::kSurveyUnknownTaxon, E, "A survey names a taxon that the taxon-to-compartment mapping does not list."},
    {code::kSurveyUnknownCompartment, E, "The taxon mapping names a compartment that the scenario does not have."},
    {code::kSurveyUnknownStratum, E, "A haul names a stratum that the strata file does not list, or a stratum has no haul."},
    {code::kFieldworkTooFewData, E, "Too few hauls, fish, points or stomachs for the estimate and its interval."},
    {code::kFieldworkInvalidInput, E, "An input of a fieldwork estimate is missing or outside what the equation allows."},
    {code::kFieldworkOutsideRange, W, "An input lies outside the range of the data the empirical equation was fitted to."},
    {code::kFieldworkTarget, E, "The estimate cannot be written into that compartment or parameter."},
    {code::kFieldworkNothingUnknown, W,
     "An estimate filled a value the balance used to solve while EE stays given: the compartment has nothing left unknown."},
    // Flow network.
    {code::kNetworkShortfallImport, W,
     "An unbalanced flow would be negative; the shortfall enters the flow network as an import."},
    // CSV model folders.
    {code::kCsvUnreadable, E, "A CSV file cannot be read."},
    {code::kCsvEncoding, E, "A CSV file is not UTF-8 text (for example UTF-16 or a spreadsheet workbook)."},
    {code::kCsvQuote, E, "A quoted CSV field is not closed or has text after its closing quote."},
    {code::kCsvMissingFile, E, "A required CSV file (compartments.csv, diet.csv) is missing from the folder."},
    {code::kCsvHeader, E, "A CSV file's header is not the one expected."},
    {code::kCsvMissingColumn, E, "A required column is missing from a CSV header."},
    {code::kCsvUnknownColumn, E, "A CSV header has a column the reader does not know."},
    {code::kCsvDuplicateColumn, E, "A CSV header names a column twice."},
    {code::kCsvNoRows, E, "A CSV file has a header but no rows."},
    {code::kCsvRowCells, E, "A CSV row has a different number of cells than its header."},
    {code::kCsvName, E, "A compartment has no name."},
    {code::kCsvKind, E, "A compartment kind is not producer, consumer or detritus."},
    {code::kCsvNumber, E, "A cell that should hold a number does not (decimal mark is '.')."},
    {code::kCsvMissingValue, E, "A required cell is empty."},
    {code::kCsvDuplicateName, E, "A compartment or fleet is named twice in a CSV file."},
    {code::kCsvDuplicateRow, E, "The same entry appears on two rows of a CSV file."},
    {code::kCsvUnknownCompartment, E, "A CSV cell names a compartment that compartments.csv does not have."},
    {code::kCsvParameter, E, "A confidence row names a parameter that is not a column of compartments.csv."},
    {code::kCsvGrade, E, "A confidence grade is not A, B, C or D."},
    {code::kCsvDiscardPool, E, "A fleet's discards are sent to two different pools, or to a compartment that is not a pool."},
    {code::kCsvUnknownSetting, E, "settings.csv has a key the reader does not know."},
    {code::kCsvTooManyProblems, E, "More problems were found than are listed (a warning when only warnings were left out)."},
    {code::kCsvWrite, E, "A CSV file could not be written."},
    {code::kCsvLimit, E, "A CSV model exceeds a limit of this version (compartments, name length, diet entries or file size)."},
    // SCOR files.
    {code::kScorOpen, E, "The SCOR file cannot be opened."},
    {code::kScorLimit, E, "The SCOR file exceeds a limit of this version (name length or file size)."},
    {code::kScorEncoding, E, "A SCOR file holds bytes that are not UTF-8 text, or NUL bytes."},
    {code::kScorSyntax, E, "A line of the SCOR file is not in the expected form."},
    {code::kScorNumber, E, "A SCOR entry that should be a number is not."},
    {code::kScorCounts, E, "The node counts on the SCOR header do not fit the file."},
    {code::kScorIndexRange, E, "A SCOR entry refers to a node number outside the network."},
    {code::kScorDuplicate, E, "A SCOR section lists the same node or flow twice."},
    {code::kScorNegative, E, "A SCOR flow or stock is below zero."},
    {code::kScorTruncated, E, "The SCOR file ends before all its sections are complete."},
    {code::kScorTrailingText, W, "The SCOR file has text after its last section; it is ignored."},
    {code::kScorNoBiomass, E, "A living SCOR node has no positive stock; a scenario needs its biomass."},
    {code::kScorNoProduction, E, "A SCOR consumer respires so much of its consumption that it has no production left."},
    {code::kScorNoDetritus, W, "The SCOR network has no non-living node to serve as a detritus pool."},
    {code::kScorDetritusRespiration, W, "A non-living SCOR node respires; the scenario cannot keep that flow."},
    {code::kScorDetritusToDetritus, W, "A SCOR flow runs between two non-living nodes; the scenario cannot keep it."},
    // Project files.
    {code::kStoreNotFound, E, "No file or folder at the given path."},
    {code::kStoreLimit, E, "A scenario exceeds a limit of this version (compartments, name length or diet entries)."},
    {code::kStoreNotProject, E, "The file is not a Trophic Ledger project; it is left untouched."},
    {code::kStoreForeignDatabase, E, "The file is a database of another program; it is left untouched."},
    {code::kStoreDamaged, E, "The project file is damaged; it is left as it is."},
    {code::kStoreUnreadable, E, "The project file cannot be read."},
    {code::kStoreOpenFailed, E, "The project file cannot be opened."},
    {code::kStoreNewerVersion, W, "The project was made by a newer version; it opens read-only to keep what it holds."},
    {code::kStoreMigrationFailed, E, "The project could not be brought to the current format; the file is unchanged."},
    {code::kStoreReadOnly, E, "The project can only be read, so the change was refused."},
    {code::kStoreBusy, E, "Another program held the project file too long; nothing was changed."},
    {code::kStoreReadFailed, E, "Reading the project file failed."},
    {code::kStoreWriteFailed, E, "Writing the project file failed; nothing was changed."},
    {code::kStoreCreateFailed, E, "The project file could not be created."},
    {code::kStoreExists, E, "A file already exists where a new project was to be created."},
    {code::kStoreInvalidName, E, "A scenario name is empty."},
    {code::kStoreDuplicateName, E, "Two scenarios share a name."},
    {code::kStoreInvalidValue, E, "A value cannot be stored (not a finite number)."},
    {code::kStoreInvalidFraction, E, "A share to be stored lies outside [0, 1]."},
    {code::kStoreUnknownScenario, E, "The project has no scenario of that name."},
    {code::kStoreScenarioNeeded, E, "The project holds several scenarios; name the one to use."},
    {code::kStoreNoScenario, E, "The project holds no scenario yet."},
    {code::kStoreUnknownRun, E, "The project has no stored run of that number."},
    {code::kStoreOpenedReadOnly, W,
     "The project was opened read-only (no permission to write it, a read-only disk or folder); use Save As to keep changes."},
    {code::kStoreDiskFull, E, "The disk is full, so the project could not be written; the file keeps its previous content."},
    {code::kStorePermissionDenied, E, "Permission to write the project file or its folder is denied; nothing was changed."},
    {code::kStoreIoError, E, "The disk reported an input/output error (removed, full or failing); the file was not changed."},
});

}  // namespace

std::span<const ProblemCodeInfo> problemCodes() { return kCodes; }

const ProblemCodeInfo* findProblemCode(std::string_view code)
{
    const auto it = std::find_if(kCodes.begin(), kCodes.end(), [&](const ProblemCodeInfo& i) { return i.code == code; });
    return it == kCodes.end() ? nullptr : &*it;
}

}  // namespace tl
