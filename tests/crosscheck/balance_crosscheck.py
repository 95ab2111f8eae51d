#!/usr/bin/python3
"""Cross-check of `tledger solve --json` against an independent numpy build of the
mass balance (Polovina 1984; Christensen & Pauly 1992; DESIGN.md 3.2) and of the
trophic levels against networkx.trophic_levels.

For each random model (invented numbers, written as a CSV folder per DESIGN 5.1):
  * numpy: one row per living compartment i,
        B_i PB_i EE_i - sum_j B_j QB_j DC_ij = Y_i + E_i + BA_i,
    one column per unknown (B, P/B, Q/B or EE; P/Q standing in for P/B or Q/B),
    solved with numpy.linalg.solve (square) or numpy.linalg.lstsq (more equations
    than unknowns; those models are consistent by construction, so the least-squares
    solution is the exact one whatever the row weights);
  * networkx: trophic_levels on the weighted diet graph (edge prey -> predator,
    weight DC_ij, import left out). Its definition, TL_j = 1 + sum_i w_ij TL_i /
    sum_i w_ij with nodes of in-degree 0 at level 1, coincides with DESIGN 3.3 when
    producers and detritus pools are the nodes without food: they are here, and no
    consumer lives on import alone (networkx would put such a consumer at 1, the
    solver at 2 by its documented choice), so the generator never writes one.
Solved values, flows, detritus EE and TL must agree within 1e-8 relative.

Usage: balance_crosscheck.py --tledger PATH [--models N] [--seed S] [--keep DIR]
"""

import argparse
import csv
import json
import math
import os
import shutil
import subprocess
import sys
import tempfile
import warnings

import networkx
import numpy

REL_TOL = 1e-8
# networkx 2.8 warns that adjacency_matrix will change type in 3.0; not our concern.
warnings.filterwarnings("ignore", category=FutureWarning, module="networkx")
HEADER = ["name", "kind", "biomass", "pb", "qb", "ee", "pq", "unassim",
          "biomass_accum", "net_emigration", "detritus_import"]


# ---------------------------------------------------------------- random models

