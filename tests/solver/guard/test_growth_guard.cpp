/// \file test_growth_guard.cpp
/// \brief The run's guard (solver/guard/growth_guard.h) on deliberately unstable runs: a
/// time step 1.2 times the Courant limit (Taflove & Hagness, 3rd ed., eq. 4.92: past it the
/// leapfrog step has growing modes), in vacuum and with an MnF2 crystal through the
/// absorbers. The guard must stop each within a few percent of its run time, naming the
/// step and a cell with its medium; it stays quiet on the same runs at a stable step
/// (tests/solver/grid/test_absorber_stability.cpp). The long case: a PML forced on an MnF2
/// half-space in its hyperbolic band, whose slow growth stays below both blow-up limits and
/// must be stopped by the guard's slow checks. A closed lossless box at eight cells a wavelength
/// must run to its end: its measured energy swings about the leapfrog's conserved one by w dt.
#include <doctest/doctest.h>

#include <algorithm>

#include "io/scene/scene_reader.h"
#include "tests/solver/absorber_cases.h"

using namespace ty;

TEST_CASE("guard: a run with too large a time step is stopped early, saying where") {
  for (bool magnet : {false, true}) {
    test::AbsorberCase c;
    c.cell = 50e-6;
    c.step_fraction = 1.2;
    c.stop = 0.3e-9;
    Scene s = test::absorber_scene(c);
    if (!magnet) s.bodies.clear();
    Simulation<double> sim(s, 2);
    GrowthGuard<double> guard(sim);
    const long n = sim.total_steps(), every = std::max(1L, n / 100);
    std::string error;
    long k = 0;
    for (; k < n && error.empty(); ++k) {
      sim.step();
      if ((k + 1) % every == 0) error = guard.check(sim);
    }
    MESSAGE(std::string(magnet ? "MnF2: " : "vacuum: ") << "stopped at step " << k << " of " << n << ": " << error);
    REQUIRE(!error.empty());
    CHECK(k <= n / 20);
    CHECK(error.find("the run is growing: by step " + std::to_string(k)) != std::string::npos);
    CHECK(error.find("cell (") != std::string::npos);
    // the cell's medium: the growth starts at the source, in vacuum, in both scenes
    CHECK((error.find("in vacuum, ") != std::string::npos || error.find("in 'MnF2', ") != std::string::npos));
    CHECK(error.find("side the absorbing layers") != std::string::npos);
  }
}

namespace {
/// A dielectric disc (eps 4) between electric walls on 15 um cells, a point pulse at 1.5 THz
/// (0.8 ps): lossless and closed, so after the pulse the energy is kept. Returns the guard's
/// verdict (checked every 1% of the run) and the measured energy's (max - min) / min after 10 ps.
std::pair<std::string, double> closed_box(double fraction) {
  Scene s = read_scene_text(R"(
title: "closed box"
grid: {extent: [1.2 mm, 0.9 mm], cell: 15 um, boundaries: {x: electric-wall, y: electric-wall}}
time: {stop: 40 ps}
media:
  disc: {permittivity: 4}
bodies:
  - {medium: disc, circle: {centre: [0.15 mm, 0.05 mm], radius: 0.2 mm}}
sources:
  - point: {at: [-0.2 mm, -0.3 mm], component: Ez, amplitude: 1 mA, spread: 2 cells,
            frequency: 1.5 THz, waveform: {kind: pulse, fwhm: 0.8 ps, delay: 2 ps}}
)",
                            "closed-box");
  s.time.step_fraction = fraction;
  Simulation<double> sim(s, 1);
  GrowthGuard<double> guard(sim);
  const long n = sim.total_steps(), every = std::max(1L, n / 100), quiet = static_cast<long>(10e-12 / sim.grid().dt);
  std::string error;
  double lo = 1e300, hi = 0;
  for (long k = 0; k < n && error.empty(); ++k) {
    sim.step();
    if ((k + 1) % every == 0) error = guard.check(sim);
    if (k >= quiet) lo = std::min(lo, sim.held_energy()), hi = std::max(hi, sim.held_energy());
  }
  return {error, hi / lo - 1};
}
}  // namespace

