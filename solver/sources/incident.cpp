/// \file incident.cpp
/// \brief Plane-wave and Gaussian-beam incident fields for launch lines.
#include "solver/sources/incident.h"

#include <cmath>
#include <vector>

#include "io/scene/units.h"

namespace ty {

using constants::c0;
using constants::pi;

double yee_wavenumber(double omega, double theta, double n, double dx, double dy, double dt) {
  const double lhs = std::pow(n * std::sin(0.5 * omega * dt) / (c0 * dt), 2);
  const double cx = std::cos(theta), sy = std::sin(theta);
  auto f = [&](double k) {
    return std::pow(std::sin(0.5 * k * cx * dx) / dx, 2) + std::pow(std::sin(0.5 * k * sy * dy) / dy, 2) - lhs;
  };
  const double k0 = n * omega / c0;
  double lo = 0.5 * k0, hi = 2.0 * k0;
  const double kmax = pi / std::max(std::abs(cx) * dx, std::abs(sy) * dy);
  hi = std::min(hi, 0.999999 * kmax);
  if (f(hi) < 0) return k0;  // beyond the grid's band: keep the continuum value
  for (int it = 0; it < 200; ++it) {
    const double mid = 0.5 * (lo + hi);
    (f(mid) > 0 ? hi : lo) = mid;
  }
  return 0.5 * (lo + hi);
}

std::complex<double> yee_normal_wavenumber(double omega, double kt, double n, double d_t, double d_n, double dt) {
  const double a = std::sin(0.5 * kt * d_t) / d_t;
  const double b2 = std::pow(n * std::sin(0.5 * omega * dt) / (c0 * dt), 2) - a * a;
  const double x = d_n * std::sqrt(std::abs(b2));  // sin (or i sinh) of kn d_n / 2
  if (b2 < 0) return {0.0, 2 / d_n * std::asinh(x)};
  if (x > 1) return {std::nan(""), 0.0};
  return {2 / d_n * std::asin(x), 0.0};
}

IncidentField::IncidentField(const Source& s, Vec2 crossing, double n, double dx, double dy, double dt)
    : s_(s), n_(n), crossing_(crossing) {
  const double omega = 2 * pi * s.frequency;
  k_ = yee_wavenumber(omega, s.angle, n, dx, dy, dt);
  v_ = omega / k_;
  u_ = {std::cos(s.angle), std::sin(s.angle)};
  v_dir_ = {-u_.y, u_.x};
  if (s.kind == Source::Kind::beam) {
    qmax_ = std::min(0.999 * k_, 9.0 / s.waist);
    nq_ = 601;
    dq_ = 2 * qmax_ / (nq_ - 1);
    double sum = 0;
    for (int m = 0; m < nq_; ++m) {
      const double q = -qmax_ + m * dq_;
      sum += std::exp(-q * q * s.waist * s.waist / 4) * (m == 0 || m == nq_ - 1 ? 0.5 : 1.0);
    }
    norm_ = 1.0 / sum;
  }
}

void IncidentField::at(Component c, Vec2 p, std::complex<double>& A, double& tau) const {
  const double ell = (p.x - crossing_.x) * u_.x + (p.y - crossing_.y) * u_.y;
  tau = ell / v_;
  const bool ez = s_.component == Component::Ez;
  // polarization factor of component c for a plane wave along unit vector (kx, ky)
  auto factor = [&](double kx, double ky) -> double {
    switch (c) {
      case Component::Ez: return ez ? 1.0 : 0.0;
      case Component::Hx: return ez ? n_ * ky : 0.0;
      case Component::Hy: return ez ? -n_ * kx : 0.0;
      case Component::Hz: return ez ? 0.0 : n_;
      case Component::Ex: return ez ? 0.0 : -ky;
      case Component::Ey: return ez ? 0.0 : kx;
    }
    return 0.0;
  };
  if (s_.kind == Source::Kind::plane) {
    A = s_.amplitude * factor(u_.x, u_.y);
    return;
  }
  // Gaussian beam: sum over the angular spectrum, relative to the focus
  const Vec2 d{p.x - s_.focus.x, p.y - s_.focus.y};
  const double du = d.x * u_.x + d.y * u_.y, dv = d.x * v_dir_.x + d.y * v_dir_.y;
  std::complex<double> sum = 0;
  for (int m = 0; m < nq_; ++m) {
    const double q = -qmax_ + m * dq_;
    const double kap = std::sqrt(k_ * k_ - q * q);
    const double w = std::exp(-q * q * s_.waist * s_.waist / 4) * (m == 0 || m == nq_ - 1 ? 0.5 : 1.0);
    const double kx = (q * v_dir_.x + kap * u_.x) / k_, ky = (q * v_dir_.y + kap * u_.y) / k_;
    const double ph = q * dv + kap * du;
    sum += w * factor(kx, ky) * std::complex<double>(std::cos(ph), std::sin(ph));
  }
  // remove the propagation phase that tau carries: A = U exp(-i k ell)
  A = s_.amplitude * norm_ * sum * std::complex<double>(std::cos(k_ * ell), -std::sin(k_ * ell));
}

}  // namespace ty
