#!/usr/bin/python3
"""Independent scipy/numpy computation of the fieldwork estimators, for
tests/crosscheck/fieldwork_crosscheck_test.cpp. Reads a JSON list of cases from argv[1]
and prints a JSON list of results.

catch_curve: raw length classes, L-inf, K and the chosen class indices. The points are
  computed here from the equations (Pauly 1983; Sparre & Venema 1998, 4.4.3), the slope
  and its standard error by scipy.stats.linregress, the interval with scipy.stats.t.ppf.
swept_area: catch per area of each haul grouped by stratum with the strata areas; the
  stratified mean, its SE, Satterthwaite's df and the t interval (Cochran 1977).
t_quantile: scipy.stats.t.ppf(p, df) for fractional df, and scipy.stats.t.cdf at the
  C++ quantile.
"""
import json
import sys

import numpy as np
from scipy import stats


def catch_curve(case):
    linf, k = case["linf"], case["k"]
    lo = np.array(case["from"], dtype=float)
    hi = np.array(case["to"], dtype=float)
    count = np.array(case["count"], dtype=float)
    idx = np.array(case["selected"], dtype=int)
    dt = np.log((linf - lo) / (linf - hi)) / k
    age = -np.log(1.0 - (lo + hi) / 2.0 / linf) / k
    y = np.log(count / dt)
    fit = stats.linregress(age[idx], y[idx])
    t = stats.t.ppf(0.5 + case["level"] / 2.0, len(idx) - 2)
    z = -fit.slope
    return {"z": z, "slope_se": fit.stderr, "intercept": fit.intercept, "r2": fit.rvalue ** 2,
            "ci_low": max(0.0, z - t * fit.stderr), "ci_high": z + t * fit.stderr}


def swept_area(case):
    areas = np.array(case["areas"], dtype=float)
    w = areas / areas.sum()
    means, g_s2 = [], []
    for wh, cpua in zip(w, case["cpua"]):
        x = np.array(cpua, dtype=float)
        means.append(x.mean())
        g_s2.append(wh ** 2 / len(x) * x.var(ddof=1))
    g_s2 = np.array(g_s2)
    mean = float(np.dot(w, means)) / case["x1"]
    se = float(np.sqrt(g_s2.sum())) / case["x1"]
    dof = g_s2.sum() ** 2 / sum(v ** 2 / (len(c) - 1) for v, c in zip(g_s2, case["cpua"]))
    t = stats.t.ppf(0.5 + case["level"] / 2.0, dof)
    return {"mean": mean, "se": se, "df": float(dof), "ci_low": max(0.0, mean - t * se), "ci_high": mean + t * se}


def main():
    cases = json.load(open(sys.argv[1]))
    out = []
    for c in cases:
        if c["kind"] == "catch_curve":
            out.append(catch_curve(c))
        elif c["kind"] == "swept_area":
            out.append(swept_area(c))
        else:
            out.append({"t": float(stats.t.ppf(c["p"], c["df"])), "cdf_at": float(stats.t.cdf(c["at"], c["df"]))})
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
