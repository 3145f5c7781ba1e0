/// \file test_dispersive_media.cpp
/// \brief Dispersive media on the grid (trapezoidal ADE, materials/permittivity/ade.h)
/// against the closed forms with eps(omega): a polar crystal's reststrahlen reflectance
/// (Fresnel at normal incidence, Born & Wolf, Principles of Optics, 7th ed., sec. 1.5.2,
/// with n = sqrt(eps(omega))), a Drude film's transmission (the Airy formula, Born & Wolf
/// sec. 7.6), and a lossless dispersive body in a closed cavity at step-fraction 0.99 for
/// 1e5 steps (bounded fields), bit-identical for 1 and 3 threads.
#include <doctest/doctest.h>

#include <cstring>

#include "materials/permittivity/permittivity.h"
#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;
using constants::c0;
using constants::pi;
using cd = std::complex<double>;

namespace {

/// GaAs, from memory (Blakemore, J. Appl. Phys. 53, R123 (1982)): eps_inf 10.89, TO 8.02 THz,
/// LO 8.75 THz; the damping 0.25 THz is the test's own (it lets the reflection ring down).
PermittivityTensor gaas() {
  PermittivityModel m;
  m.eps_inf = 10.89;
  m.lorentz = {{8.02e12, strength_from_lo(10.89, 8.02e12, 8.75e12), 0.25e12}};
  PermittivityTensor t;
  t.axis = {m, m, m};
  return t;
}

Medium dispersive(const std::string& name, const PermittivityTensor& t) {
  Medium m;
  m.name = name;
  m.tensor = t;
  for (int c = 0; c < 3; ++c) m.permittivity[c] = t.axis[c].eps_inf;
  return m;
}

/// A slab of medium m from x0 to x1 (cells) across a 2-row periodic strip; a plane-wave
/// pulse from x = 100 cells; the series of component `probe` at x = probe_x (cells).
std::vector<double> strip(const Medium* m, double cell, int nx, double x0, double x1, Component pol, double f,
                          double fwhm, double stop, double probe_x, double* dt) {
  Scene s = test::box_scene(nx, 2, cell, Boundary::absorbing, Boundary::periodic, 0.95, stop);
  if (m) {
    s.media.push_back(*m);
    Body b;
    b.shape.kind = Shape::Kind::rectangle;
    b.shape.centre = {0.5 * (x0 + x1) * cell, cell};
    b.shape.size = {(x1 - x0) * cell, 20 * cell};
    s.bodies.push_back(b);
  }
  s.sources.push_back(test::plane_pulse(pol, 100 * cell, f, fwhm, 4 * fwhm, 1e3));
  Simulation<double> sim(s, 2);
  *dt = sim.grid().dt;
  return test::probe_series(sim, pol, {probe_x * cell, cell}, static_cast<long>(stop / *dt));
}

}  // namespace

TEST_CASE("Dispersive media: reststrahlen reflectance of a GaAs half-space against Fresnel") {
  constexpr double kCell = 0.4e-6;
  constexpr int kNx = 900;
  const Medium crystal = dispersive("GaAs", gaas());
  for (Component pol : {Component::Ez, Component::Hz}) {
    double dt = 0;
    // the crystal runs from 400 cells into the absorber; the reflection is seen at 50 cells,
    // behind the launch line, where only the scattered field is
    const auto refl = strip(&crystal, kCell, kNx, 400, kNx + 40, pol, 8.5e12, 0.1e-12, 8e-12, 50, &dt);
    const auto inc = strip(nullptr, kCell, kNx, 400, kNx + 40, pol, 8.5e12, 0.1e-12, 8e-12, 400, &dt);
    double worst = 0, in_band = 1, outside = 0;
    int checked = 0;
    for (double f = 6e12; f <= 11e12; f += 0.1e12) {
      const cd n = std::sqrt(axis_permittivity(crystal.tensor->axis[0], 2 * pi * f));
      if (c0 / (f * std::abs(n)) / kCell < 20) continue;  // too few cells per wavelength (near TO)
      const double r = std::abs((1.0 - n) / (1.0 + n));
      const double measured = std::abs(test::dft(refl, dt, f) / test::dft(inc, dt, f));
      worst = std::max(worst, std::abs(measured - r));
      if (f > 8.2e12 && f < 8.6e12) in_band = std::min(in_band, measured * measured);
      if (f < 7.0e12 || f > 10.0e12) outside = std::max(outside, measured * measured);
      ++checked;
    }
    MESSAGE(std::string(component_name(pol)) << " wave: worst |r| error " << worst << " over " << checked
                                             << " frequencies 6-11 THz; least R inside 8.2-8.6 THz " << in_band
                                             << ", most below 7 and above 10 THz " << outside);
    CHECK(checked >= 30);
    CHECK(worst < 0.01);
    CHECK(in_band > 1.5 * outside);  // the reststrahlen band stands out
  }
}

