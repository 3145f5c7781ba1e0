/// \file slab_transfer.h
/// \brief The transmission and reflection of a homogeneous slab at normal incidence, in the
/// convention fields ~ exp(-i omega t) (so a lossy medium has n = n' + i kappa, kappa > 0).
/// The slab (thickness d, index n, relative impedance z = sqrt(mu/eps), both with their
/// principal branches chosen by the caller) sits in vacuum; q = n k0 d.
///   t_slab = 1 / [cos q - (i/2)(z + 1/z) sin q],  r_slab = -(i/2)(z - 1/z) sin q * t_slab
/// (the Airy formula, Born & Wolf, Principles of Optics, sec. 7.6; in this form Smith,
/// Schultz, Markos & Soukoulis, Phys. Rev. B 65, 195104 (2002), eq. 1-2). t_slab is the field
/// at the back face over the incident field at the front face; r_slab is referred to the front
/// face. The same t_slab split into its interfaces and echoes (Duvillaret, Garet & Coutaz,
/// IEEE J. Sel. Top. Quantum Electron. 2, 739 (1996), eq. 1-3):
///   t_slab = [4z / (1+z)^2] e^{iq} FP,  FP = 1 / (1 - ((1-z)/(1+z))^2 e^{2iq})
/// and a time-domain measurement against a reference run (the same path in vacuum) sees
///   H(omega) = t_slab e^{-i k0 d}.
/// With the echoes cut off by a time window, FP is left out (`echoes = false`).
/// The Fresnel reflection of a half-space at normal incidence, for the transverse E field:
///   r = (z - 1) / (z + 1)  (Born & Wolf sec. 1.5.2; z = 1/n for a dielectric).
#pragma once
#include <complex>

namespace ty {

using cplx = std::complex<double>;

/// The Airy t and r of a slab: n, z, k0 = omega/c, d.
cplx slab_t(cplx n, cplx z, double k0, double d);
cplx slab_r(cplx n, cplx z, double k0, double d);
/// The same t_slab from interfaces and echoes; without echoes only the first pass.
cplx slab_t_echoes(cplx n, cplx z, double k0, double d, bool echoes);
/// H(omega) = t_slab e^{-i k0 d}: sample over reference at one point behind the slab.
cplx slab_transfer(cplx n, cplx z, double k0, double d, bool echoes);
/// Fresnel r of a half-space at normal incidence.
cplx fresnel_r(cplx z);

}  // namespace ty
