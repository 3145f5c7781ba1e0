/// \file crystal_axes.cpp
/// \brief Cuts and Euler rotations of a crystal's axes (conventions in crystal_axes.h).
#include "io/scene/crystals/crystal_axes.h"

#include <algorithm>
#include <cmath>

namespace ty {

Rot3 cut_rotation(char axis) {
  // columns: where a, b, c go
  switch (axis) {
    case 'a':
      return Rot3{{{0, 1, 0}, {0, 0, 1}, {1, 0, 0}}};  // a -> z, b -> x, c -> y
    case 'b':
      return Rot3{{{0, 0, 1}, {1, 0, 0}, {0, 1, 0}}};  // b -> z, c -> x, a -> y
    default:
      return Rot3{{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}};
  }
}

Rot3 euler_rotation(double phi, double theta, double psi) {
  auto rz = [](double t) { return Rot3{{{std::cos(t), -std::sin(t), 0}, {std::sin(t), std::cos(t), 0}, {0, 0, 1}}}; };
  const Rot3 rx{{{1, 0, 0}, {0, std::cos(theta), -std::sin(theta)}, {0, std::sin(theta), std::cos(theta)}}};
  return rz(phi) * rx * rz(psi);
}

Rot3 operator*(const Rot3& a, const Rot3& b) {
  Rot3 c{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      for (int k = 0; k < 3; ++k) c[i][j] += a[i][k] * b[k][j];
  return c;
}

std::array<double, 3> operator*(const Rot3& r, const std::array<double, 3>& v) {
  std::array<double, 3> o{};
  for (int i = 0; i < 3; ++i)
    for (int k = 0; k < 3; ++k) o[i] += r[i][k] * v[k];
  return o;
}

bool rotate_diagonal(const Rot3& r, const std::array<double, 3>& e, std::array<double, 3>& out) {
  Rot3 t{};
  double largest = 0, off = 0;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      for (int k = 0; k < 3; ++k) t[i][j] += r[i][k] * e[k] * r[j][k];
      largest = std::max(largest, std::abs(t[i][j]));
      if (i != j) off = std::max(off, std::abs(t[i][j]));
    }
  if (off > 1e-9 * largest) return false;
  out = {t[0][0], t[1][1], t[2][2]};
  return true;
}

}  // namespace ty
