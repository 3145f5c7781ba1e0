/// \file run_command.cpp
/// \brief `terayee run SCENE -o RUN`: reads and checks the scene, steps the simulation with a progress
/// line, and writes the run folder. A stop (Ctrl-C, SIGTERM, SIGHUP, --stop-at-step) writes a checkpoint
/// first; nothing is left that looks like a result. Exit status: 0 done or stopped as asked, 128 + signal
/// when stopped by a signal, 1 a field that became non-finite, a run the growth guard stopped
/// (solver/guard/growth_guard.h) or a write error, 2 bad input.
#include <fmt/format.h>
#include <unistd.h>

#include <chrono>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <iostream>
#include <memory>
#include <nlohmann/json.hpp>
#include <stdexcept>

#include "io/run/checkpoint.h"
#include "io/run/kill_point.h"
#include "io/run/log.h"
#include "io/run/folder_scene.h"
#include "io/run/run_folder.h"
#include "io/run/stop_signals.h"
#include "io/scene/diagnostics.h"
#include "io/scene/medium_lookup.h"
#include "io/scene/scene_reader.h"
#include "io/scene/scene_writer.h"
#include "io/scene/validation.h"
#include "solver/guard/growth_guard.h"
#include "solver/parallel/ranks.h"
#include "solver/parallel/slabs.h"
#include "solver/simulation.h"
#include "tools/commands.h"

namespace ty {
namespace {

std::string hms(double s) {
  const long t = std::lround(std::max(0.0, s));
  return fmt::format("{:02d}:{:02d}:{:02d}", t / 3600, (t / 60) % 60, t % 60);
}

std::string resume_line(const Scene& scene, const RunOptions& o) {
  return fmt::format("terayee run {} -o {} --resume{}", scene.file, o.out,
                     o.sets.empty() ? "" : " (and the same --set values)");
}

/// The run's bookkeeping around the simulation: checkpoints, stops and failures.
template <class R>
struct Runner {
  const Scene& scene;
  const RunOptions& o;
  Log& log;
  RunFolder* folder;  ///< over ranks, rank 0's writes the run folder, the others' only their frame rows
  Simulation<R>& sim;
  GrowthGuard<R>& guard;
  std::string resolved, checkpoint;
  long saved_at = -1;  ///< step of the last checkpoint written or loaded (-1: none)

  /// A field that became non-finite: the step, the node, its medium, and what to do.
  int nonfinite(long step, int i, int j, Component c) {
    const YeeGrid& g = sim.grid();
    const double x = g.x(c, i) - scene.origin_shift.x, y = g.y(c, j) - scene.origin_shift.y;
    const int mi = i - g.npml_x, mj = j - g.npml_y;
    std::string medium = "the absorbing layer";
    if (mi >= 0 && mj >= 0 && mi < sim.map_nx() && mj < sim.map_ny()) {  // the medium map's cell, as fields.h5's
      const int m = medium_at(scene, {(mi + 0.5) * g.dx, (mj + 0.5) * g.dy});
      medium = m < 0 ? "vacuum" : "medium '" + scene.media.at(m).name + "'";
    }
    if (folder) folder->abandon();
    log.error(fmt::format(
        "the field {} became non-finite by step {} (t = {:.4g} ps) at node ({}, {}), x = {:.4g} mm, "
        "y = {:.4g} mm, in {}. {} To see whether it is a stability problem, run again with a smaller time step, "
        "e.g. --set time.step-fraction=0.5 --overwrite (a checkpoint belongs to its own time step).",
        component_name(c), step, step * g.dt * 1e12, i, j, x * 1e3, y * 1e3, medium,
        saved_at >= 0 ? fmt::format("The last good checkpoint (step {}) is kept in {}.", saved_at, checkpoint)
                      : std::string("No checkpoint had been written.")));
    return 1;
  }

  /// A run the guard stopped: its message, and what is kept.
  int growing(const std::string& e) {
    if (folder) folder->abandon();
    log.error(fmt::format("{}. Nothing is written as a result. {}", e,
                          saved_at >= 0 ? fmt::format("The last checkpoint (step {}) is kept in {}.", saved_at, checkpoint)
                                        : std::string("No checkpoint had been written.")));
    return 1;
  }