def random_model(rng, n, consistent):
    """A random food web (dict of lists). With consistent=True, P/B is set so that
    every equation closes exactly for the drawn EE; otherwise P/B is drawn freely."""
    n_prod, n_pool = int(rng.integers(1, 4)), int(rng.integers(1, 3))
    kinds = ["producer"] * n_prod + ["detritus"] * n_pool + ["consumer"] * (n - n_prod - n_pool)
    rng.shuffle(kinds)
    names = []
    for i, k in enumerate(kinds):
        base = {"producer": "Alga", "detritus": "Pool", "consumer": "Fish"}[k]
        # Some names need RFC 4180 quoting or are not ASCII.
        style = int(rng.integers(0, 6))
        names.append(f"{base} {i + 1}" if style < 4 else
                     f"{base}, stage {i + 1}" if style == 4 else f"Åsp \"{i + 1}\"")
    m = {"n": n, "kind": kinds, "name": names,
         "B": [math.nan] * n, "PB": [math.nan] * n, "QB": [math.nan] * n, "EE": [math.nan] * n,
         "PQ": [math.nan] * n, "U": [math.nan] * n, "BA": [0.0] * n, "E": [0.0] * n,
         "import": [0.0] * n, "Bdet": [math.nan] * n,
         "DC": numpy.zeros((n, n)), "dietImport": numpy.zeros(n),
         "landings": numpy.zeros((2, n)), "discards": numpy.zeros((2, n)),
         "routing": {}}  # routing[source] = {pool: fraction}
    consumers = [i for i in range(n) if kinds[i] == "consumer"]
    basal = [i for i in range(n) if kinds[i] != "consumer"]
    for i in range(n):
        if kinds[i] == "producer":
            m["B"][i] = float(rng.uniform(20, 500))
        elif kinds[i] == "consumer":
            m["B"][i] = float(math.exp(rng.uniform(math.log(0.05), math.log(40))))
            m["QB"][i] = float(math.exp(rng.uniform(math.log(2), math.log(60))))
            if rng.random() < 0.7:
                m["U"][i] = float(rng.uniform(0.1, 0.4))
        else:
            if rng.random() < 0.3:
                m["import"][i] = float(rng.uniform(0, 50))
            if rng.random() < 0.3:
                m["Bdet"][i] = float(rng.uniform(10, 300))
        if kinds[i] != "detritus":
            if rng.random() < 0.1:
                m["E"][i] = float(rng.uniform(0, 0.2)) * m["B"][i]
            if rng.random() < 0.1:
                m["BA"][i] = float(rng.uniform(0, 0.1)) * m["B"][i]
    for r, j in enumerate(consumers):
        cand = basal + consumers[:r]
        w = numpy.zeros(n)
        for _ in range(int(rng.integers(1, 5))):
            w[cand[int(rng.integers(0, len(cand)))]] += rng.uniform(0.2, 1)
        if rng.random() < 0.25:
            w[j] += rng.uniform(0.02, 0.2)  # cannibalism
        if r + 1 < len(consumers) and rng.random() < 0.15:
            w[consumers[int(rng.integers(r + 1, len(consumers)))]] += rng.uniform(0.02, 0.2)  # feeding loop
        imp = float(rng.uniform(0.05, 0.3)) if rng.random() < 0.2 else 0.0
        m["DC"][:, j] = (1 - imp) * w / w.sum()
        m["dietImport"][j] = imp
    for i in range(n):
        if kinds[i] == "detritus":
            continue
        eaten = any(m["DC"][i, j] > 0 for j in consumers if j != i)
        if not eaten or rng.random() < 0.3:
            m["landings"][0, i] = float(rng.uniform(0.02, 0.3)) * m["B"][i]
        if rng.random() < 0.2:
            m["discards"][1, i] = float(rng.uniform(0.01, 0.1)) * m["B"][i]
    pools = [i for i in range(n) if kinds[i] == "detritus"]
    if len(pools) == 2:
        for i in range(n):
            if kinds[i] != "detritus" and rng.random() < 0.4:
                s = float(rng.uniform(0.1, 0.9))
                m["routing"][i] = {pools[0]: s, pools[1]: 1 - s}
    Y = m["landings"].sum(axis=0) + m["discards"].sum(axis=0)
    for i in range(n):
        if kinds[i] == "detritus":
            continue
        ee = float(rng.uniform(0.2, 0.95))
        if consistent:
            demand = Y[i] + m["E"][i] + m["BA"][i] + sum(
                m["DC"][i, j] * m["B"][j] * m["QB"][j] for j in consumers)
            m["PB"][i] = demand / (m["B"][i] * ee)
        else:
            m["PB"][i] = float(rng.uniform(0.3, 3)) if kinds[i] == "consumer" else float(rng.uniform(5, 200))
        m["EE"][i] = ee
    return m


def hide_values(rng, m, square):
    """Hides at most one of B, P/B, Q/B, EE per living compartment so that each unknown
    can be matched to a distinct equation row (B, P/B, EE and a cannibal's Q/B to
    their own row, Q/B otherwise to a prey's free row). square=True hides an own-row
    value in every living compartment. Some hidden P/B or Q/B get a P/Q that stands in
    for them (the compartment then also has EE hidden). Returns {index: [params]}."""
    n, kinds = m["n"], m["kind"]
    living = [i for i in range(n) if kinds[i] != "detritus"]
    order = list(living)
    rng.shuffle(order)
    claimed, choice = set(), {}
    for i in order:
        r = rng.random()
        if square:
            choice[i] = "EE" if r < 0.4 else "B" if r < 0.75 else "PB"
        elif r < 0.15:
            continue
        else:
            choice[i] = ("EE" if r < 0.4 else "B" if r < 0.65 else "PB" if r < 0.8 else
                         "QB" if kinds[i] == "consumer" else "EE")
        if choice[i] != "QB":
            claimed.add(i)
    for j in order:
        if choice.get(j) != "QB":
            continue
        rows = ([j] if m["DC"][j, j] > 0 and j not in claimed else []) + \
               [i for i in range(n) if kinds[i] != "detritus" and m["DC"][i, j] > 0 and i not in claimed]
        if rows:
            claimed.add(rows[0])
        else:
            del choice[j]
    hidden = {}
    for i, p in choice.items():
        hidden[i] = [p]
        m[p][i] = math.nan
        # P/Q standing in: hide P/B (or Q/B) too and give P/Q, when EE is the unknown.
        if p == "EE" and kinds[i] == "consumer" and rng.random() < 0.25:
            other = "PB" if rng.random() < 0.5 else "QB"
            m["PQ"][i] = (m["PB"][i] / m["QB"][i])
            m[other][i] = math.nan
            hidden[i].append(other)
    return hidden


