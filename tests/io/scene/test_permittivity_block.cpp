/// \file test_permittivity_block.cpp
/// \brief A medium's `permittivity` map: one model or one per axis, the LO form converted by
/// the single-oscillator Lyddane-Sachs-Teller relation (Phys. Rev. 59, 673 (1941)), wave
/// numbers in cm^-1, and the resolved scene reading back to the same tensor.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "io/scene/constants.h"
#include "io/scene/scene_reader.h"
#include "io/scene/scene_writer.h"

using namespace ty;

namespace {

const char* kBase = R"(
grid: {extent: [1 mm, 1 mm], cell: 10 um}
time: {stop: 10 ps}
sources:
  - point: {at: [0, 0.4 mm], component: Ez, amplitude: 1 mA, frequency: 0.5 THz, waveform: {kind: pulse, fwhm: 1 ps}}
title: "t"
)";

}  // namespace

TEST_CASE("permittivity block: lorentz by lo or strength, drude, per-axis with rotate, round trip") {
  const Scene s = read_scene_text(std::string(kBase) + R"(
media:
  polar: {permittivity: {background: 10.89, lorentz: [{to: 268 cm^-1, lo: 292 cm^-1, damping: 2 cm^-1}]}}
  film: {permittivity: {drude: [{plasma: 3 THz, collision: 0.5 THz}]}, conductivity: 10 S/m}
  tilted:
    permittivity:
      u: {background: 2.2, lorentz: [{to: 5 THz, strength: 1.5}]}
      v: {background: 2.0}
      z: {background: 2.0}
      rotate: 30 deg
)",
                                  "scene.yaml");
  REQUIRE(s.media.size() == 3);
  REQUIRE(s.media[0].tensor);
  const PermittivityModel& p = s.media[0].tensor->axis[2];
  REQUIRE(p.lorentz.size() == 1);
  CHECK(p.lorentz[0].f_to == doctest::Approx(268 * 100 * constants::c0));
  // LST: eps_inf + delta_eps = eps_inf (LO/TO)^2
  CHECK(p.eps_inf + p.lorentz[0].delta_eps == doctest::Approx(10.89 * std::pow(292.0 / 268.0, 2)));
  CHECK(s.media[0].permittivity[0] == 10.89);  // the grid's instantaneous (background) value
  REQUIRE(s.media[1].tensor);
  CHECK(s.media[1].tensor->axis[0].drude[0].collision == doctest::Approx(0.5e12));
  CHECK(s.media[1].permittivity[1] == 1.0);
  const PermittivityTensor& t = *s.media[2].tensor;
  CHECK(t.rotate == doctest::Approx(constants::pi / 6));
  CHECK_FALSE(t.diagonal_in_plane());
  // background rotated: eps_xx = u cos^2 + v sin^2
  CHECK(s.media[2].permittivity[0] == doctest::Approx(2.2 * 0.75 + 2.0 * 0.25));
  // the resolved scene reads back to the same tensors
  const Scene back = read_scene_text(resolved_scene_yaml(s), "resolved.yaml");
  for (size_t m = 0; m < 3; ++m) {
    REQUIRE(back.media[m].tensor);
    const PermittivityTensor &a = *s.media[m].tensor, &b = *back.media[m].tensor;
    CHECK(a.rotate == doctest::Approx(b.rotate));
    for (int k = 0; k < 3; ++k) {
      CHECK(a.axis[k].eps_inf == doctest::Approx(b.axis[k].eps_inf));
      REQUIRE(a.axis[k].lorentz.size() == b.axis[k].lorentz.size());
      for (size_t q = 0; q < a.axis[k].lorentz.size(); ++q) {
        CHECK(a.axis[k].lorentz[q].f_to == doctest::Approx(b.axis[k].lorentz[q].f_to));
        CHECK(a.axis[k].lorentz[q].delta_eps == doctest::Approx(b.axis[k].lorentz[q].delta_eps));
        CHECK(a.axis[k].lorentz[q].damping == doctest::Approx(b.axis[k].lorentz[q].damping));
      }
      REQUIRE(a.axis[k].drude.size() == b.axis[k].drude.size());
      for (size_t q = 0; q < a.axis[k].drude.size(); ++q)
        CHECK(a.axis[k].drude[q].plasma == doctest::Approx(b.axis[k].drude[q].plasma));
    }
  }
}
