/// \file electric_wall.h
/// \brief The electric wall (perfect electric conductor): tangential E is zero on it. The
/// low-side wall runs through the first E nodes (column or row 0), whose update
/// coefficients are set to zero; the high side is the zero ghost line past the last node,
/// which nothing writes. H needs nothing: its normal component follows.
#pragma once
#include <cstddef>
#include <vector>

namespace ty::electric_wall {

/// Row j's E coefficients (ca, cb of each component, columns 0 .. nx-1) with the wall's
/// tangential E held at zero: across x, Ey and Ez of column 0; across y, Ex and Ez of row 0.
inline void hold_row_coefficients(bool across_x, int j, std::vector<double> (&ca)[3], std::vector<double> (&cb)[3],
                                  int nx) {
  auto zero = [&](int c, int i) { ca[c][i] = cb[c][i] = 0; };
  if (across_x)
    zero(1, 0), zero(2, 0);
  else if (j == 0)
    for (int i = 0; i < nx; ++i) zero(0, i), zero(2, i);
}

}  // namespace ty::electric_wall