# ---------------------------------------------------------------- CSV folder (DESIGN 5.1)

def fmt(v):
    return "" if v is None or (isinstance(v, float) and math.isnan(v)) else repr(float(v))


def write_csv_folder(m, folder):
    os.makedirs(folder, exist_ok=True)
    n, kinds, names = m["n"], m["kind"], m["name"]
    with open(os.path.join(folder, "compartments.csv"), "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f)
        w.writerow(HEADER)
        for i in range(n):
            living = kinds[i] != "detritus"
            w.writerow([names[i], kinds[i],
                        fmt(m["B"][i] if living else m["Bdet"][i]),
                        fmt(m["PB"][i]) if living else "",
                        fmt(m["QB"][i]) if kinds[i] == "consumer" else "",
                        fmt(m["EE"][i]) if living else "",
                        fmt(m["PQ"][i]) if kinds[i] == "consumer" else "",
                        fmt(m["U"][i]) if kinds[i] == "consumer" else "",
                        fmt(m["BA"][i]) if living and m["BA"][i] else "",
                        fmt(m["E"][i]) if living and m["E"][i] else "",
                        fmt(m["import"][i]) if not living and m["import"][i] else ""])
    with open(os.path.join(folder, "diet.csv"), "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f)
        w.writerow(["predator"] + names + ["import"])
        for j in range(n):
            if kinds[j] == "consumer":
                w.writerow([names[j]] + [fmt(m["DC"][i, j]) if m["DC"][i, j] else "" for i in range(n)]
                           + [fmt(m["dietImport"][j]) if m["dietImport"][j] else ""])
    with open(os.path.join(folder, "harvest.csv"), "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f)
        w.writerow(["fleet", "compartment", "landings", "discards"])
        for fl, fleet in enumerate(["Nets", "Lines"]):
            for i in range(n):
                if m["landings"][fl, i] or m["discards"][fl, i]:
                    w.writerow([fleet, names[i], fmt(m["landings"][fl, i]), fmt(m["discards"][fl, i])])
    if m["routing"]:
        with open(os.path.join(folder, "detritus_routing.csv"), "w", newline="", encoding="utf-8") as f:
            w = csv.writer(f)
            w.writerow(["source", "detritus", "fraction"])
            for s, split in m["routing"].items():
                for d, frac in split.items():
                    w.writerow([names[s], names[d], fmt(frac)])


# ---------------------------------------------------------------- numpy reference

def numpy_solve(m):
    """Completes B, P/B, Q/B, EE from the hidden model; returns values, flows and the
    solved parameter keys per compartment."""
    n, kinds = m["n"], m["kind"]
    B, PB, QB, EE, PQ = (numpy.array(m[k], dtype=float) for k in ("B", "PB", "QB", "EE", "PQ"))
    U = numpy.array([(0.2 if math.isnan(u) else u) if k == "consumer" else 0.0
                     for u, k in zip(m["U"], kinds)])
    Y = m["landings"].sum(axis=0) + m["discards"].sum(axis=0)
    dead = m["discards"].sum(axis=0)
    DC = m["DC"]
    living = [i for i in range(n) if kinds[i] != "detritus"]
    consumers = [i for i in range(n) if kinds[i] == "consumer"]
    solved = {i: set() for i in range(n)}
    tied = set()
    for i in consumers:  # P/Q standing in
        if not math.isnan(PQ[i]):
            if math.isnan(PB[i]) and not math.isnan(QB[i]):
                PB[i] = PQ[i] * QB[i]; solved[i].add("pb")
            elif math.isnan(QB[i]) and not math.isnan(PB[i]):
                QB[i] = PB[i] / PQ[i]; solved[i].add("qb")
            elif math.isnan(PB[i]) and math.isnan(QB[i]):
                tied.add(i)
    unknown = {}
    for i in living:
        miss = [p for p, v in (("B", B), ("PB", PB), ("QB", QB), ("EE", EE))
                if math.isnan(v[i]) and not (p == "QB" and kinds[i] != "consumer")
                and not (p == "PB" and i in tied)]
        assert len(miss) <= 1, (m["name"][i], miss)
        if miss:
            unknown[i] = miss[0]
    for i in range(n):
        if kinds[i] != "consumer":
            QB[i] = 0.0
    cols = {i: c for c, i in enumerate(sorted(unknown))}
    A = numpy.zeros((len(living), len(cols)))
    b = numpy.zeros(len(living))
    for r, i in enumerate(living):
        b[r] = Y[i] + m["E"][i] + m["BA"][i]
        u = unknown.get(i)
        if u == "B":
            A[r, cols[i]] += PB[i] * EE[i]
        elif u == "PB":
            A[r, cols[i]] += B[i] * EE[i]
        elif u == "EE":
            A[r, cols[i]] += B[i] * PB[i]
        elif u == "QB" and i in tied:
            A[r, cols[i]] += B[i] * EE[i] * PQ[i]
        else:
            b[r] -= B[i] * PB[i] * EE[i]
        for j in consumers:
            if DC[i, j] == 0:
                continue
            uj = unknown.get(j)
            if uj == "B":
                A[r, cols[j]] -= DC[i, j] * QB[j]
            elif uj == "QB":
                A[r, cols[j]] -= DC[i, j] * B[j]
            else:
                b[r] += DC[i, j] * B[j] * QB[j]
    if cols:
        x = numpy.linalg.solve(A, b) if A.shape[0] == A.shape[1] else numpy.linalg.lstsq(A, b, rcond=None)[0]
        for i, c in cols.items():
            key = {"B": "biomass", "PB": "pb", "QB": "qb", "EE": "ee"}[unknown[i]]
            {"B": B, "PB": PB, "QB": QB, "EE": EE}[unknown[i]][i] = x[c]
            solved[i].add(key)
            if i in tied:
                PB[i] = PQ[i] * x[c]
                solved[i].add("pb")
    P = numpy.where([k != "detritus" for k in kinds], B * PB, 0.0)
    Q = numpy.where([k == "consumer" for k in kinds], B * QB, 0.0)
    P = numpy.nan_to_num(P)
    Q = numpy.nan_to_num(Q)
    to_det = numpy.array([(1 - EE[i]) * P[i] + U[i] * Q[i] + dead[i] if kinds[i] != "detritus" else 0.0
                          for i in range(n)])
    pools = [i for i in range(n) if kinds[i] == "detritus"]
    inflow = {d: m["import"][d] for d in pools}
    for i in living:
        split = m["routing"].get(i, {pools[0]: 1.0})
        for d, frac in split.items():
            inflow[d] += frac * (to_det[i] - dead[i])
        inflow[pools[0]] += dead[i]  # CSV fleets have no discard pool: dead discards to the first pool
    out = {}
    for i in range(n):
        name = m["name"][i]
        if kinds[i] == "detritus":
            eaten = float(DC[i, :] @ Q)
            out[name] = {"ee": eaten / inflow[i] if inflow[i] > 0 else (0.0 if eaten == 0 else math.nan),
                         "solved": {"ee"}}
            continue
        row = {"biomass": B[i], "pb": PB[i], "ee": EE[i], "production": P[i],
               "flow_to_detritus": to_det[i], "solved": solved[i]}
        if kinds[i] == "consumer":
            row.update({"qb": QB[i], "consumption": Q[i], "respiration": Q[i] * (1 - U[i]) - P[i],
                        "pq": PB[i] / QB[i]})
        out[name] = row
    return out


def networkx_levels(m):
    g = networkx.DiGraph()
    g.add_nodes_from(m["name"])
    for j in range(m["n"]):
        for i in range(m["n"]):
            if m["DC"][i, j] > 0:
                g.add_edge(m["name"][i], m["name"][j], weight=float(m["DC"][i, j]))
    return networkx.trophic_levels(g, weight="weight")


# ---------------------------------------------------------------- comparison

def close(a, b):
    """Within REL_TOL relative; an undefined value (JSON null, numpy NaN) matches only
    another undefined one."""
    undefined_a = a is None or (isinstance(a, float) and math.isnan(a))
    undefined_b = b is None or (isinstance(b, float) and math.isnan(b))
    if undefined_a or undefined_b:
        return undefined_a and undefined_b
    return abs(a - b) <= REL_TOL * max(abs(a), abs(b)) + 1e-12


def compare(m, sheet, reference, levels):
    errors = []
    rows = {r["name"]: r for r in sheet["compartments"]}
    if sheet["status"] == "invalid":
        errors.append("status invalid: " + "; ".join(p["message"] for p in sheet["problems"]))
        return errors
    for name, ref in reference.items():
        row = rows.get(name)
        if row is None:
            errors.append(f"{name}: missing from the JSON")
            continue
        for key, value in ref.items():
            if key == "solved":
                if set(row["solved"]) != value:
                    errors.append(f"{name}: solved {sorted(row['solved'])}, numpy {sorted(value)}")
                continue
            if not close(row.get(key), float(value)):
                errors.append(f"{name}.{key}: tledger {row.get(key)!r}, numpy {float(value)!r}")
        if not close(row.get("tl"), levels[name]):
            errors.append(f"{name}.tl: tledger {row.get('tl')!r}, networkx {levels[name]!r}")
    return errors


def main():
    parser = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("--tledger", required=True)
    parser.add_argument("--models", type=int, default=60)
    parser.add_argument("--seed", type=int, default=20240611)
    parser.add_argument("--keep", help="copy the CSV folders of failing models here")
    args = parser.parse_args()
    print(f"numpy {numpy.__version__}, networkx {networkx.__version__}, python {sys.version.split()[0]}")

    rng = numpy.random.default_rng(args.seed)
    failures, compared = 0, 0
    tally = {"B": 0, "PB": 0, "QB": 0, "EE": 0, "P/Q stand-in": 0, "overdetermined models": 0}
    with tempfile.TemporaryDirectory(prefix="tl_crosscheck_") as tmp:
        for k in range(args.models):
            n = int(rng.integers(8, 31))
            kind = k % 3  # 0: consistent, mixed unknowns; 1: consistent, square; 2: free values, square
            m = random_model(rng, n, consistent=kind != 2)
            hidden = hide_values(rng, m, square=kind != 0)
            for params in hidden.values():
                tally[params[0]] += 1
                tally["P/Q stand-in"] += len(params) > 1
            tally["overdetermined models"] += len(hidden) < sum(k != "detritus" for k in m["kind"])
            folder = os.path.join(tmp, f"model_{k:03d}")
            write_csv_folder(m, folder)
            reference = numpy_solve(m)
            levels = networkx_levels(m)
            run = subprocess.run([args.tledger, "solve", folder, "--json"], capture_output=True, text=True)
            if run.returncode not in (0, 1):
                errors = [f"exit {run.returncode}: {run.stderr.strip()}"]
            else:
                try:
                    errors = compare(m, json.loads(run.stdout), reference, levels)
                except json.JSONDecodeError as e:
                    errors = [f"unreadable JSON ({e}): {run.stdout[:200]}"]
            compared += 1
            if errors:
                failures += 1
                print(f"FAIL model {k} ({n} compartments, {['mixed', 'square', 'free'][kind]}):")
                for e in errors[:10]:
                    print("   ", e)
                if args.keep:
                    shutil.copytree(folder, os.path.join(args.keep, os.path.basename(folder)), dirs_exist_ok=True)
    print("unknowns solved:", ", ".join(f"{k} {v}" for k, v in tally.items()))
    print(f"{compared - failures} of {compared} models agree with numpy and networkx within {REL_TOL:g} relative")
    return 1 if failures or compared < 50 else 0


if __name__ == "__main__":
    sys.exit(main())
