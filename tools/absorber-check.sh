#!/usr/bin/env bash
# The absorber's long checks, outside CI (minutes to hours on two cores): MnF2 half-spaces
# and plates through the default absorber -- a-cut (hyperbolic band), c-cut (negative-mu)
# and c-cut under 0.2 T (gyrotropic) -- at 50, 20, 10 and 5 um cells, pulsed and cw,
# below, inside and above the band, 4 ns each; nothing may gain energy after the pulse, nor
# tilt more in the layer than the interior did (tests/solver/grid/test_absorber_stability.cpp,
# docs/method.md). Then the guard on a PML forced on the same half-space (slow growth,
# stopped early; tests/solver/guard/test_growth_guard.cpp) and the MnF2 half-space
# reflectance against its linear response (the issue's targets). Run one case at a time:
# each takes both cores.
#   tools/absorber-check.sh            all cells
#   tools/absorber-check.sh 20 10      only these cells (um)
# TERAYEE_ABSORBER_PICK keeps the cases whose names hold each of its words and none of its
# words written with a leading "-" ("c-cut plate -T": the unbiased c-cut plates). A case's
# carrier is its name's last word as printed ({:g}): 250, 262.5, 275, and for the biased
# crystal the middle of its band, 257.077 ("c-cut 0.2 T half-space cw -250 -275" picks it too).
# Run each case as its own process when writing to a file: the MESSAGE lines come out only
# when the process ends (stdout to a file is block-buffered).
# One case, traced (each region's largest tilt over time and where, the envelope along x):
#   TERAYEE_ABSORBER_TRACE=1 TERAYEE_ABSORBER_CELL=50 TERAYEE_ABSORBER_PICK="a-cut plate cw 275" \
#     build/terayee_tests -tc="absorbers\, long*" --no-skip -s
# The 10^6-step half-space (an hour or more at 5 um, alone):
#   TERAYEE_ABSORBER_CELL=5 TERAYEE_ABSORBER_STEPS=1000000 TERAYEE_ABSORBER_PICK="a-cut half-space pulse 262.5" \
#     build/terayee_tests -tc="absorbers\, long*" --no-skip -s
# TERAYEE_ABSORBER_KIND=pml forces the PML on every side, to see what the default avoids.
# Spread over several sittings (the 5 um half-spaces take 25 min each on two cores, about
# 50 min on one): one process per case, its log and verdict kept in DIR; the same command
# again skips the cases that ended and those another queue is running, so two queues (one
# per core, e.g. under `taskset -c 0` and `-c 1`) share the list; a case stopped from outside
# (kill, Ctrl-C) records no verdict and starts over, while a crash or SIGKILL (the
# out-of-memory killer) is a failure (tests/scripts/absorber-queue.sh):
#   tools/absorber-check.sh --queue DIR [cells]     DIR/SUMMARY: each case's verdict
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
tests="${TERAYEE_TESTS:-$root/build/terayee_tests}"
if [ "${1:-}" = "--queue" ]; then
  [ $# -ge 2 ] || { echo "usage: tools/absorber-check.sh --queue DIR [cells in um]" >&2; exit 2; }
  dir="$2"
  shift 2
  mkdir -p "$dir"
  cells=("$@")
  [ ${#cells[@]} -gt 0 ] || cells=(50 20 10 5)
  for c in "${cells[@]}"; do
    mapfile -t names < <(TERAYEE_ABSORBER_CELL="$c" TERAYEE_ABSORBER_LIST=1 "$tests" -tc="absorbers\\, long*" --no-skip |
      sed -n 's/^case: //p')
    [ ${#names[@]} -gt 0 ] || { echo "no cases at $c um (is $tests built?)" >&2; exit 1; }
    for n in "${names[@]}"; do
      key="$dir/${c}um $n"
      [ -e "$key.passed" ] || [ -e "$key.failed" ] && continue
      # claimed by a running queue? (a claim whose process is gone is stale: take it over)
      if [ -e "$key.running" ]; then
        kill -0 "$(cat "$key.running")" 2>/dev/null && continue
        rm -f "$key.running"
      fi
      (set -C && echo $$ > "$key.running") 2>/dev/null || continue  # made at once, or another queue's
      if [ -e "$key.passed" ] || [ -e "$key.failed" ]; then  # ended while we looked
        rm -f "$key.running"
        continue
      fi
      echo "== $c um, $n ($(date +%T))"
      rc=0
      TERAYEE_ABSORBER_CELL="$c" TERAYEE_ABSORBER_NAME="$n" "$tests" -tc="absorbers\\, long*" --no-skip -s \
        > "$key.log" 2>&1 || rc=$?
      # a case stopped from outside (kill, Ctrl-C, a hang-up: killed by SIGTERM, SIGINT or
      # SIGHUP, or doctest reporting it caught one) has no verdict: its claim goes, and the next
      # queue runs it again. Any other end is the case's verdict: a crash (SIGSEGV, SIGABRT) and
      # SIGKILL (the out-of-memory killer; kill -9 too) fail it, and the log says which signal.
      verdict=failed
      if [ $rc -eq 0 ]; then verdict=passed
      elif [ $rc -eq 129 ] || [ $rc -eq 130 ] || [ $rc -eq 143 ] ||
        grep -qE "CRASHED: SIG(TERM|INT|HUP)" "$key.log"; then verdict=""
      elif [ $rc -gt 128 ]; then
        echo "ended by signal $((rc - 128)) ($(kill -l $((rc - 128)) 2>/dev/null || echo '?')); 9 is the out-of-memory killer's (or kill -9)" >> "$key.log"
      fi
      [ -z "$verdict" ] || touch "$key.$verdict"
      rm -f "$key.running"
      echo "   ${verdict:-stopped from outside, no verdict (the next queue runs it again)} ($(date +%T))"
    done
  done
  (cd "$dir" && for f in *.passed *.failed; do if [ -e "$f" ]; then echo "${f%.*}: ${f##*.}"; fi; done) | sort > "$dir/SUMMARY"
  cat "$dir/SUMMARY"
  exit 0
fi
cells=("$@")
[ ${#cells[@]} -gt 0 ] || cells=(50 20 10 5)
for c in "${cells[@]}"; do
  echo "== ${c} um"
  TERAYEE_ABSORBER_CELL="$c" "$tests" -tc="absorbers\\, long*" --no-skip -s | grep -E "MESSAGE|energy rise|ERROR|FAILED|passed|failed" || true
done
"$tests" -tc="guard\\, long*" --no-skip -s | grep -E "stopped at|passed|failed" || true
"$tests" -tc="coupled solver: reflectance of an MnF2 half-space*" -s | grep -E "worst|peak|passed|failed"
