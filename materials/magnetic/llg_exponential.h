/// \file llg_exponential.h
/// \brief The large-tilt step of a cell's sublattices below the chart limit: the exact
/// small-signal step (llg_linear.h) plus the nonlinear remainder of the full
/// Landau-Lifshitz-Gilbert equations, taken at the step's midpoint (an implicit exponential
/// integrator of second order).
///
/// In the tangent coordinates of llg_linear.h, x_s = (e1_s . m_s, e2_s . m_s) exactly, so the
/// full equations are dx/dt = F(x, t) = E^T (w(m) x m) with m = m(x) and the field of
/// llg_cell.h (bias, wave field interpolated in time, less the cell's own reaction and self
/// field). Splitting F = A x + Ct b'(t) + N(x, t), with A x + Ct b' the linearised
/// equations that the small-signal step integrates exactly and N the remainder (of second
/// order in x), the variation-of-constants formula gives
///   x(h) = x_lin(h) + int_0^h e^{(h-s)A} N(x(s), s) ds,
/// and taking N at the midpoint x_bar = (x(0) + x(h))/2, t = h/2:
///   x(h) = x_lin(h) + h phi1(hA) N(x_bar, h/2)
/// (exponential integrators for semilinear problems: Hochbruck & Ostermann, Acta Numerica
/// 19, 209 (2010), sec. 2; this is the implicit exponential midpoint of that family). It
/// is exact for the linearised equations at any step, and its error is that of a
/// second-order rule applied only to N, relatively of the size of the tilt squared times
/// (w h)^2, so one step per time step serves where the plain midpoint rule needs
/// (w_max h)^2/12 < 6e-5 (three sub-steps for MnF2 at 20 um). The implicit equation is
/// solved by fixed-point passes from x_lin; each pass contracts by about h |dN/dx|, of the
/// size of the tilt times gamma B_E h, so two passes converge up to 1e-2 rad (four at
/// 0.1 rad) where the plain rule takes seven per sub-step. Each cell (lane) stops on its own
/// once the error of its x, estimated from the contraction the last two passes measured, is
/// at most `tol` (1e-10) of its change over the step, so its result does not depend on the
/// other cells of its block, and the count is the same on every run and any thread count.
/// |m_s| = 1 to round-off by construction (m(x) = g sqrt(1 - |x|^2) + x1 e1 + x2 e2). Its
/// error grows with the tilt (one MnF2 step against a fine reference: 1.9e-10 at 1e-3 rad,
/// 2.9e-6 at 0.1 rad, as the plain midpoint rule's 2.6e-6; 4.3e-5 at 0.25 rad against its
/// 1.5e-5), so cell_step.h hands cells beyond 7 degrees, and any lane that has not
/// converged in kPasses, to the plain midpoint rule of llg_cell.h.
#pragma once
#include <algorithm>
#include <cmath>

#include "materials/magnetic/llg_cell.h"
#include "materials/magnetic/llg_linear.h"

namespace ty {

/// sqrt(1 - q) for 0 <= q <= 0.03 (|x_s| <= 0.17, past the chart limit of 0.12) to
/// round-off: ten terms of its binomial series, c_n = c_{n-1} (2n - 3) / (2n) (the first left
/// out, c_10 q^10, is below 6e-18 there; measured against a long-double root: within 6.3e-17).
/// Beyond 0.03 it stays finite and falls short of the root; only lanes tilted past the chart
/// limit reach it, and cell_step.h hands those to the plain midpoint rule. A polynomial,
/// because a root or a division costs this loop several multiply-adds (docs/performance.md).
inline double root_one_minus(double q) {
  return 1.0 + q * (-0.5 + q * (-0.125 + q * (-0.0625 + q * (-0.0390625 + q * (-0.02734375 +
             q * (-0.0205078125 + q * (-0.01611328125 + q * (-0.013092041015625 + q * -0.0109100341796875))))))));
}

/// The coefficients of one medium's exponential step as plain local arrays (a local object,
/// so that the loops over lanes that hold one vectorize), for N sublattices and NA
/// anisotropy axes (compile-time counts, so that a one-sublattice or one-axis crystal does
/// no arithmetic on zeros), and the arithmetic of one lane.
template <int N, int NA>
struct ExponentialLocal {
  static constexpr int T = 2 * N;
  double e1[N][3], e2[N][3], g[N][3], mu[N], A[T][T], ct[T][3], hp[T][T];
  double lam[2], fd[2], k[N], al[N], ax[NA + 1][3] = {}, ba[NA + 1] = {}, rr[3], rs[3], fixed[3], bd[3];