TEST_CASE("guard: a closed lossless box at eight cells a wavelength runs to its end") {
  // At the source's 1.5 THz w dt = 0.30 at step fraction 0.9: the measured W (E at n, H at
  // n-1/2) swings about the conserved (1/2)(eps E^n.E^n + mu H^(n-1/2).H^(n+1/2)) by up to (w dt / 2) W
  // each way (the Yee scheme's discrete energy identity; growth_guard.cpp). The guard took a 6% rise of
  // that swing for slow growth ("1.06 times the lowest since") and stopped the run at 10.3 ps.
  const auto [error9, swing9] = closed_box(0.9);
  const auto [error2, swing2] = closed_box(0.2);
  MESSAGE("swing after the pulse: " << swing9 << " at 0.9 of the step limit, " << swing2 << " at 0.2");
  CHECK_MESSAGE(error9.empty(), error9);
  CHECK_MESSAGE(error2.empty(), error2);
  // the swing is the leapfrog's, first order in dt: measured 0.125, 0.061, 0.027, 0.013 at step
  // fractions 0.9, 0.45, 0.2, 0.1 (4.6 times the step, 4.6 times the swing), and within w dt at the
  // source's centre (0.30 at 1.5 THz and 0.9: the bound for a wave of that one frequency)
  CHECK(swing9 > 0.06);
  CHECK(swing9 / swing2 > 3.5);
  CHECK(swing9 / swing2 < 5.5);
  CHECK(swing9 < 0.30);
}

TEST_CASE("guard, long: a PML forced on MnF2 in its hyperbolic band grows slowly and is stopped early" *
          doctest::skip()) {
  // The plain PML amplifies the backward waves of the band (Becache, Fauqueux & Joly,
  // J. Comput. Phys. 188, 399 (2003): stable only where k_x and the group velocity along x
  // agree in sign; in a-cut MnF2 on 261.4-263.1 GHz they do not along the side layers).
  // Measured at 20 um, 2 ns: the period-averaged energy rose 0.34 after the pulse, the
  // absorber tilted 4.5e-7 rad against 5.3e-8 inside -- below both blow-up limits.
  //   ./build/terayee_tests -tc="guard\, long*" --no-skip -s
  test::AbsorberCase c;
  c.cell = 20e-6;
  c.stop = 2e-9;
  c.kind = Absorber::Kind::pml;
  const auto o = test::run_absorber_case(c);
  MESSAGE("stopped at step " << o.guard_step << " of " << o.steps << ": " << o.guard);
  REQUIRE(!o.guard.empty());
  CHECK(o.guard.find("the run is growing slowly") != std::string::npos);
  CHECK(o.guard.find("cell (") != std::string::npos);
  CHECK(o.guard.find("side the absorbing layers") != std::string::npos);
  CHECK(o.guard_step < o.steps * 95 / 100);
}

