#!/usr/bin/python3
# check_extremes.py: extreme but legal inputs either work, with every number in the outputs finite, or fail with one
# line that says why (the field at fault), never with a crash, a NaN or an infinity. The cases: a 1 um water drop
# (from 2 m it stays aloft past the hour the solver allows: a clear failure; from 1 cm it lands, slowly), a
# fragment at 10 km/s (Mach 30) from 1 km, a launch above the 86 km top of the U.S. Standard Atmosphere 1976 (a
# clear refusal), tolerances of 1e-12 (the same range as the default ones to 1e-6, and finite), a footprint
# whose fragments leave at 10 km/s, and fragment catalogues of 100 000 and 100 001 rows.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_extremes.py DRAGARC_BINARY
# Prints "ok NAME" or "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed.

import json
import math
import os
import subprocess
import sys
import tempfile

from plot_files import check, tally

BIN = os.path.abspath(sys.argv[1])
ENV = dict(os.environ, LC_ALL="C")
ENV.pop("DRAGARC_PROFILE_PATH", None)

BALL = {"name": "ball", "projectile": {"mass": 0.16, "diameter": 0.072, "drag": {"model": "constant", "cd": 0.38}},
        "launch": {"speed": 38.0, "elevation": 32.0, "azimuth": 20.0, "height": 1.8}}
CASES = {
    "drop-1um-2m": {"name": "1 um drop", "projectile": {"density": 998.2, "diameter": "1 um", "drag": {"model": "sphere"}},
                    "launch": {"speed": 5.0, "elevation": 30.0, "azimuth": 0.0, "height": 2.0}},
    "drop-1um-1cm": {"name": "1 um drop near the ground",
                     "projectile": {"density": 998.2, "diameter": "1 um", "drag": {"model": "sphere"}},
                     "launch": {"speed": 0.0, "elevation": 0.0, "azimuth": 0.0, "height": 0.01}},
    "fragment-10km-s": {"name": "fast fragment",
                        "projectile": {"mass": 1.0, "diameter": 0.05, "drag": {"model": "constant", "cd": 1.0}},
                        "launch": {"speed": 10000.0, "elevation": 10.0, "azimuth": 0.0, "height": 1000.0},
                        "solver": {"max_time": 2000}},
    "above-86-km": {"name": "too high", "projectile": {"mass": 1.0, "diameter": 0.05, "drag": {"model": "constant", "cd": 1.0}},
                    "launch": {"speed": 100.0, "elevation": -10.0, "azimuth": 0.0, "height": 90000.0}},
    "tight": dict(BALL, solver={"rtol": 1e-12, "atol": 1e-12}),
    "default": BALL,
}


def finite_everywhere(x, where=""):
    """The paths of the numbers in a JSON document that are null or not finite."""
    bad = []
    if isinstance(x, dict):
        for k, v in x.items():
            bad += finite_everywhere(v, f"{where}.{k}")
    elif isinstance(x, list):
        for i, v in enumerate(x):
            bad += finite_everywhere(v, f"{where}[{i}]")
    elif x is None or (isinstance(x, float) and not math.isfinite(x)):
        bad.append(where)
    return bad


def run(args, work):
    p = subprocess.run([BIN, *args], capture_output=True, env=ENV, cwd=work, timeout=600)
    return p.returncode, p.stdout.decode(), p.stderr.decode()


