#!/usr/bin/env bash
# Reads every #include "..." line of the product's sources and rejects any that reaches
# against the layer order (docs/architecture.md):
#   io/scene (0) -> materials (1) -> solver (2) -> io/run (3) -> io/analysis, io/pictures (4) -> tools (5)
# A file may include its own layer or a lower one; io/analysis and io/pictures do not include
# each other. Tests may include anything. Exit 0 when clean, 1 with one line per violation.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$root"
layer() {  # prints "rank name" of a path, or nothing for a path outside the layers
  case "$1" in
    io/scene/*) echo "0 scene" ;;
    materials/*) echo "1 materials" ;;
    solver/*) echo "2 solver" ;;
    io/run/*) echo "3 run" ;;
    io/analysis/*) echo "4 analysis" ;;
    io/pictures/*) echo "4 pictures" ;;
    tools/*) echo "5 tools" ;;
  esac
}
bad=0
checked=0
while IFS= read -r file; do
  read -r from_rank from_name <<<"$(layer "$file")" || true
  [ -n "${from_rank:-}" ] || { echo "check-layers: $file is in no layer" >&2; bad=1; continue; }
  while IFS=: read -r line inc; do
    target="$(sed -E 's/.*#include "([^"]+)".*/\1/' <<<"$inc")"
    [ -f "$target" ] || { echo "$file:$line: includes \"$target\", which is not a file of the tree"; bad=1; continue; }
    read -r to_rank to_name <<<"$(layer "$target")" || true
    checked=$((checked + 1))
    if [ -z "${to_rank:-}" ] || [ "$to_rank" -gt "$from_rank" ] ||
       { [ "$to_rank" -eq "$from_rank" ] && [ "$to_name" != "$from_name" ]; }; then
      echo "$file:$line: $from_name includes \"$target\" ($to_name): against the layer order"
      bad=1
    fi
  done < <(grep -n '^[[:space:]]*#[[:space:]]*include[[:space:]]*"' "$file" || true)
done < <(find io materials solver tools -name '*.h' -o -name '*.cpp' | sort)
echo "check-layers: $checked includes checked"
exit $bad
