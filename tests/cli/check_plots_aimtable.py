#!/usr/bin/python3
# check_plots_aimtable.py: `dragarc aim --plot` and `dragarc table --plot` (tables of flights and aim tables) end to
# end. Each format is written, valid and of a plausible size, with no temporary file left; plotting never changes the
# numbers (standard output and the -o file are byte for byte those of a run without --plot, and --quiet changes
# nothing when stderr is no terminal); an aim out of reach draws nothing; bad uses (a bad extension, a folder that
# does not exist, an unknown --plot-column, --plot-column without --plot, more than two --vary, too many curves)
# each give one error line, exit status 2, and leave no file.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_plots_aimtable.py DRAGARC_BINARY TESTS_DATA_DIR
# Prints "ok NAME" or "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed.
#
# The formats' signatures: SVG is XML whose root is <svg> in the SVG namespace (W3C, Scalable Vector Graphics 1.1,
# 2011); PNG opens with the 8-byte signature 89 50 4E 47 0D 0A 1A 0A and then the IHDR chunk holding the width and
# height (W3C/ISO 15948, PNG specification, sections 5.2 and 11.2.2); PDF opens with "%PDF-" and ends with "%%EOF"
# and an optional end of line (ISO 32000-1:2008, 7.5.2 and 7.5.5).

import os
import subprocess
import sys
import tempfile

from plot_files import VALIDATORS, check, tally


def run(*args):  # dragarc ARGS... in WORK
    e = dict(os.environ, LC_ALL="C")
    e.pop("DRAGARC_PROFILE_PATH", None)
    p = subprocess.run([BIN, *args], capture_output=True, env=e, cwd=WORK, timeout=300)
    return p.returncode, p.stdout, p.stderr.decode("utf-8", "replace")


VALID = VALIDATORS


def clear():
    for f in os.listdir(WORK):
        os.remove(os.path.join(WORK, f))


def same_with_plot(what, args, status=0, extra_files=(), plot_args=()):
    """args run without and with --plot (and plot_args) in each format: the same status, stdout and extra files; a
    valid plot."""
    rc0, out0, err0 = run(*args)
    check(f"{what}: runs (exit {status})", rc0 == status, f"exit {rc0}, stderr {err0!r}")
    before = {f: open(os.path.join(WORK, f), "rb").read() for f in extra_files}
    for ext, valid in VALID.items():
        name = f"plot.{ext}"
        rc, out, err = run(*args, "--plot", name, *plot_args)
        check(f"{what}, {ext}: exit {status} and the same stderr", rc == status and err == err0,
              f"exit {rc}, stderr {err!r}")
        check(f"{what}, {ext}: standard output unchanged", out == out0, "it differs from the run without --plot")
        for f, b in before.items():
            check(f"{what}, {ext}: {f} unchanged", open(os.path.join(WORK, f), "rb").read() == b, "it differs")
        path = os.path.join(WORK, name)
        if not os.path.exists(path):
            check(f"{what}, {ext}: the file exists", False, "missing")
            continue
        size = os.path.getsize(path)
        # one panel of lines and text: more than an empty page, far less than a runaway one
        check(f"{what}, {ext}: plausible size", 5_000 < size < 5_000_000, f"{size} bytes")
        ok, why = valid(path)
        check(f"{what}, {ext}: valid {ext.upper()}", ok, why)
        left = sorted(os.listdir(WORK))
        check(f"{what}, {ext}: no temporary file left", left == sorted([name, *extra_files]), f"{left}")
        os.remove(path)
    clear()


if len(sys.argv) != 3:
    print("usage: check_plots_aimtable.py DRAGARC_BINARY TESTS_DATA_DIR", file=sys.stderr)
    sys.exit(2)
BIN = os.path.abspath(sys.argv[1])
DATA = os.path.abspath(sys.argv[2])
LOB = os.path.join(DATA, "courtyard-lob.json")
DROPS = os.path.join(DATA, "sprinkler-drops.json")

