/// \file tds_analysis.cpp
/// \brief Window, band, t(f) and n of a slab from two runs' probe traces (see tds_analysis.h).
#include "io/analysis/spectroscopy/tds_analysis.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "io/analysis/spectroscopy/slab_retrieval.h"
#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"

namespace ty {

using constants::c0;
using constants::pi;

namespace {

size_t peak_index(const std::vector<double>& v) {
  size_t k = 0;
  for (size_t i = 1; i < v.size(); ++i)
    if (std::abs(v[i]) > std::abs(v[k])) k = i;
  return k;
}

/// The reference pulse's length after its peak, down to 1e-3 of the peak.
double tail_after_peak(const ProbeTrace& p) {
  const size_t k = peak_index(p.value);
  const double floor = 1e-3 * std::abs(p.value[k]);
  size_t last = k;
  for (size_t i = k; i < p.value.size(); ++i)
    if (std::abs(p.value[i]) > floor) last = i;
  return p.time[last] - p.time[k];
}

TimeWindow main_pulse_window(const ProbeTrace& s, const ProbeTrace& r, double d, double& n_est) {
  const double ts = s.time[peak_index(s.value)], tr = r.time[peak_index(r.value)];
  n_est = std::max(1.0, 1.0 + c0 * (ts - tr) / d);
  const double half = n_est * d / c0;  // half the echo spacing 2 n d / c
  const double tail = tail_after_peak(r);
  if (tail > half)
    throw BadInput(fmt::format(
        "{}: error: --window main: the reference pulse lasts {:.4g} ps after its peak, longer than half the echo "
        "spacing ({:.4g} ps for n ~ {:.3g}, d = {:.4g} um): the first echo would fall in the window; use "
        "--window all (the echoes kept and modelled) or a shorter pulse",
        r.file, tail * 1e12, half * 1e12, n_est, d * 1e6));
  // Flat over the main pulse (its peak plus the reference's tail), zero from the first echo's
  // start (ts + 2 half - tail) on; the opening edge lies wholly before the trace.
  const double taper = half - tail;
  return TimeWindow{s.time.front() - taper - (s.time[1] - s.time[0]), ts + half, taper};
}

}  // namespace

std::vector<double> reference_band(const ProbeTrace& r) {
  const double dt = r.time[1] - r.time[0];
  std::vector<double> f;
  const int probe_count = 400;
  for (int m = 1; m <= probe_count; ++m) f.push_back(m * 0.25 / dt / probe_count);  // up to a quarter of 1/dt
  const auto R = fourier(r.time, r.value, f, {});
  size_t k = 0;
  for (size_t m = 1; m < R.size(); ++m)
    if (std::abs(R[m]) > std::abs(R[k])) k = m;
  size_t lo = k, hi = k;
  const double floor = 0.01 * std::abs(R[k]);
  while (lo > 0 && std::abs(R[lo - 1]) > floor) --lo;
  while (hi + 1 < R.size() && std::abs(R[hi + 1]) > floor) ++hi;
  return {f[lo], f[hi]};
}

TdsResult analyse_transmission(const ProbeTrace& s, const ProbeTrace& r, const TdsOptions& o) {
  if (s.time != r.time)
    throw BadInput(
        fmt::format("{}: error: probe '{}' has a different time axis from the run's ({}): the two runs "
                    "must share the scene's grid and time step",
                    r.file, r.name, s.file));
  if (!(o.thickness > 0)) throw BadInput("terayee measure material: error: --thickness must be positive");
  TdsResult out;
  out.echoes = o.window == "all";
  if (o.window == "main")
    out.window = main_pulse_window(s, r, o.thickness, out.n_estimate);
  else if (o.window != "all")
    throw BadInput(fmt::format("terayee measure material: error: --window '{}': main or all", o.window));
  double from = o.from, to = o.to;
  if (!(to > from)) {
    const auto band = reference_band(r);
    from = band[0], to = band[1];
  }
  const int count = std::max(2, o.count);
  for (int m = 0; m < count; ++m) out.freq.push_back(from + (to - from) * m / (count - 1));
  const auto S = fourier(s.time, s.value, out.freq, out.window), R = fourier(r.time, r.value, out.freq, out.window);
  for (size_t m = 0; m < S.size(); ++m) out.t.push_back(S[m] / R[m]);
  out.phase = unwrapped_phase(out.freq, out.t);
  const auto got = retrieve_index(out.freq, out.t, o.thickness, out.echoes, o.permittivity);
  out.n = got.n;
  out.iterations = got.iterations;
  if (o.permittivity)
    for (const auto& n : out.n) out.mu.push_back(n * n / *o.permittivity);
  return out;
}

std::vector<std::complex<double>> front_face_reflection(const ProbeTrace& s, const ProbeTrace& r,
                                                        const std::vector<double>& freq, const TimeWindow& w, double L,
                                                        bool flip) {
  std::vector<double> scattered(s.value.size());
  for (size_t k = 0; k < scattered.size(); ++k) scattered[k] = s.value[k] - r.value[k];
  const auto Sc = fourier(s.time, scattered, freq, w), R = fourier(r.time, r.value, freq, w);
  std::vector<std::complex<double>> out;
  for (size_t m = 0; m < freq.size(); ++m) {
    const double k0 = 2 * pi * freq[m] / c0;
    out.push_back((flip ? -1.0 : 1.0) * Sc[m] / R[m] * std::polar(1.0, -2 * k0 * L));
  }
  return out;
}

}  // namespace ty
