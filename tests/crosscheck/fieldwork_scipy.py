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
equation_mc: a Monte Carlo of an empirical equation (Pauly 1980, Then et al. 2015,
  Palomares & Pauly 1998) with numpy's seeded generator: power-law inputs drawn lognormal
  with median = the value and CV = SE / value, the aspect ratio and the temperature of the
  consumption equation normal with SD = SE, a residual error normal on ln(result); the
  sample CV and the central percentile interval of the results. Written from the
  equations, not from the C++ code, to check its delta-method CV and interval.
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


def lognormal(rng, median, se, n):
    if se == 0:
        return np.full(n, median)
    return median * np.exp(rng.normal(0.0, np.sqrt(np.log1p((se / median) ** 2)), n))


def equation_mc(case):
    rng = np.random.default_rng(case["seed"])
    n = case["draws"]
    x, se = case["inputs"], case["se"]
    if case["equation"] == "pauly1980":
        linf, k, t = (lognormal(rng, x[i], se[i], n) for i in ("linf", "k", "t"))
        y = 10 ** (-0.0066 - 0.279 * np.log10(linf) + 0.6543 * np.log10(k) + 0.4634 * np.log10(t))
    elif case["equation"] == "then_tmax":
        y = 4.899 * lognormal(rng, x["tmax"], se["tmax"], n) ** -0.916
    elif case["equation"] == "then_growth":
        y = 4.118 * lognormal(rng, x["k"], se["k"], n) ** 0.73 * lognormal(rng, x["linf"], se["linf"], n) ** -0.33
    else:  # palomares_pauly, carnivore
        w = lognormal(rng, x["winf"], se["winf"], n)
        t = x["t"] + se["t"] * rng.standard_normal(n)
        a = x["a"] + se["a"] * rng.standard_normal(n)
        y = 10 ** (7.964 - 0.204 * np.log10(w) - 1.965 * 1000.0 / (t + 273.15) + 0.083 * a)
    y = y * np.exp(case["residual"] * rng.standard_normal(n))
    tail = (1.0 - case["level"]) / 2.0 * 100.0
    low, high = np.percentile(y, [tail, 100.0 - tail])
    return {"cv": float(y.std(ddof=1) / y.mean()), "ci_low": float(low), "ci_high": float(high),
            "median": float(np.median(y))}


def main():
    cases = json.load(open(sys.argv[1]))
    out = []
    for c in cases:
        if c["kind"] == "catch_curve":
            out.append(catch_curve(c))
        elif c["kind"] == "swept_area":
            out.append(swept_area(c))
        elif c["kind"] == "equation_mc":
            out.append(equation_mc(c))
        else:
            out.append({"t": float(stats.t.ppf(c["p"], c["df"])), "cdf_at": float(stats.t.cdf(c["at"], c["df"]))})
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
