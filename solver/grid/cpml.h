/// \file cpml.h
/// \brief The absorbing layers along one axis: the convolutional PML (Roden & Gedney,
/// Microwave Opt. Technol. Lett. 27, 334 (2000); Taflove & Hagness, 3rd ed., sec. 7.9) or,
/// side by side, the graded loss of graded_loss.h.
///
/// In a PML side each derivative d/du becomes (1/kappa) d/du + psi, with the recursive
/// convolution psi^{n+1} = b psi^n + a dF/du,
///   b = exp(-(sigma/kappa + alpha) dt / eps0),  a = sigma (b - 1) / (sigma kappa + kappa^2 alpha).
/// Grading over the depth rho of a layer of thickness d (polynomial order m):
///   sigma = strength * 0.8 (m+1) / (eta0 du) * (rho/d)^m,  kappa = 1 + (kappa_max-1)(rho/d)^m,
///   alpha = alpha_max (1 - rho/d).
/// The solver applies the layer as a correction after the bulk update of a row,
///   F += coef * [(1/kappa - 1) dF + psi],
/// so the bulk loops stay branch-free and the auxiliaries exist only in the layers.
/// A graded side has no stretch (b = 1, a = 0, 1/kappa - 1 = 0) and instead a decay factor
/// per line that the solver applies to every node there before and after its update.
#pragma once
#include <vector>

#include "io/scene/scene.h"

namespace ty {

struct CpmlAxis {
  /// Lines (columns for x, rows for y) that carry auxiliaries, ascending.
  std::vector<int> lines;
  /// Per line, for nodes on the integer positions [0] and on the half-integer ones [1].
  std::vector<double> b[2], a[2], kinv_m1[2];
  /// Per line: the graded loss's decay over half a step, exp(-nu dt / 2) (1 on PML sides).
  std::vector<double> decay[2];
  bool graded[2] = {false, false};  ///< the low and the high side carry the graded loss
  /// Stretches of consecutive lines: stretch s is lines [stretch[s], stretch[s + 1]) (one a
  /// side's layer), so that a row's loop over them is a vector loop.
  std::vector<int> stretch;
  int count() const { return static_cast<int>(lines.size()); }
  bool any_graded() const { return graded[0] || graded[1]; }
  bool any_pml() const { return count() > 0 && !(graded[0] && graded[1]); }
};

/// `n` cells along the axis, `npml` of them absorbing on each side (0: no layer);
/// `cell` the cell size along the axis; graded_low / graded_high: that side takes the
/// graded loss instead of the PML.
CpmlAxis make_cpml_axis(int n, int npml, double cell, double dt, const Absorber& p, bool graded_low = false,
                        bool graded_high = false);

}  // namespace ty
