/// \file jones_measurement.cpp
/// \brief Jones matrices from the probe traces of runs driven by each polarization (see
/// jones_measurement.h for the formulas).
#include "io/analysis/spectroscopy/jones_measurement.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "io/analysis/spectroscopy/trace_spectrum.h"
#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"

namespace ty {

namespace {

/// The largest |value| of a trace.
double peak(const std::vector<double>& v) {
  const auto by_size = [](double a, double b) { return std::abs(a) < std::abs(b); };
  return v.empty() ? 0.0 : std::abs(*std::max_element(v.begin(), v.end(), by_size));
}

void same_axis(const ProbeTrace& a, const ProbeTrace& b) {
  if (a.time != b.time)
    throw BadInput(
        fmt::format("{}: error: probe '{}' has a different time axis from {}'s: the runs must share the "
                    "scene's grid and time step",
                    b.file, b.name, a.file));
}

}  // namespace

int driven_polarization(const ProbeTrace& ez_ref, const ProbeTrace& hz_ref) {
  return constants::eta0 * peak(hz_ref.value) > peak(ez_ref.value) ? 1 : 0;
}

PolarizedRuns read_polarized_runs(const std::string& run, const std::string& reference, const std::string& probe) {
  PolarizedRuns p;
  p.ez = read_probe_trace(run, probe, "Ez"), p.hz = read_probe_trace(run, probe, "Hz");
  p.ez_ref = read_probe_trace(reference, probe, "Ez"), p.hz_ref = read_probe_trace(reference, probe, "Hz");
  same_axis(p.ez, p.ez_ref);
  p.input = driven_polarization(p.ez_ref, p.hz_ref);
  return p;
}

JonesSpectrum measure_jones(const std::vector<PolarizedRuns>& runs, const std::vector<double>& freq, bool reflected,
                            double face_distance) {
  using cd = std::complex<double>;
  JonesSpectrum out;
  out.freq = freq;
  out.J.assign(freq.size(), Jones{});
  const double eta0 = constants::eta0;
  for (const PolarizedRuns& p : runs) {
    const int in = p.input;
    const auto Sz = fourier(p.ez.time, p.ez.value, freq, {}), Sh = fourier(p.hz.time, p.hz.value, freq, {});
    const auto Rz = fourier(p.ez_ref.time, p.ez_ref.value, freq, {}),
               Rh = fourier(p.hz_ref.time, p.hz_ref.value, freq, {});
    for (size_t m = 0; m < freq.size(); ++m) {
      const cd A = in == 0 ? Rz[m] : eta0 * Rh[m];
      cd ez = Sz[m], eu = eta0 * Sh[m];
      if (reflected) ez -= Rz[m], eu = -(eu - eta0 * Rh[m]);
      cd move = 1.0;
      if (reflected && face_distance >= 0)
        move = std::polar(1.0, -2 * 2 * constants::pi * freq[m] / constants::c0 * face_distance);
      out.J[m][0][in] = ez / A * move;
      out.J[m][1][in] = eu / A * move;
    }
    out.columns[in] = true;
  }
  return out;
}

}  // namespace ty
