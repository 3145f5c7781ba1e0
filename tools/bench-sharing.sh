#!/usr/bin/env bash
# Two runs sharing the machine: times one run alone, then two of the same run started at
# once, and prints the slowdown of each (about 2x on 2 cores is fair sharing; the issue it
# guards against was 20x). A benchmark, not a test: run it on an otherwise idle machine.
#   tools/bench-sharing.sh [SCENE] [extra `terayee run` options, e.g. --threads 2]
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
scene="${1:-$root/tests/data/mnf2-slab.yaml}"
shift || true
bin="${TERAYEE_BIN:-$root/build/terayee}"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
run() { "$bin" run "$scene" -o "$work/$1" --quiet "${@:2}" >/dev/null 2>&1; }
now() { date +%s.%N; }
sub() { awk -v a="$1" -v b="$2" 'BEGIN { printf "%.3f", a - b }'; }
div() { awk -v a="$1" -v b="$2" 'BEGIN { printf "%.1f", a / b }'; }
t0=$(now); run alone "$@"; t1=$(now)
alone=$(sub "$t1" "$t0")
t0=$(now)
( s=$(now); run a "$@"; e=$(now); sub "$e" "$s" > "$work/ta" ) &
( s=$(now); run b "$@"; e=$(now); sub "$e" "$s" > "$work/tb" ) &
wait
ta=$(cat "$work/ta"); tb=$(cat "$work/tb")
printf 'scene %s %s\n' "$(basename "$scene")" "$*"
echo "alone $alone s; two at once $ta s and $tb s ($(div "$ta" "$alone")x and $(div "$tb" "$alone")x)"