with tempfile.TemporaryDirectory(prefix="dragarc-extremes.") as work:
    for name, doc in CASES.items():
        with open(os.path.join(work, name + ".json"), "w") as f:
            json.dump(doc, f)
    out = {}
    for name in CASES:
        rc, text, err = run(["fly", name + ".json", "--json", "--trajectory", name + ".csv", "--dt", "0.5"], work)
        out[name] = (rc, text, err)
    # clear failures: one line naming the field, no file
    for name, field, status in [("drop-1um-2m", "solver.max_time", 3), ("above-86-km", "launch.height", 2)]:
        rc, text, err = out[name]
        check(f"{name}: exit {status}, one line naming {field}", rc == status and text == "" and
              err.count("\n") == 1 and field in err, f"exit {rc}, stderr {err!r}")
        check(f"{name}: no trajectory file", not os.path.exists(os.path.join(work, name + ".csv")))
    # they work: every number finite, in the JSON and in the trajectory
    for name in ("drop-1um-1cm", "fragment-10km-s", "tight", "default"):
        rc, text, err = out[name]
        check(f"{name}: exit 0", rc == 0 and err == "", f"exit {rc}, stderr {err!r}")
        if rc != 0:
            continue
        doc = json.loads(text)
        bad = finite_everywhere(doc)
        check(f"{name}: every number in the JSON finite", bad == [], str(bad[:5]))
        with open(os.path.join(work, name + ".csv")) as f:
            rows = f.read().splitlines()[1:]
        # a value that is not defined there is an empty cell, as docs/cli.md says (C_D of a drop at rest, Re = 0)
        cells = [c for r in rows for c in r.split(",") if c != ""]
        check(f"{name}: every trajectory cell empty or a finite number",
              rows and all(math.isfinite(float(c)) for c in cells), f"{len(rows)} rows")
    # the 1 um drop falls at its Stokes speed: v = (rho_w - rho_a) g d^2 / (18 mu) (Stokes, "On the effect of the
    # internal friction of fluids on the motion of pendulums", 1851), with sea-level air of the U.S. Standard
    # Atmosphere 1976 (rho_a = 1.225 kg/m3; mu = 1.7894e-5 Pa s from its Sutherland law, Table 1 of the standard's
    # part 1) and g = 9.80665: 3.036e-5 m/s, so 1 cm takes 329.4 s. At Re ~ 2e-6 Oseen's correction (3/16 Re) is
    # below 1e-6 and the start from rest lasts v/g ~ 3e-6 s: 0.5 % covers the atmosphere's 1 cm of height and
    # rounding, not a model difference (the slip of so small a drop in air is not modelled, and not expected here).
    rc, text, _ = out["drop-1um-1cm"]
    if rc == 0:
        t = json.loads(text)["summary"]["time_of_flight"]
        v = (998.2 - 1.225) * 9.80665 * 1e-12 / (18.0 * 1.7894e-5)
        check("drop-1um-1cm: falls 1 cm at its Stokes speed (329.4 s)", abs(t - 0.01 / v) <= 0.005 * 0.01 / v,
              f"{t} s against {0.01 / v} s")
    # tolerances of 1e-12 give the default tolerances' range to 1e-6 (the default rtol is 1e-9)
    if out["tight"][0] == 0 and out["default"][0] == 0:
        a = json.loads(out["tight"][1])["summary"]["range"]
        b = json.loads(out["default"][1])["summary"]["range"]
        check("tight: the same range as the default tolerances to 1e-6", abs(a - b) <= 1e-6 * b, f"{a} against {b}")
    # a footprint whose fragments leave the breakup at 10 km/s: it works, or refuses with a line; never a NaN
    fp = {"name": "fast breakup", "breakup": {"latitude": 10, "longitude": 20, "altitude": "20 km", "speed": "10 km/s",
                                              "flight_path_angle": 0, "heading": 90},
          "fragments": [{"name": "piece", "count": 3, "mass": 1, "area": 0.01, "drag": {"model": "constant", "cd": 1}}],
          "footprint": {"samples": 20, "seed": 3}, "solver": {"max_time": 3000}}
    with open(os.path.join(work, "fast-breakup.json"), "w") as f:
        json.dump(fp, f)
    rc, text, err = run(["footprint", "fast-breakup.json", "--json", "--quiet"], work)
    if rc == 0:
        bad = finite_everywhere(json.loads(text).get("groups", json.loads(text)))
        check("fast breakup: works, every number in the groups finite", bad == [], str(bad[:5]))
    else:
        check("fast breakup: refused with one line", rc in (2, 3) and err.count("\n") == 1, f"exit {rc}, {err!r}")

    # fragment catalogues at the limit of 100 000 classes (docs/limits.md): one row more is refused before anything is
    # flown, with the line of the file; the limit itself is read, checked and refused only for its flights (100 000
    # classes x 300 samples is over the 20 million flights a run may have)
    for rows, want in ((100001, "more than 100000 classes"), (100000, "more than 20000000 flights")):
        with open(os.path.join(work, "big.csv"), "w") as f:
            f.write("name,count,mass,area,drag\n")
            for i in range(rows):
                f.write(f"piece {i},1,0.5,0.01,1.1\n")
        big = dict(fp, fragments="big.csv", footprint={"samples": 300, "seed": 1})
        with open(os.path.join(work, "big.json"), "w") as f:
            json.dump(big, f)
        rc, text, err = run(["footprint", "big.json", "--quiet", "--points", "big-points.csv"], work)
        check(f"a catalogue of {rows} rows: exit 2, one line ({want})", rc == 2 and text == "" and
              err.count("\n") == 1 and want in err, f"exit {rc}, {err!r}")
        check(f"a catalogue of {rows} rows: no points file", not os.path.exists(os.path.join(work, "big-points.csv")))

print(f"{tally['passed']} passed, {tally['failed']} failed")
sys.exit(1 if tally["failed"] else 0)
