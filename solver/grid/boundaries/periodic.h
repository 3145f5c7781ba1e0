/// \file periodic.h
/// \brief The periodic boundary: the ghost line past each periodic edge holds a copy of
/// the line on the opposite edge, written just before anything reads it.
///
/// Along x, per row: Ey and Ez of column nx are column 0's before the row's H update reads
/// them; after everything that adds to H, Hy and Hz of column -1 are column nx-1's (the E
/// update reads them) and Hx of column nx is column 0's (the magnetic gather of the seam's
/// last cell reads it, so that gather and scatter stay transposes across the seam).
/// Along y: E of row 0 is copied to the ghost row ny before the sweep, H of row ny-1 to
/// the ghost row -1 before row 0's E update.
#pragma once
#include <algorithm>

namespace ty::periodic {

/// Row pointers at column 0 (the ghost columns are -1 and nx).
template <class R>
inline void e_ghosts_x(R* ey, R* ez, int nx) {
  ez[nx] = ez[0], ey[nx] = ey[0];
}
template <class R>
inline void h_ghosts_x(R* hx, R* hy, R* hz, int nx) {
  hy[-1] = hy[nx - 1], hz[-1] = hz[nx - 1], hx[nx] = hx[0];
}
/// One whole row (its ghosts and padding included) of stride elements onto another.
template <class R>
inline void copy_row(const R* from, R* to, long stride) {
  std::copy_n(from, stride, to);
}
/// Index k wrapped into [0, n).
inline int wrap(int k, int n) { return (k % n + n) % n; }

}  // namespace ty::periodic
