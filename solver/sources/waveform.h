/// \file waveform.h
/// \brief Source time dependence as a complex signal g(t) = envelope(t) * exp(-i phi(t)),
/// so that a source's value is Re[A g(t - tau)] for a complex amplitude A and delay tau.
///   cw:    raised-cosine turn-on 1/2 (1 - cos(pi t / ramp)) over the ramp, phi = w t
///   pulse: Gaussian field envelope exp(-(t-t0)^2 / (2 s^2)) whose intensity has the
///          given FWHM (s = fwhm / (2 sqrt(ln 2))), phi = w (t - t0)
///   chirp: linear sweep phi = 2 pi (f1 t + (f2-f1) t^2 / (2 L)) on [0, L], with
///          raised-cosine tapers over the first and last 5% of L
#pragma once
#include <complex>

#include "io/scene/scene.h"

namespace ty {

class Signal {
 public:
  Signal(const Waveform& w, double frequency);
  std::complex<double> operator()(double t) const;
  double envelope(double t) const;

 private:
  Waveform w_;
  double omega_;
  double sigma_t_ = 0;
};

}  // namespace ty
