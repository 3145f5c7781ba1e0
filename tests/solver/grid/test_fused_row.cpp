/// \file test_fused_row.cpp
/// \brief H and E of a row's interior in one vector loop (solver/grid/fused_row.h,
/// solver/row_fusion.cpp) against the pair of row loops, bit for bit.
///
/// The reference is the plain Yee update (Yee 1966; Taflove & Hagness, 3rd ed., eqs.
/// 3.41-3.43), whose physics the cavity, Fresnel and dispersion tests check against their
/// formulas. The fused loop computes every node from the same operands in the same order, so
/// it must give the same bits, not merely close ones: on random rows for every span the
/// solver can choose, and on whole runs with absorbers, walls, media, sources and blocks.
#include <doctest/doctest.h>

#include <cstring>
#include <map>
#include <random>

#include "io/scene/permittivity_model.h"
#include "solver/grid/fused_row.h"
#include "solver/grid/yee_update.h"
#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

/// Rows -1, 0, 1 of six arrays of random values, nx columns plus a ghost and a vector of slack.
template <class R>
struct ThreeRows {
  int nx;
  long s;
  std::vector<R> f[6];
  explicit ThreeRows(int n) : nx(n), s(n + 2 * fused_row::lanes<R>()) {
    std::mt19937 gen(7);
    std::uniform_real_distribution<double> u(-1, 1);
    for (auto& a : f) {
      a.resize(static_cast<std::size_t>(3 * s));
      for (auto& v : a) v = static_cast<R>(u(gen));
    }
  }
  R* row(int c) { return f[c].data() + s + fused_row::lanes<R>(); }  // column 0 of row 0
};

/// The pair of plain loops over [a, b), one node at a time: H of the row, then its E, as
/// simulation.cpp's kernels do (the one-run loop, or with runs a run's loop at ca = 1).
template <bool kRuns, class R>
void two_loops(ThreeRows<R>& t, int a, int b, R sx, R sy, R kx, R ky) {
  R *ex = t.row(0), *ey = t.row(1), *ez = t.row(2), *hx = t.row(3), *hy = t.row(4), *hz = t.row(5);
  const long s = t.s;
  const R one = 1;
  for (int i = a; i < b; ++i) {
    hx[i] = yee::hx(hx[i], ez[i + s] - ez[i], R(-sy));
    hy[i] = yee::hy(hy[i], ez[i + 1] - ez[i], sx);
    hz[i] = yee::hz(hz[i], ey[i + 1] - ey[i], ex[i + s] - ex[i], sx, sy);
  }
  for (int i = a; i < b; ++i) {
    if (kRuns) {
      ex[i] = yee::ex(one, ex[i], hz[i] - hz[i - s], ky);
      ey[i] = yee::ey(one, ey[i], hz[i] - hz[i - 1], R(-kx));
      ez[i] = yee::ez(one, ez[i], hy[i] - hy[i - 1], hx[i] - hx[i - s], kx, ky);
    } else {
      ex[i] = yee::ex(ex[i], hz[i] - hz[i - s], ky);
      ey[i] = yee::ey(ey[i], hz[i] - hz[i - 1], R(-kx));
      ez[i] = yee::ez(ez[i], hy[i] - hy[i - 1], hx[i] - hx[i - s], kx, ky);
    }
  }
}

/// Byte-for-byte equality: == would take -0 for +0.
template <class R>
bool same_bytes(const std::vector<R>& a, const std::vector<R>& b) {
  return a.size() == b.size() && std::memcmp(a.data(), b.data(), a.size() * sizeof(R)) == 0;
}

template <bool kRuns, class R>
void kernel_same_bits() {
  constexpr int W = fused_row::lanes<R>();
  const R sx = R(0.61), sy = R(0.37), kx = R(0.29), ky = R(0.17);  // any coefficients
  for (int a : {W, 2 * W})
    for (int n : {1, 2, 5}) {
      ThreeRows<R> p(a + (n + 2) * W), q = p;
      two_loops<kRuns>(p, a, a + n * W, sx, sy, kx, ky);
      R* f[6] = {q.row(0), q.row(1), q.row(2), q.row(3), q.row(4), q.row(5)};
      fused_row::step(f, q.s, a, a + n * W, sx, sy, kx, ky);
      CAPTURE(a);
      CAPTURE(n);
      int changed = 0;
      for (int c = 0; c < 6; ++c) {
        CHECK(same_bytes(p.f[c], q.f[c]));
        changed += p.f[c] != ThreeRows<R>(p.nx).f[c];
      }
      CHECK(changed == 6);  // every component moved: equal arrays would prove nothing
    }
}

