/// \file run_estimate.cpp
/// \brief run_estimate.h: the scene's own simulation built and its parts timed (the fastest
/// of short repeats), times the run's counts of each.
#include "tools/run_estimate.h"

#include <fmt/format.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstring>
#include <ctime>

#include "io/scene/medium_lookup.h"
#include "solver/guard/growth_guard.h"
#include "solver/simulation.h"
#include "solver/threads/thread_count.h"
#include "tools/commands.h"

namespace ty {
namespace {

using Clock = std::chrono::steady_clock;
double since(Clock::time_point t0) { return std::chrono::duration<double>(Clock::now() - t0).count(); }

/// CPU seconds of this process (every thread).
double cpu_now() {
  timespec t{};
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t);
  return static_cast<double>(t.tv_sec) + 1e-9 * static_cast<double>(t.tv_nsec);
}

/// Seconds of one group of `calls` calls on an idle machine: the wall time, or the CPU time
/// per thread where that is shorter (on a busy machine the threads wait for cores, which
/// costs wall time but no CPU time; on an idle one the two agree, the threads spinning at
/// their barriers (solver/threads/wait_policy.h)).
template <class F>
double group(F& once, long calls, int threads) {
  const auto t0 = Clock::now();
  const double c0 = cpu_now();
  for (long c = 0; c < calls; ++c) once();
  return std::min(since(t0), (cpu_now() - c0) / threads);
}

/// Seconds per call of `once` on `threads` threads: calls are grouped into repeats of at
/// least `least` seconds and the fastest repeat counts; at most `budget` seconds are spent
/// after the first.
template <class F>
double fastest(F&& once, int threads, double least = 0.02, int repeats = 7, double budget = 0.5) {
  long calls = 1;
  double best = 0;
  for (;;) {  // the group size: doubled until a group lasts `least`
    const double t = group(once, calls, threads);
    if (t >= least || calls >= (1L << 20)) {
      best = t / calls;
      break;
    }
    calls *= 2;
  }
  const auto start = Clock::now();
  for (int r = 1; r < repeats && since(start) < budget; ++r) best = std::min(best, group(once, calls, threads) / calls);
  return best;
}

/// Sampled steps k in [lo, hi) of a run of `total` steps: (total - 1 - k) % every == 0.
double sampled(long lo, long hi, long total, int every) {
  lo = std::max(lo, 0L), hi = std::min(hi, total);
  if (hi <= lo) return 0;
  const long first = (total - hi + every - 1) / every, last = (total - 1 - lo) / every;
  return last >= first ? static_cast<double>(last - first + 1) : 0.0;
}

/// The running DFT's work over a run in units of one sampled step with every frequency
/// inside its window: sum over frequencies of the sampled steps in its windows (sampling.h,
/// DftWindows), divided by the number of frequencies.
double dft_calls(const DftWindows& w, long total, long start) {
  if (w.length.empty()) return 0;
  double n = 0;
  for (const long L : w.length) {
    if (L == 0) {
      n += sampled(start, total, total, w.every);
    } else if (w.block > 0) {
      for (long end = w.block; end < total + w.block; end += w.block)
        n += sampled(std::max(start, end - L), end, total, w.every);
    } else {
      n += sampled(std::max(start, total - L), total, total, w.every);
    }
  }
  return n / static_cast<double>(w.length.size());
}

/// A snapshot sink that copies each frame, in place of the run folder's HDF5 write.
template <class R>
struct CopySink : SnapshotSink {
  std::vector<R> copy;
  void frame(std::size_t, double, std::size_t, const float* d) override { keep(d); }
  void frame(std::size_t, double, std::size_t, const double* d) override { keep(d); }
  template <class T>
  void keep(const T* d) {
    if (!copy.empty()) copy[0] = static_cast<R>(d[0]);
  }
};

template <class R>
RunTimeEstimate timed(const Scene& s, int threads) {
  RunTimeEstimate e;
  const auto t0 = Clock::now();
  const double c0 = cpu_now();
  Simulation<R> sim(s, threads);  // built by one thread: its CPU time is its time alone
  e.parts.push_back({"building the simulation", std::min(since(t0), cpu_now() - c0), "once"});
  sim.set_block_depth(0);  // what `run` takes by default
  e.blocking = sim.block_note();
  const YeeGrid& g = sim.grid();
  const long N = sim.total_steps();
  e.threads = sim.threads(), e.steps = N;
  const double step = fastest([&] { sim.step(); }, e.threads);
  e.parts.push_back({"time steps", step * N, fmt::format("{} steps of {:.3g} ms", N, step * 1e3)});
  const R* const F[6] = {sim.field(Component::Ex), sim.field(Component::Ey), sim.field(Component::Ez),
                         sim.field(Component::Hx), sim.field(Component::Hy), sim.field(Component::Hz)};
  auto value = [&](const std::string& f, long cell) { return sim.magnetic_value(f, cell); };
  for (auto& p : sim.probes()) {
    const double t = fastest([&] { p.record(0, F, value); }, 1);
    e.parts.push_back({fmt::format("probe '{}'", p.name), t * N, fmt::format("{} steps", N)});
  }
  // The throw-away simulation's own DFT recorders are timed in place (they are not const
  // objects; the simulation hands them out read-only for the run folder).
  for (const auto& c : sim.power_spectra()) {
    auto& r = const_cast<PowerSpectrumRecorder&>(c);
    const double t = fastest([&] { r.record(N - 1, N, F, e.threads); }, e.threads);
    const double calls = dft_calls(r.win, N, 0);
    e.parts.push_back({fmt::format("power spectrum '{}'", r.name), t * calls,
                       fmt::format("{} frequencies x {} points, {:.0f} sampled steps", r.freq.size(), r.points.size(),
                                   calls)});
  }
  for (const auto& c : sim.spectral_maps()) {
    auto& m = const_cast<SpectralMap&>(c);
    const double t = fastest([&] { m.record(N - 1, N, F, g, e.threads); }, e.threads);
    const double calls = dft_calls(m.win, N, m.start);
    e.parts.push_back({fmt::format("spectral map '{}'", m.name), t * calls,
                       fmt::format("{} frequencies x {} points, {:.0f} sampled steps", m.freq.size(),
                                   static_cast<long>(m.ni) * m.nj, calls)});
  }
  for (const Output& o : s.outputs) {
    if (o.kind != Output::Kind::snapshots) continue;
    SnapshotRecorder<R> rec;
    rec.build(sim.scene(), o, g, N);
    if (rec.plan.steps.empty()) continue;
    CopySink<R> sink;
    sink.copy.resize(1);
    const auto cells = [&sim](int i, int j) { return sim.magnets().cell_at(i, j); };
    const double t = fastest([&] {
      rec.next_frame = 0;
      rec.record(rec.plan.steps[0], F, g, cells, value, &sink);
    }, 1);
    const double frames = static_cast<double>(rec.plan.steps.size());
    e.parts.push_back({"snapshots", t * frames, fmt::format("{:.0f} frames", frames)});
  }
  // the run's loop looks at the fields every 1% of the steps: non-finite values and the growth guard
  GrowthGuard<R> guard(sim);
  const double check = fastest([&] {
    int i, j;
    Component c;
    (void)sim.find_nonfinite(i, j, c);
    (void)guard.check(sim);
  }, 1);
  const double checks = static_cast<double>(std::min(N, 100L));
  e.parts.push_back({"field checks", check * checks, fmt::format("{:.0f} checks", checks)});
  return e;
}

/// For a scene too large to build here: the vacuum rate of this machine times the cells,
/// and each magnetic medium's rate times its cells (bench_command.cpp's measurements).
RunTimeEstimate modelled(const Scene& s, int threads) {
  RunTimeEstimate e;
  e.built = false;
  const YeeGrid g = grid_for(s, 8);
  e.steps = steps_for(s, g);
  e.threads = threads > 0 ? threads : s.time.threads > 0 ? s.time.threads : usable_cores();
  const bool single = s.time.precision == Precision::single;
  const double rate = measure_vacuum_rate(256, e.threads, single, 0.05, 5);
  e.parts.push_back({"time steps (cells)", double(g.nx) * g.ny * e.steps / rate,
                     fmt::format("{} steps of {} cells at {:.3g} cell-updates/s", e.steps, g.cells(), rate)});
  std::vector<double> magnetic(s.media.size(), 0);
  for (const auto& b : s.bodies) {
    if (!s.media[b.medium].magnet) continue;
    Vec2 lo, hi;
    b.shape.bounds(lo, hi);
    magnetic[b.medium] += std::ceil((hi.x - lo.x) / g.dx) * std::ceil((hi.y - lo.y) / g.dy);
  }
  for (size_t k = 0; k < s.media.size(); ++k) {
    if (magnetic[k] == 0) continue;
    const double r = measure_magnetic_rate(s, static_cast<int>(k), e.threads, 0.05);
    e.parts.push_back({fmt::format("magnetic cells of '{}'", s.media[k].name), magnetic[k] * e.steps / r,
                       fmt::format("about {:.0f} cells at {:.3g} cell-updates/s", magnetic[k], r)});
  }
  return e;
}

}  // namespace

double RunTimeEstimate::total() const {
  double t = 0;
  for (const auto& p : parts) t += p.seconds;
  return t;
}

RunTimeEstimate estimate_run_time(const Scene& s, int threads, double memory, double build_limit) {
  if (memory > build_limit) return modelled(s, threads);
  return s.time.precision == Precision::single ? timed<float>(s, threads) : timed<double>(s, threads);
}

}  // namespace ty
