/// \file test_fresnel.cpp
/// \brief Normal-incidence reflection from a dielectric half-space: a plane-wave pulse
/// launched by the one-sided line source, the reflected wave recorded behind the launch
/// line (only scattered field lives there), normalised by the incident spectrum of a
/// run without the half-space. r = (1 - n)/(1 + n) for the tangential E (Born & Wolf,
/// Principles of Optics, 7th ed., sec. 1.5.2), so the Ez of the Ez wave reflects with a
/// negative sign and the Hz of the Hz wave with a positive one. The remaining error is the
/// grid's own, second order in the cell: it is checked to scale as N^-2 (N cells per
/// wavelength in the medium) and to stay under 0.5% from N = 32 on, in double and in single
/// precision, whose worst errors must agree (rounding adds nothing measurable to the grid's).
#include <doctest/doctest.h>

#include "solver/recorders/recorders.h"
#include "solver/simulation.h"
#include "tests/helpers.h"
#include "tests/solver/half_space.h"

using namespace ty;

namespace {

constexpr double kCell = 5e-6;
constexpr int kNx = 700, kNy = 2;
constexpr double kLaunch = 200 * kCell, kInterface = 400 * kCell, kProbe = 100 * kCell;

template <class R>
std::vector<double> run(Component pol, double eps, bool with_body, double probe_x, double* dt) {
  Scene s = test::box_scene(kNx, kNy, kCell, Boundary::absorbing, Boundary::periodic, 0.95, 1e-9);
  if (with_body) test::add_half_space(s, eps, kInterface, kNx, kNy, kCell);
  const Source src = test::plane_pulse(pol, kLaunch, 0.6e12, 1.0e-12, 3.0e-12, 1e3);
  s.sources.push_back(src);
  Simulation<R> sim(s, 2);
  *dt = sim.grid().dt;
  return test::probe_series(sim, pol, {probe_x, 0.5 * kNy * kCell}, static_cast<long>(30e-12 / *dt));
}

/// The worst relative |r| error over the band, double or single precision (float fields, the
/// probes' sums and spectra in double either way).
template <class R>
double fresnel_worst(Component pol, double eps) {
  const double n = std::sqrt(eps), r_e = (1 - n) / (1 + n);
  const double expected = pol == Component::Ez ? r_e : -r_e;  // Hz reflects with the opposite sign
  double dt = 0;
  const auto reflected = run<R>(pol, eps, true, kProbe, &dt);
  const auto incident = run<R>(pol, eps, false, kInterface, &dt);
  const double tau = (kInterface - kProbe) / constants::c0;  // extra path of the reflected wave
  double worst = 0, fmax_checked = 0, c_lo = 1e9, c_hi = 0;
  int checked = 0;
  for (double f = 0.2e12; f <= 1.0e12; f += 0.05e12) {
    const double cells_per_wavelength = constants::c0 / (f * n) / kCell;
    if (cells_per_wavelength < 30) continue;
    const auto I = test::dft(incident, dt, f), Rf = test::dft(reflected, dt, f);
    const std::complex<double> r =
        Rf / I * std::complex<double>(std::cos(2 * constants::pi * f * tau), -std::sin(2 * constants::pi * f * tau));
    const double err = std::abs(std::abs(r) / std::abs(expected) - 1);
    // 0.5% from 32 cells per wavelength in the medium up (measured: the error is the
    // grid's second-order one, 0.50% (31.6/N)^2, so 0.55% at exactly 30 cells)
    if (cells_per_wavelength >= 32) worst = std::max(worst, err);
    // second order: err N^2 is the same constant across the band
    if (cells_per_wavelength < 100) {
      const double c = err * cells_per_wavelength * cells_per_wavelength;
      c_lo = std::min(c_lo, c), c_hi = std::max(c_hi, c);
    }
    // the sign: the phase of r, after removing the path, is 0 or pi to within the
    // half-cell uncertainty of the interface position
    CHECK(r.real() * expected > 0.9 * std::abs(r) * std::abs(expected));
    fmax_checked = f;
    ++checked;
  }
  MESSAGE(std::string(component_name(pol)) << " wave, eps = " << eps << (sizeof(R) == 4 ? ", single" : ", double")
                              << ": worst |r| error " << worst * 100 << "% over 0.2-" << fmax_checked / 1e12
                              << " THz (" << checked << " frequencies)");
  CHECK(checked >= 10);
  CHECK(worst < 0.005);
  MESSAGE("  error x N^2 from " << c_lo << " to " << c_hi);
  CHECK(c_hi / c_lo < 1.15);
  return worst;
}

}  // namespace

TEST_CASE("Fresnel reflection at normal incidence, both polarizations, double and single precision") {
  for (Component pol : {Component::Ez, Component::Hz}) {
    for (double eps : {4.0, 2.25}) {
      const double dbl = fresnel_worst<double>(pol, eps), sgl = fresnel_worst<float>(pol, eps);
      // single precision: the same grid error, plus rounding of ~1e-7 relative per step that the
      // leapfrog does not accumulate (measured: the worst errors agree to 5e-7)
      CHECK(std::abs(sgl - dbl) < 1e-5);
    }
  }
}
