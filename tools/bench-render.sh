#!/usr/bin/env bash
# Benchmark of `terayee render`: a 200-frame H.264 movie of a 1000 x 1000 field.
# Makes the field with a short run of the bundled window scene on 5 um cells (single
# precision, one Ez snapshot every 0.1 ps: about 800 MB in /tmp), then times the movie.
#   tools/bench-render.sh [WORKDIR]      (default: a fresh folder under /tmp, removed after)
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
ty="$root/build/terayee"
[ -x "$ty" ] || { echo "build terayee first: $root/tools/setup.sh" >&2; exit 1; }
work="${1:-$(mktemp -d /tmp/terayee-bench-render.XXXXXX)}"
[ -n "${1:-}" ] || trap 'rm -rf "$work"' EXIT
"$ty" run "$root/scenarios/window-beam.yaml" -o "$work/run" --quiet \
  --set "grid.extent=[5 mm, 5 mm]" --set "grid.cell=5 um" --set "sources.0.beam.launch.x=-2.2 mm" \
  --set "time.stop=20 ps" --set "time.precision=single" \
  --set "outputs.0.snapshots.fields=[Ez]" --set "outputs.0.snapshots.every=0.1 ps" --set "outputs.0.snapshots.stride=1"
start=$(date +%s.%N)
"$ty" render "$work/run" --field Ez --movie "$work/movie.mp4" --fps 25
end=$(date +%s.%N)
awk -v a="$start" -v b="$end" 'BEGIN { printf "render_seconds=%.2f\n", b - a }'