/// Zero coefficients on fields of -0: every result is a signed zero, and its sign follows the
/// sign each coefficient is used with (IEEE 754: -0 + -0 = -0, -0 + +0 = +0), so the fused loop
/// must hold -k, not 0 - k, as the row loops do.
template <bool kRuns, class R>
void kernel_signed_zeros() {
  constexpr int W = fused_row::lanes<R>();
  ThreeRows<R> p(4 * W);
  for (auto& a : p.f) std::fill(a.begin(), a.end(), R(-0.0));
  ThreeRows<R> q = p;
  two_loops<kRuns>(p, W, 3 * W, R(0), R(0), R(0), R(0));
  R* f[6] = {q.row(0), q.row(1), q.row(2), q.row(3), q.row(4), q.row(5)};
  fused_row::step(f, q.s, W, 3 * W, R(0), R(0), R(0), R(0));
  for (int c = 0; c < 6; ++c) {
    CAPTURE(c);
    CHECK(same_bytes(p.f[c], q.f[c]));
  }
}

using State = std::map<std::string, std::vector<char>>;

/// `steps` steps of the scene, fused rows on or off, in blocks of `depth` (1: one pass each);
/// every state array's bytes, and how many rows took the fused loop.
template <class R>
State run(const Scene& scene, bool fused, int depth, long steps, int threads, int& rows) {
  Simulation<R> sim(scene, threads);
  sim.set_row_fusion(fused);
  sim.set_block_depth(depth);
  rows = sim.fused_rows();
  for (long n = 0; n < steps;) n += sim.advance_up_to(steps - n);
  State s;
  sim.visit_state([&s](const std::string& name, auto* p, std::size_t k) {
    const char* b = reinterpret_cast<const char*>(p);
    s[name].assign(b, b + k * sizeof(*p));
  });
  return s;
}

/// 83 x 41 cells of 10 um (odd, so spans end inside rows); sides by kind, a lossy circle of
/// dielectric (rows through it fuse on one side), an Ez point source and an Hz plane pulse
/// launched across every row (their columns stay out of the spans), or along one row
/// ("turned": that row keeps no span). "dispersive" adds a body of a Lorentz medium, "edges" a diagonal of Hz point sources over 17 consecutive columns
/// (so some sit at a span's first or last column, or just outside it, in float and double).
Scene scene_of(const std::string& kind) {
  const int nx = 83, ny = 41;
  const double d = 10e-6;
  Boundary bx = Boundary::absorbing, by = Boundary::absorbing;
  if (kind == "periodic x") bx = Boundary::periodic, by = Boundary::electric_wall;
  if (kind == "periodic y") by = Boundary::periodic;
  if (kind == "walls") bx = Boundary::electric_wall, by = Boundary::magnetic_wall;
  if (kind == "magnetic x") bx = Boundary::magnetic_wall;
  Scene s = test::box_scene(nx, ny, d, bx, by, 0.95, 1e-9);
  s.grid.absorber.cells = 6;
  if (kind == "graded") s.grid.absorber.kind = Absorber::Kind::graded;
  s.sources.push_back(test::point_source(Component::Ez, {0.3 * nx * d, 0.4 * ny * d}, 1e12, 0.3e-12, 0.8e-12, 1e-3));
  s.sources.push_back(test::plane_pulse(Component::Hz, 0.2 * nx * d, 1e12, 0.3e-12, 0.8e-12, 100));
  test::add_lossy_circle(s, {0.7 * nx * d, 0.5 * ny * d}, 0.2 * ny * d);
  if (kind == "turned") {  // the pulse launched along a row instead, obliquely: one row holds the whole line
    s.sources.back().line_axis = 'y';
    s.sources.back().line_at = 0.35 * ny * d;
    s.sources.back().angle = 1.27;  // rad from +x: 17 degrees off the row's normal
  }
  if (kind == "edges")
    for (int k = 0; k < 17; ++k)
      s.sources.push_back(test::point_source(Component::Hz, {(k + 10.5) * d, (k + 12.5) * d}, 1e12, 0.3e-12, 0.8e-12, 1));
  // a rotated dispersive tensor (values invented): its in-plane nodes stepped after the sweep;
  // or an isotropic Lorentz medium (invented): rows through it fuse beside it (its nodes'
  // ca is not 1, the pole's implicit term, and row_fusion.cpp also cuts at them)
  if (kind == "rotated" || kind == "dispersive") {
    const bool rotated = kind == "rotated";
    Medium r;
    r.name = "dispersive";
    r.tensor = PermittivityTensor{};
    for (auto& a : r.tensor->axis) a.eps_inf = 2;
    r.tensor->axis[0].eps_inf = rotated ? 4 : 2;
    for (int c = 0; c < (rotated ? 1 : 3); ++c) r.tensor->axis[c].lorentz = {{8e12, 2.0, 0.1e12}};
    r.tensor->rotate = rotated ? 0.5 : 0.0;
    r.permittivity = {r.tensor->axis[0].eps_inf, 2, 2};
    s.media.push_back(r);
    Body b = s.bodies.back();
    b.medium = 1;
    b.shape.centre = {0.45 * nx * d, 0.7 * ny * d};
    b.shape.radius = 0.15 * ny * d;
    s.bodies.push_back(b);
  }
  return s;
}

