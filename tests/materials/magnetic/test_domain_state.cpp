/// \file test_domain_state.cpp
/// \brief Antiferromagnetic domains: a body's own order (`order: reversed`, `order`, `state`
/// on the body) against time reversal, and two domains of one crystal in a scene, read and
/// built into the magnetic cells.
#include <doctest/doctest.h>

#include <cmath>

#include "../../helpers.h"
#include "io/scene/diagnostics.h"
#include "io/scene/scene_reader.h"
#include "io/scene/scene_writer.h"
#include "materials/magnetic/domain_state.h"
#include "materials/magnetic/linear_response.h"
#include "solver/simulation.h"

using namespace ty;

namespace {
Magnet crystal(const std::string& name, double alpha) {
  const std::string text =
      "title: t\ngrid: {extent: [1 mm, 1 mm], cell: 20 um}\ntime: {stop: 1 ps}\nmedia:\n  s: "
      "{crystal: " +
      name +
      "}\nbodies:\n  - {medium: s, rectangle: {centre: [0, 0], size: [0.2 mm, 0.2 mm]}}\nsources:\n  - point: {at: [0, "
      "0.3 mm], component: Ez, amplitude: 1 mA, frequency: 0.26 THz, waveform: {kind: pulse, fwhm: 5 ps}}\n";
  Magnet g = *read_scene_text(text, "t.yaml").media[0].magnet;
  for (auto& s : g.sublattices) s.damping = alpha;
  return g;
}
BodyOrder reversed() {
  BodyOrder o;
  o.reversed = true;
  return o;
}
}  // namespace

TEST_CASE("Domains: order reversed in YFeO3 is the time-reversed state, whose gyrotropy changes sign") {
  // Time reversal (Onsager's relations for a magnetic medium: mu_ij(w; M) = mu_ji(w; -M);
  // Gurevich & Melkov, Magnetization Oscillations and Waves (CRC 1996), ch. 1; Landau &
  // Lifshitz, Electrodynamics of Continuous Media, sec. 101): with no bias the reversed
  // domain (m_s -> -m_s: opposite Neel vector and opposite weak moment D x L) has the same
  // diagonal permeability and the off-diagonal terms of the other sign. The damping is kept:
  // the relation holds for the lossy tensor too.
  const Magnet g = crystal("YFeO3", 1e-3);
  const std::array<double, 3> bias{0, 0, 0};
  const MagnetModel M(g, bias);
  const ChosenState a = choose_body_state(g, BodyOrder{}, bias), b = choose_body_state(g, reversed(), bias);
  MESSAGE(b.how);
  CHECK(b.state.energy == doctest::Approx(a.state.energy).epsilon(1e-12));
  CHECK((b.state.m[0] + a.state.m[0]).norm() < 1e-8);  // the Neel vector turned over
  const Vec3 na = M.net(a.state.m), nb = M.net(b.state.m);
  REQUIRE(na.norm() > 1e-4);  // a weak ferromagnet: the test would not see a sign otherwise
  CHECK((na + nb).norm() < 1e-8 * na.norm());
  int gyrotropic = 0;
  for (double f : {0.1e12, 0.296e12, 0.5e12}) {
    const Mat3c xa = susceptibility(M, a.state, 2 * constants::pi * f),
                xb = susceptibility(M, b.state, 2 * constants::pi * f);
    const double scale = xa.cwiseAbs().maxCoeff();
    CHECK((xb - xa.transpose()).cwiseAbs().maxCoeff() < 1e-9 * scale);
    // and the two domains do differ (else the check above could not fail)
    gyrotropic += (xb - xa).cwiseAbs().maxCoeff() > 1e-4 * scale;
  }
  CHECK(gyrotropic == 3);
}

TEST_CASE("Domains: MnF2 under a bias along its easy axis, order reversed exchanges equal sublattices") {
  // The two sublattices of the model are equivalent (equal moments, the same anisotropy),
  // so the state with the sublattices exchanged has the same energy and the same
  // permeability (Keffer & Kittel, Phys. Rev. 85, 329 (1952): the two-sublattice model's
  // symmetry): reversing the Neel vector alone does not turn the bias's gyrotropy over.
  const Magnet g = test::mnf2(1e-3);
  const std::array<double, 3> bias{0, 0, 1.0};
  const MagnetModel M(g, bias);
  const ChosenState a = choose_body_state(g, BodyOrder{}, bias), b = choose_body_state(g, reversed(), bias);
  CHECK(a.state.kind == "collinear");
  CHECK((b.state.m[0] - a.state.m[1]).norm() < 1e-8);
  CHECK((b.state.m[1] - a.state.m[0]).norm() < 1e-8);
  const double w = 2 * constants::pi * 289e9;
  const Mat3c xa = susceptibility(M, a.state, w), xb = susceptibility(M, b.state, w);
  CHECK((xb - xa).cwiseAbs().maxCoeff() < 1e-9 * xa.cwiseAbs().maxCoeff());
  CHECK(std::abs(xa(0, 1)) > 1e-3 * xa.cwiseAbs().maxCoeff());  // gyrotropic, and alike in both
}

