#!/bin/sh
# Fills a scenario of the reservoir sample from the INVENTED survey in this folder, end
# to end: B from the trawl hauls, P/B from lengths (catch curve, mean length) and from
# natural mortality plus fishing, Q/B from the consumption equation, diets from stomachs.
# Every value is written with its CV (where one exists) and a source note.
#
#   TLEDGER=build/app/tledger sample_projects/reservoir_survey/fill_reservoir.sh COPY.tledger
#
# COPY.tledger is a copy of sample_projects/reservoir.tledger (never the committed file);
# the script adds the scenario "survey 2026" to it (the baseline, refilled).
# Growth parameters, temperatures and fin aspect ratios below are invented as well.
set -eu
TLEDGER=${TLEDGER:-tledger}
HERE=$(cd "$(dirname "$0")" && pwd)
PROJECT=${1:?usage: fill_reservoir.sh PROJECT.tledger}
S="survey 2026"

"$TLEDGER" import "$HERE/../reservoir" --into "$PROJECT" --scenario "$S" --parent baseline \
    --description "baseline refilled from the invented 2026 survey (sample_projects/reservoir_survey)"

# Biomass: swept area, three strata, catchability 0.5 assumed for the demo's bottom trawl.
for c in "Roach adults" "Roach juveniles" "Bream" "Perch adults" "Zander adults" "Zander juveniles" "Pike"; do
    "$TLEDGER" fieldwork biomass --hauls "$HERE/hauls.csv" --strata "$HERE/strata.csv" --taxa "$HERE/taxa.csv" \
        --catchability 0.5 --compartment "$c" --into "$PROJECT" --scenario "$S"
done

# P/B = Z from lengths (Allen 1971).
"$TLEDGER" fieldwork mortality --lengths "$HERE/lengths.csv" --taxon "roach adult" --linf 35 --k 0.22 \
    --into "$PROJECT" --scenario "$S" --compartment "Roach adults"
"$TLEDGER" fieldwork mortality --lengths "$HERE/lengths.csv" --taxon "perch adult" --linf 40 --k 0.25 \
    --into "$PROJECT" --scenario "$S" --compartment "Perch adults"
"$TLEDGER" fieldwork mortality --method mean-length --lengths "$HERE/lengths.csv" --taxon "zander adult" \
    --linf 80 --k 0.18 --into "$PROJECT" --scenario "$S" --compartment "Zander adults"
# Pike: no length sample; P/B = M + F with M from the oldest pike aged (15 years).
"$TLEDGER" fieldwork mortality --method then-tmax --tmax 15 --into "$PROJECT" --scenario "$S" --compartment "Pike"

# Q/B from the consumption equation (mean annual water temperature 11 °C).
"$TLEDGER" fieldwork consumption --winf 900 --temperature 11 --aspect-ratio 1.5 \
    --into "$PROJECT" --scenario "$S" --compartment "Perch adults"
"$TLEDGER" fieldwork consumption --winf 6000 --temperature 11 --aspect-ratio 1.6 \
    --into "$PROJECT" --scenario "$S" --compartment "Zander adults"

# Diets from stomach contents.
for c in "Perch adults" "Zander adults"; do
    "$TLEDGER" fieldwork diet --stomachs "$HERE/stomachs.csv" --taxa "$HERE/taxa.csv" --compartment "$c" \
        --into "$PROJECT" --scenario "$S"
done
