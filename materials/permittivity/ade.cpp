/// \file ade.cpp
/// \brief Coefficients of the trapezoidal auxiliary-differential-equation step (ade.h).
#include "materials/permittivity/ade.h"

#include <cmath>

#include "io/scene/constants.h"
#include "materials/permittivity/permittivity.h"

namespace ty {

using constants::pi;

AdePole ade_pole(double w0, double strength, double damping, double dt) {
  const double a = 0.5 * dt, D = 1 + a * damping + a * a * w0 * w0;
  return {(1 - a * damping - a * a * w0 * w0) / D, -2 * a * w0 * w0 / D, a * strength / D};
}

void append_poles(const PermittivityModel& m, double weight, double dt, std::vector<AdePole>& out) {
  for (const LorentzTerm& t : m.lorentz) {
    const double w0 = 2 * pi * t.f_to;
    out.push_back(ade_pole(w0, weight * t.delta_eps * w0 * w0, 2 * pi * t.damping, dt));
  }
  for (const DrudeTerm& t : m.drude) {
    const double wp = 2 * pi * t.plasma;
    out.push_back(ade_pole(0, weight * wp * wp, 2 * pi * t.collision, dt));
  }
}

AdeNode ade_node(double eps_inf, double sigma, double sum_c3, double dt) {
  const double a = 0.5 * dt, x = a * (sigma / constants::eps0 + sum_c3);
  const double kp = eps_inf + x, km = eps_inf - x;
  return {km / kp, 1 / kp, a / kp};
}

std::complex<double> ade_permittivity(const PermittivityModel& m, double omega, double dt) {
  return axis_permittivity(m, 2 / dt * std::tan(0.5 * omega * dt));
}

}  // namespace ty