with tempfile.TemporaryDirectory(prefix="dragarc-plots-aimtable.") as WORK:
    # 1. aim: the summary, the JSON, US units and the speed solve, each unchanged by --plot
    same_with_plot("aim", ["aim", LOB, "--range", "20"])
    same_with_plot("aim --json", ["aim", LOB, "--range", "20", "--json"])
    same_with_plot("aim in US units, solving the speed", ["aim", LOB, "--range", "50 ft", "--solve", "speed", "--units",
                                                          "us"])
    same_with_plot("aim with a crossrange and a raised target", ["aim", LOB, "--range", "15", "--crossrange", "2",
                                                                 "--height", "1"])

    # 2. aim out of reach: exit 1, the maximum range said, no file drawn
    rc, out, err = run("aim", LOB, "--range", "40", "--plot", "plot.svg")
    check("aim out of reach: exit 1, one line", rc == 1 and len(err.splitlines()) == 1 and "out of reach" in err,
          f"exit {rc}, stderr {err!r}")
    check("aim out of reach: no file", os.listdir(WORK) == [], f"left {os.listdir(WORK)}")

    # 3. tables of flights: two parameters, one, another column in other units, --quiet, -o
    vary2 = ["--vary", "diameter=0.0005:0.002:0.0005", "--vary", "wind_speed=0:4:2"]
    same_with_plot("table of two parameters", ["table", DROPS, *vary2])
    same_with_plot("table --csv of one parameter", ["table", LOB, "--vary", "speed=10:20:2", "--csv"])
    same_with_plot("table --plot-column impact_speed in US units",
                   ["table", DROPS, *vary2, "--json", "--units", "us"], plot_args=["--plot-column", "impact_speed"])
    rc0, out0, err0 = run("table", DROPS, *vary2)
    rc, out, err = run("table", DROPS, *vary2, "--quiet")
    check("table --quiet: the same output, stderr empty", rc == rc0 == 0 and out == out0 and err == "",
          f"exit {rc}, stderr {err!r}")
    run("table", DROPS, *vary2, "--markdown", "-o", "table.md")
    same_with_plot("table -o FILE", ["table", DROPS, *vary2, "--markdown", "-o", "table.md"], extra_files=["table.md"])

    # 4. an aim table: some ranges out of reach (exit 1), the plot drawn from those reached
    same_with_plot("aim table", ["table", LOB, "--ranges", "2:26:2", "--csv"], status=1)

    # 5. bad uses: one line on stderr, exit 2, nothing on stdout, no file left
    cases = [
        ("aim, a bad extension", ["aim", LOB, "--range", "20", "--plot", "plot.gif"],
         "dragarc: aim: --plot: 'plot.gif' ends in '.gif'"),
        ("aim, a folder that does not exist", ["aim", LOB, "--range", "20", "--plot", "no/such/plot.svg"],
         "dragarc: --plot: cannot write no/such/plot.svg: No such file or directory"),
        ("table, a bad extension", ["table", LOB, "--vary", "speed=10:20:5", "--plot", "plot.jpg"],
         "dragarc: table: --plot: 'plot.jpg' ends in '.jpg'"),
        ("table, a folder that does not exist", ["table", LOB, "--vary", "speed=10:20:5", "--plot", "no/such/p.png"],
         "dragarc: --plot: cannot write no/such/p.png: No such file or directory"),
        ("aim table, a folder that does not exist", ["table", LOB, "--ranges", "5:10:5", "--plot", "no/such/p.pdf"],
         "dragarc: --plot: cannot write no/such/p.pdf: No such file or directory"),
        ("an unknown --plot-column", ["table", LOB, "--vary", "speed=10:20:5", "--plot", "p.svg", "--plot-column",
                                     "carry"], "dragarc: table: --plot-column: no column 'carry'; choose range,"),
        ("--plot-column without --plot", ["table", LOB, "--vary", "speed=10:20:5", "--plot-column", "range"],
         "dragarc: table: --plot-column chooses what --plot draws; give --plot FILE too"),
        ("--plot-column with an aim table", ["table", LOB, "--ranges", "5:10:5", "--plot", "p.svg", "--plot-column",
                                            "range"], "dragarc: table: --plot-column is for a table of flights"),
        ("three --vary", ["table", LOB, "--vary", "speed=10:20:5", "--vary", "elevation=10:40:10", "--vary",
                          "height=1:2:1", "--plot", "p.svg"], "dragarc: table: --plot draws one or two --vary"),
        ("ten curves", ["table", LOB, "--vary", "speed=10:20:5", "--vary", "elevation=10:55:5", "--plot", "p.svg"],
         "dragarc: table: --plot draws one curve per value of the second --vary, at most 9: elevation has 10"),
        ("--plot and -o the same file", ["table", LOB, "--vary", "speed=10:20:5", "--plot", "p.svg", "-o", "p.svg"],
         "dragarc: table: --plot and -o name the same file 'p.svg'"),
    ]
    for name, args, want in cases:
        rc, out, err = run(*args)
        lines = err.splitlines()
        check(f"{name}: exit 2", rc == 2, f"exit {rc}")
        check(f"{name}: one stderr line", len(lines) == 1 and err.endswith("\n") and lines[0].startswith(want),
              f"stderr {err!r}")
        check(f"{name}: no output", out == b"", f"stdout {out[:80]!r}")
        check(f"{name}: no file left", os.listdir(WORK) == [], f"left {os.listdir(WORK)}")
        clear()

print(f"{tally['passed']} passed, {tally['failed']} failed")
sys.exit(1 if tally["failed"] else 0)
