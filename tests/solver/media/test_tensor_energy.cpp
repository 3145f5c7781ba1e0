/// \file test_tensor_energy.cpp
/// \brief The discrete energy of a rotated lossless dispersive body in a closed cavity
/// (solver/media/tensor_cells.h, docs/method.md "Rotated in-plane tensors"): with electric
/// walls and the sources off, Yee's energy (1/2)|E|^2 + (1/2) H^{n-1/2} . H^{n+1/2} (Taflove &
/// Hagness, sec. 4.7 on the leapfrog's conserved quantity), with the list's nodes counted by
/// their instances' W = eps_inf E_a^2/2 + (j^2 + w0^2 p^2)/(2 W^2) (the Lorentz oscillator's
/// energy, Loudon, The Quantum Theory of Light, or Jackson sec. 7.10's harmonic oscillator), is
/// constant to rounding, and falls once the phonons are damped.
#include <doctest/doctest.h>

#include <cmath>

#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

/// The energy (V^2/m^2 per cell) of the list's instances and of the E nodes outside it.
double electric_energy(const Simulation<double>& sim) {
  const TensorCells& t = sim.tensor_cells();
  const YeeGrid& g = sim.grid();
  std::vector<char> in[2] = {std::vector<char>(g.size(), 0), std::vector<char>(g.size(), 0)};
  for (long q = 0; q < t.count(); ++q) in[t.comp[q]][t.index[q]] = 1;
  double u = 0;
  for (int c = 0; c < 2; ++c)
    for (int j = 0; j < g.ny; ++j)
      for (int i = 0; i < g.nx; ++i)
        if (!in[c][g.at(i, j)]) u += 0.5 * std::pow(sim.field(static_cast<Component>(c))[g.at(i, j)], 2);
  const double a = t.half_dt;
  for (long s = 0; s < t.instances(); ++s)
    for (int x = 0; x < 2; ++x) {
      const long sa = 2 * s + x;
      const AdeNode& k = t.axis[sa];
      const double eps_inf = (1 + k.ca) / (2 * k.cb);  // k+- = eps_inf +- x (ade.h)
      double w = 0.5 * eps_inf * t.e_axis[sa] * t.e_axis[sa];
      for (int i = t.pole_first[sa]; i < t.pole_first[sa + 1]; ++i) {
        const AdePole& p = t.poles[i];
        const double D = 2 / (1 + p.c1), w02 = -p.c2 * D / (2 * a), W2 = p.c3 * D / a;  // ade.h's c1, c2, c3
        w += (t.j[i] * t.j[i] + w02 * t.p[i] * t.p[i]) / (2 * W2);
      }
      u += t.weight[s] * w;
    }
  return u;
}

std::vector<double> hz(const Simulation<double>& sim) {
  const double* h = sim.field(Component::Hz);
  return std::vector<double>(h, h + sim.grid().size());
}

/// The energy after steps n0, n0 + every, ... (each from E^n and H^{n-1/2}, H^{n+1/2}).
std::vector<double> energies(double damping, long n0, long every, int count) {
  constexpr double kCell = 5e-6;
  Scene s = test::box_scene(40, 40, kCell, Boundary::electric_wall, Boundary::electric_wall, 0.99, 1);
  Medium m;
  m.name = "rotated";
  m.tensor = PermittivityTensor{};
  m.tensor->axis[0].eps_inf = 3;
  m.tensor->axis[0].lorentz = {{8e12, 4.0, damping}, {40e12, 3.0, 0}};  // w_TO dt = 2.9 for the second
  m.tensor->axis[1].eps_inf = 2.5;
  m.tensor->axis[1].lorentz = {{6e12, 1.5, 0}};
  m.tensor->axis[1].drude = {{5e12, 0}};
  m.tensor->axis[2] = m.tensor->axis[1];
  m.tensor->rotate = -0.9;
  m.permittivity = {2.7, 2.7, 2.5};
  s.media.push_back(m);
  Body b;
  b.shape.kind = Shape::Kind::rectangle;
  b.shape.centre = {20 * kCell, 20 * kCell};
  b.shape.size = {20 * kCell, 26 * kCell};
  s.bodies.push_back(b);
  s.sources.push_back(test::point_source(Component::Hz, {5 * kCell, 9 * kCell}, 6e12, 0.1e-12, 0.4e-12, 1.0));
  Simulation<double> sim(s, 1);
  REQUIRE(sim.tensor_cells().count() > 0);
  std::vector<double> out;
  long n = 0;
  for (int k = 0; k < count; ++k) {
    while (n < n0 + k * every) sim.step(), ++n;
    const double we = electric_energy(sim);
    const std::vector<double> h0 = hz(sim);
    sim.step(), ++n;
    const std::vector<double> h1 = hz(sim);
    double wh = 0;
    for (size_t q = 0; q < h0.size(); ++q) wh += 0.5 * h0[q] * h1[q];
    out.push_back(we + wh);
  }
  return out;
}

}  // namespace

TEST_CASE("Tensor media: a rotated lossless dispersive body in a closed cavity keeps its discrete energy") {
  const std::vector<double> u = energies(0, 2000, 2000, 5);  // the pulse is over by step 100
  double lo = u[0], hi = u[0];
  for (double v : u) lo = std::min(lo, v), hi = std::max(hi, v);
  MESSAGE("energy over steps 2e3-1e4: " << u[0] << " .. " << u.back() << ", relative spread " << (hi - lo) / u[0]);
  CHECK(u[0] > 0);
  CHECK((hi - lo) < 1e-9 * u[0]);
}

TEST_CASE("Tensor media: with a damped phonon the discrete energy falls") {
  const std::vector<double> u = energies(0.3e12, 2000, 1000, 4);
  MESSAGE("energy at steps 2e3, 3e3, 4e3, 5e3: " << u[0] << " " << u[1] << " " << u[2] << " " << u[3]);
  for (size_t k = 1; k < u.size(); ++k) CHECK(u[k] < u[k - 1]);
  CHECK(u.back() < 0.8 * u[0]);
}