  /// Writes a checkpoint unless the state holds a NaN (then that is reported: returns 1).
  int save(long step) {
    // over ranks each rank writes the parts its rows update (solver/parallel/state_owners.cpp)
    int i, j;
    Component c;
    if (sim.find_nonfinite(i, j, c)) return nonfinite(step, i, j, c);
    StopSignals::Hold hold;
    if (folder) folder->flush();
    save_checkpoint(checkpoint, sim, resolved);
    saved_at = step;
    return 0;
  }

  int stop(long step, int sig) {  // over ranks every rank comes here at the same step
    if (const int rc = save(step)) return rc;
    if (folder) folder->keep();
    log.info(fmt::format("{} at step {} of {}; the state is in {}. Go on with: {}",
                         sig ? fmt::format("stopped by signal {}", sig) : std::string("stopped as asked"), step,
                         sim.total_steps(), checkpoint, resume_line(scene, o)));
    return sig ? 128 + sig : 0;
  }

  /// Steps from n to the next step the loop looks at (progress line, checkpoint, --stop-at-step,
  /// stop rule, end): a block of steps (solver/blocking/) ends there.
  long steps_to_event(long n, long N, long every) const {
    auto to_multiple = [n](long m) { return m - n % m; };
    long k = std::min(N - n, to_multiple(every));
    if (o.checkpoint_steps > 0) k = std::min(k, to_multiple(o.checkpoint_steps));
    if (o.stop_at_step > n) k = std::min(k, o.stop_at_step - n);
    if (sim.stop_rule().on()) k = std::min(k, to_multiple(std::max(1L, sim.stop_rule().plan().check)));
    return std::max(1L, k);
  }

  /// Steps to the end; returns -1 when done, else the exit status.
  int loop() {
    const YeeGrid& g = sim.grid();
    const bool tty = isatty(STDERR_FILENO) && !o.quiet;
    const auto t0 = std::chrono::steady_clock::now();
    auto last_checkpoint = t0;
    const long N = sim.total_steps(), first = sim.steps_done(), every = std::max(1L, N / 100);
    int last_plain = -1;
    for (long n = first; n < N; ++n) {
      // over ranks all stop at one step: the largest signal seen, asked every 16 steps (the flag stays set)
      int sig = StopSignals::received();
      if (sim.ranks() > 1) sig = n % 16 == 0 ? static_cast<int>(parallel::max_over_ranks(sig)) : 0;
      if (sig) return stop(n, sig);
      const long took = sim.advance_up_to(steps_to_event(n, N, every));  // one step, or a block ending at the next event
      for (long m = n + 1; m <= n + took; ++m) kill_point(KillPoint::step, m);
      n += took - 1;  // the loop's body below sees n + 1 = the steps done
      // Bloch pair with magnets (one step a block): past the small-signal step it cannot superpose
      if (const std::string e = sim.bloch_superposition_broken(); !e.empty()) return growing(e);
      if (sim.settled()) break;  // `stop: auto`: done before the limit
      if (o.stop_at_step > 0 && n + 1 == o.stop_at_step && n + 1 < N) return stop(n + 1, 0);
      const double since = std::chrono::duration<double>(std::chrono::steady_clock::now() - last_checkpoint).count();
      bool by_time = o.checkpoint_minutes > 0 && since > 60 * o.checkpoint_minutes;
      if (sim.ranks() > 1)  // the first rank whose clock says so decides for all, asked every 16 steps
        by_time = o.checkpoint_minutes > 0 && (n + 1) % 16 == 0 && parallel::max_over_ranks(by_time ? 1 : 0) > 0;
      if ((by_time || (o.checkpoint_steps > 0 && (n + 1) % o.checkpoint_steps == 0)) && n + 1 < N) {
        if (const int rc = save(n + 1)) return rc;
        last_checkpoint = std::chrono::steady_clock::now();
        log.info(fmt::format("checkpoint at step {}", n + 1));
      }
      if ((n + 1) % every != 0 && n + 1 != N) continue;
      int i, j;
      Component c;
      sim.gather_sums();  // over ranks: each row's energy and work on every rank, so all decide alike
      if (sim.find_nonfinite(i, j, c)) return nonfinite(n + 1, i, j, c);
      if (const std::string e = guard.check(sim); !e.empty()) return growing(e);
      const double el = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
      const long done_here = n + 1 - first;
      const double rate = el > 0 ? static_cast<double>(g.cells()) * done_here / el : 0;
      const int pct = static_cast<int>(100.0 * (n + 1) / N);
      const std::string line = fmt::format("{:3d}%  t = {:.4g} ps  elapsed {}  eta {}  {:.3g} cell-updates/s", pct,
                                           (n + 1) * g.dt * 1e12, hms(el), hms(el * (N - n - 1) / done_here), rate);
      if (tty) {
        std::cerr << "\r" << line << std::flush;
      } else if (!o.quiet && pct / 5 != last_plain) {
        last_plain = pct / 5;
        std::cerr << line << "\n";
      }
    }
    if (tty) std::cerr << "\n";
    return -1;
  }