TEST_CASE("guard: sources in vacuum hold no more than their work, pulsed or cw, sharp or ramped, at any time step") {
  // The Yee scheme's discrete energy identity (growth_guard.cpp): a value v added to a node
  // does the work (eps/2) v (E^n + E^(n+1)) on the conserved energy, E^n the node's value at
  // the step's start. The gross sum of those bounds the conserved energy, and the measured W
  // (E at n, H at n-1/2) stays within a few tens of percent of it (measured worst 1.38 at
  // 0.95 of the step limit, a cw line current switched on at once; 2.8 for a magnetic one). Before this identity the work
  // was counted from the node's value after its curl update: a pulsed line current at 0.5
  // of the step limit held 23 times that count and the guard stopped a run in vacuum.
  struct Kind {
    Component c;
    bool plane, cw;
    double ramp;  // periods
  };
  const Kind kinds[] = {{Component::Ez, false, false, 0}, {Component::Ez, false, true, 0},
                        {Component::Ez, false, true, 10}, {Component::Hz, false, true, 1},
                        {Component::Ez, true, false, 0},  {Component::Hz, true, true, 2}};
  for (const Kind& k : kinds)
    for (double fraction : {0.3, 0.5, 0.95}) {
      Scene s = test::box_scene(100, 100, 20e-6, Boundary::electric_wall, Boundary::electric_wall, fraction, 30e-12);
      Source src = k.plane ? test::plane_pulse(k.c, 0.3e-3, 0.25e12, 2e-12, 8e-12, 1e3)
                           : test::point_source(k.c, {1e-3, 1e-3}, 0.25e12, 2e-12, 8e-12, k.c == Component::Ez ? 1e-3 : 1);
      if (k.cw) src.waveform.kind = Waveform::Kind::cw, src.waveform.ramp = k.ramp / 0.25e12;
      s.sources.push_back(src);
      Simulation<double> sim(s, 1);
      GrowthGuard<double> guard(sim);
      double worst = 0;
      std::string error;
      for (long n = 0; n < sim.total_steps() && error.empty(); ++n) {
        sim.step();
        if (sim.injected_energy() > 0) worst = std::max(worst, sim.held_energy() / sim.injected_energy());
        error = guard.check(sim);  // every step: the start is where the old count failed
      }
      const std::string what = fmt::format("{} {} {}, ramp {} periods, step fraction {}", k.plane ? "plane" : "point",
                                           k.c == Component::Ez ? "Ez" : "Hz", k.cw ? "cw" : "pulse", k.ramp, fraction);
      INFO(what);
      CHECK_MESSAGE(error.empty(), error);
      CHECK(worst < 1 / (1 - fraction));  // the bound above
      // measured 1.00-1.38: a count twice too large (0.5) or half as large (2.0-2.8) fails
      if (k.c == Component::Ez && !k.plane) CHECK(worst < 1.5);
      if (k.c == Component::Ez && !k.plane) CHECK(worst > 0.9);
    }
}

TEST_CASE("guard: crystals at rest beside the leading tail of a pulse are not stopped") {
  // Magnets at rest hold round-off energy (NiO from the crystal library: 3e-28 J/m by step 21
  // at 0.3 of the step limit), more than a pulsed line current has put in during its leading
  // tail (3.5e-31 J/m at 0.3 ps, the pulse's peak at 8 ps); with a floor of 1e-30 J/m the guard
  // stopped such runs at their first check. Its floor is now 1e-12 of the sources' energy scale
  // eps0 e0^2 lambda^2 (5e-11 J/m for 1 mA at 0.25 THz). Crystals: the library's (docs/crystals.md).
  for (const char* crystal : {"NiO", "Fe2O3", "YFeO3", "MnF2"})
    for (double fraction : {0.3, 0.95}) {
      const std::string text = fmt::format(
          "title: rest\ngrid: {{extent: [2 mm, 2 mm], cell: 20 um}}\ntime: {{stop: 30 ps, step-fraction: {}}}\n"
          "media:\n  c: {{crystal: {}}}\nbodies:\n  - {{medium: c, rectangle: {{centre: [0.5 mm, 0], size: [0.8 mm, "
          "1.5 mm]}}}}\nsources:\n  - point: {{at: [0, 0], component: Ez, amplitude: 1 mA, frequency: 0.25 THz, "
          "waveform: {{kind: pulse, fwhm: 2 ps, delay: 8 ps}}}}\n",
          fraction, crystal);
      Simulation<double> sim(read_scene_text(text, "rest.yaml"), 1);
      GrowthGuard<double> guard(sim);
      const long every = std::max(1L, sim.total_steps() / 100);  // as terayee run checks
      std::string error;
      for (long n = 1; n <= sim.total_steps() && error.empty(); ++n) {
        sim.step();
        if (n % every == 0) error = guard.check(sim);
      }
      INFO(fmt::format("{} at step fraction {}", crystal, fraction));
      CHECK_MESSAGE(error.empty(), error);
    }
}
