#!/usr/bin/env python3
# check_uniformity.py: `dragarc uniformity FILE --json` against the same statistics worked out here, apart
# from the library, and the human summary against the JSON.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# Usage: check_uniformity.py DRAGARC_BINARY TESTS_DATA_DIR
#
# The formulas (docs/uniformity.md): CU = 100 (1 - sum a|x - m| / sum a x) (Christiansen, J. E. 1942,
# Irrigation by sprinkling, Univ. of California Agric. Exp. Stn. Bulletin 670); DU_lq = 100 (mean of the lowest
# quarter of the area) / m, the boundary catch counted by the part of its area that completes the quarter
# (this project's convention, common practice, no source); sd: the sample standard deviation with equal areas
# (Python's statistics.stdev, divisor n - 1), GSL's weighted estimator with areas (GSL Reference Manual,
# gsl_stats_wvariance: sum w / ((sum w)^2 - sum w^2) * sum w (x - m)^2). Both sides add a few dozen doubles,
# so they agree to 1e-12 relative; the human summary rounds (4 significant digits, CU and DU to 0.1).
# Prints "ok NAME" or "FAIL NAME: why", then "N passed, M failed"; exits 1 if any failed.
import csv
import json
import math
import os
import statistics
import subprocess
import sys

RULES = ("Sprinkler design and watering schedules follow local codes and water-use rules; catch-can tests "
         "follow the applicable test standard.")


def expected(path):
    rows = list(csv.DictReader(open(path, newline="")))
    x = [float(r["depth"]) for r in rows]
    a = [float(r["area"]) for r in rows] if "area" in rows[0] else None
    w = a or [1.0] * len(x)
    total = sum(w)
    m = sum(wi * xi for wi, xi in zip(w, x)) / total
    cu = 100.0 * (1.0 - sum(wi * abs(xi - m) for wi, xi in zip(w, x)) / sum(wi * xi for wi, xi in zip(w, x)))
    quarter, taken, low = total / 4.0, 0.0, 0.0
    for xi, wi in sorted(zip(x, w)):
        part = min(wi, quarter - taken)
        if part <= 0.0:
            break
        low += part * xi
        taken += part
    low /= quarter
    if a is None:
        sd = statistics.stdev(x)
    else:
        sd = math.sqrt(total / (total ** 2 - sum(wi * wi for wi in w)) * sum(wi * (xi - m) ** 2 for wi, xi in zip(w, x)))
    want = {"catches": len(x), "areas": "weighted" if a else "equal", "mean": m, "min": min(x), "max": max(x),
            "sd": sd, "cv": sd / m, "cu": cu, "low_quarter_mean": low, "du_lq": 100.0 * low / m}
    if a:
        want["total_area"] = total
    if "x" in rows[0]:
        xs, ys = [float(r["x"]) for r in rows], [float(r["y"]) for r in rows]
        want["grid"] = {"x_min": min(xs), "x_max": max(xs), "y_min": min(ys), "y_max": max(ys)}
    return want


def main(argv):
    binary, data = argv[1], argv[2]
    passed = failed = 0

    def report(name, why):
        nonlocal passed, failed
        if why:
            failed += 1
            print("FAIL %s: %s" % (name, why))
        else:
            passed += 1
            print("ok   %s" % name)

    for name in ("catch-cans.csv", "catch-cans-by-area.csv"):
        path = os.path.join(data, name)
        want = expected(path)
        p = subprocess.run([binary, "uniformity", path, "--json"], capture_output=True, text=True)
        if p.returncode != 0 or p.stderr:
            report(name + " --json", "exit %d, stderr %r" % (p.returncode, p.stderr))
            continue
        got = json.loads(p.stdout)
        why = []
        for key, value in want.items():
            g = got.get(key)
            if isinstance(value, float):
                if not isinstance(g, (int, float)) or abs(g - value) > 1e-12 * max(1.0, abs(value)):
                    why.append("%s %r, want %r" % (key, g, value))
            elif g != value:
                why.append("%s %r, want %r" % (key, g, value))
        if got.get("file") != path or got.get("cautions", [None])[-1] != RULES:
            why.append("file or cautions: %r, %r" % (got.get("file"), got.get("cautions")))
        report(name + " --json", "; ".join(why))

        p = subprocess.run([binary, "uniformity", path], capture_output=True, text=True)
        text = p.stdout.replace("\n    ", " ")
        lines = {
            "mean": "  mean            %.4g (in the file's depth unit)" % want["mean"],
            "min, max": "  min, max        %.4g, %.4g" % (want["min"], want["max"]),
            "CU": "  CU              %.1f %% (Christiansen)" % want["cu"],
            "DU_lq": "  DU_lq           %.1f %% (mean of the lowest quarter %.4g)" % (want["du_lq"], want["low_quarter_mean"]),
            "CV": "  CV              %.3f (standard deviation %.4g)" % (want["cv"], want["sd"]),
        }
        why = [k for k, line in lines.items() if line not in p.stdout.split("\n")]
        if p.returncode != 0 or RULES not in text:
            why.append("exit %d or the caution missing" % p.returncode)
        report(name + " summary", ", ".join(why) and "lines differ: " + ", ".join(why) + "\n" + p.stdout)

    print("%d passed, %d failed" % (passed, failed))
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
