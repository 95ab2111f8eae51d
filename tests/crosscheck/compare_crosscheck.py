#!/usr/bin/env python3
"""Cross-check of `tledger compare --json` (issue 16) against the figures of the
separate commands, differenced here with numpy.

For each pair of scenarios of the invented sample projects, every compartment output
of `compare` must equal the scenario's own `tledger solve --json` value, every system
indicator and level figure the `tledger network --json` value, and the absolute and
percent differences must be numpy's (x - ref, 100 (x - ref) / |ref|). The inputs that
differ must be exactly the (compartment, parameter) cells whose values differ between
the two scenarios' `tledger export --format json` inputs.
Exit 0 when everything agrees, 1 with the disagreements listed.
"""
import argparse
import json
import math
import subprocess
import sys

import numpy as np

PAIRS = [("lagoon.tledger", "baseline", "clam raking closed"),
         ("reservoir.tledger", "baseline", "doubled net effort"),
         ("reservoir.tledger", "baseline", "invasive mussel"),
         ("reservoir.tledger", "invasive mussel", "doubled net effort")]
SOLVE_KEYS = ["biomass", "pb", "qb", "ee", "pq", "tl", "oi", "production", "consumption", "respiration",
              "flow_to_detritus"]
NETWORK_KEYS = ["tst", "tstp", "fci", "apl", "ami", "ascendency", "capacity", "overhead", "connectance",
                "food_web_connectance", "total_primary_production", "total_respiration", "tpp_over_r",
                "tpp_over_b", "total_biomass", "system_omnivory", "total_catch", "catch_mean_tl", "mean_te"]
ROMAN = ["I", "II", "III", "IV", "V", "VI", "VII", "VIII", "IX", "X"]
PARAMS = ["biomass", "pb", "qb", "ee", "pq", "unassim", "biomass_accum", "net_emigration", "detritus_import"]


def run(tledger, *args):
    done = subprocess.run([tledger, *args], capture_output=True, text=True)
    if done.returncode not in (0, 1):
        raise SystemExit(f"tledger {' '.join(args)} failed ({done.returncode}): {done.stderr}")
    return json.loads(done.stdout)


def close(a, b, tol=1e-9):
    if a is None or b is None:
        return a is None and b is None
    return abs(a - b) <= tol * max(1.0, abs(a), abs(b))


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--tledger", required=True)
    ap.add_argument("--samples", required=True)
    args = ap.parse_args()
    bad = []
    checked = 0
    for project, ref, other in PAIRS:
        path = f"{args.samples}/{project}"
        cmp = run(args.tledger, "compare", path, "--scenarios", f"{ref},{other}", "--json")
        solves = [run(args.tledger, "solve", path, "--scenario", s, "--json") for s in (ref, other)]
        nets = [run(args.tledger, "network", path, "--scenario", s, "--json") for s in (ref, other)]
        outputs = {(o["group"], o["subject"], o["quantity"]): o for o in cmp["outputs"]}
        for s, solve in enumerate(solves):
            for c in solve["compartments"]:
                for key in SOLVE_KEYS:
                    o = outputs.get(("compartment", c["name"], key))
                    if c.get(key) is None:
                        continue
                    checked += 1
                    if o is None or not close(o["values"][s], c[key]):
                        bad.append(f"{project} {c['name']}.{key} [{s}]: compare {o and o['values'][s]} vs solve {c[key]}")
        for s, net in enumerate(nets):
            for key in NETWORK_KEYS:
                o = outputs[("system", "", key)]
                checked += 1
                if not close(o["values"][s], net.get(key)):
                    bad.append(f"{project} {key} [{s}]: compare {o['values'][s]} vs network {net.get(key)}")
            for level in net["levels"]:
                o = outputs.get(("level", ROMAN[level["level"] - 1], "throughput"))
                checked += 1
                if o is None or not close(o["values"][s], level["throughput"]):
                    bad.append(f"{project} level {level['level']} throughput [{s}]")
        # Differences with numpy, over every output that has both values.
        values = np.array([[np.nan if v is None else v for v in o["values"]] for o in cmp["outputs"]], dtype=float)
        both = ~np.isnan(values).any(axis=1)
        absolute = values[:, 1] - values[:, 0]
        with np.errstate(divide="ignore", invalid="ignore"):
            percent = 100.0 * absolute / np.abs(values[:, 0])
        for k, o in enumerate(cmp["outputs"]):
            if not both[k]:
                continue
            d = o["differences"][0]
            checked += 1
            small = abs(absolute[k]) <= 1e-9 * max(abs(values[k, 0]), abs(values[k, 1]))
            if d["differs"] == small:
                bad.append(f"{project} {o['subject']}.{o['quantity']}: differs {d['differs']} but |d| = {absolute[k]}")
            if not small and not close(d["absolute"], float(absolute[k])):
                bad.append(f"{project} {o['subject']}.{o['quantity']}: absolute {d['absolute']} vs numpy {absolute[k]}")
            if not small and values[k, 0] != 0 and not close(d["percent"], float(percent[k])):
                bad.append(f"{project} {o['subject']}.{o['quantity']}: percent {d['percent']} vs numpy {percent[k]}")
        # Inputs that differ: every compartment parameter cell, from the export of each scenario.
        exported = [run(args.tledger, "export", path, "--scenario", s, "--format", "json", "--out", "-") for s in (ref, other)]
        cells = []
        for e in exported:
            comps = e["scenarios"][0]["inputs"]["compartments"]
            cells.append({(c["name"], p): c.get(p) for c in comps for p in PARAMS})
        names = [{c["name"] for c in e["scenarios"][0]["inputs"]["compartments"]} for e in exported]
        expected = {(n, p) for (n, p) in cells[0] if n in names[1] and cells[0][(n, p)] != cells[1].get((n, p))}
        got = {(d["compartment"], d["item"]) for d in cmp["inputs"] if d["item"] in PARAMS and d["value_differs"]}
        checked += 1
        if expected != got:
            bad.append(f"{project} {ref} vs {other}: parameter inputs differ {sorted(got)} but the exports say {sorted(expected)}")
    print(f"compare crosscheck: {checked} figures checked, {len(bad)} disagreements")
    for line in bad[:50]:
        print("  " + line)
    return 1 if bad else 0


if __name__ == "__main__":
    sys.exit(main())
