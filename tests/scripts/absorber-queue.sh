#!/usr/bin/env bash
# The verdicts tools/absorber-check.sh --queue records, with a stand-in for the test program
# that lists four cases and ends each its own way: a pass, a failure, a crash (SIGSEGV) and a
# stop from outside (SIGTERM). The first three must be recorded (a crash is a failure, with the
# signal in its log) and the stop must leave no verdict, so that the next queue runs it again.
# Run by ctest as `absorber_queue`.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
cat > "$work/fake-tests" <<'FAKE'
#!/usr/bin/env bash
if [ -n "${TERAYEE_ABSORBER_LIST:-}" ]; then printf 'case: ok\ncase: bad\ncase: crash\ncase: stop\n'; exit 0; fi
case "$TERAYEE_ABSORBER_NAME" in
  ok) exit 0 ;;
  bad) exit 1 ;;
  crash) kill -SEGV $$ ;;
  stop) kill -TERM $$ ;;
esac
FAKE
chmod +x "$work/fake-tests"
TERAYEE_TESTS="$work/fake-tests" bash "$root/tools/absorber-check.sh" --queue "$work/q" 5 > "$work/out" 2>&1
fail=0
expect() {  # expect FILE present|absent
  if { [ "$2" = present ] && [ ! -e "$work/q/$1" ]; } || { [ "$2" = absent ] && [ -e "$work/q/$1" ]; }; then
    echo "absorber-queue: $1 should be $2"
    fail=1
  fi
}
expect "5um ok.passed" present
expect "5um bad.failed" present
expect "5um crash.failed" present
expect "5um stop.passed" absent
expect "5um stop.failed" absent
expect "5um stop.running" absent
grep -q "ended by signal 11" "$work/q/5um crash.log" || { echo "absorber-queue: the crash's log does not name its signal"; fail=1; }
[ $fail -eq 0 ] || { cat "$work/out"; exit 1; }
echo "absorber-queue: pass, failure and crash recorded; the stopped case left to run again"
