/// \file focus.h
/// \brief The focal spot in an intensity map I(x, y) = |E|^2: the maximum, its position
/// refined by the vertex of the parabola through it and its two neighbours along each axis
/// (three-point peak interpolation), and the full widths at half maximum across and along
/// the axis of focus (linear interpolation of the two half-maximum crossings on the row and
/// the column through the maximum).
#pragma once
#include <cstddef>
#include <vector>

namespace ty {

/// One frequency's intensity on a map's nodes, [y][x].
struct IntensityMap {
  std::vector<double> x, y, I;
  double frequency = 0;
  double at(size_t i, size_t j) const { return I[j * x.size() + i]; }
};

struct Focus {
  double x = 0, y = 0;              ///< refined peak position, m
  double peak = 0;                  ///< the largest sample, (V/m)^2
  double fwhm_x = 0, fwhm_y = 0;    ///< along x (the row) and along y (the column); NaN where the spot reaches the edge
  size_t i = 0, j = 0;              ///< the node of the largest sample
  std::vector<double> row, column;  ///< the intensity through that node along x and along y
};

Focus find_focus(const IntensityMap& m);

/// The largest value of a map (the reference run's incident peak).
double peak_of(const IntensityMap& m);

}  // namespace ty
