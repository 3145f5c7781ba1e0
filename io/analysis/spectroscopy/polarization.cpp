/// \file polarization.cpp
/// \brief Rotation and ellipticity of a Jones vector (see polarization.h for the basis and
/// the signs).
#include "io/analysis/spectroscopy/polarization.h"

#include <algorithm>
#include <cmath>

namespace ty {

PolarizationState rotation_ellipticity(std::complex<double> E_a, std::complex<double> E_b) {
  const std::complex<double> rho = E_b / E_a;
  const double m = std::norm(rho);
  PolarizationState s;
  s.theta = 0.5 * std::atan2(2 * rho.real(), 1 - m);
  s.eta = 0.5 * std::asin(std::clamp(2 * rho.imag() / (1 + m), -1.0, 1.0));
  return s;
}

PolarizationState jones_rotation(const Jones& J, int in, bool reflected) {
  // b = k x a: for an Ez input (a = z) b = -u, for an Hz input (a = u) b = z.
  const double sign = reflected ? -1.0 : 1.0;
  if (in == 0) return rotation_ellipticity(J[0][0], -sign * J[1][0]);
  return rotation_ellipticity(J[1][1], sign * J[0][1]);
}

}  // namespace ty
