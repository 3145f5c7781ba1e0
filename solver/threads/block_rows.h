/// \file block_rows.h
/// \brief How a sweep's rows are cut among threads (and ranks' rows among their threads):
/// contiguous blocks, either of equal size (block_rows) or of equal work (work_rows: a
/// scene whose magnetic crystal fills part of the grid has rows of very different cost).
/// Every value a step computes is the same whatever the cut (the solver's sweeps are
/// written so), so the cut decides only the speed.
#pragma once
#include <algorithm>
#include <vector>

namespace ty {

/// Rows [lo, hi) of thread t of nt: contiguous blocks whose sizes differ by at most one.
inline void block_rows(int n, int t, int nt, int& lo, int& hi) {
  const int q = n / nt, r = n % nt;
  lo = t * q + (t < r ? t : r);
  hi = lo + q + (t < r ? 1 : 0);
}

/// Rows [lo, hi) of thread t of nt cut by work, out of rows [a, b) (a rank's rows; all rows:
/// 0, n): work[j] is the summed cost of rows 0 .. j-1 (work[0] = 0, non-decreasing, one
/// entry more than the grid's rows); thread t starts at the first row whose preceding work
/// reaches work[a] + t / nt of the range's. No work table: block_rows over the range.
inline void work_rows(const std::vector<double>& work, int a, int b, int t, int nt, int& lo, int& hi) {
  if (work.size() < static_cast<std::size_t>(b) + 1) {
    block_rows(b - a, t, nt, lo, hi);
    lo += a, hi += a;
    return;
  }
  auto start = [&](int k) {
    if (k <= 0) return a;
    if (k >= nt) return b;
    const double share = work[a] + (work[b] - work[a]) * k / nt;
    return static_cast<int>(std::lower_bound(work.begin() + a, work.begin() + b, share) - work.begin());
  };
  lo = start(t);
  hi = start(t + 1);
}

}  // namespace ty
