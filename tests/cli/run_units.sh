#!/usr/bin/env bash
# run_units.sh: values with units at the command line and in scenario files give the same results as the
# same values in SI units, to the last digit printed (docs/units.md).
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: run_units.sh DRAGARC_BINARY TESTS_DATA_DIR
#
# The unit factors are the exact definitions of NIST Special Publication 811 (2008), appendix B (1 ft =
# 0.3048 m, 1 yd = 0.9144 m, 1 mph = 0.44704 m/s, 1 oz = 0.028349523125 kg, 1 in = 0.0254 m, a difference
# of 1 degF = 5/9 K); the SI twins below were converted by hand with them. Prints "ok NAME" or
# "FAIL NAME: why" per check, then "N passed, M failed"; exits 1 if any failed, 2 if it cannot run.

set -u
export LC_ALL=C

if [ "$#" -ne 2 ]; then
    echo "usage: $0 DRAGARC_BINARY TESTS_DATA_DIR" >&2
    exit 2
fi
bin=$1
data=$(cd -- "$2" 2>/dev/null && pwd -P) || data=
if [ ! -x "$bin" ] || [ -z "$data" ] || [ ! -f "$data/batted-ball-us.json" ]; then
    echo "$0: needs the dragarc binary and the tests/data folder" >&2
    exit 2
fi
root=$(mktemp -d "${TMPDIR:-/tmp}/dragarc-units.XXXXXX") || exit 2
trap 'rm -rf -- "$root"' EXIT

passed=0 failed=0
check() { # check NAME: compares $root/a and $root/b, which must both exist and be equal
    if [ ! -s "$root/a" ] || [ ! -s "$root/b" ]; then
        echo "FAIL $1: no output ($(head -c 200 "$root/err" 2>/dev/null))"
        failed=$((failed + 1))
    elif ! cmp -s "$root/a" "$root/b"; then
        echo "FAIL $1: outputs differ: $(diff "$root/a" "$root/b" | head -4 | tr '\n' ' ')"
        failed=$((failed + 1))
    else
        echo "ok $1"
        passed=$((passed + 1))
    fi
}

# A scenario in US units and its SI twin: the same flight, every printed digit (the name line aside).
"$bin" fly "$data/batted-ball-us.json" 2>"$root/err" | tail -n +2 >"$root/a"
"$bin" fly "$data/batted-ball-si.json" 2>"$root/err" | tail -n +2 >"$root/b"
check "fly: batted ball in US units = its SI twin (human summary)"
"$bin" fly "$data/batted-ball-us.json" --json 2>"$root/err" | grep -v '"scenario"' >"$root/a"
"$bin" fly "$data/batted-ball-si.json" --json 2>"$root/err" | grep -v '"scenario"' >"$root/b"
check "fly --json: batted ball in US units = its SI twin, all 17 digits"

# Command-line values with units.
# 25 yd is 22.860000000000003 m in doubles (0.9144 has no exact binary form), so the aim search may take
# another flight or two; the solutions must agree to every digit printed.
"$bin" aim "$data/courtyard-lob.json" --range "25 yd" --height "2 ft" 2>"$root/err" | grep -v "flights flown" >"$root/a"
"$bin" aim "$data/courtyard-lob.json" --range 22.86 --height 0.6096 2>"$root/err" | grep -v "flights flown" >"$root/b"
check "aim --range \"25 yd\" --height \"2 ft\" = --range 22.86 --height 0.6096 (the solutions as printed)"
"$bin" table "$data/ball-in-wind.json" --vary "speed=60 mph:100 mph:20 mph" --vary "temperature_offset=0 degF:18 degF:9 degF" --csv \
    2>"$root/err" >"$root/a"
"$bin" table "$data/ball-in-wind.json" --vary speed=26.8224:44.704:8.9408 --vary temperature_offset=0:10:5 --csv \
    2>"$root/err" >"$root/b"
