/// \file test_growth_guard.cpp
/// \brief The run's guard (solver/guard/growth_guard.h) on deliberately unstable runs: a
/// time step 1.2 times the Courant limit (Taflove & Hagness, 3rd ed., eq. 4.92: past it the
/// leapfrog step has growing modes), in vacuum and with an MnF2 crystal through the
/// absorbers. The guard must stop each within a few percent of its run time, naming the
/// step and a cell with its medium; it stays quiet on the same runs at a stable step
/// (tests/solver/grid/test_absorber_stability.cpp).
#include <doctest/doctest.h>

#include <fmt/format.h>

#include <cstdlib>

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

TEST_CASE("guard, trace: forced PML on MnF2" * doctest::skip()) {
  test::AbsorberCase c;
  c.cell = std::getenv("TY_CELL") ? std::atof(std::getenv("TY_CELL")) * 1e-6 : 20e-6;
  c.kind = Absorber::Kind::pml;
  c.stop = std::getenv("TY_STOP") ? std::atof(std::getenv("TY_STOP")) * 1e-9 : 2e-9;
  if (std::getenv("TY_KIND")) c.kind = Absorber::Kind::automatic;
  if (std::getenv("TY_CW")) c.cw = true;
  if (std::getenv("TY_F")) c.frequency = std::atof(std::getenv("TY_F")) * 1e9;
  if (std::getenv("TY_PLATE")) c.plate = true;
  Scene s = test::absorber_scene(c);
  Simulation<double> sim(s, 2);
  GrowthGuard<double> guard(sim);
  const long n = sim.total_steps(), every = std::max(1L, n / 100);
  const YeeGrid& g = sim.grid();
  for (long k = 0; k < n; ++k) {
    sim.step();
    if ((k + 1) % every == 0) {
      const std::string e = guard.check(sim);
      fmt::print("{:.1f} ps W {:.4e} inj {:.3e} Tabs {:.3e} Tin {:.3e} {}\n", (k + 1) * g.dt * 1e12,
                 sim.field_energy() + sim.magnetic_energy(), sim.injected_energy(),
                 sim.magnets().largest_tilt(true, g.nx, g.ny, g.npml_x, g.npml_y),
                 sim.magnets().largest_tilt(false, g.nx, g.ny, g.npml_x, g.npml_y), e);
      if (!e.empty()) break;
    }
  }
}
