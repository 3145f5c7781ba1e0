# Shared by the studies' run.sh (sourced, not run): finds the terayee program and reads the
# command line [--fine | --long] [OUT]. The caller sets `study` (its folder's name) and, if
# it takes --long, `long_ok=true`, and passes "$@"; afterwards $root, $ty, $here, $scene,
# $out, $fine and $long (true or false) are set, and run_scene runs the scene. TERAYEE_BIN
# picks another terayee program (a developer's own build folder).
# --long: 6.25 um cells for 8 ns, the absorber's long stability run (docs/method.md): hours
# on two cores, a checkpoint every 10 minutes, and the same command again goes on from the
# last checkpoint (Ctrl-C, a killed job or a closed session lose at most 10 minutes).
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[1]}")" && pwd)"
root="$(cd "$here/../.." && pwd)"
ty="${TERAYEE_BIN:-$root/build/terayee}"  # another build: TERAYEE_BIN=/path/to/terayee
[ -x "$ty" ] || { echo "build terayee first: $root/tools/setup.sh" >&2; exit 1; }
fine=false long=false
if [ "${1:-}" = "--fine" ]; then fine=true; shift; fi
if [ "${1:-}" = "--long" ]; then
  [ "${long_ok:-false}" = true ] || { echo "$study has no --long setting" >&2; exit 2; }
  $fine && { echo "--fine and --long are two settings: give one" >&2; exit 2; }
  long=true
  shift
fi
suffix=""
$long && suffix="-long"  # its own folder: a default run's folder is not resumed as a long one
out="${1:-$root/runs/$study$suffix}"
scene="$here/$study.yaml"
long_sets=(--set "grid.cell=6.25 um" --set "time.stop=8 ns")

# run_scene DIR [terayee run options]: the study's scene into DIR. By default it replaces
# the results of an earlier run there; with --long it goes on with a stopped run in DIR
# (terayee run --resume: same scene, same settings) or, in a folder without one, starts it.
run_scene() {
  local dir="$1"
  shift
  if ! $long; then
    "$ty" run "$scene" --overwrite -o "$dir" "$@"
  elif [ -f "$dir/scene.yaml" ]; then
    "$ty" run "$scene" --resume -o "$dir" "$@" --checkpoint-every 10
  else
    "$ty" run "$scene" -o "$dir" "$@" --checkpoint-every 10
  fi
}
