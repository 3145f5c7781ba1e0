/// \file test_cavity.cpp
/// \brief A 2D rectangular perfect-conductor cavity (electric walls on all four sides).
/// Resonances f_mn = (c/2) sqrt((m/a)^2 + (n/b)^2) (Pozar, Microwave Engineering, 4th ed.,
/// sec. 6.3), moved by the grid's dispersion to
///   sin(pi f dt) / (c dt) = sqrt(sin^2(m pi dx / 2a)/dx^2 + sin^2(n pi dy / 2b)/dy^2)
/// (Taflove & Hagness, 3rd ed., eq. 4.15 with k = (m pi/a, n pi/b)); TM (Ez) modes have
/// m, n >= 1, TE (Hz) modes allow one index to be 0. The undriven cavity at step-fraction 0.99
/// keeps its field energy over 10^5 steps: the leapfrog invariant
///   W^n = sum eps0 |E^n|^2 + mu0 H^{n-1/2} . H^{n+1/2}
/// (the discrete energy of the Yee scheme; e.g. Taflove & Hagness, 3rd ed., sec. 4.7 on
/// its stability) is constant up to round-off.
#include <doctest/doctest.h>

#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

double yee_mode(int m, int n, double a, double b, double d, double dt) {
  const double c = constants::c0;
  const double rhs = std::sqrt(std::pow(std::sin(m * constants::pi * d / (2 * a)) / d, 2) +
                               std::pow(std::sin(n * constants::pi * d / (2 * b)) / d, 2));
  return std::asin(c * dt * rhs) / (constants::pi * dt);
}

// peak of |X(f)| (Hann-windowed) near f0, by golden-section search
double peak_near(const std::vector<double>& x, double dt, double f0) {
  std::vector<double> w(x.size());
  for (size_t n = 0; n < x.size(); ++n) w[n] = x[n] * (0.5 - 0.5 * std::cos(2 * constants::pi * n / (x.size() - 1)));
  double lo = f0 * 0.997, hi = f0 * 1.003;
  // coarse scan first, then refine
  double best = lo, bv = 0;
  for (int k = 0; k <= 60; ++k) {
    const double f = lo + (hi - lo) * k / 60;
    const double v = std::abs(test::dft(w, dt, f));
    if (v > bv) bv = v, best = f;
  }
  lo = best - (hi - lo) / 60;
  hi = best + (hi - lo) / 60;
  const double g = 0.5 * (std::sqrt(5.0) - 1);
  for (int it = 0; it < 40; ++it) {
    const double a = hi - g * (hi - lo), b = lo + g * (hi - lo);
    if (std::abs(test::dft(w, dt, a)) > std::abs(test::dft(w, dt, b))) hi = b; else lo = a;
  }
  return 0.5 * (lo + hi);
}

// W^n from E^n and H^{n-1/2} now and H^{n+1/2} after one more step (which it takes)
double leapfrog_energy(Simulation<double>& sim) {
  const YeeGrid& g = sim.grid();
  double we = 0, wh = 0;
  std::vector<double> h_old(3 * g.cells());
  for (int j = 0; j < g.ny; ++j)
    for (int i = 0; i < g.nx; ++i)
      for (int c = 0; c < 3; ++c) {
        const double e = sim.at(static_cast<Component>(c), i, j);
        we += e * e;
        h_old[(static_cast<size_t>(j) * g.nx + i) * 3 + c] = sim.at(static_cast<Component>(c + 3), i, j);
      }
  sim.step();
  for (int j = 0; j < g.ny; ++j)
    for (int i = 0; i < g.nx; ++i)
      for (int c = 0; c < 3; ++c)
        wh += h_old[(static_cast<size_t>(j) * g.nx + i) * 3 + c] * sim.at(static_cast<Component>(c + 3), i, j);
  return 0.5 * constants::eps0 * (we + wh);  // eta0 H is stored: mu0 H^2 = eps0 (eta0 H)^2
}

}  // namespace

TEST_CASE("perfect-conductor cavity: resonances and bounded energy over 1e5 steps") {
  const int nx = 40, ny = 30;
  const double d = 10e-6, a = nx * d, b = ny * d;
  Scene s = test::box_scene(nx, ny, d, Boundary::electric_wall, Boundary::electric_wall, 0.99, 1e-9);
  // broadband kicks of both polarizations, off every symmetry line
  s.sources.push_back(test::point_source(Component::Ez, {0.37 * a, 0.29 * b}, 1.0e12, 0.3e-12, 1.2e-12, 1e-3));
  s.sources.push_back(test::point_source(Component::Hz, {0.23 * a, 0.61 * b}, 1.0e12, 0.3e-12, 1.2e-12, 1e-1));
  Simulation<double> sim(s, 2);
  const double dt = sim.grid().dt;
  const long quiet = 400;  // the pulses are over by then
  const long steps = 100000;
  std::vector<double> ez, hz, energy;
  for (long n = 0; n < steps; ++n) {
    if (n >= quiet && n % 1000 == 0) energy.push_back(leapfrog_energy(sim));  // takes this step
    else sim.step();
    if (n < quiet) continue;
    ez.push_back(sim.at(Component::Ez, 29, 19));
    hz.push_back(sim.at(Component::Hz, 13, 21));
  }
  struct Mode {
    int m, n;
    bool tm;
  };
  const Mode modes[] = {{1, 1, true}, {2, 1, true}, {1, 2, true}, {3, 1, true},
                        {1, 0, false}, {0, 1, false}, {1, 1, false}, {2, 0, false}};
  for (const auto& md : modes) {
    const double f_yee = yee_mode(md.m, md.n, a, b, d, dt);
    const double f_pozar = 0.5 * constants::c0 * std::hypot(md.m / a, md.n / b);
    const double f = peak_near(md.tm ? ez : hz, dt, f_yee);
    MESSAGE((md.tm ? "TM" : "TE") << md.m << md.n << ": measured " << f / 1e9 << " GHz, Yee-corrected "
                                  << f_yee / 1e9 << " GHz, continuum " << f_pozar / 1e9 << " GHz");
    CHECK(std::abs(f / f_yee - 1) < 1e-4);  // the issue asks 1e-3; the grid does far better
  }
  // energy of the undriven cavity: no growth, no loss (lossless walls) over 1e5 steps
  double lo = energy[0], hi = energy[0], first = 0, last = 0;
  for (double e : energy) lo = std::min(lo, e), hi = std::max(hi, e);
  for (int k = 0; k < 10; ++k) first += energy[k] / 10, last += energy[energy.size() - 1 - k] / 10;
  MESSAGE("cavity energy over 1e5 steps: 1 - min/max = " << 1 - lo / hi << ", last/first - 1 = " << last / first - 1);
  CHECK(std::isfinite(hi));
  CHECK(hi / lo < 1 + 1e-9);
  CHECK(std::abs(last / first - 1) < 1e-9);
}
