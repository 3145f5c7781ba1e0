/// \file test_growth_guard.cpp
/// \brief The run's guard (solver/guard/growth_guard.h) on deliberately unstable runs: a
/// time step 1.2 times the Courant limit (Taflove & Hagness, 3rd ed., eq. 4.92: past it the
/// leapfrog step has growing modes), in vacuum and with an MnF2 crystal through the
/// absorbers. The guard must stop each within a few percent of its run time, naming the
/// step and a cell with its medium; it stays quiet on the same runs at a stable step
/// (tests/solver/grid/test_absorber_stability.cpp). The long case: a PML forced on an MnF2
/// half-space in its hyperbolic band, whose slow growth stays below both blow-up limits and
/// must be stopped by the guard's slow checks.
#include <doctest/doctest.h>

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
