#!/usr/bin/python3
"""Independent reconcile of a food-web model with scipy.optimize.minimize(method="SLSQP").

Reads a problem written by the C++ test (the model's raw inputs, the CVs, which inputs
may move, the bounds; no solved value and no EE from the C++ side), states the same
objective and constraints from the mass-balance equations (Polovina 1984; Christensen &
Pauly 1992; DESIGN.md 3.2 and 3.6) on its own, solves, and prints JSON:
{"objective", "max_violation", "success", "message", "seconds", "iterations"}.

Formulation (DESIGN 3.6): log-multipliers on B, P/B, Q/B and catch; diet fractions of
each moving predator with >= 2 non-zero prey on their simplex; objective sum of
((change) / CV)^2 with change = ln m for multipliers and (d - d0) / d0 for diets.
Unknown B (EE given) is a free variable with the balance equation as an equality; Q/B
given through P/Q follows P/B. Constraints: EE <= EE max (EE unknown), EE >= EE min,
P/Q within [pq_min, pq_max] and R >= 0 for consumers, detritus consumption <= inflow,
diet rows keep their sum.

usage: reconcile_scipy.py PROBLEM.json [--maxiter N]
"""
import json
import math
import sys
import time

import numpy as np
from scipy.optimize import minimize


def solve_problem(prob, maxiter=2000):
    comps = prob["compartments"]
    n = len(comps)
    living = [i for i, c in enumerate(comps) if c["kind"] != "detritus"]
    pools = [i for i, c in enumerate(comps) if c["kind"] == "detritus"]
    consumer = [c["kind"] == "consumer" for c in comps]
    diet = [(int(j), int(i), float(d)) for j, i, d in prob["diet"]]  # predator, prey, share
    routing = [(int(s), int(p), float(r)) for s, p, r in prob["routing"]]
    discards = [(int(s), int(p), float(a)) for s, p, a in prob["discards_to_pool"]]
    move = prob["move"]
    cv = prob["cv"]
    max_log = math.log(prob["max_factor"])

    def val(c, key):
        v = comps[c][key]
        return None if v is None else float(v)

    # Start values: given ones, Q/B from P/Q, unknown B from the balance equations
    # (linear in the unknown B; numpy solve).
    B = np.array([val(i, "biomass") or 0.0 for i in range(n)])
    PB = np.array([val(i, "pb") or 0.0 for i in range(n)])
    QB = np.zeros(n)
    qb_from_pq = [False] * n
    for i in living:
        if consumer[i]:
            if val(i, "qb") is None:
                QB[i] = PB[i] / val(i, "pq")
                qb_from_pq[i] = True
            else:
                QB[i] = val(i, "qb")
    Y = np.array([float(c["catch"]) for c in comps])
    E = np.array([float(c["e"]) for c in comps])
    BA = np.array([float(c["ba"]) for c in comps])
    U = np.array([float(c["unassim"]) for c in comps])
    IMP = np.array([float(c["import"]) for c in comps])
    unknown_b = [i for i in living if val(i, "biomass") is None]
    if unknown_b:
        col = {i: k for k, i in enumerate(unknown_b)}
        A = np.zeros((len(unknown_b), len(unknown_b)))
        rhs = np.zeros(len(unknown_b))
        for r, i in enumerate(unknown_b):
            A[r, col[i]] += PB[i] * val(i, "ee")
            rhs[r] = Y[i] + E[i] + BA[i]
            for j, prey, d in diet:
                if prey != i:
                    continue
                if j in col:
                    A[r, col[j]] -= QB[j] * d
                else:
                    rhs[r] += B[j] * QB[j] * d
        for i, b in zip(unknown_b, np.linalg.solve(A, rhs)):
            B[i] = b

    # Variables.
    var = []  # (kind, compartment, prey or None, weight, start, scale, lo, hi)
    vb, vp, vq, vy = {}, {}, {}, {}

    def add(kind, i, weight, start=0.0, scale=1.0, lo=-max_log, hi=max_log, prey=None):
        var.append((kind, i, prey, weight, start, scale, lo, hi))
        return len(var) - 1

    def bounded(i, key, v0):
        lo, hi = -max_log, max_log
        b = prob["bounds"].get(f"{i}.{key}")
        if b:
            if b[0] is not None:
                lo = max(lo, math.log(b[0] / v0))
            if b[1] is not None:
                hi = min(hi, math.log(b[1] / v0))
        return lo, hi

    pinned = {tuple(p) for p in prob["pins"]}
    for i in living:
        if i in unknown_b:
            vb[i] = add("b", i, 0.0)
        elif move["b"] and (i, "b") not in pinned:
            vb[i] = add("b", i, 1.0 / cv[f"{i}.b"] ** 2, 0.0, 1.0, *bounded(i, "b", B[i]))
        if move["pb"] and (i, "pb") not in pinned:
            vp[i] = add("pb", i, 1.0 / cv[f"{i}.pb"] ** 2, 0.0, 1.0, *bounded(i, "pb", PB[i]))
        if consumer[i]:
            if qb_from_pq[i]:
                if i in vp:
                    vq[i] = vp[i]
            elif move["qb"] and (i, "qb") not in pinned:
                vq[i] = add("qb", i, 1.0 / cv[f"{i}.qb"] ** 2, 0.0, 1.0, *bounded(i, "qb", QB[i]))
        if move["catch"] and Y[i] > 0 and (i, "catch") not in pinned:
            vy[i] = add("catch", i, 1.0 / prob["catch_cv"] ** 2)
    diet_var = {}  # index in `diet` -> variable
    diet_rows = []
    for j in range(n):
        entries = [k for k, (p, _, d) in enumerate(diet) if p == j and d > 0]
        if move["diet"] and (j, "diet") not in pinned and len(entries) >= 2:
            for k in entries:
                d0 = diet[k][2]
                diet_var[k] = add("diet", j, 1.0 / prob["diet_cv"] ** 2, d0, d0, 0.0, 1.0, prey=diet[k][1])
            diet_rows.append((j, [diet_var[k] for k in entries], sum(diet[k][2] for k in entries)))
    nv = len(var)
    x0 = np.array([v[4] for v in var])
    w = np.array([v[3] for v in var])
    s0 = np.array([v[4] for v in var])
    sc = np.array([v[5] for v in var])

    def state(x):
        b = B.copy()
        pb = PB.copy()
        qb = QB.copy()
        y = Y.copy()
        for i, k in vb.items():
            b[i] = B[i] * math.exp(x[k])
        for i, k in vp.items():
            pb[i] = PB[i] * math.exp(x[k])
        for i, k in vq.items():
            qb[i] = QB[i] * math.exp(x[k])
        for i, k in vy.items():
            y[i] = Y[i] * math.exp(x[k])
        q = b * qb
        p = b * pb
        pred = np.zeros(n)
        for k, (j, i, d) in enumerate(diet):
            pred[i] += (x[diet_var[k]] if k in diet_var else d) * q[j]
        demand = pred + y + E + BA
        return b, pb, qb, y, q, p, pred, demand

    def objective(x):
        z = (x - s0) / sc
        return float(np.sum(w * z * z))

    def objective_grad(x):
        return 2.0 * w * (x - s0) / sc ** 2

    # Constraints (scipy: "ineq" means fun(x) >= 0), each a function of one state of x;
    # scales from the start.
    _, _, _, _, q_s, p_s, pred_s, dem_s = state(x0)
    ineq, eq = [], []  # functions (x, st) -> value
    for i in living:
        s = max(p_s[i], abs(dem_s[i]))
        if val(i, "ee") is None:
            ee_max = float(prob["ee_max"].get(str(i), prob["ee_max_default"]))
            ineq.append(lambda x, st, i=i, s=s, m=ee_max: (m * st[5][i] - st[7][i]) / s)
            if str(i) in prob["ee_min"]:
                ee_min = float(prob["ee_min"][str(i)])
                ineq.append(lambda x, st, i=i, s=s, m=ee_min: (st[7][i] - m * st[5][i]) / s)
        else:
            eq.append(lambda x, st, i=i, s=s, e=val(i, "ee"): (st[7][i] - e * st[5][i]) / s)
        if consumer[i] and not qb_from_pq[i] and (i in vp or i in vq):
            lo, hi = prob["pq_min"], prob["pq_max"]
            ineq.append(lambda x, st, i=i, lo=lo: math.log(st[1][i] / st[2][i]) - math.log(lo))
            ineq.append(lambda x, st, i=i, hi=hi: math.log(hi) - math.log(st[1][i] / st[2][i]))
            ineq.append(lambda x, st, i=i: math.log(1.0 - U[i]) - math.log(st[1][i] / st[2][i]))

    def inflow(st, d):
        b, pb, qb, y, q, p, pred, demand = st
        total = IMP[d]
        for s, pool, r in routing:
            if pool == d:
                total += r * (p[s] - demand[s] + U[s] * q[s])
        for s, pool, a in discards:
            if pool == d:
                total += a * (y[s] / Y[s] if Y[s] > 0 else 1.0)
        return total

    st0 = state(x0)
    for d in pools:
        eaten = pred_s[d] > 0 or any(diet[k][1] == d for k in diet_var)
        if not eaten:
            continue
        s = max(abs(inflow(st0, d)), pred_s[d], 1e-12)
        ineq.append(lambda x, st, d=d, s=s: (inflow(st, d) - st[6][d]) / s)
    for j, ks, total in diet_rows:
        eq.append(lambda x, st, ks=ks, total=total: sum(x[k] for k in ks) - total)

    def vector(funs):
        def f(x):
            st = state(x)
            return np.array([g(x, st) for g in funs])
        return f

    cons = []
    if ineq:
        cons.append({"type": "ineq", "fun": vector(ineq)})
    if eq:
        cons.append({"type": "eq", "fun": vector(eq)})
    bounds = [(v[6], v[7]) for v in var]

    def violation(x):
        st = state(x)
        worst = 0.0
        for g in ineq:
            worst = max(worst, -g(x, st))
        for g in eq:
            worst = max(worst, abs(g(x, st)))
        return worst

    t0 = time.perf_counter()
    if violation(x0) <= 0.0:
        return {"objective": 0.0, "max_violation": 0.0, "success": True, "message": "start feasible",
                "seconds": 0.0, "iterations": 0, "variables": nv}
    res = minimize(objective, x0, jac=objective_grad, method="SLSQP", bounds=bounds, constraints=cons,
                   options={"ftol": 1e-12, "maxiter": maxiter})
    seconds = time.perf_counter() - t0
    return {"objective": objective(res.x), "max_violation": violation(res.x), "success": bool(res.success),
            "message": str(res.message), "seconds": seconds, "iterations": int(res.nit), "variables": nv, "x": [float(v) for v in res.x]}


def main(argv):
    if len(argv) < 2:
        print(__doc__, file=sys.stderr)
        return 2
    maxiter = int(argv[argv.index("--maxiter") + 1]) if "--maxiter" in argv else 2000
    with open(argv[1], encoding="utf-8") as f:
        prob = json.load(f)
    print(json.dumps(solve_problem(prob, maxiter)))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
