/// \file half_space.h
/// \brief A dielectric half-space for the quasi-1D test scenes: a body from x_face to past the
/// grid's right edge, taller than the grid, so it continues through the absorber (test only).
#pragma once
#include <string>

#include "io/scene/scene.h"

namespace ty::test {

/// Adds a medium "half-space" of relative permittivity eps filling x >= x_face of an nx x ny
/// grid of square cells `cell` (internal coordinates), through the absorbers beyond.
inline void add_half_space(Scene& s, double eps, double x_face, int nx, int ny, double cell) {
  Medium m;
  m.name = "half-space";
  m.permittivity = {eps, eps, eps};
  s.media.push_back(m);
  Body b;
  b.medium = static_cast<int>(s.media.size()) - 1;
  b.shape.kind = Shape::Kind::rectangle;
  b.shape.centre = {x_face + 0.5 * nx * cell, 0.5 * ny * cell};
  b.shape.size = {nx * cell, 10 * ny * cell};  // reaches past the extent: continues through the absorber
  s.bodies.push_back(b);
}

}  // namespace ty::test
