#!/usr/bin/env bash
# Outside CI: one run spread over MPI ranks gives the same bits as a one-process run
# (docs/parallel.md). Builds build-mpi/ (MPI=ON tools/setup.sh) if it is missing, then runs
# each scene once as one process (2 threads) and under `mpirun -n 2` and
# `mpirun -n 3 --oversubscribe` (1 thread per rank) and over 2 ranks of 2 threads, and compares every dataset of their
# fields.h5 exactly (h5diff without a tolerance: any differing bit fails). Then checkpoints:
# each scene stopped at step K (--stop-at-step) as one process and over 2 ranks must leave the
# same checkpoint.h5 (every dataset, h5diff), and the 2-rank one resumed on 3 ranks and on one
# process, the one-process one on 2 ranks, must end with the straight run's fields.h5; a
# SIGTERM given to one rank of two (TERAYEE_KILL_AT=term:N, io/run/kill_point.h) stops both at
# one step with a checkpoint that resumes to the same bits; a damaged checkpoint or one of
# another scene is refused with exit status 2 over 2 ranks (no hang). First, the guard: the
# bench and the magnetic bench at 1.2 times the stable time step must be stopped at the same
# step with the same message on one process and on 3 ranks, and each of 3 ranks must hold
# well under one process's memory (quick mode too).
#   tools/mpi-check.sh            the bench scene with absorbing and with periodic y edges, a Bloch
#                                 half-space (the sine copy over ranks), the Otto bench (Bloch sides
#                                 with magnets), a rotated-tensor disc, and the
#                                 magnetic bench (an MnF2 slab) with absorbing and with periodic y edges
#   tools/mpi-check.sh SCENE...   these scenes instead
#   tools/mpi-check.sh --if-built --quick   (the ctest case mpi_same_bits) 3 ranks only, and each
#                                           scene stopped on 2 ranks, resumed on 3 and on one process;
#                                           exit 77, skipped, when build-mpi/ or mpirun is missing
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
bench="$root/tests/data/ranks-bench.yaml"
trap 'rm -rf "$work"' EXIT

