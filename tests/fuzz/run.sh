#!/usr/bin/env bash
# run.sh: build the libFuzzer harnesses (if needed) and run each for a bounded time on a copy of its seed corpus.
# SPDX-License-Identifier: GPL-3.0-or-later
#
#   tests/fuzz/run.sh [HARNESS ...]        all harnesses when none is named (tests/fuzz/harnesses.cmake)
#
# Environment: FUZZ_SECONDS (default 50, 5 s a harness) is the time for all the harnesses together, shared evenly;
# FUZZ_BUILD (default build-fuzz in the source tree) is the clang build folder, configured here when it has no
# CMakeCache.txt; FUZZ_KEEP=1 keeps the work folder (grown corpora, logs) even when every harness passed;
# FUZZ_ARGS adds libFuzzer options (e.g. "-detect_leaks=0" for a faster exploring run, whose grown corpus is then
# replayed with leak checks by build-asan/tests/replay_<harness>).
#
# The committed corpus is never written: each harness runs on a copy in a temporary folder, which is removed at
# the end unless something failed (its path is printed). A crash, a leak, a timeout (-timeout=10 s for one input),
# running out of memory (-rss_limit_mb=2048) or any sanitizer report makes libFuzzer exit non-zero and leave the
# input as crash-*, leak-*, timeout-* or oom-* in the work folder; this script then fails. Each harness prints one
# summary line with the executions done; the last line is "fuzz: N passed, M failed".
set -uo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
root="$(cd "$here/../.." && pwd)"
build="${FUZZ_BUILD:-$root/build-fuzz}"
total="${FUZZ_SECONDS:-50}"

harnesses=("$@")
if [ ${#harnesses[@]} -eq 0 ]; then
  # the list in harnesses.cmake is the one source of the names
  read -r -a harnesses < <(sed -n 's/^set(DRAGARC_FUZZ_HARNESSES \(.*\))$/\1/p' "$here/harnesses.cmake")
fi
per=$(( total / ${#harnesses[@]} ))
[ "$per" -ge 1 ] || per=1

if [ ! -f "$build/CMakeCache.txt" ]; then
  mkdir -p "$build"
  CC=clang cmake -S "$root" -B "$build" -DDRAGARC_FUZZ=ON -DBUILD_TESTING=OFF -DCMAKE_BUILD_TYPE=RelWithDebInfo \
    >"$build/configure.log" 2>&1 || { cat "$build/configure.log"; echo "fuzz: configuring $build failed"; exit 2; }
fi
targets=()
for h in "${harnesses[@]}"; do targets+=(--target "fuzz_$h"); done
nice cmake --build "$build" -j2 "${targets[@]}" >"$build/fuzz-build.log" 2>&1 \
  || { tail -40 "$build/fuzz-build.log"; echo "fuzz: building the harnesses failed"; exit 2; }

# UDUNITS-2's own leak on some malformed units (lsan.supp says which); any other leak still fails
export LSAN_OPTIONS="suppressions=$here/lsan.supp${LSAN_OPTIONS:+:$LSAN_OPTIONS}"
work="$(mktemp -d "${TMPDIR:-/tmp}/dragarc-fuzz.XXXXXX")"
passed=0 failed=0
for h in "${harnesses[@]}"; do
  mkdir -p "$work/corpus/$h" "$work/artifacts/$h"
  cp "$here/corpus/$h/"* "$work/corpus/$h/"
  seeds=$(ls "$work/corpus/$h" | wc -l)
  dict=()
  case "$h" in scenario|fly|*_spec) dict=(-dict="$here/json.dict");; esac
  log="$work/$h.log"
  # stdin from /dev/null: a scenario may name any file (a profile, a catalogue), /dev/stdin among them
  (cd "$work" && nice "$build/fuzz/fuzz_$h" -max_total_time="$per" -timeout=10 -rss_limit_mb=2048 \
     -print_final_stats=1 ${FUZZ_ARGS:-} "${dict[@]}" -artifact_prefix="$work/artifacts/$h/" "$work/corpus/$h" \
     </dev/null >"$log" 2>&1)
  rc=$?
  execs=$(sed -n 's/^stat::number_of_executed_units: *//p' "$log" | tail -1)
  grown=$(ls "$work/corpus/$h" | wc -l)
  found=$(ls "$work/artifacts/$h" | wc -l)
  if [ "$rc" -eq 0 ] && [ "$found" -eq 0 ]; then
    passed=$((passed + 1))
    printf 'fuzz_%-20s ok      %10s executions in %3d s, corpus %d -> %d\n' "$h" "${execs:-?}" "$per" "$seeds" "$grown"
  else
    failed=$((failed + 1))
    printf 'fuzz_%-20s FAILED  %10s executions (exit %d); inputs kept in %s\n' "$h" "${execs:-?}" "$rc" \
      "$work/artifacts/$h"
    grep -E -m1 -A30 'ERROR: |runtime error|WARNING: ' "$log" | head -40
  fi
done
if [ "$failed" -eq 0 ] && [ "${FUZZ_KEEP:-0}" != 1 ]; then
  rm -rf "$work"
else
  echo "fuzz: logs, corpora and failing inputs in $work"
fi
echo "fuzz: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
