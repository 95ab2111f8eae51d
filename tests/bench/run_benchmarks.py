#!/usr/bin/python3
"""Runs the performance benchmarks of issue 9 and prints one table.

    tests/bench/run_benchmarks.py [--build build] [--sizes 10,50,200,1000,5000]
                                  [--work DIR] [--min-time 0.2] [--json FILE]

1. writes the synthetic models (tl_make_synthetic, seed 20261202; invented numbers) of
   every size and unknown mix as CSV model folders;
2. runs the Google Benchmark programs (balance_bench, network_bench, store_bench and,
   when the GUI is built, gui_bench offscreen) with JSON output;
3. runs the NumPy implementation (numpy_balance.py) on the same folders, single-threaded
   BLAS like the C++ side, and checks that it agrees with `tledger solve FOLDER --json`
   to 1e-8 relative on B, P/B, Q/B, EE, P, Q, R and TL;
4. times the whole process `tledger solve FOLDER --json` (read, solve, checks, TL,
   write) and its peak memory;
5. prints the table: per size and mix, the C++ numeric step, the full solveBalance, the
   NumPy solve and their ratio, whole-process times; the growth exponent of each cost
   fitted from 50 to 5000 compartments; the targets of issue 9 met or not.
CPU times are per call of this process (Google Benchmark's cpu_time); whole-process
figures are wall-clock. Nothing here is a test: it asserts nothing and always exits 0
unless a program fails to run.
"""
import argparse
import json
import math
import os
import platform
import statistics
import subprocess
import sys
import time
from pathlib import Path

SEED = 20261202  # = tl::bench::kSeed (bench_support.h)
NUMPY_SKIP_ABOVE_S = 150.0  # default of --numpy-limit
MIXES = ["ee", "ee-biomass", "ee-qb-pq"]
HERE = Path(__file__).resolve().parent
ROOT = HERE.parent.parent


def log(msg):
    print(msg, file=sys.stderr, flush=True)


def run_bench(exe, filt, min_time, env=None):
    """Google Benchmark JSON of one program; {name: entry}."""
    cmd = [str(exe), f"--benchmark_filter={filt}", "--benchmark_format=json", f"--benchmark_min_time={min_time}"]
    log("  $ " + " ".join(cmd))
    out = subprocess.run(cmd, capture_output=True, text=True, env=env)
    if out.returncode != 0:
        log(out.stderr)
        raise SystemExit(f"{exe.name} failed ({out.returncode})")
    if not out.stdout.strip():  # no benchmark matched the filter
        log(f"  (nothing matched: {out.stderr.strip()})")
        return {}
    data = json.loads(out.stdout)
    return {b["name"]: b for b in data["benchmarks"]}


def seconds_of(entry):
    """Per-call CPU seconds of a Google Benchmark entry (real time if it asked for it)."""
    if entry is None or entry.get("error_occurred"):
        return None
    scale = {"ns": 1e-9, "us": 1e-6, "ms": 1e-3, "s": 1.0}[entry.get("time_unit", "ns")]
    key = "real_time" if "/real_time" in entry["name"] else "cpu_time"
    return entry[key] * scale


def timed_process(cmd, env=None, with_cpu=False):
    """(wall seconds, peak RSS MiB, exit code, stdout[, user + system CPU seconds]) of one child process."""
    t0 = time.perf_counter()
    p = subprocess.Popen(cmd, stdout=subprocess.PIPE, stderr=subprocess.PIPE, env=env)
    stdout_chunks = []
    # Read before waiting so a large JSON cannot fill the pipe.
    stdout = p.stdout.read()
    stdout_chunks.append(stdout)
    p.stderr.read()
    _, status, usage = os.wait4(p.pid, 0)
    wall = time.perf_counter() - t0
    p.returncode = os.waitstatus_to_exitcode(status)
    result = (wall, usage.ru_maxrss / 1024.0, p.returncode, b"".join(stdout_chunks).decode())
    return result + (usage.ru_utime + usage.ru_stime,) if with_cpu else result


def fmt_time(s):
    if s is None:
        return "—"
    if s < 1e-3:
        return f"{s * 1e6:.3g} µs"
    if s < 1:
        return f"{s * 1e3:.3g} ms"
    return f"{s:.3g} s"