# each case: a scene file and its --set values (space separated)
cases=()
custom=$#
if [ $# -gt 0 ]; then
  for s in "$@"; do cases+=("$s|"); done
else
  cases+=("$bench|")
  cases+=("$bench|grid.boundaries.y=periodic sources.0.beam.angle=0deg")
  # a dispersive (Lorentz) wafer on 8 rows with a periodic y seam: every rank's rows at the seam
  [ $quick -eq 1 ] || cases+=("$root/scenarios/gaas-reststrahlen.yaml|time.stop=2ps")
  # Bloch x sides: the sine copy's halo and state (sine/) over ranks, its power-spectrum line joined
  cases+=("$root/tests/data/bloch-half-space.yaml|time.stop=5ps")
  # Bloch x sides with magnetic cells: the pair's magnetic step over ranks, each copy its own
  # exchanges (the Otto bench: silicon prism, gap, biased FeF2)
  # (the gap and crystal moved down, so every cut of 2 and 3 ranks runs through the crystal)
  cases+=("$root/scenarios/otto-atr/otto-atr-fef2.yaml|time.stop=30ps bodies.1.rectangle.centre=[5um,165um] bodies.2.rectangle.centre=[5um,380um] outputs.0.power-spectrum.line.y=120um")
  # a rotated dispersive tensor (its list gathered and stepped whole on every rank) across the cuts
  cases+=("$root/tests/data/ranks-tensor.yaml|")
  # a spectral map over every rank's rows (each rank sums its own rows') deciding a self-stopping
  # run: the stop rule's samples summed over the ranks (stop_rule.cpp)
  cases+=("$root/tests/data/cw-beam.yaml|time.stop=auto time.limit=200ps")
  # magnetic cells across every cut: their halo (magnet_halo.h), probes and tilt snapshots
  magnets="$root/tests/data/ranks-magnets.yaml"
  cases+=("$magnets|")
  # the slab through the periodic y seam: the cells' neighbours and Hy's scatter wrap across it
  # (quick mode too: a resumed rank reads the cells beyond the seam, state_owners.cpp's widen)
  cases+=("$magnets|grid.boundaries.y=periodic bodies.0.rectangle.size=[0.3mm,1mm]")
fi

ranks() { # ranks N ARGS...: `terayee ARGS` over N ranks of 1 thread
  local n="$1"; shift
  local extra=()
  [ "$n" -gt "$(nproc)" ] && extra=(--oversubscribe --mca mpi_yield_when_idle 1)
  mpirun -n "$n" "${extra[@]}" -x OMP_NUM_THREADS=1 "$bin" "$@" --threads 1
}
same() { # same A B WHAT [H5DIFF OPTIONS]: every dataset of two HDF5 files bit for bit
  if h5diff "${@:4}" "$1" "$2" >"$work/diff" 2>&1; then echo "mpi-check: $3: identical"
  else echo "mpi-check: $3: DIFFERS"; head -20 "$work/diff"; failed=1; fi
}

# resume_check SCENE K SETS...: stopped at step K as one process and over 2 ranks, resumed on
# other rank counts, against the straight one-process run $work/K-one
resume_check() {
  local scene="$1" k="$2"; shift 2
  local steps stop
  steps=$(jq .steps "$work/$k-one/summary.json")
  stop=$((steps / 2 + 1))
  ranks 2 run "$scene" "$@" -o "$work/$k-ck2" --stop-at-step "$stop" --quiet
  cp -r "$work/$k-ck2" "$work/$k-ck2-on1"
  if [ $quick -eq 0 ]; then
    OMP_NUM_THREADS=2 "$bin" run "$scene" "$@" -o "$work/$k-ck1" --stop-at-step "$stop" --quiet
    # (a periodic y seam: one process copies every component into the ghost rows, the ranks'
    # halo only those the stencils read, so Ey, Hy there differ; nothing reads them)
    local skip=()
    if [[ "$*" == *periodic* ]] || grep -Eq "y: *periodic" "$scene"; then
      skip=(--exclude-path /fields/Ey --exclude-path /fields/Hy)
    fi
    same "$work/$k-ck1/checkpoint.h5" "$work/$k-ck2/checkpoint.h5" \
      "$(basename "$scene") $* checkpoint at step $stop, 1 process vs 2 ranks${skip:+ (periodic y: all but Ey, Hy)}" "${skip[@]}"
    ranks 2 run "$scene" "$@" -o "$work/$k-ck1" --resume --quiet
    same "$work/$k-one/fields.h5" "$work/$k-ck1/fields.h5" "$(basename "$scene") $* stopped as 1 process, resumed on 2 ranks"
  fi
  ranks 3 run "$scene" "$@" -o "$work/$k-ck2" --resume --quiet
  same "$work/$k-one/fields.h5" "$work/$k-ck2/fields.h5" "$(basename "$scene") $* stopped on 2 ranks, resumed on 3"
  if [ "$scene" = "$bench" ] && [ $# -eq 0 ]; then
    # stopped where the first frame's Poynting field has E kept (snapshots.h): each rank
    # holds and writes only its rows of it (state_owners.cpp); the frame step as snapshots.cpp
    local frame
    frame=$(jq '((2e-12 / ."time-step-s") - 0.5 | ceil) - 1' "$work/$k-one/summary.json")
    ranks 2 run "$scene" -o "$work/$k-ckS" --stop-at-step "$frame" --quiet
    ranks 3 run "$scene" -o "$work/$k-ckS" --resume --quiet
    same "$work/$k-one/fields.h5" "$work/$k-ckS/fields.h5" "$(basename "$scene") stopped on 2 ranks with E kept for a Poynting frame (step $frame), resumed on 3"
  fi
  OMP_NUM_THREADS=2 "$bin" run "$scene" "$@" -o "$work/$k-ck2-on1" --resume --quiet
  same "$work/$k-one/fields.h5" "$work/$k-ck2-on1/fields.h5" "$(basename "$scene") $* stopped on 2 ranks, resumed as 1 process"
}

# A SIGTERM to rank 1 of two (after step 37; the ranks agree every 16 steps, so both stop
# at step 48) keeps a checkpoint that resumes to the straight run's bits; then refusals.
signal_and_refusals() {
  [ $quick -eq 0 ] && [ $custom -eq 0 ] || return 0
  local d="$work/signal" rc
  set +e
  # rank 1 alone (Open MPI's OMPI_COMM_WORLD_RANK) is sent it; rank 0 writes the log
  mpirun -n 2 -x OMP_NUM_THREADS=1 sh -c '[ "$OMPI_COMM_WORLD_RANK" = 1 ] && export TERAYEE_KILL_AT=term:37; exec "$0" "$@"' \
    "$bin" run "$bench" -o "$d" --threads 1 --quiet 2>"$work/err"
  rc=$?
  set -e
  if [ $rc -ne 0 ] && grep -q "stopped by signal 15 at step 48" "$d/log.txt" && [ -f "$d/checkpoint.h5" ]; then
    echo "mpi-check: SIGTERM to one rank of two: both stopped at step 48 with a checkpoint (exit $rc)"
  else
    echo "mpi-check: SIGTERM to one rank of two: no checkpoint at step 48 (exit $rc)"; cat "$work/err" "$d/log.txt"; failed=1
  fi
  ranks 2 run "$bench" -o "$d" --resume --quiet
  same "$work/1-one/fields.h5" "$d/fields.h5" "signalled on 2 ranks, resumed on 2"
  # refusals, exit 2 on every rank within a minute: a cut file, and another scene's checkpoint
  ranks 2 run "$bench" -o "$work/bad" --stop-at-step 30 --quiet
  cp -r "$work/bad" "$work/other"
  head -c 3000 "$work/bad/checkpoint.h5" >"$work/cut" && mv "$work/cut" "$work/bad/checkpoint.h5"
  ranks 2 run "$bench" --set time.stop=9ps -o "$work/other-scene" --stop-at-step 30 --quiet
  cp "$work/other-scene/checkpoint.h5" "$work/other/checkpoint.h5"
  for c in bad other; do
    set +e
    timeout 60 mpirun -n 2 -x OMP_NUM_THREADS=1 "$bin" run "$bench" -o "$work/$c" --resume --threads 1 --quiet 2>"$work/err"
    rc=$?
    set -e
    if [ $rc -eq 2 ] && grep -q "checkpoint" "$work/err"; then
      echo "mpi-check: $c checkpoint over 2 ranks: refused, exit 2: $(head -1 "$work/err")"
    else
      echo "mpi-check: $c checkpoint over 2 ranks: NOT refused with exit 2 (exit $rc)"; cat "$work/err"; failed=1
    fi
  done
}

# guard_check SCENE NAME: the guard's verdict over ranks. A time step 1.2 times the stability
# limit (TERAYEE_UNSTABLE, a test hook: a scene cannot ask for it) grows; one process and 3
# ranks must stop it at the same step with the same message, naming the same node or cell
# (each rank sums and picks in its own rows, solver/guard/held_energy.cpp)
guard_check() {
  local scene="$1" name="$2" rc1 rc3 m1 m3
  set +e
  TERAYEE_UNSTABLE=1.2 OMP_NUM_THREADS=2 "$bin" run "$scene" -o "$work/g1-$name" --quiet 2>/dev/null
  rc1=$?
  TERAYEE_UNSTABLE=1.2 mpirun -n 3 --oversubscribe --mca mpi_yield_when_idle 1 -x TERAYEE_UNSTABLE -x OMP_NUM_THREADS=1 \
    "$bin" run "$scene" -o "$work/g3-$name" --threads 1 --quiet 2>/dev/null
  rc3=$?
  set -e
  m1=$(grep -oE "(the run is growing|the field [A-Za-z]+ became non-finite).*" "$work/g1-$name/log.txt" || true)
  m3=$(grep -oE "(the run is growing|the field [A-Za-z]+ became non-finite).*" "$work/g3-$name/log.txt" || true)
  if [ $rc1 -ne 0 ] && [ $rc3 -eq $rc1 ] && [ -n "$m1" ] && [ "$m1" = "$m3" ]; then
    echo "mpi-check: $name, too large a step: stopped alike on 1 process and 3 ranks: ${m1:0:110}..."
  else
    echo "mpi-check: $name, too large a step: 1 process (exit $rc1) and 3 ranks (exit $rc3) differ:"
    echo "  1: $m1"; echo "  3: $m3"; failed=1
  fi
}

# memory_check WHAT SCENE SETS...: the arrays divided over ranks (solver/grid/aligned.h: a rank's
# pages are those of its own rows). Each of 3 ranks must peak (resident set, /usr/bin/time) under
# 0.7 of one process's peak, straight and on a run stopped on 2 ranks and resumed on 3; a rank
# touching every row reaches 1.0 or more (the program and Open MPI are about 30 MB of each).
#  - fields: the speed bench at 0.75 um (1620 x 1220 cells, 106 MB of fields): measured 0.52-0.58
#    (74-82 MB against 142 MB);
#  - magnets: the magnetic bench at 1 um with the MnF2 slab over most of the grid (900 x 600 cells,
#    450 000 magnetic cells, 160 bytes of state each beside 48 of fields): the cells' state and
#    neighbours are mapped pages written only for a rank's rows and the row beyond each side
#    (magnetic_cells.h); with every rank holding every cell's state a rank peaked at 0.8 of one process.
memory_check() {
  local what="$1" scene="$2" one worst=0 m
  shift 2
  [ -x /usr/bin/time ] || { echo "mpi-check: memory: no /usr/bin/time (Debian's time): skipped"; return 0; }
  local sets=("$@" --set time.stop=0.2ps --quiet)
  one=$( { /usr/bin/time -f "peak %M" "$bin" run "$scene" "${sets[@]}" -o "$work/mem-one" --threads 1; } 2>&1 |
    sed -n 's/^peak //p')
  local peak3=(mpirun -n 3 --oversubscribe --mca mpi_yield_when_idle 1 -x OMP_NUM_THREADS=1
    sh -c '/usr/bin/time -o "$0-$OMPI_COMM_WORLD_RANK" -f "%M" "$@"')
  rm -rf "$work"/mem-*
  "${peak3[@]}" "$work/mem-rank" "$bin" run "$scene" "${sets[@]}" -o "$work/mem-ranks" --threads 1 2>/dev/null || true
  # and resumed: each rank reads back only its rows' parts of the checkpoint (checkpoint.cpp)
  ranks 2 run "$scene" "${sets[@]}" -o "$work/mem-resumed" --stop-at-step 40
  "${peak3[@]}" "$work/mem-resume" "$bin" run "$scene" "${sets[@]}" -o "$work/mem-resumed" --resume --threads 1 \
    2>/dev/null || true
  for how in rank resume; do
    worst=0
    for f in "$work/mem-$how"-*; do m=$(tail -1 "$f"); [ "$m" -gt "$worst" ] && worst=$m; done
    if [ "$worst" -gt 0 ] && [ $((worst * 10)) -lt $((one * 7)) ]; then
      echo "mpi-check: memory ($what, $how): 3 ranks peak at most $((worst / 1024)) MB each, one process $((one / 1024)) MB"
    else
      echo "mpi-check: memory ($what, $how): a rank of 3 peaked at $((worst / 1024)) MB, one process at $((one / 1024)) MB"
      failed=1
    fi
  done
}

failed=0
if [ $custom -eq 0 ]; then
  memory_check fields "$root/scenarios/cluster/ranks-speed.yaml" --set grid.cell=0.75um
  memory_check magnets "$root/tests/data/ranks-magnets.yaml" --set grid.cell=1um \
    --set "bodies.0.rectangle.centre=[0, 0]" --set "bodies.0.rectangle.size=[0.84 mm, 0.54 mm]"
  guard_check "$bench" bench
  guard_check "$root/tests/data/ranks-magnets.yaml" magnets
fi
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
      keys='{energy, "magnetic-cells", stop, warnings}'
      [ "$(jq -S "$keys" "$work/$k-one/summary.json")" = "$(jq -S "$keys" "$work/$k-ranks$nt/summary.json")" ] ||
        { echo "mpi-check: summary.json's energy, magnet numbers or stop differ"; failed=1; }
    fi
  done
  resume_check "$scene" "$k" "${sets[@]}"
done
signal_and_refusals
exit $failed