  ExponentialLocal(const LinearStep& L, const LlgCoefficients& p, const double* r) {
    for (int s = 0; s < N; ++s) {
      for (int c = 0; c < 3; ++c) e1[s][c] = L.e1[s][c], e2[s][c] = L.e2[s][c], g[s][c] = L.g[s][c];
      mu[s] = L.mu[s], k[s] = p.gp[s], al[s] = p.alpha[s];
    }
    for (int i = 0; i < T; ++i) {
      for (int j = 0; j < T; ++j) A[i][j] = L.a[i][j], hp[i][j] = L.hphi1[i][j];
      for (int c = 0; c < 3; ++c) ct[i][c] = L.ct[i][c];
    }
    lam[0] = N == 2 ? p.lambda * p.mu[1] : 0.0, lam[1] = N == 2 ? p.lambda * p.mu[0] : 0.0;
    fd[0] = N == 2 ? p.mu_d / p.mu[0] : 0.0, fd[1] = N == 2 ? p.mu_d / p.mu[1] : 0.0;
    for (int a = 0; a < NA; ++a) {
      for (int c = 0; c < 3; ++c) ax[a][c] = p.axis[a][c];
      ba[a] = p.ba[a];
    }
    // the cell's own reaction and self field, -r (mu0 M - mu0 M(0)) - self (mu0 M - mu0
    // M_ground): the part that depends on m is -(r + self) mu0 M
    for (int c = 0; c < 3; ++c) {
      rr[c] = r[c], rs[c] = r[c] + p.self[c], bd[c] = p.bd[c];
      fixed[c] = p.bias[c] + p.self[c] * p.m_ground[c];
    }
  }

  /// The tangent coordinates x[T] of the unit vectors m[6].
  [[gnu::always_inline]] void coordinates(const double* m, double* x) const {
    for (int s = 0; s < N; ++s) {
      x[2 * s] = e1[s][0] * m[3 * s] + e1[s][1] * m[3 * s + 1] + e1[s][2] * m[3 * s + 2];
      x[2 * s + 1] = e2[s][0] * m[3 * s] + e2[s][1] * m[3 * s + 1] + e2[s][2] * m[3 * s + 2];
    }
  }

  /// The unit vectors m[N][3] of the tangent coordinates x[T]: g sqrt(1 - |x|^2) + x1 e1 + x2 e2.
  [[gnu::always_inline]] void unit_vectors(const double* x, double (*m)[3]) const {
    for (int s = 0; s < N; ++s) {
      const double root = root_one_minus(x[2 * s] * x[2 * s] + x[2 * s + 1] * x[2 * s + 1]);
      for (int c = 0; c < 3; ++c) m[s][c] = g[s][c] * root + x[2 * s] * e1[s][c] + x[2 * s + 1] * e2[s][c];
    }
  }

  /// What stays the same over the passes, from the step's start m0[6], x0[T] and the wave
  /// field b0[3], b1[3] at its ends: the field less its m-dependent parts (fixed[3]) and
  /// Ct b' of the linearised equations (cb[T]).
  [[gnu::always_inline]] void constants(const double* m0, const double* x0, const double* b0, const double* b1, double* field,
                 double* cb) const {
    double bl[3];
    for (int c = 0; c < 3; ++c) {
      const double B = 0.5 * (b0[c] + b1[c]);
      double kx0 = 0, mu_m0 = 0;  // mu0 M(x0) to first order in x0, and exactly
      for (int s = 0; s < N; ++s) {
        kx0 += mu[s] * (x0[2 * s] * e1[s][c] + x0[2 * s + 1] * e2[s][c]);
        mu_m0 += mu[s] * m0[3 * s + c];
      }
      bl[c] = B + rr[c] * kx0;                  // the linearised equations' b'
      field[c] = fixed[c] + B + rr[c] * mu_m0;  // less -(r + self) mu0 M(x) and the crystal's own
    }
    for (int i = 0; i < T; ++i) cb[i] = ct[i][0] * bl[0] + ct[i][1] * bl[1] + ct[i][2] * bl[2];
  }

