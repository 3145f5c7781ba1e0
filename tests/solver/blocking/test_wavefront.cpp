/// \file test_wavefront.cpp
/// \brief Temporal blocking (solver/blocking/): the wavefront's skew against the Yee
/// staggering, its schedule against the leapfrog's row dependencies, and blocked runs
/// against the one-pass sweep, every state array compared bit for bit.
///
/// The reference for the same-bits checks is the one-pass sweep (whose physics the cavity,
/// Fresnel and dispersion tests check against their formulas): a wavefront only reorders
/// row updates that do not depend on each other (Wellein et al., COMPSAC 2009; Malas et
/// al., SIAM J. Sci. Comput. 37, C439 (2015)), so every value is computed from the same
/// operands in the same order and must come out the same bits, not merely close.
#include <doctest/doctest.h>
#include <omp.h>

#include <atomic>
#include <cstring>
#include <map>

#include "io/scene/permittivity_model.h"
#include "solver/blocking/wavefront.h"
#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

TEST_CASE("wavefront: the row reaches and skew come from the Yee staggering") {
  // Yee (1966); Taflove & Hagness, 3rd ed., eqs. 3.41-3.43 with d/dz = 0: Hx(i, j+1/2) and
  // Hz(i+1/2, j+1/2) take differences of Ez, Ex at rows j+1 and j (one row above); Ex(i+1/2, j)
  // and Ez(i, j) take differences of Hz, Hx at rows j+1/2 and j-1/2 (one row below)
  constexpr blocking::RowReach r = blocking::row_reach();
  CHECK(r.h_reads_e_above == 1);
  CHECK(r.e_reads_h_below == 1);
  // a radius-1 stencil: step t - 1 must be one row ahead, and one more row keeps the units of
  // one front independent (Wellein et al. 2009, fig. 2: fronts of a 3-point stencil)
  CHECK(blocking::kLead == 1);
  CHECK(blocking::kSkew == 2);
}

TEST_CASE("wavefront: a magnetic scene's lead comes from its cells' reaches") {
  // the cell field G H averages Hy(i, j) and Hy(i, j+1) (one row above) and takes the dM of the
  // cells below and above (magnetic_cells.h); with the Yee reaches above, H runs one row ahead
  // of the cells and E, and b(n-1/2) of that row reads the final H one row further: lead 2
  constexpr blocking::MagneticReach m;
  CHECK(m.gather_above == 1);
  CHECK(m.neighbours == 1);
  CHECK(blocking::kMagneticLead == 2);
  // a wider gather or neighbourhood must lengthen it (the formula, not a constant)
  CHECK(blocking::magnetic_lead(blocking::row_reach(), {2, 1}) == 4);
  CHECK(blocking::magnetic_lead(blocking::row_reach(), {1, 3}) == 3);
}

TEST_CASE("wavefront: depth auto keeps the band of the doubled depth within the budget") {
  // worked by hand: a double row of the six arrays is 6 * (nx + 2) * 8 bytes; depth d's band
  // is skew * d + 2 rows (wavefront.h), and auto doubles d while the doubled depth's band fits
  constexpr std::size_t MiB = std::size_t(1) << 20;
  CHECK(blocking::auto_depth(1024, 1024, 8, 2 * MiB, 2) == 16);  // 34 rows of 49 248 B: 1.67 MB
  CHECK(blocking::auto_depth(4096, 4096, 8, 2 * MiB, 2) == 4);   // 10 rows of 196 704 B: 1.97 MB
  CHECK(blocking::auto_depth(4096, 4096, 8, 16 * MiB, 2) == 16);  // 34 rows: 6.7 MB
  CHECK(blocking::auto_depth(4096, 4096, 4, 2 * MiB, 2) == 8);   // single precision: half the bytes
  CHECK(blocking::auto_depth(1024, 1024, 8, 2 * MiB, 3, 184 * 1024) == 2);  // 8 magnetic rows of 238 KB: 1.9 MB
  CHECK(blocking::auto_depth(1024, 1024, 8, 16 * MiB, 3, 184 * 1024) == 16);  // 50 rows: 11.9 MB
  CHECK(blocking::auto_depth(1024, 5, 8, 16 * MiB, 2) == 5);  // never deeper than the rows
  // a grid past the cache: up to 64 steps in up to 32 MiB (depth 64: 130 rows of 196 704 B, 25.6 MB)
  CHECK(blocking::auto_depth(4096, 4096, 8, 32 * MiB, 2, 0, 64) == 64);
  CHECK(blocking::auto_depth(4096, 4096, 8, 16 * MiB, 2, 0, 64) == 32);  // 130 rows do not fit 16 MiB
  CHECK(blocking::auto_depth(1024, 1024, 8, 32 * MiB, 2, 0, 16) == 16);  // within the cache: 16 at most
  CHECK(blocking::auto_depth(4096, 4096, 8, 32 * MiB, 2, 0, 48) == 48);  // a limit that is no power of two holds
  // the budget: a quarter of the last-level cache, between 2 and 16 MiB, or 32 MiB for a
  // grid larger than the cache (docs/performance.md)
  CHECK(blocking::band_bytes() >= 2 * MiB);
  CHECK(blocking::band_bytes() <= 16 * MiB);
  CHECK(blocking::band_bytes(true) >= blocking::band_bytes());
  CHECK(blocking::band_bytes(true) <= 32 * MiB);
}

