/// \file test_time_axes.cpp
/// \brief Every recorded value sits at the time its axis says: probe series (E, H and the
/// magnetic fields) on the E times (k+1) dt, snapshot frames at the frame time plus their
/// field's offset (H, M and S at (k+1/2) dt), spectral maps with each component
/// transformed at its own time level.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <complex>

#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

TEST_CASE("time axes: a probe's magnetic series lies on the E times (k+1) dt") {
  // sampled at (k+1/2) dt like H; on the (k+1) dt axis the mean of neighbouring samples is
  // within the linear-interpolation bound max|x''| h^2/8 (h = dt; Burden & Faires,
  // Numerical Analysis, Thm. 3.3), while the raw samples are off by about w dt/2
  const double dt = 1e-14, w = 2 * constants::pi * 2e12;  // w dt = 0.126
  const long n = 400;
  ProbeRecorder p;
  p.magnetic = {"Mx"};
  p.magnetic_series.assign(1, std::vector<double>(n));
  for (long k = 0; k < n; ++k) p.magnetic_series[0][k] = std::sin(w * (k + 0.5) * dt);
  p.count = n;
  const auto s = p.series("Mx");
  double worst = 0;
  for (long k = 0; k + 1 < n; ++k) worst = std::max(worst, std::abs(s[k] - std::sin(w * (k + 1) * dt)));
  const double bound = w * w * dt * dt / 8;
  MESSAGE("largest error on the E times " << worst << ", bound " << bound << ", half-step offset " << w * dt / 2);
  CHECK(worst <= bound * 1.001);
  CHECK(worst < 0.1 * (w * dt / 2));
}

namespace {

struct LastFrames : SnapshotSink {  // keeps the latest frame of field 0
  std::vector<double> last;
  std::vector<double> times;
  void frame(std::size_t, double time, std::size_t field, const float* data) override { keep(time, field, data); }
  void frame(std::size_t, double time, std::size_t field, const double* data) override { keep(time, field, data); }
  template <class T>
  void keep(double time, std::size_t field, const T* data) {
    if (field != 0) return;
    last.assign(data, data + n);
    times.push_back(time);
  }
  std::size_t n = 0;
};

}  // namespace

TEST_CASE("time axes: snapshot Poynting frames and spectral maps of a plane wave in vacuum") {
  // A cw plane wave along +x in vacuum, 20 cells per wavelength: E and H in phase with
  // Hy = -Ez/eta0 (Jackson, Classical Electrodynamics, 3rd ed., eq. 7.11), so Sx = Ez^2/eta0
  // >= 0 at every node and time when E and H are taken at one time. E(k+1) times H(k+1/2)
  // instead goes negative by about (w dt/4)^2 of the peak near the zeros of E.
  const double d = 10e-6, f = 1.5e12;
  Scene s = test::box_scene(80, 2, d, Boundary::absorbing, Boundary::periodic, 0.95, 6e-12);
  Source src = test::plane_pulse(Component::Ez, 5 * d, f, 1e-12, 0, 1.0);
  src.waveform.kind = Waveform::Kind::cw;
  src.waveform.ramp = 1e-12;
  s.sources.push_back(src);
  Output snap;
  snap.kind = Output::Kind::snapshots;
  snap.name = "frames";
  snap.fields = {"Sx", "Ez", "Hy", "Mx"};
  snap.every = 0.25e-12;
  s.outputs.push_back(snap);
  Output map;
  map.kind = Output::Kind::spectral_map;
  map.name = "map";
  map.fields = {"Ez", "Hy"};
  map.frequencies = {f};
  s.outputs.push_back(map);
  Simulation<double> sim(s, 2);
  const SnapshotPlan& plan = sim.snapshot_plan();
  const double dt = sim.grid().dt;
  CHECK(plan.fields[0].time_offset == -0.5 * dt);  // S at the H time
  CHECK(plan.fields[1].time_offset == 0.0);        // E at the frame time
  CHECK(plan.fields[2].time_offset == -0.5 * dt);
  CHECK(plan.fields[3].time_offset == -0.5 * dt);  // M with H
  LastFrames sink;
  sink.n = static_cast<size_t>(plan.fields[0].ni) * plan.fields[0].nj;
  sim.set_snapshot_sink(&sink);
  double lowest = 0, highest = 0;
  const SnapshotField& sf = plan.fields[0];
  while (sim.steps_done() < sim.total_steps()) {
    const size_t frames = sink.times.size();
    sim.advance();
    if (sink.times.size() == frames || sim.time() < 4e-12) continue;  // the wave fills the box by 4 ps
    for (int b = 0; b < sf.nj; ++b)
      for (int a = 0; a < sf.ni; ++a) {
        if (sf.x[a] < 10 * d || sf.x[a] > 70 * d) continue;  // the total-field side, off the absorber
        const double v = sink.last[static_cast<size_t>(b) * sf.ni + a];
        lowest = std::min(lowest, v), highest = std::max(highest, v);
      }
  }
  MESSAGE("Sx over the frames: " << lowest << " .. " << highest << " W/m^2");
  CHECK(highest > 0.5 / constants::eta0);  // peak E^2/eta0 with E = 1 V/m
  CHECK(lowest > -1e-4 * highest);
  // spectral map: E and H transformed at their own times stay in phase, Ez = -eta0 Hy
  const SpectralMap& m = sim.spectral_maps()[0];
  double worst_phase = 0;
  for (int a = 0; a < m.ni; ++a) {
    if (m.x[a] < 10 * d || m.x[a] > 70 * d) continue;
    const std::complex<double> ratio = m.field(0, a, 2) / (-constants::eta0 * m.field(0, a, 4));
    worst_phase = std::max(worst_phase, std::abs(std::arg(ratio)));
  }
  MESSAGE("largest phase between Ez and -eta0 Hy: " << worst_phase << " rad (w dt / 2 = " << constants::pi * f * dt
                                                    << ")");
  CHECK(worst_phase < 0.01 * constants::pi * f * dt);
}
