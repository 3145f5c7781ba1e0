/// \file graded_loss.h
/// \brief The graded-loss absorber: a loss on E and H ramped slowly over the layer, with no
/// coordinate stretch, so that nothing in the layer can amplify.
///
/// Why not a PML everywhere: a PML damps a wave whose phase moves into the layer and
/// amplifies one whose phase moves out while its energy moves in -- the backward waves of
/// hyperbolic and negative-permeability bands (Becache, Fauqueux & Joly, J. Comput. Phys.
/// 188, 399 (2003): the PML is stable only where group and phase velocities agree in sign
/// along the layer's normal; Loh, Oskooi, Ibanescu, Skorobogatiy & Johnson, Phys. Rev. E 79,
/// 065601 (2009)). A plain loss never amplifies: with a rate nu >= 0 on both fields,
///   dE/dt = (curl H)/eps - nu E,   dH/dt = -(curl E)/mu0 - dM/dt - nu H,
/// the energy of the fields and the magnets can only fall (dW/dt = -nu (eps E^2 + mu0 H^2)
/// - Gilbert loss), whatever eps and the magnets' response. The same rate on E and H is the
/// matched layer of every non-magnetic medium (sigma/eps = sigma*/mu): no reflection at
/// normal incidence in the continuum, for any profile. In a magnet the loss on H alone gives
/// mu(omega) + i nu/omega where matching wants mu(omega)(1 + i nu/omega): a mismatch of
/// (mu - 1) nu / omega that the slow ramp keeps small. Loss matched to mu itself (on B) is
/// active wherever mu < 0, and a decay of the magnets' deviation too (the whole state times
/// exp(-nu t), a complex frequency) shifts their lines by i nu, far more: measured in the
/// MnF2 half-space test at 20 um cells, 40 cells, R error off the band 0.044 against 0.0077.
/// Elsewhere (oblique incidence, the grid) the layer reflects as a taper does: the slower the
/// ramp, the less, the reflection falling as a power of the thickness for a smooth profile
/// (Oskooi, Zhang, Avniel & Johnson, Opt. Express 16, 11376 (2008), sec. 3), so a graded
/// layer is counted in wavelengths of the medium (absorber_cells in io/scene/scene.h).
///
/// Profile over the depth rho (0 .. 1 across the layer, thickness L):
///   nu(rho) = nu_max rho^m,   nu_max = strength * N (m + 1) c / (2 L)
/// so that a wave at normal incidence in vacuum returns from the outer wall attenuated by
/// exp(-N) in amplitude (the round trip through the layer: 2 int nu / c dx = N); a medium of
/// index n attenuates n times more. N = kGradedNepers: a weaker loss ramps more gently (R
/// error off the band at 20 um, 40 cells: 0.0077 with N = 16, 0.0046 with N = 8).
///
/// On the grid: each node of the layer is multiplied by exp(-nu dt / 2) before its update
/// and again after it (a symmetric split: with nu uniform the step is exactly the lossless
/// step times exp(-nu dt), its dispersion and impedance unchanged), E at its own node and
/// time, H at its own; each factor is at most one, so the product can only lose energy.
#pragma once
#include <cmath>

#include "io/scene/constants.h"
#include "io/scene/scene.h"

namespace ty {

/// Round-trip attenuation of the graded layer at normal incidence in vacuum, nepers.
inline constexpr double kGradedNepers = 8.0;

/// nu_max (1/s) of a graded layer of thickness L (m).
inline double graded_loss_peak(const Absorber& p, double L) {
  return p.strength * kGradedNepers * (p.grading + 1) * constants::c0 / (2 * L);
}

/// nu (1/s) at depth rho (0 .. 1).
inline double graded_loss_rate(double nu_max, double rho, double m) { return nu_max * std::pow(rho, m); }

}  // namespace ty
