#!/usr/bin/env bash
# No lost work, tested the hard way (outside CI; a few minutes):
#   tools/kill-test.sh [ROUNDS]     kill -9 a run at random steps ROUNDS times (default 6), once
#                                   inside a checkpoint write and once on each side of the final
#                                   rename, `terayee run --resume` after each, then compare every
#                                   dataset of fields.h5 bit for bit with a straight run (h5diff)
#   tools/kill-test.sh --disk-full  a resumed run under `ulimit -f` (a file-size limit) fails at
#                                   its next checkpoint with a clear message and exit 1; the last
#                                   checkpoint is unchanged, and a resume then ends with the same bits
# Uses build/terayee (tools/setup.sh) and installs hdf5-tools (h5diff) if it is missing.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
ty="$root/build/terayee"
scene="$root/scenarios/window-beam.yaml"
sets=(--threads 2 --set time.stop=30ps --set outputs.0.snapshots.every=2ps --checkpoint-steps 40 --quiet)
work="$(mktemp -d "${TMPDIR:-/tmp}/terayee-kill-test.XXXXXX")"
trap 'rm -rf "$work"' EXIT
if ! command -v h5diff >/dev/null; then
  echo "kill-test: installing hdf5-tools (h5diff)" >&2
  sudo=""
  [ "$(id -u)" -eq 0 ] || sudo="sudo"
  $sudo apt-get update -qq && DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq hdf5-tools >/dev/null
fi
[ -x "$ty" ] || { echo "kill-test: build first (tools/setup.sh)" >&2; exit 2; }

run() { # run DIR [ENV...] -- extra args; prints the exit status
  local dir="$1"; shift
  local envs=()
  while [ "$#" -gt 0 ] && [ "$1" != "--" ]; do envs+=("$1"); shift; done
  shift || true
  set +e
  env "${envs[@]}" "$ty" run "$scene" -o "$dir" "${sets[@]}" "$@" >>"$work/log" 2>&1
  local rc=$?
  set -e
  echo "$rc"
}

compare() { # every dataset, bit for bit (h5diff without tolerances compares exactly)
  h5diff -r "$work/straight/fields.h5" "$1/fields.h5" >"$work/diff" 2>&1 || {
    cat "$work/diff" >&2
    echo "kill-test: FAILED: $1/fields.h5 differs from the straight run" >&2
    exit 1
  }
}

[ "$(run "$work/straight" --)" = 0 ] || { echo "kill-test: the straight run failed" >&2; exit 1; }
steps=$(python3 -c "import json;print(json.load(open('$work/straight/summary.json'))['steps'])")

if [ "${1:-}" = "--disk-full" ]; then
  d="$work/full"
  [ "$(run "$d" -- --stop-at-step 100)" = 0 ]
  before=$(md5sum <"$d/checkpoint.h5")
  size=$(stat -c %s "$d/checkpoint.h5")
  # a limit of half a checkpoint: the next checkpoint cannot be written
  rc=$(ulimit -f $((size / 2048)); run "$d" -- --resume)
  [ "$rc" = 1 ] || { echo "kill-test: expected exit 1 on a full disk, got $rc" >&2; exit 1; }
  grep -q "disk full" "$work/log" || { echo "kill-test: no disk-full message" >&2; exit 1; }
  grep "disk full" "$work/log" | tail -1
  [ "$(md5sum <"$d/checkpoint.h5")" = "$before" ] || { echo "kill-test: the checkpoint changed" >&2; exit 1; }
  [ "$(run "$d" -- --resume)" = 0 ]
  compare "$d"
  echo "kill-test: disk full: exit 1 with a message, checkpoint intact, resumed to the same bits"
  exit 0
fi

rounds="${1:-6}"
d="$work/killed"
kills=("checkpoint:2" "result" "renamed")
for ((k = 0; k < rounds; ++k)); do kills+=("step:$((RANDOM % steps + 1))"); done
kills=($(printf '%s\n' "${kills[@]}" | shuf))
first=1
for at in "${kills[@]}"; do
  args=(--resume)
  [ "$first" = 1 ] && args=()
  rc=$(run "$d" TERAYEE_KILL_AT="$at" -- "${args[@]}")
  first=0
  echo "kill-test: killed at $at: exit $rc"
  # a kill after the run completed (a step past the end, or after a finished run) is no kill
  if [ "$rc" = 0 ]; then compare "$d"; rm -rf "$d"; first=1; fi
done
[ "$first" = 1 ] || { [ "$(run "$d" -- --resume)" = 0 ] && compare "$d"; }
echo "kill-test: every resumed run has the bits of the straight run (${#kills[@]} kills)"
