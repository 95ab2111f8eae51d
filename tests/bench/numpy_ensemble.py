#!/usr/bin/python3
"""Batched NumPy ensemble of a CSV model folder: the reference side of ensemble_bench
(issue 15). Written the way a scripting user would vectorise it, from the published
equations (Polovina 1984; Christensen & Pauly 1992; DESIGN.md 3.2, 3.7), independently of
the C++ code; handles the `ee` unknown mix of tests/bench/synthetic_model.h (every living
EE unknown, B, P/B and consumers' Q/B given), which needs no linear solve.

Per chunk of draws (arrays draws x compartments):
  - B, P/B, Q/B drawn lognormal with mean = the given value and CV --cv;
  - each diet row with two or more non-zero shares (import counted) from a Dirichlet
    with concentration alpha0 = max(1, (1 - p_max) / (p_max cv^2) - 1), cv = --diet-cv,
    by normalised numpy gamma variates (the same rule as core/ensemble);
  - EE_i = (sum_j DC_ij Q_j + Y_i + E_i + BA_i) / (B_i P/B_i); R = Q (1 - U) - P;
    detritus inflow = routed (1 - EE) P + U Q + dead discards + import, EE_d =
    consumption / inflow; a draw balances when EE <= 1, R >= 0 and EE_d <= 1 (the same
    tolerances as the solver);
  - tier tl: TL of every compartment by a batched dense solve (I - D'^T) TL = 1 + basal
    (numpy.linalg.solve on draws x n x n);
  - tier network: on the balanced draws, the flow matrix extended with imports, exports
    and respiration and from it TST, AMI, ascendency, capacity, overhead (bits) and the
    Finn cycling index by a batched inverse. It does NOT do the level decomposition
    (transfer efficiency by level), so its figure is a lower bound of NumPy's cost for
    the C++ tier, which does.
  - percentiles (2.5, 25, 50, 75, 97.5) and means of every output over the balanced
    draws with numpy.percentile (all balanced draws are held in memory).
Prints one line: draws/s (best of --rounds), balanced share, the tier's note.

    numpy_ensemble.py FOLDER --draws N [--cv 0.1] [--diet-cv 0.1] [--tier balance|tl|network] [--rounds 3]
"""
import argparse
import os
import sys
import time

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from numpy_balance import read_folder  # noqa: E402

CHUNK = 4000


def lognormal(rng, value, cv, size):
    s2 = np.log1p(cv * cv)
    return np.exp(np.log(value) - 0.5 * s2 + np.sqrt(s2) * rng.standard_normal(size))


def prepare(t, diet_cv):
    kinds = t["kinds"]
    n = len(kinds)
    v = t["value"]
    living = np.array([k != "detritus" for k in kinds])
    consumer = np.array([k == "consumer" for k in kinds])
    for i in range(n):
        if living[i] and (v["ee"][i] is not None or v["biomass"][i] is None or v["pb"][i] is None):
            sys.exit("numpy_ensemble.py handles the 'ee' mix only (every living EE unknown, B and P/B given)")
    B = np.array([x or 0.0 for x in v["biomass"]])
    PB = np.array([x or 0.0 for x in v["pb"]])
    QB = np.where(consumer, np.array([x or 0.0 for x in v["qb"]]), 0.0)
    U = np.array([x if x is not None else (0.2 if c else 0.0) for x, c in zip(v["unassim"], consumer)])
    BA = np.array([x or 0.0 for x in v["biomass_accum"]])
    E = np.array([x or 0.0 for x in v["net_emigration"]])
    imports = np.array([x or 0.0 for x in v["detritus_import"]])
    dead = t["dead_discards_to"]
    Y = t["landings"] + dead.sum(axis=1)
    # Diet entries (prey, predator, share), import as prey -1, grouped by predator.
    entries, alpha, rows = [], [], []
    dc = t["dc"]
    for j in range(n):
        prey = [i for i in range(n) if dc[i, j] > 0]
        shares = [dc[i, j] for i in prey]
        if t["diet_import"][j] > 0:
            prey.append(-1)
            shares.append(t["diet_import"][j])
        if not prey:
            continue
        total = sum(shares)
        p = np.array(shares) / total
        a0 = max(1.0, (1 - p.max()) / (p.max() * diet_cv ** 2) - 1) if len(p) > 1 and diet_cv > 0 else 0.0
        start = len(entries)
        entries += [(i, j) for i in prey]
        alpha += list(a0 * p) if a0 > 0 else list(p)
        rows.append((j, start, len(entries), total, a0 > 0))
    return dict(n=n, living=living, consumer=consumer, B=B, PB=PB, QB=QB, U=U, BA=BA, E=E, Y=Y,
                imports=imports, dead=dead, routing=t["routing"], pools=t["pools"],
                entries=entries, alpha=np.array(alpha), rows=rows)


