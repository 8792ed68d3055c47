#!/usr/bin/env bash
# run_bad_inputs.sh: run dragarc on every bad scenario (and bad catch-can or track file) of bad_inputs.tsv and every
# usage error of bad_usage.tsv, and check how it fails. A file in bad/ ending in .track.csv is run as
# `dragarc fit VALID FILE --estimate cd` (VALID: the valid base scenario), any other ending in .csv as
# `dragarc uniformity FILE`, any other as `dragarc fly FILE`.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: run_bad_inputs.sh DRAGARC_BINARY TESTS_CLI_DIR
#
# For each case: the exit status, a text that must appear in stderr, exactly one stderr line
# starting "dragarc: ", empty stdout when the case fails, nothing left in the folder the case ran in,
# no new file at a --trajectory path, and no run longer than DRAGARC_TEST_TIMEOUT seconds (default 30).
# Prints "ok NAME" or "FAIL NAME: why" per case, then "N passed, M failed"; exits 1 if any failed,
# 2 if it could not run at all.
#
# Optional environment:
#   DRAGARC_TEST_TIMEOUT  seconds allowed per case (default 30)
#   DRAGARC_TEST_EVERY    run only every Nth case (1st, N+1st, ...; default 1: all), for slow wrappers; the
#                         manifest checks (files listed and present) always run in full
#   DRAGARC_TEST_FIRST    with DRAGARC_TEST_EVERY, start at this case (default 1): EVERY=2 with FIRST=1 and FIRST=2
#                         splits the corpus into two halves that ctest runs side by side
#   DRAGARC_TEST_WRAPPER  command put in front of dragarc, split at spaces, e.g.
#                         "valgrind --error-exitcode=99 -q --leak-check=full"
#
# Needs only bash and coreutils. Temporary files live in one mktemp -d folder, removed on exit.

set -u
export LC_ALL=C
unset DRAGARC_PROFILE_PATH # the profile cases expect the built-in folders only

if [ "$#" -ne 2 ]; then
    echo "usage: $0 DRAGARC_BINARY TESTS_CLI_DIR" >&2
    exit 2
fi

abs_path() { # abs_path PATH: PATH made absolute (the last part need not be a directory)
    local dir base
    case $1 in
    */*) dir=${1%/*} base=${1##*/} ;;
    *) dir=. base=$1 ;;
    esac
    [ -n "$dir" ] || dir=/
    dir=$(cd -- "$dir" 2>/dev/null && pwd -P) || return 1
    if [ -z "$base" ] || [ "$base" = . ]; then
        printf '%s\n' "$dir"
    else
        printf '%s\n' "${dir%/}/$base"
    fi
}

