/// \file node_average.h
/// \brief The six field components averaged to one Ez node (a cell corner), written once
/// for every recorder that needs them together (spectral maps, the snapshot Poynting vector).
///
/// On the Yee cell (yee_grid.h) the Ez node (i, j) is flanked by Ex(i-1, j), Ex(i, j) and
/// Hy(i-1, j), Hy(i, j) along x, by Ey(i, j-1), Ey(i, j) and Hx(i, j-1), Hx(i, j) along y,
/// and sits at the centre of Hz(i-1..i, j-1..j): the arithmetic mean of each group is its
/// value there to second order in the cell (Taflove & Hagness, Computational
/// Electrodynamics, 3rd ed., sec. 3.6.8, where the same averaging forms the Poynting vector).
#pragma once

namespace ty {

/// Flat offsets from an Ez node to the nodes each component averages over.
struct EzNodeAverage {
  long stride;  ///< row stride of the field arrays (YeeGrid::stride)

  /// v[c] for c = Ex .. Hz at the Ez node with flat index id, as stored (E in V/m, eta0 H).
  template <class R>
  void operator()(const R* const F[6], long id, double v[6]) const {
    const long s = stride;
    v[0] = 0.5 * (static_cast<double>(F[0][id]) + F[0][id - 1]);
    v[1] = 0.5 * (static_cast<double>(F[1][id]) + F[1][id - s]);
    v[2] = F[2][id];
    v[3] = 0.5 * (static_cast<double>(F[3][id]) + F[3][id - s]);
    v[4] = 0.5 * (static_cast<double>(F[4][id]) + F[4][id - 1]);
    v[5] = 0.25 * (static_cast<double>(F[5][id]) + F[5][id - 1] + F[5][id - s] + F[5][id - s - 1]);
  }
};

}  // namespace ty
