/// \file test_ade_node.cpp
/// \brief One dispersive node with no wave (k = 0): the E update without a curl. A uniform
/// polar crystal left alone rings at its LO frequency, where eps(omega) = 0 (Born & Huang,
/// Dynamical Theory of Crystal Lattices, ch. 2); the trapezoidal ADE step realises
/// eps(W_d), W_d = (2/dt) tan(omega dt/2) (ade.h), so it rings at
/// omega = (2/dt) atan(w_LO dt/2) [derived], which tends to w_LO with error -(w_LO dt)^2/12.
/// Without damping the ringing keeps its amplitude for 1e5 steps also at w_TO dt = 3, above
/// the limit 2 of the explicit central-difference oscillator.
#include <doctest/doctest.h>

#include <cmath>

#include "io/scene/constants.h"
#include "materials/permittivity/permittivity.h"
#include "solver/media/dispersive_cells.h"

using namespace ty;
using constants::pi;

namespace {

struct Ringing {
  double omega = 0;            ///< from the mean period between upward zero crossings
  double first = 0, last = 0;  ///< peak |E - E_static| over the first and last tenth
};

/// Rings a node of model m (undamped unless m says so) from E = 1, P = 0 for `steps` steps.
Ringing ring(const PermittivityModel& m, double dt, long steps) {
  DispersiveCells d;
  d.half_dt = 0.5 * dt;
  d.row_first = {0, 1};
  d.index = {0};
  d.comp = {0};
  d.pole_first.push_back(0);
  append_poles(m, 1.0, dt, d.poles);
  d.pole_first.push_back(static_cast<int>(d.poles.size()));
  double sum_c3 = 0;
  for (const AdePole& q : d.poles) sum_c3 += q.c3;
  const AdeNode k = ade_node(m.eps_inf, 0, sum_c3, dt);
  d.corr = {k.corr};
  d.p.assign(d.poles.size(), 0.0);
  d.j.assign(d.poles.size(), 0.0);
  d.e_old = {0.0};
  double e = 1;
  double* E[3] = {&e, &e, &e};
  // D = eps_inf E + P is conserved without a curl; at rest E = eps_inf / eps(0), and free
  // carriers (a Drude term) screen it to zero
  const double e_static = m.drude.empty() ? m.eps_inf / axis_permittivity(m, 0.0).real() : 0.0;
  Ringing r;
  double prev = e - e_static, t_first = -1, t_last = -1;
  long crossings = 0;
  for (long n = 1; n <= steps; ++n) {
    d.before_row(0, E);
    e = k.ca * e;  // no curl
    d.after_row(0, E);
    const double x = e - e_static;
    if (prev < 0 && x >= 0) {  // upward crossing, interpolated
      const double t = n - 1 + prev / (prev - x);
      if (t_first < 0) t_first = t;
      t_last = t;
      ++crossings;
    }
    prev = x;
    if (n < steps / 10) r.first = std::max(r.first, std::abs(x));
    if (n > steps - steps / 10) r.last = std::max(r.last, std::abs(x));
  }
  r.omega = 2 * pi * (crossings - 1) / ((t_last - t_first) * dt);
  return r;
}

}  // namespace

TEST_CASE("ADE node: a polar crystal at k = 0 rings at its LO frequency, bilinear-warped") {
  // GaAs, from memory (Blakemore, J. Appl. Phys. 53, R123 (1982)): eps_inf 10.89, TO 8.02 THz, LO 8.75 THz
  PermittivityModel gaas;
  gaas.eps_inf = 10.89;
  gaas.lorentz = {{8.02e12, strength_from_lo(10.89, 8.02e12, 8.75e12), 0}};
  const double w_lo = 2 * pi * 8.75e12;
  double err_prev = 0;
  for (double wdt : {0.4, 0.2, 0.1}) {
    const double dt = wdt / w_lo;
    const Ringing r = ring(gaas, dt, 20000);
    const double warped = 2 / dt * std::atan(0.5 * w_lo * dt);
    CHECK(r.omega == doctest::Approx(warped).epsilon(1e-6));
    const double err = r.omega / w_lo - 1;
    // second order: the warp's series (2/x) atan(x/2) = 1 - x^2/12 + x^4/80 - x^6/448 (the
    // arctangent's Taylor series), x = w_LO dt; relative (scale 0: doctest's Approx otherwise
    // adds an absolute 0.02, which passed any error under 0.02 against 0.0133)
    CHECK(err == doctest::Approx(-wdt * wdt / 12 + std::pow(wdt, 4) / 80).epsilon(2e-3).scale(0));
    if (err_prev != 0) CHECK(err_prev / err == doctest::Approx(4).epsilon(0.02));
    err_prev = err;
    MESSAGE("w_LO dt = " << wdt << ": frequency error " << err);
  }
}

TEST_CASE("ADE node: undamped ringing keeps its amplitude for 1e5 steps, also at w_TO dt = 3") {
  PermittivityModel m;
  m.eps_inf = 1;  // a bare strong oscillator and a Drude term: the hardest case for the step
  m.lorentz = {{8e12, 5.0, 0}};
  m.drude = {{3e12, 0}};
  const double dt = 3 / (2 * pi * 8e12);
  const Ringing r = ring(m, dt, 100000);
  MESSAGE("amplitude first " << r.first << ", last " << r.last);
  CHECK(std::isfinite(r.last));
  CHECK(r.last < 1.02 * r.first);
  CHECK(r.last > 0.5 * r.first);  // no numerical damping to speak of either
  // with damping the ringing decays
  m.lorentz[0].damping = 0.2e12;
  m.drude[0].collision = 0.2e12;
  const Ringing d = ring(m, dt, 100000);
  CHECK(d.last < 1e-6 * d.first);
}
