#!/usr/bin/env bash
# The long validations, outside CI: the bundled studies (negative refraction, slab lens,
# bias-flipped shift, TDS of an MnF2 slab, Otto ATR of a biased MnF2 crystal) at their
# default settings, or with --fine at 12.5 um cells (about 45 minutes on 2 cores). Each
# prints its measurements beside the predictions and ends with its pictures; see
# scenarios/*/README.md for the numbers they should print.
# --long: the three studies whose crystals run through the absorbers (negative refraction,
# slab lens, shift reversal) at 6.25 um cells for 8 ns, the absorber's long stability run
# (about 7 hours on 2 cores); a checkpoint every 10 minutes, and the same command again
# goes on where it stopped (docs/method.md, "Long runs").
#   tools/run-studies.sh [--fine | --long] [OUT]      (default OUT: runs/studies, runs/studies-fine or -long)
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
mode=()
studies=(negative-refraction slab-lens shift-reversal tds-mnf2-slab otto-atr)
if [ "${1:-}" = "--fine" ]; then mode=(--fine); shift; fi
if [ "${1:-}" = "--long" ]; then
  mode=(--long)
  studies=(negative-refraction slab-lens shift-reversal)
  shift
fi
out="${1:-$root/runs/studies${mode[0]:+-${mode[0]#--}}}"  # runs/studies, studies-fine, studies-long
for s in "${studies[@]}"; do
  echo "=== $s"
  "$root/scenarios/$s/run.sh" "${mode[@]}" "$out/$s"
done
