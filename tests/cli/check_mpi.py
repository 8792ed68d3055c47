#!/usr/bin/env python3
# check_mpi.py: the MPI build (DRAGARC_MPI) under `mpirun -n 1`, `-n 2` and `-n 4` (4 oversubscribed on a small
# machine) writes the same bytes as the ordinary build on one process: footprint (JSON, summary, --points, --grid,
# --geojson, --plot), footprint with a population file, table (JSON with failed rows, CSV file), a campaign (every
# file of its folder); more
# processes than flights or rows; bad input (exit 2, one line on stderr, no file); a failure on one process in the
# middle of a run (exit 3, one line, no file, no process left waiting); a command that is not distributed.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# Usage: check_mpi.py MPI_DRAGARC SERIAL_DRAGARC MPIEXEC SOURCE_DIR WORK_DIR
#
# SERIAL_DRAGARC is the ordinary build's binary (built without MPI). Open MPI's mpirun is run with -q (no notices of
# its own, so that stderr holds dragarc's lines alone) and --oversubscribe; as root it needs OMPI_ALLOW_RUN_AS_ROOT
# and OMPI_ALLOW_RUN_AS_ROOT_CONFIRM, which are set here for these runs only. Each process runs one OpenMP thread.
# Prints "ok NAME" or "FAIL NAME: why", then "N passed, M failed"; exits 1 if any failed, 2 if it cannot run.
import json
import os
import shutil
import subprocess
import sys

passed = failed = 0
RANKS = (1, 2, 4)


def check(ok, name, why=""):
    global passed, failed
    if ok:
        passed += 1
        print(f"ok   {name}")
    else:
        failed += 1
        print(f"FAIL {name}: {why}")


