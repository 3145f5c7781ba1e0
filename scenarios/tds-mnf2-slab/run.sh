#!/usr/bin/env bash
# The TDS study: run the MnF2 slab and its reference, extract t(f), n and mu(f) from the
# detector behind the slab (eps = 5.5 given), and eps and mu together from both detectors;
# print mu beside the crystal's own Voigt permeability (terayee medium).
#   scenarios/tds-mnf2-slab/run.sh [--fine] [OUT]     (default OUT: runs/tds-mnf2-slab)
# --fine is accepted for tools/run-studies.sh and changes nothing: at 10 um cells mu already
# agrees with the linear response within 0.003.
study=tds-mnf2-slab
. "$(dirname "${BASH_SOURCE[0]}")/../study-setup.sh" "$@"
ref="$out-reference"
"$ty" run "$scene" --overwrite -o "$out" --quiet
"$ty" run "$scene" --overwrite -o "$ref" --reference --quiet
band=(--from "240 GHz" --to "285 GHz" --count 91)
"$ty" medium "$scene" --medium mnf2 "${band[@]}" --normal x --csv "$out/linear-response.csv" > /dev/null
"$ty" measure material "$out" --reference "$ref" --probe behind --thickness "200 um" --permittivity 5.5 \
  --window all "${band[@]}" --json "$out/material.json" | tee "$out/material.txt"
"$ty" measure material "$out" --reference "$ref" --probe behind --thickness "200 um" --window all "${band[@]}" \
  --reflected-probe before --front x=0.4mm --json "$out/material-rt.json" > "$out/material-rt.txt"
echo
echo "mu from t (eps = 5.5 given) against the linear response's mu_V, every 5th frequency:"
awk -F, 'NR > 1 { print $1, $10, $11 }' "$out/linear-response.csv" > "$out/muV.txt"
"$ty" render "$out" --plot probes > /dev/null
paste -d' ' <(awk 'NR > 2 && NF >= 7 { print $1, $6, $7 }' "$out/material.txt") "$out/muV.txt" |
  awk 'NR % 5 == 1 { printf "%10.3f GHz   mu = %9.4f %+9.4fi   mu_V = %9.4f %+9.4fi\n", $1, $2, $3, $5, $6 }'
