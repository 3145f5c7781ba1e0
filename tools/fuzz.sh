#!/usr/bin/env bash
# Fuzzes with libFuzzer under AddressSanitizer and UndefinedBehaviorSanitizer, from Debian's
# clang, MINUTES minutes (default 10) per target. Outside the test suite. Targets:
#   scene       the scene reader, `--set` overrides and the scene validation
#               (tests/fuzz/fuzz_scene.cpp); seeds: every bundled scene, the bad-input corpus
#               (tests/data/bad) and tests/fuzz/seeds
#   run-folder  the readers of a run folder read back: fields.h5 (render, measure),
#               checkpoint.h5 and fields.h5.partial (run --resume), summary.json
#               (tests/fuzz/fuzz_run_folder.cpp, which makes its own real run folder of
#               tests/fuzz/run/seed.yaml and mutates copies of it); seeds: tests/fuzz/run/corpus
# The corpus each grows is kept in build-fuzz/corpus-TARGET for the next run. A finding
# (crash, hang over 10 s, sanitizer report, an exception other than BadInput) stops that
# target and leaves its input in build-fuzz/ (crash-*, timeout-*, oom-*).
# Usage: tools/fuzz.sh [MINUTES] [scene|run-folder|all]
set -euo pipefail
minutes=${1:-10}
which=${2:-all}
root=$(cd "$(dirname "$0")/.." && pwd)
build=$root/build-fuzz
if ! command -v clang++ >/dev/null; then
  echo "fuzz.sh: clang++ is missing: sudo apt-get install clang" >&2
  exit 2
fi
case $which in
  scene) targets=(fuzz_scene) ;;
  run-folder) targets=(fuzz_run_folder) ;;
  all) targets=(fuzz_scene fuzz_run_folder) ;;
  *) echo "fuzz.sh: the target is scene, run-folder or all, not '$which'" >&2; exit 2 ;;
esac
cmake -S "$root" -B "$build" -DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_C_COMPILER=clang \
  -DCMAKE_CXX_COMPILER=clang++ -DTERAYEE_FUZZ=ON >/dev/null
cmake --build "$build" --target "${targets[@]}" -j"$(nproc)"
cd "$build"
export ASAN_OPTIONS=detect_leaks=1:abort_on_error=1
export UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1:suppressions=$root/tools/sanitize/ubsan.supp
export LSAN_OPTIONS=suppressions=$root/tools/sanitize/lsan.supp  # third-party leaks, each with its reason
status=0
for t in "${targets[@]}"; do
  mkdir -p "corpus-$t" "seeds-$t"
  if [ "$t" = fuzz_scene ]; then
    cp "$root"/scenarios/*.yaml "$root"/scenarios/*/*.yaml "$root"/tests/data/bad/*.yaml "seeds-$t/" 2>/dev/null || true
    cp "$root"/tests/fuzz/seeds/* "seeds-$t/" 2>/dev/null || true
    extra=(-max_len=65536 -dict="$root/tests/fuzz/scene.dict")
  else
    cp "$root"/tests/fuzz/run/corpus/* "seeds-$t/" 2>/dev/null || true
    extra=(-max_len=4096)
  fi
  echo "== $t: $minutes minutes"
  ./"$t" "corpus-$t" "seeds-$t" -max_total_time=$((minutes * 60)) -timeout=10 -rss_limit_mb=4096 \
    "${extra[@]}" -print_final_stats=1 || status=$?
done
exit $status
