#!/usr/bin/env bash
# Finds the checks that pass only by doctest's absolute term. doctest::Approx(v).epsilon(e)
# accepts |x - v| < e (scale + max(|x|, |v|)) with scale 1 by default, so against a small v
# (an error of 0.013, a time of 1e-10 s) it accepts anything within e itself: a check that
# cannot fail. This builds the test program once more with a copy of doctest whose Approx
# throws where a comparison passes with the absolute term and would fail without it, or where
# that term is larger than the values compared (any x from 0 to 2 v would pass), runs
# terayee_tests (the studies' program is not audited), and lists each such CHECK by file and
# line. Compare a small value relatively instead: Approx(v).scale(0), or x / v against 1. A
# comparison with 0 (Approx(0).epsilon(1e-12): a deliberate absolute bound) is listed too;
# write those as |x| < bound. Not part of CI (about five minutes on two cores).
#   tools/approx-audit.sh            (needs the build folder: ./tools/setup.sh)
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
build="$root/build"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
cp -r /usr/include/doctest "$work/doctest"
/usr/bin/python3 - "$work/doctest/doctest.h" <<'EOF'
import sys
p = sys.argv[1]
s = open(p).read()
old = """    return std::fabs(lhs - rhs.m_value) <
           rhs.m_epsilon * (rhs.m_scale + std::max<double>(std::fabs(lhs), std::fabs(rhs.m_value)));"""
new = """    const double d = std::fabs(lhs - rhs.m_value), big = std::max<double>(std::fabs(lhs), std::fabs(rhs.m_value));
    const bool with = d < rhs.m_epsilon * (rhs.m_scale + big);
    // passes only by the absolute term, or would pass whatever x between 0 and 2 v (the
    // tolerance above the value itself: vacuous even where this run's x was close)
    if (with && ((!(d < rhs.m_epsilon * big) && d > 0) || (big > 0 && big < rhs.m_epsilon * rhs.m_scale))) {
        char b[200];
        std::snprintf(b, sizeof b, "approx-audit: passes by the absolute term: %.6g against %.6g, epsilon %.3g",
                      lhs, rhs.m_value, rhs.m_epsilon);
        throw std::runtime_error(b);
    }
    return with;"""
if old not in s:
    sys.exit("approx-audit: this doctest's Approx is not the one the audit knows")
open(p, "w").write(s.replace(old, new))
EOF
g++ -O1 -std=c++20 -I"$work" -I"$root" -c "$root/tests/main.cpp" -o "$work/main.o"
link=$(sed "s|CMakeFiles/terayee_tests.dir/tests/main.cpp.o|$work/main.o|; s|-o terayee_tests |-o $work/audit |" \
  "$build/CMakeFiles/terayee_tests.dir/link.txt")
(cd "$build" && eval "$link")
(cd "$build" && "$work/audit" > "$work/out.txt" 2>&1) || true
grep "approx-audit:" "$work/out.txt" | sed 's/ERROR: //; s/ THREW exception: / /' | sort -u || true
echo "approx-audit: $(grep -c 'approx-audit:' "$work/out.txt" || true) comparison(s) passed by the absolute term"