  /// A write error (a full disk): what happened, and that the last checkpoint is intact.
  [[noreturn]] void write_failed(const std::exception& e) {
    if (folder) folder->abandon();
    throw std::runtime_error(fmt::format(
        "{} (is the disk full?). {}", e.what(),
        saved_at >= 0 ? fmt::format("The checkpoint of step {} is intact: make room and go on with {}", saved_at,
                                    resume_line(scene, o))
                      : std::string("No checkpoint had been written; make room and run again with --overwrite.")));
  }
};

/// Why the run ended where it did (`stop: auto`: settled, or the limit reached first).
template <class R>
nlohmann::json stop_summary(const Scene& scene, const Simulation<R>& sim, Log& log, std::vector<std::string>& warnings) {
  const double t = sim.time();
  const StopRule& r = sim.stop_rule();
  if (!r.on()) return {{"rule", "fixed"}, {"reason", "time.stop reached"}, {"at-step", sim.steps_done()}, {"at-time-s", t}};
  nlohmann::json j = {{"rule", "auto"},
                      {"kind", r.plan().cw ? "cw: spectra of successive blocks agree" : "pulsed: energy gone, spectra converged"},
                      {"reason", r.done() ? "settled" : "limit reached before settling"},
                      {"at-step", sim.steps_done()},
                      {"at-time-s", t},
                      {"limit-s", scene.time.stop},
                      {"check-every-steps", r.plan().check},
                      {"checks", r.checks()},
                      {"largest-change", std::isfinite(r.largest_change()) ? r.largest_change() : -1.0},
                      {"tolerance", scene.time.auto_stop.tolerance}};
  if (!r.plan().cw) j["energy-left-fraction"] = r.energy_fraction(), j["energy-left-goal"] = scene.time.auto_stop.energy_left;
  const std::string figures = fmt::format(
      "largest change of the spectra between checks {:.3g} (tolerance {:g}){}", r.largest_change(),
      scene.time.auto_stop.tolerance,
      r.plan().cw ? std::string()
                  : fmt::format(", energy left {:.3g} of its peak (goal {:g})", r.energy_fraction(),
                                scene.time.auto_stop.energy_left));
  if (r.done()) {
    log.info(fmt::format("settled at t = {:.4g} ps (step {}): {}", t * 1e12, sim.steps_done(), figures));
  } else {
    const std::string w = fmt::format("the run reached its limit ({:.4g} ps) before settling: {}; a longer "
                                      "'time.limit' (or a larger tolerance) would let it settle",
                                      t * 1e12, figures);
    log.warn(w);
    warnings.push_back(w);
  }
  return j;
}

/// The largest tilt inside (absorber) or outside the absorbing layers: each rank's cells, then over the ranks.
template <class R>
double largest_tilt(const Simulation<R>& sim, bool absorber) {
  const MagneticCells& M = sim.magnets();
  const YeeGrid& g = sim.grid();
  double t = M.largest_tilt(absorber, g.nx, g.ny, g.npml_x, g.npml_y, M.first_cell(sim.row_lo()),
                            M.first_cell(sim.row_hi()));
  if (sim.ranks() > 1)
    for (const parallel::Pick& p : parallel::picks_over_ranks({t, 0})) t = std::max(t, p.value);
  return t;
}

template <class R>
nlohmann::json make_summary(const Scene& scene, Simulation<R>& sim, Log& log, long first, double wall) {
  const YeeGrid& g = sim.grid();
  const long N = sim.steps_done();
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
  s["ranks"] = sim.ranks();
  s["precision"] = sizeof(R) == 4 ? "single" : "double";
  s["wall-time-s"] = wall;
  s["cell-updates-per-s"] = wall > 0 ? static_cast<double>(g.cells()) * (N - first) / wall : 0.0;
  s["resumed-at-step"] = first;
  s["memory-bytes"] = sim.memory_bytes();
  std::vector<std::string> warnings = scene.warnings;
  warnings.insert(warnings.end(), sim.warnings().begin(), sim.warnings().end());
  s["warnings"] = warnings;
  s["notes"] = sim.notes();
  // held: what the guard and `stop: auto` watch (fields, magnets, poles; over ranks from the rows' sums)
  s["energy"] = {{"field-energy-at-end-J-per-m", sim.field_energy()}, {"held-at-end-J-per-m", sim.held_energy()}};
  s["stop"] = stop_summary(scene, sim, log, warnings);
  s["warnings"] = warnings;
  if (!sim.magnets().empty()) {
    const double cell_steps = static_cast<double>(sim.magnets().count()) * static_cast<double>(N - first);
    const double tilted = cell_steps > 0 ? sim.midpoint_cell_steps() / cell_steps : 0.0;
    const double tilt_in = largest_tilt(sim, true), tilt_out = largest_tilt(sim, false);
    s["magnetic-cells"] = {{"count", sim.magnets().count()},
                           {"large-tilt-fraction", tilted},
                           {"largest-tilt-rad", tilt_out},
                           {"largest-tilt-in-absorber-rad", tilt_in}};
    if (tilted > 0.01)
      log.info(
          fmt::format("{:.1f}% of the magnetic cell-steps were tilted past {:g} rad and took the large-tilt path "
                      "(the exponential midpoint, past 7 degrees the midpoint rule), several times slower than the "
                      "small-signal step; a linear study can use a smaller amplitude (the response scales with it)",
                      100 * tilted, CellStep::kTilt));
  }
  return s;
}

/// What a run over several MPI ranks does not do yet (docs/parallel.md): refused with exit
/// status 2 before anything is written, rather than done wrong. The same on every rank.
void refuse_over_ranks(const Scene& scene) {
  const int P = parallel::size();
  std::vector<std::string> why;
  const YeeGrid g = grid_for(scene, 8);
  if (g.ny < P * parallel::kMinRowsPerRank)
    why.push_back(fmt::format("the grid has {} rows: {} ranks need at least {} ({} each)", g.ny, P,
                              P * parallel::kMinRowsPerRank, parallel::kMinRowsPerRank));
  if (why.empty()) return;
  std::string m = fmt::format("terayee run: error: not done over {} MPI ranks (run it as one process):", P);
  for (const auto& w : why) m += "\n  " + w;
  throw BadInput(m);
}

template <class R>
int run_with(const Scene& scene, const RunOptions& o) {
  Log log;
  // over ranks rank 0 alone makes the run folder; a refusal there ends every rank
  const bool root = parallel::rank() == 0;
  std::unique_ptr<RunFolder> made;
  std::string refused;
  if (root) {
    try {
      made = std::make_unique<RunFolder>(o.out, scene, o.resume, o.overwrite);
    } catch (const BadInput& e) {
      refused = e.what();
    }
  }
  if (parallel::max_over_ranks(refused.empty() ? 0 : 1) > 0) {
    if (root) throw BadInput(refused);
    return 2;
  }
  if (!root) made = std::make_unique<RunFolder>(o.out, scene, RunFolder::Follower{});  // its frame rows
  RunFolder* folder = made.get();
  if (root) log.open(folder->path("log.txt"), o.resume);
  log.quiet(o.quiet);
  if (!root) log.silent();
  log.info(fmt::format("terayee {}: {}{}", TERAYEE_VERSION, scene.title.empty() ? scene.file : scene.title,
                       scene.reference ? " (reference run: sample bodies removed)" : ""));
  for (const auto& w : scene.warnings) log.warn(w);

  Simulation<R> sim(scene, o.threads);
  sim.set_block_depth(o.block_depth);
  const YeeGrid& g = sim.grid();
  for (const auto& w : sim.warnings()) log.warn(w);
  for (const auto& n : sim.notes()) log.info(n);
  log.info("time blocking: " + sim.block_note());  // the depth `run --block-depth` took, and why
  log.info(
      fmt::format("grid {} x {} cells ({} x {} absorbing), cell {:.4g} x {:.4g} um, time step {:.5g} fs, {} steps, "
                  "{} thread{}{}, {} precision, {:.1f} MB",
                  g.nx, g.ny, g.npml_x, g.npml_y, g.dx * 1e6, g.dy * 1e6, g.dt * 1e15, sim.total_steps(), sim.threads(),
                  sim.threads() == 1 ? "" : "s",
                  sim.ranks() > 1 ? fmt::format(" per rank on {} MPI ranks (rank 0: rows {}..{})", sim.ranks(),
                                                sim.row_lo(), sim.row_hi() - 1)
                                  : std::string(),
                  sizeof(R) == 4 ? "single" : "double", sim.memory_bytes() / 1e6));
  GrowthGuard<R> guard(sim);  // stops a growing run (solver/guard/growth_guard.h)
  if (!sim.magnets().empty())
    log.info(guard.tilt_limit() > 0
                 ? fmt::format("guard: the sources' linear response tilts the magnets by about {:.2g} rad; a tilt past "
                               "{:.2g} rad, or more energy than the sources put in, stops the run",
                               guard.linear_tilt(), guard.tilt_limit())
                 : std::string("guard: the sources ask for large tilts; more energy than they put in stops the run"));
  Runner<R> run{scene, o, log, folder, sim, guard, resolved_scene_yaml(scene), o.out + "/checkpoint.h5"};
  if (parallel::max_over_ranks(folder && folder->resuming() ? 1 : 0) > 0) {  // every rank reads it
    load_checkpoint(run.checkpoint, sim, run.resolved);
    run.saved_at = sim.steps_done();
    log.info(fmt::format("resumed at step {} of {}", sim.steps_done(), sim.total_steps()));
  } else if (o.resume) {
    log.info("no checkpoint was written before the run stopped: starting again from step 0");
  }
  if (folder) folder->begin(g, sim.snapshot_plan(), sizeof(R) == 4, sim.medium_map(), sim.map_nx(), sim.map_ny());
  sim.set_snapshot_sink(folder);
  const long first = sim.steps_done();
  const auto t0 = std::chrono::steady_clock::now();
  try {
    if (const int rc = run.loop(); rc >= 0) return rc;
    const double wall = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    if (folder && sim.steps_done() < sim.total_steps()) folder->ended_at(sim.steps_done());
    sim.gather_sums(true);  // the summary's energies and counts: the rows' sums (no rank gathers the grid)
    const nlohmann::json s = make_summary(scene, sim, log, first, wall);
    if (folder) folder->finish(sim.probes(), sim.power_spectra(), sim.spectral_maps(), g.dt, s);
    log.info(fmt::format("done: {} steps in {} ({:.3g} cell-updates/s); results in {}", sim.steps_done(), hms(wall),
                         s["cell-updates-per-s"].get<double>(), o.out));
    if (sim.ranks() > 1)  // docs/parallel.md: what the recorders and checks move besides the halos
      log.info(fmt::format("rank 0 gathered {:.4g} MB from the other ranks (recorders' nodes and rows, whole-grid checks)",
                           parallel::gathered_bytes() / 1e6));
  } catch (const BadInput&) {
    throw;
  } catch (const std::exception& e) {
    run.write_failed(e);
  }
  return 0;
}

}  // namespace

int run_command(const RunOptions& o) {
  StopSignals signals;  // first, so an early Ctrl-C is not lost
  if (o.resume && o.overwrite)
    throw BadInput("terayee run: error: --resume goes on with a run, --overwrite replaces it: give one of them");
  Scene read = read_scene(o.scene, o.sets);
  const std::vector<std::string> found = validate_scene(read, machine_memory_bytes());  // before anything is sized
  read.warnings.insert(read.warnings.end(), found.begin(), found.end());
  // a test hook (tools/mpi-check.sh: the guard's verdict over ranks): TERAYEE_UNSTABLE=F takes a
  // time step F times the stability limit, which a scene cannot ask for (time.step-fraction < 1)
  if (const char* f = std::getenv("TERAYEE_UNSTABLE")) read.time.step_fraction = std::atof(f);
  const Scene scene = o.reference ? reference_scene(read) : read;
  if (o.resume && holds_completed(o.out, scene)) {  // every rank: they all return here
    std::cerr << fmt::format("terayee run: {} holds this completed run; there is nothing to resume\n", o.out);
    return 0;
  }
  if (parallel::size() > 1) refuse_over_ranks(scene);
  if (scene.time.precision == Precision::single) return run_with<float>(scene, o);
  return run_with<double>(scene, o);
}

}  // namespace ty
