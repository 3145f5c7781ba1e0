/// \file linear_response.cpp
/// \brief Linear response of a sublattice magnet (equations in linear_response.h).
#include "materials/magnetic/linear_response.h"
#include "io/scene/constants.h"

#include <Eigen/Eigenvalues>
#include <algorithm>
#include <cmath>

namespace ty {
namespace {

Eigen::Matrix3d cross_matrix(const Vec3& a) {
  Eigen::Matrix3d m;
  m << 0, -a.z(), a.y(), a.z(), 0, -a.x(), -a.y(), a.x(), 0;
  return m;
}

}  // namespace

Linearised linearise(const MagnetModel& M, const MagneticState& st) {
  const int n = M.n;
  Linearised lin{n, Eigen::MatrixXd::Zero(3 * n, 3 * n), Eigen::MatrixXd::Zero(3 * n, 3 * n),
                 Eigen::MatrixXd::Zero(3 * n, 3)};
  Eigen::Matrix3d A = Eigen::Matrix3d::Zero();
  for (size_t k = 0; k < M.axis.size(); ++k) A += M.b_a[k] * M.axis[k] * M.axis[k].transpose();
  for (int s = 0; s < n; ++s) {
    const Vec3 B0 = M.field(s, st.m);
    const Eigen::Matrix3d m0x = cross_matrix(st.m[s]);
    const double g = M.gamma[s];
    lin.L.block<3, 3>(3 * s, 3 * s) = g * cross_matrix(B0) - g * m0x * A;
    if (n == 2) {
      const int t = 1 - s;
      Eigen::Matrix3d X = -M.lambda * M.mu[t] * Eigen::Matrix3d::Identity();
      X += (s == 0 ? 1.0 : -1.0) * (M.mu_d / M.mu[s]) * cross_matrix(M.b_d);
      lin.L.block<3, 3>(3 * s, 3 * t) = -g * m0x * X;
    }
    lin.D.block<3, 3>(3 * s, 3 * s) = M.alpha[s] * m0x;
    lin.Bm.block<3, 3>(3 * s, 0) = -g * m0x;
  }
  return lin;
}

Mat3c susceptibility(const MagnetModel& M, const MagneticState& st, double omega) {
  const Linearised lin = linearise(M, st);
  const int N = 3 * M.n;
  const std::complex<double> iw(0, omega);
  // -i w dm = L dm - i w D dm + Bm b  ->  (-i w I - L + i w D) dm = Bm b
  Eigen::MatrixXcd A = -iw * Eigen::MatrixXcd::Identity(N, N) - lin.L.cast<std::complex<double>>() +
                       iw * lin.D.cast<std::complex<double>>();
  const Eigen::MatrixXcd dm = A.partialPivLu().solve(lin.Bm.cast<std::complex<double>>());
  Mat3c chi = Mat3c::Zero();
  for (int s = 0; s < M.n; ++s) chi += M.mu[s] * dm.block<3, 3>(3 * s, 0);
  return chi;
}

std::vector<double> resonances(const MagnetModel& M, const MagneticState& st) {
  const Linearised lin = linearise(M, st);
  Eigen::EigenSolver<Eigen::MatrixXd> es(lin.L);
  const auto ev = es.eigenvalues();
  double scale = 0;
  for (int k = 0; k < ev.size(); ++k) scale = std::max(scale, std::abs(ev[k]));
  std::vector<double> f;
  for (int k = 0; k < ev.size(); ++k)
    if (ev[k].imag() > 1e-6 * scale) f.push_back(ev[k].imag() / (2 * constants::pi));  // zero modes come out at ~1e-7
  std::sort(f.begin(), f.end());
  return f;
}

std::vector<DampedMode> damped_modes(const MagnetModel& M, const MagneticState& st) {
  const Linearised lin = linearise(M, st);
  const int N = 3 * M.n;
  const Eigen::MatrixXd A = (Eigen::MatrixXd::Identity(N, N) - lin.D).partialPivLu().solve(lin.L);
  Eigen::EigenSolver<Eigen::MatrixXd> es(A);
  const auto ev = es.eigenvalues();
  double scale = 0;
  for (int k = 0; k < ev.size(); ++k) scale = std::max(scale, std::abs(ev[k]));
  std::vector<DampedMode> modes;
  for (int k = 0; k < ev.size(); ++k)
    if (ev[k].imag() > 1e-6 * scale) modes.push_back({ev[k].imag() / (2 * constants::pi), -ev[k].real()});
  std::sort(modes.begin(), modes.end(), [](const DampedMode& a, const DampedMode& b) { return a.frequency < b.frequency; });
  return modes;
}

std::vector<Band> negative_bands(const std::function<double(double)>& value, double f0, double f1, int samples) {
  std::vector<Band> bands;
  auto edge = [&](double a, double b) {  // sign change in [a, b]
    const bool neg_a = value(a) < 0;
    for (int it = 0; it < 80; ++it) {
      const double mid = 0.5 * (a + b);
      ((value(mid) < 0) == neg_a ? a : b) = mid;
    }
    return 0.5 * (a + b);
  };
  double prev_f = f0;
  bool prev_neg = value(f0) < 0;
  double start = prev_neg ? f0 : 0;
  for (int k = 1; k <= samples; ++k) {
    const double f = f0 + (f1 - f0) * k / samples;
    const bool neg = value(f) < 0;
    if (neg != prev_neg) {
      const double e = edge(prev_f, f);
      if (neg) start = e;
      else bands.push_back({start, e});
    }
    prev_f = f;
    prev_neg = neg;
  }
  if (prev_neg) bands.push_back({start, f1});
  return bands;
}

std::vector<Band> whole_negative_bands(const std::function<double(double)>& value, double f0, double f1, int samples,
                                       double f_floor, double f_ceiling) {
  std::vector<Band> bands = negative_bands(value, f0, f1, samples);
  if (bands.empty()) return bands;
  const double step = (f1 - f0) / samples;
  // walk outwards from `from` by `dir` steps until the value is no longer negative; refine
  auto follow = [&](double from, double dir, double limit) {
    double a = from;
    while (dir * (limit - a) > 0) {
      const double b = dir > 0 ? std::min(a + step, limit) : std::max(a - step, limit);
      if (value(b) >= 0) {
        double neg = a, pos = b;
        for (int it = 0; it < 80; ++it) {
          const double mid = 0.5 * (neg + pos);
          (value(mid) < 0 ? neg : pos) = mid;
        }
        return 0.5 * (neg + pos);
      }
      a = b;
    }
    return limit;
  };
  if (bands.back().to >= f1) bands.back().to = follow(f1, +1, f_ceiling);
  if (bands.front().from <= f0) bands.front().from = follow(f0, -1, f_floor);
  return bands;
}

std::complex<double> voigt_permeability(const Mat3c& mu, int normal) {
  return (mu(0, 0) * mu(1, 1) - mu(0, 1) * mu(1, 0)) / mu(normal, normal);
}

}  // namespace ty
