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
  export    MODEL --scenario NAME --format csv|scor|json|html --out PATH
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
