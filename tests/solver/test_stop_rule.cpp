/// \file test_stop_rule.cpp
/// \brief `time.stop: auto`: a pulsed run ends once the pulse has left and its spectra have
/// converged, a cw run once two blocks of its spectra agree; the results they stop with are
/// checked against Fresnel's formulas (Born & Wolf, Principles of Optics, 7th ed.,
/// sec. 1.5.2: r = (1 - n)/(1 + n), t = 2/(1 + n) for the tangential E at normal
/// incidence), and the layout of a self-stopping run against its own rules.
#include <doctest/doctest.h>

#include <cmath>

#include "solver/simulation.h"
#include "solver/stop_rule.h"
#include "tests/helpers.h"
#include "tests/solver/half_space.h"

using namespace ty;

namespace {

constexpr double kCell = 5e-6;
constexpr int kNx = 400, kNy = 2;
constexpr double kLaunch = 100 * kCell, kInterface = 250 * kCell, kLimit = 400e-12;

/// A line across the periodic y extent at x: its normal is -x.
Output line_at(const std::string& name, double x) {
  Output o;
  o.kind = Output::Kind::power_spectrum;
  o.name = name;
  o.from = {x, 0};
  o.to = {x, kNy * kCell};
  o.band_from = 0.3e12;
  o.band_to = 0.9e12;
  o.count = 13;
  return o;
}

Scene scene(double eps, const Source& src) {
  Scene s = test::box_scene(kNx, kNy, kCell, Boundary::absorbing, Boundary::periodic, 0.95, kLimit);
  s.time.auto_stop.on = true;
  if (eps > 1) test::add_half_space(s, eps, kInterface, kNx, kNy, kCell);
  s.sources.push_back(src);
  s.outputs.push_back(line_at("behind", 50 * kCell));  // behind the one-sided launch line: reflected only
  s.outputs.push_back(line_at("front", 180 * kCell));  // between the launch line and the interface
  return s;
}

/// Steps until the rule says done or the limit; the steps taken.
long run(Simulation<double>& sim) {
  while (sim.steps_done() < sim.total_steps()) {
    sim.advance();
    if (sim.settled()) break;
  }
  return sim.steps_done();
}

std::vector<double> power(const Simulation<double>& sim, int line) {
  const auto& l = sim.power_spectra()[line];
  return line_power(l, [&](size_t f, size_t p, int c) { return l.field(f, p, c); });
}

}  // namespace

TEST_CASE("stop: auto ends a pulsed run when the pulse has left, and its reflectance is Fresnel's") {
  const Source src = test::plane_pulse(Component::Ez, kLaunch, 0.6e12, 1.0e-12, 3.0e-12, 1e3);
  const double eps = 4.0, n = 2.0, R_fresnel = std::pow((1 - n) / (1 + n), 2);
  Simulation<double> sample(scene(eps, src), 2), reference(scene(1.0, src), 2);
  const long ns = run(sample), nr = run(reference);
  const double dt = sample.grid().dt;
  MESSAGE("sample stopped at " << ns * dt * 1e12 << " ps, reference at " << nr * dt * 1e12 << " ps of a "
                               << kLimit * 1e12 << " ps limit; energy left " << sample.stop_rule().energy_fraction()
                               << " of its peak; last change " << sample.stop_rule().largest_change());
  CHECK(sample.stop_rule().done());
  CHECK(reference.stop_rule().done());
  // the pulse (6 sigma after its 3 ps peak: 6.6 ps) and its transit of the 2 mm box (6.7 ps) are
  // long over by a tenth of the limit; the rule must not wait for the limit
  CHECK(ns * dt > src.waveform.delay + 3 * src.waveform.fwhm);
  CHECK(ns * dt < 0.25 * kLimit);
  CHECK(sample.stop_rule().energy_fraction() <= 1e-5);
  CHECK(sample.stop_rule().largest_change() <= 1e-3);
  // both runs normalise by the same planned length, whatever step they stopped at
  const auto Pr = power(sample, 0), Pi = power(reference, 1);
  double worst = 0;
  for (size_t f = 0; f < Pr.size(); ++f) worst = std::max(worst, std::abs(std::abs(Pr[f] / Pi[f]) / R_fresnel - 1));
  MESSAGE("worst relative error of R against Fresnel over 0.3-0.9 THz: " << worst);
  CHECK(worst < 0.01);  // the grid's own error at >= 33 cells per wavelength in the medium (test_fresnel: 0.5%)
}

TEST_CASE("stop: auto ends a cw run when two blocks of its spectra agree, and the wave it keeps is Fresnel's") {
  Source src = test::plane_pulse(Component::Ez, kLaunch, 0.5e12, 0, 0, 1e3);
  src.waveform = Waveform{};
  src.waveform.kind = Waveform::Kind::cw;
  src.waveform.ramp = 5e-12;
  Scene s = scene(4.0, src);
  Output map;
  map.kind = Output::Kind::spectral_map;
  map.name = "inside";
  map.fields = {"Ez"};
  map.frequencies = {0.5e12};
  map.region.given = true;
  map.region.centre = {300 * kCell, 0.5 * kNy * kCell};
  map.region.size = {60 * kCell, kNy * kCell};
  s.outputs.push_back(map);
  Simulation<double> sim(s, 2);
  const StopPlan& plan = sim.stop_rule().plan();
  CHECK(plan.cw);
  CHECK(plan.check % plan.every == 0);
  CHECK(sim.total_steps() % plan.check == 0);
  const long steps = run(sim);
  MESSAGE("cw run stopped at " << steps * sim.grid().dt * 1e12 << " ps after " << sim.stop_rule().checks()
                               << " blocks of " << plan.check * sim.grid().dt * 1e12 << " ps; last change "
                               << sim.stop_rule().largest_change());
  CHECK(sim.stop_rule().done());
  CHECK(sim.stop_rule().checks() >= 2);
  CHECK(steps < sim.total_steps());
  // the transmitted amplitude in the half-space: t = 2/(1+n) of the launched 1 kV/m
  const SpectralMap& m = sim.spectral_maps()[0];
  double lo = 1e300, hi = 0;
  for (long p = 0; p < static_cast<long>(m.ni) * m.nj; ++p) {
    const double a = std::abs(m.field(0, p, 2));
    lo = std::min(lo, a), hi = std::max(hi, a);
  }
  const double t = 2.0 / (1.0 + 2.0) * 1e3;
  MESSAGE("|Ez| in the half-space " << lo << " .. " << hi << " V/m, Fresnel " << t);
  CHECK(std::abs(lo / t - 1) < 0.01);
  CHECK(std::abs(hi / t - 1) < 0.01);
}

TEST_CASE("a self-stopping run's windows: whole periods in each block, one sampling interval") {
  // the block rule: each frequency sums over the whole number of its periods that fits in the
  // block, ending at the block's end (so a steady wave of amplitude A gives |X| = A)
  const std::vector<double> freq{0.5e12, 0.37e12};
  const double dt = 1e-15;
  const DftWindows w = make_windows(freq, WindowRule::blocks, 100000, dt, 10, 20000);
  for (size_t f = 0; f < freq.size(); ++f) {
    const double periods = w.length[f] * dt * freq[f];
    CHECK(w.length[f] % 10 == 0);
    CHECK(w.length[f] <= 20000);
    CHECK(std::abs(periods - std::round(periods)) < 10 * dt * freq[f]);  // whole to one sampling interval
    CHECK(w.inside(f, 19999, 100000));
    CHECK(!w.inside(f, 20000 - w.length[f] - 1, 100000));
  }
  CHECK(w.restarts(20000));
  CHECK(!w.restarts(19999));
}
