/// \file electric_wall.h
/// \brief The electric wall (perfect electric conductor): tangential E is zero on it. The
/// low-side wall runs through the first E nodes (column or row 0), whose update
/// coefficients are set to zero; the high side is the zero ghost line past the last node,
/// which nothing writes. H needs nothing: its normal component follows.
#pragma once
#include <cstddef>
#include <vector>

namespace ty::electric_wall {

/// Zeroes ca and cb ([component][j * nx + i], components Ex Ey Ez) of the E nodes
/// tangential to the low-side wall across x (Ey, Ez at i = 0) or across y (Ex, Ez at j = 0).
inline void hold_coefficients(bool across_x, std::vector<double> (&ca)[3], std::vector<double> (&cb)[3], int nx,
                              int ny) {
  auto zero = [&](int c, int i, int j) {
    ca[c][static_cast<size_t>(j) * nx + i] = 0;
    cb[c][static_cast<size_t>(j) * nx + i] = 0;
  };
  if (across_x)
    for (int j = 0; j < ny; ++j) zero(1, 0, j), zero(2, 0, j);
  else
    for (int i = 0; i < nx; ++i) zero(0, i, 0), zero(2, i, 0);
}

}  // namespace ty::electric_wall