case $1 in
*/*) bin=$(abs_path "$1") || bin= ;;
*) bin=$(command -v -- "$1") || bin= ;;
esac
if [ -z "$bin" ] || [ ! -x "$bin" ] || [ -d "$bin" ]; then
    echo "$0: $1: not an executable dragarc binary" >&2
    exit 2
fi
data=$(cd -- "$2" 2>/dev/null && pwd -P) || data=
if [ -z "$data" ] || [ ! -f "$data/bad_inputs.tsv" ] || [ ! -f "$data/bad_usage.tsv" ] || [ ! -d "$data/bad" ]; then
    echo "$0: $2: not the tests/cli folder (needs bad_inputs.tsv, bad_usage.tsv and bad/)" >&2
    exit 2
fi

limit=${DRAGARC_TEST_TIMEOUT:-30}
every=${DRAGARC_TEST_EVERY:-1}
first=${DRAGARC_TEST_FIRST:-1}
case $every$first in
'' | *[!0-9]* | 0*) echo "$0: DRAGARC_TEST_EVERY and DRAGARC_TEST_FIRST must be positive whole numbers" >&2; exit 2 ;;
esac
case $every in 0) echo "$0: DRAGARC_TEST_EVERY must be positive" >&2; exit 2 ;; esac
wrapper=()
if [ -n "${DRAGARC_TEST_WRAPPER:-}" ]; then
    IFS=' ' read -r -a wrapper <<<"$DRAGARC_TEST_WRAPPER"
fi

root=$(mktemp -d "${TMPDIR:-/tmp}/dragarc-bad-inputs.XXXXXX") || {
    echo "$0: cannot make a temporary folder" >&2
    exit 2
}
trap 'rm -rf -- "$root"' EXIT
trap 'exit 130' INT HUP TERM
mkdir -- "$root/io"
work=$root/work
valid=$root/valid.json

# The valid base scenario every file in bad/ departs from.
cat >"$valid" <<'EOF'
{
  "projectile": {"mass": 0.145, "diameter": 0.074, "drag": {"model": "constant", "cd": 0.35}},
  "launch": {"speed": 40.0, "elevation": 30.0, "azimuth": 0.0, "height": 1.0},
  "environment": {"gravity": 9.80665,
                  "atmosphere": {"model": "isa", "site_elevation": 0.0, "temperature_offset": 0.0},
                  "wind": {"speed": 3.0, "from": 270.0}},
  "ground": {"elevation": 0.0},
  "solver": {"rtol": 1e-9, "atol": 1e-9}
}
EOF

passed=0
failed=0

report() { # report NAME WHY...: one line for the case
    local name=$1
    shift
    if [ "$#" -eq 0 ]; then
        printf 'ok   %s\n' "$name"
        passed=$((passed + 1))
    else
        local why=$1
        shift
        local w
        for w in "$@"; do why="$why; $w"; done
        printf 'FAIL %s: %s\n' "$name" "$why"
        failed=$((failed + 1))
    fi
}

oneline() { # oneline FILE: the file's first 300 bytes on one line, newlines shown as \n
    local text
    text=$(head -c 300 -- "$1")
    text=${text//$'\n'/\\n}
    printf '%s' "${text//$'\t'/\\t}"
}

subst() { # subst TEXT: the tokens replaced
    local t=$1
    t=${t//@DATA@/$data}
    t=${t//@VALID@/$valid}
    t=${t//@WORK@/$work}
    printf '%s' "$t"
}

# run_case NAME STATUS TEXT PREFIX ARG...: run dragarc ARG... in an empty folder and check it.
case_no=0
run_case() {
    local name=$1 want=$2 text=$3 prefix=$4
    shift 4
    case_no=$((case_no + 1))
    if [ "$case_no" -lt "$first" ] || [ $(((case_no - first) % every)) -ne 0 ]; then
        return
    fi
    local -a why=()
    local -a traj=() traj_before=()
    rm -rf -- "$work"
    if ! mkdir -- "$work"; then
        report "$name" "cannot make the work folder $work"
        return
    fi
    local i prev=
    for i in "$@"; do
        if [ "$prev" = --trajectory ]; then
            case $i in /*) traj+=("$i") ;; *) traj+=("$work/$i") ;; esac
            if [ -e "${traj[${#traj[@]} - 1]}" ]; then traj_before+=(1); else traj_before+=(0); fi
        fi
        prev=$i
    done
    local out=$root/io/stdout err=$root/io/stderr
    (cd -- "$work" && exec timeout -k 5 "$limit" ${wrapper[@]+"${wrapper[@]}"} "$bin" "$@") >"$out" 2>"$err" </dev/null
    local got=$?

    if [ "$got" -eq 124 ] || [ "$got" -eq 137 ]; then
        why+=("timed out after $limit s (exit $got), expected exit $want")
    elif [ "$got" -ne "$want" ]; then
        why+=("exit $got, expected $want")
    fi
    local lines
    lines=$(wc -l <"$err")
    if [ ! -s "$err" ]; then
        why+=("stderr is empty")
    elif [ "$lines" -ne 1 ] || [ -n "$(tail -c 1 -- "$err")" ]; then
        why+=("stderr is not exactly one line ($lines newlines)")
    fi
    local msg
    msg=$(head -c 65536 -- "$err")
    if [ -s "$err" ] && [[ $msg != "$prefix"* ]]; then
        why+=("stderr does not start with '$prefix'")
    fi
    if [[ $msg != *"$text"* ]]; then
        why+=("stderr lacks '$text'")
    fi
    if [ "$want" -ne 0 ] && [ -s "$out" ]; then
        why+=("stdout is not empty ($(wc -c <"$out") bytes: $(oneline "$out"))")
    fi
    local left
    left=$(ls -A -- "$work")
    if [ -n "$left" ]; then
        why+=("left files in its folder: ${left//$'\n'/ }")
    fi
    left=$(ls -A -- "$root")
    if [ "$left" != $'io\nvalid.json\nwork' ]; then
        why+=("left files next to its folder: ${left//$'\n'/ }")
    fi
    for i in "${!traj[@]}"; do
        if [ "${traj_before[i]}" = 0 ] && [ -e "${traj[i]}" ]; then
            why+=("created the --trajectory file ${traj[i]}")
        fi
    done
    if [ "${#why[@]}" -gt 0 ]; then
        why+=("stderr was: $(oneline "$err")")
        report "$name" "${why[@]}"
    else
        report "$name"
    fi
    rm -rf -- "$work" "$out" "$err"
}

# read_manifest FILE: the cases of FILE into the arrays m_first, m_status, m_text, m_line
read_manifest() {
    m_first=() m_status=() m_text=() m_line=()
    local n=0 line first status text extra
    while IFS= read -r line || [ -n "$line" ]; do
        n=$((n + 1))
        line=${line%$'\r'}
        case $line in '#'* | '') continue ;; esac
        IFS=$'\t' read -r first status text extra <<<"$line"
        if [ -z "${text:-}" ] || [ -n "${extra:-}" ] || [[ ! $status =~ ^[0-9]+$ ]]; then
            report "${1##*/}:$n" "malformed manifest line (want NAME<TAB>STATUS<TAB>TEXT): $line"
            continue
        fi
        m_first+=("$first") m_status+=("$status") m_text+=("$text") m_line+=("$n")
    done <"$1"
}

