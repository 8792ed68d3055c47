#!/usr/bin/python3
# check_limits.py: the one line a big run prints before its progress bar. A footprint of 21000 flights (over the
# 20000 of CLI_BIG_RUN, and longer than the second the bar waits) run with stderr on a terminal (a pseudo-terminal) says "dragarc: 21000 flights, about N MB,
# about T on K threads" once, above the bar; the same run with stderr not a terminal, or with --quiet, says nothing;
# and the --points file is the same bytes in every case. A small run (3000 flights) never prints the line.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_limits.py DRAGARC_BINARY SOURCE_DIR
# Prints "ok NAME" or "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed.

import os
import pty
import re
import subprocess
import sys
import tempfile

from plot_files import check, tally

BIN, SRC = os.path.abspath(sys.argv[1]), os.path.abspath(sys.argv[2])
DROP = os.path.join(SRC, "tests", "data", "footprint-drop.json")  # 3 classes, fast flights
ROCKET = os.path.join(SRC, "docs", "examples", "footprint-rocket.json")  # 3 classes, about 1 ms a flight
ENV = dict(os.environ, LC_ALL="C", OMP_NUM_THREADS="2")
PLAN = re.compile(r"^dragarc: (\d+) flights, about [0-9.]+ [kMGT]?B, about [0-9.]+ (s|min|h) on (\d+) threads?$",
                  re.M)


def run(args, work, tty):
    """dragarc ARGS in WORK with stderr on a pseudo-terminal (tty) or a pipe: (returncode, stderr text)."""
    if not tty:
        p = subprocess.run([BIN, *args], cwd=work, env=ENV, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
        return p.returncode, p.stderr.decode()
    master, slave = pty.openpty()
    p = subprocess.Popen([BIN, *args], cwd=work, env=ENV, stdout=subprocess.DEVNULL, stderr=slave)
    os.close(slave)
    chunks = []
    while True:
        try:
            b = os.read(master, 65536)
        except OSError:  # EIO: the terminal's other end closed
            break
        if not b:
            break
        chunks.append(b)
    os.close(master)
    return p.wait(), b"".join(chunks).decode(errors="replace").replace("\r\n", "\n")


with tempfile.TemporaryDirectory() as work:
    big = ["footprint", ROCKET, "--samples", "7000", "--json"]
    rc, tty_err = run([*big, "--points", "tty.csv"], work, True)
    lines = [m for m in PLAN.finditer(tty_err)]
    check("big run on a terminal exits 0", rc == 0, f"exit {rc}: {tty_err[-300:]!r}")
    check("big run on a terminal prints the line once", len(lines) == 1, repr(tty_err[:300]))
    if lines:
        check("the line counts the run's flights", lines[0].group(1) == "21000", lines[0].group(0))
        check("the line names the threads", lines[0].group(3) == "2", lines[0].group(0))
        check("the line comes before the bar", "[" not in tty_err[:tty_err.index(lines[0].group(0))],
              repr(tty_err[:200]))
    rc, pipe_err = run([*big, "--points", "pipe.csv"], work, False)
    check("big run into a pipe exits 0 and is silent", rc == 0 and pipe_err == "", repr(pipe_err[:300]))
    rc, quiet_err = run([*big, "--points", "quiet.csv", "--quiet"], work, True)
    check("big run with --quiet prints nothing", rc == 0 and quiet_err.strip() == "", repr(quiet_err[:300]))
    with open(os.path.join(work, "tty.csv"), "rb") as a, open(os.path.join(work, "pipe.csv"), "rb") as b, \
            open(os.path.join(work, "quiet.csv"), "rb") as c:
        x, y, z = a.read(), b.read(), c.read()
    check("--points the same bytes with and without the line", x == y == z and len(x) > 21000 * 20,
          f"{len(x)}, {len(y)}, {len(z)} bytes")
    rc, small_err = run(["footprint", DROP, "--samples", "1000", "--json"], work, True)
    check("a small run prints no such line", rc == 0 and not PLAN.search(small_err), repr(small_err[:300]))

print(f"{tally['passed']} passed, {tally['failed']} failed")
sys.exit(1 if tally["failed"] else 0)
