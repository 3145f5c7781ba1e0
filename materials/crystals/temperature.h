/// \file temperature.h
/// \brief Temperature laws of a magnet's values (the `thermal` data of io/scene/scene.h).
///
/// Sublattice magnetization: the mean-field (Weiss) law m = B_S(3S/(S+1) m T_N/T), with B_S
/// the Brillouin function (Kittel, Introduction to Solid State Physics, 8th ed., ch. 11,
/// eq. 11.11 and problem 11.7 (from memory); Ashcroft & Mermin ch. 33). With the molecular-
/// field constant lambda fixed, the exchange field lambda*Ms and the Dzyaloshinskii field
/// (energy ~ M1 M2) scale like m. The anisotropy energy follows the Callen-Callen power law
/// K(T)/K(0) = m^(l(l+1)/2) (Callen & Callen, J. Phys. Chem. Solids 27, 1271 (1966)), = m^3
/// for l = 2, so its field K/Ms scales as m^(power-1). Values are given at `reference`, so
/// every ratio is m(T)/m(reference).
#pragma once
#include "io/scene/scene.h"

namespace ty {

/// The Brillouin function B_S(x).
double brillouin(double spin, double x);
/// The mean-field reduced magnetization m(T)/m(0) at t = T/T_N (1 at 0, 0 from 1 up).
double mean_field_magnetization(double spin, double t);

struct ThermalScale {
  double magnetization = 1;  ///< Ms(T)/Ms(ref); also the exchange and DM fields' factor
  double anisotropy = 1;     ///< B_A(T)/B_A(ref)
};
ThermalScale thermal_scale(const Thermal& th);

/// The full width at half maximum of the zero-field line at th.temperature, Hz, from the
/// table th.linewidth (K, Hz): straight lines between its points, its end values held
/// beyond them. 0 without a table.
double thermal_linewidth(const Thermal& th);

/// The Gilbert damping that gives a two-sublattice uniaxial antiferromagnet's zero-field line
/// the width `fwhm` (Hz): linearising the LLG equation about the collinear state gives the
/// modes exp(-i w t - G t) with G = alpha gamma (B_E + B_A) / (1 + alpha^2) (the exchange-
/// enhanced width, with the 1 + alpha^2 of Gilbert's form as for one sublattice; derived, as
/// in Gurevich & Melkov, Magnetization Oscillations and Waves (CRC 1996), ch. 1; to O(B_A/B_E)
/// against the model's damped modes, checked in test_linewidth.cpp), and the line's full width
/// is 2G/2pi. The smaller root in alpha; 1 where no alpha gives the width.
double damping_from_linewidth(double fwhm, double gamma, double b_exchange, double b_anisotropy);

}  // namespace ty
