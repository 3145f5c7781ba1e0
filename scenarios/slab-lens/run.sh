#!/usr/bin/env bash
# The slab-lens study: run the scene, find the focus behind the plate, and print it beside
# the prediction from the source's angular spectrum through the plate's transfer matrix.
#   scenarios/slab-lens/run.sh [--fine | --long] [OUT]     (default OUT: runs/slab-lens)
# --fine: 12.5 um cells, to see the focus and spot converge (the absorber needs no setting:
# its sides with the crystal take the graded loss, docs/method.md).
# --long: 6.25 um cells for 8 ns, the absorber's long stability run (hours; the same command
# again goes on from the last checkpoint, study-setup.sh).
study=slab-lens
long_ok=true
. "$(dirname "${BASH_SOURCE[0]}")/../study-setup.sh" "$@"
sets=()
$fine && sets=(--set "grid.cell=12.5 um")
$long && sets=("${long_sets[@]}")

run_scene "$out" "${sets[@]}"
"$ty" medium "$scene" --medium mnf2 --from "262.5 GHz" --to "262.5 GHz" --count 1 --thickness "3 mm" \
  --source-distance "0.25 mm" --image-range "4 mm" --json "$out/prediction.json" > "$out/prediction.txt"
# the plate's far face is at y = 1 mm
"$ty" measure focus "$out" --map image --axis y --face "1 mm" | tee "$out/focus.txt"
echo
echo "predicted by terayee medium (angular spectrum through the transfer matrix):"
tail -n 1 "$out/prediction.txt"

# pictures: a movie of the field, the steady intensity over the whole bench and behind the
# plate (the focal spot), and the spot's profiles with their FWHM, in $out/pictures/
"$ty" render "$out" --field Ez --movie "$out/pictures/Ez.mp4" --fps 20
"$ty" render "$out" --map steady
"$ty" render "$out" --map image
"$ty" render "$out" --plot focus