check "table --vary with mph and degF differences = the same table in m/s and K"
"$bin" table "$data/courtyard-lob.json" --ranges "10 yd:20 yd:5 yd" 2>"$root/err" >"$root/a"
"$bin" table "$data/courtyard-lob.json" --ranges 9.144:18.288:4.572 2>"$root/err" >"$root/b"
check "table --ranges in yards = the same aim table in metres (as printed)"
"$bin" atmosphere "35 kft" "-1000 ft" --temperature-offset "-9 degF" 2>"$root/err" >"$root/a"
"$bin" atmosphere 10668 -304.8 --temperature-offset -5 2>"$root/err" >"$root/b"
check "atmosphere \"35 kft\" \"-1000 ft\" --temperature-offset \"-9 degF\" = 10668 -304.8 --temperature-offset -5"
"$bin" fly "$data/ball-in-wind.json" --trajectory "$root/a" --dt "100 ms" 2>"$root/err" >/dev/null
"$bin" fly "$data/ball-in-wind.json" --trajectory "$root/b" --dt 0.1 2>"$root/err" >/dev/null
check "fly --dt \"100 ms\" = --dt 0.1"

# Output units: the same flight shown in feet, yards and mph, against the SI result converted by the same
# exact factors (awk's doubles; the human summary prints two decimals, the JSON all 17 digits).
m=$("$bin" fly "$data/batted-ball-si.json" --json | awk -F'\t' '$3 == "\"range\":" {sub(/,$/, "", $4); print $4; exit}')
printf '  range           %.2f ft\n' "$(awk -v m="$m" 'BEGIN {printf "%.17g", m / 0.3048}')" >"$root/b"
"$bin" fly "$data/batted-ball-si.json" --units us 2>"$root/err" | awk '/^  range / {print $1, $2, $3}' |
    sed 's/^/  /; s/range /range           /' >"$root/a"
check "fly --units us: the range in feet is the SI range / 0.3048"
# dragarc multiplies by UDUNITS-2's factor 1/0.9144, awk divides by 0.9144: a few units in the last place apart.
echo "within 1e-15" >"$root/b"
"$bin" fly "$data/batted-ball-si.json" --unit range=yd --json 2>"$root/err" |
    awk -F'\t' -v m="$m" '$3 == "\"range\":" {sub(/,$/, "", $4); d = $4 - m / 0.9144; if (d < 0) d = -d;
        if (d <= 1e-15 * $4) print "within 1e-15"; else printf "%.17g against %.17g\n", $4, m / 0.9144; exit}' >"$root/a"
check "fly --unit range=yd --json: the range in yards is the SI range / 0.9144"
"$bin" fly "$data/batted-ball-si.json" --units us --unit range=yd --json 2>"$root/err" |
    awk -F'\t' '$3 ~ /^"(range|downrange|impact_speed|impact_energy)":$/ && $4 ~ /^"/ {print $3, $4}' >"$root/a"
printf '%s\n' '"range": "yd",' '"downrange": "ft",' '"impact_speed": "mph",' '"impact_energy": "ft.lbf",' >"$root/b"
check "fly --units us --unit range=yd --json: the units object names each value's unit"
"$bin" fly "$data/ball-in-wind.json" --units us --trajectory "$root/t.csv" 2>"$root/err" >/dev/null
head -1 "$root/t.csv" >"$root/a"
echo "t_s,x_ft,y_ft,z_ft,vx_mph,vy_mph,vz_mph,speed_mph,mach,reynolds,spin_rpm,spin_factor,cl,cd,diameter_ft" >"$root/b"
check "fly --units us --trajectory: the column names carry the units"

