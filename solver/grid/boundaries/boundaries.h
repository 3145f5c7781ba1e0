/// \file boundaries.h
/// \brief The grid's edges, one small interface over the kinds (periodic.h,
/// electric_wall.h, magnetic_wall.h; the absorbing kind is the CPML, cpml.h and
/// absorber_hooks.cpp): the step calls these hooks at fixed points of its row sweep and
/// each kind acts at the hooks it needs.
///   build:                hold_e_row (electric walls), cell_allowed and
///                         neighbour (where magnetic cells may sit and who their
///                         neighbours are across an edge)
///   before the sweep:     before_sweep (periodic y: E row 0 to the ghost row ny)
///   before H of row j:    before_h_row (periodic x: E ghost column nx)
///   after all H of row j: after_h_row (magnetic walls; periodic x: H ghost columns)
///   before E of row 0:    before_first_e_row (periodic y: H row ny-1 to the ghost row -1)
/// Bloch x sides (bloch.h) join two copies of the fields: Simulation::step_pair writes their
/// ghosts at the points where the periodic x side writes its own; these hooks leave them.
#pragma once
#include <vector>

#include "io/scene/scene.h"
#include "solver/grid/boundaries/electric_wall.h"
#include "solver/grid/boundaries/magnetic_wall.h"
#include "solver/grid/boundaries/periodic.h"
#include "solver/grid/yee_grid.h"

namespace ty {

struct Boundaries {
  bool periodic_x = false, periodic_y = false;
  bool electric_x = false, electric_y = false;
  bool magnetic_x = false, magnetic_y = false;
  bool bloch_x = false;

  static Boundaries of(const GridSpec& G) {
    Boundaries b;
    b.periodic_x = G.bx == Boundary::periodic, b.periodic_y = G.by == Boundary::periodic;
    b.electric_x = G.bx == Boundary::electric_wall, b.electric_y = G.by == Boundary::electric_wall;
    b.magnetic_x = G.bx == Boundary::magnetic_wall, b.magnetic_y = G.by == Boundary::magnetic_wall;
    b.bloch_x = G.bx == Boundary::bloch;
    return b;
  }

  /// Row j's E coefficients (columns 0 .. nx-1) held where an electric wall stands.
  void hold_e_row(int j, std::vector<double> (&ca)[3], std::vector<double> (&cb)[3], int nx) const {
    if (electric_x) electric_wall::hold_row_coefficients(true, j, ca, cb, nx);
    if (electric_y) electric_wall::hold_row_coefficients(false, j, ca, cb, nx);
  }
  bool cell_allowed(int i, int j, int nx, int ny) const {
    return !magnetic_wall::on_wall(i, j, nx, ny, magnetic_x, magnetic_y);
  }
  /// Cell (i, j) wrapped across periodic edges (and Bloch x sides, where the neighbour's value
  /// is the phase-shifted one of both copies: Simulation::seam_value); false when it lies off
  /// the grid.
  bool neighbour(int& i, int& j, int nx, int ny) const {
    if (periodic_x || bloch_x) i = periodic::wrap(i, nx);
    if (periodic_y) j = periodic::wrap(j, ny);
    return i >= 0 && i < nx && j >= 0 && j < ny;
  }

  /// F: the six field arrays (Ex .. Hz), each indexed by YeeGrid::at.
  template <class R>
  void before_sweep(R* const* F, const YeeGrid& g) const {
    if (periodic_y)
      for (int c = 0; c < 3; ++c) periodic::copy_row(F[c] + g.row_begin(0), F[c] + g.row_begin(g.ny), g.stride);
  }
  /// ey, ez: row j's pointers at column 0.
  template <class R>
  void before_h_row(R* ey, R* ez, int nx) const {
    if (periodic_x) periodic::e_ghosts_x(ey, ez, nx);
  }
  template <class R>
  void after_h_row(R* const* F, int j, const YeeGrid& g) const {
    const long o = g.at(0, j);
    if (magnetic_x) magnetic_wall::hold_h_x(F[4] + o, F[5] + o, g.nx);
    if (magnetic_y && j == g.ny - 1) magnetic_wall::hold_h_y(F[3] + o, F[5] + o, g.nx);
    if (periodic_x) periodic::h_ghosts_x(F[3] + o, F[4] + o, F[5] + o, g.nx);
  }
  template <class R>
  void before_first_e_row(R* const* F, const YeeGrid& g) const {
    if (periodic_y)
      for (int c = 3; c < 6; ++c) periodic::copy_row(F[c] + g.row_begin(g.ny - 1), F[c] + g.row_begin(-1), g.stride);
  }
};

}  // namespace ty
