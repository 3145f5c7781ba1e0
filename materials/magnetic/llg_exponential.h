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

/// sqrt(1 - q) for 0 <= q <= 0.5 to round-off: three terms of its series, then two Newton
/// steps (the error goes 5q^4/128 -> 3e-12 -> 1e-23 at q = 0.09). Written out because a
/// call to std::sqrt keeps GCC from vectorizing the loop (errno).
inline double root_one_minus(double q) {
  const double w = 1.0 - q;
  double c = 1.0 - q * (0.5 + q * (0.125 + q * 0.0625));
  c = 0.5 * (c + w / c);
  return 0.5 * (c + w / c);
}

/// The eight lanes of one block (the caller fills unused lanes with copies of a used one):
/// m0[6] the state at the step's start, ml[6] the small-signal step's result (its
/// predictor), b0[3], b1[3] the wave field at the step's ends, r the cell's own reaction
/// weights. Out: mn[6], dM[3] and per lane the largest squared tilt |x_s|^2 of the result
/// (q) and whether the passes converged (ok: 1 or 0). tol: each lane's error allowed, relative
/// to its change over the step (tests ask for less); passes, if given: how many the block took.
inline void exponential_lanes(const LinearStep& L, const LlgCoefficients& p, const double* r,
                              const double (*m0)[8], const double (*ml)[8], const double (*b0)[8],
                              const double (*b1)[8], double (*mn)[8], double (*dM)[8], double* q, double* ok,
                              double tol = 1e-10, int* passes = nullptr) {
  constexpr int W = 8, kPasses = 8;
  constexpr double kFloor = 1e-15;  // above the round-off of N (|m| = 1)
  double X0[4][W], X1[4][W], XL[4][W], B[3][W], KX0[3][W], M0[6][W];
  double done[W];  // 1 once the lane has converged (a double, so that the loop vectorizes)
  double last[W];  // the lane's change at its previous pass
  for (int l = 0; l < W; ++l) done[l] = 0.0, last[l] = 0.0;
  if (passes) *passes = kPasses;
  // local copies of the coefficients, so that the loops over lanes vectorize
  double e1[2][3], e2[2][3], g[2][3], mu[2], A[4][4], ct[4][3], hp[4][4];
  for (int s = 0; s < 2; ++s) {
    for (int c = 0; c < 3; ++c) e1[s][c] = L.e1[s][c], e2[s][c] = L.e2[s][c], g[s][c] = L.g[s][c];
    mu[s] = L.mu[s];
  }
  for (int i = 0; i < 4; ++i)
    for (int j = 0; j < 4; ++j) A[i][j] = L.a[i][j], hp[i][j] = L.hphi1[i][j];
  for (int i = 0; i < 4; ++i)
    for (int c = 0; c < 3; ++c) ct[i][c] = L.ct[i][c];
  const int two = p.n == 2;
  const double lam0 = two ? p.lambda * p.mu[1] : 0.0, lam1 = two ? p.lambda * p.mu[0] : 0.0;
  const double fd0 = two ? p.mu_d / p.mu[0] : 0.0, fd1 = two ? p.mu_d / p.mu[1] : 0.0;
  const double k0 = p.gp[0], k1 = two ? p.gp[1] : 0.0, al0 = p.alpha[0], al1 = two ? p.alpha[1] : 0.0;
  double ax[4][3] = {}, ba[4] = {}, bias[3], self[3], mg[3], rr[3], bd[3];
  for (int k = 0; k < p.na; ++k) {
    for (int c = 0; c < 3; ++c) ax[k][c] = p.axis[k][c];
    ba[k] = p.ba[k];
  }
  for (int c = 0; c < 3; ++c) bias[c] = p.bias[c], self[c] = p.self[c], mg[c] = p.m_ground[c], rr[c] = r[c], bd[c] = p.bd[c];
#pragma omp simd
  for (int l = 0; l < W; ++l) {
    for (int s = 0; s < 2; ++s) {
      X0[2 * s][l] = e1[s][0] * m0[3 * s][l] + e1[s][1] * m0[3 * s + 1][l] + e1[s][2] * m0[3 * s + 2][l];
      X0[2 * s + 1][l] = e2[s][0] * m0[3 * s][l] + e2[s][1] * m0[3 * s + 1][l] + e2[s][2] * m0[3 * s + 2][l];
      XL[2 * s][l] = e1[s][0] * ml[3 * s][l] + e1[s][1] * ml[3 * s + 1][l] + e1[s][2] * ml[3 * s + 2][l];
      XL[2 * s + 1][l] = e2[s][0] * ml[3 * s][l] + e2[s][1] * ml[3 * s + 1][l] + e2[s][2] * ml[3 * s + 2][l];
    }
    for (int i = 0; i < 4; ++i) X1[i][l] = XL[i][l];
    for (int c = 0; c < 6; ++c) M0[c][l] = m0[c][l];
    for (int c = 0; c < 3; ++c) {
      B[c][l] = 0.5 * (b0[c][l] + b1[c][l]);
      KX0[c][l] = mu[0] * (X0[0][l] * e1[0][c] + X0[1][l] * e2[0][c]) + mu[1] * (X0[2][l] * e1[1][c] + X0[3][l] * e2[1][c]);
    }
  }
  for (int pass = 0; pass < kPasses; ++pass) {
#pragma omp simd
    for (int l = 0; l < W; ++l) {
      double xb[4], m[2][3];
      for (int i = 0; i < 4; ++i) xb[i] = 0.5 * (X0[i][l] + X1[i][l]);
      const double r0 = root_one_minus(xb[0] * xb[0] + xb[1] * xb[1]);
      const double r1 = root_one_minus(xb[2] * xb[2] + xb[3] * xb[3]);
      for (int c = 0; c < 3; ++c) {
        m[0][c] = g[0][c] * r0 + xb[0] * e1[0][c] + xb[1] * e2[0][c];
        m[1][c] = g[1][c] * r1 + xb[2] * e1[1][c] + xb[3] * e2[1][c];
      }
      double b[3];
      for (int c = 0; c < 3; ++c) {
        const double d = mu[0] * (m[0][c] - M0[c][l]) + mu[1] * (m[1][c] - M0[3 + c][l]);
        b[c] = bias[c] + B[c][l] - rr[c] * d - self[c] * (mu[0] * m[0][c] + mu[1] * m[1][c] - mg[c]);
      }
      const double x0 = m[0][0], x1 = m[0][1], x2 = m[0][2], y0 = m[1][0], y1 = m[1][1], y2 = m[1][2];
      double f0 = b[0] - lam0 * y0, f1 = b[1] - lam0 * y1, f2 = b[2] - lam0 * y2;
      double g0 = b[0] - lam1 * x0, g1 = b[1] - lam1 * x1, g2 = b[2] - lam1 * x2;
      for (int k = 0; k < 4; ++k) {
        const double d1 = ba[k] * (x0 * ax[k][0] + x1 * ax[k][1] + x2 * ax[k][2]);
        const double d2 = ba[k] * (y0 * ax[k][0] + y1 * ax[k][1] + y2 * ax[k][2]);
        f0 += d1 * ax[k][0], f1 += d1 * ax[k][1], f2 += d1 * ax[k][2];
        g0 += d2 * ax[k][0], g1 += d2 * ax[k][1], g2 += d2 * ax[k][2];
      }
      f0 += fd0 * (bd[1] * y2 - bd[2] * y1), f1 += fd0 * (bd[2] * y0 - bd[0] * y2), f2 += fd0 * (bd[0] * y1 - bd[1] * y0);
      g0 += fd1 * (x1 * bd[2] - x2 * bd[1]), g1 += fd1 * (x2 * bd[0] - x0 * bd[2]), g2 += fd1 * (x0 * bd[1] - x1 * bd[0]);
      // w = gamma' (B + alpha m x B), dm/dt = w x m
      const double w0 = k0 * (f0 + al0 * (x1 * f2 - x2 * f1)), w1 = k0 * (f1 + al0 * (x2 * f0 - x0 * f2)),
                   w2 = k0 * (f2 + al0 * (x0 * f1 - x1 * f0));
      const double v0 = k1 * (g0 + al1 * (y1 * g2 - y2 * g1)), v1 = k1 * (g1 + al1 * (y2 * g0 - y0 * g2)),
                   v2 = k1 * (g2 + al1 * (y0 * g1 - y1 * g0));
      const double d1[3] = {w1 * x2 - w2 * x1, w2 * x0 - w0 * x2, w0 * x1 - w1 * x0};
      const double d2[3] = {v1 * y2 - v2 * y1, v2 * y0 - v0 * y2, v0 * y1 - v1 * y0};
      // N = F - A x_bar - Ct (b_wave + R K x0)
      const double bl[3] = {B[0][l] + rr[0] * KX0[0][l], B[1][l] + rr[1] * KX0[1][l], B[2][l] + rr[2] * KX0[2][l]};
      double nl_[4] = {e1[0][0] * d1[0] + e1[0][1] * d1[1] + e1[0][2] * d1[2],
                       e2[0][0] * d1[0] + e2[0][1] * d1[1] + e2[0][2] * d1[2],
                       e1[1][0] * d2[0] + e1[1][1] * d2[1] + e1[1][2] * d2[2],
                       e2[1][0] * d2[0] + e2[1][1] * d2[1] + e2[1][2] * d2[2]};
      for (int i = 0; i < 4; ++i) {
        for (int j = 0; j < 4; ++j) nl_[i] -= A[i][j] * xb[j];
        for (int c = 0; c < 3; ++c) nl_[i] -= ct[i][c] * bl[c];
      }
      double change = 0, size = 0, nx[4];
      for (int i = 0; i < 4; ++i) {
        double v = XL[i][l];
        for (int j = 0; j < 4; ++j) v += hp[i][j] * nl_[j];
        nx[i] = v;
        change = std::max(change, std::abs(v - X1[i][l]));
        size = std::max(size, std::abs(v - X0[i][l]));
      }
      // the error of this pass's x: within rho/(1 - rho) of its change, rho the contraction
      // measured by the last two changes (the stopping rule of simplified Newton iterations:
      // Hairer & Wanner, Solving ODEs II, 2nd ed., sec. IV.8, eq. 8.10-8.11); the change
      // itself until a second pass has measured rho, or where rho >= 1/2
      const double rho = pass > 0 && last[l] > 0 ? change / last[l] : 1.0;
      const double error = rho < 0.5 ? rho / (1 - rho) * change : change;
      const double was = done[l];
      for (int i = 0; i < 4; ++i) X1[i][l] = was > 0 ? X1[i][l] : nx[i];
      done[l] = was > 0 || error <= tol * size + kFloor ? 1.0 : 0.0;
      last[l] = change;
    }
    double all = 1;
    for (int l = 0; l < W; ++l) all = std::min(all, done[l]);
    if (all > 0) {
      if (passes) *passes = pass + 1;
      break;
    }
  }
#pragma omp simd
  for (int l = 0; l < W; ++l) {
    ok[l] = done[l];
    const double q0 = X1[0][l] * X1[0][l] + X1[1][l] * X1[1][l], q1 = X1[2][l] * X1[2][l] + X1[3][l] * X1[3][l];
    q[l] = std::max(q0, q1);
    const double c0 = root_one_minus(q0), c1 = root_one_minus(q1);
    for (int c = 0; c < 3; ++c) {  // g, e1, e2 of sublattice 2 are zero for one sublattice
      mn[c][l] = g[0][c] * c0 + X1[0][l] * e1[0][c] + X1[1][l] * e2[0][c];
      mn[3 + c][l] = g[1][c] * c1 + X1[2][l] * e1[1][c] + X1[3][l] * e2[1][c];
      dM[c][l] = mu[0] * (mn[c][l] - M0[c][l]) + mu[1] * (mn[3 + c][l] - M0[3 + c][l]);
    }
  }
}

}  // namespace ty
