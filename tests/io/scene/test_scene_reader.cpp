/// \file test_scene_reader.cpp
/// \brief Reader rules of scene-reference.md that need more than a bad-input file: the unit
/// `cells` per axis (a multiple of the cell along that axis), keys given twice (a YAML
/// mapping's keys must be unique: YAML 1.2 spec, section 3.2.1.1), `--set` errors blamed on
/// the option, one error for one mistake, and SI prefixes of the second (BIPM SI brochure,
/// 9th ed., table 7).
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "io/scene/scene_reader.h"

using namespace ty;

namespace {

const char* kBase = R"(
grid: {extent: [1 mm, 1 mm], cell: [20 um, 10 um]}
time: {stop: 10 ps}
sources:
  - point: {at: [0, 0], component: Ez, amplitude: 1 mA, frequency: 0.5 THz, waveform: {kind: pulse, fwhm: 1 ps}}
title: "t"
)";

/// The message of the BadInput that reading `text` throws ("" when it reads).
std::string error_of(const std::string& text, const std::vector<std::string>& sets = {}) {
  try {
    read_scene_text(text, "scene.yaml", sets);
  } catch (const BadInput& e) {
    return e.what();
  }
  return "";
}

int count(const std::string& s, const std::string& what) {
  int n = 0;
  for (auto p = s.find(what); p != std::string::npos; p = s.find(what, p + 1)) ++n;
  return n;
}

}  // namespace

TEST_CASE("'cells' counts cells of its own axis: y values in dy, x values in dx") {
  const Scene s = read_scene_text(std::string(kBase) + R"(
outputs:
  - probe: {name: p, at: [3 cells, 5 cells], fields: [Ez]}
  - power-spectrum: {name: t, line: {y: 4 cells}, band: {from: 0.4 THz, to: 0.6 THz, count: 3}}
)",
                                  "scene.yaml");
  REQUIRE(s.outputs.size() == 2);
  CHECK(s.outputs[0].at.x - s.origin_shift.x == doctest::Approx(3 * 20e-6));
  CHECK(s.outputs[0].at.y - s.origin_shift.y == doctest::Approx(5 * 10e-6));  // was 100 um (dx)
  CHECK(s.outputs[1].from.y - s.origin_shift.y == doctest::Approx(4 * 10e-6));
  // a length along no axis cannot be counted in cells of a rectangular cell
  const std::string e = error_of(std::string(kBase) +
                                 "bodies: [{medium: g, circle: {centre: [0, 0], radius: 2 cells}}]\n"
                                 "media: {g: {permittivity: 2}}\n");
  CHECK(e.find("ambiguous") != std::string::npos);
}

TEST_CASE("a key given twice is an error at the second, naming the first") {
  const std::string e = error_of(R"(grid: {extent: [1 mm, 1 mm], cell: 20 um}
time: {stop: 1 ps, stop: 5 ns}
sources:
  - point: {at: [0, 0], component: Ez, amplitude: 1 mA, frequency: 0.5 THz, waveform: {kind: pulse, fwhm: 1 ps}}
)");
  INFO(e);
  CHECK(e.find("scene.yaml:2:20: error: the key 'stop' is given twice") != std::string::npos);
  CHECK(e.find("first at line 2, column 8") != std::string::npos);
}

TEST_CASE("--set errors name the option, not the file") {
  std::string e = error_of(kBase, {"title.x=3"});
  CHECK(e.rfind("--set title.x=3: 'title' is a single value", 0) == 0);
  e = error_of(kBase, {"time.stop=5"});  // a time without a unit
  INFO(e);
  CHECK(e.find("--set time.stop=5: error: 'time.stop'") != std::string::npos);
  CHECK(e.find("scene.yaml:1:1") == std::string::npos);
  e = error_of(kBase, {"sources.x.point.at=[0, 0]"});
  CHECK(e.find("should be a list index") != std::string::npos);
  // an error in the file next to a good option still points into the file
  e = error_of(std::string(kBase) + "bias: [0, 0, 1]\n", {"time.stop=2 ps"});
  CHECK(e.find("scene.yaml:7:") != std::string::npos);
  // keys an option creates are blamed on it too
  e = error_of(kBase, {"bias.x=3"});
  CHECK(e.rfind("--set bias.x=3: error: 'bias' must be a list of three values", 0) == 0);
}

TEST_CASE("giving both 'exchange' and 'exchange-constant' is one error") {
  const std::string e = error_of(std::string(kBase) + R"(
media:
  crystal:
    magnet:
      sublattices: [{saturation: 0.75 T}, {saturation: 0.75 T}]
      exchange: 55 T
      exchange-constant: 73
bodies: [{medium: crystal, circle: {centre: [0, 0], radius: 0.1 mm}}]
outputs: [{probe: {name: p, at: [0, 0], fields: [Lx]}}]
)");
  INFO(e);
  CHECK(count(e, "error:") == 1);
  CHECK(e.find("not both") != std::string::npos);
}

TEST_CASE("milliseconds and microseconds are times") {
  const Scene s = read_scene_text(kBase, "scene.yaml", {"time.stop=2 ms"});
  CHECK(s.time.stop == doctest::Approx(2e-3));
  CHECK(read_scene_text(kBase, "scene.yaml", {"time.stop=3 us"}).time.stop == doctest::Approx(3e-6).scale(0));
}

TEST_CASE("bloch: the angle inside a prism sets k_x = n k0 sin(A)") {
  // phase matching across faces parallel to x (Snell's law, Born & Wolf sec. 1.5.1): a wave at
  // 30 deg inside silicon (eps 11.7) at 0.3 THz has k_x = 2 pi f sqrt(11.7) sin(30 deg) / c
  const std::string scene = R"(
grid: {extent: [1 mm, 1 mm], cell: 20 um, boundaries: {x: bloch, y: absorbing}, bloch: {angle: 30 deg, at: 0.3 THz, in: si}}
time: {stop: 10 ps}
media: {si: {permittivity: 11.7}, tilted: {permittivity: [11.7, 11.7, 11.6]}}
sources:
  - point: {at: [0, 0], component: Ez, amplitude: 1 mA, frequency: 0.5 THz, waveform: {kind: pulse, fwhm: 1 ps}}
title: "t"
)";
  const double c0 = 299792458.0, pi = 3.141592653589793;
  CHECK(read_scene_text(scene, "s.yaml").grid.bloch_kx ==
        doctest::Approx(2 * pi * 0.3e12 * std::sqrt(11.7) * 0.5 / c0).epsilon(1e-12));
  // without `in`: the angle in vacuum
  std::string vacuum = scene;
  vacuum.erase(vacuum.find(", in: si"), 8);
  CHECK(read_scene_text(vacuum, "s.yaml").grid.bloch_kx ==
        doctest::Approx(2 * pi * 0.3e12 * 0.5 / c0).epsilon(1e-12));
  CHECK(error_of(scene, {"grid.bloch.in=glass"}).find("medium 'glass' is not defined") != std::string::npos);
  CHECK(error_of(scene, {"grid.bloch.in=tilted"}).find("must be an isotropic") != std::string::npos);
}
