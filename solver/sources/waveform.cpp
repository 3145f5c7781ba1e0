/// \file waveform.cpp
/// \brief cw, pulse and chirp signals (see waveform.h for the formulas).
#include "solver/sources/waveform.h"

#include <cmath>

#include "io/scene/units.h"

namespace ty {

using constants::pi;

Signal::Signal(const Waveform& w, double frequency) : w_(w), omega_(2 * pi * frequency) {
  if (w.kind == Waveform::Kind::pulse) sigma_t_ = w.fwhm / (2.0 * std::sqrt(std::log(2.0)));
}

double Signal::envelope(double t) const {
  switch (w_.kind) {
    case Waveform::Kind::cw:
      if (t <= 0) return 0;
      if (t >= w_.ramp) return 1;
      return 0.5 * (1 - std::cos(pi * t / w_.ramp));
    case Waveform::Kind::pulse: {
      const double u = (t - w_.delay) / sigma_t_;
      return u * u > 1400 ? 0.0 : std::exp(-0.5 * u * u);
    }
    case Waveform::Kind::chirp: {
      if (t <= 0 || t >= w_.length) return 0;
      const double edge = 0.05 * w_.length, r = std::min(t, w_.length - t);
      return r >= edge ? 1.0 : 0.5 * (1 - std::cos(pi * r / edge));
    }
  }
  return 0;
}

std::complex<double> Signal::operator()(double t) const {
  const double env = envelope(t);
  if (env == 0) return 0;
  double phi = 0;
  switch (w_.kind) {
    case Waveform::Kind::cw: phi = omega_ * t; break;
    case Waveform::Kind::pulse: phi = omega_ * (t - w_.delay); break;
    case Waveform::Kind::chirp:
      phi = 2 * pi * (w_.from * t + (w_.to - w_.from) * t * t / (2 * w_.length));
      break;
  }
  return env * std::complex<double>(std::cos(phi), -std::sin(phi));
}

}  // namespace ty