# 1. The bad scenarios.
valid_status=0
(cd -- "$root" && exec timeout -k 5 "$limit" "$bin" fly "$valid") >/dev/null 2>"$root/io/stderr" </dev/null ||
    valid_status=$?
if [ "$valid_status" -ne 0 ]; then
    report "base scenario (@VALID@)" "exit $valid_status, expected 0: the cases below no longer differ from a valid scenario" \
        "stderr was: $(oneline "$root/io/stderr")"
fi
rm -f -- "$root/io/stderr"

read_manifest "$data/bad_inputs.tsv"
declare -A listed=()
for i in "${!m_first[@]}"; do
    f=${m_first[i]}
    if [ -n "${listed[$f]:-}" ]; then
        report "$f" "listed twice in bad_inputs.tsv (lines ${listed[$f]} and ${m_line[i]})"
        continue
    fi
    listed[$f]=${m_line[i]}
    path=$data/bad/$f
    if [ ! -f "$path" ]; then
        report "$f" "listed in bad_inputs.tsv but not in bad/"
        continue
    fi
    case $f in
    *.track.csv)
        run_case "$f" "${m_status[i]}" "$(subst "${m_text[i]}")" "dragarc: $path: " fit "$valid" "$path" --estimate cd ;;
    *.csv) run_case "$f" "${m_status[i]}" "$(subst "${m_text[i]}")" "dragarc: uniformity: $path: " uniformity "$path" ;;
    *) run_case "$f" "${m_status[i]}" "$(subst "${m_text[i]}")" "dragarc: $path: " fly "$path" ;;
    esac
done
for path in "$data"/bad/*; do
    [ -e "$path" ] || continue
    f=${path##*/}
    if [ -z "${listed[$f]:-}" ]; then
        report "$f" "in bad/ but not listed in bad_inputs.tsv"
    fi
done

# 2. The usage errors.
read_manifest "$data/bad_usage.tsv"
for i in "${!m_first[@]}"; do
    IFS=' ' read -r -a raw <<<"${m_first[i]}"
    args=()
    for a in "${raw[@]}"; do args+=("$(subst "$a")"); done
    run_case "usage: ${m_first[i]}" "${m_status[i]}" "$(subst "${m_text[i]}")" "dragarc: " "${args[@]}"
done

if [ $((passed + failed)) -eq 0 ]; then
    report "manifests" "no cases found"
fi
printf '%d passed, %d failed\n' "$passed" "$failed"
if [ "$failed" -gt 0 ]; then
    exit 1
fi
exit 0