def main():
    if len(sys.argv) != 6:
        print(__doc__ or "usage: check_mpi.py MPI_DRAGARC SERIAL_DRAGARC MPIEXEC SOURCE_DIR WORK_DIR", file=sys.stderr)
        return 2
    mpi_bin, serial_bin, mpiexec, src, work = sys.argv[1:]
    for b in (mpi_bin, serial_bin):
        if not os.access(b, os.X_OK):
            print(f"check_mpi.py: no binary at {b} (SERIAL_DRAGARC is the build without MPI: build it first, or set "
                  "DRAGARC_SERIAL_CLI)", file=sys.stderr)
            return 2
    shutil.rmtree(work, ignore_errors=True)
    os.makedirs(work)
    # SOURCE_DATE_EPOCH: the campaign report's footer gives this date, not the moment of each run
    env = dict(os.environ, OMP_NUM_THREADS="1", OMPI_ALLOW_RUN_AS_ROOT="1", OMPI_ALLOW_RUN_AS_ROOT_CONFIRM="1",
               LC_ALL="C", SOURCE_DATE_EPOCH="1767225600")
    env.pop("DRAGARC_MPI_TEST_FAULT", None)
    examples, data = os.path.join(src, "docs", "examples"), os.path.join(src, "tests", "data")

    def run(ranks, args, outs=(), extra_env=None, tag=None):
        """Run dragarc ARGS in a folder of its own (the serial binary when ranks is 0, else mpirun -n ranks); the
        output file names in outs are relative to that folder. Returns (status, stdout, stderr, {name: bytes})."""
        d = os.path.join(work, tag or f"{'serial' if ranks == 0 else f'n{ranks}'}-{run.count}")
        run.count += 1
        os.makedirs(d)
        cmd = [serial_bin] if ranks == 0 else [mpiexec, "-q", "--oversubscribe", "-n", str(ranks), mpi_bin]
        r = subprocess.run(cmd + args, capture_output=True, cwd=d, env=dict(env, **(extra_env or {})), timeout=300)
        files = {}
        for o in outs:
            p = os.path.join(d, o)
            if os.path.isdir(p):  # a folder: every file in it, by its path
                files[o] = {os.path.relpath(os.path.join(w, f), p): open(os.path.join(w, f), "rb").read()
                            for w, _, fs in os.walk(p) for f in fs}
            else:
                files[o] = open(p, "rb").read() if os.path.exists(p) else None
        return r.returncode, r.stdout, r.stderr, files

    run.count = 0

    def same_as_serial(name, args, outs=(), ranks=RANKS, want_status=0):
        ref = run(0, args, outs)
        check(ref[0] == want_status, f"{name}: the serial run exits {want_status}", f"exit {ref[0]}: {ref[2][-300:]!r}")
        for o in outs:
            check(ref[3][o] is not None and len(ref[3][o]) > 0, f"{name}: the serial run writes {o}")
        for p in ranks:
            got = run(p, args, outs)
            diffs = [w for w, a, b in (("exit status", ref[0], got[0]), ("stdout", ref[1], got[1]),
                                       ("stderr", ref[2], got[2])) if a != b]
            diffs += [o for o in outs if ref[3][o] != got[3][o]]
            check(not diffs, f"{name}: mpirun -n {p} gives the same bytes", f"differ: {', '.join(diffs)}; "
                  f"stderr {got[2][-300:]!r}")
        return ref

    rocket = os.path.join(examples, "footprint-rocket.json")
    # footprint: every output, 3 classes x 40 samples (120 flights dealt to 1, 2 and 4 processes)
    same_as_serial("footprint outputs", ["footprint", rocket, "--samples", "40", "--json", "--points", "p.csv", "--grid", "g.csv",
                                         "--geojson", "f.geojson", "--plot", "f.svg", "--quiet"],
                   ("p.csv", "g.csv", "f.geojson", "f.svg"))
    same_as_serial("footprint summary", ["footprint", rocket, "--samples", "17", "--seed", "5"], ranks=(3,))
    ref = run(0, ["footprint", rocket, "--samples", "40", "--json"])
    doc = json.loads(ref[1]) if ref[0] == 0 else {}
    check(doc.get("all", {}).get("expected_casualties", 0) > 0, "footprint: the compared run has an E_c above 0",
          str(doc.get("all", {}).get("expected_casualties")))

    # a population from a file (read by rank 0 alone), with E_c
    scen = json.load(open(rocket))
    scen["hazard"] = {"population": {"file": os.path.join(data, "population", "grid.csv"), "background": 20},
                      "criterion": 1e-4}
    pop = os.path.join(work, "rocket-population.json")
    json.dump(scen, open(pop, "w"))
    same_as_serial("footprint with a population file", ["footprint", pop, "--samples", "25", "--json"], ranks=(2,))

    # more processes than flights: 3 flights on 4 processes (one flies none)
    same_as_serial("footprint, 4 processes for 3 flights", ["footprint", rocket, "--samples", "1", "--json"], ranks=(4,))

    # table: failed rows (exit 3, their reasons in the JSON, the same line on stderr); a CSV file
    throw = os.path.join(data, "downhill-throw.json")
    t = ["table", throw, "--vary", "speed=20:40:10", "--vary", "height=-1:1:1", "--json"]
    same_as_serial("table with failed rows", t, want_status=3)
    drops = os.path.join(data, "sprinkler-drops.json")
    same_as_serial("table CSV file", ["table", drops, "--vary", "diameter=0.0005:0.002:0.0005", "--vary",
                                      "wind_speed=0:4:1", "--csv", "-o", "t.csv"], ("t.csv",))
    same_as_serial("table, 4 processes for 3 rows", ["table", throw, "--vary", "speed=20:40:10"], ranks=(4,))
    # a command that is not shared: rank 0 runs it alone
    same_as_serial("fly on rank 0 alone", ["fly", os.path.join(data, "ball-in-wind.json"), "--json"], ranks=(2,))

    # a campaign: each case's flights shared among the processes, every file of the folder the same
    ref = same_as_serial("campaign", ["campaign", os.path.join(examples, "campaign-ascent.json"), "--out", "c",
                                      "--samples", "12", "--quiet"], ("c",))
    check(isinstance(ref[3]["c"], dict) and len(ref[3]["c"]) == 13, "campaign: 13 files compared",
          sorted(ref[3]["c"] or {}))

    # bad input: every process reads it, rank 0 alone says so, all exit 2, no file
    bad = dict(scen, breakup=dict(scen["breakup"], altitude=-5))
    badp = os.path.join(work, "bad-altitude.json")
    json.dump(bad, open(badp, "w"))
    camp_bad = os.path.join(work, "bad-campaign.json")
    json.dump({"scenario": rocket, "cases": [{}, {"set": {"breakup": {"altitude": -5}}}]}, open(camp_bad, "w"))
    for name, args in (("a missing scenario", [os.path.join(work, "none.json")]),
                       ("a bad breakup altitude", [badp]),
                       ("a bad --vary", ["table", throw, "--vary", "speed=1:2:0"]),
                       ("an unknown option", ["--frobnicate", rocket]),
                       ("a campaign's case", ["campaign", camp_bad, "--out", "c"])):
        args = (args + ["-o", "t.csv"] if args[0] == "table" else args if args[0] == "campaign"
                else ["footprint"] + args + ["--points", "p.csv"])
        ref = run(0, args, ("p.csv", "t.csv", "c"))
        got = run(4, args, ("p.csv", "t.csv", "c"))
        lines = got[2].decode(errors="replace").splitlines()
        check(got[0] == 2 and ref[0] == 2, f"bad input, {name}: exit 2 under mpirun -n 4", f"exit {got[0]}")
        check(len(lines) == 1 and got[2] == ref[2], f"bad input, {name}: one line on stderr, the serial one",
              repr(got[2][-400:]))
        check(all(v is None for v in got[3].values()) and not got[1], f"bad input, {name}: no output")

    # one process fails in the middle of the run: all end with exit 3, one line on stderr, nothing written
    for p, rank, args, out in ((2, 1, [rocket, "--samples", "20", "--json", "--points", "p.csv"], "p.csv"),
                               (4, 3, ["table", throw, "--vary", "speed=20:40:5", "--csv", "-o", "t.csv"], "t.csv"),
                               (4, 0, [rocket, "--samples", "20", "--grid", "g.csv"], "g.csv")):
        args = args if args[0] == "table" else ["footprint"] + args
        got = run(p, args, (out,), {"DRAGARC_MPI_TEST_FAULT": str(rank)})
        lines = got[2].decode(errors="replace").splitlines()
        what = f"{args[0]}, process {rank} of {p} fails"
        check(got[0] == 3, f"{what}: every process exits 3", f"exit {got[0]}: {got[2][-300:]!r}")
        check(len(lines) == 1 and "made on purpose" in lines[0], f"{what}: its one line reaches stderr", repr(lines))
        check(got[3][out] is None and not got[1], f"{what}: no output")

    print(f"{passed} passed, {failed} failed")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