TEST_CASE("wavefront: every (row, step) once, after the units it reads, for 1 to 3 threads") {
  // the leapfrog's dependencies (wavefront.h): (j, t) after (j + lead, t - 1) and (j - 1, t)
  for (int lead : {blocking::kLead, blocking::kMagneticLead})
  for (int threads : {1, 2, 3})
    for (int ny : {1, 2, 5, 37})
      for (int depth : {1, 2, 3, 8, 9}) {
        std::vector<long> start(static_cast<size_t>(ny * depth), -1), end(start.size(), -1);
        std::atomic<long> clock{0};
        std::atomic<int> twice{0};
        blocking::Progress progress;
        progress.resize(depth);
        progress.reset(depth);
#pragma omp parallel num_threads(threads)
        {
          int t0, t1;
          block_rows(depth, omp_get_thread_num(), omp_get_num_threads(), t0, t1);
          blocking::sweep_steps(
              ny, t0, t1, progress,
              [&](int j, int t) {
                const size_t u = static_cast<size_t>(t * ny + j);
                if (start[u] >= 0) ++twice;
                start[u] = clock++;
                end[u] = clock++;
              },
              lead);
        }
        CAPTURE(lead);
        CAPTURE(threads);
        CAPTURE(ny);
        CAPTURE(depth);
        CHECK(twice == 0);
        int missing = 0, early = 0;
        for (int t = 0; t < depth; ++t)
          for (int j = 0; j < ny; ++j) {
            const long s = start[static_cast<size_t>(t * ny + j)];
            if (s < 0) ++missing;
            if (j > 0 && s < end[static_cast<size_t>(t * ny + j - 1)]) ++early;
            if (t > 0 && s < end[static_cast<size_t>((t - 1) * ny + std::min(j + lead, ny - 1))]) ++early;
          }
        CHECK(missing == 0);
        CHECK(early == 0);
      }
}

