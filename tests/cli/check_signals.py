#!/usr/bin/python3
# check_signals.py: an interrupted run leaves no partial file. dragarc is stopped by SIGINT, SIGTERM and SIGHUP
# while it is writing (the signal is sent once its temporary file has appeared, so it lands mid-write, not by
# luck of timing) and while it is computing: each time it ends by that signal, says so in one line on stderr,
# leaves no temporary file and no output file, and a file already at the destination stays as it was.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_signals.py DRAGARC_BINARY SOURCE_DIR
# Prints "ok NAME" or "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed.

import os
import signal
import subprocess
import sys
import tempfile
import time

from plot_files import check, tally


BIN, SRC = sys.argv[1], sys.argv[2]
BALL = os.path.join(SRC, "tests", "data", "ball-in-wind.json")
ROCKET = os.path.join(SRC, "docs", "examples", "footprint-rocket.json")
ENV = dict(os.environ, LC_ALL="C")
ENV.pop("DRAGARC_PROFILE_PATH", None)
MESSAGE = "dragarc: stopped by a signal; files not yet complete were removed"


def stop(args, work, sig, when):
    """Start dragarc ARGS in WORK, wait for `when` (a function of the folder's names that says the moment has
    come, or a number of seconds), send sig; return (returncode, stderr, whether the moment came before the end)."""
    p = subprocess.Popen([BIN, *args], cwd=work, env=ENV, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
    came = False
    t0 = time.monotonic()
    while p.poll() is None and time.monotonic() - t0 < 60:
        if callable(when) and when(os.listdir(work)) or not callable(when) and time.monotonic() - t0 >= when:
            came = True
            break
        time.sleep(0.005)
    if p.poll() is None:
        p.send_signal(sig)
    try:
        _, err = p.communicate(timeout=60)
    except subprocess.TimeoutExpired:
        p.kill()
        _, err = p.communicate()
    return p.returncode, err.decode("utf-8", "replace"), came


def writing(names):  # a temporary output file exists: dragarc is writing
    return any(".tmp-" in n for n in names)


for sig in (signal.SIGINT, signal.SIGTERM, signal.SIGHUP):
    name = signal.Signals(sig).name
    with tempfile.TemporaryDirectory() as work:
        with open(os.path.join(work, "path.csv"), "w") as f:
            f.write("kept\n")
        # a long trajectory (0.2 million rows) and its plot: the trajectory's temporary file is open from its first
        # row until the plot is drawn, several seconds
        rc, err, came = stop(["fly", BALL, "--trajectory", "path.csv", "--dt", "2e-5", "--plot", "path.svg"], work,
                             sig, writing)
        names = sorted(os.listdir(work))
        check(f"{name} while writing: the signal came mid-write", came, "the run ended before a temporary file showed")
        check(f"{name} while writing: ends by the signal", rc == -sig, f"return code {rc}")
        check(f"{name} while writing: one line on stderr", err == MESSAGE + "\n", repr(err))
        check(f"{name} while writing: no temporary or new file", names == ["path.csv"], str(names))
        with open(os.path.join(work, "path.csv")) as f:
            check(f"{name} while writing: the file in place is untouched", f.read() == "kept\n")

with tempfile.TemporaryDirectory() as work:
    # 30 000 debris flights: seconds of work before any output is opened
    rc, err, _ = stop(["footprint", ROCKET, "--samples", "5000", "--points", "p.csv", "--geojson", "f.geojson",
                       "--quiet"], work, signal.SIGTERM, 0.5)
    check("SIGTERM while computing: ends by the signal", rc == -signal.SIGTERM, f"return code {rc}")
    check("SIGTERM while computing: one line on stderr", err == MESSAGE + "\n", repr(err))
    check("SIGTERM while computing: no file", os.listdir(work) == [], str(os.listdir(work)))

# a run that is not interrupted is unaffected: both files whole
with tempfile.TemporaryDirectory() as work:
    p = subprocess.run([BIN, "fly", BALL, "--trajectory", "t.csv", "--plot", "t.svg"], cwd=work, env=ENV,
                       capture_output=True, timeout=60)
    check("uninterrupted: exit 0 and both files", p.returncode == 0 and sorted(os.listdir(work)) == ["t.csv", "t.svg"],
          f"{p.returncode} {os.listdir(work)}")

print(f"{tally['passed']} passed, {tally['failed']} failed")
sys.exit(1 if tally["failed"] else 0)
