#!/usr/bin/env bash
# The long validations, outside CI: the bundled studies (negative refraction, slab lens,
# bias-flipped shift, TDS of an MnF2 slab, Otto ATR of a biased MnF2 crystal) at their default settings, or with --fine at 12.5 um cells (about 45
# minutes on 2 cores). Each prints its measurements beside the predictions and ends with its
# pictures; see scenarios/*/README.md for the numbers they should print.
#   tools/run-studies.sh [--fine] [OUT]      (default OUT: runs/studies)
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
fine=()
if [ "${1:-}" = "--fine" ]; then fine=(--fine); shift; fi
out="${1:-$root/runs/studies}"
for s in negative-refraction slab-lens shift-reversal tds-mnf2-slab otto-atr; do
  echo "=== $s"
  "$root/scenarios/$s/run.sh" "${fine[@]}" "$out/$s"
done
