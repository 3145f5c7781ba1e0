/// \file yee_grid.h
/// \brief The 2D Yee grid: its size, where each of the six components sits, and the
/// memory layout of a field array. The only place that knows the staggering.
///
/// Staggering (3D Yee cell with d/dz = 0; Yee, IEEE Trans. Antennas Propag. 14, 302
/// (1966); Taflove & Hagness, Computational Electrodynamics, 3rd ed., ch. 3), in cell
/// units from the grid's lower-left corner, for cell (i, j):
///   Ex (i+1/2, j)   Ey (i, j+1/2)   Ez (i, j)
///   Hx (i, j+1/2)   Hy (i+1/2, j)   Hz (i+1/2, j+1/2)
/// Arrays are [row j][column i], x contiguous, with one ghost row below and above and
/// a ghost column on each side (held at zero, or copied for periodic boundaries).
/// The grid spans the extent plus an absorbing layer of `npml` cells on each
/// absorbing side; cell (npml_x, npml_y) starts at the extent's lower-left corner.
#pragma once
#include <cstddef>

#include "io/scene/scene.h"

namespace ty {

struct YeeGrid {
  int nx = 0, ny = 0;          ///< cells in all, absorbing layers included
  int npml_x = 0, npml_y = 0;  ///< absorbing cells on each side along x and y
  double dx = 0, dy = 0;       ///< cell size, m
  double dt = 0;               ///< time step, s
  long stride = 0;             ///< row stride in elements (padded for alignment)
  long lead = 0;               ///< elements before column 0 of a row

  static constexpr double offset_x[6] = {0.5, 0.0, 0.0, 0.0, 0.5, 0.5};
  static constexpr double offset_y[6] = {0.0, 0.5, 0.0, 0.5, 0.0, 0.5};

  void init(int nx_, int ny_, int npx, int npy, double dx_, double dy_, int align_elements);

  /// Flat index of node (i, j); i in [-1, nx], j in [-1, ny].
  long at(int i, int j) const { return (static_cast<long>(j) + 1) * stride + lead + i; }
  /// Flat index where row j's storage begins (its ghost and padding included).
  long row_begin(int j) const { return (static_cast<long>(j) + 1) * stride; }
  std::size_t size() const { return static_cast<std::size_t>(ny + 2) * static_cast<std::size_t>(stride); }
  long cells() const { return static_cast<long>(nx) * ny; }

  /// Position of component c's node (i, j), internal coordinates (extent corner = 0), m.
  double x(Component c, double i) const { return (i + offset_x[static_cast<int>(c)] - npml_x) * dx; }
  double y(Component c, double j) const { return (j + offset_y[static_cast<int>(c)] - npml_y) * dy; }
  /// Fractional node index of component c at position (px, py).
  double fi(Component c, double px) const { return px / dx + npml_x - offset_x[static_cast<int>(c)]; }
  double fj(Component c, double py) const { return py / dy + npml_y - offset_y[static_cast<int>(c)]; }
};

/// The grid a scene asks for: the extent in whole cells plus the absorbing layers, and
/// the time step (`step_fraction` times the Courant limit); rows aligned to `align_elements`.
YeeGrid grid_for(const Scene& s, int align_elements);
/// Steps to reach the scene's stop time on grid g.
long steps_for(const Scene& s, const YeeGrid& g);

/// The 2D Courant limit c*dt <= 1/sqrt(dx^-2 + dy^-2) (Taflove & Hagness, eq. 4.92).
double courant_limit_dt(double dx, double dy);

}  // namespace ty
