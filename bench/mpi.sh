#!/bin/bash
# SPDX-License-Identifier: GPL-3.0-or-later
# bench/mpi.sh DRAGARC_MPI DRAGARC OUT_JSON [REPEATS]: time a debris footprint (docs/examples/footprint-rocket.json,
# 3 classes x 4000 samples: 12000 flights, about 4 s on one core) with the MPI build (DRAGARC_MPI) under mpirun on 1
# and on 2 processes of one thread each, and with the ordinary build (DRAGARC) on 1 and 2 threads, REPEATS times
# each (default 3), taking turns; write the fastest of each (s: on a machine others share, the run least disturbed
# by them) and the load average before and after as JSON (docs/cluster.md,
# docs/performance.md). Open MPI's mpirun; as root it needs OMPI_ALLOW_RUN_AS_ROOT(_CONFIRM), set here for these
# runs only. bench/run runs it; alone, `bench/report.py --update-mpi docs/performance.md OUT_JSON` puts its numbers
# into docs/performance.md.
set -euo pipefail
mpi_bin=$1 bin=$2 out=$3 n=${4:-3}
cd "$(dirname "$0")/.."
args=(footprint docs/examples/footprint-rocket.json --samples 4000 --json --quiet)
fastest() { sort -g | head -1; }
seconds() { # seconds COMMAND...: the wall time of one run
  local t0 t1
  t0=$(date +%s%N)
  "$@" >/dev/null
  t1=$(date +%s%N)
  awk -v a="$t0" -v b="$t1" 'BEGIN { printf "%.6f\n", (b - a) / 1e9 }'
}
load() { cut -d' ' -f1 /proc/loadavg; }
export OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1
tmp=$(mktemp -d)
trap 'rm -rf -- "$tmp"' EXIT
l0=$(load)
# the runs take turns, round after round, so that a change in the machine's load falls on all of them alike;
# --bind-to none: on a machine others share, a process pinned to one core waits when that core is busy
for _ in $(seq 1 "$n"); do
  OMP_NUM_THREADS=1 seconds mpirun -q --bind-to none -n 1 "$mpi_bin" "${args[@]}" >>"$tmp/p1"
  OMP_NUM_THREADS=1 seconds mpirun -q --bind-to none -n 2 "$mpi_bin" "${args[@]}" >>"$tmp/p2"
  OMP_NUM_THREADS=1 seconds "$bin" "${args[@]}" >>"$tmp/t1"
  OMP_NUM_THREADS=2 seconds "$bin" "${args[@]}" >>"$tmp/t2"
  seconds mpirun -q -n 1 "$mpi_bin" --version >>"$tmp/p0" # mpirun's own start and end
done
l1=$(load)
p1=$(fastest <"$tmp/p1") p2=$(fastest <"$tmp/p2") t1=$(fastest <"$tmp/t1") t2=$(fastest <"$tmp/t2") p0=$(fastest <"$tmp/p0")
# the same bytes on 1 and 2 processes and from the ordinary build (docs/cluster.md says why)
same=true
a=$(OMP_NUM_THREADS=1 mpirun -q -n 2 "$mpi_bin" "${args[@]}" | sha256sum) b=$("$bin" "${args[@]}" | sha256sum)
[ "$a" = "$b" ] || same=false
printf '{"flights": 12000, "rounds": %s, "processes1": %s, "processes2": %s, "mpirun_alone": %s, "threads1": %s, "threads2": %s, "same_bytes": %s, "load_before": %s, "load_after": %s}\n' \
  "$n" "$p1" "$p2" "$p0" "$t1" "$t2" "$same" "$l0" "$l1" >"$out"
cat "$out"
