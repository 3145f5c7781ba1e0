/// \file jones_measurement.cpp
/// \brief Jones matrices from the probes or power-spectrum lines of runs driven by each
/// polarization (see jones_measurement.h for the formulas).
#include "io/analysis/spectroscopy/jones_measurement.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "io/analysis/power_spectrum_line.h"
#include "io/analysis/spectroscopy/line_spectrum.h"
#include "io/analysis/spectroscopy/probe_trace.h"
#include "io/analysis/spectroscopy/tds_analysis.h"
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

PolarizedSpectra probe_spectra(const std::string& run, const std::string& reference, const std::string& probe,
                               std::vector<double>& freq, int count) {
  const ProbeTrace ez = read_probe_trace(run, probe, "Ez"), hz = read_probe_trace(run, probe, "Hz");
  const ProbeTrace ez_ref = read_probe_trace(reference, probe, "Ez"), hz_ref = read_probe_trace(reference, probe, "Hz");
  same_axis(ez, ez_ref);
  PolarizedSpectra p;
  p.input = constants::eta0 * peak(hz_ref.value) > peak(ez_ref.value) ? 1 : 0;
  if (freq.empty()) {
    const auto band = reference_band(p.input == 0 ? ez_ref : hz_ref);
    for (int m = 0; m < count; ++m) freq.push_back(band[0] + (band[1] - band[0]) * m / (count - 1));
  }
  p.ez = fourier(ez.time, ez.value, freq, {}), p.hz = fourier(hz.time, hz.value, freq, {});
  p.ez_ref = fourier(ez_ref.time, ez_ref.value, freq, {}), p.hz_ref = fourier(hz_ref.time, hz_ref.value, freq, {});
  return p;
}

PolarizedSpectra line_spectra(const std::string& run, const std::string& reference, const std::string& line,
                              std::vector<double>& freq) {
  const PowerSpectrumLine s = read_power_spectrum_line(run, line), r = read_power_spectrum_line(reference, line);
  if (s.freq != r.freq || s.points != r.points)
    throw BadInput(
        fmt::format("{}: error: line '{}' has other frequencies or points than {}'s: the runs must share "
                    "the scene",
                    r.file, line, s.file));
  PolarizedSpectra p;
  p.input = dominant_polarization(r) == 5 ? 1 : 0;
  freq = s.freq;
  for (size_t f = 0; f < freq.size(); ++f) {
    p.ez.push_back(line_mean(s, nullptr, f, 2)), p.hz.push_back(line_mean(s, nullptr, f, 5));
    p.ez_ref.push_back(line_mean(r, nullptr, f, 2)), p.hz_ref.push_back(line_mean(r, nullptr, f, 5));
  }
  return p;
}

JonesSpectrum measure_jones(const std::vector<PolarizedSpectra>& inputs, const std::vector<double>& freq,
                            bool reflected, double face_distance) {
  using cd = std::complex<double>;
  JonesSpectrum out;
  out.freq = freq;
  out.J.assign(freq.size(), Jones{});
  const double eta0 = constants::eta0;
  for (const PolarizedSpectra& p : inputs) {
    const int in = p.input;
    for (size_t m = 0; m < freq.size(); ++m) {
      const cd A = in == 0 ? p.ez_ref[m] : eta0 * p.hz_ref[m];
      cd ez = p.ez[m], eu = eta0 * p.hz[m];
      if (reflected) ez -= p.ez_ref[m], eu = -(eu - eta0 * p.hz_ref[m]);
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
