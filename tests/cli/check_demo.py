#!/usr/bin/python3
# check_demo.py: `dragarc demo` writes its pictures and reports into the folder it names. The folder holds exactly
# the files the demo lists, each a valid SVG (plot_files.py) or a self-contained HTML page with its figures inline;
# a second run replaces them and leaves no temporary file; --no-files writes nothing; the text printed is the same
# with and without files, apart from the closing list.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_demo.py DRAGARC_BINARY
# Prints "ok NAME" or "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed.

import os
import subprocess
import sys
import tempfile

from plot_files import check, tally, validate

BIN = os.path.abspath(sys.argv[1])
ENV = dict(os.environ, LC_ALL="C")
ENV.pop("DRAGARC_PROFILE_PATH", None)
LISTED = "Pictures and reports, written into"


def run(args, cwd):
    p = subprocess.run([BIN, "demo", *args], capture_output=True, env=ENV, cwd=cwd, timeout=300)
    return p.returncode, p.stdout.decode(), p.stderr.decode()


with tempfile.TemporaryDirectory(prefix="dragarc-demo.") as work:
    rc, out, err = run([], work)  # the default folder, in the current folder
    check("default: exit 0, empty stderr", rc == 0 and err == "", f"exit {rc}, stderr {err!r}")
    folder = os.path.join(work, "dragarc-demo")
    names = sorted(os.listdir(folder)) if os.path.isdir(folder) else []
    listed = sorted(line.strip() for line in out.split(LISTED, 1)[-1].splitlines()[1:] if line.startswith("  "))
    expected = sorted(["1-practice-ball.svg", "1-practice-ball-aim.svg", "2-droplet-sizes.svg",
                       "3-fragment-from-3-km.svg", "4-saltmarsh-links.svg", "5-high-mesa-range.svg",
                       "report-saltmarsh-links.html", "6-garden-sprinkler.svg", "7-boom-sprayer-drift.svg",
                       "8-debris-footprint.svg", "report-debris-footprint.html", "9-launcher-ball-fit.svg"])
    check("default: the folder holds what the demo lists", names == listed == expected,
          f"{names} against {listed}, expected {expected}")
    # the fit of the built-in launcher-ball example recovers the values its track was made with
    check("default: the fit case is there and converged", "9. A launcher ball's drag and lift" in out and
          "Levenberg-Marquardt converged" in out, out.split("9. ", 1)[-1][:300])
    check("default: nothing else in the current folder", os.listdir(work) == ["dragarc-demo"], str(os.listdir(work)))
    for name in names:
        path = os.path.join(folder, name)
        if name.endswith(".svg"):
            ok, why = validate(path, "svg")
            check(f"{name}: a valid SVG of plausible size", ok and 10_000 < os.path.getsize(path) < 5_000_000, why)
        else:
            with open(path, encoding="utf-8") as f:
                page = f.read()
            check(f"{name}: a page with its figure inline, no script", page.startswith("<!DOCTYPE html>") and
                  "<svg" in page and "<script" not in page.lower(), page[:60])
    stamp = {n: os.stat(os.path.join(folder, n)).st_mtime_ns for n in names}
    rc2, out2, _ = run(["--out", "dragarc-demo"], work)  # again, into the same folder
    after = sorted(os.listdir(folder))
    check("again: exit 0, the same files, no temporary file", rc2 == 0 and after == names, str(after))
    check("again: the same text", out2 == out, "the output differs")
    check("again: every file replaced", all(os.stat(os.path.join(folder, n)).st_mtime_ns >= stamp[n] for n in names))
    rc3, out3, _ = run(["--no-files"], folder)
    check("--no-files: nothing written", rc3 == 0 and sorted(os.listdir(folder)) == names, str(os.listdir(folder)))
    check("--no-files: the same cases, no closing list", LISTED not in out3 and
          out3.split("Cautions:")[0] == out.split("Cautions:")[0], "the cases differ")

print(f"{tally['passed']} passed, {tally['failed']} failed")
sys.exit(1 if tally["failed"] else 0)
