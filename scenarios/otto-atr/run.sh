#!/usr/bin/env bash
# The Otto ATR study: a sweep over the Bloch wavenumber k_x (both signs) of the prism / gap /
# biased MnF2 bench, the reflectance of one broadband pulse per k_x against its reference run
# (all prism), and the map R(f, k_x) (`terayee render --plot bloch-map`); it prints R(+k_x) and
# R(-k_x) every 5 GHz. The 4x4 transfer matrix's R of the same stack is the study's test
# (tests/scenarios/test_otto_atr.cpp), which prints both.
#   scenarios/otto-atr/run.sh [--fine] [OUT]      (default OUT: runs/otto-atr)
# Default: k_x = -13620 and +13620 rad/m (2.5 k0 at 260 GHz), 20 um cells, a few seconds.
# --fine: 10 um cells and POINTS wavenumbers over -13620..13620 rad/m (default 9), a few minutes.
study=otto-atr
. "$(dirname "${BASH_SOURCE[0]}")/../study-setup.sh" "$@"
sets=()
vary="grid.bloch.wavenumber=-13620:13620:2"
if $fine; then
  sets=(--set "grid.cell=10 um")
  vary="grid.bloch.wavenumber=-13620:13620:${POINTS:-9}"  # both ends are always points
fi
rm -rf "$out/points" "$out/references" "$out/pictures"  # the study's own folders, from a previous run
mkdir -p "$out"
"$ty" sweep "$scene" -o "$out" --vary "$vary" "${sets[@]}" --measure 'spectrum --reference auto' --jobs 1 \
  > "$out/sweep.log" 2>&1 || { cat "$out/sweep.log" >&2; exit 1; }
"$ty" render "$out" --plot bloch-map > /dev/null
spectrum() { ls -d "$out"/points/*"wavenumber=$1" | head -1; }
plus=$(spectrum 13620)
minus=$(spectrum -13620)
echo "R at k_x = +13620 and -13620 rad/m (2.5 k0 at 260 GHz), every 5 GHz:"
paste -d, "$plus/spectrum.csv" "$minus/spectrum.csv" |
  awk -F, 'NR > 1 && (NR - 2) % 5 == 0 { printf "%7.1f GHz   R(+k_x) = %.3f   R(-k_x) = %.3f\n", $1 / 1e9, $2, $4 }'
