#!/usr/bin/env python3
"""Cross-check of `tledger network --scor FILE --json` against independent libraries.

For every SCOR file given (default: the 58 published networks in
tests/fixtures/reference/scor/, data from the enaR collection, Borrett & Lau 2014):
  * trophic levels against networkx.trophic_levels on the graph of flows into living
    nodes (non-living nodes and nodes without intake from others are basal, the
    convention of shared/reference meta.conventions "TL");
  * TST, TSTp, boundary input, APL, FCI (Finn 1976), AMI, ascendency, capacity and
    overhead (Ulanowicz 1986) recomputed with numpy from the same file, read here by a
    separate fixed-column reader;
  * the level decomposition conserves throughput: its levels add up to TST.
Exit status 0 when everything agrees within --rtol, 1 otherwise.
"""
import argparse
import glob
import json
import os
import subprocess
import sys
import warnings

warnings.simplefilter("ignore", FutureWarning)  # networkx's own deprecation notices

import networkx as nx
import numpy as np


def read_scor(path):
    """Minimal fixed-column SCOR reader (layout of shared/reference/SCOR_FORMAT.md)."""
    with open(path) as f:
        lines = [l.rstrip("\r\n") for l in f]
    n, nl = int(lines[1][0:3]), int(lines[1][3:6])
    names = [l.strip() for l in lines[2:2 + n]]

    def num(text):
        text = text.strip()
        if "e" not in text.lower() and ("+" in text[1:] or "-" in text[1:]):
            k = max(text.rfind("+"), text.rfind("-"))
            text = text[:k] + "E" + text[k:]
        return float(text)

    i = 2 + n
    stocks = np.zeros(n)
    for _ in range(n):
        stocks[int(lines[i][0:3]) - 1] = num(lines[i][3:])
        i += 1
    i += 1  # terminator
    blocks = []
    for _ in range(3):
        v = np.zeros(n)
        while int(lines[i][0:3]) != -1:
            v[int(lines[i][0:3]) - 1] = num(lines[i][3:])
            i += 1
        i += 1
        blocks.append(v)
    F = np.zeros((n, n))
    while int(lines[i][0:3]) != -1:
        F[int(lines[i][0:3]) - 1, int(lines[i][3:6]) - 1] = num(lines[i][6:])
        i += 1
    living = np.arange(n) < nl
    return names, living, stocks, blocks[0], blocks[1], blocks[2], F


def reference_figures(living, z, e, r, F):
    n = len(z)
    T = F.sum(axis=0) + z
    tst = T.sum()
    tstp = F.sum() + z.sum() + e.sum() + r.sum()
    G = np.divide(F, T[:, None], out=np.zeros_like(F), where=T[:, None] > 0)
    N = np.linalg.inv(np.eye(n) - G)
    fci = sum((N[j, j] - 1) / N[j, j] * T[j] for j in range(n)) / tst
    X = np.zeros((n + 3, n + 3))
    X[1:n + 1, 1:n + 1] = F
    X[0, 1:n + 1] = z
    X[1:n + 1, n + 1] = e
    X[1:n + 1, n + 2] = r
    tot = X.sum()
    rs, cs = X.sum(axis=1), X.sum(axis=0)
    nz = X > 0
    ii, jj = np.nonzero(nz)
    p = X[nz] / tot
    ami = float(np.sum(p * np.log2(X[nz] * tot / (rs[ii] * cs[jj]))))
    h = float(-np.sum(p * np.log2(p)))
    return {"tst": tst, "tstp": tstp, "boundary_input": z.sum(), "apl": tst / z.sum(), "fci": fci,
            "ami": ami, "ascendency": tot * ami, "capacity": tot * h, "overhead": tot * (h - ami),
            "links": float(np.count_nonzero(F)), "connectance": np.count_nonzero(F) / n ** 2}


def networkx_levels(living, F):
    n = len(living)
    g = nx.DiGraph()
    g.add_nodes_from(range(n))
    for i in range(n):
        for j in range(n):
            if F[i, j] <= 0 or not living[j]:
                continue
            if i == j and F[:, j].sum() - F[j, j] <= 0:
                continue  # only a self-loop: no intake from others, basal
            g.add_edge(i, j, weight=F[i, j])
    return nx.trophic_levels(g, weight="weight")


def rel(a, b):
    return abs(a - b) / abs(b) if b != 0 else abs(a)


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    ap = argparse.ArgumentParser()
    ap.add_argument("--tledger", required=True)
    ap.add_argument("--rtol", type=float, default=1e-9)
    ap.add_argument("files", nargs="*")
    args = ap.parse_args()
    files = args.files or sorted(glob.glob(os.path.join(here, "..", "fixtures", "reference", "scor", "*.scor")))
    failures = 0
    worst = (0.0, "")
    for path in files:
        slug = os.path.basename(path)
        run = subprocess.run([args.tledger, "network", "--scor", path, "--json"], capture_output=True, text=True)
        if run.returncode != 0:
            print(f"{slug}: tledger exited {run.returncode}: {run.stderr.strip()}")
            failures += 1
            continue
        out = json.loads(run.stdout)
        names, living, stocks, z, e, r, F = read_scor(path)
        ref = reference_figures(living, z, e, r, F)
        for key, want in ref.items():
            d = rel(out[key], want)
            if d > worst[0]:
                worst = (d, f"{slug} {key}")
            if d > args.rtol:
                print(f"{slug}: {key} = {out[key]}, numpy {want} (rel {d:.2e})")
                failures += 1
        levels = networkx_levels(living, F)
        keys = out["compartments"]
        for j in range(len(names)):
            got = out["tl"][keys[j]]
            d = rel(got, levels[j])
            if d > worst[0]:
                worst = (d, f"{slug} TL {names[j]}")
            if d > args.rtol:
                print(f"{slug}: TL of {names[j]} = {got}, networkx {levels[j]} (rel {d:.2e})")
                failures += 1
        level_sum = sum(bin_["throughput"] for bin_ in out["levels"])
        if rel(level_sum, ref["tst"]) > 1e-9:
            print(f"{slug}: levels add up to {level_sum}, TST {ref['tst']}")
            failures += 1
    print(f"{len(files)} networks, worst relative difference {worst[0]:.2e} ({worst[1]}), {failures} failures")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
