#!/usr/bin/env bash
# fields.xmf in ParaView, tested with the real reader (outside CI; a minute):
#   tools/paraview-check.sh RUN    open RUN/fields.xmf in pvbatch with ParaView's default reader
#                                  (XDMF 3), step through every time and compare each field's
#                                  min/max with the frame h5dump reads from RUN/fields.h5
#   tools/paraview-check.sh        the same on a short run of scenarios/window-beam.yaml, in
#                                  double and single precision (build/terayee, tools/setup.sh)
# Installs Debian's paraview, python3-paraview (pvbatch) and hdf5-tools (h5dump) if missing.
# Exit status 0 when every time and field matches, 1 otherwise.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
missing=()
for p in paraview python3-paraview hdf5-tools; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -gt 0 ]; then
  echo "paraview-check: installing ${missing[*]}" >&2
  sudo=""
  [ "$(id -u)" -eq 0 ] || sudo="sudo"
  $sudo apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
fi
check() { # pvbatch prints its own errors; offscreen, so no display is needed
  pvbatch --force-offscreen-rendering "$root/tools/paraview-check.py" "$1"
}
if [ "$#" -gt 0 ]; then
  check "$1"
  exit
fi
ty="$root/build/terayee"
[ -x "$ty" ] || { echo "paraview-check: build first (tools/setup.sh)" >&2; exit 2; }
work="$(mktemp -d "${TMPDIR:-/tmp}/terayee-paraview-check.XXXXXX")"
trap 'rm -rf "$work"' EXIT
status=0
for precision in double single; do
  "$ty" run "$root/scenarios/window-beam.yaml" -o "$work/$precision" --quiet --threads 2 --set time.stop=6ps \
    --set outputs.0.snapshots.every=1ps --set time.precision=$precision
  check "$work/$precision" || status=1
done
exit $status
