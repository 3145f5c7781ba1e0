/// \file test_validation.cpp
/// \brief Whole-scene rules (io/scene/validation.h). The step is the 2D Courant limit
/// dt = S / (c0 sqrt(1/dx^2 + 1/dy^2)) (Taflove & Hagness, Computational Electrodynamics,
/// 3rd ed., eq. 4.93 with S the step fraction); a probe keeps six doubles per step; a
/// plane wave needs boundaries without edges along its front (periodic), and a
/// transmission line must not lie in the sample that its reference run removes.
#include <doctest/doctest.h>
#include <unistd.h>

#include <chrono>
#include <cmath>
#include <string>

#include "io/scene/constants.h"
#include "io/scene/scene_reader.h"
#include "io/scene/validation.h"

using namespace ty;

namespace {

const std::string kGrid = "grid: {extent: [1 mm, 0.5 mm], cell: [20 um, 10 um]}\n";
const std::string kPoint =
    "sources:\n  - point: {at: [0, 0], component: Ez, amplitude: 1 mA, frequency: 0.5 THz, waveform: {kind: pulse, "
    "fwhm: 1 ps}}\n";

Scene scene(const std::string& text) { return read_scene_text(text, "scene.yaml"); }

std::string error_of(const Scene& s, double limit) {
  try {
    validate_scene(s, limit);
  } catch (const BadInput& e) {
    return e.what();
  }
  return "";
}

bool any_has(const std::vector<std::string>& w, const std::string& what) {
  for (const auto& x : w)
    if (x.find(what) != std::string::npos) return true;
  return false;
}

}  // namespace

TEST_CASE("run sizes: whole cells plus the absorber, the 2D Courant step, ceil(stop/dt) steps") {
  const Scene s = scene(kGrid + "time: {stop: 10 ps, step-fraction: 0.9}\n" + kPoint +
                        "outputs: [{probe: {name: p, at: [0, 0], fields: [Ez]}}]\n");
  const RunSizes z = run_sizes(s);
  CHECK(z.nx == 50 + 2 * 16);  // default absorber: 16 cells a side
  CHECK(z.ny == 50 + 2 * 16);
  const double dt = 0.9 / (constants::c0 * std::sqrt(1 / (20e-6 * 20e-6) + 1 / (10e-6 * 10e-6)));
  CHECK(z.dt == doctest::Approx(dt).epsilon(1e-12).scale(0));
  CHECK(z.steps == std::ceil(10e-12 / dt));
  double probe = 0;
  for (const auto& m : z.memory)
    if (m.what == "probe 'p'") probe = m.bytes;
  CHECK(probe == z.steps * 6 * 8);
  CHECK(validate_scene(s, 1e12).empty());
}

TEST_CASE("sizes that overflow and memory beyond the machine are errors before anything is allocated") {
  std::string e = error_of(scene("grid: {extent: [60000 m, 20 um], cell: 20 um}\ntime: {stop: 1 ps}\n" + kPoint), 1e18);
  CHECK(e.find("scene.yaml:1:") == 0);
  CHECK(e.find("at most") != std::string::npos);
  e = error_of(scene(kGrid + "time: {stop: 1e30 s}\n" + kPoint), 1e18);
  CHECK(e.find("steps") != std::string::npos);
  e = error_of(
      scene(kGrid + "time: {stop: 10 ps}\n" + kPoint + "outputs: [{snapshots: {fields: [Ez], every: 1e-25 s}}]\n"),
      1e18);
  CHECK(e.find("shorter than one time step") != std::string::npos);
  // one second at a ~20 fs step is ~5e13 steps: a probe would need ~2 PB
  const Scene p =
      scene(kGrid + "time: {stop: 1 s}\n" + kPoint + "outputs: [{probe: {name: p, at: [0, 0], fields: [Ez]}}]\n");
  e = error_of(p, 64e9);
  INFO(e);
  CHECK(e.find("scene.yaml:5:") == 0);  // the probe's line
  CHECK(e.find("probe 'p' is the largest part") != std::string::npos);
  CHECK(run_sizes(p).memory_bytes() > 1e15);
  // the same scene fits where the memory does
  CHECK(error_of(p, 1e18).empty());
}

