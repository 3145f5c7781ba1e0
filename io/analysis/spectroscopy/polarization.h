/// \file polarization.h
/// \brief Jones matrices of a sample in the (Ez-wave, Hz-wave) basis and the rotation and
/// ellipticity of the light it sends on.
///
/// Basis, for a wave travelling along the unit vector k: the Ez wave's field is along z;
/// the Hz wave's electric field lies in the plane, along u = z x k (so (u, z, k) is
/// right-handed: for k = +y, u = -x; for k = +x, u = +y). A Jones vector is (E.z, E.u).
/// J[out][in]: the complex amplitude of polarization `out` in the sample run over the incident
/// amplitude of polarization `in` in that polarization's reference run:
///   J = [[t_zz, t_zu], [t_uz, t_uu]]  (0: z, 1: u).
///
/// Rotation and ellipticity of an output vector E for an input polarized along a: let b be
/// a turned by +90 degrees counterclockwise as seen by an observer facing the oncoming wave
/// (b = k x a: for a = z, b = -u; for a = u, b = z), rho = E.b / E.a. Then
///   theta = (1/2) atan2(2 Re rho, 1 - |rho|^2)  (the major axis, from a towards b)
///   eta   = (1/2) asin(2 Im rho / (1 + |rho|^2)) (tan eta = minor/major axis)
/// (Azzam & Bashara, Ellipsometry and Polarized Light, sec. 1.7, with their exp(+i omega t)
/// turned into exp(-i omega t), which flips the sign of Im rho: here eta > 0 is a field
/// that turns counterclockwise for that observer). Faraday rotation is theta of the
/// transmitted wave, Kerr rotation that of the reflected wave: its k is reversed, so its b
/// is -(k x a) and the signs of rho, theta and eta turn over.
#pragma once
#include <array>
#include <complex>

namespace ty {

using Jones = std::array<std::array<std::complex<double>, 2>, 2>;

struct PolarizationState {
  double theta = 0, eta = 0;  ///< rad
};

/// The state of output (E_a, E_b), components along the input a and along b = k x a.
PolarizationState rotation_ellipticity(std::complex<double> E_a, std::complex<double> E_b);

/// The state of the column `in` of J (0: an Ez-wave input, 1: an Hz-wave input); reflected:
/// J is a reflection matrix (the wave travels along -k).
PolarizationState jones_rotation(const Jones& J, int in, bool reflected = false);

}  // namespace ty
