/// \file test_magnetic_cavity.cpp
/// \brief Long-run behaviour of the coupled magnetic cells: a closed perfect-conductor
/// cavity holding an undamped MnF2 slab (alpha = 0), rung by a pulse, for 1e5 steps. The
/// total energy (field plus the magnet's exchange, anisotropy and bias energy relative to
/// its ground state) must not grow, and |m_s| must stay 1 to 1e-12 (design.md; the
/// midpoint rule's norm and energy conservation, d'Aquino, Serpico & Miano, J. Comput.
/// Phys. 209, 730 (2005)).
#include <doctest/doctest.h>

#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

TEST_CASE("closed cavity with an undamped magnetic slab: energy bounded, |m| = 1, over 1e5 steps") {
  const double d = 20e-6;
  Scene s = test::box_scene(48, 32, d, Boundary::electric_wall, Boundary::electric_wall, 0.95, 1e-9);
  Medium m;
  m.name = "MnF2";
  m.permittivity = {5.5, 5.5, 5.5};
  m.magnet = test::mnf2(0.0);
  s.media.push_back(m);
  s.bias = {0, 0, 0.5};
  Body b;
  b.shape.kind = Shape::Kind::rectangle;
  b.shape.centre = {30 * d, 16 * d};
  b.shape.size = {12 * d, 24 * d};
  s.bodies.push_back(b);
  // both polarizations, near the lines (the cavity is small: they ring the slab directly)
  s.sources.push_back(test::point_source(Component::Ez, {10 * d, 11 * d}, 260e9, 4e-12, 12e-12, 1e-1));
  s.sources.push_back(test::point_source(Component::Hz, {12 * d, 20 * d}, 260e9, 4e-12, 12e-12, 30.0));
  Simulation<double> sim(s, 2);
  REQUIRE(sim.magnets().count() == 12 * 24);
  const long steps = 100000, quiet = static_cast<long>(40e-12 / sim.grid().dt);
  std::vector<double> w;
  for (long n = 0; n < steps; ++n) {
    sim.step();
    if (n >= quiet && n % 100 == 0) w.push_back(sim.field_energy() + sim.magnetic_energy());
  }
  // E and H sit half a step apart, so the sum wobbles with the fields: compare window means
  const size_t win = w.size() / 10;
  double first = 0, last = 0, top = 0;
  for (size_t k = 0; k < win; ++k) first += w[k] / win, last += w[w.size() - 1 - k] / win;
  for (double v : w) top = std::max(top, v);
  const MagneticCells& M = sim.magnets();
  const auto& ms = M.m[M.latest];
  double worst = 0;
  for (long k = 0; k < M.count(); ++k)
    for (int q = 0; q < 2; ++q) {
      const double n = std::sqrt(ms[3 * q][k] * ms[3 * q][k] + ms[3 * q + 1][k] * ms[3 * q + 1][k] +
                                 ms[3 * q + 2][k] * ms[3 * q + 2][k]);
      worst = std::max(worst, std::abs(n - 1));
    }
  double tilt = 0;
  for (long k = 0; k < M.count(); ++k) tilt = std::max(tilt, std::hypot(ms[0][k], ms[1][k]));
  MESSAGE("energy: last/first window " << last / first << ", peak/first " << top / first << "; max ||m|-1| " << worst
                                       << "; largest sublattice tilt " << tilt << " rad");
  CHECK(first > 0);
  CHECK(tilt > 1e-6);  // the slab really rings
  CHECK(last / first < 1.01);
  CHECK(last / first > 0.97);
  CHECK(top / first < 1.1);
  CHECK(worst < 1e-12);
}