def exponent(points):
    """Least-squares slope of log(cost) on log(n) over the sizes 50..5000 present."""
    pts = [(n, c) for n, c in points if c and 50 <= n <= 5000]
    if len(pts) < 2:
        return None
    xs = [math.log(n) for n, _ in pts]
    ys = [math.log(c) for _, c in pts]
    mx, my = statistics.fmean(xs), statistics.fmean(ys)
    sxx = sum((x - mx) ** 2 for x in xs)
    return sum((x - mx) * (y - my) for x, y in zip(xs, ys)) / sxx


def compare(cli_json, numpy_json):
    """Largest relative difference over the compared values, and where."""
    keys = ["biomass", "pb", "qb", "ee", "production", "consumption", "respiration", "flow_to_detritus", "tl"]
    worst, where = 0.0, ""
    numpy_rows = {c["name"]: c for c in numpy_json["compartments"]}
    for c in cli_json["compartments"]:
        ref = numpy_rows.get(c["name"])
        if ref is None:
            return math.inf, f"{c['name']} missing"
        for k in keys:
            a, b = c.get(k), ref.get(k)
            if c["kind"] == "detritus" and k not in ("ee", "tl"):
                continue
            if c["kind"] == "producer" and k in ("qb", "consumption", "respiration"):
                continue
            if a is None or b is None:
                if (a is None) != (b is None) and k != "ee":
                    return math.inf, f"{c['name']}.{k}: {a} vs {b}"
                continue
            d = abs(a - b) / max(abs(a), abs(b), 1e-300)
            if d > worst:
                worst, where = d, f"{c['name']}.{k}"
    return worst, where


