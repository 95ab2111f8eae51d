#!/usr/bin/env python3
"""Derives the reservoir's scenario overlays from the baseline CSV folder
(sample_projects/reservoir/), so that they follow the baseline when it changes:

  doubled_net_effort/harvest.csv   the gill-net fleet's landings and discards doubled,
                                   i.e. catch taken as proportional to effort at the
                                   baseline biomass (first approximation; common
                                   practice, no source). Other fleets unchanged.
  invasive_mussel/                 an invented invasive filter-feeding mussel added:
                                   compartments.csv, diet.csv, detritus_routing.csv.

All numbers are invented for the demonstration. Run it after editing the baseline,
then rebuild the projects:  python3 derive_scenarios.py && ninja update_sample_projects
"""
import csv
import io
import os

HERE = os.path.dirname(os.path.abspath(__file__))
BASE = os.path.join(HERE, "..", "reservoir")

MUSSEL = "Invasive mussel"
# name,kind,biomass,pb,qb,ee,pq,unassim,... (invented values)
MUSSEL_VALUES = {"kind": "consumer", "biomass": "25", "pb": "1.1", "qb": "10", "unassim": "0.45"}
MUSSEL_DIET = {"Phytoplankton": 0.65, "Particulate detritus": 0.35}
# Predators that take this share of their diet from the mussel (the rest scaled down).
MUSSEL_PREDATORS = {"Roach adults": 0.10, "Bream": 0.10}
# The invader's row and column are placed after the native mussels'.
NATIVE_MUSSELS = "Freshwater mussels"
MUSSEL_ROUTING = {"Particulate detritus": 0.3, "Sediment organic matter": 0.7}


def read(name):
    with open(os.path.join(BASE, name), newline="", encoding="utf-8") as f:
        return list(csv.reader(f))


def write(folder, name, rows):
    os.makedirs(os.path.join(HERE, folder), exist_ok=True)
    text = io.StringIO()
    csv.writer(text, lineterminator="\n").writerows(rows)
    with open(os.path.join(HERE, folder, name), "w", newline="", encoding="utf-8") as f:
        f.write(text.getvalue())


def number(text):
    return float(text) if text.strip() else 0.0


def fmt(v):
    return "" if v == 0 else ("%.12g" % v)


def doubled_net_effort():
    rows = read("harvest.csv")
    header = rows[0]
    fleets = {r[0] for r in rows[1:]}
    nets = [f for f in fleets if "gillnet" in f.lower().replace(" ", "") or "gill net" in f.lower()]
    if len(nets) != 1:
        raise SystemExit("derive_scenarios.py: expected one gill-net fleet in reservoir/harvest.csv, found %s" % sorted(fleets))
    li, di = header.index("landings"), header.index("discards")
    out = [header]
    for r in rows[1:]:
        r = list(r)
        if r[0] == nets[0]:
            r[li] = fmt(2 * number(r[li]))
            r[di] = fmt(2 * number(r[di]))
        out.append(r)
    write("doubled_net_effort", "harvest.csv", out)


def invasive_mussel():
    comps = read("compartments.csv")
    header = comps[0]
    names = [r[0] for r in comps[1:]]
    for needed in [NATIVE_MUSSELS, *MUSSEL_DIET, *MUSSEL_PREDATORS, *MUSSEL_ROUTING]:
        if needed not in names:
            raise SystemExit("derive_scenarios.py: reservoir/compartments.csv has no '%s'" % needed)
    at = names.index(NATIVE_MUSSELS) + 1
    row = [MUSSEL] + [MUSSEL_VALUES.get(col, "") for col in header[1:]]
    out = [header] + [list(r) for r in comps[1:]]
    out.insert(at + 1, row)
    write("invasive_mussel", "compartments.csv", out)

    diet = read("diet.csv")
    dh = diet[0]
    col = dh.index(NATIVE_MUSSELS) + 1
    new_header = dh[:col] + [MUSSEL] + dh[col:]
    out = [new_header]
    for r in diet[1:]:
        r = list(r) + [""] * (len(dh) - len(r))
        share = MUSSEL_PREDATORS.get(r[0], 0.0)
        cells = [fmt(number(c) * (1 - share)) if share else c for c in r[1:]]
        out.append([r[0]] + cells[: col - 1] + [fmt(share)] + cells[col - 1:])
    mussel_row = [MUSSEL] + [fmt(MUSSEL_DIET.get(p, 0.0)) for p in new_header[1:]]
    predators = [r[0] for r in out[1:]]
    insert_at = predators.index(NATIVE_MUSSELS) + 2 if NATIVE_MUSSELS in predators else len(out)
    out.insert(insert_at, mussel_row)
    write("invasive_mussel", "diet.csv", out)

    routing = read("detritus_routing.csv") if os.path.exists(os.path.join(BASE, "detritus_routing.csv")) else [
        ["source", "detritus", "fraction"]]
    routing += [[MUSSEL, pool, fmt(v)] for pool, v in MUSSEL_ROUTING.items()]
    write("invasive_mussel", "detritus_routing.csv", routing)


if __name__ == "__main__":
    doubled_net_effort()
    invasive_mussel()
