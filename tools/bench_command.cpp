/// \file bench_command.cpp
/// \brief `terayee bench [--case C]`: cell-updates per second of the full step on a square
/// grid, for each case: vacuum (periodic x, electric-wall y sides), dielectric (a disc of eps = 4 inside
/// 16-cell absorbers), absorber (CPML auxiliaries on both axes in every cell), magnetic
/// (every cell MnF2 under 0.5 T, 20 um cells), tilted (the same with every cell forced onto
/// the large-tilt path, the midpoint rule), recorders (vacuum with two 1001-frequency
/// power-spectrum lines, a whole-grid spectral map and four probes), phonon and rotated (every
/// cell a dispersive phonon crystal, its axes along x, y or turned by 35 deg); each with its cost
/// relative to a one-pass vacuum cell. Median of several timed samples. --block-depth N|auto
/// takes the cases' steps in blocks of that many (solver/blocking/; a case that forces one
/// pass per step says so). The last line is
/// machine-readable: cell_updates_per_s=<rate of the last case printed>.
#include <fmt/format.h>
#include <omp.h>

#include <algorithm>
#include <chrono>
#include <iostream>

#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"
#include "io/scene/scene.h"
#include "solver/simulation.h"
#include "tools/commands.h"

namespace ty {
namespace {

Scene bench_scene(int n, bool dielectric, bool magnetic = false) {
  Scene s;
  s.title = "bench";
  s.grid.dx = s.grid.dy = 10e-6;
  s.grid.extent = {n * s.grid.dx, n * s.grid.dy};
  // vacuum: periodic along x, electric walls along y (a periodic y side forbids temporal
  // blocking: row 0 reads row ny-1 of the same step, solver/blocking/)
  s.grid.bx = dielectric ? Boundary::absorbing : Boundary::periodic;
  s.grid.by = dielectric ? Boundary::absorbing : Boundary::electric_wall;
  s.time.stop = 1e-9;
  s.time.step_fraction = 0.9;
  Source src;  // a point source keeps the fields non-trivial
  src.kind = Source::Kind::point;
  src.component = Component::Ez;
  src.frequency = 0.5e12;
  src.amplitude = 1e-3;
  src.at = {0.3 * s.grid.extent.x, 0.5 * s.grid.extent.y};
  src.waveform.kind = Waveform::Kind::cw;
  src.waveform.ramp = 4e-12;
  s.sources.push_back(src);
  if (magnetic) {  // every cell an MnF2 cell (references.md values), bias 0.5 T along the easy axis
    // a production cell for MnF2 (20 cells per wavelength), set before the body that fills the
    // grid is sized from the extent (set after it, the body covered 56% of the cells)
    s.grid.dx = s.grid.dy = 20e-6;
    s.grid.extent = {n * s.grid.dx, n * s.grid.dy};
    s.sources[0].at = {0.3 * s.grid.extent.x, 0.5 * s.grid.extent.y};
    s.sources[0].frequency = 0.25e12;
    Medium m;
    m.name = "MnF2";
    m.permittivity = {5.5, 5.5, 5.5};
    Magnet g;
    g.sublattices = {{0.754, 2.0, 1e-4}, {0.754, 2.0, 1e-4}};
    g.lambda = 55.0 / 0.754;
    g.anisotropy = {{{0, 0, 1}, 0.787}};
    m.magnet = g;
    s.media.push_back(m);
    s.bias = {0, 0, 0.5};
    Body b;
    b.shape.kind = Shape::Kind::rectangle;
    b.shape.centre = {0.5 * s.grid.extent.x, 0.5 * s.grid.extent.y};
    b.shape.size = {2 * s.grid.extent.x, 2 * s.grid.extent.y};
    s.bodies.push_back(b);
  }
  if (dielectric) {
    Medium m;
    m.name = "disc";
    m.permittivity = {4, 4, 4};
    s.media.push_back(m);
    Body b;
    b.shape.kind = Shape::Kind::circle;
    b.shape.centre = {0.5 * s.grid.extent.x, 0.5 * s.grid.extent.y};
    b.shape.radius = 0.25 * s.grid.extent.x;
    s.bodies.push_back(b);
  }
  return s;
}

/// `steps` steps without recorders: one pass each, or blocks of the simulation's depth.
template <class R>
void take_steps(Simulation<R>& sim, long steps) {
  const int d = sim.block_depth();
  for (long q = 0; q < steps;) {
    const int k = static_cast<int>(std::min<long>(d, steps - q));
    if (k > 1) sim.step_block(k);
    else sim.step();
    q += k;
  }
}

template <class R>
double rate_of(const Scene& scene, int threads, double seconds, int samples, bool tilted = false, int depth = 1,
               bool say_cells = false) {
  Simulation<R> sim(scene, threads);
  if (say_cells && !sim.magnets().empty())  // what the case's cost is an average over
    std::cout << fmt::format("# {} of the {} cells magnetic\n", sim.magnets().count(), sim.grid().cells());
  sim.set_block_depth(depth);
  if (depth != 1) std::cout << fmt::format("# {}\n", sim.block_note());
  if (tilted)  // every magnetic cell on the large-tilt path (the midpoint rule), whatever its tilt
    for (CellStep& c : sim.magnets().steps) c.tilt2 = -1;
  const double cells = static_cast<double>(sim.grid().cells());
  long steps = 1;
  for (;;) {  // calibrate
    const auto t0 = std::chrono::steady_clock::now();
    take_steps(sim, steps);
    const double dt = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    if (dt > 0.05) {
      steps = std::max(1L, static_cast<long>(steps * seconds / dt));
      break;
    }
    steps *= 2;
  }
  std::vector<double> r;
  for (int k = 0; k < samples; ++k) {
    const auto t0 = std::chrono::steady_clock::now();
    take_steps(sim, steps);
    const double dt = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    r.push_back(cells * steps / dt);
  }
  std::sort(r.begin(), r.end());
  return r[r.size() / 2];
}

}  // namespace

double measure_vacuum_rate(int size, int threads, bool single, double seconds, int samples) {
  const Scene s = bench_scene(size, false);
  return single ? rate_of<float>(s, threads, seconds, samples) : rate_of<double>(s, threads, seconds, samples);
}

double measure_magnetic_rate(const Scene& scene, int medium, int threads, double seconds) {
  Scene s = bench_scene(32, false);
  s.grid.dx = scene.grid.dx, s.grid.dy = scene.grid.dy;
  s.grid.extent = {32 * s.grid.dx, 32 * s.grid.dy};
  s.time = scene.time;
  s.bias = scene.bias;
  s.media = {scene.media[medium]};
  Body b;
  b.shape.kind = Shape::Kind::rectangle;
  b.shape.centre = {0.5 * s.grid.extent.x, 0.5 * s.grid.extent.y};
  b.shape.size = {2 * s.grid.extent.x, 2 * s.grid.extent.y};
  s.bodies = {b};
  s.sources[0].at = {0.3 * s.grid.extent.x, 0.5 * s.grid.extent.y};
  s.sources[0].frequency = scene.sources.empty() ? 1e12 : scene.sources[0].frequency;
  return scene.time.precision == Precision::single ? rate_of<float>(s, threads, seconds, 3)
                                                   : rate_of<double>(s, threads, seconds, 3);
}

namespace {

/// Every cell the tilted phonon mirror's crystal (scenarios/tilted-phonon-mirror.yaml: one
/// Lorentz pole per axis), its axes turned by 35 deg (`rotated`: the tensor list of
/// solver/media/tensor_cells.h, every in-plane node) or not (`phonon`: the per-component poles).
Scene phonon_scene(int n, bool rotated) {
  Scene s = bench_scene(n, false);
  s.grid.dx = s.grid.dy = 0.4e-6;  // the scene's cell
  s.grid.extent = {n * s.grid.dx, n * s.grid.dy};
  s.sources[0].at = {0.3 * s.grid.extent.x, 0.5 * s.grid.extent.y};
  s.sources[0].frequency = 8e12;
  s.sources[0].waveform.ramp = 0.4e-12;
  Medium m;
  m.name = rotated ? "rotated" : "phonon";
  PermittivityTensor t;
  t.axis[0].eps_inf = 3, t.axis[0].lorentz = {{8e12, 4.0, 0.3e12}};
  t.axis[1].eps_inf = 2.5, t.axis[1].lorentz = {{6e12, 1.5, 0.2e12}};
  t.axis[2] = t.axis[1];
  t.rotate = rotated ? 35 * constants::pi / 180 : 0;
  m.tensor = t;
  m.permittivity = {3, 2.5, 2.5};
  s.media.push_back(m);
  Body b;
  b.shape.kind = Shape::Kind::rectangle;
  b.shape.centre = {0.5 * s.grid.extent.x, 0.5 * s.grid.extent.y};
  b.shape.size = {2 * s.grid.extent.x, 2 * s.grid.extent.y};
  s.bodies.push_back(b);
  return s;
}

const char* const kCases[] = {"vacuum", "dielectric", "absorber", "magnetic", "tilted", "recorders", "phonon", "rotated"};

/// The scene of one bench case on an n x n grid.
Scene case_scene(const std::string& name, int n) {
  if (name == "vacuum") return bench_scene(n, false);
  if (name == "magnetic" || name == "tilted") return bench_scene(n, false, true);
  if (name == "phonon" || name == "rotated") return phonon_scene(n, name == "rotated");
  Scene s = bench_scene(n, name == "dielectric");
  if (name == "absorber") {  // the whole grid absorbing: every cell carries CPML auxiliaries on both axes
    s.grid.bx = s.grid.by = Boundary::absorbing;
    s.grid.absorber.cells = std::max(1, n / 2 - 1);
  }
  if (name == "recorders") {  // a vacuum grid with the recorders a study keeps: two power-spectrum lines
    // of 1001 frequencies, a spectral map at 3 frequencies over the whole grid, 4 probes
    for (int k = 0; k < 2; ++k) {
      Output o;
      o.kind = Output::Kind::power_spectrum;
      o.name = k == 0 ? "reflected" : "transmitted";
      const double x = (k == 0 ? 0.2 : 0.8) * s.grid.extent.x;
      o.from = {x, 0};
      o.to = {x, s.grid.extent.y};
      o.band_from = 0.3e12, o.band_to = 0.7e12, o.count = 1001;
      s.outputs.push_back(o);
    }
    Output map;
    map.kind = Output::Kind::spectral_map;
    map.name = "map";
    map.frequencies = {0.4e12, 0.5e12, 0.6e12};
    s.outputs.push_back(map);
    for (int k = 0; k < 4; ++k) {
      Output p;
      p.kind = Output::Kind::probe;
      p.name = fmt::format("p{}", k);
      p.fields = {"Ez", "Hx", "Hy"};
      p.at = {(0.2 + 0.2 * k) * s.grid.extent.x, 0.5 * s.grid.extent.y};
      s.outputs.push_back(p);
    }
  }
  return s;
}

double case_rate(const std::string& name, int n, int threads, bool single, double seconds, int samples, int depth = 1) {
  const Scene s = case_scene(name, n);
  const bool tilted = name == "tilted";
  return single ? rate_of<float>(s, threads, seconds, samples, tilted, depth, true)
                : rate_of<double>(s, threads, seconds, samples, tilted, depth, true);
}

}  // namespace

int bench_command(int size, int threads, const std::string& precision, double seconds, const std::string& which,
                  int block_depth) {
  const bool single = precision == "single";
  const int nt = threads > 0 ? threads : omp_get_max_threads();
  std::vector<std::string> cases;
  for (const char* c : kCases)
    if (which == "all" || which == c) cases.emplace_back(c);
  if (cases.empty()) throw BadInput(fmt::format("terayee bench: error: unknown case '{}'", which));
  std::cout << fmt::format("# terayee bench: {}x{} cells, {} precision, {} threads, median of 5 samples\n", size, size,
                           precision, nt);
  const double vac = case_rate("vacuum", size, nt, single, seconds, 5);
  double last = vac;
  for (const auto& c : cases) {
    const double r = block_depth != 1 ? case_rate(c, size, nt, single, seconds, 5, block_depth)
                     : c == "vacuum"  ? vac
                                      : case_rate(c, size, nt, single, seconds, 5);
    std::cout << fmt::format("{:<11} {:.4g} cell-updates/s, {:.2f}x the cost of a one-pass vacuum cell\n", c, r,
                             vac / r);
    last = r;
  }
  std::cout << fmt::format("cell_updates_per_s={:.6g}\n", last);
  return 0;
}

}  // namespace ty
