#!/usr/bin/python3
"""Mass balance of a CSV model folder in NumPy, the way a scripting user would write it:
the reference side of the speed comparison in run_benchmarks.py (issue 9).

Written from the published equations (Polovina 1984 Coral Reefs 3:1; Christensen & Pauly
1992 Ecol Model 61:169; DESIGN.md 3.2 and the CSV contract 5.1), independently of the
C++ solver: one dense system A x = b over every unknown, rows = living compartments,

    B_i (P/B)_i EE_i - sum_j B_j (Q/B)_j DC_ij = Y_i + E_i + BA_i,

solved with numpy.linalg.solve when square and numpy.linalg.lstsq otherwise; then the
flows, the detritus pools and the trophic levels TL_j = 1 + sum_i DC_ij TL_i (diet
renormalised without import; a dense linear solve).

    numpy_balance.py FOLDER [--repeat-seconds S]

Prints one JSON object: status, the completed values per compartment and the timings
(read_s: reading the CSV files; solve_s: one solve from the parsed tables to the trophic
levels, the median of calls repeated for --repeat-seconds, default 0.3; script_s: from the
first line of the script, imports included, to the end of the first solve: the script's
own cost of one solve, without the interpreter's start-up). Exit code 2 on input this script does not handle.
"""
import time

SCRIPT_START = time.perf_counter()  # before the imports: script_s counts them

import csv  # noqa: E402
import json  # noqa: E402
import math  # noqa: E402
import sys  # noqa: E402

import numpy as np  # noqa: E402


def number(cell):
    cell = cell.strip()
    return float(cell) if cell else None


def read_rows(path):
    with open(path, newline="", encoding="utf-8") as f:
        rows = list(csv.reader(f))
    return rows[0], rows[1:]


def read_folder(folder):
    header, rows = read_rows(f"{folder}/compartments.csv")
    col = {h.strip(): k for k, h in enumerate(header)}
    names = [r[col["name"]].strip() for r in rows]
    index = {name: k for k, name in enumerate(names)}
    n = len(names)
    kinds = [r[col["kind"]].strip() for r in rows]
    value = {key: [number(r[col[key]]) if key in col else None for r in rows]
             for key in ("biomass", "pb", "qb", "ee", "pq", "unassim", "biomass_accum",
                         "net_emigration", "detritus_import")}

    dc = np.zeros((n, n))  # dc[prey, predator]
    diet_import = np.zeros(n)
    header, rows = read_rows(f"{folder}/diet.csv")
    header = [h.strip() for h in header]
    if header == ["predator", "prey", "share"]:  # long form
        for r in rows:
            if not r:
                continue
            j, prey, share = index[r[0].strip()], r[1].strip(), number(r[2]) or 0.0
            if prey == "import":
                diet_import[j] += share
            else:
                dc[index[prey], j] += share
    else:  # wide form
        prey_of_column = [None if h == "import" else index[h] for h in header[1:]]
        for r in rows:
            if not r:
                continue
            j = index[r[0].strip()]
            for k, cell in enumerate(r[1:]):
                share = number(cell)
                if share:
                    if prey_of_column[k] is None:
                        diet_import[j] += share
                    else:
                        dc[prey_of_column[k], j] += share

    pools = [k for k in range(n) if kinds[k] == "detritus"]
    landings = np.zeros(n)
    dead_discards_to = np.zeros((n, n))  # [source, pool]
    try:
        header, rows = read_rows(f"{folder}/harvest.csv")
        col = {h.strip(): k for k, h in enumerate(header)}
        fleet_pool = {}
        for r in rows:  # one discard pool per fleet, named on any of its rows
            if "discard_pool" in col and r[col["discard_pool"]].strip():
                fleet_pool[r[col["fleet"]].strip()] = index[r[col["discard_pool"]].strip()]
        for r in rows:
            if not r or not r[col["compartment"]].strip():
                continue
            i = index[r[col["compartment"]].strip()]
            landings[i] += number(r[col["landings"]]) or 0.0
            discards = number(r[col["discards"]]) or 0.0
            survival = (number(r[col["discard_survival"]]) or 0.0) if "discard_survival" in col else 0.0
            pool = fleet_pool.get(r[col["fleet"]].strip(), pools[0] if pools else None)
            if pool is not None:
                dead_discards_to[i, pool] += discards * (1.0 - survival)
    except FileNotFoundError:
        pass

    routing = np.zeros((n, n))  # [source, pool]
    try:
        _, rows = read_rows(f"{folder}/detritus_routing.csv")
        for r in rows:
            if r:
                routing[index[r[0].strip()], index[r[1].strip()]] += number(r[2]) or 0.0
    except FileNotFoundError:
        pass
    for i in range(n):  # a source without routing sends everything to the first pool
        if pools and routing[i].sum() == 0.0:
            routing[i, pools[0]] = 1.0

    return dict(names=names, kinds=kinds, value=value, dc=dc, diet_import=diet_import,
                landings=landings, dead_discards_to=dead_discards_to, routing=routing, pools=pools)


