/// \file magnet.cpp
/// \brief Effective field and energy of a sublattice magnet (formulas in magnet.h).
#include "materials/magnetic/magnet.h"

#include <algorithm>
#include <cmath>

#include "materials/crystals/temperature.h"

namespace ty {

double gyromagnetic_ratio(double g) { return g * constants::mu_B / constants::hbar; }

MagnetModel::MagnetModel(const Magnet& m, const std::array<double, 3>& b0) {
  n = static_cast<int>(m.sublattices.size());
  const ThermalScale t = thermal_scale(m.thermal);  // 1 and 1 without thermal data
  for (int s = 0; s < n; ++s) {
    mu[s] = m.sublattices[s].saturation * t.magnetization;
    gamma[s] = gyromagnetic_ratio(m.sublattices[s].g);
    alpha[s] = m.sublattices[s].damping;
  }
  lambda = m.lambda;
  for (const auto& a : m.anisotropy) {
    axis.push_back(Vec3(a.axis[0], a.axis[1], a.axis[2]).normalized());
    b_a.push_back(a.field * t.anisotropy);
  }
  b_d = t.magnetization * Vec3(m.dzyaloshinskii[0], m.dzyaloshinskii[1], m.dzyaloshinskii[2]);
  mu_d = n == 2 ? std::sqrt(mu[0] * mu[1]) : 0.0;
  if (!m.thermal.linewidth.empty() && n == 2) {
    // the damping from the line's width at this temperature (temperature.h); the easy axis
    // is the largest positive anisotropy field (the reader allows the table on such magnets)
    double b_easy = 0;
    for (double b : b_a) b_easy = std::max(b_easy, b);
    for (int s = 0; s < n; ++s)
      alpha[s] = damping_from_linewidth(thermal_linewidth(m.thermal), gamma[s], lambda * std::sqrt(mu[0] * mu[1]), b_easy);
  }
  bias = Vec3(b0[0], b0[1], b0[2]);
  order = Vec3(m.order[0], m.order[1], m.order[2]);
}

Vec3 MagnetModel::field(int s, const std::array<Vec3, 2>& m, const Vec3& b) const {
  Vec3 h = bias + b;
  for (size_t k = 0; k < axis.size(); ++k) h += b_a[k] * m[s].dot(axis[k]) * axis[k];
  if (n == 2) {
    const int t = 1 - s;
    h -= lambda * mu[t] * m[t];
    if (s == 0) h += (mu_d / mu[0]) * b_d.cross(m[1]);
    else h += (mu_d / mu[1]) * m[0].cross(b_d);
  }
  return h;
}

double MagnetModel::energy(const std::array<Vec3, 2>& m) const {
  double e = 0;
  for (int s = 0; s < n; ++s) {
    e -= mu[s] * m[s].dot(bias);
    for (size_t k = 0; k < axis.size(); ++k) e -= 0.5 * mu[s] * b_a[k] * std::pow(m[s].dot(axis[k]), 2);
  }
  if (n == 2) e += lambda * mu[0] * mu[1] * m[0].dot(m[1]) + mu_d * b_d.dot(m[0].cross(m[1]));
  return e;
}

Vec3 MagnetModel::net(const std::array<Vec3, 2>& m) const {
  Vec3 v = mu[0] * m[0];
  if (n == 2) v += mu[1] * m[1];
  return v;
}

}  // namespace ty

#include "materials/magnetic/llg_cell.h"

namespace ty {

LlgCoefficients LlgCoefficients::from(const MagnetModel& m, double dt, double f_max, double phase_error) {
  LlgCoefficients p;
  p.n = m.n;
  double scale = m.bias.norm() + m.b_d.norm();
  for (int s = 0; s < m.n; ++s) {
    p.mu[s] = m.mu[s];
    p.alpha[s] = m.alpha[s];
    p.gp[s] = m.gamma[s] / (1 + m.alpha[s] * m.alpha[s]);
  }
  p.lambda = m.lambda;
  if (m.n == 2) scale += std::abs(m.lambda) * std::max(m.mu[0], m.mu[1]);
  p.mu_d = m.mu_d;
  for (int c = 0; c < 3; ++c) p.bd[c] = m.b_d[c], p.bias[c] = m.bias[c];
  if (m.axis.size() > 4) throw std::runtime_error("at most four anisotropy terms per magnet");
  p.na = static_cast<int>(m.axis.size());
  for (int k = 0; k < p.na; ++k) {
    for (int c = 0; c < 3; ++c) p.axis[k][c] = m.axis[k][c];
    p.ba[k] = m.b_a[k];
    scale += std::abs(m.b_a[k]);
  }
  p.dt = dt;
  const double w_max = 2 * constants::pi * f_max, g_max = std::max(m.gamma[0], m.n == 2 ? m.gamma[1] : 0.0);
  const double by_phase = w_max * dt / std::sqrt(12 * phase_error);
  const double by_contraction = 0.5 * dt * g_max * scale / 0.25;
  p.substeps = std::max(1, static_cast<int>(std::ceil(std::max(by_phase, by_contraction) - 1e-12)));
  const double rho = std::max(0.5 * (dt / p.substeps) * g_max * scale, 1e-6);
  p.iterations = std::clamp(static_cast<int>(std::ceil(-8.0 / std::log10(rho))), 2, 30);
  return p;
}

}  // namespace ty
