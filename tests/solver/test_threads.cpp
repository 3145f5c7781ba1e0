/// \file test_threads.cpp
/// \brief Results are bit-for-bit identical for any thread count (design.md: no
/// reductions in the step, a static row partition, the same arithmetic per cell).
#include <doctest/doctest.h>

#include <cstring>

#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

template <class R>
std::vector<R> final_fields(int threads, bool periodic_y) {
  const double d = 10e-6;
  Scene s = test::box_scene(150, 97, d, Boundary::absorbing, periodic_y ? Boundary::periodic : Boundary::absorbing,
                            0.95, 1e-9);
  Medium m;
  m.name = "lossy";
  m.permittivity = {3, 4, 5};
  m.conductivity = 50;
  s.media.push_back(m);
  Medium pec;
  pec.name = "metal";
  pec.perfect_conductor = true;
  s.media.push_back(pec);
  Body b;
  b.medium = 0;
  b.shape.kind = Shape::Kind::circle;
  b.shape.centre = {90 * d, 50 * d};
  b.shape.radius = 20 * d;
  s.bodies.push_back(b);
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
  Simulation<R> sim(s, threads);
  for (int n = 0; n < 300; ++n) sim.step();
  std::vector<R> out;
  for (int c = 0; c < 6; ++c) out.insert(out.end(), sim.field(static_cast<Component>(c)),
                                         sim.field(static_cast<Component>(c)) + sim.grid().size());
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
