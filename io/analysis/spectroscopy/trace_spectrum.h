/// \file trace_spectrum.h
/// \brief From a time trace to a complex spectrum: a time window, the Fourier transform at
/// chosen frequencies, and the phase unwrapped from low frequency.
///
/// Convention (docs/measurements.md): fields ~ exp(-i omega t), so the transform is
///   X(f) = sum_k w(t_k) x(t_k) exp(+i 2 pi f t_k) dt
/// (the rectangle rule on uniform samples; exact for a band-limited trace sampled well above
/// its highest frequency). A delay tau multiplies X by exp(+i omega tau): phase grows with
/// delay, so a slab of index n > 1 adds the phase (n - 1) k0 d.
/// The transform is a plain DFT at the requested frequencies (O(samples x frequencies)):
/// a spectroscopy band is a few hundred frequencies on an uneven count, where a zero-padded
/// FFT would only interpolate the same sums; it needs no extra library.
///
/// The window is flat on [from + taper, to - taper] with raised-cosine (Hann) edges of length
/// `taper` (a Tukey window; Harris, Proc. IEEE 66, 51 (1978), sec. V) and zero outside.
#pragma once
#include <complex>
#include <string>
#include <vector>

namespace ty {

struct TimeWindow {
  double from = 0, to = 0, taper = 0;  ///< s; to <= from: no window (all ones)
  double operator()(double t) const;
  std::string describe() const;
};

/// X(f) of the uniform samples x at times t (t[k] = t0 + k dt), windowed.
std::vector<std::complex<double>> fourier(const std::vector<double>& t, const std::vector<double>& x,
                                          const std::vector<double>& freq, const TimeWindow& w);

/// The phase of z, unwrapped along the frequencies (steps above pi taken as 2 pi jumps)
/// and anchored at low frequency: a straight line fitted through the lowest `anchor`
/// fraction of the band (at least two points) must meet phase 0 at f = 0 within pi, so the
/// whole curve is moved by the multiple of 2 pi that brings it there (a causal transfer
/// function of a passive sample has zero phase at f = 0; the practice of extrapolating the
/// unwrapped phase to f = 0 is described in Jepsen, Cooke & Koch, Laser Photonics Rev. 5,
/// 124 (2011) -- cited from memory).
std::vector<double> unwrapped_phase(const std::vector<double>& freq, const std::vector<std::complex<double>>& z,
                                    double anchor = 0.1);

}  // namespace ty
