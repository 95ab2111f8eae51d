// tledger: the command-line face of Trophic Ledger (DESIGN.md 5.2). Everything the GUI
// can do on a project or CSV folder, scripts and reviewers can do here.
#include <iostream>
#include <map>
#include <string>
#include <vector>

#include "app/tledger/commands.h"

namespace {

constexpr const char* kUsage = R"(usage: tledger <command> [arguments]

  solve     MODEL [--scenario NAME] [--json]   balance sheet of a scenario
  check     MODEL [--scenario NAME] [--json]   input problems and rule-of-thumb checks
  network   MODEL [--scenario NAME] [--json]   trophic structure, impacts, indicators
            --scor FILE [--producers A,B] [--json]  the same for a SCOR flow network
            [--keep-feeding-cycles]            level decomposition without removing feeding cycles
  reconcile MODEL --scenario NAME [--save-as NEW] [--move b,pb,qb,diet,catch]
            [--pin COMPARTMENT.PARAM ...] [--bound COMPARTMENT.PARAM=LOW:HIGH ...]
            [--ee-max C=V ...] [--ee-min C=V ...] [--pq-range C=LOW:HIGH ...] [--json]
                                               the smallest confidence-weighted change that
                                               balances the scenario, saved as a NEW scenario
                                               (default "NAME reconciled"; for a CSV folder
                                               --save-as names a new folder). --move: kinds of
                                               input that may change (default b,pb,qb,diet);
                                               PARAM: b, pb, qb, catch, diet. Exit 1 when only
                                               a least-violating change exists.
            [--impact-matrix]                  with --json: the impact matrix above 200 compartments too
                                               (it grows as n x n: 45 MB of JSON at 1 000)
  sensitivity MODEL [--scenario NAME] [--output COMPARTMENT.QUANTITY] [--top N]
            [--central-differences] [--json]   local elasticities d ln(output) / d ln(input),
                                               ranked; QUANTITY: biomass (or b), pb, qb, ee,
                                               pq, tl (default: every output)
  compare   PROJECT --scenarios A,B[,C...] [--json]
                                               inputs that differ and every output side by side,
                                               with differences against the first scenario named
  ensemble  MODEL [--scenario NAME] --draws N --seed S [--threads T] [--draw-range FIRST:LAST]
            [--analyses balance,tl,levels,indicators] [--shape lognormal|truncated-normal|uniform|triangular]
            [--diet-cv CV] [--shape-of COMPARTMENT.PARAM=SHAPE ...] [--keep-draws FILE.csv]
            [--out FILE] [--no-store] [--json]
                                               Monte Carlo draws of the inputs from their data
                                               confidence: percentiles of every output over the
                                               balanced draws, the balanced share, the compartments
                                               that break the balance. A project stores the run
                                               beside its scenario. --draw-range runs a slice
                                               (partial JSON, draws numbered from 0, both ends
                                               included) for ensemble-merge.
  ensemble-merge PART... [--partial] [--out FILE] [--json]
                                               slices into exactly the result of one run
  fieldwork biomass --hauls F --taxa F --compartment C [--strata F] [--catchability X1]
            mortality --lengths F --taxon T --linf CM --k K [--method catch-curve|mean-length]
                      [--points 4-9] [--cutoff CM]
            mortality --method pauly1980|then-tmax|then-growth [--linf CM --k K --temperature C | --tmax Y]
            consumption --winf G --temperature C --aspect-ratio A [--food carnivore|herbivore|detritivore]
            diet --stomachs F --taxa F --compartment C [--summary mean|pooled]
            each [--into PROJECT --scenario NAME --compartment C] [--level 0.95] [--json]
                                               a parameter from survey data with its CV and
                                               interval; --into writes it with a source note
  import    CSV_FOLDER|SCOR_FILE --into PROJECT --scenario NAME
  export    MODEL --scenario NAME --format csv|scor|json|html|pdf --out PATH
            PROJECT --scenarios A,B[,C...] --format html|pdf --out PATH
                                               html/pdf: the report (every scenario, the one named,
                                               or a comparison), charts included, with provenance
            MODEL --scenario NAME --format svg|png|pdf --view level-bars|flow-map [--dpi N] --out PATH

MODEL is a CSV model folder (compartments.csv, diet.csv, ...) or a .tledger project.
Exit codes: 0 success, 1 model problems reported, 2 bad input or usage.

Limits of this version (more is refused with the file, line and column): 20 000
compartments, 200 fleets and 2 000 000 non-zero diet shares per model; names of
200 characters; 256 MiB per CSV file, 64 MiB per SCOR file (at most 999 nodes).
)";

}  // namespace

int main(int argc, char** argv)
{
    using Command = int (*)(const tl::cli::Args&);
    const std::map<std::string, Command> commands = {
        {"solve", tl::cli::cmdSolve},   {"check", tl::cli::cmdCheck},   {"network", tl::cli::cmdNetwork},
        {"import", tl::cli::cmdImport}, {"export", tl::cli::cmdExport}, {"reconcile", tl::cli::cmdReconcile},
        {"sensitivity", tl::cli::cmdSensitivity},
        {"compare", tl::cli::cmdCompare},
        {"ensemble", tl::cli::cmdEnsemble}, {"ensemble-merge", tl::cli::cmdEnsembleMerge},
        {"fieldwork", tl::cli::cmdFieldwork},
    };
    if (argc < 2) {
        std::cerr << kUsage;
        return 2;
    }
    const std::string name = argv[1];
    if (name == "--help" || name == "-h" || name == "help") {
        std::cout << kUsage;
        return 0;
    }
    if (name == "--version") {
        std::cout << "tledger " << TL_VERSION << '\n';
        return 0;
    }
    const auto it = commands.find(name);
    if (it == commands.end()) {
        std::cerr << "tledger: unknown command '" << name << "'\n\n" << kUsage;
        return 2;
    }
    return it->second(tl::cli::Args(argv + 2, argv + argc));
}
