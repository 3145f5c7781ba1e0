/// \file tds_analysis.h
/// \brief The time-domain spectroscopist's analysis of a run against its reference run: the
/// time window, the band, the complex transmission t(f) = S(f)/R(f) at one probe behind the
/// slab, and the slab's n (and, with its permittivity or a reflected probe, mu and eps).
///
/// Windows: `all` keeps the whole trace, so the model keeps the echo term (FP); `main` keeps
/// the main transmitted pulse alone, ending half an echo spacing after its peak: the first
/// echo comes 2 n d / c after the main pulse, n estimated from the delay of the sample's
/// peak against the reference's, n ~ 1 + c (t_sample - t_reference) / d; the model then
/// leaves FP out. `main` is refused where the reference pulse (down to 1e-3 of its peak) is
/// longer than that half spacing: the echo would leak into the window.
/// The default band: where the reference spectrum is above 1% of its peak (101 frequencies).
#pragma once
#include <complex>
#include <optional>
#include <string>
#include <vector>

#include "io/analysis/spectroscopy/probe_trace.h"
#include "io/analysis/spectroscopy/trace_spectrum.h"

namespace ty {

struct TdsOptions {
  std::string window = "main";  ///< main or all
  double thickness = 0;         ///< m
  double from = 0, to = 0;      ///< Hz; 0: the default band
  int count = 101;
  std::optional<std::complex<double>> permittivity;  ///< given: mu is retrieved from t
};

struct TdsResult {
  TimeWindow window;
  bool echoes = true;
  double n_estimate = 0;            ///< from the peaks' delay
  std::vector<double> freq, phase;  ///< Hz; unwrapped phase of t, rad
  std::vector<std::complex<double>> t, n, mu;
  std::vector<int> iterations;
};

/// {from, to}: where the reference trace's spectrum is above 1% of its peak (up to a quarter of
/// the sampling rate).
std::vector<double> reference_band(const ProbeTrace& reference);

/// sample and reference: the same probe and field in the two runs (BadInput where their time
/// axes differ).
TdsResult analyse_transmission(const ProbeTrace& sample, const ProbeTrace& reference, const TdsOptions& o);

/// r of the slab referred to its front face, from a probe before it: the scattered field
/// (sample - reference) over the reference, moved by exp(-2 i k0 L), L the probe's distance to
/// the front face; `flip` for an H field (the transverse E of the reflected wave is -eta H).
std::vector<std::complex<double>> front_face_reflection(const ProbeTrace& sample, const ProbeTrace& reference,
                                                        const std::vector<double>& freq, const TimeWindow& w,
                                                        double distance, bool flip);

}  // namespace ty
