/// \file waveform.h
/// \brief Source time dependence as a complex signal g(t) = envelope(t) * exp(-i phi(t)),
/// so that a source's value is Re[A g(t - tau)] for a complex amplitude A and delay tau.
///   cw:    raised-cosine turn-on 1/2 (1 - cos(pi t / ramp)) over the ramp, phi = w t
///   pulse: Gaussian field envelope exp(-(t-t0)^2 / (2 s^2)) whose intensity has the
///          given FWHM (s = fwhm / (2 sqrt(ln 2))), phi = w (t - t0)
///   chirp: linear sweep phi = 2 pi (f1 t + (f2-f1) t^2 / (2 L)) on [0, L], with
///          raised-cosine tapers over the first and last 5% of L
///   single-cycle: the time derivative of a Gaussian, real,
///          g = -u exp((1 - u^2)/2),  u = (t - t0) / tau,  tau = 1 / (2 pi f_c)
///          (peak 1 at t0 - tau; spectrum ~ w exp(-w^2 tau^2 / 2), peak at f_c, amplitude
///          half-maximum at 0.3191 f_c and 1.9216 f_c: FWHM 1.6025 f_c; 1% at 0.0061 f_c and
///          3.5716 f_c). The far field of a
///          photoconductive emitter is the derivative of its Gaussian-like current pulse,
///          E ~ dJ/dt (e.g. Jepsen, Jacobsen & Keiding, J. Opt. Soc. Am. B 13, 2424 (1996),
///          cited from memory). f_c is the source's frequency.
///   file:  a user's table (time, value) interpolated by a natural cubic spline through its
///          samples (Press et al., Numerical Recipes, 3rd ed., sec. 3.3), zero outside it.
/// A real signal (single-cycle, file) is carried with phi = 0; a beam's complex A is set
/// for its carrier, so with these only a plane wave or a point source is exact.
#pragma once
#include <complex>
#include <vector>

#include "io/scene/scene.h"

namespace ty {

/// The natural cubic spline through (x, y), x strictly increasing, at least 2 samples.
class CubicSpline {
 public:
  CubicSpline() = default;
  CubicSpline(std::vector<double> x, std::vector<double> y);
  double operator()(double t) const;  ///< 0 outside [x.front(), x.back()]

 private:
  std::vector<double> x_, y_, m_;  // samples and second derivatives
};

/// The interpolation error of a file waveform, estimated by leaving every other sample out:
/// the spline through the even samples misses the odd ones by e2 (max, relative to the
/// table's peak |value|); the spline's error is fourth order in the spacing, so the full
/// table's is ~ e2 / 16.
double spline_error_estimate(const Waveform& w);

class Signal {
 public:
  Signal(const Waveform& w, double frequency);
  std::complex<double> operator()(double t) const;
  double envelope(double t) const;

 private:
  Waveform w_;
  double omega_;
  double sigma_t_ = 0, tau_ = 0;
  CubicSpline table_;
};

}  // namespace ty
