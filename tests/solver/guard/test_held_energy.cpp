/// \file test_held_energy.cpp
/// \brief The energy the guard and `stop: auto` watch (Simulation::held_energy) counts the
/// dispersive media's oscillators: a driven Lorentz oscillator p'' + g p' + w0^2 p = S E holds
/// eps0 (p'^2 + w0^2 p^2) / (2 S) (Jackson, Classical Electrodynamics, 3rd ed., sec. 7.5,
/// 7.10). In a closed lossless box (electric walls; Taflove & Hagness ch. 3-4: the leapfrog
/// keeps an energy) holding a lossless phonon wafer, the field's energy alone swings as the
/// phonons take it and give it back, and the sum holds. On the bundled GaAs wafer (2 ps, a
/// guard check every 1% of the run) the guard took that swing for slow growth and stopped a
/// stable run; it must stay quiet. The same for a rotated phonon wafer (eps_xy != 0), whose
/// nodes hold their instances' energy (solver/media/tensor_energy.h), and for a Bloch pair
/// whose copies each hold their own magnets.
#include <doctest/doctest.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <tuple>

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

namespace {
/// The largest relative change of the held energy and of the fields' alone after the pulse, in
/// the tilted phonon mirror made a lossless closed box (step fraction `fraction`).
std::pair<double, double> rotated_box(double fraction) {
  const Scene s = read_scene(std::string(TERAYEE_SOURCE_DIR) + "/scenarios/tilted-phonon-mirror.yaml",
                             {"grid.boundaries.x=electric-wall", "grid.extent=[0.3mm,0.002mm]", "grid.cell=0.5um",
                              "media.tilted.permittivity.u.lorentz.0.damping=0",
                              "media.tilted.permittivity.v.lorentz.0.damping=0",
                              "media.tilted.permittivity.z.lorentz.0.damping=0", "time.stop=3ps",
                              "sources.0.plane.launch.x=-0.1mm", fmt::format("time.step-fraction={}", fraction)});
  Simulation<double> sim(s, 1);
  REQUIRE(sim.tensor_cells().count() > 0);
  const long quiet = static_cast<long>(1.2e-12 / sim.grid().dt);  // the pulse (0.4 ps, 0.1 ps wide) is over
  double h0 = 0, f0 = 0, dh = 0, df = 0;
  for (long k = 0; k < sim.total_steps(); ++k) {
    sim.step();
    if (k < quiet) continue;
    const double h = sim.held_energy(), f = sim.field_energy();
    if (k == quiet) h0 = h, f0 = f;
    dh = std::max(dh, std::abs(h / h0 - 1)), df = std::max(df, std::abs(f / f0 - 1));
  }
  return {dh, df};
}
}  // namespace

TEST_CASE("held energy: a lossless rotated phonon wafer in a closed box keeps its instances' energy") {
  // The same check for a tensor with eps_xy != 0 (solver/media/tensor_cells.h): the list's
  // nodes hold the instances' energy, eps_inf E_a^2/2 plus each axis's oscillators (Jackson sec.
  // 7.5, 7.10), conserved by the trapezoidal scheme (docs/method.md, "Rotated in-plane tensors").
  // What held_energy() sums, E^n with H^(n-1/2), differs from the scheme's invariant (H^(n-1/2) .
  // H^(n+1/2)) by O(w dt): halving the step must about halve the change.
  const auto [dh, df] = rotated_box(0.95);
  const auto [dh2, df2] = rotated_box(0.475);
  MESSAGE(fmt::format("after the pulse: held energy's largest change {:.3e} ({:.3e} at half the step), the "
                      "fields' alone {:.3e}",
                      dh, dh2, df));
  CHECK(dh < 2e-2);
  CHECK(dh2 < 0.6 * dh);  // the leapfrog's offset, not a leak: it shrinks with the step
  CHECK(df > 20 * dh);    // the instances left out (the list's nodes counted as vacuum), the sum swings
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

namespace {
/// The largest relative change after the pulse of the held energy and of the same without the
/// sine copy's magnets, in a lossless biased MnF2 wafer (the crystal library's values, Gilbert
/// damping 0 set by hand) between electric walls under Bloch x sides (step fraction `fraction`).
std::pair<double, double> bloch_box(double fraction) {
  Scene s = read_scene_text(R"(
title: "closed Bloch box with MnF2"
grid:
  extent: [40 um, 1.5 mm]
  cell: 20 um
  boundaries: {x: bloch, y: electric-wall}
  bloch: {angle: 30 deg, at: 262 GHz}
  origin: corner
time:
  stop: 0.25 ns
bias: [0, 0, 1 T]
media:
  mnf2: {crystal: MnF2, magnet: {sublattices: [{damping: 0}, {damping: 0}]}}
bodies:
  - {medium: mnf2, rectangle: {centre: [20 um, 1.1 mm], size: [1 mm, 0.6 mm]}}
sources:
  - plane: {polarization: Ez, direction: +y, launch: {y: 0.3 mm}, frequency: 262 GHz, amplitude: 10 V/m,
            waveform: {kind: pulse, fwhm: 4 ps, delay: 14 ps}}
)",
                            "bloch-box");
  s.time.step_fraction = fraction;
  Simulation<double> sim(s, 1);
  REQUIRE(sim.sine_copy() != nullptr);
  const long quiet = static_cast<long>(40e-12 / sim.grid().dt);  // the pulse is over
  double h0 = 0, c0 = 0, dh = 0, dc = 0;
  for (long k = 0; k < sim.total_steps(); ++k) {
    sim.step();
    if (k < quiet) continue;
    // magnetic_energy() is both copies'; c leaves the sine copy's magnets out
    const double h = sim.held_energy(), c = h - sim.sine_copy()->magnetic_energy();
    if (k == quiet) h0 = h, c0 = c;
    dh = std::max(dh, std::abs(h / h0 - 1)), dc = std::max(dc, std::abs(c / c0 - 1));
  }
  return {dh, dc};
}
}  // namespace

TEST_CASE("held energy: a Bloch pair with lossless magnets in a closed box counts both copies' magnets") {
  // Bloch x sides at an oblique k_x step two real copies (cosine and sine, bloch.h), each with
  // its own magnets; the energy of the complex field is the sum of both copies' (|a|^2 = Re^2 +
  // Im^2). In a box closed by electric walls (Taflove & Hagness ch. 3-4: the leapfrog keeps an
  // energy) the held energy (E at n, H at n-1/2) is off that kept energy by O(w dt): it must
  // shrink with the step, where leaving the sine copy's magnets out leaves a swing that does not.
  double last = 1, dh = 0, dc = 0;
  for (double f : {0.95, 0.475, 0.2375, 0.11875}) {
    std::tie(dh, dc) = bloch_box(f);
    MESSAGE(fmt::format("step fraction {}: held energy's largest change {:.3e}; without the sine copy's magnets {:.3e}",
                        f, dh, dc));
    CHECK(dh < 0.6 * last);  // measured 3.4e-2, 1.7e-2, 8.5e-3: first order in dt
    last = dh;
  }
  CHECK(dc > 3 * dh);  // the sine copy's magnets left out: a swing of about 1.5e-2 that stays
}
