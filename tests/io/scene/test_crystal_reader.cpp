/// \file test_crystal_reader.cpp
/// \brief `crystal: NAME` in a medium: the library's values, a cut's axes, values given
/// beside the crystal winning, temperature and state keys, and the resolved scene read back.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "io/scene/scene_reader.h"
#include "io/scene/scene_writer.h"

using namespace ty;

namespace {
std::string scene_with(const std::string& medium) {
  return R"(
title: "crystal"
grid: {extent: [1 mm, 1 mm], cell: 20 um}
time: {stop: 10 ps}
media:
  sample:
)" + medium +
         R"(
bodies:
  - {medium: sample, rectangle: {centre: [0, 0], size: [0.2 mm, 0.2 mm]}}
sources:
  - point: {at: [0, 0.3 mm], component: Ez, amplitude: 1 mA, frequency: 0.26 THz, waveform: {kind: pulse, fwhm: 5 ps}}
)";
}
}  // namespace

TEST_CASE("crystal: the library's MnF2, cut a puts c along y, and values given beside it win") {
  const Scene s = read_scene_text(scene_with("    crystal: MnF2\n    cut: a\n    temperature: 40 K\n"
                                             "    magnet: {exchange: 52.6 T, state: collinear}\n"),
                                  "scene.yaml");
  const Medium& m = s.media[0];
  REQUIRE(m.magnet);
  CHECK(m.crystal == "MnF2");
  CHECK(m.magnet->sublattices[0].saturation == doctest::Approx(0.754));  // the library's
  CHECK(m.magnet->exchange_field() == doctest::Approx(52.6));            // the override
  REQUIRE(m.magnet->anisotropy.size() == 1);
  CHECK(m.magnet->anisotropy[0].axis[1] == doctest::Approx(1.0));  // c along y for cut a
  CHECK(m.magnet->order[1] == doctest::Approx(1.0));
  CHECK(m.magnet->thermal.temperature == doctest::Approx(40));
  CHECK(m.magnet->thermal.ordering == doctest::Approx(67.3));
  CHECK(m.magnet->state.pick == "collinear");
  CHECK(m.permittivity[0] == doctest::Approx(5.5));
}

TEST_CASE("crystal: Euler angles z-x-z turn the axes (90 deg about x puts c along -y)") {
  // R = Rz(0) Rx(90 deg) Rz(0): z goes to -y (a right-handed turn about x)
  const Scene s =
      read_scene_text(scene_with("    crystal: Cr2O3\n    rotation: [0 deg, 90 deg, 0 deg]\n"), "scene.yaml");
  const auto& a = s.media[0].magnet->anisotropy[0].axis;
  CHECK(a[0] == doctest::Approx(0).epsilon(1e-12));
  CHECK(a[1] == doctest::Approx(-1.0));
  CHECK(std::abs(a[2]) < 1e-12);
}

TEST_CASE("crystal: the resolved scene reads back to the same magnet, temperature and history") {
  const Scene s = read_scene_text(scene_with("    crystal: Fe2O3\n    temperature: 300 K\n"
                                             "    magnet: {history: [[0, 0, 0], [0, 0, 1 T]]}\n"),
                                  "scene.yaml");
  const std::string text = resolved_scene_yaml(s);
  CHECK(text.find("from the crystal library: Fe2O3") != std::string::npos);
  const Scene back = read_scene_text(text, "resolved.yaml");
  const Magnet &a = *s.media[0].magnet, &b = *back.media[0].magnet;
  CHECK(b.lambda == doctest::Approx(a.lambda).epsilon(1e-12));
  CHECK(b.dzyaloshinskii[2] == doctest::Approx(a.dzyaloshinskii[2]).epsilon(1e-12));
  CHECK(b.thermal.temperature == doctest::Approx(300));
  CHECK(b.thermal.spin == doctest::Approx(2.5));
  CHECK(b.thermal.reference == doctest::Approx(300));
  REQUIRE(b.state.history.size() == 2);
  CHECK(b.state.history[1][2] == doctest::Approx(1.0));
}
