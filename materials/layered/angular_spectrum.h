/// \file angular_spectrum.h
/// \brief Beams and sources through a layer stack, summed over their plane-wave (angular)
/// spectra with the 4x4 transfer matrix (transfer_matrix.h): the lateral shift of a
/// reflected Gaussian beam, and the field and focus of a line source behind a slab.
///
/// - Stationary-phase (Artmann) shift D = -d(phi)/dk_t of the co-polarized reflection
///   (Artmann, Ann. Phys. 437, 87 (1948)), and the shift of a Gaussian beam of waist w as
///   the centroid of its reflected spectrum, D = -sum A^2 |r|^2 dphi/dk_t / sum A^2 |r|^2,
///   which stays finite where the stationary phase fails near resonances; measured on a line
///   before the interface the centroid also drifts with the reflected beam's mean angle.
/// - A line current (a point in 2D) at distance a before the stack radiates
///   Ez ~ H0^(1)(k0 r) = (1/pi) int exp(i(kx x + ky |y|)) / ky dkx (the Sommerfeld-Weyl
///   expansion; e.g. Chew, Waves and Fields in Inhomogeneous Media, sec. 2.2); behind the
///   stack each plane wave carries the stack's transmission t(kx), so
///   Ez(x, s) ~ int t(kx) exp(i ky (a + s)) exp(i kx x) / ky dkx, s the distance behind the
///   exit face. The path runs a little below the real axis for kx > 0 and above it for
///   kx < 0 (kx = xi - i 0.1 k0 sin(pi xi / K)), clear of the branch points +-k0 and of the
///   poles of the slab's guided waves, which for a passive slab lie on the other side
///   (the usual deformation of Sommerfeld integrals; Chew, sec. 2.6).
///   The paraxial image distance follows from the curvature of the normal wavenumber:
///   b = d k0 Re(kn''(0)) - a (for mu = diag(mu_t, mu_n): b = -Re(sqrt(mu_t/eps)/mu_n) d - a).
#pragma once
#include <complex>
#include <vector>

#include "materials/layered/transfer_matrix.h"

namespace ty {

/// -dphi/dk_t (m) of the co-polarized reflection of polarization p at angle theta.
double artmann_shift(const LayerStack& s, double omega, double theta, int p);
/// Lateral shift (m) of a reflected Gaussian beam of waist w (1/e field radius, focused on
/// the interface), as the intensity centroids show it on a line a distance h before the
/// face: the reflected centroid less that of the same beam's specular image (the incident
/// spectrum reflected by a perfect mirror on the face, as io/analysis/shift.h measures it).
/// The beam is the one the scene's sources launch, A(q) ~ exp(-q^2 w^2/4) over the
/// transverse wavenumber q of its own frame (solver/incident.h); the centroids along the
/// line follow from Parseval's theorem with weights |F|^2 per unit k_t, |F|^2 = |A|^2
/// dq/dk_t (incident and image) and |F r|^2 (reflected):
///   D(h) = -<dphi/dk_t>_r + h (<tan theta>_r - <tan theta>_i),
/// the second term the angular drift a reflection that favours some angles gives the beam
/// (zero for a perfect mirror; for a real r only this term, the spatial shift being 0). The
/// image itself lies at the incident centroid + 2 h <tan theta>_i, not + 2 h tan(theta): a
/// diverging beam's angles average to more than the axis's.
double beam_shift(const LayerStack& s, double omega, double theta, int p, double w, double h = 0);

struct LineImage {
  double paraxial = 0;                 ///< paraxial image distance behind the exit face, m (single layer)
  double peak = 0;                     ///< axial intensity maximum behind the exit face, m
  double fwhm_across = 0, fwhm_along = 0;  ///< full widths at half maximum of |Ez|^2 there, m
  std::vector<double> s, intensity;    ///< the axial profile (distance behind the face, |Ez|^2 relative)
};

/// The Ez line source at distance a before the stack (its axis the stack's normal), its
/// axial intensity over distances [from, to] behind the exit face and the focus there (the
/// largest intensity in that stretch).
LineImage line_source_image(const LayerStack& s, double omega, double a, double from, double to);

}  // namespace ty
