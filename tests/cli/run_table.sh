#!/usr/bin/env bash
# run_table.sh: end-to-end checks of `dragarc table`: the thread count changes no byte, -o writes the
# same bytes whole, failed rows keep the table and exit 3, every format is well formed.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: run_table.sh DRAGARC_BINARY TESTS_DATA_DIR [PYTHON3]
#
# PYTHON3 (optional) parses the JSON output; without it that check is skipped. Prints "ok NAME" or
# "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed, 2 if it cannot run.
# Temporary files live in one mktemp -d folder, removed on exit.

set -u
export LC_ALL=C

if [ "$#" -lt 2 ]; then
    echo "usage: $0 DRAGARC_BINARY TESTS_DATA_DIR [PYTHON3]" >&2
    exit 2
fi
bin=$1
python=${3:-}
data=$(cd -- "$2" 2>/dev/null && pwd -P) || data=
if [ ! -x "$bin" ] || [ -z "$data" ] || [ ! -f "$data/ball-in-wind.json" ]; then
    echo "$0: needs the dragarc binary and the tests/data folder" >&2
    exit 2
fi
case $bin in /*) ;; *) bin=$PWD/$bin ;; esac
root=$(mktemp -d "${TMPDIR:-/tmp}/dragarc-table.XXXXXX") || exit 2
trap 'rm -rf -- "$root"' EXIT

passed=0
failed=0
check() { # check NAME CONDITION-STATUS [WHY]
    if [ "$2" -eq 0 ]; then
        printf 'ok   %s\n' "$1"
        passed=$((passed + 1))
    else
        printf 'FAIL %s: %s\n' "$1" "${3:-}"
        failed=$((failed + 1))
    fi
}

ball=$data/ball-in-wind.json
# 432 rows: 12 speeds x 9 elevations x 4 heights; heights -0.5 and 0 with a level or downward launch
# cannot start (72 rows, bad input), and 3 slow climbs from -0.5 m peak below the ground (no impact),
# so failed rows are compared too.
vary=(--vary speed=5:60:5 --vary elevation=-30:90:15 --vary height=-0.5:1:0.5)

# 1. The thread count changes no byte.
OMP_NUM_THREADS=1 "$bin" table "$ball" "${vary[@]}" --csv >"$root/t1.csv" 2>"$root/t1.err"
s1=$?
OMP_NUM_THREADS=2 "$bin" table "$ball" "${vary[@]}" --csv >"$root/t2.csv" 2>"$root/t2.err"
s2=$?
OMP_NUM_THREADS=2 OMP_SCHEDULE=static "$bin" table "$ball" "${vary[@]}" --csv >"$root/t3.csv" 2>/dev/null
check "csv with 1 and 2 threads: same bytes" "$(cmp -s "$root/t1.csv" "$root/t2.csv" && cmp -s "$root/t1.csv" "$root/t3.csv"; echo $?)" \
    "$(cmp "$root/t1.csv" "$root/t2.csv" 2>&1 | head -1)"
check "csv with 1 and 2 threads: same stderr" "$(cmp -s "$root/t1.err" "$root/t2.err"; echo $?)"
check "failed rows give exit status 3" "$([ "$s1" -eq 3 ] && [ "$s2" -eq 3 ]; echo $?)" "exit $s1 and $s2"
rows=$(($(wc -l <"$root/t1.csv") - 1))
check "one csv row per combination" "$([ "$rows" -eq 432 ]; echo $?)" "$rows rows"
nfail=$(grep -c ',bad input,' "$root/t1.csv")
check "failed rows stay in the table with their reason" \
    "$([ "$nfail" -eq 72 ] && grep -q ',bad input,launch.height: -0.5 m is below ground.elevation (0 m) and the launch does not climb' "$root/t1.csv"; echo $?)" \
    "$nfail failed rows"
check "stderr counts the failures on one line" \
    "$([ "$(wc -l <"$root/t1.err")" -eq 1 ] && grep -q ': 75 of 432 rows failed, the table says why (first, row 1: ' "$root/t1.err"; echo $?)" \
    "$(head -c 300 "$root/t1.err")"
OMP_NUM_THREADS=2 "$bin" table "$ball" "${vary[@]}" >"$root/h2.txt" 2>/dev/null
OMP_NUM_THREADS=1 "$bin" table "$ball" "${vary[@]}" >"$root/h1.txt" 2>/dev/null
check "human table with 1 and 2 threads: same bytes" "$(cmp -s "$root/h1.txt" "$root/h2.txt"; echo $?)"
wide=$(awk 'length($0) > 100' "$root/h1.txt" | wc -l)
check "human table fits 100 columns" "$([ "$wide" -eq 0 ]; echo $?)" "$wide longer lines"

# 2. The CSV header and its purity.
head -1 "$root/t1.csv" >"$root/header"
want='launch.speed_m_s,launch.elevation_deg,launch.height_m,range_m,downrange_m,crossrange_m,time_of_flight_s,apex_height_m,impact_speed_m_s,impact_angle_deg,impact_energy_J,terminal_speed_m_s,status,message'
check "csv header names the SI units" "$([ "$(cat "$root/header")" = "$want" ]; echo $?)" "$(cat "$root/header")"
check "csv is pure data: no comment lines" "$(! grep -q '^#' "$root/t1.csv"; echo $?)"
fields=$(awk -F, 'NR > 1 && $13 == "ok" { if (NF != 14) bad++ } END { print bad + 0 }' "$root/t1.csv")
check "every flown csv row has 14 fields" "$([ "$fields" -eq 0 ]; echo $?)" "$fields rows differ"

# 3. -o writes the same bytes, whole, and nothing on standard output.
(cd "$root" && OMP_NUM_THREADS=2 "$bin" table "$ball" "${vary[@]}" --csv -o out.csv) >"$root/o.stdout" 2>/dev/null
so=$?
check "-o FILE: the same bytes as standard output" "$(cmp -s "$root/t1.csv" "$root/out.csv"; echo $?)"
check "-o FILE: exit 3 still, empty stdout, no temporary file" \
    "$([ "$so" -eq 3 ] && [ ! -s "$root/o.stdout" ] && [ -z "$(ls "$root" | grep tmp-)" ]; echo $?)"
"$bin" table "$ball" --vary speed=20:40:10 -o "$root/ok.txt" >"$root/ok.stdout" 2>"$root/ok.err"
so=$?
check "a table without failures exits 0 and says nothing on stderr" \
    "$([ "$so" -eq 0 ] && [ ! -s "$root/ok.err" ] && [ ! -s "$root/ok.stdout" ] && grep -q '^Cautions:' "$root/ok.txt"; echo $?)"

# 4. Markdown and JSON.
"$bin" table "$data/downhill-throw.json" --vary speed=20:40:10 --vary height=-1:1:1 --markdown >"$root/t.md" 2>/dev/null
check "markdown: a pipe table with a separator row, failed rows and the cautions" \
    "$(grep -q '^| launch.speed (m/s) | launch.height (m) | range (m) |' "$root/t.md" &&
        grep -q '^| ---: | ---: |' "$root/t.md" && grep -q '| bad input: launch.height: ' "$root/t.md" &&
        grep -q '^- Model limits:' "$root/t.md"; echo $?)"
"$bin" table "$data/downhill-throw.json" --vary speed=20:40:10 --vary height=-1:1:1 --json >"$root/t.json" 2>/dev/null
if [ -n "$python" ]; then
    "$python" - "$root/t.json" <<'EOF'
import json, math, sys
doc = json.load(open(sys.argv[1]))
assert [v["name"] for v in doc["varied"]] == ["launch.speed", "launch.height"], doc["varied"]
rows = doc["rows"]
assert len(rows) == 9 and doc["failed_rows"] == 6, (len(rows), doc["failed_rows"])
assert [r["launch.speed"] for r in rows] == [20, 20, 20, 30, 30, 30, 40, 40, 40]
bad = [r for r in rows if r["status"] != "ok"]
assert all(r["range"] is None and r["error"]["field"] == "launch.height" for r in bad), bad
good = [r for r in rows if r["status"] == "ok"]
assert all(math.isfinite(r["range"]) and "error" not in r for r in good)
assert doc["units"]["impact_angle"] == "degree" and doc["units"]["launch.speed"] == "m/s"
assert doc["cautions"] and doc["cautions"][0].startswith("Model limits")
EOF
    check "json: parses, rows in order, failed rows with null results and the error" $?
else
    printf 'skip json parse (no python given)\n'
fi
check "every format carries the cautions but csv" \
    "$(grep -q '^Cautions:' "$root/h1.txt" && grep -q 'Cautions' "$root/t.md" && grep -q '"cautions"' "$root/t.json" &&
        ! grep -qi 'caution' "$root/t1.csv"; echo $?)"

# 5. The row for the scenario's own values is the scenario's flight. cJSON, which prints the fly JSON,
# settles for 15 digits when they come within DBL_EPSILON (relative) of the double, so compare to that.
"$bin" fly "$ball" --json >"$root/fly.json"
"$bin" table "$ball" --vary speed=40:40:1 --json >"$root/one.json"
range_fly=$(grep '"range"' "$root/fly.json" | head -1 | tr -d ' \t,' | cut -d: -f2)
range_table=$(grep -o '"range": [^,]*' "$root/one.json" | head -1 | cut -d' ' -f2)
check "the base values give the fly result" \
    "$([ -n "$range_fly" ] && awk -v a="$range_fly" -v b="$range_table" 'BEGIN { d = a - b; if (d < 0) d = -d; exit !(d <= 2.3e-16 * b) }'; echo $?)" \
    "fly $range_fly, table $range_table"

printf '%d passed, %d failed\n' "$passed" "$failed"
[ "$failed" -eq 0 ]
