/// \file cell_step.h
/// \brief One time step of the magnetic cells of one medium, as the solver calls it: the
/// exact small-signal step (llg_linear.h) for every cell whose sublattices stay within a
/// small tilt of the ground state; for the cells tilted further, the exponential midpoint
/// (llg_exponential.h: the small-signal step plus the nonlinear remainder at the midpoint,
/// one step, two or three passes) up to kChart2 (|x_s| = 0.12, 7 degrees),
/// and the plain implicit midpoint rule of the full equations (llg_cell.h, sub-steps of
/// fixed-point passes) beyond it or where the exponential passes do not converge.
///
/// The small-signal step leaves out terms of relative size |x_s| (the tilt, in rad); up to
/// `tilt` = 1e-4 rad that is below the midpoint rule's own error at the production step
/// (phase 6e-5, llg_cell.h), so the switch costs no accuracy, and it keeps the common case
/// (waves of up to ~10 kV/m in a fluoride away from its lines) at the price of one 4x4
/// matrix-vector product per cell. Cells are taken in blocks of sixteen (two vectors of eight
/// doubles, so that the passes have two independent chains of arithmetic in flight: 1.2x
/// over blocks of eight, docs/performance.md): the large-tilt paths
/// run for a block only when one of its cells needs them, starting from the small-signal
/// result as their predictor, and each cell keeps the result its own tilt calls for (each
/// lane of the exponential passes stops on its own test), so the outcome does not depend on
/// the block boundaries.
#pragma once
#include <algorithm>
#include <array>

#include "materials/magnetic/llg_cell.h"
#include "materials/magnetic/llg_exponential.h"
#include "materials/magnetic/llg_linear.h"

namespace ty {

struct CellStep {
  static constexpr double kTilt = 1e-4;  ///< rad, see above
  /// |x_s|^2 beyond which the plain midpoint rule takes over from the exponential one
  /// (|x_s| = 0.12, a tilt of 7 degrees: beyond it the exponential rule loses accuracy to
  /// the plain one, llg_exponential.h)
  static constexpr double kChart2 = 0.0144;
  LinearStep linear;
  LlgCoefficients midpoint;
  double r[3] = {0, 0, 0};  ///< the cell's own reaction weights (0 for a prescribed field)
  double tilt2 = kTilt * kTilt;
  double chart2 = kChart2;  ///< < 0: every tilted cell takes the plain midpoint rule (tests)