TEST_CASE("a side of two billion cells is refused in moments, not after minutes of absorber lookups") {
  // the automatic absorber looks up the medium along each absorbing edge; it took one lookup a
  // cell, 4e9 here (over a minute), before the memory rule could refuse the grid
  const auto t0 = std::chrono::steady_clock::now();
  const std::string e = error_of(scene("grid: {extent: [20 m, 1 mm], cell: 10 nm}\ntime: {stop: 1 ps}\n"
                                       "media: {glass: {permittivity: 4}}\n"
                                       "bodies: [{medium: glass, circle: {centre: [0, 0], radius: 0.1 mm}}]\n" +
                                       kPoint),
                                 64e9);
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  INFO(e);
  CHECK(e.find("more than this machine allows") != std::string::npos);
  CHECK(seconds < 5);
}

TEST_CASE("the machine's memory is the physical memory or a lower control-group limit") {
  const double m = machine_memory_bytes();
  CHECK(m > 0);
  CHECK(m <= static_cast<double>(sysconf(_SC_PHYS_PAGES)) * static_cast<double>(sysconf(_SC_PAGE_SIZE)));
}

TEST_CASE("a launch line inside a perfect conductor is rejected at the source") {
  const Scene s = scene(kGrid +
                        "time: {stop: 10 ps}\nmedia: {metal: {perfect-conductor: true}}\n"
                        "bodies: [{medium: metal, rectangle: {centre: [-0.3 mm, 0], size: [0.1 mm, 0.2 mm]}}]\n"
                        "sources:\n  - beam: {polarization: Ez, frequency: 0.5 THz, waist: 0.15 mm, focus: [0, 0], "
                        "launch: {x: -0.3 mm}, amplitude: 1 V/m, waveform: {kind: pulse, fwhm: 1 ps}}\n");
  const std::string e = error_of(s, 1e18);
  INFO(e);
  CHECK(e.find("scene.yaml:6:5: error: the launch line starts inside the perfect conductor 'metal'") == 0);
}

TEST_CASE("warnings: a plane wave cut by absorbing sides, a power-spectrum line inside the sample") {
  const std::string plane =
      "sources:\n  - plane: {polarization: Ez, direction: +x, launch: {x: -0.4 mm}, frequency: 0.5 THz, amplitude: 1 "
      "V/m, "
      "waveform: {kind: pulse, fwhm: 1 ps}}\n";
  const std::string tail =
      "time: {stop: 10 ps}\nmedia: {glass: {permittivity: 4}}\n"
      "bodies: [{medium: glass, sample: true, rectangle: {centre: [0, 0], size: [0.2 mm, 0.4 mm]}}]\n" +
      plane;
  auto w = validate_scene(scene(kGrid + tail), 1e18);
  CHECK(any_has(w, "boundaries.y periodic"));
  w = validate_scene(scene("grid: {extent: [1 mm, 0.5 mm], cell: 10 um, boundaries: {y: periodic}}\n" + tail), 1e18);
  CHECK_FALSE(any_has(w, "boundaries.y periodic"));
  const std::string band = ", band: {from: 0.4 THz, to: 0.6 THz, count: 3}}}]\n";
  w = validate_scene(scene(kGrid + tail + "outputs: [{power-spectrum: {name: in, line: {x: 0}" + band), 1e18);
  CHECK(any_has(w, "passes through the sample body at line 4"));
  w = validate_scene(scene(kGrid + tail + "outputs: [{power-spectrum: {name: out, line: {x: 0.3 mm}" + band), 1e18);
  CHECK_FALSE(any_has(w, "sample body"));
}
