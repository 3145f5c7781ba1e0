#!/usr/bin/env bash
# The speed issue's figures as medians of alternating rounds (a benchmark, not a test: run it
# on an otherwise idle machine; the host's own noise is +-25% run to run). Each round runs, one
# after the other: the yardstick's one-pass vacuum kernel (`yee_f64 N const fused`, built from
# ../shared/yardstick into a temporary folder: a ruler run beside terayee, not part of it),
# `terayee bench --case vacuum` one-pass and blocked (--block-depth auto), and the magnetic and
# tilted cases (their cost in one-pass vacuum cells, as bench prints it). Prints each round and
# then the medians: blocked / yardstick (target >= 2.0), magnetic and tilted cost (targets
# <= 2.5 and <= 10).
#   tools/bench-yardstick.sh [ROUNDS (7)] [SIZES ("1024 4096")] [THREADS (2)]
# TERAYEE_BIN picks another terayee; YARDSTICK_DIR a folder where the yardstick is built.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
rounds="${1:-7}" sizes="${2:-1024 4096}" threads="${3:-2}"
bin="${TERAYEE_BIN:-$root/build/terayee}"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
yard="${YARDSTICK_DIR:-}"
if [ -z "$yard" ]; then
  cp -r "$root/../shared/yardstick" "$work/yardstick"
  make -s -C "$work/yardstick" yee_f64 >/dev/null
  yard="$work/yardstick"
fi
# the value after KEY= on the last line that has it (terayee: cell_updates_per_s=, in cells/s;
# the yardstick: mcells_per_s=, in Mcell/s), and bench's "N.NNx the cost" figure
value() {
  local v
  v=$(grep -o "$1=[0-9.e+-]*" | tail -n 1 | cut -d= -f2) || true
  [ -n "$v" ] || { echo "bench-yardstick: no $1= in the output" >&2; exit 1; }
  echo "$v"
}
cost() {
  local v
  v=$(grep -o '[0-9.]*x the cost' | head -n 1 | cut -dx -f1) || true
  [ -n "$v" ] || { echo "bench-yardstick: no 'x the cost' in bench's output" >&2; exit 1; }
  echo "$v"
}
median() { sort -g | awk '{ v[NR] = $1 } END { print (NR % 2 ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2) }'; }
bench() { "$bin" bench --size "$1" --threads "$threads" --seconds 0.5 "${@:2}"; }
for n in $sizes; do
  echo "== ${n}^2, $threads threads, $rounds rounds (Mcell/s; cost in one-pass vacuum cells)"
  for ((r = 1; r <= rounds; ++r)); do
    y=$(OMP_NUM_THREADS="$threads" "$yard/yee_f64" "$n" const fused | value mcells_per_s)
    one=$(bench "$n" --case vacuum | value cell_updates_per_s)
    blk=$(bench "$n" --case vacuum --block-depth auto | value cell_updates_per_s)
    mag=$(bench "$n" --case magnetic | cost)
    tlt=$(bench "$n" --case tilted | cost)
    awk -v y="$y" -v o="$one" -v b="$blk" -v m="$mag" -v t="$tlt" 'BEGIN {
      printf "round %d: yardstick %.0f, one-pass %.0f, blocked %.0f (%.2fx the yardstick), magnetic %.2fx, tilted %.2fx\n",
             '"$r"', y, o / 1e6, b / 1e6, b / 1e6 / y, m, t
    }'
    awk -v y="$y" -v b="$blk" -v m="$mag" -v t="$tlt" 'BEGIN { printf "%.4f %s %s\n", b / 1e6 / y, m, t }' \
      >> "$work/rounds-$n"
  done
  col() { awk -v k="$1" '{ print $k }' "$work/rounds-$n" | median; }
  echo "median: blocked / yardstick $(col 1)x (target >= 2.0), magnetic $(col 2)x (<= 2.5), tilted $(col 3)x (<= 10)"
done