  /// f_max: the highest linear resonance (Hz), which sets the midpoint rule's sub-steps; r the
  /// cell's own reaction weights, self its self field (llg_linear.h).
  static CellStep from(const MagnetModel& model, const MagneticState& ground, double dt, double f_max,
                       const std::array<double, 3>& r, const std::array<double, 3>& self = {0, 0, 0},
                       double tilt = kTilt) {
    CellStep p;
    p.linear = LinearStep::from(model, ground, dt, r, self);
    p.midpoint = LlgCoefficients::from(model, dt, f_max);
    const Vec3 mg = model.net(ground.m);
    for (int c = 0; c < 3; ++c) p.midpoint.self[c] = self[c], p.midpoint.m_ground[c] = mg[c];
    for (int c = 0; c < 3; ++c) p.r[c] = r[c];
    p.tilt2 = tilt * tilt;
    return p;
  }
};

/// The plain midpoint rule (llg_cell.h) for the lanes of block k0 that are tilted past the
/// chart limit or whose exponential passes did not converge; ml: the small-signal result
/// (its predictor), m0 the state at the step's start, q and ok as exponential_lanes left them.
template <int W>
inline void midpoint_block(const CellStep& p, int nl, long k0, double* const* mn,
                           const double* const* b0, const double* const* b1, double* const* dM, const double* x2,
                           const double (*ml)[W], const double (*m0)[W], const double* q, const double* ok) {
  double mo[6][W], guess[6][W], d[3][W];
  double* mp[6];
  const double* gp[6];
  for (int c = 0; c < 6; ++c) {
    mp[c] = mo[c], gp[c] = guess[c];
    for (int l = 0; l < nl; ++l) mo[c][l] = m0[c][l], guess[c][l] = ml[c][l] - m0[c][l];
  }
  double* dp[3] = {d[0], d[1], d[2]};
  const double* bo[3] = {b0[0] + k0, b0[1] + k0, b0[2] + k0};
  const double* bn[3] = {b1[0] + k0, b1[1] + k0, b1[2] + k0};
  llg_cells(p.midpoint, nl, mp, gp, bo, bn, p.r, dp);
  for (int l = 0; l < nl; ++l) {
    if (x2[k0 + l] <= p.tilt2 || (ok[l] > 0 && x2[k0 + l] <= p.chart2 && q[l] <= p.chart2)) continue;
    for (int c = 0; c < 6; ++c) mn[c][k0 + l] = mo[c][l];
    for (int c = 0; c < 3; ++c) dM[c][k0 + l] = d[c][l];
  }
}

/// The cells of [0, count) tilted past the small-signal limit, after the small-signal step
/// (linear_cells, or the solver's fused row) left its result in mn and dM and each cell's
/// squared tilt in x2: each block of sixteen that holds one takes the exponential midpoint and,
/// where that does not serve, the plain midpoint rule. m: the state at the step's start.
/// Returns how many cells took a large-tilt path.
inline long tilted_cells(const CellStep& p, long count, const double* const* m, double* const* mn,
                         const double* const* b0, const double* const* b1, double* const* dM, const double* x2) {
  constexpr int W = 16;
  long tilted = 0;
  for (long k0 = 0; k0 < count; k0 += W) {
    const int nl = static_cast<int>(std::min<long>(W, count - k0));
    bool any = false;
    for (int l = 0; l < nl; ++l) any |= x2[k0 + l] > p.tilt2;
    if (!any) continue;
    // the exponential midpoint (llg_exponential.h) for the block, from the small-signal step
    double m0[6][W], ml[6][W], bo[3][W], bn[3][W], me[6][W], de[3][W], q[W], ok[W], use[W];
    // lane by lane, component by component (contiguous, so the copies vectorize); unused
    // lanes of the last block repeat its last cell
    const auto lanes = [&](const double* from, double* to) {
      if (nl == W)
        for (int l = 0; l < W; ++l) to[l] = from[k0 + l];
      else
        for (int l = 0; l < W; ++l) to[l] = from[k0 + std::min(l, nl - 1)];
    };
    for (int c = 0; c < 6; ++c) lanes(m[c], m0[c]), lanes(mn[c], ml[c]);
    for (int c = 0; c < 3; ++c) lanes(b0[c], bo[c]), lanes(b1[c], bn[c]);
    exponential_lanes(p.linear, p.midpoint, p.r, m0, ml, bo, bn, me, de, q, ok);
    // a tilted lane keeps the exponential result where it converged within the chart
    int far = 0;
    for (int l = 0; l < nl; ++l) {
      const bool past = x2[k0 + l] > p.tilt2;
      const bool serves = ok[l] > 0 && x2[k0 + l] <= p.chart2 && q[l] <= p.chart2;
      use[l] = past && serves ? 1.0 : 0.0;
      tilted += past;
      far += past && !serves;
    }
    for (int c = 0; c < 6; ++c)
      for (int l = 0; l < nl; ++l) mn[c][k0 + l] = use[l] > 0 ? me[c][l] : mn[c][k0 + l];
    for (int c = 0; c < 3; ++c)
      for (int l = 0; l < nl; ++l) dM[c][k0 + l] = use[l] > 0 ? de[c][l] : dM[c][k0 + l];
    if (far > 0) midpoint_block<W>(p, nl, k0, mn, b0, b1, dM, x2, ml, m0, q, ok);
  }
  return tilted;
}

/// Advances cells [0, count) of one medium over one step. m[6] in, mn[6] out: m1 xyz, m2 xyz
/// (unit vectors; m2 = 0 for one sublattice); b0[3], b1[3]: the wave field at the cell at the
/// step's start and end (T, bias excluded); dM[3] out: the change of mu0 M over the step (T);
/// scratch: count doubles. Returns how many cells took the midpoint rule.
inline long step_cells(const CellStep& p, long count, const double* const* m, double* const* mn,
                       const double* const* b0, const double* const* b1, double* const* dM, double* scratch) {
  if (p.linear.n == 2) linear_cells<2>(p.linear, count, m, b0, b1, mn, dM, scratch);
  else linear_cells<1>(p.linear, count, m, b0, b1, mn, dM, scratch);
  return tilted_cells(p, count, m, mn, b0, b1, dM, scratch);
}

/// One cell, for tests and small uses: m[s][c] (unit vectors), b0, b1 as above, dM out.
inline void step_cell(const CellStep& p, const double* b0, const double* b1, double (*m)[3], double* dM) {
  double mm[6], out[6], bo[3], bn[3];
  for (int c = 0; c < 3; ++c) {
    mm[c] = m[0][c], mm[3 + c] = p.linear.n == 2 ? m[1][c] : 0.0;
    bo[c] = b0[c], bn[c] = b1[c];
  }
  const double* mp[6] = {&mm[0], &mm[1], &mm[2], &mm[3], &mm[4], &mm[5]};
  double* op[6] = {&out[0], &out[1], &out[2], &out[3], &out[4], &out[5]};
  const double* bop[3] = {&bo[0], &bo[1], &bo[2]};
  const double* bnp[3] = {&bn[0], &bn[1], &bn[2]};
  double* dp[3] = {&dM[0], &dM[1], &dM[2]};
  double x2;
  step_cells(p, 1, mp, op, bop, bnp, dp, &x2);
  for (int c = 0; c < 3; ++c) {
    m[0][c] = out[c];
    if (p.linear.n == 2) m[1][c] = out[3 + c];
  }
}

}  // namespace ty
