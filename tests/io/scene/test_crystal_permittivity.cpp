/// \file test_crystal_permittivity.cpp
/// \brief A library crystal's phonons in a medium's permittivity (crystal_permittivity.h):
/// NiO's recorded phonon gives a dispersive medium whose static value is the recorded one and
/// whose LO frequency follows Lyddane-Sachs-Teller (Phys. Rev. 59, 673 (1941)) and lies near
/// NiO's measured LO phonon (about 580 cm^-1 = 17.4 THz, from memory; held to 3%); a scene's
/// `permittivity` beside the crystal replaces it; a crystal turned about z after a cut gives
/// u, v and z from the right crystal axes at the right angle.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "io/scene/crystals/crystal_permittivity.h"
#include "io/scene/scene_reader.h"
#include "io/scene/scene_writer.h"
#include "materials/permittivity/permittivity.h"

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

TEST_CASE("crystal phonons: NiO's phonon makes its medium dispersive, eps(0) as recorded, LO by LST") {
  const Scene s = read_scene_text(scene_with("    crystal: NiO\n"), "scene.yaml");
  const Medium& m = s.media[0];
  REQUIRE(m.tensor);
  for (int c = 0; c < 3; ++c) {
    const PermittivityModel& a = m.tensor->axis[c];
    REQUIRE(a.lorentz.size() == 1);
    CHECK(a.eps_inf == doctest::Approx(5.7));                          // the phonon source's eps_inf (from memory)
    CHECK(axis_permittivity(a, 0.0).real() == doctest::Approx(12.0));  // its eps(0)
    CHECK(m.permittivity[c] == doctest::Approx(5.7));                  // the background the time step sees
    const double lo = lo_frequency(a, a.lorentz[0]);
    CHECK(lo == doctest::Approx(11.9e12 * std::sqrt(12.0 / 5.7)));  // Lyddane-Sachs-Teller
    CHECK(lo == doctest::Approx(580 * 2.99792458e10).epsilon(0.03));
  }
  // the resolved scene reads back to the same tensor
  const Scene back = read_scene_text(resolved_scene_yaml(s), "resolved.yaml");
  REQUIRE(back.media[0].tensor);
  for (int c = 0; c < 3; ++c) CHECK(back.media[0].tensor->axis[c] == m.tensor->axis[c]);
}

TEST_CASE("crystal phonons: a permittivity beside the crystal replaces the library's, phonons included") {
  const Scene s = read_scene_text(scene_with("    crystal: NiO\n    permittivity: 9\n"), "scene.yaml");
  CHECK(!s.media[0].tensor);
  CHECK(s.media[0].permittivity[1] == doctest::Approx(9));
  const Scene t =
      read_scene_text(scene_with("    crystal: MnF2\n    rotation: [30 deg, 0 deg, 0 deg]\n"), "scene.yaml");
  CHECK(!t.media[0].tensor);  // isotropic and constant: the plain diagonal, as before
  CHECK(t.media[0].permittivity[0] == doctest::Approx(5.5));
}

TEST_CASE("crystal phonons: cut a then 30 deg about z puts b at 30 deg from x, c beside it, a along z") {
  Crystal c;  // invented: unlike axes, a phonon along a
  c.permittivity = {{{5, ""}, {7, ""}, {9, ""}}};
  c.phonons = {{0, {10e12, 2.0, 0.5e12}}};
  const Rot3 r = euler_rotation(30 * M_PI / 180, 0, 0) * cut_rotation('a');
  PermittivityTensor t;
  REQUIRE(crystal_permittivity(c, r, t));
  CHECK(t.rotate == doctest::Approx(30 * M_PI / 180));
  CHECK(t.axis[0].eps_inf == doctest::Approx(7));  // b
  CHECK(t.axis[1].eps_inf == doctest::Approx(9));  // c
  CHECK(t.axis[2].eps_inf == doctest::Approx(3));  // a: 5 less the phonon's 2
  CHECK(t.axis[2].lorentz.size() == 1);
  // tilted out of the plane with unlike axes: refused
  CHECK(!crystal_permittivity(c, euler_rotation(0, 0.3, 0) * cut_rotation('a'), t));
}
