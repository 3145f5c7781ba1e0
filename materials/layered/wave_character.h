/// \file wave_character.h
/// \brief What kind of wave a medium carries in the 2D grid, from the same dispersion
/// relations that give the refraction angle (refraction.h), for any permeability and
/// permittivity tensor (any bias, any crystal axes).
///
/// Iso-frequency curve of the Ez wave (H in the plane): with nu = (mu_inplane)^-1,
///   nu_yy kx^2 + nu_xx ky^2 - (nu_xy + nu_yx) kx ky = eps_zz k0^2          (refraction.h)
/// a real quadratic form in (kx, ky) where the medium is lossless (nu Hermitian, so
/// nu_xy + nu_yx = 2 Re nu_xy). Its signature decides the curve: both eigenvalues of the
/// form, divided by eps_zz, positive: an ellipse; of opposite signs: a hyperbola; both
/// negative: no real k in any direction (evanescent everywhere). For the gyrotropic tensor
/// of a bias along z (Polder: mu_xx = mu_yy = mu, mu_xy = -mu_yx = -i kappa) the form is
/// (kx^2 + ky^2) mu / (mu^2 - kappa^2), a circle of radius^2 eps mu_perp k0^2 with
/// mu_perp = (mu^2 - kappa^2) / mu: the extraordinary wave across the bias (Pozar, Microwave
/// Engineering, 4th ed., sec. 9.3; Gurevich & Melkov, Magnetization Oscillations and
/// Waves, sec. 1.6), so the sign of mu_perp = mu_V, not of mu, decides.
/// The Hz wave (E in the plane) is the same with eps_inplane and mu_zz exchanged (duality).
///
/// Normal incidence, any tensors: with k = k n, the conditions B_n = 0 and D_n = 0 remove
/// H_n and E_n, leaving the transverse 2x2 tensors over (t, z), t = z x n:
///   M_ab = mu_ab - mu_an mu_nb / mu_nn,   P_ab = eps_ab - eps_an eps_nb / eps_nn,
/// and Maxwell's curl equations k n x E = w mu0 M H, k n x H = -w eps0 P E give
///   (k/k0)^2 H = Q H,   Q = -J P J M,   J = [[0, -1], [1, 0]] (n x acting on (t, z)).
/// For a bias along z, Q = diag(eps_zz mu_V, eps_tt mu_zz): the Ez and Hz waves apart. For a
/// bias along the normal (Faraday geometry) M = [[mu, mu_tz], [-mu_tz, mu]] and the two
/// eigenvalues are eps (mu -+ kappa): the circularly polarized waves of Pozar sec. 9.2
/// (beta_+- = k0 sqrt(eps (mu -+ kappa))), so mu_tz, not mu_V, matters there.
#pragma once
#include <array>
#include <complex>
#include <string>

#include "materials/layered/refraction.h"

namespace ty {

enum class IsoCurve { ellipse, hyperbola, none };
/// "ellipse", "hyperbola", "evanescent" (no real branch).
const char* iso_curve_name(IsoCurve c);

/// The Ez wave's iso-frequency curve in the plane (real parts of the tensors: the lossless medium).
IsoCurve ez_iso_curve(std::complex<double> eps_zz, const Mat3c& mu);
/// The Hz wave's iso-frequency curve (eps in-plane block, mu_zz).
IsoCurve hz_iso_curve(const Mat3c& eps, std::complex<double> mu_zz);

/// Whether the transmitted wave of a Refraction carries its phase along the normal more than it
/// decays: |Re kn| > |Im kn| (lossless: kn real, or imaginary for an evanescent wave).
bool is_propagating(const Refraction& r);
/// The 1/e length of the field along the normal, in units of 1/k0: 1 / |Im kn| (infinite if 0).
double decay_length(const Refraction& r);

/// The two waves of normal incidence on an interface with normal `normal` (0: x, 1: y).
struct NormalModes {
  Eigen::Matrix2cd Q;                      ///< (k/k0)^2 H = Q H over (H_t, H_z)
  std::array<std::complex<double>, 2> n2;  ///< the eigenvalues of Q: (k/k0)^2 of each wave
  bool coupled = false;                    ///< Q has off-diagonal terms: the Ez and Hz waves mix
};
/// Decoupled (bias and axes keep the z mirror), n2[0] is the Ez wave (H_t: eps_zz M_tt, M_tt = mu_V)
/// and n2[1] the Hz wave (eps_tt-type P, mu_zz-type M); coupled, n2 are in ascending real part.
NormalModes normal_modes(const Mat3c& eps, const Mat3c& mu, int normal);

}  // namespace ty
