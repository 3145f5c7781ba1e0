/// \file llg_linear.h
/// \brief The exact small-signal step of a cell's sublattices: the Landau-Lifshitz-Gilbert
/// equations linearised about the ground state (linear_response.h), written in the tangent
/// plane of each sublattice and integrated exactly over one time step for a wave field that
/// varies linearly between the step's end values, the cell's own reaction included.
///
/// Coordinates: m_s = g_s sqrt(1 - |x_s|^2) + x_s1 e1_s + x_s2 e2_s with (e1_s, e2_s, g_s)
/// orthonormal and g_s the ground state, so |m_s| = 1 exactly for any |x_s| < 1. Projected on
/// the tangent planes (P = E^T, E = [e1 e2] per sublattice) the linearised equations are
///   dx/dt = Lt x + Ct b,   Lt = Q P L E,   Ct = Q P Bm,   Q = [P (I - D) E]^-1.
/// Within the step the field at the cell is
///   b(t) = b0 + (t/h)(b1 - b0) - R K (x(t) - x(0)) - N K x(t):
/// the gathered field interpolated between the step's ends, less the cell's own reaction
/// (R = diag(r), the cell's own share of gather-after-scatter), less a self field N = diag(n)
/// that a cell on the surface of its body sees (the normal component of H jumps there;
/// solver/magnetic_cells.h), K = [mu_1 E_1, mu_2 E_2] the linear change of mu0 M. With
/// A = Lt - Ct (R + N) K this is dx/dt = A x + f0 + (t/h) f1, whose exact solution is
///   x(h) = e^{hA} x(0) + h phi1(hA) f0 + h phi2(hA) f1,  phi1(z) = (e^z - 1)/z,  phi2(z) = (e^z - 1 - z)/z^2
/// (exponential integrators: Hochbruck & Ostermann, Acta Numerica 19, 209 (2010), sec. 2.1),
/// the phi functions read off one exponential of a block matrix (Higham, Functions of
/// Matrices, SIAM 2008, sec. 10.7.4). So one step is a small matrix-vector product:
///   x' = Phi x + Psi0 b0 + Psi1 b1,  Phi = e^{hA} + h phi1 Ct R K,
///   Psi0 = h (phi1 - phi2) Ct,  Psi1 = h phi2 Ct.
/// It has no time-discretization error for the linearised equations: a cell rings at its
/// linear resonances exactly, with exactly their damping, for any gamma mu0 H_E dt. What it
/// leaves out are the terms of second and higher order in x, relatively of the size of the
/// tilt |x_s|; cell_step.h hands a cell to the full midpoint rule (llg_cell.h) beyond a tilt.
#pragma once
#include <algorithm>
#include <array>

#include "materials/magnetic/ground_state.h"

namespace ty {

struct LinearStep {
  int n = 1;                                       ///< sublattices
  double g[2][3] = {}, e1[2][3] = {}, e2[2][3] = {};  ///< ground state and tangent basis
  double mu[2] = {0, 0};                           ///< mu0 Ms per sublattice, T
  double phi[4][4] = {};                           ///< x' = phi x + psi0 b0 + psi1 b1
  double psi0[4][3] = {}, psi1[4][3] = {};
  /// for the large-tilt path (llg_exponential.h): dx/dt = A x + Ct b' of the linearised
  /// equations, and h phi1(hA)
  double a[4][4] = {}, ct[4][3] = {}, hphi1[4][4] = {};

