#!/usr/bin/env bash
# The negative-refraction study: run the scene, measure where the power flows inside the
# plate, and print it beside what `terayee medium` predicts for the same crystal.
#   scenarios/negative-refraction/run.sh [--fine | --long] [OUT]     (default OUT: runs/negative-refraction)
# --fine: 12.5 um cells and 6 ns, the overnight-class setting (the absorber needs no setting:
# its sides with the crystal take the graded loss, docs/method.md).
# --long: 6.25 um cells for 8 ns, the absorber's long stability run (hours; the same command
# again goes on from the last checkpoint, study-setup.sh).
study=negative-refraction
long_ok=true
. "$(dirname "${BASH_SOURCE[0]}")/../study-setup.sh" "$@"
sets=()
$fine && sets=(--set "grid.cell=12.5 um" --set "time.stop=6 ns")
$long && sets=("${long_sets[@]}")

run_scene "$out" "${sets[@]}"
"$ty" medium "$scene" --medium mnf2 --from "262.5 GHz" --to "262.5 GHz" --count 1 --angle "30 deg" \
  --json "$out/prediction.json" > "$out/prediction.txt"
# inside the plate, 0.5 to 2.5 mm deep, where the refracted beam runs
"$ty" measure angle "$out" --map steady --region "0.5 mm" "1.5 mm" "6 mm" "2 mm" --normal y --incidence "30 deg" \
  | tee "$out/angle.txt"
echo
echo "predicted by terayee medium (the same crystal's linear response, losses included):"
tail -n 2 "$out/prediction.txt"

# pictures: a movie of the field, the steady power flow |S| (the refracted beam) and the
# steady wave's Re Ez (its phase fronts), in $out/pictures/
"$ty" render "$out" --field Ez --movie "$out/pictures/Ez.mp4" --fps 20
"$ty" render "$out" --map steady --field S
"$ty" render "$out" --map steady --field Ez --quantity real