def check_agreement(tledger, work, sizes, env):
    """The NumPy reference and tledger agree on every model (a ctest, label crosscheck)."""
    failures = 0
    for n in sizes:
        for mix in MIXES:
            folder = work / f"n{n}_{mix}"
            _, _, _, cli_out = timed_process([str(tledger), "solve", str(folder), "--json"])
            _, _, code, np_out = timed_process(["/usr/bin/python3", str(HERE / "numpy_balance.py"), str(folder),
                                               "--repeat-seconds", "0"], env=env)
            cli = json.loads(cli_out)
            if code != 0:
                print(f"FAIL n={n} {mix}: numpy_balance.py exited {code}")
                failures += 1
                continue
            npj = json.loads(np_out)
            diff, where = compare(cli, npj)
            ok = diff <= 1e-8 and cli["status"] == "balanced" and npj["status"] == "balanced"
            failures += not ok
            print(f"{'ok  ' if ok else 'FAIL'} n={n} {mix}: tledger {cli['status']}, numpy {npj['status']},"
                  f" largest relative difference {diff:.1e} {where}")
    return 1 if failures else 0


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--build", default=str(ROOT / "build"))
    ap.add_argument("--sizes", default="10,50,200,1000,5000")
    ap.add_argument("--work", default="/tmp/tl_bench_models")
    ap.add_argument("--min-time", default="0.2", help="Google Benchmark minimum time per benchmark (s)")
    ap.add_argument("--json", help="also write every raw figure to this file")
    ap.add_argument("--numpy-limit", type=float, default=NUMPY_SKIP_ABOVE_S,
                    help="skip a NumPy solve predicted (cubic growth from the size below) to take longer (s)")
    ap.add_argument("--check", action="store_true",
                    help="only check that NumPy and tledger agree (1e-8) and balance on every model; exit 1 if not")
    args = ap.parse_args()
    build = Path(args.build).resolve()
    bench = build / "tests" / "bench"
    tledger = build / "app" / "tledger"
    sizes = [int(s) for s in args.sizes.split(",")]
    work = Path(args.work)
    work.mkdir(parents=True, exist_ok=True)
    single = dict(os.environ, OPENBLAS_NUM_THREADS="1", OMP_NUM_THREADS="1", MKL_NUM_THREADS="1")
    started = time.perf_counter()

    # 1. Models.
    log("== writing the synthetic models")
    shape = {}
    for n in sizes:
        for mix in MIXES:
            folder = work / f"n{n}_{mix}"
            out = subprocess.run([str(bench / "tl_make_synthetic"), "--size", str(n), "--mix", mix, "--seed", str(SEED),
                                  "--out", str(folder)], capture_output=True, text=True, check=True)
            shape[(n, mix)] = out.stdout.strip().split(": ", 1)[1]

    if args.check:
        return check_agreement(tledger, work, sizes, single)

    # 2. C++ benchmarks.
    log("== C++ benchmarks (Google Benchmark)")
    size_re = "(" + "|".join(str(n) for n in sizes) + ")$"
    balance = run_bench(bench / "balance_bench", f"^(numeric_step|solve_balance|solve_balance_kept)/.*/{size_re}", args.min_time)
    memory = {}
    if 5000 in sizes:
        for mix in ["ee"]:  # alone in its process, so that its peak RSS is its own
            memory.update(run_bench(bench / "balance_bench", f"^solve_memory/{mix}/5000", args.min_time))
    network = run_bench(bench / "network_bench", f"^(level_decomposition|indicators|flow_network)/ee/{size_re}|^florida_bay",
                        args.min_time)
    store = run_bench(bench / "store_bench", "/200(/|$)", args.min_time)
    gui = {}
    if (bench / "gui_bench").exists():
        gui = run_bench(bench / "gui_bench", "/100(/|$)", max(float(args.min_time), 1.0), env=dict(single, QT_QPA_PLATFORM="offscreen"))

    # 3-4. NumPy and the whole process.
    log("== NumPy reference and whole-process tledger solve --json")
    rows, skipped, numpy_version = {}, {}, "?"
    for n in sizes:
        for mix in MIXES:
            folder = work / f"n{n}_{mix}"
            walls, cpus, rss, code, cli_out = [], [], 0.0, 0, ""
            for _ in range(3):  # best of three, or one when a run takes over 5 s
                w, r, code, cli_out, cpu = timed_process([str(tledger), "solve", str(folder), "--json"], with_cpu=True)
                walls.append(w)
                cpus.append(cpu)
                rss = max(rss, r)
                if w > 5:
                    break
            cli = json.loads(cli_out)
            below = [m for m in sizes if m < n and (m, mix) in rows and rows[(m, mix)]["numpy"]]
            predicted = rows[(below[-1], mix)]["numpy"] * (n / below[-1]) ** 3 if below else 0.0
            npj, diff, where, npw = None, None, "", None
            if predicted > args.numpy_limit:
                skipped[(n, mix)] = f"NumPy skipped at n={n} {mix}: one solve predicted {predicted:.0f} s (cubic from n={below[-1]})"
                log("  " + skipped[(n, mix)])
            else:
                npw, _, npcode, np_out = timed_process(
                    ["/usr/bin/python3", str(HERE / "numpy_balance.py"), str(folder)], env=single)
                if npcode != 0:
                    raise SystemExit(f"numpy_balance.py failed on {folder}")
                npj = json.loads(np_out)
                numpy_version = npj["timing"]["numpy"]
                diff, where = compare(cli, npj)
            rows[(n, mix)] = dict(
                numeric=seconds_of(balance.get(f"numeric_step/{mix}/{n}")),
                full=seconds_of(balance.get(f"solve_balance/{mix}/{n}")),
                kept=seconds_of(balance.get(f"solve_balance_kept/{mix}/{n}")),
                numpy=npj["timing"]["solve_s"] if npj else None, numpy_script=npj["timing"]["script_s"] if npj else None,
                numpy_process=npw, cli=min(walls), cli_cpu=cpus[walls.index(min(walls))], cli_rss=rss,
                cli_status=cli["status"], cli_code=code, agree=diff, agree_where=where, shape=shape[(n, mix)])
            log(f"  n={n} {mix}: tledger {min(walls):.3f} s ({cli['status']}), numpy solve "
                f"{fmt_time(rows[(n, mix)]['numpy'])}, max rel diff {diff if diff is not None else '—'} {where}")

    # 5. The table.
    print(f"Trophic Ledger benchmarks — {time.strftime('%Y-%m-%d %H:%M UTC', time.gmtime())}")
    commit = subprocess.run(["git", "-C", str(ROOT), "log", "-1", "--format=%h %s"], capture_output=True, text=True).stdout.strip()
    cpu = next((l.split(":", 1)[1].strip() for l in open("/proc/cpuinfo") if l.startswith("model name")), platform.processor())
    print(f"commit {commit}; {cpu}, {os.cpu_count()} cores; load average {open('/proc/loadavg').read().split()[0:3]}")
    print(f"synthetic models, seed {SEED}; C++ times are CPU time per call (Google Benchmark); NumPy {numpy_version},"
          " single-threaded BLAS, median per call;")
    print("kept = solveBalance(model, scratch) called again with its buffers kept (BalanceScratch);")
    print("ratio = NumPy solve / C++ solveBalance (kept: / the kept-buffer call); tledger = whole process `tledger solve FOLDER --json`, wall (CPU),"
          " best of 3 (one run when over 5 s); RSS = its peak resident set.")
    print()
    head = ["n", "mix", "eqs/unknowns", "numeric step", "solveBalance", "kept", "NumPy solve", "ratio", "ratio kept",
            "NumPy script",
            "tledger (CPU)", "tledger RSS", "status", "agree"]
    table = []
    for n in sizes:
        for mix in MIXES:
            r = rows[(n, mix)]
            eqs = r["shape"].split(": ")[1].split(" (")[0].replace(" equations, ", "/").replace(" unknowns", "")
            ratio = f"{r['numpy'] / r['full']:.1f}×" if r["full"] and r["numpy"] else "—"
            ratio_kept = f"{r['numpy'] / r['kept']:.1f}×" if r["kept"] and r["numpy"] else "—"
            agree = "—" if r["agree"] is None else f"{r['agree']:.0e}" if r["agree"] <= 1e-8 else \
                f"NO {r['agree']:.0e} {r['agree_where']}"
            table.append([str(n), mix, eqs, fmt_time(r["numeric"]), fmt_time(r["full"]), fmt_time(r["kept"]),
                          fmt_time(r["numpy"]), ratio, ratio_kept,
                          fmt_time(r["numpy_script"]), f"{fmt_time(r['cli'])} ({fmt_time(r['cli_cpu'])})",
                          f"{r['cli_rss']:.0f} MiB", r["cli_status"], agree])
    widths = [max(len(h), *(len(t[k]) for t in table)) for k, h in enumerate(head)]
    line = lambda cells: "| " + " | ".join(c.ljust(w) for c, w in zip(cells, widths)) + " |"
    print(line(head))
    print("|" + "|".join("-" * (w + 2) for w in widths) + "|")
    for t in table:
        print(line(t))

    skipped_cpp = [f"{k} {v.get('error_message', '')}" for k, v in balance.items() if v.get("error_occurred")]
    for note in skipped_cpp + list(skipped.values()):
        print("  " + note)
    print("  agree = largest relative difference between NumPy and tledger over B, P/B, Q/B, EE, P, Q, R,"
          " flow to detritus and TL.")
    print()
    print("Analyses (balanced sheet of mix ee; the three mixes solve to the same sheet):")
    for n in sizes:
        cells = []
        for what in ("flow_network", "level_decomposition", "indicators"):
            e = network.get(f"{what}/ee/{n}")
            if e is None:
                cells.append(f"{what} —")
            elif e.get("error_occurred"):
                cells.append(f"{what} {e.get('error_message', 'skipped')}")
            else:
                cells.append(f"{what} {fmt_time(seconds_of(e))}")
        print(f"  n={n:<5} " + "; ".join(cells))
    fb = [f"{k.split('/', 1)[1]} {fmt_time(seconds_of(v))}" for k, v in network.items() if k.startswith("florida_bay")]
    print("  Florida Bay reference network (125 compartments): " + "; ".join(fb))

    def store_time(prefix):
        e = next((v for k, v in store.items() if k.startswith(prefix + "/")), None)
        return seconds_of(e)

    print("Project file, 5 scenarios × 200 compartments (wall): " + "; ".join(
        f"{p} {fmt_time(store_time(p))}" for p in ("project_open", "project_save", "project_save_in_place",
                                                   "project_save_one_scenario")))
    for k, v in memory.items():
        print(f"Memory, {k}: one solveBalance {fmt_time(seconds_of(v))}, process peak {v.get('peak_rss_mib', 0):.0f} MiB"
              f" (model alone {v.get('rss_before_mib', 0):.0f} MiB)")
    gui_ms = {}
    if gui:
        for k, v in gui.items():
            gui_ms[k.split("/")[1]] = seconds_of(v)
        print("GUI, offscreen, 100 compartments, one cell edit to repainted page (wall): " +
              "; ".join(f"{k} {fmt_time(v)}" for k, v in gui_ms.items()))
    else:
        print("GUI: not built (gui_bench missing), edit-to-redraw not measured.")

    print()
    fitted = [n for n in sizes if 50 <= n <= 5000]
    print(f"Growth exponent k (cost ∝ n^k, least squares on log-log over n = {', '.join(map(str, fitted))};"
          " a skipped size is left out):")
    costs = {}
    for mix in MIXES:
        costs[f"numeric step, {mix}"] = [(n, rows[(n, mix)]["numeric"]) for n in sizes]
        costs[f"solveBalance, {mix}"] = [(n, rows[(n, mix)]["full"]) for n in sizes]
        costs[f"NumPy solve, {mix}"] = [(n, rows[(n, mix)]["numpy"]) for n in sizes]
        costs[f"tledger process, {mix}"] = [(n, rows[(n, mix)]["cli"]) for n in sizes]
    for what in ("level_decomposition", "indicators"):
        costs[what.replace("_", " ")] = [(n, seconds_of(network.get(f"{what}/ee/{n}"))) for n in sizes]
    for name, pts in costs.items():
        k = exponent(pts)
        print(f"  {name:<34} k = {k:.2f}" if k is not None else f"  {name:<34} k = —")

    print()
    print("Targets of issue 9 (this machine):")

    def target(label, value, limit, shown=None):
        if value is None:
            print(f"  [ n/a ] {label}: not measured")
            return
        ok = value < limit
        print(f"  [{' met ' if ok else 'MISSED'}] {label}: {shown or fmt_time(value)}")

    def get(n, mix, key):
        return rows[(n, mix)][key] if (n, mix) in rows else None

    target("numeric step, 50, EE only < 3 µs", get(50, "ee", "numeric"), 3e-6)
    target("numeric step, 50, EE + 10 % unknown B < 10 µs", get(50, "ee-biomass", "numeric"), 10e-6)
    target("solveBalance, 50 < 30 µs (mix ee)", get(50, "ee", "full"), 30e-6)
    target("solveBalance, 1000 < 5 ms (mix ee)", get(1000, "ee", "full"), 5e-3)
    target("solveBalance, 5000 < 50 ms (mix ee)", get(5000, "ee", "full"), 50e-3)
    m5000 = memory.get("solve_memory/ee/5000/iterations:1")
    target("solveBalance, 5000, process peak memory < 200 MB", m5000.get("peak_rss_mib") * 1.048576 if m5000 else None,
           200, f"{m5000.get('peak_rss_mib', 0) * 1.048576:.0f} MB" if m5000 else None)
    target("tledger solve --json, 1000 < 0.1 s (mix ee)", get(1000, "ee", "cli"), 0.1)
    diet_form = "long" if (work / "n5000_ee" / "diet.csv").exists() and \
        open(work / "n5000_ee" / "diet.csv").readline().strip() == "predator,prey,share" else "wide"
    target(f"tledger solve --json, 5000 < 0.5 s (mix ee; diet.csv written {diet_form}-form)", get(5000, "ee", "cli"), 0.5)
    r50, r1000 = get(50, "ee", "numpy"), get(1000, "ee", "numpy")
    f50, f1000 = get(50, "ee", "full"), get(1000, "ee", "full")
    target("≥ 30× faster than NumPy at 50 (mix ee)", 30 / (r50 / f50) if r50 and f50 else None, 1,
           f"{r50 / f50:.1f}×" if r50 and f50 else None)
    k50 = get(50, "ee", "kept")
    target("≥ 30× faster than NumPy at 50 (mix ee), buffers kept", 30 / (r50 / k50) if r50 and k50 else None, 1,
           f"{r50 / k50:.1f}×" if r50 and k50 else None)
    target("≥ 100× faster than NumPy at 1000 (mix ee)", 100 / (r1000 / f1000) if r1000 and f1000 else None, 1,
           f"{r1000 / f1000:.1f}×" if r1000 and f1000 else None)
    target("open a 200-compartment project (5 scenarios) < 200 ms", store_time("project_open"), 0.2)
    target("save a 200-compartment project (5 scenarios) < 200 ms", store_time("project_save"), 0.2)
    for page in ("balance-sheet", "level-bars"):
        target(f"edit to redraw, 100 compartments, {page} page < 50 ms", gui_ms.get(page), 0.05)
    # Ensemble (issue 15): its own driver prints draws/s beside the NumPy batched ensemble.
    ensemble = bench / "ensemble_bench"
    if ensemble.exists():
        print()
        sys.stdout.flush()
        subprocess.run([str(ensemble), "--size", "50", "--draws", "100000", "--rounds", "2"], env=single)
    print()
    print(f"(run took {time.perf_counter() - started:.0f} s)")

    if args.json:
        with open(args.json, "w") as f:
            json.dump({"rows": {f"{n}/{m}": v for (n, m), v in rows.items()}, "balance": balance, "memory": memory,
                       "network": network, "store": store, "gui": gui}, f, indent=1, default=str)
    return 0


if __name__ == "__main__":
    sys.exit(main())
