/// \file test_beam.cpp
/// \brief The one-sided Gaussian beam: almost nothing launched backwards, and the waist
/// and direction it was asked for. A Gaussian beam's field falls as exp(-s^2/w0^2) across
/// its focus (w0 the 1/e field radius; Siegman, Lasers, ch. 17), so |E|^2 has the second
/// moment w0^2/4 there; its axis is the line of intensity centroids.
#include <doctest/doctest.h>

#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

constexpr double kCell = 10e-6, kFreq = 1e12;  // 30 cells per wavelength
constexpr int kPeriodSteps = 45;               // time step chosen so that a period is whole

struct Phasor {
  int nx, ny;
  std::vector<std::complex<double>> v;
  std::complex<double> at(double fi, double fj) const {  // bilinear in node units
    const int i = static_cast<int>(std::floor(fi)), j = static_cast<int>(std::floor(fj));
    INFO("node " << fi << ", " << fj);
    REQUIRE((i >= 0 && j >= 0 && i + 1 < nx && j + 1 < ny));
    const double tx = fi - i, ty = fj - j;
    auto V = [&](int a, int b) { return v[static_cast<size_t>(b) * nx + a]; };
    return (1 - tx) * (1 - ty) * V(i, j) + tx * (1 - ty) * V(i + 1, j) + (1 - tx) * ty * V(i, j + 1) +
           tx * ty * V(i + 1, j + 1);
  }
};

Phasor steady(Simulation<double>& sim, Component c, long settle, int periods) {
  const YeeGrid& g = sim.grid();
  for (long n = 0; n < settle; ++n) sim.step();
  Phasor p{g.nx, g.ny, std::vector<std::complex<double>>(g.cells())};
  const int steps = periods * kPeriodSteps;
  for (int n = 0; n < steps; ++n) {
    sim.step();
    const double ph = 2 * constants::pi * kFreq * sim.time();
    const std::complex<double> w(std::cos(ph), std::sin(ph));
    for (int j = 0; j < g.ny; ++j)
      for (int i = 0; i < g.nx; ++i) p.v[static_cast<size_t>(j) * g.nx + i] += sim.at(c, i, j) * w;
  }
  for (auto& x : p.v) x *= 2.0 / steps;
  return p;
}

}  // namespace

TEST_CASE("one-sided Gaussian beam: no backward wave, requested waist and direction") {
  for (Component pol : {Component::Ez, Component::Hz}) {
    MESSAGE("polarization " << std::string(component_name(pol)));
    const int nx = 420, ny = 400;
    const double step_fraction = constants::c0 / (kPeriodSteps * kFreq * kCell) * std::sqrt(2.0);
    Scene s = test::box_scene(nx, ny, kCell, Boundary::absorbing, Boundary::absorbing, step_fraction, 1e-9);
    const double angle = 12 * constants::pi / 180, waist = 60 * kCell;  // 2 wavelengths
    Source b;
    b.kind = Source::Kind::beam;
    b.component = pol;
    b.frequency = kFreq;
    b.amplitude = 1e3;
    b.waist = waist;
    b.angle = angle;
    b.line_axis = 'x';
    b.line_at = 60 * kCell;
    b.focus = {160 * kCell, 190 * kCell};
    b.waveform.kind = Waveform::Kind::cw;
    b.waveform.ramp = 8 / kFreq;
    s.sources.push_back(b);
    Simulation<double> sim(s, 2);
    REQUIRE(std::abs(sim.grid().dt * kFreq * kPeriodSteps - 1) < 1e-12);
    const Phasor E = steady(sim, pol, 1400, 4);
    const YeeGrid& g = sim.grid();
    auto node_i = [&](double x) { return g.fi(pol, x); };
    auto node_j = [&](double y) { return g.fj(pol, y); };

    // backward: power through a vertical line behind the launch line against one ahead
    // (same cos(angle) factor on both sides; vacuum, so |E|^2 measures the flux)
    auto line_power = [&](double x) {
      double p = 0;
      for (int j = 2; j < ny - 2; ++j) p += std::norm(E.at(node_i(x), node_j(j * kCell)));
      return p;
    };
    const double back = line_power(40 * kCell), ahead = line_power(100 * kCell);
    MESSAGE("backward/forward power: " << back / ahead);
    CHECK(back / ahead < 0.01);

    // moments of |E|^2 along the cut across the requested axis, z from the focus
    const double ux = std::cos(angle), uy = std::sin(angle);
    auto cut = [&](double z, double& centre, double& width) {
      double m0 = 0, m1 = 0, m2 = 0;
      for (double sv = -3 * waist; sv <= 3 * waist; sv += 0.25 * kCell) {
        const double x = b.focus.x + z * ux - sv * uy, y = b.focus.y + z * uy + sv * ux;
        const double w = std::norm(E.at(node_i(x), node_j(y)));
        m0 += w, m1 += w * sv, m2 += w * sv * sv;
      }
      centre = m1 / m0;
      width = 2 * std::sqrt(m2 / m0 - centre * centre);
    };
    double c0, w0, c1, w1;
    cut(0, c0, w0);
    MESSAGE("waist: measured " << w0 / kCell << " cells, asked " << waist / kCell << " cells; axis offset "
                               << c0 / kCell << " cells");
    CHECK(std::abs(w0 / waist - 1) < 0.03);
    // amplitude: the peak E at the focus is the one asked for (eta0 Hz = E in vacuum)
    const double peak = std::abs(E.at(node_i(b.focus.x), node_j(b.focus.y)));
    MESSAGE("peak field at the focus: " << peak << " V/m, asked " << b.amplitude);
    CHECK(std::abs(peak / b.amplitude - 1) < 0.02);
    CHECK(std::abs(c0) < 1.0 * kCell);
    // direction: the axis drifts off the requested one by atan(dc/dz)
    const double z1 = 120 * kCell;
    cut(z1, c1, w1);
    const double measured = angle + std::atan2(c1 - c0, z1);
    MESSAGE("direction: measured " << measured * 180 / constants::pi << " deg, asked 12 deg");
    CHECK(std::abs(measured - angle) * 180 / constants::pi < 0.5);
  }
}