def solve(t):
    names, kinds, v, dc = t["names"], t["kinds"], t["value"], t["dc"]
    n = len(names)
    nan = float("nan")
    B = np.array([x if x is not None else nan for x in v["biomass"]])
    PB = np.array([x if x is not None else nan for x in v["pb"]])
    QB = np.array([x if x is not None else nan for x in v["qb"]])
    EE = np.array([x if x is not None else nan for x in v["ee"]])
    PQ = np.array([x if x is not None else nan for x in v["pq"]])
    consumer = np.array([k == "consumer" for k in kinds])
    living = np.array([k != "detritus" for k in kinds])
    U = np.array([x if x is not None else (0.2 if c else 0.0) for x, c in zip(v["unassim"], consumer)])
    BA = np.array([x or 0.0 for x in v["biomass_accum"]])
    E = np.array([x or 0.0 for x in v["net_emigration"]])
    imports = np.array([x or 0.0 for x in v["detritus_import"]])
    Y = t["landings"] + t["dead_discards_to"].sum(axis=1)
    QB[~consumer] = 0.0

    # P/Q stands in for a missing P/B or Q/B; both missing: Q/B unknown, P/B = P/Q Q/B.
    tied = consumer & np.isnan(PB) & np.isnan(QB) & ~np.isnan(PQ)
    fill = consumer & np.isnan(PB) & ~np.isnan(QB) & ~np.isnan(PQ)
    PB[fill] = PQ[fill] * QB[fill]
    fill = consumer & np.isnan(QB) & ~np.isnan(PB) & ~np.isnan(PQ)
    QB[fill] = PB[fill] / PQ[fill]

    unknown = [None] * n
    for i in range(n):
        if not living[i]:
            continue
        missing = [p for p, x in (("biomass", B[i]), ("pb", PB[i]), ("qb", QB[i]), ("ee", EE[i])) if math.isnan(x)]
        if tied[i]:
            missing = [p for p in missing if p not in ("pb", "qb")] + ["tied"]
        if len(missing) > 1:
            raise ValueError(f"{names[i]}: more than one unknown ({', '.join(missing)})")
        unknown[i] = missing[0] if missing else None
    rows = [i for i in range(n) if living[i]]
    cols = [i for i in range(n) if unknown[i] is not None]
    row_of = {i: r for r, i in enumerate(rows)}
    col_of = {i: c for c, i in enumerate(cols)}

    A = np.zeros((len(rows), len(cols)))
    b = (Y + E + BA)[rows].astype(float)
    # Production term of row i.
    for i in rows:
        r, u = row_of[i], unknown[i]
        if u == "biomass":
            A[r, col_of[i]] += PB[i] * EE[i]
        elif u == "pb":
            A[r, col_of[i]] += B[i] * EE[i]
        elif u == "ee":
            A[r, col_of[i]] += B[i] * PB[i]
        elif u == "tied":
            A[r, col_of[i]] += B[i] * PQ[i] * EE[i]
        else:
            b[r] -= B[i] * PB[i] * EE[i]
    # Consumption terms: predator j takes DC_ij B_j Q/B_j from prey i.
    dc_living = dc[rows, :]
    known_q = consumer & np.array([unknown[j] not in ("biomass", "qb", "tied") for j in range(n)])
    b += dc_living[:, known_q] @ (B[known_q] * QB[known_q])
    for j in cols:
        if not consumer[j]:
            continue
        if unknown[j] == "biomass":
            A[:, col_of[j]] -= dc_living[:, j] * QB[j]
        elif unknown[j] in ("qb", "tied"):
            A[:, col_of[j]] -= dc_living[:, j] * B[j]

    if A.shape[0] == A.shape[1]:
        x = np.linalg.solve(A, b)
    else:
        x, *_ = np.linalg.lstsq(A, b, rcond=None)
    for j in cols:
        u, xj = unknown[j], x[col_of[j]]
        if u == "biomass":
            B[j] = xj
        elif u == "pb":
            PB[j] = xj
        elif u == "ee":
            EE[j] = xj
        elif u == "qb":
            QB[j] = xj
        elif u == "tied":
            QB[j], PB[j] = xj, PQ[j] * xj

    # Flows (DESIGN 3.2): P, Q, R = Q(1-U) - P, flow to detritus, detritus pools.
    P = np.where(living, B * PB, 0.0)
    Q = np.where(consumer, B * QB, 0.0)
    R = np.where(consumer, Q * (1.0 - U) - P, nan)
    to_detritus = np.where(living, (1.0 - EE) * P + U * Q + t["dead_discards_to"].sum(axis=1), nan)
    detritus_ee = np.full(n, nan)
    for d in t["pools"]:
        inflow = t["routing"][living, d] @ ((1.0 - EE[living]) * P[living] + U[living] * Q[living])
        inflow += t["dead_discards_to"][:, d].sum() + imports[d]
        detritus_ee[d] = (dc[d, :] @ Q) / inflow if inflow > 0 else nan

    # Trophic levels: TL = 1 for producers and pools; TL_j = 1 + sum_i DC'_ij TL_i.
    share = dc / np.where(dc.sum(axis=0) > 0, dc.sum(axis=0), 1.0)
    M = np.eye(n) - np.where(consumer[None, :], share, 0.0).T
    TL = np.linalg.solve(M, np.ones(n))

    status = "balanced"
    if np.any(EE[living] > 1 + 1e-9) or np.any(R[consumer] < -1e-9) or np.any(B[living] < 0):
        status = "unbalanced"
    return dict(B=B, PB=PB, QB=QB, EE=np.where(living, EE, detritus_ee), P=P, Q=Q, R=R, to_detritus=to_detritus,
                TL=TL, status=status, equations=len(rows), unknowns=len(cols))