namespace {

using State = std::map<std::string, std::vector<char>>;

/// Every array of the simulation's state (fields, absorber, media, recorders), as bytes.
template <class R>
State state_of(Simulation<R>& sim) {
  State s;
  sim.visit_state([&s](const std::string& name, auto* p, std::size_t n) {
    const char* b = reinterpret_cast<const char*>(p);
    s[name].assign(b, b + n * sizeof(*p));
  });
  return s;
}

/// `steps` steps one pass at a time (depth 1) or in blocks; the largest block taken.
template <class R>
State run(const Scene& scene, int threads, int depth, long steps, int& largest, int& chosen, bool tilted = false) {
  Simulation<R> sim(scene, threads);
  sim.set_block_depth(depth);
  if (tilted)  // every magnetic cell on the large-tilt path, whatever its tilt (as `bench --case tilted`)
    for (CellStep& c : sim.magnets().steps) c.tilt2 = -1;
  chosen = sim.block_depth();
  largest = 0;
  for (long n = 0; n < steps;) {
    const long k = sim.advance_up_to(steps - n);
    largest = std::max<int>(largest, static_cast<int>(k));
    n += k;
  }
  CHECK(sim.steps_done() == steps);
  return state_of(sim);
}

/// A scene of the given kind on nx x ny cells (10 um); every one has a point source.
Scene scene_of(const std::string& kind, int nx, int ny) {
  const double d = 10e-6;
  const bool open = kind != "vacuum";
  Scene s = test::box_scene(nx, ny, d, open ? Boundary::absorbing : Boundary::periodic,
                            open ? Boundary::absorbing : Boundary::electric_wall, 0.95, 1e-9);
  s.grid.absorber.cells = 6;
  if (kind == "graded") s.grid.absorber.kind = Absorber::Kind::graded;
  // the recorders' scene has a narrow band (0.2 THz, 3 ps pulses), so its DFTs sample every few steps
  const bool slow = kind == "recorders";
  const double f0 = slow ? 0.2e12 : 1e12, fwhm = slow ? 3e-12 : 0.3e-12, delay = slow ? 5e-12 : 0.8e-12;
  s.sources.push_back(test::point_source(Component::Ez, {0.3 * nx * d, 0.4 * ny * d}, f0, fwhm, delay, 1e-3));
  if (kind == "dielectric" || kind == "graded" || kind == "recorders") {
    test::add_lossy_circle(s, {0.6 * nx * d, 0.5 * ny * d}, 0.2 * ny * d);
    s.sources.push_back(test::plane_pulse(Component::Hz, 0.15 * nx * d, f0, fwhm, delay, 100));
  }
  if (kind == "dispersive") {  // GaAs from memory (Blakemore, J. Appl. Phys. 53, R123 (1982)), damping invented
    PermittivityModel g;
    g.eps_inf = 10.89;
    g.lorentz = {{8.02e12, strength_from_lo(10.89, 8.02e12, 8.75e12), 0.25e12}};
    Medium m;
    m.name = "GaAs";
    m.tensor = PermittivityTensor{};
    m.tensor->axis = {g, g, g};
    m.permittivity = {10.89, 10.89, 10.89};
    s.media.push_back(m);
    Body b;
    b.shape.centre = {0.6 * nx * d, 0.5 * ny * d};
    b.shape.size = {0.3 * nx * d, 0.4 * ny * d};
    s.bodies.push_back(b);
  }
  if (kind == "recorders" || kind == "probes") {
    Output o;
    o.kind = Output::Kind::power_spectrum;
    o.name = "line";
    o.from = {0.8 * nx * d, 0};
    o.to = {0.8 * nx * d, ny * d};
    o.band_from = 0.5 * f0, o.band_to = 1.5 * f0, o.count = 51;
    s.outputs.push_back(o);
    Output map;
    map.kind = Output::Kind::spectral_map;
    map.name = "map";
    map.frequencies = {f0};
    s.outputs.push_back(map);
  }
  if (kind == "probes") {
    Output p;
    p.kind = Output::Kind::probe;
    p.name = "p";
    p.fields = {"Ez", "Hx"};
    p.at = {0.5 * nx * d, 0.5 * ny * d};
    s.outputs.push_back(p);
  }
  if (kind == "magnetic" || kind == "magnetic-recorders" || kind == "magnetic-graded") {
    Medium mn;
    mn.name = "MnF2";
    mn.permittivity = {5.5, 5.5, 5.5};
    mn.magnet = test::mnf2(1e-3);
    s.media.push_back(mn);
    s.bias = {0, 0, 0.5};
    Body b;
    b.shape.kind = Shape::Kind::circle;
    b.shape.centre = {0.6 * nx * d, 0.5 * ny * d};
    b.shape.radius = 0.2 * ny * d;
    s.bodies.push_back(b);
  }
  if (kind == "magnetic-graded") s.grid.absorber.kind = Absorber::Kind::graded;
  if (kind == "magnetic-recorders") {  // lines across every row and along one, probes of fields and cells
    for (int k = 0; k < 2; ++k) {
      Output o;
      o.kind = Output::Kind::power_spectrum;
      o.name = k ? "across" : "along";
      o.from = k ? Vec2{0.8 * nx * d, 0} : Vec2{0, 0.55 * ny * d};
      o.to = k ? Vec2{0.8 * nx * d, ny * d} : Vec2{nx * d, 0.55 * ny * d};
      o.band_from = 0.5e12, o.band_to = 1.5e12, o.count = 31;
      s.outputs.push_back(o);
    }
    Output p;
    p.kind = Output::Kind::probe;
    p.name = "in-crystal";
    p.fields = {"Ez", "Hx", "Mx", "Ly", "dLz"};
    p.at = {0.62 * nx * d, 0.47 * ny * d};
    s.outputs.push_back(p);
    p.name = "detector";
    p.fields = {"Ez", "Sx"};
    p.over_line = true;
    p.from = {0.3 * nx * d, 0.2 * ny * d}, p.to = {0.35 * nx * d, 0.9 * ny * d};
    s.outputs.push_back(p);
  }
  return s;
}

template <class R>
void same_bits(const std::string& kind, int nx, int ny, int depth, int threads, long steps, bool expect_blocks,
               bool tilted = false) {
  const Scene s = scene_of(kind, nx, ny);
  int l1 = 0, l2 = 0, c1 = 0, c2 = 0;
  const State a = run<R>(s, threads, 1, steps, l1, c1, tilted);
  const State b = run<R>(s, threads, depth, steps, l2, c2, tilted);
  CAPTURE(kind);
  CAPTURE(nx);
  CAPTURE(ny);
  CAPTURE(depth);
  CAPTURE(threads);
  CHECK(l1 == 1);
  if (expect_blocks) CHECK(l2 > 1);  // blocks were taken: the check below is not one pass against itself
  else CHECK(c2 == 1);               // the scene forces one pass per step
  REQUIRE(a.size() == b.size());
  double norm = 0;
  for (const char* c : {"fields/Ex", "fields/Ey", "fields/Ez", "fields/Hx", "fields/Hy", "fields/Hz"}) {
    const auto& f = a.at(c);
    for (size_t k = 0; k < f.size() / sizeof(R); ++k) norm += std::abs(reinterpret_cast<const R*>(f.data())[k]);
  }
  CHECK(norm > 0);  // something moved: equal zeros would prove nothing
  for (const auto& [name, bytes] : a) {
    CAPTURE(name);
    CHECK(bytes == b.at(name));
  }
}

}  // namespace

