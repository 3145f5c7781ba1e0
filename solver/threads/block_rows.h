/// \file block_rows.h
/// \brief How a sweep's rows are cut among threads (and ranks' rows among their threads):
/// contiguous blocks whose sizes differ by at most one, the same cut for any run.
#pragma once

namespace ty {

/// Rows [lo, hi) of thread t of nt: contiguous blocks whose sizes differ by at most one.
inline void block_rows(int n, int t, int nt, int& lo, int& hi) {
  const int q = n / nt, r = n % nt;
  lo = t * q + (t < r ? t : r);
  hi = lo + q + (t < r ? 1 : 0);
}

}  // namespace ty