# atmosphere --units us: each column of the SI table times its exact factor, to the 5 or 6 digits printed
# (1 ft = 0.3048 m; T/degF = 1.8 T/K - 459.67; 1 psi = 6894.757293168 Pa (NIST SP 811: 6.894 757 E+03);
# 1 lb/ft3 = 16.01846337 kg/m3; 1 mph = 0.44704 m/s; 1 lb/(ft s) = 1.488163944 Pa s).
"$bin" atmosphere 0 5000 11000 >"$root/si" 2>"$root/err"
"$bin" atmosphere 0 5000 11000 --units us >"$root/us" 2>"$root/err"
tail -n +3 "$root/si" >"$root/si.rows"
tail -n +3 "$root/us" >"$root/us.rows"
# Both tables are rounded as printed, so each column is held to its printed resolution: 0.05 ft, 0.002 degF
# (0.0005 K x 1.8, twice), 0.003 mph (0.0005 m/s / 0.44704, twice), 1e-5 and 2e-4 relative for the
# 6- and 5-digit columns.
paste -d' ' "$root/si.rows" "$root/us.rows" | awk '
    function abs(x) { return x < 0 ? -x : x }
    { bad = abs($7 - $1 / 0.3048) > 0.06 || abs($8 - ($2 * 1.8 - 459.67)) > 0.002 ||
            abs($9 - $3 / 6894.757293168) > 1e-5 * $9 || abs($10 - $4 / 16.01846337) > 1e-5 * $10 ||
            abs($11 - $5 / 0.44704) > 0.003 || abs($12 - $6 / 1.488163944) > 2e-4 * $12
      print bad ? "row " NR " differs: " $0 : "ok" }' >"$root/a"
printf 'ok\nok\nok\n' >"$root/b"
check "atmosphere --units us: ft, degF, psi, lb/ft3, mph and lb/(ft s) by the exact factors"
"$bin" aim "$data/courtyard-lob.json" --range "25 yd" --units us --json 2>"$root/err" |
    awk -F'\t' '$3 ~ /^"(range|speed|miss|max_range|impact_energy)":$/ && $4 ~ /^"/ {print $3, $4}' >"$root/a"
printf '%s\n' '"range": "ft",' '"speed": "mph",' '"impact_energy": "ft.lbf",' '"miss": "ft",' '"max_range": "ft",' >"$root/b"
check "aim --units us --json: the units object names each value's unit"

# table --units us: the varied values come back in the unit they were given in, every column follows, and
# the rows are the same flights as in SI (the range in feet is the SI range / 0.3048, to 1e-15).
"$bin" table "$data/ball-in-wind.json" --vary "speed=60 mph:100 mph:20 mph" --units us --csv 2>"$root/err" >"$root/us.csv"
"$bin" table "$data/ball-in-wind.json" --vary "speed=60 mph:100 mph:20 mph" --csv 2>"$root/err" >"$root/si.csv"
head -1 "$root/us.csv" | cut -d, -f1-3,9 >"$root/a"
echo "launch.speed_mph,range_ft,downrange_ft,impact_energy_ft_lbf" >"$root/b"
check "table --units us --csv: the column names carry the units"
paste -d, "$root/si.csv" "$root/us.csv" | tail -n +2 | awk -F, '
    function abs(x) { return x < 0 ? -x : x }
    { n = NF / 2; bad = abs($(n + 2) - $2 / 0.3048) > 1e-15 * $(n + 2) || abs($(n + 7) - $7 / 0.44704) > 1e-15 * $(n + 7)
      print $(n + 1), bad ? "differs" : "ok" }' >"$root/a"
printf '60 ok\n80 ok\n100 ok\n' >"$root/b"
check "table --units us: 60, 80, 100 mph as given; range and impact speed = the SI values by the exact factors"

# An aim table in yards: the ranges come back as asked (10, 15, 20 yd), the solutions are those of the SI
# table for the same ranges (elevations in degrees, the impact speed / 0.44704 to 1e-15).
"$bin" table "$data/courtyard-lob.json" --ranges "10 yd:20 yd:5 yd" --units us --unit range=yd --csv 2>"$root/err" >"$root/us.csv"
"$bin" table "$data/courtyard-lob.json" --ranges "10 yd:20 yd:5 yd" --csv 2>"$root/err" >"$root/si.csv"
paste -d, "$root/si.csv" "$root/us.csv" | tail -n +2 | awk -F, '
    function abs(x) { return x < 0 ? -x : x }
    { n = NF / 2; bad = $(n + 2) != $2 || abs($(n + 6) - $6 / 0.44704) > 1e-15 * $(n + 6)
      print $(n + 1), bad ? "differs" : "ok" }' >"$root/a"
printf '10 ok\n15 ok\n20 ok\n' >"$root/b"
check "table --ranges in yards --units us --unit range=yd: ranges as asked, the same launches as in SI"

echo "$passed passed, $failed failed"
[ "$failed" -eq 0 ]
