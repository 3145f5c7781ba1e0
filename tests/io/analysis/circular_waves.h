/// \file circular_waves.h
/// \brief Closed forms of a gyrotropic slab at normal incidence, for the Jones tests: the
/// Airy transmission of an isotropic slab (Born & Wolf sec. 7.6), and the Faraday-geometry
/// slab's J as the sum over its two circular eigenwaves, n_a^2 = eps (mu + kappa) and
/// n_b^2 = eps (mu - kappa) (Landau & Lifshitz, Electrodynamics of Continuous Media, 2nd ed.,
/// sec. 101 -- from memory), in the (E.z, E.u) basis of io/analysis/spectroscopy/polarization.h.
#pragma once
#include <complex>

#include "io/analysis/spectroscopy/polarization.h"
#include "io/scene/constants.h"

namespace ty::test {

using cd = std::complex<double>;

/// The Airy transmission (exit face over entrance face) of a slab of index n and relative
/// impedance z in vacuum, normal incidence (Born & Wolf sec. 7.6).
inline cd airy_t(cd n, cd z, double k0, double d) {
  return 1.0 / (std::cos(n * k0 * d) - 0.5 * cd(0, 1) * (z + 1.0 / z) * std::sin(n * k0 * d));
}

/// The closed-form Jones matrix of the gyrotropic slab (see the file's header).
inline Jones circular_jones(cd eps, cd mu, cd kappa, double f, double d) {
  const double k0 = 2 * constants::pi * f / constants::c0;
  const cd ta = airy_t(std::sqrt(eps * (mu + kappa)), std::sqrt((mu + kappa) / eps), k0, d);
  const cd tb = airy_t(std::sqrt(eps * (mu - kappa)), std::sqrt((mu - kappa) / eps), k0, d);
  Jones J{};
  J[0][0] = J[1][1] = 0.5 * (ta + tb);
  J[1][0] = -0.5 * cd(0, 1) * (ta - tb);  // E.u out of an Ez input
  J[0][1] = 0.5 * cd(0, 1) * (ta - tb);
  return J;
}

}  // namespace ty::test
