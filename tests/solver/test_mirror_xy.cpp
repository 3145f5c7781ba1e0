/// \file test_mirror_xy.cpp
/// \brief The Yee scheme has no preferred axis: a scene mirrored in the plane x = y (x and y
/// swapped: cells, extents, boundaries, bodies, permittivity tensor, sources) must give the
/// mirrored fields. Under that improper map E is a polar vector, (Ex, Ey, Ez) -> (Ey, Ex, Ez),
/// and H and M are axial vectors, (Hx, Hy, Hz) -> -(Hy, Hx, Hz) (Jackson, Classical
/// Electrodynamics, 3rd ed., sec. 6.10, Table 6.1); the Yee cell maps onto itself (Ex nodes
/// onto Ey nodes, Hx onto Hy, Ez and Hz onto themselves). Every boundary kind is tried on
/// each axis, with a dielectric, a lossy dielectric, a perfect conductor, a dispersive
/// (Lorentz and Drude) block, and an MnF2 slab that
/// crosses the boundary (through the absorber, up to a wall, across the periodic seam), on
/// unequal cells (dx != dy). Only round-off may differ.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <utility>

#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

constexpr double kDx = 10e-6, kDy = 7e-6;
constexpr int kNx = 44, kNy = 36;

Scene base_scene(Boundary bx, Boundary by) {
  Scene s;
  s.title = "mirror";
  s.grid.dx = kDx, s.grid.dy = kDy;
  s.grid.extent = {kNx * kDx, kNy * kDy};
  s.grid.bx = bx, s.grid.by = by;
  s.grid.absorber.cells = 8;
  s.time.step_fraction = 0.95;
  s.time.stop = 300 * 0.95 * courant_limit_dt(kDx, kDy);
  s.time.threads = 2;
  Medium diel;
  diel.name = "anisotropic";
  diel.permittivity = {2, 3, 4};
  Medium lossy = diel;
  lossy.name = "lossy";
  lossy.conductivity = 80;
  Medium metal;
  metal.name = "metal";
  metal.perfect_conductor = true;
  Medium mn;
  mn.name = "MnF2";
  mn.permittivity = {5.5, 5.5, 5.5};
  mn.magnet = test::mnf2(1e-3);
  Medium polar;  // Lorentz poles, unlike along u = x and v = y (invented values)
  polar.name = "polar";
  PermittivityTensor t;
  t.axis[0].eps_inf = 2.0, t.axis[0].lorentz = {{0.6e12, 3.0, 0.05e12}};
  t.axis[1].eps_inf = 3.0, t.axis[1].lorentz = {{0.8e12, 1.5, 0.02e12}};
  t.axis[2].eps_inf = 2.5, t.axis[2].drude = {{0.4e12, 0.1e12}};
  polar.tensor = t;
  polar.permittivity = {2.0, 3.0, 2.5};
  s.media = {diel, lossy, metal, mn, polar};
  auto rect = [&](int medium, Vec2 centre, Vec2 size) {
    Body b;
    b.medium = medium;
    b.shape.kind = Shape::Kind::rectangle;
    b.shape.centre = centre, b.shape.size = size;
    s.bodies.push_back(b);
  };
  const double X = kNx * kDx, Y = kNy * kDy;
  rect(0, {0.25 * X, 0.7 * Y}, {0.13 * X, 0.17 * Y});
  rect(1, {0.7 * X, 0.75 * Y}, {0.11 * X, 0.09 * Y});
  Body disc;
  disc.medium = 2;
  disc.shape.kind = Shape::Kind::circle;
  disc.shape.centre = {0.55 * X, 0.55 * Y}, disc.shape.radius = 0.07 * X;
  s.bodies.push_back(disc);
  rect(3, {0.5 * X, 0.3 * Y}, {2.0 * X, 0.23 * Y});  // across the x boundary, whatever it is
  rect(4, {0.3 * X, 0.52 * Y}, {0.08 * X, 0.12 * Y});  // beside the source: the pulse crosses it
  s.sources.push_back(test::point_source(Component::Ez, {0.37 * X, 0.52 * Y}, 0.5e12, 1e-12, 1.5e-12, 1e-3));
  // the Hz wave too: it alone sees the in-plane permittivity (the polar block's u and v)
  s.sources.push_back(test::point_source(Component::Hz, {0.30 * X, 0.40 * Y}, 0.5e12, 1e-12, 1.5e-12, 1.0));
  return s;
}

