#!/usr/bin/python3
"""Writes the INVENTED survey of the reservoir sample (hauls, strata, lengths, stomachs,
taxa). Nothing here was measured: densities, growth and mortality are the reservoir
baseline's own values (sample_projects/reservoir/compartments.csv), turned into catches,
lengths and stomachs with seeded noise, so that the fieldwork helpers have something to
estimate. Rerun after changing it: /usr/bin/python3 make_survey.py
"""
import csv
import math
import os
import random

HERE = os.path.dirname(os.path.abspath(__file__))
rng = random.Random(20261202)

# Strata of the (invented) reservoir, km².
STRATA = [("dam basin", 18.0), ("middle reach", 25.0), ("inflow arm", 12.0)]
HAULS_PER_STRATUM = {"dam basin": 6, "middle reach": 8, "inflow arm": 5}
WING_SPREAD_M = 14.0
X1 = 0.5  # the catchability the demo assumes (the README says so)

# Taxon -> (compartment, baseline density t/km², relative density per stratum).
FISH = {
    "roach adult": ("Roach adults", 13.0, (0.8, 1.0, 1.3)),
    "roach juvenile": ("Roach juveniles", 5.3, (0.6, 1.0, 1.6)),
    "bream": ("Bream", 14.0, (0.7, 1.0, 1.5)),
    "perch adult": ("Perch adults", 3.2, (1.3, 1.0, 0.6)),
    "perch juvenile": ("Perch juveniles", 6.0, (1.0, 1.0, 1.0)),
    "zander adult": ("Zander adults", 1.6, (1.2, 1.0, 0.8)),
    "zander juvenile": ("Zander juveniles", 0.7, (0.8, 1.0, 1.3)),
    "pike": ("Pike", 0.9, (0.5, 0.9, 1.8)),
    "ruffe": ("", 0.8, (1.0, 1.0, 1.0)),  # caught but not modelled
}


def weighted_mean_factor(rel):
    area = sum(a for _, a in STRATA)
    return sum(r * a for r, (_, a) in zip(rel, STRATA)) / area


def hauls():
    rows = []
    day = 0
    for s, (stratum, _) in enumerate(STRATA):
        for h in range(HAULS_PER_STRATUM[stratum]):
            day += 1
            station = f"{stratum[0].upper()}{h + 1:02d}"
            tow_km = round(rng.uniform(1.5, 2.5), 2)
            area = tow_km * WING_SPREAD_M / 1000.0
            date = f"2026-07-{day:02d}"
            caught = False
            for taxon, (_, b, rel) in FISH.items():
                if rng.random() < 0.12:  # patchy: some hauls miss a taxon
                    continue
                density_kg = b * 1000.0 * rel[s] / weighted_mean_factor(rel)
                kg = density_kg * X1 * area * rng.lognormvariate(-0.125, 0.5)
                rows.append([station, 1, date, stratum, "bottom trawl", tow_km, WING_SPREAD_M, taxon, round(kg, 2)])
                caught = True
            if not caught:
                rows.append([station, 1, date, stratum, "bottom trawl", tow_km, WING_SPREAD_M, "", 0])
    with open(os.path.join(HERE, "hauls.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["station", "haul", "date", "stratum", "gear", "tow_length_km", "wing_spread_m", "taxon", "catch_kg"])
        w.writerows(rows)
    with open(os.path.join(HERE, "strata.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["stratum", "area_km2"])
        w.writerows([[n, a] for n, a in STRATA])


def length_counts(linf, k, z, width, start, stop, recruit_cm, n0):
    """Counts per class from the catch curve's own model, C = N0 dt exp(-Z t), times a
    logistic selection around recruit_cm, with Poisson-like noise."""
    out = []
    lo = start
    while lo + width <= stop and lo + width < linf:
        hi = lo + width
        dt = math.log((linf - lo) / (linf - hi)) / k
        t = -math.log(1 - (lo + hi) / 2 / linf) / k
        sel = 1.0 / (1.0 + math.exp(-(lo + width / 2 - recruit_cm) / (width / 2)))
        mean = n0 * dt * math.exp(-z * t) * sel
        count = max(0, round(mean + rng.gauss(0, math.sqrt(mean))))
        out.append((lo, hi, count))
        lo = hi
    return out


def lengths():
    with open(os.path.join(HERE, "lengths.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["taxon", "length_from_cm", "length_to_cm", "count"])
        # roach adults: L∞ 35 cm, K 0.22; perch adults: L∞ 40 cm, K 0.25; zander adults: L∞ 80 cm, K 0.18
        for taxon, linf, k, z, width, start, stop, rec, n0 in [
            ("roach adult", 35.0, 0.22, 0.85, 2, 10, 34, 14, 6000),
            ("perch adult", 40.0, 0.25, 0.95, 2, 10, 38, 16, 3000),
            ("zander adult", 80.0, 0.18, 0.75, 4, 24, 76, 36, 1500),
        ]:
            for lo, hi, c in length_counts(linf, k, z, width, start, stop, rec, n0):
                w.writerow([taxon, lo, hi, c])


# Predator compartment -> (predator taxon, prey taxa and the baseline diet shares).
DIETS = {
    "perch adult": [("Leptodora", 0.15), ("chironomid larvae", 0.25), ("roach juvenile", 0.35),
                    ("perch juvenile", 0.25)],
    "zander adult": [("roach juvenile", 0.35), ("roach adult", 0.25), ("bream", 0.05), ("perch juvenile", 0.15),
                     ("perch adult", 0.1), ("zander juvenile", 0.1)],
}


def stomachs():
    rows = []
    for predator, diet in DIETS.items():
        code = "P" if predator.startswith("perch") else "Z"
        for s in range(60 if code == "P" else 35):
            sample = f"{code}{s + 1:03d}"
            if rng.random() < 0.15:
                rows.append([sample, predator, "", 0, 1])
                continue
            # a stomach holds 1-3 prey types, drawn by the diet shares
            chosen = set()
            for _ in range(rng.choice([1, 1, 2, 3])):
                r, acc = rng.random(), 0.0
                for prey, share in diet:
                    acc += share
                    if r <= acc:
                        chosen.add(prey)
                        break
            for prey in sorted(chosen):
                rows.append([sample, predator, prey, round(rng.uniform(0.3, 6.0), 2), 1])
            if rng.random() < 0.1:
                rows.append([sample, predator, "unidentified remains", round(rng.uniform(0.1, 1.0), 2), 1])
    with open(os.path.join(HERE, "stomachs.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["sample", "predator", "prey", "amount", "stomachs"])
        w.writerows(rows)


def taxa():
    mapping = [(t, c) for t, (c, _, _) in FISH.items()]
    mapping += [("Leptodora", "Predatory zooplankton"), ("chironomid larvae", "Chironomid larvae"),
                ("unidentified remains", "")]
    with open(os.path.join(HERE, "taxa.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["taxon", "compartment"])
        w.writerows(mapping)


if __name__ == "__main__":
    hauls()
    lengths()
    stomachs()
    taxa()