def draw_chunk(rng, m, M, cv):
    n, living, consumer = m["n"], m["living"], m["consumer"]
    B = np.tile(m["B"], (M, 1))
    PB = np.tile(m["PB"], (M, 1))
    QB = np.tile(m["QB"], (M, 1))
    B[:, living] = lognormal(rng, m["B"][living], cv, (M, living.sum()))
    PB[:, living] = lognormal(rng, m["PB"][living], cv, (M, living.sum()))
    QB[:, consumer] = lognormal(rng, m["QB"][consumer], cv, (M, consumer.sum()))
    shares = np.empty((M, len(m["entries"])))
    for (j, a, b, total, drawn) in m["rows"]:
        if drawn:
            g = rng.gamma(m["alpha"][a:b], size=(M, b - a))
            shares[:, a:b] = total * g / g.sum(axis=1, keepdims=True)
        else:
            shares[:, a:b] = total * m["alpha"][a:b]
    return B, PB, QB, shares


def balance(m, B, PB, QB, shares):
    n = m["n"]
    M = B.shape[0]
    P = B * PB
    Q = B * QB
    predation = np.zeros((M, n))
    for e, (i, j) in enumerate(m["entries"]):
        if i >= 0:
            predation[:, i] += shares[:, e] * Q[:, j]
    living = m["living"]
    demand = predation + m["Y"] + m["E"] + m["BA"]
    with np.errstate(divide="ignore", invalid="ignore"):
        EE = np.where(living, demand / P, 0.0)
    R = Q * (1 - m["U"]) - P
    to_detritus = np.where(living, (1 - EE) * P + m["U"] * Q, 0.0)
    inflow = to_detritus @ m["routing"] + m["dead"].sum(axis=0) + m["imports"]
    pools = m["pools"]
    with np.errstate(divide="ignore", invalid="ignore"):
        EEd = predation[:, pools] / inflow[:, pools]
    ok = (EE[:, living] <= 1 + 1e-9).all(axis=1)
    ok &= (R[:, m["consumer"]] >= -1e-9 * np.abs(Q[:, m["consumer"]])).all(axis=1)
    ok &= (EEd <= 1 + 1e-9).all(axis=1) & (EE[:, living] >= 0).all(axis=1)
    return P, Q, R, EE, EEd, predation, to_detritus, inflow, ok


def trophic_levels(m, shares, M):
    n = m["n"]
    D = np.zeros((M, n, n))  # D[:, prey, predator], modelled prey, renormalised
    for e, (i, j) in enumerate(m["entries"]):
        if i >= 0:
            D[:, i, j] = shares[:, e]
    col = D.sum(axis=1, keepdims=True)
    D = np.divide(D, col, out=np.zeros_like(D), where=col > 0)
    A = np.eye(n) - np.transpose(D, (0, 2, 1))
    return np.linalg.solve(A, np.ones((M, n, 1)))[:, :, 0]