TEST_CASE("wavefront: blocked runs give the one-pass sweep's bits (vacuum, media, absorbers, sources)") {
  for (const char* kind : {"vacuum", "dielectric", "graded", "dispersive"})
    for (int threads : {1, 2})
      for (int depth : {2, 4, 8}) same_bits<double>(kind, 41, 33, depth, threads, 120, true);
  same_bits<float>("dielectric", 41, 33, 4, 2, 120, true);
}

TEST_CASE("wavefront: odd sizes, a depth larger than the rows, more threads than steps") {
  same_bits<double>("vacuum", 17, 3, 8, 2, 100, true);   // 3 rows, 8 steps a block
  same_bits<double>("vacuum", 9, 2, 5, 2, 60, true);     // two rows (walls hold E on both)
  same_bits<double>("dielectric", 23, 5, 64, 2, 130, true);
  same_bits<double>("vacuum", 31, 29, 3, 3, 100, true);  // an odd depth over three threads
  same_bits<double>("vacuum", 31, 29, 2, 3, 100, true);  // a thread with no step
}

TEST_CASE("wavefront: spectral maps end the blocks where they sample, power-spectrum lines record inside them") {
  for (int threads : {1, 2}) same_bits<double>("recorders", 41, 33, 8, threads, 400, true);
}

TEST_CASE("wavefront: probes record inside the blocks, same bits") {
  for (int threads : {1, 2}) same_bits<double>("probes", 41, 33, 8, threads, 100, true);
}

TEST_CASE("wavefront: magnetic cells with probes and power-spectrum lines inside the blocks, same bits") {
  // depth 1 is the one-pass sweep itself; 3 (odd, over two threads) and 16 (deeper than a
  // thread's share of a 25-row grid's fronts) block
  for (int threads : {1, 2})
    for (int depth : {1, 3, 16}) same_bits<double>("magnetic-recorders", 33, 25, depth, threads, 70, depth > 1);
  same_bits<double>("magnetic", 33, 25, 4, 3, 60, true);  // three threads
  same_bits<float>("magnetic-recorders", 33, 25, 3, 2, 60, true);
  for (int threads : {1, 2}) same_bits<double>("magnetic-graded", 33, 25, 5, threads, 60, true);
}

TEST_CASE("wavefront: tilted magnetic cells (the large-tilt path) inside the blocks, same bits") {
  for (int threads : {1, 2}) same_bits<double>("magnetic-recorders", 33, 25, 3, threads, 40, true, true);
}
