/// \file refraction.cpp
/// \brief The Ez wave's normal wavenumber and power flow (equations in refraction.h).
#include "materials/layered/refraction.h"

#include <cmath>

namespace ty {

Refraction ez_refraction(std::complex<double> eps_zz, const Mat3c& mu, int normal, double kt) {
  using cd = std::complex<double>;
  Eigen::Matrix2cd m;
  m << mu(0, 0), mu(0, 1), mu(1, 0), mu(1, 1);
  const Eigen::Matrix2cd nu = m.inverse();
  // scene axes: normal y -> t = -x, n = +y; normal x -> t = +y, n = +x
  const Eigen::Vector2d t = normal == 1 ? Eigen::Vector2d(-1, 0) : Eigen::Vector2d(0, 1);
  const Eigen::Vector2d n = normal == 1 ? Eigen::Vector2d(0, 1) : Eigen::Vector2d(1, 0);
  // k = kt t + kn n; the dispersion relation as a quadratic a kn^2 + b kn + c = 0
  auto form = [&](const Eigen::Vector2cd& p, const Eigen::Vector2cd& q) {  // the bilinear form of the relation
    return nu(1, 1) * p[0] * q[0] + nu(0, 0) * p[1] * q[1] - 0.5 * (nu(0, 1) + nu(1, 0)) * (p[0] * q[1] + p[1] * q[0]);
  };
  const Eigen::Vector2cd tc = t.cast<cd>(), nc = n.cast<cd>();
  const cd a = form(nc, nc), b = 2.0 * kt * form(tc, nc), c = kt * kt * form(tc, tc) - eps_zz;
  const cd root = std::sqrt(b * b - 4.0 * a * c);
  const cd k1 = (-b + root) / (2.0 * a), k2 = (-b - root) / (2.0 * a);
  auto flow = [&](cd kn, double& st, double& sn) {
    const Eigen::Vector2cd k = kt * tc + kn * nc;
    const Eigen::Vector2cd h = nu * Eigen::Vector2cd(k[1], -k[0]);  // H per Ez, times w mu0 / k0
    const double sx = (-std::conj(h[1])).real(), sy = std::conj(h[0]).real();
    st = sx * t[0] + sy * t[1];
    sn = sx * n[0] + sy * n[1];
  };
  Refraction r;
  double st1, sn1, st2, sn2;
  flow(k1, st1, sn1);
  flow(k2, st2, sn2);
  const double scale = std::abs(k1) + std::abs(k2) + 1e-300;
  const bool lossy = std::max(std::abs(k1.imag()), std::abs(k2.imag())) > 1e-9 * scale;
  const bool first = lossy ? k1.imag() > k2.imag() : sn1 > sn2;
  r.kn = first ? k1 : k2;
  r.s_t = first ? st1 : st2;
  r.s_n = first ? sn1 : sn2;
  r.propagates = r.s_n > 1e-12 * (std::abs(r.s_t) + std::abs(r.s_n) + 1e-300);
  r.angle = std::atan2(r.s_t, r.s_n);
  return r;
}

Refraction hz_refraction(const Mat3c& eps, std::complex<double> mu_zz, int normal, double kt) {
  return ez_refraction(mu_zz, eps, normal, kt);
}

}  // namespace ty
