#!/usr/bin/python3
# SPDX-License-Identifier: GPL-3.0-or-later
# Copyright (C) 2026 the dragarc developers.
#
# report.py: write docs/performance.md from the JSON results of bench_flight and scipy_bench.py.
# Usage: report.py MACHINE_TXT OUT_MD C_JSON SCIPY_JSON [C_JSON SCIPY_JSON ...] [--patterns JSON] [--fit JSON]
#                  [--mpi JSON]
#        report.py --update-mpi OUT_MD MPI_JSON   (only the MPI section of an existing file, after bench/mpi.sh)
#   (one pair per round)

import json
import sys


LABEL = {"dop853": "DOP853", "rk8pd": "GSL rk8pd", "adams": "CVODE Adams", "bdf": "CVODE BDF"}


def us(s):
    return "%.1f" % (1e6 * s)


def median(xs):
    xs = sorted(xs)
    n = len(xs)
    return xs[n // 2] if n % 2 else 0.5 * (xs[n // 2 - 1] + xs[n // 2])


def merge_rounds(crounds, prounds):
    """One result set whose times are the medians over the rounds (each round: the C benchmark, then SciPy),
    plus, per problem, the ratio SciPy-fastest / dragarc of each round."""
    cres = json.loads(json.dumps(crounds[0]))
    for i, p in enumerate(cres["problems"]):
        for key in ("dragarc", "dragarc_forced"):
            p[key]["seconds_per_flight"] = median([r["problems"][i][key]["seconds_per_flight"] for r in crounds])
        for j, ref in enumerate(p["reference"]):
            ref["seconds_per_flight"] = median([r["problems"][i]["reference"][j]["seconds_per_flight"]
                                                for r in crounds])
    for key in ("parallel", "parallel_loose"):
        cres[key]["flights_per_second"] = median([r[key]["flights_per_second"] for r in crounds])
    cres["peak_rss_kib"] = max(r["peak_rss_kib"] for r in crounds)
    pyres, round_ratios = {}, {}
    for i, p in enumerate(cres["problems"]):
        name = p["name"]
        per_round = [{m["method"]: m for m in next(q for q in pr["problems"] if q["name"] == name)["methods"]}
                     for pr in prounds]
        rows = []
        for meth in per_round[0]:
            row = dict(per_round[0][meth])
            row["seconds_per_flight"] = median([pr[meth]["seconds_per_flight"] for pr in per_round])
            rows.append(row)
        pyres[name] = rows
        round_ratios[name] = [min(m["seconds_per_flight"] for m in pr.values()) /
                              crounds[k]["problems"][i]["dragarc"]["seconds_per_flight"]
                              for k, pr in enumerate(per_round)]
    return cres, pyres, round_ratios


def mpi_section(L, path):
    """The MPI build's scaling on this machine (bench/mpi.sh), docs/cluster.md."""
    with open(path) as f:
        m = json.load(f)
    L.append("")
    L.append("## MPI processes")
    L.append("")
    L.append("Measured by `bench/mpi.sh`: `dragarc footprint docs/examples/footprint-rocket.json --samples 4000 --json` "
             "(%d flights) with the MPI build (`-DDRAGARC_MPI=ON`, [cluster.md](cluster.md)) under `mpirun -q "
             "--bind-to none -n P`, one OpenMP thread a process, and with the ordinary build on 1 and 2 threads; "
             "the runs take turns, %d rounds, and the table gives the fastest wall time of the whole command of "
             "each (the machine is shared with other work, and the fastest run is the one it disturbed least). The "
             "load average of the machine was %.2f before and %.2f after: the runs themselves keep up to 2 cores "
             "busy, so more than that means other programs shared the machine." % (
                 m["flights"], m.get("rounds", 3), m["load_before"], m["load_after"]))
    L.append("")
    L.append("| run | wall time | against 1 process |")
    L.append("|---|---:|---:|")
    base = m["processes1"]
    for label, key in (("mpirun -n 1 (1 thread)", "processes1"), ("mpirun -n 2 (1 thread each)", "processes2"),
                       ("ordinary build, 1 thread", "threads1"), ("ordinary build, 2 threads", "threads2")):
        L.append("| %s | %.2f s | %.2fx |" % (label, m[key], base / m[key]))
    L.append("| mpirun -n 1 of `dragarc --version` (mpirun's own start and end) | %.2f s | |" % m["mpirun_alone"])
    L.append("")
    L.append("The outputs of 2 processes and of the ordinary build were %s. Processes add mpirun's start "
             "(the last row) and the gathering of the impacts to rank 0 (88 bytes a flight); threads share one "
             "process's memory, so on one machine threads are the better choice, and processes pay off across "
             "machines." % ("the same bytes" if m["same_bytes"] else "NOT the same bytes (a fault: see cluster.md)"))


def update_mpi(out_path, mpi_path):
    """Replace (or add) the MPI section of an existing docs/performance.md, the rest left as it is: for a run of
    bench/mpi.sh alone (bench/run writes the whole file)."""
    with open(out_path) as f:
        text = f.read().rstrip("\n")
    start = text.find("\n## MPI processes")
    if start >= 0:
        end = text.find("\n## ", start + 1)
        text = text[:start] + (text[end:] if end >= 0 else "")
    L = [text.rstrip("\n")]
    mpi_section(L, mpi_path)
    L.append("")
    with open(out_path, "w") as f:
        f.write("\n".join(L))
    return 0


def main():
    # report.py MACHINE_TXT OUT_MD C_JSON SCIPY_JSON [C_JSON SCIPY_JSON ...]
    # report.py --update-mpi OUT_MD MPI_JSON
    args = sys.argv[1:]
    if args[:1] == ["--update-mpi"] and len(args) == 3:
        return update_mpi(args[1], args[2])
    patterns = None
    if "--patterns" in args:
        k = args.index("--patterns")
        patterns = args[k + 1]
        del args[k:k + 2]
    fits = None
    if "--fit" in args:
        k = args.index("--fit")
        fits = args[k + 1]
        del args[k:k + 2]
    mpi = None
    if "--mpi" in args:
        k = args.index("--mpi")
        mpi = args[k + 1]
        del args[k:k + 2]
    machine_path, out_path = args[0:2]
    pairs = args[2:]
    if len(pairs) < 2 or len(pairs) % 2:
        sys.stderr.write("usage: report.py MACHINE_TXT OUT_MD C_JSON SCIPY_JSON [C_JSON SCIPY_JSON ...]\n")
        return 2
    crounds, prounds = [], []
    for k in range(0, len(pairs), 2):
        with open(pairs[k]) as f:
            crounds.append(json.load(f))
        with open(pairs[k + 1]) as f:
            prounds.append(json.load(f))
    cres, pyres, round_ratios = merge_rounds(crounds, prounds)
    nrounds = len(crounds)
    with open(machine_path) as f:
        machine = f.read().strip()

    L = []
    L.append("# Performance")
    L.append("")
    L.append("Generated by `bench/run` (do not edit by hand); the numbers below come from one run on one machine.")
    L.append("")
    L.append("## Machine")
    L.append("")
    L.extend("- " + line for line in machine.splitlines())
    L.append("")
    L.append("## What is measured")
    L.append("")
    L.append("Four problems of our own invention, defined once in `bench/bench_flight.c` as `dragarc_scenario` records "
             "and passed to `bench/scipy_bench.py` as JSON (SI units, radians), rtol = atol = 1e-8 everywhere:")
    L.append("")
    for p in cres["problems"]:
        L.append("- **%s**: %s." % (p["name"], p["what"]))
    L.append("")
    L.append("- *Time per flight*: within a round, the median over 5 loops (SciPy: 3) of N flights each, N chosen "
             "so that a loop takes about 0.5 s; `dragarc_flight_run` with no sampling (`dt = 0`), from the scenario "
             "record to the filled result. The script runs %d rounds, each the C benchmark then the SciPy one, "
             "and the tables show the median over the rounds: this machine's speed drifts by tens of per cent "
             "from minute to minute, and the rounds put the two sides side by side several times. The goals give "
             "the ratio of each round as well." % nrounds)
    L.append("- *GSL reference*: the same right-hand side (`dragarc_forces_eval`, so the physics is identical) "
             "integrated with GSL odeiv2 `rk8pd` (explicit Runge-Kutta-Prince-Dormand 8(9)) and, for the drops, "
             "`msbdf` (BDF, finite-difference Jacobian), driven by `gsl_odeiv2_evolve_apply` with one workspace "
             "reused across flights; ground impact found inside the last step by Illinois regula falsi on "
             "re-integration from the step's start, to 1e-9 s.")
    L.append("- *f-evals*: every call of `dragarc_forces_eval` during one flight, counted through a linker wrapper "
             "(`--wrap`), the library unchanged. For dragarc on its default DOP853 path this is the starting-step "
             "estimate (2), 12 per accepted step and 11 per rejected one, 3 for the continuous extension on a step "
             "that holds an event or a sample, 13 for the step that gives the impact state, and the launch and "
             "impact rows; on the CVODE paths it includes the difference-quotient Jacobian columns of BDF and one "
             "diagnostic evaluation per step. The terminal-speed solve at launch uses other calls and is not "
             "counted. For SciPy it is `nfev` of `solve_ivp` (event location uses the dense output, no extra "
             "evaluations).")
    L.append("- *SciPy on the fine drop*: only LSODA, Radau and BDF; the explicit methods would need about 10^4 "
             "steps (stability holds them to about a relaxation time, 1.2 ms, over an 80 s flight), seconds per "
             "flight in Python, and cannot be the fastest.")
    L.append("- *Tolerances*: the same numbers mean different tests: CVODE and dragarc's DOP853 bound the "
             "weighted RMS norm of the local error with weights 1/(rtol |y_i| + atol), GSL bounds each component "
             "by atol + rtol |y_i|, SciPy uses the RMS norm like CVODE. The *range error* column shows what each solver actually "
             "delivered.")
    L.append("- *Agreement*: before any time is printed, each solver's range must agree with dragarc's to 1e-6 "
             "relative, and dragarc's must lie within 10 rtol of the 1e-12 solution; the largest difference seen "
             "is listed per problem. The test suite runs these checks without the timing (`ctest -R "
             "bench_agreement`: `bench_flight --check`, then `scipy_bench.py --check`).")
    L.append("- Drag tables are interpolated as dragarc does (Steffen's monotone cubic in log Re or in Mach); the "
             "SciPy side implements Steffen's method itself and checks it against dragarc's Cd values to 1e-12 "
             "before flying.")
    L.append("")

    goals = {}
    for p in cres["problems"]:
        name = p["name"]
        d = p["dragarc"]
        refs = p["reference"]
        py = pyres.get(name, [])
        fastest = min(py, key=lambda r: r["seconds_per_flight"]) if py else None
        L.append("## Problem: %s" % name)
        L.append("")
        L.append("dragarc chose **%s**; range %.6f m, time of flight %.4f s." % (d["method"], d["range"],
                                                                                d["time_of_flight"]))
        L.append("")
        tight = p["tight_range"]

        def err(r):
            return "%.1e" % (abs(r - tight) / tight)
        L.append("| solver | time per flight (µs) | vs dragarc | steps | f-evals | range (m) | range error |")
        L.append("|---|---:|---:|---:|---:|---:|---:|")
        td = d["seconds_per_flight"]
        L.append("| dragarc (%s, its choice) | %s | 1 | %d | %d | %.9f | %s |" % (
            LABEL[d["method"]], us(td), d["steps"], d["forces_evals"], d["range"], err(d["range"])))
        fo = p["dragarc_forced"]
        L.append("| dragarc, %s forced | %s | %.2fx | %d | %d | %.9f | %s |" % (
            fo["method"], us(fo["seconds_per_flight"]), fo["seconds_per_flight"] / td, fo["steps"],
            fo["forces_evals"], fo["range"], err(fo["range"])))
        maxrel = 0.0
        for r in refs:
            maxrel = max(maxrel, abs(r["range"] - d["range"]) / d["range"])
            L.append("| %s | %s | %.2fx | %d | %d | %.9f | %s |" % (r["solver"], us(r["seconds_per_flight"]),
                                                                    r["seconds_per_flight"] / td, r["steps"],
                                                                    r["forces_evals"], r["range"], err(r["range"])))
        for r in py:
            maxrel = max(maxrel, r["range_rel_diff"])
            L.append("| SciPy %s | %s | %.0fx | %d | %d | %.9f | %s |" % (r["method"], us(r["seconds_per_flight"]),
                                                                          r["seconds_per_flight"] / td, r["steps"],
                                                                          r["nfev"], r["range"], err(r["range"])))
        L.append("")
        L.append("Largest relative range difference from dragarc: %.1e. \"vs dragarc\" is the solver's time over "
                 "dragarc's (above 1: dragarc is faster). \"range error\" is relative to an rk8pd solution at "
                 "rtol = atol = %g (range %.9f m)." % (maxrel, p["tight_tol"], tight))
        L.append("")
        rk = next(r for r in refs if r["solver"] == "gsl rk8pd")
        goals[name] = {"forced": fo["seconds_per_flight"] / td, "forced_method": fo["method"],
                       "method": d["method"],
                       "scipy_ratio": fastest["seconds_per_flight"] / td if fastest else float("nan"),
                       "scipy_fastest": fastest["method"] if fastest else "-",
                       "gsl_ratio": td / rk["seconds_per_flight"],
                       "gsl_scipy_ratio": fastest["seconds_per_flight"] / rk["seconds_per_flight"] if fastest
                       else float("nan")}

    tight_frag = next(p["tight_range"] for p in cres["problems"] if p["name"] == "fragment")
    L.append("## Throughput and memory")
    L.append("")
    for key in ("parallel", "parallel_loose"):
        par = cres[key]
        L.append("- Fragment flights at rtol = atol = %g on %d threads (OpenMP `parallel for`, each thread flying its "
                 "own copy of the scenario; %d processors seen): %d flights in %.2f s = **%.0f flights/s**, so "
                 "1,000,000 flights would take %.0f s; range error %.1e against the 1e-12 solution."
                 % (par["rtol"], par["threads"], par["max_threads"], par["flights"], par["seconds"],
                    par["flights_per_second"], 1e6 / par["flights_per_second"],
                    abs(par["range"] - tight_frag) / tight_frag))
    L.append("- Memory does not grow with the number of flights: each flight's workspace lives on the stack or is "
             "freed when it lands, and no impact points are kept here.")
    L.append("- Peak resident memory of the whole C benchmark (`getrusage` `ru_maxrss`): %d KiB." % cres["peak_rss_kib"])
    L.append("")
    L.append("## Goals")
    L.append("")
    L.append("| goal | measured | status |")
    L.append("|---|---|---|")

    def row(goal, measured, ok):
        L.append("| %s | %s | %s |" % (goal, measured, "met" if ok else "**not met**"))
    for name, g in goals.items():
        rr = round_ratios[name]
        row("%s: ≥ 100x faster than SciPy's fastest method" % name,
            "%.0fx (rounds: %s; fastest: %s; the GSL rk8pd reference itself: %.2gx)" % (
                g["scipy_ratio"], ", ".join("%.0fx" % r for r in rr), g["scipy_fastest"], g["gsl_scipy_ratio"]),
            g["scipy_ratio"] >= 100.0)
    for name in ("ball", "fragment"):
        g = goals[name]
        row("%s: within 1.5x of the GSL rk8pd reference" % name,
            "dragarc / rk8pd = %.2fx" % g["gsl_ratio"], g["gsl_ratio"] <= 1.5)
    g = goals["fine_drop"]
    row("fine drop (stiff): ≥ 5x faster than the explicit reference (rk8pd)",
        "rk8pd / dragarc (%s) = %.1fx; dragarc's own DOP853 forced: %.1fx slower" % (
            g["method"], 1.0 / g["gsl_ratio"], g["forced"]), 1.0 / g["gsl_ratio"] >= 5.0)
    g = goals["drop"]
    L.append("| 100 µm drop: not stiff enough for an implicit method to pay at rtol 1e-8 (about 150 relaxation "
             "times); `auto` keeps it explicit | dragarc (%s) against its own BDF forced: %.1fx faster; rk8pd / "
             "dragarc = %.2fx | (see the fine drop) |" % (g["method"], g["forced"], 1.0 / g["gsl_ratio"]))
    for key in ("parallel", "parallel_loose"):
        par = cres[key]
        t1m = 1e6 / par["flights_per_second"]
        row("1,000,000 fragment flights in ≤ 20 s on 2 cores (rtol %g)" % par["rtol"],
            "%.0f s (%.0f flights/s on %d threads)" % (t1m, par["flights_per_second"], par["threads"]),
            t1m <= 20.0 and par["threads"] == 2)
    if patterns:
        with open(patterns) as f:
            pat = json.load(f)
        sp, dr = pat["sprinkler"], pat["drift"]
        row("a full wind-distorted sprinkler pattern (40 drop classes x 72 directions) in under a second",
            "%.2f s on 2 threads (%d flights with evaporation; %.2f s on 1 thread, so %.2fx)" % (
                sp["threads2"], sp["flights"], sp["threads1"], sp["threads1"] / sp["threads2"]), sp["threads2"] < 1.0)
        row("a drift profile (40 drop classes) in under a second",
            "%.3f s on 2 threads (%.3f s on 1)" % (dr["threads2"], dr["threads1"]), dr["threads2"] < 1.0)
        if "footprint" in pat:
            fp = pat["footprint"]
            row("a debris footprint scales with threads (3 classes x 2000 samples from 18 km)",
                "%.2f s on 2 threads, %.2f s on 1: %.2fx; %.2f ms a flight on 1 thread, summary and output included" % (
                    fp["threads2"], fp["threads1"], fp["threads1"] / fp["threads2"],
                    1e3 * fp["threads1"] / fp["flights"]), fp["threads1"] / fp["threads2"] > 1.5)
        L.append("")
        L.append("The pattern times are wall times of the whole command (`dragarc sprinkler "
                 "docs/examples/sprinkler-garden.json --json`, `dragarc drift docs/examples/drift-boom.json --json`, "
                 "`dragarc footprint docs/examples/footprint-rocket.json --samples 2000 --json`), "
                 "medians of 5 runs, measured by `bench/patterns.sh`; the 1-thread run is the same work one flight "
                 "after another.")
    if fits:
        with open(fits) as f:
            fit = json.load(f)
        L.append("")
        L.append("## Fits to tracks")
        L.append("")
        L.append("Measured by `bench_fit` (bench/bench_fit.c): three invented problems, each a noisy synthetic track of "
                 "a known truth, fitted from %d random starts around the truth (every estimate off by up to the "
                 "spread, uniformly; angles by that share of 0.5 rad, launch offsets of 1 m). *Found* counts fits that "
                 "converged to the best minimum (within 0.1 standard error of the fit started at the truth). The "
                 "first three rows of each spread start from the random point as it is (`--start scenario`): plain "
                 "Levenberg-Marquardt, with geodesic acceleration, and the default policy (plain, retried "
                 "accelerated when it stalls); *auto+track* is the default with its default start, where launch "
                 "estimates begin at values read off the track's first points when those fit better. The "
                 "reference is one flight of the truth over the track's times, timed in the same run; *flights' "
                 "time* is a fit's time over it." % fit["starts"])
        for p in fit["problems"]:
            L.append("")
            L.append("**%s** (`--estimate %s`; one flight %.1f µs)" % (p["name"], p["estimates"],
                                                                      1e6 * p["flight_seconds"]))
            L.append("")
            L.append("| spread | method | found | iterations | flights | ms a fit | flights' time |")
            L.append("|---:|---|---:|---:|---:|---:|---:|")
            for c in p["cases"]:
                L.append("| ±%.0f %% | %s | %d of %d | %.1f | %.0f | %.2f | %.0f |" % (
                    100 * c["spread"], c["mode"], c["found"], fit["starts"], c["iterations"], c["flights"],
                    1e3 * c["seconds_per_fit"], c["seconds_per_fit"] / p["flight_seconds"]))
    if mpi:
        mpi_section(L, mpi)
    L.append("")
    with open(out_path, "w") as f:
        f.write("\n".join(L))
    return 0


if __name__ == "__main__":
    sys.exit(main())
