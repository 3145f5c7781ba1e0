# Shared by the studies' run.sh (sourced, not run): finds the terayee program and reads the
# command line [--fine] [OUT]. The caller sets `study` (its folder's name) and passes "$@";
# afterwards $root, $ty, $here, $scene, $out and $fine (true or false) are set. TERAYEE_BIN
# picks another terayee program (a developer's own build folder).
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[1]}")" && pwd)"
root="$(cd "$here/../.." && pwd)"
ty="${TERAYEE_BIN:-$root/build/terayee}"  # another build: TERAYEE_BIN=/path/to/terayee
[ -x "$ty" ] || { echo "build terayee first: $root/tools/setup.sh" >&2; exit 1; }
fine=false
if [ "${1:-}" = "--fine" ]; then fine=true; shift; fi
out="${1:-$root/runs/$study}"
scene="$here/$study.yaml"
