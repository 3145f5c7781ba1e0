#!/usr/bin/env bash
# Outside CI: one run spread over MPI ranks gives the same bits as a one-process run
# (docs/parallel.md). Builds build-mpi/ (MPI=ON tools/setup.sh) if it is missing, then runs
# each scene once as one process (2 threads) and under `mpirun -n 2` and
# `mpirun -n 3 --oversubscribe` (1 thread per rank) and over 2 ranks of 2 threads, and compares every dataset of their
# fields.h5 exactly (h5diff without a tolerance: any differing bit fails).
#   tools/mpi-check.sh            the bench scene with absorbing and with periodic y edges, and the
#                                 magnetic bench (an MnF2 slab) with absorbing and with periodic y edges
#   tools/mpi-check.sh SCENE...   these scenes instead
#   tools/mpi-check.sh --if-built --quick   (the ctest case mpi_same_bits) 3 ranks only; exit 77,
#                                           skipped, when build-mpi/ or mpirun is missing
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bin="$root/build-mpi/terayee"
if [ "${1:-}" = "--if-built" ]; then
  shift
  if [ ! -x "$bin" ] || ! command -v mpirun >/dev/null; then echo "mpi-check: no build-mpi/terayee or mpirun: skipped"; exit 77; fi
fi
counts=(2 3 2x2)  # 2 ranks, 3 ranks, 2 ranks of 2 threads
quick=0
if [ "${1:-}" = "--quick" ]; then shift; counts=(3); quick=1; fi
if [ ! -x "$bin" ]; then MPI=ON "$root/tools/setup.sh"; fi
command -v mpirun >/dev/null && command -v h5diff >/dev/null || { echo "mpi-check: needs mpirun and h5diff"; exit 2; }
if [ "$(id -u)" -eq 0 ]; then export OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1; fi
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT

# each case: a scene file and its --set values (space separated)
cases=()
if [ $# -gt 0 ]; then
  for s in "$@"; do cases+=("$s|"); done
else
  bench="$root/tests/data/ranks-bench.yaml"
  cases+=("$bench|")
  cases+=("$bench|grid.boundaries.y=periodic sources.0.beam.angle=0deg")
  # a dispersive (Lorentz) wafer on 8 rows with a periodic y seam: every rank's rows at the seam
  [ $quick -eq 1 ] || cases+=("$root/scenarios/gaas-reststrahlen.yaml|time.stop=2ps")
  # magnetic cells across every cut: their halo (magnet_halo.h), probes and tilt snapshots
  magnets="$root/tests/data/ranks-magnets.yaml"
  cases+=("$magnets|")
  # the slab through the periodic y seam: the cells' neighbours and Hy's scatter wrap across it
  [ $quick -eq 1 ] || cases+=("$magnets|grid.boundaries.y=periodic bodies.0.rectangle.size=[0.3mm,1mm]")
fi

failed=0
k=0
for c in "${cases[@]}"; do
  scene="${c%%|*}"
  sets=()
  for s in ${c#*|}; do sets+=(--set "$s"); done
  k=$((k + 1))
  if ! OMP_NUM_THREADS=2 "$bin" run "$scene" "${sets[@]}" -o "$work/$k-one" --quiet; then
    echo "mpi-check: $(basename "$scene") ${c#*|}: the one-process run failed"; failed=1; continue
  fi
  for nt in "${counts[@]}"; do  # ranks, or ranks x threads per rank
    n="${nt%x*}"
    t=1
    [ "$nt" != "$n" ] && t="${nt#*x}"
    extra=()
    [ $((n * t)) -gt "$(nproc)" ] && extra=(--oversubscribe --mca mpi_yield_when_idle 1)
    mpirun -n "$n" "${extra[@]}" -x OMP_NUM_THREADS="$t" "$bin" run "$scene" "${sets[@]}" -o "$work/$k-ranks$nt" --threads "$t" --quiet
    if h5diff "$work/$k-one/fields.h5" "$work/$k-ranks$nt/fields.h5" >"$work/diff" 2>&1; then
      echo "mpi-check: $(basename "$scene") ${c#*|} ranks $n x $t threads: fields.h5 identical to one process"
    else
      echo "mpi-check: $(basename "$scene") ${c#*|} ranks $n x $t threads: fields.h5 DIFFERS from one process"
      head -20 "$work/diff"
      failed=1
    fi
    cmp -s "$work/$k-one/fields.xmf" "$work/$k-ranks$nt/fields.xmf" || { echo "mpi-check: fields.xmf differs"; failed=1; }
    # the summary's numbers from the whole grid: the energy, the magnets' tilts and midpoint share, the stop
    if command -v jq >/dev/null; then
      same='{energy, "magnetic-cells", stop, warnings}'
      [ "$(jq -S "$same" "$work/$k-one/summary.json")" = "$(jq -S "$same" "$work/$k-ranks$nt/summary.json")" ] ||
        { echo "mpi-check: summary.json's energy, magnet numbers or stop differ"; failed=1; }
    fi
  done
done
exit $failed
