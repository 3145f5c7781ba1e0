/// \file waveform.cpp
/// \brief cw, pulse, chirp, single-cycle and file signals, and the cubic spline of file
/// waveforms (see waveform.h for the formulas).
#include "solver/sources/waveform.h"

#include <algorithm>
#include <cmath>

#include "io/scene/units.h"

namespace ty {

using constants::pi;

CubicSpline::CubicSpline(std::vector<double> x, std::vector<double> y)
    : x_(std::move(x)), y_(std::move(y)), m_(x_.size(), 0.0) {
  // Tridiagonal system for the second derivatives, m = 0 at both ends (Thomas algorithm).
  const size_t n = x_.size();
  if (n < 3) return;
  std::vector<double> c(n, 0.0), d(n, 0.0);
  for (size_t i = 1; i + 1 < n; ++i) {
    const double h0 = x_[i] - x_[i - 1], h1 = x_[i + 1] - x_[i];
    const double a = h0 / 6, b = (h0 + h1) / 3, cc = h1 / 6;
    const double r = (y_[i + 1] - y_[i]) / h1 - (y_[i] - y_[i - 1]) / h0;
    const double den = b - a * c[i - 1];
    c[i] = cc / den;
    d[i] = (r - a * d[i - 1]) / den;
  }
  for (size_t i = n - 2; i >= 1; --i) m_[i] = d[i] - c[i] * m_[i + 1];
}

double CubicSpline::operator()(double t) const {
  if (x_.size() < 2 || t < x_.front() || t > x_.back()) return 0.0;
  const size_t i = std::min<size_t>(std::upper_bound(x_.begin(), x_.end(), t) - x_.begin(), x_.size() - 1) - 1;
  const double h = x_[i + 1] - x_[i], a = (x_[i + 1] - t) / h, b = (t - x_[i]) / h;
  return a * y_[i] + b * y_[i + 1] + ((a * a * a - a) * m_[i] + (b * b * b - b) * m_[i + 1]) * h * h / 6;
}

double spline_error_estimate(const Waveform& w) {
  std::vector<double> xe, ye;
  double peak = 0;
  for (size_t i = 0; i < w.table_time.size(); ++i) {
    peak = std::max(peak, std::abs(w.table_value[i]));
    if (i % 2 == 0) xe.push_back(w.table_time[i]), ye.push_back(w.table_value[i]);
  }
  if (xe.size() < 3 || peak == 0) return 0;
  const CubicSpline half(xe, ye);
  double e2 = 0;
  for (size_t i = 1; i + 1 < w.table_time.size(); i += 2)
    e2 = std::max(e2, std::abs(half(w.table_time[i]) - w.table_value[i]));
  return e2 / peak / 16;
}

Signal::Signal(const Waveform& w, double frequency) : w_(w), omega_(2 * pi * frequency) {
  if (w.kind == Waveform::Kind::pulse) sigma_t_ = w.fwhm / (2.0 * std::sqrt(std::log(2.0)));
  if (w.kind == Waveform::Kind::single_cycle) tau_ = 1.0 / omega_;
  if (w.kind == Waveform::Kind::file) table_ = CubicSpline(w.table_time, w.table_value);
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
    case Waveform::Kind::single_cycle: {
      const double u = (t - w_.delay) / tau_;
      return u * u > 1400 ? 0.0 : -u * std::exp(0.5 * (1 - u * u));
    }
    case Waveform::Kind::file:
      return table_(t);
  }
  return 0;
}

std::complex<double> Signal::operator()(double t) const {
  const double env = envelope(t);
  if (env == 0) return 0;
  double phi = 0;
  switch (w_.kind) {
    case Waveform::Kind::cw:
      phi = omega_ * t;
      break;
    case Waveform::Kind::pulse:
      phi = omega_ * (t - w_.delay);
      break;
    case Waveform::Kind::chirp:
      phi = 2 * pi * (w_.from * t + (w_.to - w_.from) * t * t / (2 * w_.length));
      break;
    case Waveform::Kind::single_cycle:
    case Waveform::Kind::file:
      return env;  // real signals
  }
  return env * std::complex<double>(std::cos(phi), -std::sin(phi));
}

}  // namespace ty
