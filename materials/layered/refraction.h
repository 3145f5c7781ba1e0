/// \file refraction.h
/// \brief Refraction of the Ez wave (E along z, H in the plane) into a medium of any
/// complex permeability: the normal wavenumber and the direction of the time-averaged power
/// flow for a given real tangential wavenumber, losses included.
///
/// With nu = (mu_inplane)^-1 (the 2x2 in-plane block of mu), Maxwell's equations for
/// E = z Ez exp(i(kx x + ky y - w t)) give H = nu (ky, -kx) Ez / (w mu0) and
///   nu_yy kx^2 + nu_xx ky^2 - (nu_xy + nu_yx) kx ky = eps_zz k0^2,
/// which reduces to kx^2/mu_yy + ky^2/mu_xx = eps k0^2 for a diagonal tensor and to
/// k^2 = eps mu_V k0^2 for a gyrotropic one (Smith & Schurig, Phys. Rev. Lett. 90, 077405
/// (2003) for the hyperbolic case). The power flow is S = 1/2 Re(E x H*) =
/// |Ez|^2/(2 w mu0) (-Re(Ez Hy*), Re(Ez Hx*)) per unit |Ez|^2, the same direction everywhere
/// for one plane wave even when it decays. Of the two normal wavenumbers the transmitted
/// wave is the one that decays away from the interface (Im k_n > 0), or, lossless, the one
/// that carries power away from it (S_n > 0). The mu_xz, mu_yz couplings to the Hz wave of
/// canted states are left out here (the transfer matrix has them).
#pragma once
#include <complex>

#include "materials/magnetic/linear_response.h"

namespace ty {

struct Refraction {
  std::complex<double> kn;  ///< normal wavenumber in the medium, units of k0 (along +n)
  double s_t = 0, s_n = 0;  ///< power flow along t = z x n and n (arbitrary scale)
  double angle = 0;         ///< atan2(s_t, s_n), rad: negative for a positive kt means negative refraction
  bool propagates = false;  ///< false when no power enters (s_n <= 0 to round-off)
};

/// The Ez wave entering a medium (eps_zz, mu) through an interface whose normal is the scene
/// axis `normal` (0: x, 1: y), with tangential wavenumber kt (units of k0) along t = z x n.
Refraction ez_refraction(std::complex<double> eps_zz, const Mat3c& mu, int normal, double kt);

/// The Hz wave (H along z, E in the plane) entering a medium of in-plane permittivity tensor
/// eps (a rotated crystal: eps_xy != 0) and mu_zz, by duality (E -> eta0 H, eta0 H -> -E,
/// eps <-> mu leaves Maxwell's equations and S = E x H unchanged; Jackson, Classical
/// Electrodynamics, 3rd ed., sec. 6.11): the Ez wave of a medium with eps' = mu_zz, mu' = eps.
/// For a uniaxial crystal with its axis in the plane this is the extraordinary wave.
Refraction hz_refraction(const Mat3c& eps, std::complex<double> mu_zz, int normal, double kt);

}  // namespace ty
