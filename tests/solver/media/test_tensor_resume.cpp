/// \file test_tensor_resume.cpp
/// \brief A run with a rotated dispersive tensor (solver/media/tensor_cells.h) stopped,
/// checkpointed and resumed gives the same bits as a straight run: the list's displacement,
/// kept E and poles are part of the saved state.
#include <doctest/doctest.h>

#include <cstring>
#include <filesystem>

#include "io/run/checkpoint.h"
#include "solver/simulation.h"
#include "tests/helpers.h"

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
  const std::string yaml = "title: t";
  const std::filesystem::path path = std::filesystem::temp_directory_path() / "ty-checkpoint-tensor.h5";
  Simulation<double> straight(s, 2), first(s, 2);
  for (int n = 0; n < 400; ++n) straight.step();
  for (int n = 0; n < 150; ++n) first.step();
  save_checkpoint(path.string(), first, yaml);
  Simulation<double> resumed(s, 2);
  load_checkpoint(path.string(), resumed, yaml);
  for (int n = 150; n < 400; ++n) resumed.step();
  std::filesystem::remove(path);
  REQUIRE(straight.tensor_cells().count() > 0);
  CHECK(straight.tensor_cells().p == resumed.tensor_cells().p);
  CHECK(straight.tensor_cells().d == resumed.tensor_cells().d);
  for (int q = 0; q < 6; ++q)
    CHECK(std::memcmp(straight.field(static_cast<Component>(q)), resumed.field(static_cast<Component>(q)),
                      straight.grid().size() * sizeof(double)) == 0);
}
