#!/usr/bin/env bash
# The shift-reversal study: the crystal at +1 T and at -1 T and the reference run without
# it; the lateral shift of the reflected beam in each, their non-reciprocal (difference) and
# reciprocal (mean) parts, and beside them what `terayee medium` predicts for that beam.
#   scenarios/shift-reversal/run.sh [--fine | --long] [OUT]     (default OUT: runs/shift-reversal)
# --fine: 12.5 um cells (the absorber needs no setting: its sides with the crystal take the
# graded loss, docs/method.md).
# --long: 6.25 um cells for 8 ns, the absorber's long stability run (hours; the same command
# again goes on from the last checkpoint, study-setup.sh).
study=shift-reversal
long_ok=true
. "$(dirname "${BASH_SOURCE[0]}")/../study-setup.sh" "$@"
sets=()
$fine && sets=(--set "grid.cell=12.5 um")
$long && sets=("${long_sets[@]}")
reversed=(--set "bias=[0, 0, -1 T]")

run_scene "$out/plus" "${sets[@]}"
run_scene "$out/minus" "${sets[@]}" "${reversed[@]}"
run_scene "$out/reference" --reference "${sets[@]}"
# the strip y = -0.4 mm lies 0.9 mm before the crystal's face at y = 0.5 mm
"$ty" measure shift "$out/plus" --reference "$out/reference" --map cut --line "y=-0.4 mm" --interface "0.5 mm" \
  --reversed "$out/minus" --reversed-reference "$out/reference" | tee "$out/shift.txt"
for b in plus minus; do
  extra=()
  [ "$b" = minus ] && extra=("${reversed[@]}")
  "$ty" medium "$scene" --medium mnf2 --from "290.7 GHz" --to "290.7 GHz" --count 1 --angle "45 deg" \
    --waist "2.5 mm" --line-distance "0.9 mm" --json "$out/prediction-$b.json" "${extra[@]}" > /dev/null
done
echo
echo "predicted by terayee medium (the beam's angular spectrum through the transfer matrix, on the same line):"
p=$(grep -o '"beam-shift-plus": [-0-9.e]*' "$out/prediction-plus.json" | awk '{print $2 * 1e6}')
m=$(grep -o '"beam-shift-plus": [-0-9.e]*' "$out/prediction-minus.json" | awk '{print $2 * 1e6}')
awk -v p="$p" -v m="$m" 'BEGIN { printf "  +1 T: %.1f um, -1 T: %.1f um; non-reciprocal part %.1f um, reciprocal part %.1f um\n", p, m, p - m, (p + m) / 2 }'

# pictures: a movie of the field and the steady intensity for each bias, and the incident
# and the two reflected beams along the strip, in $out/plus/pictures/ and $out/minus/pictures/
for b in plus minus; do
  "$ty" render "$out/$b" --field Ez --movie "$out/$b/pictures/Ez.mp4" --fps 20
  "$ty" render "$out/$b" --map steady
done
"$ty" render "$out/plus" --plot shift
