#!/bin/bash
# SPDX-License-Identifier: GPL-3.0-or-later
# bench/patterns.sh DRAGARC OUT_JSON [REPEATS]: time a full wind-distorted sprinkler pattern (40 drop classes x 72
# directions, with evaporation), a 40-class drift profile and a debris footprint (3 classes x 2000 samples), each on
# 2 threads and on 1 (the reference: the same flights one after another), REPEATS times (default 5); write the
# medians (s) as JSON.
set -euo pipefail
bin=$1 out=$2 n=${3:-5}
cd "$(dirname "$0")/.."
median() { sort -g | awk '{a[NR] = $1} END {print (NR % 2) ? a[(NR + 1) / 2] : (a[NR / 2] + a[NR / 2 + 1]) / 2}'; }
time_it() { # time_it THREADS ARGS...: median wall time of n runs, in seconds
  local threads=$1; shift
  for _ in $(seq 1 "$n"); do
    local t0 t1
    t0=$(date +%s%N)
    OMP_NUM_THREADS=$threads "$bin" "$@" --json >/dev/null
    t1=$(date +%s%N)
    awk -v a="$t0" -v b="$t1" 'BEGIN { printf "%.6f\n", (b - a) / 1e9 }'
  done | median
}
s2=$(time_it 2 sprinkler docs/examples/sprinkler-garden.json)
s1=$(time_it 1 sprinkler docs/examples/sprinkler-garden.json)
d2=$(time_it 2 drift docs/examples/drift-boom.json)
d1=$(time_it 1 drift docs/examples/drift-boom.json)
f2=$(time_it 2 footprint docs/examples/footprint-rocket.json --samples 2000 --quiet)
f1=$(time_it 1 footprint docs/examples/footprint-rocket.json --samples 2000 --quiet)
printf '{"sprinkler": {"threads2": %s, "threads1": %s, "flights": 2880}, "drift": {"threads2": %s, "threads1": %s, "flights": 40}, "footprint": {"threads2": %s, "threads1": %s, "flights": 6000}}\n' \
  "$s2" "$s1" "$d2" "$d1" "$f2" "$f1" >"$out"
cat "$out"
