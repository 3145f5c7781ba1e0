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

#include "materials/magnetic/magnet.h"

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
  double self[3] = {0, 0, 0};     ///< self field of a surface cell: -self . (mu0 M - mu0 M_ground)
  double m_ground[3] = {0, 0, 0};  ///< mu0 M of the ground state, T
  int substeps = 1;    ///< midpoint sub-steps per time step
  int iterations = 6;  ///< fixed-point passes per sub-step (converged: see `from`)
  /// Sub-steps are chosen so that the midpoint rule's phase error (w_max h)^2/12 stays
  /// below `phase_error` for the highest linear resonance w_max of the ground state, and
  /// the fixed-point iteration contracts by at least 4 per pass (rho = (h/2) gamma B_scale
  /// < 1/4); the passes so that rho^passes < 1e-8 of the predictor's error.
  static LlgCoefficients from(const MagnetModel& m, double dt, double f_max, double phase_error = 6e-5);
};



/// Advances cells [0, count) of structure-of-arrays state over one step dt, in `substeps`
/// equal midpoint sub-steps of `iterations` fixed-point passes each (a fixed count, so the
/// loop over cells vectorizes; `from` picks it so that the iteration has converged).
///   m[6]      m1 xyz, m2 xyz per cell (unit vectors; m2 = 0 for one sublattice)
///   guess[6]  a prediction of the change of m over the whole step (the first sub-step
///             starts from its share; later ones from the previous sub-step's change)
///   b_old[3], b_new[3]  mu0 h at the start and end of the step (T)
///   r[3]      the cell's own reaction weight (0 for a prescribed field)
///   dM[3]     out: change of mu0 M over the step (T)
inline void llg_cells(const LlgCoefficients& p, long count, double* const* m, const double* const* guess,
                      const double* const* b_old, const double* const* b_new, const double* r, double* const* dM) {
  constexpr int W = 8;
  const double h = p.dt / p.substeps;
  const double mu0 = p.mu[0], mu1 = p.n == 2 ? p.mu[1] : 0.0;
  const double lam0 = p.n == 2 ? p.lambda * mu1 : 0.0, lam1 = p.n == 2 ? p.lambda * mu0 : 0.0;
  const double fd0 = p.n == 2 ? p.mu_d / p.mu[0] : 0.0, fd1 = p.n == 2 ? p.mu_d / p.mu[1] : 0.0;
  const double k0 = 0.5 * h * p.gp[0], k1 = 0.5 * h * (p.n == 2 ? p.gp[1] : 0.0);
  const double al0 = p.alpha[0], al1 = p.n == 2 ? p.alpha[1] : 0.0;
  double ax[4][3] = {}, ba[4] = {};
  for (int q = 0; q < p.na; ++q) {
    for (int c = 0; c < 3; ++c) ax[q][c] = p.axis[q][c];
    ba[q] = p.ba[q];
  }
  for (long k0_ = 0; k0_ < count; k0_ += W) {
    const int nl = static_cast<int>(std::min<long>(W, count - k0_));
    double M0[6][W], MB[6][W], MN[6][W], D0[3][W], DN[3][W], G[6][W];
    for (int c = 0; c < 6; ++c)
      for (int l = 0; l < nl; ++l) M0[c][l] = m[c][k0_ + l], G[c][l] = guess[c][k0_ + l] / p.substeps;
    for (int c = 0; c < 3; ++c)
      for (int l = 0; l < nl; ++l) D0[c][l] = 0.0;
    for (int sub = 0; sub < p.substeps; ++sub) {
      const double u = (sub + 0.5) * h / p.dt;  // the sub-step's midpoint, in units of the step
      for (int l = 0; l < nl; ++l) {
        for (int c = 0; c < 6; ++c) {
          const double g = G[c][l];
          MN[c][l] = M0[c][l] + g;
          MB[c][l] = M0[c][l] + 0.5 * g;
        }
        for (int c = 0; c < 3; ++c) DN[c][l] = D0[c][l] + mu0 * (MN[c][l] - M0[c][l]) + mu1 * (MN[3 + c][l] - M0[3 + c][l]);
      }
      for (int it = 0; it < p.iterations; ++it) {
#pragma omp simd
        for (int l = 0; l < nl; ++l) {
          double b[3];
          for (int c = 0; c < 3; ++c) {
            const double bo = b_old[c][k0_ + l], bn = b_new[c][k0_ + l];
            b[c] = p.bias[c] + bo + u * (bn - bo) - r[c] * 0.5 * (D0[c][l] + DN[c][l]) -
                   p.self[c] * (mu0 * MB[c][l] + mu1 * MB[3 + c][l] - p.m_ground[c]);
          }
          const double x0 = MB[0][l], x1 = MB[1][l], x2 = MB[2][l];
          const double y0 = MB[3][l], y1 = MB[4][l], y2 = MB[5][l];
          double f0 = b[0] - lam0 * y0, f1 = b[1] - lam0 * y1, f2 = b[2] - lam0 * y2;  // on sublattice 1
          double g0 = b[0] - lam1 * x0, g1 = b[1] - lam1 * x1, g2 = b[2] - lam1 * x2;  // on sublattice 2
          for (int q = 0; q < 4; ++q) {
            const double d1 = ba[q] * (x0 * ax[q][0] + x1 * ax[q][1] + x2 * ax[q][2]);
            const double d2 = ba[q] * (y0 * ax[q][0] + y1 * ax[q][1] + y2 * ax[q][2]);
            f0 += d1 * ax[q][0], f1 += d1 * ax[q][1], f2 += d1 * ax[q][2];
            g0 += d2 * ax[q][0], g1 += d2 * ax[q][1], g2 += d2 * ax[q][2];
          }
          // B_DM,1 = fd0 B_D x m2 ; B_DM,2 = fd1 m1 x B_D
          f0 += fd0 * (p.bd[1] * y2 - p.bd[2] * y1), f1 += fd0 * (p.bd[2] * y0 - p.bd[0] * y2),
              f2 += fd0 * (p.bd[0] * y1 - p.bd[1] * y0);
          g0 += fd1 * (x1 * p.bd[2] - x2 * p.bd[1]), g1 += fd1 * (x2 * p.bd[0] - x0 * p.bd[2]),
              g2 += fd1 * (x0 * p.bd[1] - x1 * p.bd[0]);
          // rotation vectors a = (h/2) gamma' (B + alpha m x B), then the Cayley rotations of m0
          const double a0 = k0 * (f0 + al0 * (x1 * f2 - x2 * f1)), a1 = k0 * (f1 + al0 * (x2 * f0 - x0 * f2)),
                       a2 = k0 * (f2 + al0 * (x0 * f1 - x1 * f0));
          const double c0 = k1 * (g0 + al1 * (y1 * g2 - y2 * g1)), c1 = k1 * (g1 + al1 * (y2 * g0 - y0 * g2)),
                       c2 = k1 * (g2 + al1 * (y0 * g1 - y1 * g0));
          // the two Cayley rotations are written out: a helper function, even always_inline,
          // stopped GCC 12 from vectorizing this loop (measured 4x slower)
          double n1[3], n2[3];
          {
            const double p0 = M0[0][l], p1 = M0[1][l], p2 = M0[2][l];
            const double s = 2.0 / (1.0 + a0 * a0 + a1 * a1 + a2 * a2);
            const double e0 = a1 * p2 - a2 * p1, e1 = a2 * p0 - a0 * p2, e2 = a0 * p1 - a1 * p0;
            n1[0] = p0 + s * (e0 + a1 * e2 - a2 * e1);
            n1[1] = p1 + s * (e1 + a2 * e0 - a0 * e2);
            n1[2] = p2 + s * (e2 + a0 * e1 - a1 * e0);
          }
          {
            const double p0 = M0[3][l], p1 = M0[4][l], p2 = M0[5][l];
            const double s = 2.0 / (1.0 + c0 * c0 + c1 * c1 + c2 * c2);
            const double e0 = c1 * p2 - c2 * p1, e1 = c2 * p0 - c0 * p2, e2 = c0 * p1 - c1 * p0;
            n2[0] = p0 + s * (e0 + c1 * e2 - c2 * e1);
            n2[1] = p1 + s * (e1 + c2 * e0 - c0 * e2);
            n2[2] = p2 + s * (e2 + c0 * e1 - c1 * e0);
          }
          for (int c = 0; c < 3; ++c) {
            MN[c][l] = n1[c], MN[3 + c][l] = n2[c];
            MB[c][l] = 0.5 * (M0[c][l] + n1[c]), MB[3 + c][l] = 0.5 * (M0[3 + c][l] + n2[c]);
            DN[c][l] = D0[c][l] + mu0 * (n1[c] - M0[c][l]) + mu1 * (n2[c] - M0[3 + c][l]);
          }
        }
      }
      for (int l = 0; l < nl; ++l) {
        for (int c = 0; c < 6; ++c) {
          G[c][l] = MN[c][l] - M0[c][l];
          M0[c][l] = MN[c][l];
        }
        for (int c = 0; c < 3; ++c) D0[c][l] = DN[c][l];
      }
    }
    for (int l = 0; l < nl; ++l) {
      for (int c = 0; c < 6; ++c) m[c][k0_ + l] = M0[c][l];
      for (int c = 0; c < 3; ++c) dM[c][k0_ + l] = D0[c][l];
    }
  }
}

}  // namespace ty
