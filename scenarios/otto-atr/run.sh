#!/usr/bin/env bash
# The Otto ATR study: a sweep over the Bloch wavenumber k_x (both signs) of the prism / gap /
# biased crystal bench, the reflectance of one broadband pulse per k_x against its reference
# run (all prism), and the map R(f, k_x) (`terayee render --plot bloch-map`); it prints R(+k_x)
# and R(-k_x), each beside the 4x4 transfer matrix's R of the same stack (`terayee medium --stack`,
# also in OUT/predicted+.csv and predicted-.csv and overlaid on each point's pictures/spectrum.png);
# the study's test (tests/scenarios/test_otto_atr.cpp) compares them.
#   scenarios/otto-atr/run.sh [--surface] [--fine] [OUT]
# Default (otto-atr.yaml, MnF2: bulk magnon-polaritons): k_x = -13620 and +13620 rad/m
# (2.5 k0 at 260 GHz), 20 um cells, a few seconds; OUT defaults to runs/otto-atr.
# --fine: 10 um cells and POINTS wavenumbers over -13620..13620 rad/m (default 9), a few minutes.
# --surface (otto-atr-fef2.yaml, FeF2: the surface magnon-polariton): k_x = -40000 and +40000
# rad/m, 5 um cells, 2 ns runs, under a minute; with --fine 2.5 um cells, a few minutes; OUT
# defaults to runs/otto-atr-fef2.
study=otto-atr
surface=false
if [ "${1:-}" = "--surface" ]; then surface=true; study=otto-atr-fef2; shift; fi
. "$(dirname "${BASH_SOURCE[0]}")/../study-setup.sh" "$@"
sets=()
if $surface; then
  k=40000
  vary="grid.bloch.wavenumber=-$k:$k:2"
  if $fine; then sets=(--set "grid.cell=2.5 um"); fi
else
  k=13620
  vary="grid.bloch.wavenumber=-$k:$k:2"
  if $fine; then
    sets=(--set "grid.cell=10 um")
    vary="grid.bloch.wavenumber=-$k:$k:${POINTS:-9}"  # both ends are always points
  fi
fi
rm -rf "$out/points" "$out/references" "$out/pictures"  # the study's own folders, from a previous run
mkdir -p "$out"
"$ty" sweep "$scene" -o "$out" --vary "$vary" "${sets[@]}" --measure 'spectrum --reference auto' --jobs 1 \
  > "$out/sweep.log" 2>&1 || { cat "$out/sweep.log" >&2; exit 1; }
"$ty" render "$out" --plot bloch-map > /dev/null
spectrum() { ls -d "$out"/points/*"wavenumber=$1" | head -1; }
plus=$(spectrum $k)
minus=$(spectrum -$k)
# the 4x4 transfer matrix's R of the same stack at each sign (`terayee medium --stack`, at the
# power-spectrum line's frequencies), and each sign's spectrum plot with it overlaid
for sign in + -; do
  kk=$k; [ "$sign" = - ] && kk=-$k
  "$ty" medium "$scene" --stack "${sets[@]}" --set "grid.bloch.wavenumber=$kk" --csv "$out/predicted$sign.csv" \
    > "$out/predicted$sign.txt" || { cat "$out/predicted$sign.txt" >&2; exit 1; }
  point=$plus; [ "$sign" = - ] && point=$minus
  "$ty" render "$point" --plot spectrum --predicted "$out/predicted$sign.csv" > /dev/null
done
# columns: f, R(+k_x) measured, R(+k_x) 4x4, R(-k_x) measured, R(-k_x) 4x4 (the reflectance columns)
table() {
  paste -d, <(cut -d, -f1,2 "$plus/spectrum.csv") <(cut -d, -f3 "$out/predicted+.csv") \
    <(cut -d, -f2 "$minus/spectrum.csv") <(cut -d, -f3 "$out/predicted-.csv")
}
header='    f/GHz   R(+k_x)   4x4(+k_x)   R(-k_x)   4x4(-k_x)'
row='{ printf "%9.1f   %7.3f   %9.3f   %7.3f   %9.3f\n", $1 / 1e9, $2, $3, $4, $5 }'
if $surface; then
  # every 5 GHz, and every 0.5 GHz over the two surface-mode dips
  echo "R at k_x = +$k and -$k rad/m (1.23 k0 at 1548 GHz), measured and from the 4x4 transfer matrix:"
  echo "$header"
  table | awk -F, 'NR > 1 { f = $1 / 1e9
    if ((NR - 2) % 10 == 0 || (f > 1546.9 && f < 1549.1) || (f > 1609.9 && f < 1612.1)) '"$row"' }'
else
  echo "R at k_x = +$k and -$k rad/m (2.5 k0 at 260 GHz), measured and from the 4x4 transfer matrix, every 5 GHz:"
  echo "$header"
  table | awk -F, 'NR > 1 && (NR - 2) % 5 == 0 '"$row"
fi
