#!/usr/bin/python3
"""Partial rank correlation coefficients computed independently with numpy/scipy
(Marino et al. 2008 J Theor Biol 254:178, section 4.2), for prcc_crosscheck_test.

Reads a CSV (header: input names..., last column the output; one row per draw) and
prints JSON {"prcc": [value or null per input], "draws": n}. Step by step, as the
method is written: rank every column (scipy.stats.rankdata, ties averaged); for each
input, regress its ranks and the output's ranks on the other inputs' ranks with an
intercept (numpy.linalg.lstsq), and take the Pearson correlation of the two residuals
(scipy.stats.pearsonr). A constant input is left out of the others' regressions and
gets null, as does everything when the output is constant. Two-sided p-values of the
test T = r sqrt(df / (1 - r^2)), df = draws - 2 - (kept inputs - 1), by
scipy.stats.t.sf."""
import json
import sys

import numpy as np
from scipy.stats import pearsonr, rankdata, t as student_t


def prcc(x, y):
    n, p = x.shape
    keep = [j for j in range(p) if np.ptp(x[:, j]) > 0]
    out = [None] * p
    if np.ptp(y) == 0:
        return out, [None] * p
    ranks = {j: rankdata(x[:, j]) for j in keep}
    ry = rankdata(y)
    for j in keep:
        others = [ranks[k] for k in keep if k != j]
        design = np.column_stack([np.ones(n)] + others)
        res_x = ranks[j] - design @ np.linalg.lstsq(design, ranks[j], rcond=None)[0]
        res_y = ry - design @ np.linalg.lstsq(design, ry, rcond=None)[0]
        if np.linalg.norm(res_x) <= 1e-9 * np.linalg.norm(ranks[j] - ranks[j].mean()):
            continue  # the other inputs determine this one
        out[j] = float(pearsonr(res_x, res_y)[0])
    df = n - 2 - (len(keep) - 1)
    pvalues = [None if r is None else
               (0.0 if abs(r) >= 1 else float(2 * student_t.sf(abs(r) * np.sqrt(df / (1 - r * r)), df)))
               for r in out]
    return out, pvalues


def main():
    data = np.genfromtxt(sys.argv[1], delimiter=",", skip_header=1, ndmin=2)
    x, y = data[:, :-1], data[:, -1]
    coefficients, pvalues = prcc(x, y)
    print(json.dumps({"prcc": coefficients, "p": pvalues, "draws": int(len(y))}))


if __name__ == "__main__":
    main()
