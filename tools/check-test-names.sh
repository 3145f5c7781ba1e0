#!/usr/bin/env bash
# Fails when a doctest case's name holds a character that doctest_discover_tests cannot carry
# into a ctest name: a ';' splits it (the ctest entry then runs no case and passes), and a
# '\' escapes the -tc filter. Run by ctest as `test_names`.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bad=$(grep -rnE 'TEST_CASE\("[^"]*[;\\]' "$root/tests" || true)
if [ -n "$bad" ]; then
  echo "test names with ';' or '\\' (ctest would run no case for them):"
  echo "$bad"
  exit 1
fi
echo "check-test-names: every doctest case name fits a ctest name"
