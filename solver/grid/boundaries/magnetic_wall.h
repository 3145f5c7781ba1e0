/// \file magnetic_wall.h
/// \brief The magnetic wall (perfect magnetic conductor): tangential H is zero on it. The
/// high-side wall runs through the last H nodes tangential to it (Hy, Hz of column nx-1;
/// Hx, Hz of row ny-1), held at zero after everything that adds to H; the low side is the
/// zero ghost line below the first nodes. No magnetic cell sits on the wall.
#pragma once

namespace ty::magnetic_wall {

/// Row pointers at column 0; last_row: j == ny-1 with a wall across y.
template <class R>
inline void hold_h_x(R* hy, R* hz, int nx) {
  hy[nx - 1] = 0, hz[nx - 1] = 0;
}
template <class R>
inline void hold_h_y(R* hx, R* hz, int nx) {
  for (int i = 0; i < nx; ++i) hx[i] = 0, hz[i] = 0;
}
/// Whether the cell (i, j) of an nx x ny grid lies on a magnetic wall (wall_x, wall_y:
/// which axes end in one).
inline bool on_wall(int i, int j, int nx, int ny, bool wall_x, bool wall_y) {
  return (wall_x && i == nx - 1) || (wall_y && j == ny - 1);
}

}  // namespace ty::magnetic_wall
