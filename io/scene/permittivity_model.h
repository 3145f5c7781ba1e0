/// \file permittivity_model.h
/// \brief The plain data of a permittivity that disperses and rotates: per principal axis a
/// background, Lorentz oscillators (phonons) and Drude terms (free carriers), and the angle
/// of the first in-plane principal axis. Frequencies in hertz (not rad/s). The physics
/// (eps(omega), the rotated tensor, the time-stepping coefficients) is in
/// materials/permittivity/; this header is here only because the Scene holds it.
///
///   eps(w) = eps_inf + sum_k delta_eps_k w_TO,k^2 / (w_TO,k^2 - w^2 - i w G_k)
///                    - sum_k w_p,k^2 / (w^2 + i w C_k),       w = 2 pi f, fields exp(-i w t)
/// with w_TO = 2 pi f_to, G = 2 pi damping, w_p = 2 pi plasma, C = 2 pi collision
/// (Born & Huang, Dynamical Theory of Crystal Lattices, ch. 2 for the oscillator; Ashcroft
/// & Mermin, Solid State Physics, ch. 1 for the Drude term).
#pragma once
#include <array>
#include <cmath>
#include <vector>

namespace ty {

struct LorentzTerm {
  double f_to = 0;       ///< transverse-optical (resonance) frequency, Hz
  double delta_eps = 0;  ///< oscillator strength: its contribution to the static permittivity
  double damping = 0;    ///< full width G/2pi, Hz
  bool operator==(const LorentzTerm&) const = default;
};

struct DrudeTerm {
  double plasma = 0;     ///< plasma frequency w_p/2pi, Hz
  double collision = 0;  ///< collision rate C/2pi, Hz
  bool operator==(const DrudeTerm&) const = default;
};

struct PermittivityModel {
  double eps_inf = 1;  ///< the background (high-frequency) permittivity
  std::vector<LorentzTerm> lorentz;
  std::vector<DrudeTerm> drude;
  bool dispersive() const { return !lorentz.empty() || !drude.empty(); }
  bool operator==(const PermittivityModel&) const = default;
};

/// Principal axes u, v in the plane (u at `rotate` from x toward y) and z.
struct PermittivityTensor {
  std::array<PermittivityModel, 3> axis;  ///< along u, v, z
  double rotate = 0;                      ///< rad, counter-clockwise
  bool dispersive() const { return axis[0].dispersive() || axis[1].dispersive() || axis[2].dispersive(); }
  /// true when eps_xy = 0 on the grid: no rotation, or u and v alike
  bool diagonal_in_plane() const { return axis[0] == axis[1] || std::fabs(std::sin(2 * rotate)) < 1e-12; }
  /// the model along lab axis c (0 x, 1 y, 2 z) when diagonal_in_plane()
  const PermittivityModel& along(int c) const {
    if (c == 2 || axis[0] == axis[1]) return axis[c];
    return std::fabs(std::cos(rotate)) > 0.5 ? axis[c] : axis[1 - c];
  }
};

/// Single-oscillator Lyddane-Sachs-Teller relation eps(0)/eps_inf = (f_LO/f_TO)^2 (Lyddane,
/// Sachs & Teller, Phys. Rev. 59, 673 (1941)): the strength of an oscillator given by its
/// LO frequency, exact for one undamped oscillator over the background.
inline double strength_from_lo(double eps_inf, double f_to, double f_lo) {
  return eps_inf * (f_lo * f_lo - f_to * f_to) / (f_to * f_to);
}

}  // namespace ty