  /// The nonlinear remainder N(x_bar) = F(x_bar) - A x_bar - Ct b' (nl[T]), F the full
  /// equations' rate in tangent coordinates.
  [[gnu::always_inline]] void remainder(const double* xb, const double* field, const double* cb, double* nl) const {
    double m[N][3], f[N][3];
    unit_vectors(xb, m);
    // each sublattice's field: the fixed part, -(r + self) mu0 M, exchange with the other,
    // anisotropy, Dzyaloshinskii-Moriya
    for (int c = 0; c < 3; ++c) {
      double mu_m = 0;
      for (int s = 0; s < N; ++s) mu_m += mu[s] * m[s][c];
      const double b = field[c] - rs[c] * mu_m;
      f[0][c] = b - (N == 2 ? lam[0] * m[N - 1][c] : 0.0);
      if constexpr (N == 2) f[1][c] = b - lam[1] * m[0][c];
    }
    for (int a = 0; a < NA; ++a)
      for (int s = 0; s < N; ++s) {
        const double d = ba[a] * (m[s][0] * ax[a][0] + m[s][1] * ax[a][1] + m[s][2] * ax[a][2]);
        for (int c = 0; c < 3; ++c) f[s][c] += d * ax[a][c];
      }
    if constexpr (N == 2) {
      const double *x = m[0], *y = m[1];
      f[0][0] += fd[0] * (bd[1] * y[2] - bd[2] * y[1]), f[0][1] += fd[0] * (bd[2] * y[0] - bd[0] * y[2]),
          f[0][2] += fd[0] * (bd[0] * y[1] - bd[1] * y[0]);
      f[1][0] += fd[1] * (x[1] * bd[2] - x[2] * bd[1]), f[1][1] += fd[1] * (x[2] * bd[0] - x[0] * bd[2]),
          f[1][2] += fd[1] * (x[0] * bd[1] - x[1] * bd[0]);
    }
    // w = gamma' (B + alpha m x B), dm/dt = w x m, projected on the tangent basis
    for (int s = 0; s < N; ++s) {
      const double *x = m[s], *F = f[s];
      const double w0 = k[s] * (F[0] + al[s] * (x[1] * F[2] - x[2] * F[1]));
      const double w1 = k[s] * (F[1] + al[s] * (x[2] * F[0] - x[0] * F[2]));
      const double w2 = k[s] * (F[2] + al[s] * (x[0] * F[1] - x[1] * F[0]));
      const double d[3] = {w1 * x[2] - w2 * x[1], w2 * x[0] - w0 * x[2], w0 * x[1] - w1 * x[0]};
      nl[2 * s] = e1[s][0] * d[0] + e1[s][1] * d[1] + e1[s][2] * d[2];
      nl[2 * s + 1] = e2[s][0] * d[0] + e2[s][1] * d[1] + e2[s][2] * d[2];
    }
    for (int i = 0; i < T; ++i) {
      nl[i] -= cb[i];
      for (int j = 0; j < T; ++j) nl[i] -= A[i][j] * xb[j];
    }
  }
};

/// One block of W lanes (see exponential_lanes for the arguments), for N sublattices and NA
/// axes. What does not change from pass to pass is taken out of the passes: the wave field
/// at the midpoint, the part of the field that does not depend on m, and Ct b'.
template <int W, int N, int NA>
inline void exponential_kernel(const LinearStep& L, const LlgCoefficients& p, const double* r,
                               const double (*m0)[W], const double (*ml)[W], const double (*b0)[W],
                               const double (*b1)[W], double (*mn)[W], double (*dM)[W], double* q, double* ok,
                               double tol, int* passes) {
  constexpr int T = 2 * N, kPasses = 8;
  constexpr double kFloor = 1e-15;  // above the round-off of N (|m| = 1)
  const ExponentialLocal<N, NA> E(L, p, r);
  double X0[T][W], X1[T][W], XL[T][W], CB[T][W], B0[3][W];
  double done[W];  // 1 once the lane has converged (a double, so that the loop vectorizes)
  double last[W];  // the lane's change at its previous pass
  for (int l = 0; l < W; ++l) done[l] = 0.0, last[l] = 0.0;
  if (passes) *passes = kPasses;
  // (vectorized by GCC on its own, as the passes below)
  for (int l = 0; l < W; ++l) {
    double m[6], x[T], y[T], b[2][3], field[3], cb[T];
    for (int c = 0; c < 6; ++c) m[c] = m0[c][l];
    E.coordinates(m, x);
    for (int c = 0; c < 6; ++c) m[c] = ml[c][l];
    E.coordinates(m, y);
    for (int c = 0; c < 6; ++c) m[c] = m0[c][l];
    for (int c = 0; c < 3; ++c) b[0][c] = b0[c][l], b[1][c] = b1[c][l];
    E.constants(m, x, b[0], b[1], field, cb);
    for (int i = 0; i < T; ++i) X0[i][l] = x[i], XL[i][l] = X1[i][l] = y[i], CB[i][l] = cb[i];
    for (int c = 0; c < 3; ++c) B0[c][l] = field[c];
  }
  for (int pass = 0; pass < kPasses; ++pass) {
    // no `omp simd` on this loop: with it GCC 12 keeps the lanes' small arrays in memory and
    // runs 2.6x slower; it vectorizes the loop on its own (-fopt-info-vec)
    for (int l = 0; l < W; ++l) {
      double xb[T], nl[T], field[3] = {B0[0][l], B0[1][l], B0[2][l]}, cb[T];
      for (int i = 0; i < T; ++i) xb[i] = 0.5 * (X0[i][l] + X1[i][l]), cb[i] = CB[i][l];
      E.remainder(xb, field, cb, nl);
      double change = 0, size = 0, nx[T];
      for (int i = 0; i < T; ++i) {
        double v = XL[i][l];
        for (int j = 0; j < T; ++j) v += E.hp[i][j] * nl[j];
        nx[i] = v;
        change = std::max(change, std::abs(v - X1[i][l]));
        size = std::max(size, std::abs(v - X0[i][l]));
      }
      // this pass's error is within rho/(1 - rho) of its change, rho = change / last (Hairer &
      // Wanner, Solving ODEs II, 2nd ed., sec. IV.8, eq. 8.10-8.11): change^2 <= allowed (last -
      // change), no division; the change itself before a second pass, or where rho >= 1/2.
      const double allowed = tol * size + kFloor;
      const double contracts = pass > 0 && change < 0.5 * last[l] ? 1.0 : 0.0;
      const double lhs = contracts > 0 ? change * change : change;
      const double rhs = contracts > 0 ? allowed * (last[l] - change) : allowed;
      const double was = done[l];
      for (int i = 0; i < T; ++i) X1[i][l] = was > 0 ? X1[i][l] : nx[i];
      done[l] = was > 0 || lhs <= rhs ? 1.0 : 0.0;
      last[l] = change;
    }
    double all = 1;
    for (int l = 0; l < W; ++l) all = std::min(all, done[l]);
    if (all > 0) {
      if (passes) *passes = pass + 1;
      break;
    }
  }
  // the unit vectors as ExponentialLocal::unit_vectors has them, written out: under omp simd
  // (which this loop needs to vectorize) its m[N][3] stayed in memory: the step outside the
  // passes took 13.6 ns a cell instead of 5.9
#pragma omp simd
  for (int l = 0; l < W; ++l) {
    ok[l] = done[l];
    double qs[N], d[3] = {0, 0, 0}, m[6] = {0, 0, 0, 0, 0, 0};  // m: 0 for a second sublattice not there
    for (int s = 0; s < N; ++s) qs[s] = X1[2 * s][l] * X1[2 * s][l] + X1[2 * s + 1][l] * X1[2 * s + 1][l];
    q[l] = N == 2 ? std::max(qs[0], qs[N - 1]) : qs[0];
    for (int s = 0; s < N; ++s) {
      const double root = root_one_minus(qs[s]);
      for (int c = 0; c < 3; ++c) {
        m[3 * s + c] = E.g[s][c] * root + X1[2 * s][l] * E.e1[s][c] + X1[2 * s + 1][l] * E.e2[s][c];
        d[c] += E.mu[s] * (m[3 * s + c] - m0[3 * s + c][l]);
      }
    }
    for (int c = 0; c < 6; ++c) mn[c][l] = m[c];
    for (int c = 0; c < 3; ++c) dM[c][l] = d[c];
  }
}

/// The lanes of one block (the caller fills unused lanes with copies of a used one):
/// m0[6] the state at the step's start, ml[6] the small-signal step's result (its
/// predictor), b0[3], b1[3] the wave field at the step's ends, r the cell's own reaction
/// weights. Out: mn[6], dM[3] and per lane the largest squared tilt |x_s|^2 of the result
/// (q) and whether the passes converged (ok: 1 or 0). tol: each lane's error allowed, relative
/// to its change over the step (tests ask for less); passes, if given: how many the block took.
template <int W>
inline void exponential_lanes(const LinearStep& L, const LlgCoefficients& p, const double* r,
                              const double (*m0)[W], const double (*ml)[W], const double (*b0)[W],
                              const double (*b1)[W], double (*mn)[W], double (*dM)[W], double* q, double* ok,
                              double tol = 1e-10, int* passes = nullptr) {
#define TY_EXPONENTIAL(n, na) \
  return exponential_kernel<W, n, na>(L, p, r, m0, ml, b0, b1, mn, dM, q, ok, tol, passes)
  if (p.n == 2) {
    switch (p.na) {
      case 0: TY_EXPONENTIAL(2, 0);
      case 1: TY_EXPONENTIAL(2, 1);
      case 2: TY_EXPONENTIAL(2, 2);
      case 3: TY_EXPONENTIAL(2, 3);
      default: TY_EXPONENTIAL(2, 4);
    }
  }
  switch (p.na) {
    case 0: TY_EXPONENTIAL(1, 0);
    case 1: TY_EXPONENTIAL(1, 1);
    case 2: TY_EXPONENTIAL(1, 2);
    case 3: TY_EXPONENTIAL(1, 3);
    default: TY_EXPONENTIAL(1, 4);
  }
#undef TY_EXPONENTIAL
}

}  // namespace ty