/// The run without fused rows (one pass, `off` threads) against the run with them (`depth`
/// steps a block, `on` threads).
template <class R>
void run_same_bits(const std::string& kind, int depth, int off_threads = 2, int on_threads = 2) {
  const Scene s = scene_of(kind);
  int on = 0, off = 0;
  const State a = run<R>(s, false, 1, 150, off_threads, off);
  const State b = run<R>(s, true, depth, 150, on_threads, on);
  CAPTURE(kind);
  CAPTURE(depth);
  CAPTURE(on_threads);
  CHECK(off == 0);
  CHECK(on >= 20);  // most rows fuse (41 less the absorber's 12, or none lost to a y wall)
  double norm = 0;
  for (const char* c : {"fields/Ex", "fields/Ey", "fields/Ez", "fields/Hx", "fields/Hy", "fields/Hz"}) {
    const auto& f = a.at(c);
    for (size_t k = 0; k < f.size() / sizeof(R); ++k) norm += std::abs(reinterpret_cast<const R*>(f.data())[k]);
  }
  CHECK(norm > 0);
  REQUIRE(a.size() == b.size());
  for (const auto& [name, bytes] : a) {
    CAPTURE(name);
    CHECK(bytes == b.at(name));
  }
}

}  // namespace

TEST_CASE("fused rows: the one-loop kernel gives the two loops' bits on random rows") {
  kernel_same_bits<false, double>();
  kernel_same_bits<false, float>();
  kernel_same_bits<true, double>();
  kernel_same_bits<true, float>();
  kernel_signed_zeros<false, double>();
  kernel_signed_zeros<true, float>();
}

TEST_CASE("fused rows: whole runs give the two loops' bits (absorbers, walls, media, sources, blocks)") {
  for (const char* kind :
       {"pml", "graded", "periodic x", "periodic y", "walls", "magnetic x", "turned", "rotated", "dispersive", "edges"})
    run_same_bits<double>(kind, 1);
  run_same_bits<double>("pml", 8);  // the wavefront's units take the fused rows too
  run_same_bits<double>("graded", 8);
  run_same_bits<double>("edges", 4);
  run_same_bits<double>("pml", 1, 1, 3);  // which rows fuse depends on the thread count; the bits do not
  run_same_bits<double>("dispersive", 8, 1, 3);
  run_same_bits<float>("pml", 1);
  run_same_bits<float>("edges", 1);
  run_same_bits<float>("walls", 4);
}
