#!/usr/bin/python3
# check_plots_spray.py: `dragarc sprinkler --plot` and `dragarc drift --plot` end to end. Each format is written,
# valid and of a plausible size, with no temporary file left; plotting never changes the numbers (--json, the
# summary and the --csv/--grid files are byte for byte those of a run without --plot); a bad extension and a folder
# that does not exist each give one error line, exit status 2, and leave no file behind (no CSV either).
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_plots_spray.py DRAGARC_BINARY PROJECT_SOURCE_DIR
# Prints "ok NAME" or "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed.
# The formats' signatures are those checked by check_plots.py (SVG 1.1 root element, PNG signature and IHDR of
# ISO 15948, PDF header and trailer of ISO 32000-1:2008).

import os
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from plot_files import VALIDATORS, check, tally


def run(*args):  # dragarc ARGS... in WORK
    e = dict(os.environ, LC_ALL="C")
    p = subprocess.run([BIN, *args], capture_output=True, env=e, cwd=WORK, timeout=300)
    return p.returncode, p.stdout, p.stderr.decode("utf-8", "replace")


if len(sys.argv) != 3:
    print("usage: check_plots_spray.py DRAGARC_BINARY PROJECT_SOURCE_DIR", file=sys.stderr)
    sys.exit(2)
BIN = os.path.abspath(sys.argv[1])
SRC = os.path.abspath(sys.argv[2])

COMMANDS = {
    "sprinkler": (os.path.join(SRC, "docs", "examples", "sprinkler-garden.json"), ["--csv", "--grid"]),
    "drift": (os.path.join(SRC, "docs", "examples", "drift-boom.json"), ["--csv"]),
}
VALID = VALIDATORS

with tempfile.TemporaryDirectory(prefix="dragarc-spray-plots.") as WORK:
    for cmd, (scenario, file_opts) in COMMANDS.items():
        rc0, json0, err0 = run(cmd, scenario, "--json")
        check(f"{cmd} --json runs", rc0 == 0 and err0 == "", f"exit {rc0}, stderr {err0!r}")
        # 1. every format with --json: valid, plausible, stderr empty, the JSON unchanged, nothing else left
        for ext, valid in VALID.items():
            name = f"{cmd}.{ext}"
            rc, out, err = run(cmd, scenario, "--json", "--plot", name)
            path = os.path.join(WORK, name)
            check(f"{cmd} {ext}: exit 0 and empty stderr", rc == 0 and err == "", f"exit {rc}, stderr {err!r}")
            check(f"{cmd} {ext}: the --json output is unchanged", out == json0, "it differs")
            if not os.path.exists(path):
                check(f"{cmd} {ext}: the file exists", False, "missing")
                continue
            size = os.path.getsize(path)
            # a page of two or three panels of lines, text and (sprinkler) a colour map: more than an empty page
            check(f"{cmd} {ext}: plausible size", 5_000 < size < 5_000_000, f"{size} bytes")
            ok, why = valid(path)
            check(f"{cmd} {ext}: valid {ext.upper()}", ok, why)
            check(f"{cmd} {ext}: no temporary file left", sorted(os.listdir(WORK)) == [name], f"{os.listdir(WORK)}")
            os.remove(path)
        # 2. the summary and the CSV files with and without --plot
        a = [x for o in file_opts for x in (o, f"a{o[2:]}.csv")]
        b = [x for o in file_opts for x in (o, f"b{o[2:]}.csv")]
        rc, text0, _ = run(cmd, scenario, *a)
        rc1, text1, err1 = run(cmd, scenario, *b, "--plot", "p.svg")
        check(f"{cmd}: summary and files with --plot: exit 0, empty stderr", rc1 == 0 and err1 == "",
              f"exit {rc1}, stderr {err1!r}")
        check(f"{cmd}: the summary is unchanged by --plot", text1 == text0, "it differs")
        for o in file_opts:
            fa, fb = (os.path.join(WORK, f"{p}{o[2:]}.csv") for p in "ab")
            same = os.path.exists(fa) and os.path.exists(fb) and open(fa, "rb").read() == open(fb, "rb").read()
            check(f"{cmd}: the {o} file is unchanged by --plot", same, "it differs or is missing")
        for f in os.listdir(WORK):
            os.remove(os.path.join(WORK, f))
        # 3. failures: one line on stderr, exit 2, nothing on stdout, no file left (the CSV is not written either)
        cases = [
            ("a bad extension", ["--plot", "plot.gif"],
             f"dragarc: {cmd}: --plot: 'plot.gif' ends in '.gif': a plot is drawn into an .svg, .png or .pdf file"),
            ("a folder that does not exist", ["--plot", "no/such/plot.svg"],
             "dragarc: --plot: cannot write no/such/plot.svg: No such file or directory"),
        ]
        for name, args, want in cases:
            rc, out, err = run(cmd, scenario, "--csv", "c.csv", *args)
            lines = err.splitlines()
            check(f"{cmd}, {name}: exit 2", rc == 2, f"exit {rc}")
            check(f"{cmd}, {name}: one stderr line", len(lines) == 1 and lines[0].startswith(want), f"stderr {err!r}")
            check(f"{cmd}, {name}: no output", out == b"", f"stdout {out[:80]!r}")
            check(f"{cmd}, {name}: no file left", os.listdir(WORK) == [], f"left {os.listdir(WORK)}")

print(f"{tally['passed']} passed, {tally['failed']} failed")
sys.exit(1 if tally["failed"] else 0)
