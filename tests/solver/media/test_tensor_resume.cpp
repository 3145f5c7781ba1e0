/// \file test_tensor_resume.cpp
/// \brief A run with a rotated dispersive tensor (solver/media/tensor_cells.h) stopped,
/// checkpointed and resumed gives the same bits as a straight run: the sites' axis fields,
/// kept E and poles are part of the saved state.
#include <doctest/doctest.h>

#include "tests/helpers.h"
#include "tests/solver/media/resume_pair.h"

using namespace ty;

TEST_CASE("checkpoint: a run with a rotated dispersive tensor resumed gives the bits of a straight run") {
  Scene s = test::box_scene(60, 40, 2e-6, Boundary::absorbing, Boundary::periodic, 0.95, 1e-12);
  Medium m;
  m.name = "rotated";
  m.tensor = PermittivityTensor{};
  m.tensor->axis[0].eps_inf = 4;
  m.tensor->axis[0].lorentz = {{8e12, 2.0, 0.1e12}};
  m.tensor->axis[1].eps_inf = 2;
  m.tensor->axis[1].drude = {{4e12, 0.3e12}};
  m.tensor->axis[2].eps_inf = 2;
  m.tensor->rotate = 0.5;
  m.permittivity = {3, 3, 2};
  s.media.push_back(m);
  Body b;
  b.shape.kind = Shape::Kind::circle;
  b.shape.centre = {60e-6, 40e-6};
  b.shape.radius = 20e-6;
  s.bodies.push_back(b);
  s.sources.push_back(test::point_source(Component::Hz, {25e-6, 30e-6}, 6e12, 0.1e-12, 0.3e-12, 1.0));
  const test::ResumePair r = test::run_straight_and_resumed(s, "tensor", 150, 400);
  REQUIRE(r.straight->tensor_cells().count() > 0);
  CHECK(r.straight->tensor_cells().p == r.resumed->tensor_cells().p);
  CHECK(r.straight->tensor_cells().e_axis == r.resumed->tensor_cells().e_axis);
  CHECK(r.same_fields());
}