def indicators(m, Q, R, shares, to_detritus, inflow, predation, P):
    # Flow matrix over [import, compartments..., export, respiration], per draw.
    n = m["n"]
    M = Q.shape[0]
    T = np.zeros((M, n + 3, n + 3))
    for e, (i, j) in enumerate(m["entries"]):
        T[:, (0 if i < 0 else i + 1), j + 1] += shares[:, e] * Q[:, j]
    T[:, 1:n + 1, 1:n + 1] += to_detritus[:, :, None] * m["routing"][None, :, :]
    producers = m["living"] & ~m["consumer"]
    T[:, 0, 1:n + 1] += np.where(producers, P, 0.0) + m["imports"]
    T[:, 1:n + 1, n + 1] += m["Y"]
    pools = m["pools"]
    T[:, [p + 1 for p in pools], n + 1] += np.maximum(inflow[:, pools] - predation[:, pools], 0)
    T[:, 1:n + 1, n + 2] += np.where(m["consumer"], np.maximum(R, 0), 0.0)
    tstp = T.sum(axis=(1, 2))
    out_ = T.sum(axis=2)
    in_ = T.sum(axis=1)
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = T * tstp[:, None, None] / (out_[:, :, None] * in_[:, None, :])
        logs = np.where(T > 0, np.log2(np.where(T > 0, ratio, 1.0)), 0.0)
        ami = (T / tstp[:, None, None] * logs).sum(axis=(1, 2))
        p = T / tstp[:, None, None]
        capacity = -(T * np.where(T > 0, np.log2(np.where(T > 0, p, 1.0)), 0.0)).sum(axis=(1, 2))
    ascendency = ami * tstp
    overhead = capacity - ascendency
    through = T[:, 1:n + 1, :].sum(axis=2)
    internal = T[:, 1:n + 1, 1:n + 1]
    G = np.divide(internal, through[:, :, None], out=np.zeros_like(internal), where=through[:, :, None] > 0)
    Ninv = np.linalg.inv(np.eye(n) - G)
    diag = np.diagonal(Ninv, axis1=1, axis2=2)
    with np.errstate(divide="ignore", invalid="ignore"):
        fci = ((diag - 1) / diag * through).sum(axis=1) / through.sum(axis=1)
    return np.stack([through.sum(axis=1), tstp, ami, ascendency, capacity, overhead, fci], axis=1)


def run(m, draws, cv, tier, seed, keep=False):
    rng = np.random.default_rng(seed)
    kept, balanced = [], 0
    for start in range(0, draws, CHUNK):
        M = min(CHUNK, draws - start)
        B, PB, QB, shares = draw_chunk(rng, m, M, cv)
        P, Q, R, EE, EEd, predation, to_det, inflow, ok = balance(m, B, PB, QB, shares)
        balanced += int(ok.sum())
        outs = [B[ok], PB[ok], QB[ok], EE[ok], EEd[ok]]
        if tier in ("tl", "network"):
            outs.append(trophic_levels(m, shares, M)[ok])
        if tier == "network" and ok.any():
            outs.append(indicators(m, Q[ok], R[ok], shares[ok], to_det[ok], inflow[ok], predation[ok], P[ok]))
        kept.append(np.concatenate(outs, axis=1))
    allk = np.concatenate(kept, axis=0)
    if len(allk):
        np.percentile(allk, [2.5, 25, 50, 75, 97.5], axis=0)
        allk.mean(axis=0)
    return (balanced / draws, allk) if keep else balanced / draws


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("folder")
    ap.add_argument("--draws", type=int, required=True)
    ap.add_argument("--cv", type=float, default=0.1)
    ap.add_argument("--diet-cv", type=float, default=0.1)
    ap.add_argument("--tier", choices=["balance", "tl", "network"], default="balance")
    ap.add_argument("--rounds", type=int, default=3)
    ap.add_argument("--json", action="store_true", help="one run: balanced share and EE statistics as JSON")
    a = ap.parse_args()
    t = read_folder(a.folder)
    m = prepare(t, a.diet_cv)
    if a.json:
        import json
        share, kept = run(m, a.draws, a.cv, "balance", 7, keep=True)
        n = m["n"]
        ee = kept[:, 3 * n:4 * n]  # outputs: B, P/B, Q/B, EE, EE_d blocks of n columns
        out = {"draws": a.draws, "balanced_share": share, "balanced": len(kept), "ee": {}}
        for i, name in enumerate(t["names"]):
            if m["living"][i] and len(kept):
                out["ee"][name] = {"mean": float(ee[:, i].mean()), "sd": float(ee[:, i].std(ddof=1)),
                                   "median": float(np.median(ee[:, i]))}
        print(json.dumps(out))
        return
    best, share = float("inf"), 0.0
    for r in range(a.rounds):
        t0 = time.perf_counter()
        share = run(m, a.draws, a.cv, a.tier, 7 + r)
        best = min(best, time.perf_counter() - t0)
    note = {"balance": "", "tl": "", "network": " (indicators + FCI only: no level decomposition)"}[a.tier]
    print(f"{a.draws / best:10.0f} draws/s, balanced {100 * share:.1f} %{note}")


if __name__ == "__main__":
    main()
