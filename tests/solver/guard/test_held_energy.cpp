/// \file test_held_energy.cpp
/// \brief The energy the guard and `stop: auto` watch (Simulation::held_energy) counts the
/// dispersive media's oscillators: a driven Lorentz oscillator p'' + g p' + w0^2 p = S E holds
/// eps0 (p'^2 + w0^2 p^2) / (2 S) (Jackson, Classical Electrodynamics, 3rd ed., sec. 7.5,
/// 7.10). In a closed lossless box (electric walls; Taflove & Hagness ch. 3-4: the leapfrog
/// keeps an energy) holding a lossless phonon wafer, the field's energy alone swings as the
/// phonons take it and give it back, and the sum holds. On the bundled GaAs wafer (2 ps, a
/// guard check every 1% of the run) the guard took that swing for slow growth and stopped a
/// stable run; it must stay quiet.
#include <doctest/doctest.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "io/scene/scene_reader.h"
#include "solver/guard/growth_guard.h"
#include "solver/simulation.h"

using namespace ty;

namespace {
const std::string kWafer = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/gaas-reststrahlen.yaml";
}

TEST_CASE("held energy: a lossless phonon wafer in a closed box keeps field plus oscillator energy") {
  const Scene s = read_scene(kWafer, {"grid.boundaries.x=electric-wall", "grid.extent=[0.3mm,0.002mm]",
                                      "media.gaas.permittivity.lorentz.0.damping=0", "time.stop=3ps",
                                      "sources.0.plane.launch.x=-0.1mm"});
  Simulation<double> sim(s, 1);
  const long quiet = static_cast<long>(1.2e-12 / sim.grid().dt);  // the pulse (0.5 ps, 0.12 ps wide) is over
  double h0 = 0, f0 = 0, dh = 0, df = 0;
  for (long k = 0; k < sim.total_steps(); ++k) {
    sim.step();
    if (k < quiet) continue;
    const double h = sim.held_energy(), f = sim.field_energy() + sim.magnetic_energy();
    if (k == quiet) h0 = h, f0 = f;
    dh = std::max(dh, std::abs(h / h0 - 1)), df = std::max(df, std::abs(f / f0 - 1));
  }
  MESSAGE(fmt::format("after the pulse: held energy's largest change {:.3e}, the fields' alone {:.3e}", dh, df));
  CHECK(dh < 1e-2);  // measured 4.8e-3: the leapfrog energy E^n.E^(n+1) against |E^n|^2, O((w dt)^2); the poles left out: 0.30
  CHECK(df > 5 * dh);   // without the oscillators' share the sum swings
}

TEST_CASE("held energy: the guard stays quiet on the GaAs wafer's short run") {
  const Scene s = read_scene(kWafer, {"time.stop=2ps"});
  Simulation<double> sim(s, 2);
  GrowthGuard<double> guard(sim);
  const long n = sim.total_steps(), every = std::max(1L, n / 100);
  std::string error;
  for (long k = 0; k < n && error.empty(); ++k) {
    sim.step();
    if ((k + 1) % every == 0) error = guard.check(sim);
  }
  CHECK_MESSAGE(error.empty(), error);
}
