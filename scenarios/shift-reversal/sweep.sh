#!/usr/bin/env bash
# The shift-reversal study as a sweep: the lateral shift of the reflected beam against the
# bias along z, from -2 T to +2 T, one run per bias and one shared reference run
# (`terayee sweep`), beside the shift `terayee medium` predicts for this beam at each bias,
# and the plot of both (`terayee render --plot sweep`).
#   scenarios/shift-reversal/sweep.sh [--fine] [OUT]      (default OUT: runs/shift-reversal)
# POINTS=N sets the number of biases (default 5: -2, -1, 0, 1, 2 T); JOBS=N runs N at a
# time (default 1: the cores go to one run). It writes OUT/sweep/ (the sweep: points/,
# references/, results.csv), OUT/sweep/prediction.csv and OUT/sweep/pictures/.
study=shift-reversal
. "$(dirname "${BASH_SOURCE[0]}")/../study-setup.sh" "$@"
points="${POINTS:-5}"
jobs="${JOBS:-1}"
dir="$out/sweep"
sets=()
$fine && sets=(--set "grid.cell=12.5 um")
start=$(date +%s)

# the strip y = -0.4 mm lies 0.9 mm before the crystal's face at y = 0.5 mm (as in run.sh)
"$ty" sweep "$scene" -o "$dir" --vary "bias.2=-2T:2T:$points" --jobs "$jobs" "${sets[@]}" \
  --measure 'shift --reference auto --map cut --line "y=-0.4 mm" --interface "0.5 mm" --angle "45 deg"'

# the prediction at each swept bias: the beam's angular spectrum through the transfer matrix,
# its centroid on the same line (terayee medium --waist --line-distance)
col() { head -1 "$dir/results.csv" | tr ',' '\n' | grep -n -x -F "$1" | cut -d: -f1; }
kb=$(col bias.2)
ks=$(col "shift.run.shift [m]")
echo "bias.2,shift [m]" > "$dir/prediction.csv.tmp"
tail -n +2 "$dir/results.csv" | cut -d, -f"$kb" | while read -r b; do
  "$ty" medium "$scene" --medium mnf2 --from "290.7 GHz" --to "290.7 GHz" --count 1 --angle "45 deg" \
    --waist "2.5 mm" --line-distance "0.9 mm" --set "bias.2=$b" --json "$dir/prediction.json" > /dev/null
  p=$(grep -o '"beam-shift-plus": [-0-9.e+]*' "$dir/prediction.json" | awk '{print $2}')
  echo "$b,$p" >> "$dir/prediction.csv.tmp"
done
rm -f "$dir/prediction.json"
mv "$dir/prediction.csv.tmp" "$dir/prediction.csv"

echo
echo "lateral shift of the reflected beam along t = z x n (um): measured by the sweep, predicted by terayee medium"
awk -F, -v kb="$kb" -v ks="$ks" 'NR == FNR { if (FNR > 1) p[FNR] = $2; next }
  FNR > 1 { printf "  bias %6s: measured %7.1f, predicted %7.1f\n", $kb, $ks * 1e6, p[FNR] * 1e6 }' \
  "$dir/prediction.csv" "$dir/results.csv"
echo "took $(( $(date +%s) - start )) s"

"$ty" render "$dir" --plot sweep --x bias.2 --y shift.run.shift --predicted "$dir/prediction.csv"