  /// The step over dt about `ground`, with the cell's own reaction weights r (0 for a
  /// prescribed field) and its self field N = diag(self) (0 inside a body).
  static LinearStep from(const MagnetModel& model, const MagneticState& ground, double dt,
                         const std::array<double, 3>& r, const std::array<double, 3>& self = {0, 0, 0});
};

/// The coefficients of one medium's small-signal step as plain local arrays (a local object,
/// so that a loop over cells that holds one vectorizes), and the step of one cell: the one
/// copy of that arithmetic, used by linear_cells and the solver's fused row
/// (solver/media/magnetic_run.h).
template <int N>
struct LinearLocal {
  static constexpr int T = 2 * N;
  double phi[T][T], psi0[T][3], psi1[T][3], g[N][3], e1[N][3], e2[N][3], mu[N];
  explicit LinearLocal(const LinearStep& p) {
    for (int i = 0; i < T; ++i)
      for (int c = 0; c < 3; ++c) psi0[i][c] = p.psi0[i][c], psi1[i][c] = p.psi1[i][c];
    for (int i = 0; i < T; ++i)
      for (int j = 0; j < T; ++j) phi[i][j] = p.phi[i][j];
    for (int s = 0; s < N; ++s) {
      for (int c = 0; c < 3; ++c) g[s][c] = p.g[s][c], e1[s][c] = p.e1[s][c], e2[s][c] = p.e2[s][c];
      mu[s] = p.mu[s];
    }
  }
  /// o: m1 xyz, m2 xyz now; f: b0 xyz, b1 xyz. Out: the new m (n), the change of mu0 M (d);
  /// returns the largest squared sublattice tilt |x_s|^2 before or after the step.
  __attribute__((always_inline)) double cell(const double* o, const double* f, double* n, double* d) const {
    double x[T], y[T];
    for (int s = 0; s < N; ++s) {
      x[2 * s] = e1[s][0] * o[3 * s] + e1[s][1] * o[3 * s + 1] + e1[s][2] * o[3 * s + 2];
      x[2 * s + 1] = e2[s][0] * o[3 * s] + e2[s][1] * o[3 * s + 1] + e2[s][2] * o[3 * s + 2];
    }
    for (int i = 0; i < T; ++i) {
      double v = 0;
      for (int c = 0; c < 3; ++c) v += psi0[i][c] * f[c] + psi1[i][c] * f[3 + c];
      for (int j = 0; j < T; ++j) v += phi[i][j] * x[j];
      y[i] = v;
    }
    double worst = 0;
    for (int c = 0; c < 6; ++c) n[c] = 0;
    for (int c = 0; c < 3; ++c) d[c] = 0;
    for (int s = 0; s < N; ++s) {
      const double q0 = x[2 * s] * x[2 * s] + x[2 * s + 1] * x[2 * s + 1];
      const double q1 = y[2 * s] * y[2 * s] + y[2 * s + 1] * y[2 * s + 1];
      worst = std::max(worst, std::max(q0, q1));
      // sqrt(1 - q1), to 1e-25 where the step is kept (q1 <= 1e-8, cell_step.h); beyond, the
      // result is only the midpoint rule's predictor
      const double r = 1.0 - 0.5 * q1 - 0.125 * q1 * q1;
      for (int c = 0; c < 3; ++c) {
        n[3 * s + c] = g[s][c] * r + y[2 * s] * e1[s][c] + y[2 * s + 1] * e2[s][c];
        d[c] += mu[s] * (n[3 * s + c] - o[3 * s + c]);
      }
    }
    return worst;
  }
};

/// The linear step of cells [0, count): m (6 components, unit vectors), b0 and b1 the wave
/// field (T, without the bias) at the step's start and end. Out: the new m (mn), the change
/// of mu0 M (dm, T), and per cell the largest squared sublattice tilt |x_s|^2 before or
/// after the step (x2).
template <int N>
inline void linear_cells(const LinearStep& p, long count, const double* const* m, const double* const* b0,
                         const double* const* b1, double* const* mn, double* const* dm, double* x2) {
  const LinearLocal<N> L(p);
  const double *m0 = m[0], *m1 = m[1], *m2 = m[2], *m3 = m[3], *m4 = m[4], *m5 = m[5];
  const double *a0 = b0[0], *a1 = b0[1], *a2 = b0[2], *c0 = b1[0], *c1 = b1[1], *c2 = b1[2];
  double *n0 = mn[0], *n1 = mn[1], *n2 = mn[2], *n3 = mn[3], *n4 = mn[4], *n5 = mn[5];
  double *d0 = dm[0], *d1 = dm[1], *d2 = dm[2];
#pragma omp simd
  for (long l = 0; l < count; ++l) {
    const double o[6] = {m0[l], m1[l], m2[l], N == 2 ? m3[l] : 0.0, N == 2 ? m4[l] : 0.0, N == 2 ? m5[l] : 0.0};
    const double f[6] = {a0[l], a1[l], a2[l], c0[l], c1[l], c2[l]};
    double n[6], d[3];
    x2[l] = L.cell(o, f, n, d);
    n0[l] = n[0], n1[l] = n[1], n2[l] = n[2], n3[l] = n[3], n4[l] = n[4], n5[l] = n[5];
    d0[l] = d[0], d1[l] = d[1], d2[l] = d[2];
  }
}

}  // namespace ty