def finite(x):
    return float(x) if math.isfinite(x) else None


def main(argv):
    if len(argv) < 2:
        print(__doc__, file=sys.stderr)
        return 2
    folder = argv[1]
    repeat_seconds = float(argv[argv.index("--repeat-seconds") + 1]) if "--repeat-seconds" in argv else 0.3
    t0 = time.perf_counter()
    try:
        tables = read_folder(folder)
    except (OSError, KeyError, ValueError, IndexError) as e:
        print(f"numpy_balance.py: cannot read {folder}: {e}", file=sys.stderr)
        return 2
    read_s = time.perf_counter() - t0

    times = []
    while True:
        t1 = time.perf_counter()
        try:
            out = solve(tables)
        except (ValueError, np.linalg.LinAlgError) as e:
            print(f"numpy_balance.py: {folder}: {e}", file=sys.stderr)
            return 2
        times.append(time.perf_counter() - t1)
        if len(times) == 1:
            script_s = time.perf_counter() - SCRIPT_START
        if sum(times) >= repeat_seconds or len(times) >= 2000:
            break
    names, kinds = tables["names"], tables["kinds"]
    result = {
        "status": out["status"],
        "equations": out["equations"],
        "unknowns": out["unknowns"],
        "compartments": [
            {"name": names[i], "kind": kinds[i], "biomass": finite(out["B"][i]), "pb": finite(out["PB"][i]),
             "qb": finite(out["QB"][i]), "ee": finite(out["EE"][i]), "production": finite(out["P"][i]),
             "consumption": finite(out["Q"][i]), "respiration": finite(out["R"][i]),
             "flow_to_detritus": finite(out["to_detritus"][i]), "tl": finite(out["TL"][i])}
            for i in range(len(names))],
        "timing": {"read_s": read_s, "solve_s": float(np.median(times)), "solve_calls": len(times),
                   "numpy": np.__version__},
    }
    result["timing"]["script_s"] = script_s
    json.dump(result, sys.stdout)
    sys.stdout.write("\n")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
