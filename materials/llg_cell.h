/// \file llg_cell.h
/// \brief One time step of the sublattice magnetizations of one cell: the implicit
/// midpoint rule for the Landau-Lifshitz-Gilbert equation, solved by fixed-point
/// iteration, each iterate an exact Cayley rotation so that |m_s| = 1 to round-off
/// whatever the number of iterations.
///
/// Written as a rotation, dm/dt = w x m with w = gamma' (B_eff + alpha m x B_eff),
/// gamma' = gamma / (1 + alpha^2) (the Landau-Lifshitz form of the Gilbert equation).
/// The implicit midpoint rule m' - m = dt w(m_bar) x m_bar, m_bar = (m + m')/2
/// (d'Aquino, Serpico & Miano, J. Comput. Phys. 209, 730 (2005)) is, for a given w,
/// m' - m = a x (m + m') with a = dt w / 2, whose solution is the Cayley rotation
///   m' = m + 2/(1 + a.a) (a x m + a x (a x m)).
/// w is re-evaluated at the midpoint of the latest iterate; the wave field there is
/// interpolated in time between the step's end values, less r (.) dM, dM the cell's own
/// change of mu0*M so far: the part of the field that the magnetization takes back within
/// the step (B = mu0 (H + M) is what Faraday's law advances), r = 0 for a prescribed field.
#pragma once
#include <cmath>

#include "materials/magnet.h"