TEST_CASE("Domains: a body's own order and state, and no reversed state under a bias is an error at its key") {
  const Magnet g = test::mnf2();
  BodyOrder down;
  down.order = {0, 0, -1};
  CHECK(choose_body_state(g, down, {0, 0, 0}).state.m[0].z() == doctest::Approx(-1.0));
  BodyOrder flop;
  flop.state = "spin-flop";
  CHECK(choose_body_state(g, flop, {0, 0, 9.25}).state.kind == "spin-flop");  // metastable at 9.25 T
  // a single-sublattice ferrite along a bias along its easy axis: the reversed moment is
  // metastable, 2 mu B higher (Stoner & Wohlfarth), not a domain of the same energy
  Magnet f;
  f.sublattices = {{0.47, 2.0, 0}};
  f.anisotropy = {{{0, 0, 1}, 1.7}};
  BodyOrder r = reversed();
  r.where = {"scene.yaml", 12, 5};
  std::string message;
  try {
    choose_body_state(f, r, {0, 0, 0.5});
  } catch (const BadInput& e) {
    message = e.what();
  }
  CHECK(message.find("scene.yaml:12:5") != std::string::npos);
  CHECK(choose_body_state(f, r, {0, 0, 0}).state.m[0].dot(choose_state(f, {0, 0, 0}).state.m[0]) < -0.999);
}

TEST_CASE("Domains: two bodies of one crystal start from opposite Neel vectors, each cell from its body's") {
  const Scene s = read_scene_text(R"(
title: "two domains"
grid: {extent: [0.4 mm, 0.2 mm], cell: 20 um, boundaries: {x: periodic, y: periodic}}
time: {stop: 1 ps}
media:
  yfo: {crystal: YFeO3}
bodies:
  - {medium: yfo, rectangle: {centre: [-0.1 mm, 0], size: [0.2 mm, 0.4 mm]}}
  - {medium: yfo, rectangle: {centre: [0.1 mm, 0], size: [0.2 mm, 0.4 mm]}, order: reversed}
sources:
  - point: {at: [0, 0], component: Ez, amplitude: 1 mA, frequency: 0.3 THz, waveform: {kind: pulse, fwhm: 5 ps}}
)",
                                  "domains.yaml");
  REQUIRE(s.bodies.size() == 2);
  CHECK_FALSE(s.bodies[0].magnetic.given());
  CHECK(s.bodies[1].magnetic.reversed);
  // the resolved scene (a run's scene.yaml, read back to resume) keeps the body's order
  const Scene back = read_scene_text(resolved_scene_yaml(s), "back.yaml");
  CHECK(back.bodies[1].magnetic.reversed);
  CHECK_FALSE(back.bodies[0].magnetic.given());
  Simulation<double> sim(s);
  const MagneticCells& M = sim.magnets();
  REQUIRE(M.models.size() == 2);
  const Vec3 up = choose_state(*s.media[0].magnet, s.bias).state.m[0];
  long left = 0, right = 0;
  for (long k = 0; k < M.count(); ++k) {
    const Vec3 m1(M.m[0][0][k], M.m[0][1][k], M.m[0][2][k]);
    const bool is_left = sim.grid().x(Component::Hz, M.ci[k]) < 0.2e-3;
    CHECK(m1.dot(up) == doctest::Approx(is_left ? 1.0 : -1.0));
    (is_left ? left : right)++;
  }
  CHECK(left == 10 * 10);  // each body's cells, the wall between them sharp
  CHECK(right == 10 * 10);
  // the run's notes say which state each slot took
  bool noted = false;
  for (const auto& n : sim.notes())
    noted |= n.find("body 2") != std::string::npos && n.find("reversed") != std::string::npos;
  CHECK(noted);
}
