/// \file focus.cpp
/// \brief The focal spot of an intensity map (see focus.h).
#include "io/analysis/focus.h"

#include <algorithm>
#include <cmath>

namespace ty {
namespace {

// vertex of the parabola through (-1, a), (0, b), (1, c), in units of the spacing
double vertex(double a, double b, double c) {
  const double d = a - 2 * b + c;
  return d < 0 ? 0.5 * (a - c) / d : 0.0;
}

// full width at `half` along a line of samples v at positions s, through the maximum at k
double fwhm(const std::vector<double>& s, const std::vector<double>& v, size_t k, double half) {
  size_t a = k, b = k;
  while (a > 0 && v[a - 1] > half) --a;
  while (b + 1 < v.size() && v[b + 1] > half) ++b;
  if (a == 0 || b + 1 == v.size()) return std::nan("");  // the spot reaches the map's edge
  const double left = s[a - 1] + (half - v[a - 1]) / (v[a] - v[a - 1]) * (s[a] - s[a - 1]);
  const double right = s[b] + (half - v[b]) / (v[b + 1] - v[b]) * (s[b + 1] - s[b]);
  return right - left;
}

}  // namespace

Focus find_focus(const IntensityMap& m) {
  const size_t nx = m.x.size(), ny = m.y.size();
  Focus f;
  size_t& bi = f.i;
  size_t& bj = f.j;
  for (size_t j = 0; j < ny; ++j)
    for (size_t i = 0; i < nx; ++i)
      if (m.at(i, j) > m.at(bi, bj)) bi = i, bj = j;
  f.x = m.x[bi], f.y = m.y[bj];
  if (bi > 0 && bi + 1 < nx) f.x += vertex(m.at(bi - 1, bj), m.at(bi, bj), m.at(bi + 1, bj)) * (m.x[1] - m.x[0]);
  if (bj > 0 && bj + 1 < ny) f.y += vertex(m.at(bi, bj - 1), m.at(bi, bj), m.at(bi, bj + 1)) * (m.y[1] - m.y[0]);
  f.row.resize(nx), f.column.resize(ny);
  for (size_t i = 0; i < nx; ++i) f.row[i] = m.at(i, bj);
  for (size_t j = 0; j < ny; ++j) f.column[j] = m.at(bi, j);
  f.peak = m.at(bi, bj);
  f.fwhm_x = fwhm(m.x, f.row, bi, 0.5 * f.peak);
  f.fwhm_y = fwhm(m.y, f.column, bj, 0.5 * f.peak);
  return f;
}

double peak_of(const IntensityMap& m) {
  double p = 0;
  for (double v : m.I) p = std::max(p, v);
  return p;
}

}  // namespace ty
