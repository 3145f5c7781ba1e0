#!/usr/bin/env bash
# Fuzzes the scene reader, `--set` overrides and the scene validation for MINUTES minutes
# (default 10) with libFuzzer under AddressSanitizer and UndefinedBehaviorSanitizer, from
# Debian's clang. Outside the test suite. The seed corpus is every bundled scene and the
# bad-input corpus (tests/data/bad), plus tests/fuzz/seeds; the corpus it grows is kept in
# build-fuzz/corpus for the next run. A finding (crash, hang over 10 s, sanitizer report,
# an exception other than BadInput) stops the run and leaves its input in build-fuzz/.
# Usage: tools/fuzz.sh [MINUTES]
set -euo pipefail
minutes=${1:-10}
root=$(cd "$(dirname "$0")/.." && pwd)
build=$root/build-fuzz
if ! command -v clang++ >/dev/null; then
  echo "fuzz.sh: clang++ is missing: sudo apt-get install clang" >&2
  exit 2
fi
cmake -S "$root" -B "$build" -DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_C_COMPILER=clang \
  -DCMAKE_CXX_COMPILER=clang++ -DTERAYEE_FUZZ=ON >/dev/null
cmake --build "$build" --target fuzz_scene -j"$(nproc)"
mkdir -p "$build/corpus" "$build/seeds"
cp "$root"/scenarios/*.yaml "$root"/scenarios/*/*.yaml "$root"/tests/data/bad/*.yaml "$build/seeds/" 2>/dev/null || true
cp "$root"/tests/fuzz/seeds/* "$build/seeds/" 2>/dev/null || true
cd "$build"
export ASAN_OPTIONS=detect_leaks=1:abort_on_error=1
export UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1
./fuzz_scene corpus seeds -max_total_time=$((minutes * 60)) -timeout=10 -rss_limit_mb=4096 -max_len=65536 \
  -dict="$root/tests/fuzz/scene.dict" -print_final_stats=1