namespace ty {

/// Per-medium constants of the cell step (plain numbers, so the loop over cells inlines).
struct LlgCoefficients {
  int n = 1;
  double mu[2] = {0, 0};
  double gp[2] = {0, 0};     ///< gamma / (1 + alpha^2)
  double alpha[2] = {0, 0};
  double lambda = 0, mu_d = 0;
  double bd[3] = {0, 0, 0};
  double bias[3] = {0, 0, 0};
  int na = 0;
  double axis[4][3] = {};
  double ba[4] = {};
  double dt = 0;
  int substeps = 1;     ///< midpoint sub-steps per time step
  int iterations = 30;  ///< most fixed-point iterations per sub-step (they stop when converged)
  /// Sub-steps are chosen so that the midpoint rule's phase error (w_max h)^2/12 stays
  /// below `phase_error` for the highest linear resonance w_max of the ground state, and
  /// the fixed-point iteration contracts by at least 4 per pass ((h/2) gamma B_scale < 1/4).
  static LlgCoefficients from(const MagnetModel& m, double dt, double f_max, double phase_error = 6e-5);
};

namespace llg_detail {

inline void effective_field(const LlgCoefficients& p, int s, const double (*m)[3], const double* b, double* h) {
  for (int c = 0; c < 3; ++c) h[c] = p.bias[c] + b[c];
  for (int k = 0; k < p.na; ++k) {
    const double d = p.ba[k] * (m[s][0] * p.axis[k][0] + m[s][1] * p.axis[k][1] + m[s][2] * p.axis[k][2]);
    for (int c = 0; c < 3; ++c) h[c] += d * p.axis[k][c];
  }
  if (p.n == 2) {
    const int t = 1 - s;
    for (int c = 0; c < 3; ++c) h[c] -= p.lambda * p.mu[t] * m[t][c];
    const double f = p.mu_d / p.mu[s];
    const double* a = s == 0 ? p.bd : m[0];  // B_DM,1 = f B_D x m2 ; B_DM,2 = f m1 x B_D
    const double* c = s == 0 ? m[1] : p.bd;
    h[0] += f * (a[1] * c[2] - a[2] * c[1]);
    h[1] += f * (a[2] * c[0] - a[0] * c[2]);
    h[2] += f * (a[0] * c[1] - a[1] * c[0]);
  }
}

inline void cayley(const double* a, const double* m, double* out) {
  const double f = 2.0 / (1.0 + a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
  const double b0 = a[1] * m[2] - a[2] * m[1], b1 = a[2] * m[0] - a[0] * m[2], b2 = a[0] * m[1] - a[1] * m[0];
  const double d0 = a[1] * b2 - a[2] * b1, d1 = a[2] * b0 - a[0] * b2, d2 = a[0] * b1 - a[1] * b0;
  out[0] = m[0] + f * (b0 + d0);
  out[1] = m[1] + f * (b1 + d1);
  out[2] = m[2] + f * (b2 + d2);
}

}  // namespace llg_detail

/// One implicit-midpoint sub-step over [t0, t0 + h] of the step [0, dt]. The wave field
/// at time t is b_old + (t/dt)(b_new - b_old) - r (.) (M(t) - M(0)): linear between the
/// step's end values, less the cell's own reaction (r = 0 for a prescribed field).
/// `guess` is the predicted change of each m over the sub-step (the previous sub-step's).
/// Iterates until the midpoint stops moving (1e-14) or `iterations` is reached.
inline void llg_substep(const LlgCoefficients& p, double t0, double h, const double* b_old, const double* b_new,
                        const double* r, const double* dM0, double (*m)[3], double (*guess)[3], double* dM) {
  using namespace llg_detail;
  double m0[2][3], mb[2][3] = {}, mn[2][3] = {};
  for (int s = 0; s < p.n; ++s)
    for (int c = 0; c < 3; ++c) {
      m0[s][c] = m[s][c];
      mn[s][c] = m[s][c] + guess[s][c];
      mb[s][c] = m[s][c] + 0.5 * guess[s][c];
    }
  const double u = (t0 + 0.5 * h) / p.dt;  // midpoint of the sub-step, in units of the step
  double dn[3] = {dM0[0], dM0[1], dM0[2]};
  for (int s = 0; s < p.n; ++s)
    for (int c = 0; c < 3; ++c) dn[c] += p.mu[s] * guess[s][c];
  for (int it = 0; it < p.iterations; ++it) {
    double b[3];
    for (int c = 0; c < 3; ++c) b[c] = b_old[c] + u * (b_new[c] - b_old[c]) - r[c] * 0.5 * (dM0[c] + dn[c]);
    for (int s = 0; s < p.n; ++s) {
      double f[3];
      effective_field(p, s, mb, b, f);
      const double* x = mb[s];
      const double cx = x[1] * f[2] - x[2] * f[1], cy = x[2] * f[0] - x[0] * f[2], cz = x[0] * f[1] - x[1] * f[0];
      const double k = 0.5 * h * p.gp[s];
      const double a[3] = {k * (f[0] + p.alpha[s] * cx), k * (f[1] + p.alpha[s] * cy), k * (f[2] + p.alpha[s] * cz)};
      cayley(a, m0[s], mn[s]);
    }
    double moved = 0;
    for (int c = 0; c < 3; ++c) dn[c] = dM0[c];
    for (int s = 0; s < p.n; ++s)
      for (int c = 0; c < 3; ++c) {
        const double v = 0.5 * (m0[s][c] + mn[s][c]);
        moved = std::max(moved, std::abs(v - mb[s][c]));
        mb[s][c] = v;
        dn[c] += p.mu[s] * (mn[s][c] - m0[s][c]);
      }
    if (moved < 1e-14) break;
  }
  for (int s = 0; s < p.n; ++s)
    for (int c = 0; c < 3; ++c) {
      guess[s][c] = mn[s][c] - m0[s][c];
      m[s][c] = mn[s][c];
    }
  for (int c = 0; c < 3; ++c) dM[c] = dn[c];
}

/// Advances m (m[s][c], unit vectors) over one step dt in `substeps` equal midpoint
/// sub-steps; writes the change of mu0*M (T) over the step to dM. `guess` carries the
/// last sub-step's change of each m from one call to the next (the predictor of the
/// first iteration; zero to start).
inline void llg_cell_step(const LlgCoefficients& p, const double* b_old, const double* b_new, const double* r,
                          double (*m)[3], double (*guess)[3], double* dM) {
  double d[3] = {0, 0, 0};
  const double h = p.dt / p.substeps;
  for (int k = 0; k < p.substeps; ++k) llg_substep(p, k * h, h, b_old, b_new, r, d, m, guess, d);
  for (int c = 0; c < 3; ++c) dM[c] = d[c];
}

}  // namespace ty
