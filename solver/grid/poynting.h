/// \file poynting.h
/// \brief The Poynting vector, written once: the in-plane part of S = E x H of
/// instantaneous fields, and of the complex S = 1/2 E x H* of phasors, whose real part is
/// the time average (Jackson, Classical Electrodynamics, 3rd ed., eqs. 6.109 and 6.132).
/// Only Sx and Sy are needed in a 2D scene: Sz carries no power across the plane's lines.
#pragma once
#include <array>
#include <complex>

namespace ty {

/// (Sx, Sy) of E x H, E and H in SI.
inline std::array<double, 2> poynting(const double E[3], const double H[3]) {
  return {E[1] * H[2] - E[2] * H[1], E[2] * H[0] - E[0] * H[2]};
}

/// (Sx, Sy) of the complex Poynting vector 1/2 E x H* of phasors (exp(-i w t) convention).
inline std::array<std::complex<double>, 2> poynting(const std::complex<double> E[3], const std::complex<double> H[3]) {
  return {0.5 * (E[1] * std::conj(H[2]) - E[2] * std::conj(H[1])),
          0.5 * (E[2] * std::conj(H[0]) - E[0] * std::conj(H[2]))};
}

}  // namespace ty
