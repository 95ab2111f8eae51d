#!/usr/bin/python3
"""Local elasticities of a CSV model folder by central differences in NumPy: the reference
side of sensitivity_bench (issue 15), in speed and in value.

Each input (given, non-zero B, P/B, Q/B, EE, E, BA of a living compartment and U of a
consumer; P/Q where it stands in for P/B or Q/B; a pool's import; a compartment's catch,
landings and dead discards scaled together; each
non-zero diet share of a predator with two or more, moved on its simplex: the others,
import included, give up the change in proportion to their shares) is moved to
value * exp(+-h); each side is a full solve by numpy_balance.solve (an independent dense
NumPy balance, tests/bench/numpy_balance.py), and

    e = (y(+h) - y(-h)) / (2 h y)

for every output (B, P/B, Q/B, EE, P/Q and TL of each compartment; EE of each pool).

    numpy_elasticity.py FOLDER [--step H]

Prints JSON: {"inputs": [names], "outputs": [names], "elasticity": [[per input] per
output], "timing": {"seconds", "solves", "numpy"}}; names as tledger sensitivity writes
them ("Perch.pb", "Perch.catch", "Perch.diet:Roach", "Perch.diet:import").
"""
import json
import math
import os
import sys
import time

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from numpy_balance import read_folder, solve  # noqa: E402


def inputs_of(t):
    names, kinds, v, dc = t["names"], t["kinds"], t["value"], t["dc"]
    y = t["landings"] + t["dead_discards_to"].sum(axis=1)
    out = []
    for i, name in enumerate(names):
        if kinds[i] == "detritus":
            if v["detritus_import"][i] not in (None, 0.0):
                out.append((f"{name}.detritus_import", ("value", "detritus_import", i)))
            continue
        consumer = kinds[i] == "consumer"
        for key in ("biomass", "pb", "qb", "ee"):
            if key == "qb" and not consumer:
                continue
            if v[key][i] not in (None, 0.0):
                out.append((f"{name}.{key}", ("value", key, i)))
        if consumer and v["pq"][i] is not None and (v["pb"][i] is None or v["qb"][i] is None):
            out.append((f"{name}.pq", ("value", "pq", i)))
        if y[i] > 0:
            out.append((f"{name}.catch", ("catch", i)))
        for key in (("unassim",) if consumer else ()) + ("net_emigration", "biomass_accum"):
            if v[key][i] not in (None, 0.0):
                out.append((f"{name}.{key}", ("value", key, i)))
        if not consumer:
            continue
        prey = [k for k in range(len(names)) if dc[k, i] > 0]
        if len(prey) + (t["diet_import"][i] > 0) < 2:
            continue
        for k in prey:
            out.append((f"{name}.diet:{names[k]}", ("diet", i, k)))
        if t["diet_import"][i] > 0:
            out.append((f"{name}.diet:import", ("diet", i, None)))
    return out


def moved(t, how, h):
    m = dict(t)
    f = math.exp(h)
    if how[0] == "value":
        _, key, i = how
        m["value"] = dict(t["value"])
        m["value"][key] = list(t["value"][key])
        m["value"][key][i] *= f
    elif how[0] == "catch":
        i = how[1]
        m["landings"] = t["landings"].copy()
        m["landings"][i] *= f
        m["dead_discards_to"] = t["dead_discards_to"].copy()
        m["dead_discards_to"][i, :] *= f
    else:
        _, j, k = how
        dc, imp = t["dc"].copy(), t["diet_import"].copy()
        total = dc[:, j].sum() + imp[j]
        before = imp[j] if k is None else dc[k, j]
        rest = (total - before * f) / (total - before)
        dc[:, j] *= rest
        imp[j] *= rest
        if k is None:
            imp[j] = before * f
        else:
            dc[k, j] = before * f
        m["dc"], m["diet_import"] = dc, imp
    return m


def outputs_of(t, point):
    names, kinds = t["names"], t["kinds"]
    out = []
    for i, name in enumerate(names):
        if kinds[i] == "detritus":
            out.append((f"{name}.ee", lambda s, i=i: s["EE"][i]))
            continue
        for key, col in (("biomass", "B"), ("pb", "PB"), ("ee", "EE")):
            out.append((f"{name}.{key}", lambda s, i=i, col=col: s[col][i]))
        if kinds[i] == "consumer":
            out.append((f"{name}.qb", lambda s, i=i: s["QB"][i]))
            out.append((f"{name}.pq", lambda s, i=i: s["PB"][i] / s["QB"][i]))
            out.append((f"{name}.tl", lambda s, i=i: s["TL"][i]))
    return out


def main(argv):
    folder = argv[1]
    h = float(argv[argv.index("--step") + 1]) if "--step" in argv else 1e-5
    t = read_folder(folder)
    start = time.perf_counter()
    point = solve(t)
    ins, outs = inputs_of(t), outputs_of(t, point)
    y0 = np.array([f(point) for _, f in outs])
    e = np.full((len(outs), len(ins)), np.nan)
    for k, (_, how) in enumerate(ins):
        up, down = solve(moved(t, how, h)), solve(moved(t, how, -h))
        dy = (np.array([f(up) for _, f in outs]) - np.array([f(down) for _, f in outs])) / (2 * h)
        with np.errstate(divide="ignore", invalid="ignore"):
            e[:, k] = np.where(y0 != 0, dy / y0, np.nan)
    seconds = time.perf_counter() - start
    json.dump({"inputs": [n for n, _ in ins], "outputs": [n for n, _ in outs],
               "elasticity": [[float(x) if math.isfinite(x) else None for x in row] for row in e],
               "timing": {"seconds": seconds, "solves": 1 + 2 * len(ins), "numpy": np.__version__}}, sys.stdout)
    sys.stdout.write("\n")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
