/// \file test_threads.cpp
/// \brief Results are bit-for-bit identical for any thread count (design.md: no
/// reductions in the step, a static row partition, the same arithmetic per cell), with and
/// without magnetic cells (whose step hands rows between threads at the block edges).
#include <doctest/doctest.h>

#include <cstring>

#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

template <class R>
std::vector<R> final_fields(int threads, bool periodic_y, bool magnetic = false, int ny = 97) {
  const double d = 10e-6;
  Scene s = test::box_scene(150, ny, d, Boundary::absorbing, periodic_y ? Boundary::periodic : Boundary::absorbing,
                            0.95, 1e-9);
  test::add_lossy_circle(s, {90 * d, 50 * d}, 20 * d);  // medium 0
  Medium pec;
  pec.name = "metal";
  pec.perfect_conductor = true;
  s.media.push_back(pec);
  Body b = s.bodies.back();
  b.medium = 1;
  b.shape.kind = Shape::Kind::rectangle;
  b.shape.centre = {40 * d, 70 * d};
  b.shape.size = {10 * d, 30 * d};
  b.shape.rotate = 0.3;
  s.bodies.push_back(b);
  s.sources.push_back(test::point_source(Component::Ez, {30 * d, 30 * d}, 1e12, 0.5e-12, 1.5e-12, 1e-3));
  Source beam;
  beam.kind = Source::Kind::beam;
  beam.component = Component::Hz;
  beam.frequency = 1e12;
  beam.amplitude = 100;
  beam.waist = 20 * d;
  beam.angle = 0.2;
  beam.line_axis = 'x';
  beam.line_at = 10 * d;
  beam.focus = {60 * d, 48 * d};
  beam.waveform.kind = Waveform::Kind::cw;
  beam.waveform.ramp = 3e-12;
  s.sources.push_back(beam);
  if (magnetic) {  // an MnF2 strip through the right absorber and across the y edges, and a disc
    Medium mn;
    mn.name = "MnF2";
    mn.permittivity = {5.5, 5.5, 5.5};
    mn.magnet = test::mnf2(1e-3);
    s.media.push_back(mn);
    s.bias = {0.2, 0, 0.5};
    b.medium = 2;
    b.shape.kind = Shape::Kind::rectangle;
    b.shape.centre = {130 * d, 0.5 * ny * d};
    b.shape.size = {40 * d, 2.0 * ny * d};
    b.shape.rotate = 0;
    s.bodies.push_back(b);
    b.shape.kind = Shape::Kind::circle;
    b.shape.centre = {110 * d, 0.3 * ny * d};
    b.shape.radius = 8 * d;
    s.bodies.push_back(b);
    // strong enough near the disc to tilt some cells past the small-signal limit
    s.sources.push_back(test::point_source(Component::Hz, {104 * d, 0.3 * ny * d}, 0.26e12, 1e-12, 2e-12, 3e4));
  }
  Simulation<R> sim(s, threads);
  for (int n = 0; n < 300; ++n) sim.step();
  std::vector<R> out;
  for (int c = 0; c < 6; ++c) out.insert(out.end(), sim.field(static_cast<Component>(c)),
                                         sim.field(static_cast<Component>(c)) + sim.grid().size());
  if (magnetic) {
    const MagneticCells& M = sim.magnets();
    double tilt = 0;
    for (long k = 0; k < M.count(); ++k)
      tilt = std::max(tilt, std::hypot(M.m[M.latest][0][k], M.m[M.latest][1][k]));
    MESSAGE("largest sublattice tilt " << tilt << " rad (the small-signal step ends at " << CellStep::kTilt << ")");
    CHECK(tilt > CellStep::kTilt);
    for (long k = 0; k < M.count(); ++k)
      for (int c = 0; c < 6; ++c) out.push_back(static_cast<R>(M.m[M.latest][c][k]));
  }
  return out;
}

}  // namespace

TEST_CASE("one, two and three threads give bit-identical fields") {
  for (bool periodic : {false, true}) {
    const auto a = final_fields<double>(1, periodic);
    const auto b = final_fields<double>(2, periodic);
    const auto c = final_fields<double>(3, periodic);
    double norm = 0;
    for (double v : a) norm += v * v;
    CHECK(norm > 0);
    CHECK(std::memcmp(a.data(), b.data(), a.size() * sizeof(double)) == 0);
    CHECK(std::memcmp(a.data(), c.data(), a.size() * sizeof(double)) == 0);
    const auto fa = final_fields<float>(1, periodic);
    const auto fb = final_fields<float>(2, periodic);
    CHECK(std::memcmp(fa.data(), fb.data(), fa.size() * sizeof(float)) == 0);
  }
}

TEST_CASE("magnetic cells: one to seven threads give bit-identical fields and magnetization") {
  // 24 rows (56 with the absorbers) over up to seven threads; 5 periodic rows over four or
  // seven threads leave one-row blocks, whose first row is also their last, and idle threads
  for (bool periodic : {false, true})
    for (int ny : {24, 5}) {
      const auto a = final_fields<double>(1, periodic, true, ny);
      for (int t : {2, 3, 4, 7}) {
        const auto b = final_fields<double>(t, periodic, true, ny);
        CHECK(std::memcmp(a.data(), b.data(), a.size() * sizeof(double)) == 0);
      }
      const auto fa = final_fields<float>(1, periodic, true, ny);
      const auto fb = final_fields<float>(4, periodic, true, ny);
      CHECK(std::memcmp(fa.data(), fb.data(), fa.size() * sizeof(float)) == 0);
    }
}
