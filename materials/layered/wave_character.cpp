/// \file wave_character.cpp
/// \brief Iso-frequency curves and normal-incidence waves (equations in wave_character.h).
#include "materials/layered/wave_character.h"

#include <Eigen/Eigenvalues>
#include <cmath>
#include <limits>

namespace ty {
namespace {

using cd = std::complex<double>;

/// The curve of  nu_yy kx^2 + nu_xx ky^2 - (nu_xy + nu_yx) kx ky = eps k0^2  for the 2x2 block m.
IsoCurve curve_of(cd eps, const Eigen::Matrix2cd& m) {
  const Eigen::Matrix2cd nu = m.inverse();
  Eigen::Matrix2d form;  // the symmetric matrix of the form over (kx, ky), lossless part
  const double off = -0.5 * (nu(0, 1) + nu(1, 0)).real();
  form << nu(1, 1).real(), off, off, nu(0, 0).real();
  const double e = eps.real();
  const Eigen::Vector2d ev = Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d>(form / e).eigenvalues();
  if (!std::isfinite(ev[0]) || !std::isfinite(ev[1])) return IsoCurve::none;
  if (ev[0] > 0 && ev[1] > 0) return IsoCurve::ellipse;
  if (ev[0] < 0 && ev[1] < 0) return IsoCurve::none;
  return IsoCurve::hyperbola;
}

Eigen::Matrix2cd inplane(const Mat3c& t) {
  Eigen::Matrix2cd m;
  m << t(0, 0), t(0, 1), t(1, 0), t(1, 1);
  return m;
}

/// The transverse tensor over (t, z) with the normal component removed (B_n = 0 or D_n = 0);
/// t = z x n: normal y -> t = -x, normal x -> t = +y.
Eigen::Matrix2cd transverse(const Mat3c& a, int normal) {
  const int n = normal, t = 1 - normal;
  const double s = normal == 1 ? -1.0 : 1.0;  // the sign of t along its scene axis
  const int idx[2] = {t, 2};
  const double sg[2] = {s, 1.0};
  Eigen::Matrix2cd m;
  for (int p = 0; p < 2; ++p)
    for (int q = 0; q < 2; ++q) m(p, q) = sg[p] * sg[q] * (a(idx[p], idx[q]) - a(idx[p], n) * a(n, idx[q]) / a(n, n));
  return m;
}

}  // namespace

const char* iso_curve_name(IsoCurve c) {
  return c == IsoCurve::ellipse ? "ellipse" : c == IsoCurve::hyperbola ? "hyperbola" : "evanescent";
}

IsoCurve ez_iso_curve(cd eps_zz, const Mat3c& mu) { return curve_of(eps_zz, inplane(mu)); }

IsoCurve hz_iso_curve(const Mat3c& eps, cd mu_zz) { return curve_of(mu_zz, inplane(eps)); }

bool is_propagating(const Refraction& r) { return std::abs(r.kn.real()) > std::abs(r.kn.imag()); }

double decay_length(const Refraction& r) {
  const double im = std::abs(r.kn.imag());
  return im > 0 ? 1.0 / im : std::numeric_limits<double>::infinity();
}

NormalModes normal_modes(const Mat3c& eps, const Mat3c& mu, int normal) {
  NormalModes out;
  const Eigen::Matrix2cd M = transverse(mu, normal), P = transverse(eps, normal);
  Eigen::Matrix2cd J;
  J << 0, -1, 1, 0;
  out.Q = -J * P * J * M;
  const double scale = std::abs(out.Q(0, 0)) + std::abs(out.Q(1, 1)) + 1e-300;
  out.coupled = std::abs(out.Q(0, 1)) + std::abs(out.Q(1, 0)) > 1e-9 * scale;  // above round-off of chi
  if (!out.coupled) {
    out.n2 = {out.Q(0, 0), out.Q(1, 1)};
    return out;
  }
  const Eigen::Vector2cd ev = Eigen::ComplexEigenSolver<Eigen::Matrix2cd>(out.Q, false).eigenvalues();
  out.n2 = {ev[0], ev[1]};
  if (out.n2[1].real() < out.n2[0].real()) std::swap(out.n2[0], out.n2[1]);
  return out;
}

}  // namespace ty
