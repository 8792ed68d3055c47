#!/usr/bin/python3
# check_plots_footprint.py: `dragarc footprint --plot` end to end. Each format is written, valid and of a plausible
# size, with no temporary file left; plotting never changes the numbers (the --json output, the summary and the
# --points, --grid and --geojson files are byte for byte those of a run without --plot); a bad extension, a plot
# named like another output, a folder that does not exist and a PLplot that cannot find its drivers each give one
# clean error line, exit status 2, nothing on stdout, and leave no file behind (the other outputs asked for
# included: the plot is drawn before them).
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_plots_footprint.py DRAGARC_BINARY SOURCE_DIR
# Prints "ok NAME" or "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed.
#
# The formats' signatures and the tally: plot_files.py.

import json
import os
import subprocess
import sys
import tempfile

from plot_files import check, png_size, tally, validate


def run(*args, env=None):  # dragarc footprint SCENARIO --samples 60 ARGS... in WORK
    e = dict(os.environ, LC_ALL="C", OMP_NUM_THREADS="2")
    e.pop("DRAGARC_PROFILE_PATH", None)
    if env:
        e.update(env)
    p = subprocess.run([BIN, "footprint", SCENARIO, "--samples", "60", "--quiet", *args], capture_output=True, env=e,
                       cwd=WORK, timeout=120)
    return p.returncode, p.stdout, p.stderr.decode("utf-8", "replace")


def read(name):
    path = os.path.join(WORK, name)
    return open(path, "rb").read() if os.path.exists(path) else None


def clear():
    for f in os.listdir(WORK):
        p = os.path.join(WORK, f)
        if os.path.isfile(p):
            os.remove(p)


if len(sys.argv) != 3:
    print("usage: check_plots_footprint.py DRAGARC_BINARY SOURCE_DIR", file=sys.stderr)
    sys.exit(2)
BIN = os.path.abspath(sys.argv[1])
SCENARIO = os.path.join(os.path.abspath(sys.argv[2]), "docs", "examples", "footprint-rocket.json")
OUTPUTS = ["--points", "p.csv", "--grid", "g.csv", "--geojson", "f.geojson"]

with tempfile.TemporaryDirectory(prefix="dragarc-fpplots.") as WORK:
    # 1. the numbers without a plot: the JSON, the summary and the three files
    rc0, json0, err0 = run("--json", *OUTPUTS)
    check("footprint --json runs", rc0 == 0 and err0 == "" and json.loads(json0)["run"]["samples"] == 60,
          f"exit {rc0}, stderr {err0!r}")
    files0 = {n: read(n) for n in ("p.csv", "g.csv", "f.geojson")}
    check("the three files are written", all(files0.values()), f"{sorted(os.listdir(WORK))}")
    rc, text0, _ = run()
    clear()

    # 2. every format, with --json and the files: valid, plausible, stderr empty, every number unchanged
    for ext in ("svg", "png", "pdf"):
        name = f"plot.{ext}"
        rc, out, err = run("--json", *OUTPUTS, "--plot", name)
        check(f"{ext}: exit 0 and empty stderr", rc == 0 and err == "", f"exit {rc}, stderr {err!r}")
        check(f"{ext}: the --json output is unchanged", out == json0, "it differs from the run without --plot")
        for n, b in files0.items():
            check(f"{ext}: {n} is unchanged", read(n) == b, "it differs or is missing")
        path = os.path.join(WORK, name)
        if not os.path.exists(path):
            check(f"{ext}: the file exists", False, "missing")
            continue
        size = os.path.getsize(path)
        # two maps with a colour map, 180 points and text: more than an empty page, far less than a runaway one
        check(f"{ext}: plausible size", 20_000 < size < 5_000_000, f"{size} bytes")
        ok, why = validate(path, ext)
        check(f"{ext}: valid {ext.upper()}", ok, why)
        if ext == "png":  # the footprint's page: 600 x 1080 points at 108 pixels an inch
            check("png: 900 x 1620 pixels", png_size(path) == (900, 1620), f"{png_size(path)}")
        left = sorted(os.listdir(WORK))
        check(f"{ext}: no temporary file left", left == sorted([name, "p.csv", "g.csv", "f.geojson"]), f"{left}")
        clear()
    rc, text1, err = run("--plot", "summary.svg")
    check("the summary is unchanged by --plot", rc == 0 and err == "" and text1 == text0, "it differs")
    clear()

    # 3. failures: one line on stderr, exit 2, nothing on stdout, no file left (the other outputs neither)
    empty_drivers = tempfile.mkdtemp(prefix="drivers.", dir=WORK)
    cases = [
        ("a bad extension", ["--plot", "plot.gif"], None,
         "dragarc: footprint: --plot: 'plot.gif' ends in '.gif': a plot is drawn into an .svg, .png or .pdf file"),
        ("no extension", ["--plot", "plot"], None,
         "dragarc: footprint: --plot: 'plot' has no extension"),
        ("the plot named like the points", ["--points", "x.svg", "--plot", "x.svg"], None,
         "dragarc: footprint: --plot and --points name the same file 'x.svg'"),
        ("a folder that does not exist", ["--plot", "no/such/plot.svg"], None,
         "dragarc: --plot: cannot write no/such/plot.svg: No such file or directory"),
        # PLplot's fatal error path (plexit): no drivers where it is told to look
        ("PLplot without drivers", ["--plot", "plot.pdf"], {"PLPLOT_DRV_DIR": empty_drivers},
         "dragarc: --plot: cannot draw plot.pdf: PLplot: No device drivers found"),
    ]
    for name, args, env, want in cases:
        rc, out, err = run("--json", *OUTPUTS, *args, env=env)
        lines = err.splitlines()
        check(f"{name}: exit 2", rc == 2, f"exit {rc}")
        check(f"{name}: one stderr line", len(lines) == 1 and err.endswith("\n") and lines[0].startswith(want),
              f"stderr {err!r}")
        check(f"{name}: no output", out == b"", f"stdout {out[:80]!r}")
        left = [f for f in os.listdir(WORK) if f != os.path.basename(empty_drivers)]
        check(f"{name}: no file left", left == [] and os.listdir(empty_drivers) == [], f"left {left}")

print(f"{tally['passed']} passed, {tally['failed']} failed")
sys.exit(1 if tally["failed"] else 0)
