#!/usr/bin/python3
"""Ensemble against an independent NumPy ensemble (tests/bench/numpy_ensemble.py):
the same synthetic food web (invented; tests/bench/synthetic_model.h, mix `ee`), the
same distributions (lognormal B, P/B, Q/B with CV 0.1; Dirichlet diet rows with diet CV
0.1), different random streams (tledger's SplitMix64 per draw, NumPy's PCG64). The two
must agree within sampling error on
  - the share of draws that balance: |p1 - p2| <= 5 sqrt(p (1 - p) (1/n1 + 1/n2));
  - the mean EE of every living compartment over the balanced draws:
    |m1 - m2| <= 5 sd sqrt(1/k1 + 1/k2) + the percentile bins' bound is not involved
    (the mean is exact), sd from NumPy's balanced draws.
5 standard errors: a correct pair fails one comparison with probability below 6e-7
(normal approximation); with ~50 comparisons, below 3e-5.

    ensemble_crosscheck.py --tledger EXE --make-synthetic EXE [--draws 30000]
"""
import argparse
import json
import math
import os
import subprocess
import sys
import tempfile

HERE = os.path.dirname(os.path.abspath(__file__))


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--tledger", required=True)
    ap.add_argument("--make-synthetic", required=True)
    ap.add_argument("--draws", type=int, default=30000)
    a = ap.parse_args()
    with tempfile.TemporaryDirectory() as tmp:
        folder = os.path.join(tmp, "web50")
        subprocess.run([a.make_synthetic, "--size", "50", "--mix", "ee", "--seed", "20261202", "--out", folder],
                       check=True, capture_output=True)
        # Every value ungraded counts as grade C: set grade C's CV to 0.1 (settings.csv).
        with open(os.path.join(folder, "settings.csv"), "w", encoding="utf-8") as f:
            f.write("key,value\ncv_grade_c,0.1\n")
        c = subprocess.run([a.tledger, "ensemble", folder, "--draws", str(a.draws), "--seed", "11", "--diet-cv", "0.1",
                            "--threads", "2", "--json"], capture_output=True, text=True)
        if c.returncode not in (0, 1):
            sys.exit(f"tledger ensemble failed ({c.returncode}): {c.stderr}")
        cpp = json.loads(c.stdout)
        p = subprocess.run(["/usr/bin/python3", os.path.join(HERE, "..", "bench", "numpy_ensemble.py"), folder,
                            "--draws", str(a.draws), "--cv", "0.1", "--diet-cv", "0.1", "--json"],
                           capture_output=True, text=True, check=True)
        ref = json.loads(p.stdout)
    failures = []
    n1, n2 = cpp["draws"], ref["draws"]
    p1, p2 = cpp["balanced_share"], ref["balanced_share"]
    pooled = (p1 * n1 + p2 * n2) / (n1 + n2)
    bound = 5 * math.sqrt(pooled * (1 - pooled) * (1 / n1 + 1 / n2))
    print(f"balanced share: tledger {p1:.4f}, numpy {p2:.4f}, bound {bound:.4f}")
    if abs(p1 - p2) > bound:
        failures.append(f"balanced share {p1} vs {p2} (bound {bound})")
    k1, k2 = cpp["balanced_draws"], ref["balanced"]
    compared = 0
    for name, r in ref["ee"].items():
        key = f"{name}.ee"
        if key not in cpp["outputs"] or cpp["outputs"][key]["mean"] is None:
            failures.append(f"{key}: missing from tledger's outputs")
            continue
        m1, m2 = cpp["outputs"][key]["mean"], r["mean"]
        b = 5 * r["sd"] * math.sqrt(1 / k1 + 1 / k2) + 1e-12
        compared += 1
        if abs(m1 - m2) > b:
            failures.append(f"{key}: mean {m1} vs numpy {m2} (bound {b})")
    print(f"mean EE compared for {compared} compartments over {k1} and {k2} balanced draws")
    if compared < 40:
        failures.append(f"only {compared} compartments compared")
    for f in failures:
        print("FAIL", f)
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
