/// \file ade.h
/// \brief Time stepping of a dispersive permittivity by auxiliary differential equations
/// (ADE; Taflove & Hagness, Computational Electrodynamics, 3rd ed., ch. 9), in the
/// trapezoidal (Crank-Nicolson) form. Each pole k carries p = P_k/eps0 and its rate j = dp/dt,
///   dp/dt = j,   dj/dt = -G j - w0^2 p + W^2 E
/// (Lorentz: w0 = w_TO, W^2 = delta_eps w_TO^2; Drude: w0 = 0, W^2 = w_p^2), and the E node obeys
///   eps_inf (E' - E) + sum_k (p_k' - p_k) = c dt curl(eta0 H)^{n+1/2} - (sigma dt/2 eps0)(E' + E).
/// All of p, j and E are taken at whole steps and every right-hand side is averaged over
/// n and n+1 (a = dt/2):
///   j' = c1 j + c2 p + c3 (E' + E),  p' = p + a (j' + j),
///   D = 1 + a G + a^2 w0^2,  c1 = (1 - a G - a^2 w0^2)/D,  c2 = -2 a w0^2/D,  c3 = a W^2/D,
/// and E' follows from one scalar equation per node:
///   E' = ca E + cb c dt curl(eta0 H) - corr sum_k [(1 + c1) j + c2 p],
///   k+- = eps_inf +- a (sigma/eps0 + sum_k c3),  ca = k-/k+,  cb = 1/k+,  corr = a/k+.
/// The scheme is the bilinear (Tustin) transform of eps: at real omega the grid's medium is
/// exactly eps(W_d) with W_d = (2/dt) tan(omega dt/2), so it is second order (W_d/omega - 1 =
/// (omega dt)^2/12 + ...), stays passive (Im eps(W_d) >= 0 wherever Im eps >= 0) and adds no
/// step limit of its own: the oscillators are stable for any w0 dt, also above 2, where the
/// explicit central-difference form diverges. Tested in tests/materials/permittivity/.
#pragma once
#include <complex>
#include <vector>

#include "io/scene/permittivity_model.h"

namespace ty {

struct AdePole {
  double c1 = 0, c2 = 0, c3 = 0;
};

/// The energy one pole holds, per unit volume over eps0 (V^2/m^2), from its state p, j = dp/dt.
/// The pole p'' + G p' + w0^2 p = W^2 E takes the power eps0 E p' = d/dt [eps0 (p'^2 + w0^2 p^2) /
/// (2 W^2)] + eps0 G p'^2 / W^2 (the driven oscillator's energy: Jackson, Classical
/// Electrodynamics, 3rd ed., secs. 7.5 and 7.10; Drude: w0 = 0). W^2 and w0^2 come back from the
/// coefficients with a = dt/2 = half_dt: 1 + c1 = 2/D, c2 = -2 a w0^2/D, c3 = a W^2/D.
inline double pole_energy(const AdePole& q, double half_dt, double p, double j) {
  const double D = 2 / (1 + q.c1), W2 = q.c3 * D / half_dt, w02 = -q.c2 * D / (2 * half_dt);
  return W2 > 0 ? (j * j + w02 * p * p) / (2 * W2) : 0.0;
}

/// One pole: natural angular frequency w0 (0 for Drude), strength W^2 (rad^2/s^2), damping G (1/s).
AdePole ade_pole(double w0, double strength, double damping, double dt);

/// The poles of a model, each strength multiplied by `weight` (the model's share of the node's cell).
void append_poles(const PermittivityModel& m, double weight, double dt, std::vector<AdePole>& out);

struct AdeNode {
  double ca = 1, cb = 1, corr = 0;
};
/// The node's coefficients from its (cell-averaged) background, conductivity and sum of c3.
AdeNode ade_node(double eps_inf, double sigma, double sum_c3, double dt);

/// The permittivity the scheme realises at omega: eps at the warped frequency (2/dt) tan(omega dt/2).
std::complex<double> ade_permittivity(const PermittivityModel& m, double omega, double dt);

}  // namespace ty
