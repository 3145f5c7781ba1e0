#!/usr/bin/env bash
# The absorber's long checks, outside CI (minutes to hours on two cores): an a-cut MnF2
# half-space and plate through the default absorber, 50, 20, 10 and 5 um cells, pulsed and
# cw, below, inside and above the hyperbolic band, 4 ns each; nothing may gain energy or
# tilt more in the absorber than inside (tests/solver/grid/test_absorber_stability.cpp).
# Then the guard on a PML forced on the same half-space (slow growth, stopped early;
# tests/solver/guard/test_growth_guard.cpp) and the MnF2 half-space reflectance against its
# linear response (the issue's targets).
#   tools/absorber-check.sh            all cells
#   tools/absorber-check.sh 20 10      only these cells (um)
# One case, traced (each region's largest tilt over time and where, the envelope along x):
#   TERAYEE_ABSORBER_TRACE=1 TERAYEE_ABSORBER_CELL=50 TERAYEE_ABSORBER_PICK="plate cw 275" \
#     build/terayee_tests -tc="absorbers\, long*" --no-skip -s
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
tests="${TERAYEE_TESTS:-$root/build/terayee_tests}"
cells=("$@")
[ ${#cells[@]} -gt 0 ] || cells=(50 20 10 5)
for c in "${cells[@]}"; do
  echo "== ${c} um"
  TERAYEE_ABSORBER_CELL="$c" "$tests" -tc="absorbers\\, long*" --no-skip -s | grep -E "MESSAGE|energy rise|ERROR|FAILED|passed|failed" || true
done
"$tests" -tc="guard\\, long*" --no-skip -s | grep -E "stopped at|passed|failed" || true
"$tests" -tc="coupled solver: reflectance of an MnF2 half-space*" -s | grep -E "worst|peak|passed|failed"
