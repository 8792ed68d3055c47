#!/usr/bin/python3
# check_locale.py: dragarc's output does not depend on the locale. A German locale (decimal comma, "1.234,5") is
# built with localedef into a temporary folder, and the same commands run under LC_ALL=C and under it must write the
# same bytes: the fly summary and JSON, a table as CSV, a footprint as JSON and its points, a trajectory, values read
# with units ("0,5" is not a number in a scenario either way: JSON and dragarc's own number syntax use ".").
# The program never calls setlocale, so it runs in the "C" locale whatever the environment says; PLplot sets
# LC_NUMERIC to "C" for itself. Skipped (exit 77) when localedef or the locale's sources are missing.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_locale.py DRAGARC_BINARY SOURCE_DIR
# Prints "ok NAME" or "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed.

import os
import shutil
import subprocess
import sys
import tempfile

from plot_files import check, tally

BIN, SRC = os.path.abspath(sys.argv[1]), os.path.abspath(sys.argv[2])
DATA = os.path.join(SRC, "tests", "data")
EXAMPLES = os.path.join(SRC, "docs", "examples")

COMMANDS = [
    ("fly summary", ["fly", os.path.join(DATA, "ball-in-wind.json")], None),
    ("fly --json, US units", ["fly", os.path.join(DATA, "batted-ball-us.json"), "--json", "--units", "us"], None),
    ("fly --trajectory", ["fly", os.path.join(DATA, "ball-in-wind.json"), "--trajectory", "t.csv", "--dt", "0.1"],
     "t.csv"),
    ("table --csv", ["table", os.path.join(DATA, "sprinkler-drops.json"), "--vary", "diameter=0.0005:0.002:0.0005",
                     "--csv", "--quiet"], None),
    ("aim --range with a unit", ["aim", os.path.join(DATA, "courtyard-lob.json"), "--range", "20.5 m", "--json"], None),
    ("footprint --json --points", ["footprint", os.path.join(EXAMPLES, "footprint-rocket.json"), "--samples", "40",
                                   "--json", "--quiet", "--points", "p.csv"], "p.csv"),
    ("drift --json", ["drift", os.path.join(EXAMPLES, "drift-boom.json"), "--json"], None),
]

with tempfile.TemporaryDirectory(prefix="dragarc-locale.") as work:
    locpath = os.path.join(work, "locales")
    os.mkdir(locpath)
    made = shutil.which("localedef") and subprocess.run(
        ["localedef", "-i", "de_DE", "-f", "UTF-8", os.path.join(locpath, "de_DE.UTF-8")],
        capture_output=True).returncode in (0, 1)  # 1: made, with warnings
    env_de = dict(os.environ, LOCPATH=locpath, LC_ALL="de_DE.UTF-8", LANG="de_DE.UTF-8")
    probe = subprocess.run([sys.executable, "-c", "import locale; locale.setlocale(locale.LC_ALL, ''); "
                            "print(locale.localeconv()['decimal_point'])"], capture_output=True, text=True,
                           env=env_de) if made else None
    if not made or probe.returncode != 0 or probe.stdout.strip() != ",":
        print("0 passed, 0 failed (no German locale could be built: localedef or the locales package is missing)")
        sys.exit(77)
    check("the German locale is in force for a program that asks for it (decimal comma)", True)
    env_c = dict(os.environ, LC_ALL="C")
    for env in (env_c, env_de):
        env.pop("DRAGARC_PROFILE_PATH", None)
    for name, args, out_file in COMMANDS:
        results = []
        for tag, env in (("C", env_c), ("de", env_de)):
            d = os.path.join(work, tag)
            os.makedirs(d, exist_ok=True)
            p = subprocess.run([BIN, *args], capture_output=True, env=env, cwd=d, timeout=300)
            body = open(os.path.join(d, out_file), "rb").read() if out_file and p.returncode == 0 else b""
            results.append((p.returncode, p.stdout, p.stderr, body))
        (rc_c, out_c, err_c, f_c), (rc_de, out_de, err_de, f_de) = results
        check(f"{name}: exit 0 in both", rc_c == 0 and rc_de == 0, f"{rc_c}, {rc_de}: {err_de!r}")
        check(f"{name}: the same bytes under de_DE.UTF-8", out_c == out_de and err_c == err_de and f_c == f_de,
              "the outputs differ")

print(f"{tally['passed']} passed, {tally['failed']} failed")
sys.exit(1 if tally["failed"] else 0)
