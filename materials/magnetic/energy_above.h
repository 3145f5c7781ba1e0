/// \file energy_above.h
/// \brief The energy of a magnet's state above its equilibrium, from the deviations alone.
///
/// mu0 e(m) - mu0 e(g) taken as a difference of two energies (magnet.h) loses everything
/// below the rounding of the exchange energy: with lambda mu_1 mu_2 = 55 T x 0.754 T, about
/// 5e-15 T^2 per cell, the energy of a 1e-8 rad tilt. The energy is quadratic in m, so exactly
///   mu0 (e(g+d) - e(g)) = -sum_s mu_s B_eff,s(g).d_s + (the quadratic terms of e in d),
/// and at equilibrium B_eff,s(g) = c_s g_s, with g_s.d_s = -|d_s|^2/2 for unit vectors:
///   = sum_s mu_s c_s |d_s|^2/2 - sum_s sum_k mu_s B_A,k (d_s.n_k)^2/2
///     + lambda mu_1 mu_2 d_1.d_2 + mu_D B_D.(d_1 x d_2),
/// the sublattices' Hamiltonian about their ground state (its second variation is the
/// small-signal energy of a precessing two-sublattice magnet: Gurevich & Melkov, Magnetization
/// Oscillations and Waves, CRC 1996, ch. 1 and 4), here to all orders in d, each term a product
/// of small numbers. The ground state's residual torque (its solver's tolerance) is left out,
/// as the small-signal step (llg_linear.h) leaves it out.
#pragma once
#include <array>
#include <cmath>

#include "materials/magnetic/magnet.h"

namespace ty {

/// mu0 times the energy density of the state m above the equilibrium g, T^2.
inline double energy_above(const MagnetModel& mm, const std::array<Vec3, 2>& g, const std::array<Vec3, 2>& m) {
  const std::array<Vec3, 2> d{Vec3(m[0] - g[0]), mm.n == 2 ? Vec3(m[1] - g[1]) : Vec3(Vec3::Zero())};
  double e = 0;
  for (int s = 0; s < mm.n; ++s) {
    const double c = mm.field(s, g).dot(g[s]);
    e += 0.5 * mm.mu[s] * c * d[s].squaredNorm();
    for (size_t k = 0; k < mm.axis.size(); ++k) e -= 0.5 * mm.mu[s] * mm.b_a[k] * std::pow(d[s].dot(mm.axis[k]), 2);
  }
  if (mm.n == 2) e += mm.lambda * mm.mu[0] * mm.mu[1] * d[0].dot(d[1]) + mm.mu_d * mm.b_d.dot(d[0].cross(d[1]));
  return e;
}

}  // namespace ty
