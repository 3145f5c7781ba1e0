/// \file cpml.h
/// \brief Convolutional PML profiles along one axis (Roden & Gedney, Microwave Opt.
/// Technol. Lett. 27, 334 (2000); Taflove & Hagness, 3rd ed., sec. 7.9).
///
/// In the layer each derivative d/du becomes (1/kappa) d/du + psi, with the recursive
/// convolution psi^{n+1} = b psi^n + a dF/du,
///   b = exp(-(sigma/kappa + alpha) dt / eps0),  a = sigma (b - 1) / (sigma kappa + kappa^2 alpha).
/// Grading over the depth rho of a layer of thickness d (polynomial order m):
///   sigma = strength * 0.8 (m+1) / (eta0 du) * (rho/d)^m,  kappa = 1 + (kappa_max-1)(rho/d)^m,
///   alpha = alpha_max (1 - rho/d).
/// The solver applies the layer as a correction after the bulk update of a row,
///   F += coef * [(1/kappa - 1) dF + psi],
/// so the bulk loops stay branch-free and the auxiliaries exist only in the layers.
#pragma once
#include <vector>

#include "io/scene/scene.h"

namespace ty {

struct CpmlAxis {
  /// Lines (columns for x, rows for y) that carry auxiliaries, ascending.
  std::vector<int> lines;
  /// Per line, for nodes on the integer positions [0] and on the half-integer ones [1].
  std::vector<double> b[2], a[2], kinv_m1[2];
  int count() const { return static_cast<int>(lines.size()); }
};

/// `n` cells along the axis, `npml` of them absorbing on each side (0: no layer);
/// `cell` the cell size along the axis.
CpmlAxis make_cpml_axis(int n, int npml, double cell, double dt, const Absorber& p);

}  // namespace ty
