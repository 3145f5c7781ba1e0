#!/usr/bin/env bash
# The size rules of DEVELOPERS.md for the product's sources (io, materials, solver, tools):
# no file over 400 lines, no function over 80 lines. Function extents come from
# universal-ctags (its `end:` field), so a function is measured from its first to its last
# line, comments and blank lines included. Exit 0 when clean, 1 with one line per breach.
# The few functions allowed to be longer are listed below, each with its reason.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$root"
max_file=400
max_function=80
# "path function": longer on purpose (keep this list short, and say why).
allowed=(
  # the 8-lane SIMD kernels of tilted magnetic cells: each is one loop body over the lanes, written
  # out so that the compiler vectorizes it whole (calls inside it would have to inline to keep that)
  "materials/magnetic/llg_cell.h llg_cells"
  "materials/magnetic/llg_exponential.h exponential_lanes"
)
command -v ctags >/dev/null || { echo "check-sizes: needs universal-ctags (tools/setup.sh installs it)" >&2; exit 1; }
ctags --version 2>/dev/null | grep -q "Universal Ctags" || { echo "check-sizes: ctags is not universal-ctags" >&2; exit 1; }
mapfile -t files < <(find io materials solver tools -name '*.h' -o -name '*.cpp' | sort)
bad=0
for f in "${files[@]}"; do
  n=$(wc -l <"$f")
  if [ "$n" -gt "$max_file" ]; then echo "$f: $n lines (at most $max_file)"; bad=1; fi
done
functions=0
while IFS=$'\t' read -r length file name; do
  functions=$((functions + 1))
  [ "$length" -gt "$max_function" ] || continue
  for a in "${allowed[@]}"; do [ "$a" = "$file $name" ] && continue 2; done
  echo "$file: function $name is $length lines (at most $max_function)"
  bad=1
done < <(ctags --c++-kinds=f --fields=+ne --output-format=u-ctags -f - "${files[@]}" 2>/dev/null |
  awk -F'\t' '{ line = ""; end = "";
                for (i = 4; i <= NF; i++) { if ($i ~ /^line:/) line = substr($i, 6); if ($i ~ /^end:/) end = substr($i, 5) }
                if (line != "" && end != "") printf "%d\t%s\t%s\n", end - line + 1, $2, $1 }')
[ "$functions" -gt 100 ] || { echo "check-sizes: ctags found only $functions functions: not measuring" >&2; exit 1; }
echo "check-sizes: ${#files[@]} files, $functions functions measured"
exit $bad
