// The registry of problem codes: every Problem::code the program reports, each with
// its usual severity and one sentence a user understands. The Checks panel shows the
// sentence beside a problem and Help lists the whole table. Tests, the CLI's JSON and
// scripts match on the code strings: add codes, never rename or reuse one; one code
// means one thing (a negative input and a negative solved value are two codes).
//
// Codes are grouped by who reports them: validation of inputs (core/model/validation),
// the balance solver and trophic levels (core/balance), the flow network
// (core/network), CSV model folders (csv-*), SCOR files (scor-*) and project files
// (store-*).
#pragma once

#include <span>
#include <string_view>

#include "core/model/problem.h"

namespace tl {

namespace code {
// --- inputs (core/model/validation) --------------------------------------------------
inline constexpr const char* kEmptyName = "empty-name";
inline constexpr const char* kDuplicateName = "duplicate-name";
inline constexpr const char* kNegativeValue = "negative-value";  // an INPUT below zero
inline constexpr const char* kValueTooLarge = "value-too-large";  // an INPUT beyond kMaxInputMagnitude (1e30)
inline constexpr const char* kUnassimOutOfRange = "unassim-out-of-range";
inline constexpr const char* kProducerConsumes = "producer-consumes";
inline constexpr const char* kDetritusRate = "detritus-rate";
inline constexpr const char* kImportOnLiving = "detritus-import-on-living";
inline constexpr const char* kDietSum = "diet-sum";
inline constexpr const char* kDietFraction = "diet-fraction-out-of-range";
inline constexpr const char* kDietOfNonConsumer = "diet-of-non-consumer";
inline constexpr const char* kRoutingSum = "routing-sum";
inline constexpr const char* kRoutingFraction = "routing-fraction-out-of-range";
inline constexpr const char* kRoutingToLiving = "routing-to-non-detritus";
inline constexpr const char* kNegativeLandings = "landings-negative";
inline constexpr const char* kNegativeDiscards = "discards-negative";
inline constexpr const char* kDiscardSurvival = "discard-survival-out-of-range";
inline constexpr const char* kCatchFromDetritus = "catch-from-detritus";
inline constexpr const char* kDiscardPool = "discard-pool-not-detritus";
inline constexpr const char* kEmptyFleetName = "empty-fleet-name";
inline constexpr const char* kDuplicateFleet = "duplicate-fleet";
inline constexpr const char* kNoDetritusPool = "no-detritus-pool";  // also found by the solver: reported once
// The one sentence for a scenario without a detritus pool: validation and the solver
// both find it, and the Checks panel and the Balance sheet must not word it twice.
// (Sentences, not codes: declared as arrays so the registry test does not take them for codes.)
inline constexpr char kNoDetritusPoolMessage[] =
    "The model has no detritus pool, so egestion, other mortality and dead discards have nowhere to go.";
inline constexpr char kNoDetritusPoolHint[] = "Add a compartment of kind detritus.";
inline constexpr const char* kImplausibleValue = "implausible-value";  // above the rules' plausible range (warning)
// --- balance (core/balance) ----------------------------------------------------------
// Structure (status Invalid).
inline constexpr const char* kUnderdetermined = "underdetermined-compartment";  // two or more unknowns
inline constexpr const char* kSingularSystem = "singular-system";               // one per compartment involved
inline constexpr const char* kInvalidValue = "invalid-value";                   // a value the solve cannot use
// Numerics (warning).
inline constexpr const char* kIllConditioned = "ill-conditioned-system";
// Breaches of balance (status Unbalanced).
inline constexpr const char* kEquationResidual = "equation-residual";         // an equation does not close
inline constexpr const char* kEEAboveMax = "ee-above-max";                    // EE > rules.eeMax
inline constexpr const char* kNegativeRespiration = "negative-respiration";   // consumer R < 0
inline constexpr const char* kNegativeSolvedValue = "negative-solved-value";  // a SOLVED B, P/B, Q/B or EE < 0
inline constexpr const char* kDetritusEEAboveOne = "detritus-ee-above-one";   // pool consumed beyond inflow
// Rules of thumb (warning).
inline constexpr const char* kPQOutOfRange = "pq-out-of-range";    // consumer P/Q outside [pqMin, pqMax]
inline constexpr const char* kPQInconsistent = "pq-inconsistent";  // given P/Q != P/B / Q/B
inline constexpr const char* kRoutingFromPoolIgnored = "routing-from-pool-ignored";
// Trophic levels (warning).
inline constexpr const char* kTLFromImport = "tl-from-import";  // no modelled prey: TL set to 2
inline constexpr const char* kTLUndefined = "tl-undefined";     // feeding loop with no basal food
// --- flow network (core/network) -----------------------------------------------------
inline constexpr const char* kNetworkShortfallImport = "network-shortfall-import";
// --- CSV model folders (core/io/csv_*) ------------------------------------------------
inline constexpr const char* kCsvUnreadable = "csv-unreadable";
inline constexpr const char* kCsvEncoding = "csv-encoding";
inline constexpr const char* kCsvQuote = "csv-quote";
inline constexpr const char* kCsvMissingFile = "csv-missing-file";
inline constexpr const char* kCsvHeader = "csv-header";
inline constexpr const char* kCsvMissingColumn = "csv-missing-column";
inline constexpr const char* kCsvUnknownColumn = "csv-unknown-column";
inline constexpr const char* kCsvDuplicateColumn = "csv-duplicate-column";
inline constexpr const char* kCsvNoRows = "csv-no-rows";
inline constexpr const char* kCsvRowCells = "csv-row-cells";
inline constexpr const char* kCsvName = "csv-name";
inline constexpr const char* kCsvKind = "csv-kind";
inline constexpr const char* kCsvNumber = "csv-number";
inline constexpr const char* kCsvMissingValue = "csv-missing-value";
inline constexpr const char* kCsvDuplicateName = "csv-duplicate-name";
inline constexpr const char* kCsvDuplicateRow = "csv-duplicate-row";
inline constexpr const char* kCsvUnknownCompartment = "csv-unknown-compartment";
inline constexpr const char* kCsvParameter = "csv-parameter";
inline constexpr const char* kCsvGrade = "csv-grade";
inline constexpr const char* kCsvDiscardPool = "csv-discard-pool";
inline constexpr const char* kCsvUnknownSetting = "csv-unknown-setting";
inline constexpr const char* kCsvTooManyProblems = "csv-too-many-problems";
inline constexpr const char* kCsvWrite = "csv-write";
inline constexpr const char* kCsvLimit = "csv-limit";
// --- SCOR files (core/io/scor, core/store/scor_import) ---------------------------------
inline constexpr const char* kScorOpen = "scor-open";
inline constexpr const char* kScorLimit = "scor-limit";
inline constexpr const char* kScorEncoding = "scor-encoding";
inline constexpr const char* kScorSyntax = "scor-syntax";
inline constexpr const char* kScorNumber = "scor-number";
inline constexpr const char* kScorCounts = "scor-counts";
inline constexpr const char* kScorIndexRange = "scor-index-range";
inline constexpr const char* kScorDuplicate = "scor-duplicate";
inline constexpr const char* kScorNegative = "scor-negative";
inline constexpr const char* kScorTruncated = "scor-truncated";
inline constexpr const char* kScorTrailingText = "scor-trailing-text";
inline constexpr const char* kScorNoBiomass = "scor-no-biomass";
inline constexpr const char* kScorNoProduction = "scor-no-production";
inline constexpr const char* kScorNoDetritus = "scor-no-detritus";
inline constexpr const char* kScorDetritusRespiration = "scor-detritus-respiration";
inline constexpr const char* kScorDetritusToDetritus = "scor-detritus-to-detritus";
// --- project files (core/store) -------------------------------------------------------
inline constexpr const char* kStoreNotFound = "store-not-found";
inline constexpr const char* kStoreLimit = "store-limit";
inline constexpr const char* kStoreNotProject = "store-not-project";
inline constexpr const char* kStoreForeignDatabase = "store-foreign-database";
inline constexpr const char* kStoreDamaged = "store-damaged";
inline constexpr const char* kStoreUnreadable = "store-unreadable";
inline constexpr const char* kStoreOpenFailed = "store-open-failed";
inline constexpr const char* kStoreNewerVersion = "store-newer-version";
inline constexpr const char* kStoreMigrationFailed = "store-migration-failed";
inline constexpr const char* kStoreReadOnly = "store-read-only";
inline constexpr const char* kStoreBusy = "store-busy";
inline constexpr const char* kStoreReadFailed = "store-read-failed";
inline constexpr const char* kStoreWriteFailed = "store-write-failed";
inline constexpr const char* kStoreCreateFailed = "store-create-failed";
inline constexpr const char* kStoreExists = "store-exists";
inline constexpr const char* kStoreInvalidName = "store-invalid-name";
inline constexpr const char* kStoreDuplicateName = "store-duplicate-name";
inline constexpr const char* kStoreInvalidValue = "store-invalid-value";
inline constexpr const char* kStoreInvalidFraction = "store-invalid-fraction";
inline constexpr const char* kStoreUnknownScenario = "store-unknown-scenario";
inline constexpr const char* kStoreScenarioNeeded = "store-scenario-needed";
inline constexpr const char* kStoreNoScenario = "store-no-scenario";
inline constexpr const char* kStoreUnknownRun = "store-unknown-run";
inline constexpr const char* kStoreOpenedReadOnly = "store-opened-read-only";    // a warning: reading works, writing would not
inline constexpr const char* kStoreDiskFull = "store-disk-full";
inline constexpr const char* kStorePermissionDenied = "store-permission-denied";
inline constexpr const char* kStoreIoError = "store-io-error";
// Reconcile (core/reconcile).
inline constexpr const char* kReconcileUnsolvable = "reconcile-unsolvable";
inline constexpr const char* kReconcileOption = "reconcile-option";
inline constexpr const char* kReconcileConflict = "reconcile-conflict";
// Ensemble (core/ensemble).
inline constexpr const char* kEnsembleUnsolvable = "ensemble-unsolvable";
inline constexpr const char* kEnsembleSettings = "ensemble-settings";
inline constexpr const char* kEnsemblePartial = "ensemble-partial";
// Fieldwork: survey files and the estimators built on them (core/fieldwork).
inline constexpr const char* kSurveyValue = "survey-value";                  // a cell outside its allowed range
inline constexpr const char* kSurveyInconsistent = "survey-inconsistent";    // rows of one haul or sample disagree
inline constexpr const char* kSurveyUnknownTaxon = "survey-unknown-taxon";   // a taxon the mapping lacks
inline constexpr const char* kSurveyUnknownCompartment = "survey-unknown-compartment";
inline constexpr const char* kSurveyUnknownStratum = "survey-unknown-stratum";
inline constexpr const char* kFieldworkTooFewData = "fieldwork-too-few-data";
inline constexpr const char* kFieldworkInvalidInput = "fieldwork-invalid-input";
inline constexpr const char* kFieldworkOutsideRange = "fieldwork-outside-range";  // warning
inline constexpr const char* kFieldworkTarget = "fieldwork-target";
inline constexpr const char* kFieldworkNothingUnknown = "fieldwork-nothing-unknown";  // warning
}  // namespace code

struct ProblemCodeInfo {
    std::string_view code;
    Severity severity;             // as usually reported (a few readers lower or raise it; see the sentence)
    std::string_view explanation;  // one sentence for the user
};

// Every code, grouped as above, each once.
std::span<const ProblemCodeInfo> problemCodes();
// The entry of `code`, or nullptr for a code the registry does not know.
const ProblemCodeInfo* findProblemCode(std::string_view code);

}  // namespace tl
