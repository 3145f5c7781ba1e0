/// \file test_magnet_halo.cpp
/// \brief What the magnetic step reads across a cut between ranks (solver/parallel/magnet_halo.h),
/// derived from the cells' gather table: the table against the nodes a cell's step really
/// reads, and the derived halo against the placement of M and H on the Yee cell.
#include <doctest/doctest.h>

#include <set>
#include <string>
#include <utility>

#include "solver/parallel/magnet_halo.h"
#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {
/// The cells (i, j) whose state moved in one step of an MnF2-filled closed box with no source,
/// from one H node (q, i, j) set to a field and everything else at rest.
std::set<std::pair<int, int>> cells_moved_by(Component q, int i, int j) {
  const double d = 20e-6;
  Scene s = test::box_scene(12, 12, d, Boundary::electric_wall, Boundary::electric_wall, 0.9, 1e-9);
  Medium m;
  m.name = "MnF2";
  m.permittivity = {5.5, 5.5, 5.5};
  m.magnet = test::mnf2(0.0);
  s.media.push_back(m);
  s.bias = {0, 0, 0.3};
  Body b;
  b.shape.kind = Shape::Kind::rectangle;
  b.shape.centre = {6 * d, 6 * d};
  b.shape.size = {20 * d, 20 * d};
  s.bodies.push_back(b);
  Simulation<double> sim(s, 1);
  REQUIRE(sim.magnets().count() == 144);
  sim.at(q, i, j) = 1e5;
  sim.step();
  const MagneticCells& M = sim.magnets();
  std::set<std::pair<int, int>> moved;
  // the cells moved where b reached: the step just taken wrote one copy of the state, the
  // other still holds the starting state (magnetic_cells.h)
  for (long k = 0; k < M.count(); ++k)
    for (int c = 0; c < 6; ++c)
      if (M.m[0][c][k] != M.m[1][c][k]) moved.insert({M.ci[k], M.cj[k]});
  return moved;
}
}  // namespace

TEST_CASE("magnet halo: the gather table lists the H nodes a cell's step reads") {
  // an in-plane field tilts the z-ordered sublattices; a field along z (the order) exerts no
  // torque, so Hz is left out. Each node moves exactly the cells whose table terms reach it.
  for (Component q : {Component::Hx, Component::Hy}) {
    std::set<std::pair<int, int>> expected;
    for (const CellNode& t : kCellGather)
      if (t.q == q) expected.insert({6 - t.di, 6 - t.dj});
    const auto moved = cells_moved_by(q, 6, 6);
    std::string seen;
    for (const auto& [i, j] : moved) seen += " (" + std::to_string(i) + ", " + std::to_string(j) + ")";
    INFO("component " << static_cast<int>(q) << " moved" << seen);
    CHECK(moved == expected);
  }
}

TEST_CASE("magnet halo: Hy from the row above, and the cells above and below along y") {
  // M at the cell centre (the Hz node), Hx on its left and right faces, Hy on its lower and
  // upper faces (magnetic_cells.h; the H nodes of the Yee cell, Yee 1966, with d/dz = 0):
  // only the upper face's Hy lies in another row, so a cut carries Hy down, dM_y up, and the
  // cells' y components both ways.
  CHECK(parallel::cell_h_above_mask() == 1u << static_cast<int>(Component::Hy));
  CHECK(parallel::cell_dm_axes() == 1u << 1);
  CHECK(parallel::cell_m_axes() == 1u << 1);
  CHECK(parallel::kCellValues == 3);  // m1_y, m2_y, dM_y per cell
}
