/// \file permittivity.cpp
/// \brief eps(omega) per principal axis, rotated into the scene frame, with conductivity.
#include "materials/permittivity/permittivity.h"

#include <cmath>

#include "io/scene/constants.h"

namespace ty {

using cd = std::complex<double>;
using constants::pi;

cd axis_permittivity(const PermittivityModel& m, double omega) {
  cd eps = m.eps_inf;
  for (const LorentzTerm& t : m.lorentz) {  // Born & Huang ch. 2: damped oscillator
    const double w0 = 2 * pi * t.f_to, g = 2 * pi * t.damping;
    eps += t.delta_eps * w0 * w0 / cd(w0 * w0 - omega * omega, -omega * g);
  }
  for (const DrudeTerm& t : m.drude) {  // Ashcroft & Mermin ch. 1: free carriers
    const double wp = 2 * pi * t.plasma, c = 2 * pi * t.collision;
    eps -= wp * wp / cd(omega * omega, omega * c);
  }
  return eps;
}

Mat3c tensor_permittivity(const PermittivityTensor& t, double omega) {
  const cd eu = axis_permittivity(t.axis[0], omega), ev = axis_permittivity(t.axis[1], omega);
  const double c = std::cos(t.rotate), s = std::sin(t.rotate);
  Mat3c e = Mat3c::Zero();
  e(0, 0) = eu * c * c + ev * s * s;
  e(1, 1) = eu * s * s + ev * c * c;
  e(0, 1) = e(1, 0) = (eu - ev) * s * c;
  e(2, 2) = axis_permittivity(t.axis[2], omega);
  return e;
}

Mat3c medium_permittivity(const Medium& m, double omega) {
  Mat3c e = Mat3c::Zero();
  if (m.tensor)
    e = tensor_permittivity(*m.tensor, omega);
  else
    for (int c = 0; c < 3; ++c) e(c, c) = m.permittivity[c];
  if (m.conductivity > 0) e += cd(0, m.conductivity / (constants::eps0 * omega)) * Mat3c::Identity();
  return e;
}

double lo_frequency(const PermittivityModel& m, const LorentzTerm& t) {
  return t.f_to * std::sqrt(1 + t.delta_eps / m.eps_inf);
}

}  // namespace ty
