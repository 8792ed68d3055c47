#!/usr/bin/python3
# check_plots.py: `dragarc fly --plot` end to end. Each format is written, valid and of a plausible size; plotting
# never changes the numbers (the --json output and the --trajectory file are byte for byte those of a run without
# --plot); stderr stays empty on success; a bad extension, a folder that does not exist and a PLplot that cannot
# find its drivers each give one clean error line, exit status 2, and leave no file behind.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_plots.py DRAGARC_BINARY TESTS_DATA_DIR
# Prints "ok NAME" or "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed.
#
# The formats' signatures and the tally: plot_files.py.

import json
import os
import subprocess
import sys
import tempfile

from plot_files import check, tally, valid_svg, validate


def run(*args, env=None):  # dragarc fly ARGS... in WORK
    e = dict(os.environ, LC_ALL="C")
    e.pop("DRAGARC_PROFILE_PATH", None)
    if env:
        e.update(env)
    p = subprocess.run([BIN, "fly", *args], capture_output=True, env=e, cwd=WORK, timeout=120)
    return p.returncode, p.stdout, p.stderr.decode("utf-8", "replace")


if len(sys.argv) != 3:
    print("usage: check_plots.py DRAGARC_BINARY TESTS_DATA_DIR", file=sys.stderr)
    sys.exit(2)
BIN = os.path.abspath(sys.argv[1])
DATA = os.path.abspath(sys.argv[2])
SCENARIO = os.path.join(DATA, "ball-in-wind.json")

with tempfile.TemporaryDirectory(prefix="dragarc-plots.") as WORK:
    # 1. every format, with --json: valid, plausible, stderr empty, the JSON unchanged, nothing else left
    rc0, json0, err0 = run(SCENARIO, "--json")
    check("fly --json runs", rc0 == 0 and err0 == "" and json.loads(json0)["summary"]["range"] > 0,
          f"exit {rc0}, stderr {err0!r}")
    for ext in ("svg", "png", "pdf"):
        name = f"plot.{ext}"
        rc, out, err = run(SCENARIO, "--json", "--plot", name)
        path = os.path.join(WORK, name)
        check(f"{ext}: exit 0 and empty stderr", rc == 0 and err == "", f"exit {rc}, stderr {err!r}")
        check(f"{ext}: the --json output is unchanged", out == json0, "it differs from the run without --plot")
        if not os.path.exists(path):
            check(f"{ext}: the file exists", False, "missing")
            continue
        size = os.path.getsize(path)
        # a page of three panels of lines and text: more than an empty page, far less than a runaway one
        check(f"{ext}: plausible size", 5_000 < size < 5_000_000, f"{size} bytes")
        ok, why = validate(path, ext)
        check(f"{ext}: valid {ext.upper()}", ok, why)
        check(f"{ext}: no temporary file left", sorted(os.listdir(WORK)) == [name], f"{os.listdir(WORK)}")
        os.remove(path)

    # 2. the summary and the trajectory file with and without --plot, in US units, with --dt and --plot-scale
    rc, text0, _ = run(SCENARIO, "--units", "us", "--trajectory", "a.csv", "--dt", "0.1")
    rc1, text1, err1 = run(SCENARIO, "--units", "us", "--trajectory", "b.csv", "--dt", "0.1", "--plot", "us.svg",
                           "--plot-scale", "free")
    check("us units, --trajectory and --plot-scale free: exit 0, empty stderr", rc1 == 0 and err1 == "",
          f"exit {rc1}, stderr {err1!r}")
    same = text1 == text0.replace(b"a.csv", b"b.csv")
    check("the summary is unchanged by --plot", same, "it differs")
    csv = [os.path.join(WORK, n) for n in ("a.csv", "b.csv")]
    same = all(map(os.path.exists, csv)) and open(csv[0], "rb").read() == open(csv[1], "rb").read()
    check("the --trajectory file is unchanged by --plot", same, "it differs or is missing")
    ok, why = valid_svg(os.path.join(WORK, "us.svg")) if os.path.exists(os.path.join(WORK, "us.svg")) else (False, "missing")
    check("us units: a valid SVG", ok, why)
    rc, out, err = run(SCENARIO, "--json", "--plot", "dt.png", "--dt", "0.01")
    check("--dt sets the plot's samples: exit 0, JSON unchanged", rc == 0 and err == "" and out == json0,
          f"exit {rc}, stderr {err!r}")
    for f in os.listdir(WORK):
        os.remove(os.path.join(WORK, f))

    # 3. failures: one line on stderr, exit 2, nothing on stdout, no file left
    empty_drivers = tempfile.mkdtemp(prefix="drivers.", dir=WORK)
    cases = [
        ("a bad extension", ["--plot", "plot.gif"], None,
         "dragarc: fly: --plot: 'plot.gif' ends in '.gif': a plot is drawn into an .svg, .png or .pdf file"),
        ("a folder that does not exist", ["--plot", "no/such/plot.svg"], None,
         "dragarc: --plot: cannot write no/such/plot.svg: No such file or directory"),
        # PLplot's fatal error path (plexit): no drivers where it is told to look
        ("PLplot without drivers", ["--plot", "plot.pdf"], {"PLPLOT_DRV_DIR": empty_drivers},
         "dragarc: --plot: cannot draw plot.pdf: PLplot: No device drivers found"),
    ]
    for name, args, env, want in cases:
        rc, out, err = run(SCENARIO, *args, env=env)
        lines = err.splitlines()
        check(f"{name}: exit 2", rc == 2, f"exit {rc}")
        check(f"{name}: one stderr line", len(lines) == 1 and err.endswith("\n") and lines[0].startswith(want),
              f"stderr {err!r}")
        check(f"{name}: no output", out == b"", f"stdout {out[:80]!r}")
        left = [f for f in os.listdir(WORK) if f != os.path.basename(empty_drivers)]
        check(f"{name}: no file left", left == [] and os.listdir(empty_drivers) == [], f"left {left}")

print(f"{tally['passed']} passed, {tally['failed']} failed")
sys.exit(1 if tally["failed"] else 0)