TEST_CASE("Dispersive media: a Drude film's transmission against Airy") {
  // invented parameters: a heavily doped film, plasma 3 THz, collisions 0.5 THz, 20 um thick
  constexpr double kCell = 0.5e-6, kD = 20e-6;
  PermittivityTensor t;
  t.axis[0].drude = {{3e12, 0.5e12}};
  t.axis[1] = t.axis[2] = t.axis[0];
  const Medium film = dispersive("film", t);
  double dt = 0;
  const auto trans = strip(&film, kCell, 600, 300, 300 + kD / kCell, Component::Ez, 3.5e12, 0.15e-12, 8e-12, 440, &dt);
  const auto inc = strip(nullptr, kCell, 600, 300, 340, Component::Ez, 3.5e12, 0.15e-12, 8e-12, 440, &dt);
  double worst = 0;
  int checked = 0;
  for (double f = 1e12; f <= 6e12; f += 0.1e12) {
    const double k0 = 2 * pi * f / c0;
    const cd n = std::sqrt(axis_permittivity(t.axis[2], 2 * pi * f)), z = 1.0 / n;
    const cd airy = 1.0 / (std::cos(n * k0 * kD) - cd(0, 0.5) * (z + 1.0 / z) * std::sin(n * k0 * kD));
    const double measured = std::abs(test::dft(trans, dt, f) / test::dft(inc, dt, f));
    worst = std::max(worst, std::abs(measured / std::abs(airy) - 1));
    ++checked;
  }
  MESSAGE("worst relative |t| error " << worst << " over 1-6 THz (|t| from "
                                      << std::abs(test::dft(trans, dt, 1e12) / test::dft(inc, dt, 1e12))
                                      << " at 1 THz)");
  CHECK(worst < 0.02);
}

TEST_CASE("Dispersive media: lossless poles in a closed cavity stay bounded for 1e5 steps at step-fraction 0.99") {
  constexpr double kCell = 5e-6;
  Scene s = test::box_scene(40, 40, kCell, Boundary::electric_wall, Boundary::electric_wall, 0.99, 1);
  PermittivityModel m;
  m.eps_inf = 1;
  m.lorentz = {{40e12, 3.0, 0}};  // w_TO dt = 2.9: beyond the explicit oscillator's limit of 2
  m.drude = {{5e12, 0}};
  PermittivityTensor t;
  t.axis = {m, m, m};
  t.axis[2].lorentz[0].f_to = 20e12;
  s.media.push_back(dispersive("stress", t));
  Body b;
  b.shape.kind = Shape::Kind::circle;
  b.shape.centre = {20 * kCell, 20 * kCell};
  b.shape.radius = 12 * kCell;
  s.bodies.push_back(b);
  s.sources.push_back(test::point_source(Component::Ez, {8 * kCell, 9 * kCell}, 2e12, 0.3e-12, 1e-12, 1e-3));
  s.sources.push_back(test::point_source(Component::Hz, {31 * kCell, 9 * kCell}, 2e12, 0.3e-12, 1e-12, 1.0));
  auto peak = [](Simulation<double>& sim) {
    double e = 0;
    for (int c = 0; c < 3; ++c)
      for (int j = 0; j < sim.grid().ny; ++j)
        for (int i = 0; i < sim.grid().nx; ++i) e = std::max(e, std::abs(sim.at(static_cast<Component>(c), i, j)));
    return e;
  };
  Simulation<double> sim(s, 2);
  REQUIRE(sim.dispersive().count() > 0);
  double early = 0, late = 0;
  for (long n = 0; n < 100000; ++n) {
    sim.step();
    if (n >= 5000 && n < 10000 && n % 50 == 0) early = std::max(early, peak(sim));
    if (n >= 95000 && n % 50 == 0) late = std::max(late, peak(sim));
  }
  MESSAGE("peak |E| over steps 5e3-1e4: " << early << " V/m, over 9.5e4-1e5: " << late << " V/m");
  CHECK(std::isfinite(late));
  CHECK(late < 1.5 * early);
  // the same few hundred steps on 1 and 3 threads: the same bits
  Simulation<double> a(s, 1), c(s, 3);
  for (int n = 0; n < 300; ++n) a.step(), c.step();
  for (int q = 0; q < 6; ++q) {
    const size_t bytes = a.grid().size() * sizeof(double);
    CHECK(std::memcmp(a.field(static_cast<Component>(q)), c.field(static_cast<Component>(q)), bytes) == 0);
  }
  CHECK(a.dispersive().p == c.dispersive().p);
}
