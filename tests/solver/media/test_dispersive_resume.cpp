/// \file test_dispersive_resume.cpp
/// \brief A run with dispersive media stopped, checkpointed and resumed gives the same bits as
/// a straight run: the poles' polarization and its rate are part of the saved state.
#include <doctest/doctest.h>

#include "tests/helpers.h"
#include "tests/solver/media/resume_pair.h"

using namespace ty;

TEST_CASE("checkpoint: a dispersive run resumed gives the bits of a straight run") {
  Scene s = test::box_scene(60, 40, 2e-6, Boundary::absorbing, Boundary::periodic, 0.95, 1e-12);
  Medium m;
  m.name = "polar";
  m.tensor = PermittivityTensor{};
  m.tensor->axis[0].eps_inf = m.tensor->axis[1].eps_inf = m.tensor->axis[2].eps_inf = 4;
  m.tensor->axis[2].lorentz = {{8e12, 2.0, 0.1e12}};
  m.tensor->axis[0].drude = m.tensor->axis[1].drude = {{4e12, 0.3e12}};
  m.permittivity = {4, 4, 4};
  s.media.push_back(m);
  Body b;
  b.shape.kind = Shape::Kind::circle;
  b.shape.centre = {60e-6, 40e-6};
  b.shape.radius = 20e-6;
  s.bodies.push_back(b);
  s.sources.push_back(test::point_source(Component::Ez, {20e-6, 40e-6}, 6e12, 0.1e-12, 0.3e-12, 1e-3));
  s.sources.push_back(test::point_source(Component::Hz, {25e-6, 30e-6}, 6e12, 0.1e-12, 0.3e-12, 1.0));
  const test::ResumePair r = test::run_straight_and_resumed(s, "dispersive", 150, 400);
  REQUIRE(r.straight->dispersive().count() > 0);
  CHECK(r.straight->dispersive().p == r.resumed->dispersive().p);
  CHECK(r.straight->dispersive().j == r.resumed->dispersive().j);
  CHECK(r.same_fields());
}