/// The scene mirrored in x = y.
Scene mirrored(Scene s) {
  auto sw = [](Vec2& v) { std::swap(v.x, v.y); };
  std::swap(s.grid.dx, s.grid.dy);
  sw(s.grid.extent);
  std::swap(s.grid.bx, s.grid.by);
  for (Medium& m : s.media) {
    std::swap(m.permittivity[0], m.permittivity[1]);
    if (m.tensor) std::swap(m.tensor->axis[0], m.tensor->axis[1]);  // unrotated: u along x, v along y
    if (m.magnet) {  // axial: order -> -(oy, ox, oz); anisotropy axes are lines (sign free)
      auto& o = m.magnet->order;
      o = {-o[1], -o[0], -o[2]};
      for (auto& a : m.magnet->anisotropy) std::swap(a.axis[0], a.axis[1]);
    }
  }
  s.bias = {-s.bias[1], -s.bias[0], -s.bias[2]};
  for (Body& b : s.bodies) sw(b.shape.centre), sw(b.shape.size);
  for (Source& src : s.sources) {
    sw(src.at);
    if (src.component == Component::Hz) src.amplitude = -src.amplitude;  // axial: Hz -> -Hz
  }
  return s;
}

/// Largest |A - mirror(B)| over every node of the six components, relative to the largest
/// |A| of the same kind (E or H), and the largest sublattice tilt in A.
double mirror_mismatch(const Scene& a_scene, double& tilt) {
  Simulation<double> a(a_scene), b(mirrored(a_scene));
  for (long n = 0; n < a.total_steps(); ++n) a.step(), b.step();
  REQUIRE(b.grid().nx == a.grid().ny);
  const YeeGrid& ga = a.grid();
  const YeeGrid& gb = b.grid();
  // A's component c at (i, j) is sign * B's component partner[c] at (j, i)
  const Component partner[6] = {Component::Ey, Component::Ex, Component::Ez,
                                Component::Hy, Component::Hx, Component::Hz};
  const double sign[6] = {1, 1, 1, -1, -1, -1};
  double scale[2] = {0, 0};
  for (int c = 0; c < 6; ++c)
    for (int j = 0; j < ga.ny; ++j)
      for (int i = 0; i < ga.nx; ++i)
        scale[c / 3] = std::max(scale[c / 3], std::abs(a.field(static_cast<Component>(c))[ga.at(i, j)]));
  double rel = 0;
  for (int c = 0; c < 6; ++c)
    for (int j = 0; j < ga.ny; ++j)
      for (int i = 0; i < ga.nx; ++i) {
        const double va = a.field(static_cast<Component>(c))[ga.at(i, j)];
        const double vb = sign[c] * b.field(partner[c])[gb.at(j, i)];
        rel = std::max(rel, std::abs(va - vb) / scale[c / 3]);
      }
  const MagneticCells& M = a.magnets();
  tilt = 0;
  for (long k = 0; k < M.count(); ++k) tilt = std::max(tilt, std::hypot(M.m[M.latest][0][k], M.m[M.latest][1][k]));
  CHECK(scale[0] > 0);
  CHECK(scale[1] > 0);
  return rel;
}

}  // namespace

TEST_CASE("mirror x<->y: every boundary kind on each axis, five media (one dispersive), unequal cells") {
  // each kind once along x and once along y
  const std::pair<Boundary, Boundary> pairs[] = {{Boundary::periodic, Boundary::absorbing},
                                                 {Boundary::electric_wall, Boundary::magnetic_wall},
                                                 {Boundary::magnetic_wall, Boundary::periodic},
                                                 {Boundary::absorbing, Boundary::electric_wall}};
  for (auto [bx, by] : pairs) {
    double tilt = 0;
    const double rel = mirror_mismatch(base_scene(bx, by), tilt);
    MESSAGE(std::string(boundary_name(bx)) << " x " << std::string(boundary_name(by)) << ": largest mismatch " << rel
                                           << " of the largest field, MnF2 tilt " << tilt << " rad");
    CHECK(tilt > 1e-9);  // the magnet took part
    CHECK(rel < 1e-9);   // round-off only (a broken seam or wall differs at the 1e-2 level)
  }
}
