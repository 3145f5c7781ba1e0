/// \file run_command.cpp
/// \brief `terayee run SCENE -o RUN`: reads and checks the scene, steps the simulation
/// with a progress line, and writes the run folder. Ctrl-C stops the run cleanly
/// (nothing is left that looks like a result).
#include <fmt/format.h>
#include <nlohmann/json.hpp>
#include <unistd.h>

#include <chrono>
#include <cmath>
#include <csignal>
#include <iostream>

#include "io/run/checkpoint.h"
#include "io/run/log.h"
#include "io/run/run_folder.h"
#include "io/scene/scene_reader.h"
#include "io/scene/scene_writer.h"
#include "io/scene/validation.h"
#include "solver/simulation.h"
#include "tools/commands.h"

namespace ty {
namespace {

volatile std::sig_atomic_t g_stop = 0;
void on_signal(int) { g_stop = 1; }

std::string hms(double s) {
  const long t = std::lround(std::max(0.0, s));
  return fmt::format("{:02d}:{:02d}:{:02d}", t / 3600, (t / 60) % 60, t % 60);
}

template <class R>
int run_with(const Scene& scene, const RunOptions& o) {
  Log log;
  RunFolder folder(o.out, scene, o.resume);
  log.open(folder.path("log.txt"), o.resume);
  log.quiet(o.quiet);
  log.info(fmt::format("terayee {}: {}{}", TERAYEE_VERSION, scene.title.empty() ? scene.file : scene.title,
                       scene.reference ? " (reference run: sample bodies removed)" : ""));
  for (const auto& w : scene.warnings) log.warn(w);

  Simulation<R> sim(scene, o.threads);
  const YeeGrid& g = sim.grid();
  for (const auto& w : sim.warnings()) log.warn(w);
  for (const auto& n : sim.notes()) log.info(n);
  log.info(fmt::format("grid {} x {} cells ({} x {} absorbing), cell {:.4g} x {:.4g} um, time step {:.5g} fs, {} steps, "
                       "{} threads, {} precision, {:.1f} MB",
                       g.nx, g.ny, g.npml_x, g.npml_y, g.dx * 1e6, g.dy * 1e6, g.dt * 1e15, sim.total_steps(),
                       sim.threads(), sizeof(R) == 4 ? "single" : "double", sim.memory_bytes() / 1e6));
  folder.begin(g, sim.snapshot_plan(), sizeof(R) == 4, sim.medium_map(), sim.map_nx(), sim.map_ny());
  sim.set_snapshot_sink(&folder);
  const std::string resolved = resolved_scene_yaml(scene);
  const std::string checkpoint = folder.path("checkpoint.h5");
  if (o.resume) {
    load_checkpoint(checkpoint, sim, resolved);
    log.info(fmt::format("resumed at step {} of {}", sim.steps_done(), sim.total_steps()));
  }
  auto stop_here = [&](long done, const char* why) {
    folder.flush();
    save_checkpoint(checkpoint, sim, resolved);
    folder.keep();
    log.info(fmt::format("{} at step {} of {}; the state is in {}. Go on with: terayee run {} -o {} --resume{}", why,
                         done, sim.total_steps(), checkpoint, scene.file, o.out,
                         o.sets.empty() ? "" : " (and the same --set values)"));
    return 1;
  };

  g_stop = 0;
  auto old_int = std::signal(SIGINT, on_signal);
  auto old_term = std::signal(SIGTERM, on_signal);
  const bool tty = isatty(STDERR_FILENO) && !o.quiet;
  const auto t0 = std::chrono::steady_clock::now();
  auto last_checkpoint = t0;
  const long N = sim.total_steps();
  const long first = sim.steps_done();
  const long every = std::max(1L, N / 100);
  int last_plain = -1;
  double rate = 0;
  for (long n = first; n < N; ++n) {
    sim.advance();
    if (g_stop || (o.stop_at_step > 0 && n + 1 == o.stop_at_step && n + 1 < N)) {
      std::signal(SIGINT, old_int);
      std::signal(SIGTERM, old_term);
      return stop_here(n + 1, g_stop ? "stopped" : "stopped as asked");
    }
    if (o.checkpoint_minutes > 0 &&
        std::chrono::duration<double>(std::chrono::steady_clock::now() - last_checkpoint).count() >
            60 * o.checkpoint_minutes) {
      folder.flush();
      save_checkpoint(checkpoint, sim, resolved);
      last_checkpoint = std::chrono::steady_clock::now();
      log.info(fmt::format("checkpoint at step {}", n + 1));
    }
    if ((n + 1) % every != 0 && n + 1 != N) continue;
    int i, j;
    Component c;
    if (sim.find_nonfinite(i, j, c)) {
      folder.abandon();
      const double x = g.x(c, i) - scene.origin_shift.x, y = g.y(c, j) - scene.origin_shift.y;
      log.info(fmt::format("error: the field {} became non-finite by step {} (t = {:.4g} ps) at node ({}, {}), "
                           "x = {:.4g} mm, y = {:.4g} mm. Check the medium there; rerun with a smaller "
                           "time.step-fraction (e.g. --set time.step-fraction=0.5) to see whether it is a stability problem.",
                           component_name(c), n + 1, (n + 1) * g.dt * 1e12, i, j, x * 1e3, y * 1e3));
      return 1;
    }
    const double el = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    const long done_here = n + 1 - first;
    rate = el > 0 ? static_cast<double>(g.cells()) * done_here / el : 0;
    const int pct = static_cast<int>(100.0 * (n + 1) / N);
    const std::string line =
        fmt::format("{:3d}%  t = {:.4g} ps  elapsed {}  eta {}  {:.3g} cell-updates/s", pct, (n + 1) * g.dt * 1e12,
                    hms(el), hms(el * (N - n - 1) / done_here), rate);
    if (tty) {
      std::cerr << "\r" << line << std::flush;
    } else if (!o.quiet && pct / 5 != last_plain) {
      last_plain = pct / 5;
      std::cerr << line << "\n";
    }
  }
  if (tty) std::cerr << "\n";
  std::signal(SIGINT, old_int);
  std::signal(SIGTERM, old_term);
  const double wall = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  nlohmann::json s;
  s["terayee-version"] = TERAYEE_VERSION;
  s["title"] = scene.title;
  s["reference-run"] = scene.reference;
  s["scene"] = scene.file;
  s["completed"] = true;
  s["steps"] = N;
  s["time-step-s"] = g.dt;
  s["simulated-time-s"] = N * g.dt;
  s["cells"] = {{"x", g.nx}, {"y", g.ny}, {"absorbing-x", g.npml_x}, {"absorbing-y", g.npml_y}, {"total", g.cells()}};
  s["cell-size-m"] = {g.dx, g.dy};
  s["threads"] = sim.threads();
  s["precision"] = sizeof(R) == 4 ? "single" : "double";
  s["wall-time-s"] = wall;
  s["cell-updates-per-s"] = wall > 0 ? static_cast<double>(g.cells()) * (N - first) / wall : 0.0;
  s["resumed-at-step"] = first;
  s["memory-bytes"] = sim.memory_bytes();
  std::vector<std::string> warnings = scene.warnings;
  warnings.insert(warnings.end(), sim.warnings().begin(), sim.warnings().end());
  s["warnings"] = warnings;
  s["notes"] = sim.notes();
  s["energy"] = {{"field-energy-at-end-J-per-m", sim.field_energy()}};
  if (!sim.magnets().empty()) {
    const double cell_steps = static_cast<double>(sim.magnets().count()) * static_cast<double>(N - first);
    const double tilted = cell_steps > 0 ? sim.midpoint_cell_steps() / cell_steps : 0.0;
    const double tilt_in = sim.magnets().largest_tilt(true, g.nx, g.ny, g.npml_x, g.npml_y);
    const double tilt_out = sim.magnets().largest_tilt(false, g.nx, g.ny, g.npml_x, g.npml_y);
    s["magnetic-cells"] = {{"count", sim.magnets().count()}, {"midpoint-fraction", tilted},
                           {"largest-tilt-rad", tilt_out}, {"largest-tilt-in-absorber-rad", tilt_in}};
    if (tilt_in > 1e-4 && tilt_in > 3 * tilt_out) {  // the studies at their defaults: below 1.2e-5 and below the rest
      const std::string w = fmt::format(
          "the magnetic cells inside the absorbing layers tilted to {:.3g} rad, {:.0f} times more than anywhere "
          "else: the absorber is amplifying a backward wave (docs/magnets.md); give it a lower "
          "conductivity, e.g. twice the cells at half the strength (grid.absorber), and check the results",
          tilt_in, tilt_in / std::max(tilt_out, 1e-300));
      log.warn(w);
      warnings.push_back(w);
      s["warnings"] = warnings;
    }
    if (tilted > 0.01)
      log.info(fmt::format("{:.1f}% of the magnetic cell-steps were tilted past {:g} rad and took the midpoint rule, "
                           "several times slower than the small-signal step; a linear study can use a smaller "
                           "amplitude (the response scales with it)",
                           100 * tilted, CellStep::kTilt));
  }
  folder.finish(sim.probes(), sim.power_spectra(), sim.spectral_maps(), g.dt, s);
  log.info(fmt::format("done: {} steps in {} ({:.3g} cell-updates/s); results in {}", N, hms(wall),
                       s["cell-updates-per-s"].get<double>(), o.out));
  return 0;
}

}  // namespace

int run_command(const RunOptions& o) {
  Scene read = read_scene(o.scene, o.sets);
  const std::vector<std::string> found = validate_scene(read, machine_memory_bytes());  // before anything is sized
  read.warnings.insert(read.warnings.end(), found.begin(), found.end());
  const Scene scene = o.reference ? reference_scene(read) : read;
  if (scene.time.precision == Precision::single) return run_with<float>(scene, o);
  return run_with<double>(scene, o);
}

}  // namespace ty
